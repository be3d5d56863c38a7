/** areas: what both store implementations share (row shape and mapping). */
import type { Area } from '../../../core/schemas';

export interface AreaRow {
  id: string;
  site_id: string;
  name: string;
  kind: string;
  zone: number | null;
  gas_group: string | null;
  substance_id: string | null;
  dust_mie_j: number | null;
  limit_set_id: string | null;
  notes: string;
  created_at: string;
  updated_at: string;
}

export function areaFromRow(r: AreaRow): Area {
  return {
    id: r.id, siteId: r.site_id, name: r.name, kind: r.kind as Area['kind'], zone: r.zone as Area['zone'],
    gasGroup: r.gas_group as Area['gasGroup'], substanceId: r.substance_id, dustMieJ: r.dust_mie_j,
    limitSetId: r.limit_set_id, notes: r.notes, createdAt: r.created_at, updatedAt: r.updated_at,
  };
}
