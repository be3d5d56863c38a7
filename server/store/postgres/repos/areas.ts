/** areas: an EPA, a hazardous zone (zone, gas group or dust) or a general area, with its limit set. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Area, AreaInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import type { Db } from '../db';
import { areaFromRow, type AreaRow } from '../../shared/areas';
import { limitSetSite } from './limit-sets';
import { requireSite } from './sites';

export async function getArea(db: Db, id: string): Promise<Area | null> {
  const r = (await db.get('SELECT * FROM areas WHERE id = ?', id)) as AreaRow | undefined;
  return r ? areaFromRow(r) : null;
}

/** In the order they were created (the order of the site's route through its areas). */
export async function listAreas(db: Db, siteId: string): Promise<Area[]> {
  return ((await db.all('SELECT * FROM areas WHERE site_id = ? ORDER BY seq', siteId)) as AreaRow[]).map(areaFromRow);
}

export async function areaSite(db: Db, id: string): Promise<string | null> {
  const r = (await db.get('SELECT site_id FROM areas WHERE id = ?', id)) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

async function checkLimitSet(db: Db, input: AreaInput): Promise<void> {
  if (input.limitSetId === null) return;
  const site = (await limitSetSite(db, input.limitSetId));
  if (site === null) throw notFound(`no limit set with id ${input.limitSetId}`, ['limitSetId']);
  if (site !== input.siteId) throw invalid('the limit set belongs to another site', ['limitSetId']);
}

export async function insertArea(db: Db, input: AreaInput, now: string): Promise<Area> {
  (await requireSite(db, input.siteId));
  (await checkLimitSet(db, input));
  const id = input.id ?? newId();
  if (input.id && (await areaSite(db, id)) !== null) throw conflict(`an area with id ${id} already exists`, ['id']);
  (await db.run(`INSERT INTO areas (id, site_id, name, kind, zone, gas_group, substance_id, dust_mie_j, limit_set_id, notes, created_at, updated_at)
            VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`, id, input.siteId, input.name, input.kind, input.zone, input.gasGroup, input.substanceId, input.dustMieJ,
      input.limitSetId, input.notes, now, now));
  return (await getArea(db, id))!;
}

export async function updateArea(db: Db, id: string, input: AreaInput, now: string): Promise<Area> {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const site = (await areaSite(db, id));
  if (site === null) throw notFound(`no area with id ${id}`, ['id']);
  if (site !== input.siteId) throw invalid('an area cannot move to another site', ['siteId']);
  (await checkLimitSet(db, input));
  (await db.run(`UPDATE areas SET name = ?, kind = ?, zone = ?, gas_group = ?, substance_id = ?, dust_mie_j = ?, limit_set_id = ?,
            notes = ?, updated_at = ? WHERE id = ?`, input.name, input.kind, input.zone, input.gasGroup, input.substanceId, input.dustMieJ, input.limitSetId,
      input.notes, now, id));
  return (await getArea(db, id))!;
}
