/**
 * area_plans and spot_positions: an area's floor plan image (already checked or
 * sanitized by the route) and where its spots sit on it, as fractions 0..1.
 * A position counts only while the spot is still in the area it was placed in.
 */
import type { PlanInfo, SpotPosition } from '../../../../core/schemas';
import { notFound } from '../../errors';
import type { Db } from '../db';
import { infoFromRow, type PinData, type PlanRow, type PlanToStore } from '../../shared/plans';
export type { PinData, PlanToStore };
import { areaSite } from './areas';
import { listSpotReadings } from './readings';

const INFO = 'SELECT area_id, content_type, octet_length(bytes) AS size, width, height, sha256, uploaded_at FROM area_plans';

export async function getPlanInfo(db: Db, areaId: string): Promise<PlanInfo | null> {
  const r = (await db.get(`${INFO} WHERE area_id = ?`, areaId)) as PlanRow | undefined;
  return r ? infoFromRow(r) : null;
}

export async function getPlanBytes(db: Db, areaId: string): Promise<{ info: PlanInfo; bytes: Buffer } | null> {
  const info = (await getPlanInfo(db, areaId));
  if (!info) return null;
  const r = (await db.get('SELECT bytes FROM area_plans WHERE area_id = ?', areaId)) as { bytes: Buffer };
  return { info, bytes: r.bytes };
}

export async function putPlan(db: Db, areaId: string, plan: PlanToStore, now: string): Promise<PlanInfo> {
  if ((await areaSite(db, areaId)) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  (await db.run(`INSERT INTO area_plans (area_id, content_type, bytes, width, height, sha256, uploaded_at) VALUES (?, ?, ?, ?, ?, ?, ?)
    ON CONFLICT (area_id) DO UPDATE SET content_type = excluded.content_type, bytes = excluded.bytes, width = excluded.width,
      height = excluded.height, sha256 = excluded.sha256, uploaded_at = excluded.uploaded_at`, areaId, plan.contentType, plan.bytes, plan.width, plan.height, plan.sha256, now));
  return (await getPlanInfo(db, areaId))!;
}

/** True when a plan was removed. Spot positions stay (a new plan of the same floor keeps them). */
export async function deletePlan(db: Db, areaId: string): Promise<boolean> {
  if ((await areaSite(db, areaId)) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  return (await db.run('DELETE FROM area_plans WHERE area_id = ?', areaId)).changes > 0;
}

export async function getSpotPosition(db: Db, spotId: string): Promise<SpotPosition | null> {
  const r = (await db.get(`SELECT s.id AS spot_id, s.area_id, p.x, p.y FROM spots s
    LEFT JOIN spot_positions p ON p.spot_id = s.id AND p.area_id = s.area_id WHERE s.id = ?`, spotId)) as
    { spot_id: string; area_id: string; x: number | null; y: number | null } | undefined;
  if (!r) return null;
  return { spotId: r.spot_id, areaId: r.area_id, position: r.x === null || r.y === null ? null : { x: r.x, y: r.y } };
}

export async function setSpotPosition(db: Db, spotId: string, pos: { x: number; y: number } | null, now: string): Promise<SpotPosition> {
  const current = (await getSpotPosition(db, spotId));
  if (!current) throw notFound(`no spot with id ${spotId}`, ['id']);
  if (pos === null) {
    (await db.run('DELETE FROM spot_positions WHERE spot_id = ?', spotId));
  } else {
    (await db.run(`INSERT INTO spot_positions (spot_id, area_id, x, y, updated_at) VALUES (?, ?, ?, ?, ?)
      ON CONFLICT (spot_id) DO UPDATE SET area_id = excluded.area_id, x = excluded.x, y = excluded.y, updated_at = excluded.updated_at`, spotId, current.areaId, pos.x, pos.y, now));
  }
  return (await getSpotPosition(db, spotId))!;
}

/** The area's active spots in route order, each with its position and latest current reading (derived by core/). */
export async function areaPins(db: Db, areaId: string): Promise<PinData[]> {
  const rows = (await db.all(`SELECT s.id, s.code, s.name, p.x, p.y FROM spots s
    LEFT JOIN spot_positions p ON p.spot_id = s.id AND p.area_id = s.area_id
    WHERE s.area_id = ? AND s.retired_at IS NULL ORDER BY s.route_position, lower(s.code), s.id`, areaId)) as
    { id: string; code: string; name: string; x: number | null; y: number | null }[];
  const pins: PinData[] = [];
  for (const r of rows) {
    pins.push({
      spotId: r.id, code: r.code, name: r.name,
      position: r.x === null || r.y === null ? null : { x: r.x, y: r.y },
      latest: (await listSpotReadings(db, r.id, { history: false, limit: 1 }))[0] ?? null,
    });
  }
  return pins;
}

export interface PlanExport { areaId: string; contentType: PlanInfo['contentType']; width: number | null; height: number | null; sha256: string; uploadedAt: string; bytes: Buffer }

export async function exportPlans(db: Db, siteId: string): Promise<{ plans: PlanExport[]; positions: { spotId: string; areaId: string; x: number; y: number; updatedAt: string }[] }> {
  const plans = ((await db.all(`SELECT p.* FROM area_plans p JOIN areas a ON a.id = p.area_id WHERE a.site_id = ? ORDER BY a.seq`, siteId)) as
    { area_id: string; content_type: string; bytes: Buffer; width: number | null; height: number | null; sha256: string; uploaded_at: string }[])
    .map((r) => ({ areaId: r.area_id, contentType: r.content_type as PlanInfo['contentType'], width: r.width, height: r.height, sha256: r.sha256, uploadedAt: r.uploaded_at, bytes: r.bytes }));
  const positions = ((await db.all(`SELECT p.* FROM spot_positions p JOIN spots s ON s.id = p.spot_id WHERE s.site_id = ? ORDER BY s.seq`, siteId)) as
    { spot_id: string; area_id: string; x: number; y: number; updated_at: string }[])
    .map((r) => ({ spotId: r.spot_id, areaId: r.area_id, x: r.x, y: r.y, updatedAt: r.updated_at }));
  return { plans, positions };
}
