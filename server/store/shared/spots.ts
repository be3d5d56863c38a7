/** spots: what both store implementations share (row shape and mapping). */
import { SpotGeometrySchema, type Spot } from '../../../core/schemas';

export interface SpotRow {
  id: string;
  site_id: string;
  area_id: string;
  name: string;
  code: string;
  object_kind: string;
  material_class: string;
  model: string | null;
  geometry: string;
  default_distance_value: number;
  default_distance_unit: string;
  distance_uncertainty_m: number | null;
  route_position: number;
  notes: string;
  retired_at: string | null;
  retired_reason: string | null;
  created_at: string;
  updated_at: string;
}

export function spotFromRow(r: SpotRow): Spot {
  return {
    id: r.id, areaId: r.area_id, name: r.name, code: r.code,
    objectKind: r.object_kind as Spot['objectKind'], materialClass: r.material_class as Spot['materialClass'],
    model: r.model as Spot['model'], geometry: SpotGeometrySchema.parse(JSON.parse(r.geometry)),
    defaultDistance: { value: r.default_distance_value, unit: r.default_distance_unit as Spot['defaultDistance']['unit'] },
    distanceUncertaintyM: r.distance_uncertainty_m, routePosition: r.route_position, notes: r.notes,
    retiredAt: r.retired_at, retiredReason: r.retired_reason, createdAt: r.created_at, updatedAt: r.updated_at,
  };
}
