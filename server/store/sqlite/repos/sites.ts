/** sites: one plant or building with its time zone. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Site, SiteInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { siteFromRow, type SiteRow } from '../../shared/sites';

export function getSite(db: Db, id: string): Site | null {
  const r = stmt(db, 'SELECT * FROM sites WHERE id = ?').get(id) as SiteRow | undefined;
  return r ? siteFromRow(r) : null;
}

export function listSites(db: Db): Site[] {
  return (stmt(db, 'SELECT * FROM sites ORDER BY name, id').all() as SiteRow[]).map(siteFromRow);
}

export function siteExists(db: Db, id: string): boolean {
  return stmt(db, 'SELECT 1 FROM sites WHERE id = ?').get(id) !== undefined;
}

/** Throws not-found naming `path` when the site does not exist. */
export function requireSite(db: Db, id: string, path: (string | number)[] = ['siteId']): void {
  if (!siteExists(db, id)) throw notFound(`no site with id ${id}`, path);
}

export function insertSite(db: Db, input: SiteInput, now: string): Site {
  const id = input.id ?? newId();
  if (input.id && siteExists(db, id)) throw conflict(`a site with id ${id} already exists`, ['id']);
  stmt(db, `INSERT INTO sites (id, name, time_zone, notes, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)`)
    .run(id, input.name, input.timeZone, input.notes, now, now);
  return getSite(db, id)!;
}

export function updateSite(db: Db, id: string, input: SiteInput, now: string): Site {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const r = stmt(db, 'UPDATE sites SET name = ?, time_zone = ?, notes = ?, updated_at = ? WHERE id = ?')
    .run(input.name, input.timeZone, input.notes, now, id);
  if (r.changes === 0) throw notFound(`no site with id ${id}`, ['id']);
  return getSite(db, id)!;
}
