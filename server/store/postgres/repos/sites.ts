/** sites: one plant or building with its time zone. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Site, SiteInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import type { Db } from '../db';
import { siteFromRow, type SiteRow } from '../../shared/sites';

export async function getSite(db: Db, id: string): Promise<Site | null> {
  const r = (await db.get('SELECT * FROM sites WHERE id = ?', id)) as SiteRow | undefined;
  return r ? siteFromRow(r) : null;
}

export async function listSites(db: Db): Promise<Site[]> {
  return ((await db.all('SELECT * FROM sites ORDER BY name, id')) as SiteRow[]).map(siteFromRow);
}

export async function siteExists(db: Db, id: string): Promise<boolean> {
  return (await db.get('SELECT 1 FROM sites WHERE id = ?', id)) !== undefined;
}

/** Throws not-found naming `path` when the site does not exist. */
export async function requireSite(db: Db, id: string, path: (string | number)[] = ['siteId']): Promise<void> {
  if (!(await siteExists(db, id))) throw notFound(`no site with id ${id}`, path);
}

export async function insertSite(db: Db, input: SiteInput, now: string): Promise<Site> {
  const id = input.id ?? newId();
  if (input.id && (await siteExists(db, id))) throw conflict(`a site with id ${id} already exists`, ['id']);
  (await db.run(`INSERT INTO sites (id, name, time_zone, notes, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)`, id, input.name, input.timeZone, input.notes, now, now));
  return (await getSite(db, id))!;
}

export async function updateSite(db: Db, id: string, input: SiteInput, now: string): Promise<Site> {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const r = (await db.run('UPDATE sites SET name = ?, time_zone = ?, notes = ?, updated_at = ? WHERE id = ?', input.name, input.timeZone, input.notes, now, id));
  if (r.changes === 0) throw notFound(`no site with id ${id}`, ['id']);
  return (await getSite(db, id))!;
}
