/** spots: a measured object or place, with its geometry, default distance and route position. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Spot, SpotInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { spotFromRow, type SpotRow } from '../../shared/spots';
import { areaSite } from './areas';

/** The site's route: areas in their order, spots by route position, then code. */
const ROUTE_ORDER = 'ORDER BY a.rowid, s.route_position, s.code, s.id';

export function getSpot(db: Db, id: string): Spot | null {
  const r = stmt(db, 'SELECT * FROM spots WHERE id = ?').get(id) as SpotRow | undefined;
  return r ? spotFromRow(r) : null;
}

export function listSiteSpots(db: Db, siteId: string): Spot[] {
  return (stmt(db, `SELECT s.* FROM spots s JOIN areas a ON a.id = s.area_id WHERE s.site_id = ? ${ROUTE_ORDER}`)
    .all(siteId) as SpotRow[]).map(spotFromRow);
}

/** Ids of the site's spots that are not retired, in route order. */
export function activeSpotIds(db: Db, siteId: string): string[] {
  return (stmt(db, `SELECT s.id FROM spots s JOIN areas a ON a.id = s.area_id WHERE s.site_id = ? AND s.retired_at IS NULL ${ROUTE_ORDER}`)
    .all(siteId) as { id: string }[]).map((r) => r.id);
}

export function spotSite(db: Db, id: string): string | null {
  const r = stmt(db, 'SELECT site_id FROM spots WHERE id = ?').get(id) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

function checkCodeFree(db: Db, siteId: string, code: string, exceptId: string | null): void {
  const r = stmt(db, 'SELECT id FROM spots WHERE site_id = ? AND code = ? AND id IS NOT ?').get(siteId, code, exceptId);
  if (r) throw conflict(`another spot of this site already has the code ${code}`, ['code']);
}

export function insertSpot(db: Db, input: SpotInput, now: string): Spot {
  const siteId = areaSite(db, input.areaId);
  if (siteId === null) throw notFound(`no area with id ${input.areaId}`, ['areaId']);
  const id = input.id ?? newId();
  if (input.id && spotSite(db, id) !== null) throw conflict(`a spot with id ${id} already exists`, ['id']);
  checkCodeFree(db, siteId, input.code, null);
  stmt(db, `INSERT INTO spots (id, site_id, area_id, name, code, object_kind, material_class, model, geometry,
              default_distance_value, default_distance_unit, distance_uncertainty_m, route_position, notes, created_at, updated_at)
            VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`)
    .run(id, siteId, input.areaId, input.name, input.code, input.objectKind, input.materialClass, input.model,
      JSON.stringify(input.geometry), input.defaultDistance.value, input.defaultDistance.unit, input.distanceUncertaintyM,
      input.routePosition, input.notes, now, now);
  return getSpot(db, id)!;
}

export function updateSpot(db: Db, id: string, input: SpotInput, now: string): Spot {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const siteId = spotSite(db, id);
  if (siteId === null) throw notFound(`no spot with id ${id}`, ['id']);
  const newSite = areaSite(db, input.areaId);
  if (newSite === null) throw notFound(`no area with id ${input.areaId}`, ['areaId']);
  if (newSite !== siteId) throw invalid('a spot cannot move to an area of another site', ['areaId']);
  checkCodeFree(db, siteId, input.code, id);
  stmt(db, `UPDATE spots SET area_id = ?, name = ?, code = ?, object_kind = ?, material_class = ?, model = ?, geometry = ?,
              default_distance_value = ?, default_distance_unit = ?, distance_uncertainty_m = ?, route_position = ?, notes = ?,
              updated_at = ? WHERE id = ?`)
    .run(input.areaId, input.name, input.code, input.objectKind, input.materialClass, input.model,
      JSON.stringify(input.geometry), input.defaultDistance.value, input.defaultDistance.unit, input.distanceUncertaintyM,
      input.routePosition, input.notes, now, id);
  return getSpot(db, id)!;
}

export function retireSpot(db: Db, id: string, reason: string, now: string): Spot {
  const spot = getSpot(db, id);
  if (!spot) throw notFound(`no spot with id ${id}`, ['id']);
  if (spot.retiredAt !== null) return spot;
  stmt(db, 'UPDATE spots SET retired_at = ?, retired_reason = ?, updated_at = ? WHERE id = ?').run(now, reason, now, id);
  return getSpot(db, id)!;
}

/**
 * Gives the listed spots route positions 0..n-1 in the given order; the area's other
 * spots follow in their previous order. Answers the area's active spots in route order.
 */
export function setRouteOrder(db: Db, areaId: string, spotIds: string[], now: string): Spot[] {
  if (areaSite(db, areaId) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  const seen = new Set<string>();
  spotIds.forEach((sid, i) => {
    if (seen.has(sid)) throw invalid(`spot ${sid} appears twice`, ['spotIds', i]);
    seen.add(sid);
    const r = stmt(db, 'SELECT area_id FROM spots WHERE id = ?').get(sid) as { area_id: string } | undefined;
    if (!r) throw notFound(`no spot with id ${sid}`, ['spotIds', i]);
    if (r.area_id !== areaId) throw invalid('this spot belongs to another area', ['spotIds', i]);
  });
  const rest = (stmt(db, 'SELECT id FROM spots WHERE area_id = ? ORDER BY route_position, code, id').all(areaId) as { id: string }[])
    .map((r) => r.id).filter((sid) => !seen.has(sid));
  const update = stmt(db, 'UPDATE spots SET route_position = ?, updated_at = ? WHERE id = ? AND route_position IS NOT ?');
  [...spotIds, ...rest].forEach((sid, pos) => update.run(pos, now, sid, pos));
  return (stmt(db, 'SELECT * FROM spots WHERE area_id = ? AND retired_at IS NULL ORDER BY route_position, code, id')
    .all(areaId) as SpotRow[]).map(spotFromRow);
}
