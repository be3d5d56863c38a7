/** spots: a measured object or place, with its geometry, default distance and route position. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Spot, SpotInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import type { Db } from '../db';
import { spotFromRow, type SpotRow } from '../../shared/spots';
import { areaSite } from './areas';

/** The site's route: areas in their order, spots by route position, then code. */
const ROUTE_ORDER = 'ORDER BY a.seq, s.route_position, lower(s.code), s.id';

export async function getSpot(db: Db, id: string): Promise<Spot | null> {
  const r = (await db.get('SELECT * FROM spots WHERE id = ?', id)) as SpotRow | undefined;
  return r ? spotFromRow(r) : null;
}

export async function listSiteSpots(db: Db, siteId: string): Promise<Spot[]> {
  return ((await db.all(`SELECT s.* FROM spots s JOIN areas a ON a.id = s.area_id WHERE s.site_id = ? ${ROUTE_ORDER}`, siteId)) as SpotRow[]).map(spotFromRow);
}

/** Ids of the site's spots that are not retired, in route order. */
export async function activeSpotIds(db: Db, siteId: string): Promise<string[]> {
  return ((await db.all(`SELECT s.id FROM spots s JOIN areas a ON a.id = s.area_id WHERE s.site_id = ? AND s.retired_at IS NULL ${ROUTE_ORDER}`, siteId)) as { id: string }[]).map((r) => r.id);
}

export async function spotSite(db: Db, id: string): Promise<string | null> {
  const r = (await db.get('SELECT site_id FROM spots WHERE id = ?', id)) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

async function checkCodeFree(db: Db, siteId: string, code: string, exceptId: string | null): Promise<void> {
  const r = (await db.get('SELECT id FROM spots WHERE site_id = ? AND lower(code) = lower(?) AND id IS DISTINCT FROM ?', siteId, code, exceptId));
  if (r) throw conflict(`another spot of this site already has the code ${code}`, ['code']);
}

export async function insertSpot(db: Db, input: SpotInput, now: string): Promise<Spot> {
  const siteId = (await areaSite(db, input.areaId));
  if (siteId === null) throw notFound(`no area with id ${input.areaId}`, ['areaId']);
  const id = input.id ?? newId();
  if (input.id && (await spotSite(db, id)) !== null) throw conflict(`a spot with id ${id} already exists`, ['id']);
  (await checkCodeFree(db, siteId, input.code, null));
  (await db.run(`INSERT INTO spots (id, site_id, area_id, name, code, object_kind, material_class, model, geometry,
              default_distance_value, default_distance_unit, distance_uncertainty_m, route_position, notes, created_at, updated_at)
            VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`, id, siteId, input.areaId, input.name, input.code, input.objectKind, input.materialClass, input.model,
      JSON.stringify(input.geometry), input.defaultDistance.value, input.defaultDistance.unit, input.distanceUncertaintyM,
      input.routePosition, input.notes, now, now));
  return (await getSpot(db, id))!;
}

export async function updateSpot(db: Db, id: string, input: SpotInput, now: string): Promise<Spot> {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const siteId = (await spotSite(db, id));
  if (siteId === null) throw notFound(`no spot with id ${id}`, ['id']);
  const newSite = (await areaSite(db, input.areaId));
  if (newSite === null) throw notFound(`no area with id ${input.areaId}`, ['areaId']);
  if (newSite !== siteId) throw invalid('a spot cannot move to an area of another site', ['areaId']);
  (await checkCodeFree(db, siteId, input.code, id));
  (await db.run(`UPDATE spots SET area_id = ?, name = ?, code = ?, object_kind = ?, material_class = ?, model = ?, geometry = ?,
              default_distance_value = ?, default_distance_unit = ?, distance_uncertainty_m = ?, route_position = ?, notes = ?,
              updated_at = ? WHERE id = ?`, input.areaId, input.name, input.code, input.objectKind, input.materialClass, input.model,
      JSON.stringify(input.geometry), input.defaultDistance.value, input.defaultDistance.unit, input.distanceUncertaintyM,
      input.routePosition, input.notes, now, id));
  return (await getSpot(db, id))!;
}

export async function retireSpot(db: Db, id: string, reason: string, now: string): Promise<Spot> {
  const spot = (await getSpot(db, id));
  if (!spot) throw notFound(`no spot with id ${id}`, ['id']);
  if (spot.retiredAt !== null) return spot;
  (await db.run('UPDATE spots SET retired_at = ?, retired_reason = ?, updated_at = ? WHERE id = ?', now, reason, now, id));
  return (await getSpot(db, id))!;
}

/**
 * Gives the listed spots route positions 0..n-1 in the given order; the area's other
 * spots follow in their previous order. Answers the area's active spots in route order.
 */
export async function setRouteOrder(db: Db, areaId: string, spotIds: string[], now: string): Promise<Spot[]> {
  if ((await areaSite(db, areaId)) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  const seen = new Set<string>();
  for (const [i, sid] of spotIds.entries()) {
    if (seen.has(sid)) throw invalid(`spot ${sid} appears twice`, ['spotIds', i]);
    seen.add(sid);
    const r = (await db.get('SELECT area_id FROM spots WHERE id = ?', sid)) as { area_id: string } | undefined;
    if (!r) throw notFound(`no spot with id ${sid}`, ['spotIds', i]);
    if (r.area_id !== areaId) throw invalid('this spot belongs to another area', ['spotIds', i]);
  }
  const rest = ((await db.all('SELECT id FROM spots WHERE area_id = ? ORDER BY route_position, lower(code), id', areaId)) as { id: string }[])
    .map((r) => r.id).filter((sid) => !seen.has(sid));
  const update = { run: (...a: unknown[]) => db.run('UPDATE spots SET route_position = ?, updated_at = ? WHERE id = ? AND route_position IS DISTINCT FROM ?', ...a) };
  for (const [pos, sid] of [...spotIds, ...rest].entries()) await update.run(pos, now, sid, pos);
  return ((await db.all('SELECT * FROM spots WHERE area_id = ? AND retired_at IS NULL ORDER BY route_position, lower(code), id', areaId)) as SpotRow[]).map(spotFromRow);
}
