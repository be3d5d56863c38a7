/** areas: an EPA, a hazardous zone (zone, gas group or dust) or a general area, with its limit set. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Area, AreaInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { areaFromRow, type AreaRow } from '../../shared/areas';
import { limitSetSite } from './limit-sets';
import { requireSite } from './sites';

export function getArea(db: Db, id: string): Area | null {
  const r = stmt(db, 'SELECT * FROM areas WHERE id = ?').get(id) as AreaRow | undefined;
  return r ? areaFromRow(r) : null;
}

/** In the order they were created (the order of the site's route through its areas). */
export function listAreas(db: Db, siteId: string): Area[] {
  return (stmt(db, 'SELECT * FROM areas WHERE site_id = ? ORDER BY rowid').all(siteId) as AreaRow[]).map(areaFromRow);
}

export function areaSite(db: Db, id: string): string | null {
  const r = stmt(db, 'SELECT site_id FROM areas WHERE id = ?').get(id) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

function checkLimitSet(db: Db, input: AreaInput): void {
  if (input.limitSetId === null) return;
  const site = limitSetSite(db, input.limitSetId);
  if (site === null) throw notFound(`no limit set with id ${input.limitSetId}`, ['limitSetId']);
  if (site !== input.siteId) throw invalid('the limit set belongs to another site', ['limitSetId']);
}

export function insertArea(db: Db, input: AreaInput, now: string): Area {
  requireSite(db, input.siteId);
  checkLimitSet(db, input);
  const id = input.id ?? newId();
  if (input.id && areaSite(db, id) !== null) throw conflict(`an area with id ${id} already exists`, ['id']);
  stmt(db, `INSERT INTO areas (id, site_id, name, kind, zone, gas_group, substance_id, dust_mie_j, limit_set_id, notes, created_at, updated_at)
            VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`)
    .run(id, input.siteId, input.name, input.kind, input.zone, input.gasGroup, input.substanceId, input.dustMieJ,
      input.limitSetId, input.notes, now, now);
  return getArea(db, id)!;
}

export function updateArea(db: Db, id: string, input: AreaInput, now: string): Area {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const site = areaSite(db, id);
  if (site === null) throw notFound(`no area with id ${id}`, ['id']);
  if (site !== input.siteId) throw invalid('an area cannot move to another site', ['siteId']);
  checkLimitSet(db, input);
  stmt(db, `UPDATE areas SET name = ?, kind = ?, zone = ?, gas_group = ?, substance_id = ?, dust_mie_j = ?, limit_set_id = ?,
            notes = ?, updated_at = ? WHERE id = ?`)
    .run(input.name, input.kind, input.zone, input.gasGroup, input.substanceId, input.dustMieJ, input.limitSetId,
      input.notes, now, id);
  return getArea(db, id)!;
}
