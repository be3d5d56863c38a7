/** sites: what both store implementations share (row shape and mapping). */
import type { Site } from '../../../core/schemas';

export interface SiteRow {
  id: string;
  name: string;
  time_zone: string;
  notes: string;
  created_at: string;
  updated_at: string;
}

export function siteFromRow(r: SiteRow): Site {
  return { id: r.id, name: r.name, timeZone: r.time_zone, notes: r.notes, createdAt: r.created_at, updatedAt: r.updated_at };
}
