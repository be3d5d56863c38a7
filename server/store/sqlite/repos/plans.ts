/**
 * area_plans and spot_positions: an area's floor plan image (already checked or
 * sanitized by the route) and where its spots sit on it, as fractions 0..1.
 * A position counts only while the spot is still in the area it was placed in.
 */
import type { PlanInfo, SpotPosition } from '../../../../core/schemas';
import { notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { infoFromRow, type PinData, type PlanRow, type PlanToStore } from '../../shared/plans';
export type { PinData, PlanToStore };
import { areaSite } from './areas';
import { listSpotReadings } from './readings';

const INFO = 'SELECT area_id, content_type, length(bytes) AS size, width, height, sha256, uploaded_at FROM area_plans';

export function getPlanInfo(db: Db, areaId: string): PlanInfo | null {
  const r = stmt(db, `${INFO} WHERE area_id = ?`).get(areaId) as PlanRow | undefined;
  return r ? infoFromRow(r) : null;
}

export function getPlanBytes(db: Db, areaId: string): { info: PlanInfo; bytes: Buffer } | null {
  const info = getPlanInfo(db, areaId);
  if (!info) return null;
  const r = stmt(db, 'SELECT bytes FROM area_plans WHERE area_id = ?').get(areaId) as { bytes: Buffer };
  return { info, bytes: r.bytes };
}

export function putPlan(db: Db, areaId: string, plan: PlanToStore, now: string): PlanInfo {
  if (areaSite(db, areaId) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  stmt(db, `INSERT INTO area_plans (area_id, content_type, bytes, width, height, sha256, uploaded_at) VALUES (?, ?, ?, ?, ?, ?, ?)
    ON CONFLICT (area_id) DO UPDATE SET content_type = excluded.content_type, bytes = excluded.bytes, width = excluded.width,
      height = excluded.height, sha256 = excluded.sha256, uploaded_at = excluded.uploaded_at`)
    .run(areaId, plan.contentType, plan.bytes, plan.width, plan.height, plan.sha256, now);
  return getPlanInfo(db, areaId)!;
}

/** True when a plan was removed. Spot positions stay (a new plan of the same floor keeps them). */
export function deletePlan(db: Db, areaId: string): boolean {
  if (areaSite(db, areaId) === null) throw notFound(`no area with id ${areaId}`, ['id']);
  return stmt(db, 'DELETE FROM area_plans WHERE area_id = ?').run(areaId).changes > 0;
}

export function getSpotPosition(db: Db, spotId: string): SpotPosition | null {
  const r = stmt(db, `SELECT s.id AS spot_id, s.area_id, p.x, p.y FROM spots s
    LEFT JOIN spot_positions p ON p.spot_id = s.id AND p.area_id = s.area_id WHERE s.id = ?`).get(spotId) as
    { spot_id: string; area_id: string; x: number | null; y: number | null } | undefined;
  if (!r) return null;
  return { spotId: r.spot_id, areaId: r.area_id, position: r.x === null || r.y === null ? null : { x: r.x, y: r.y } };
}

export function setSpotPosition(db: Db, spotId: string, pos: { x: number; y: number } | null, now: string): SpotPosition {
  const current = getSpotPosition(db, spotId);
  if (!current) throw notFound(`no spot with id ${spotId}`, ['id']);
  if (pos === null) {
    stmt(db, 'DELETE FROM spot_positions WHERE spot_id = ?').run(spotId);
  } else {
    stmt(db, `INSERT INTO spot_positions (spot_id, area_id, x, y, updated_at) VALUES (?, ?, ?, ?, ?)
      ON CONFLICT (spot_id) DO UPDATE SET area_id = excluded.area_id, x = excluded.x, y = excluded.y, updated_at = excluded.updated_at`)
      .run(spotId, current.areaId, pos.x, pos.y, now);
  }
  return getSpotPosition(db, spotId)!;
}

/** The area's active spots in route order, each with its position and latest current reading (derived by core/). */
export function areaPins(db: Db, areaId: string): PinData[] {
  const rows = stmt(db, `SELECT s.id, s.code, s.name, p.x, p.y FROM spots s
    LEFT JOIN spot_positions p ON p.spot_id = s.id AND p.area_id = s.area_id
    WHERE s.area_id = ? AND s.retired_at IS NULL ORDER BY s.route_position, s.code, s.id`).all(areaId) as
    { id: string; code: string; name: string; x: number | null; y: number | null }[];
  return rows.map((r) => ({
    spotId: r.id, code: r.code, name: r.name,
    position: r.x === null || r.y === null ? null : { x: r.x, y: r.y },
    latest: listSpotReadings(db, r.id, { history: false, limit: 1 })[0] ?? null,
  }));
}

export interface PlanExport { areaId: string; contentType: PlanInfo['contentType']; width: number | null; height: number | null; sha256: string; uploadedAt: string; bytes: Buffer }

export function exportPlans(db: Db, siteId: string): { plans: PlanExport[]; positions: { spotId: string; areaId: string; x: number; y: number; updatedAt: string }[] } {
  const plans = (stmt(db, `SELECT p.* FROM area_plans p JOIN areas a ON a.id = p.area_id WHERE a.site_id = ? ORDER BY a.rowid`).all(siteId) as
    { area_id: string; content_type: string; bytes: Buffer; width: number | null; height: number | null; sha256: string; uploaded_at: string }[])
    .map((r) => ({ areaId: r.area_id, contentType: r.content_type as PlanInfo['contentType'], width: r.width, height: r.height, sha256: r.sha256, uploadedAt: r.uploaded_at, bytes: r.bytes }));
  const positions = (stmt(db, `SELECT p.* FROM spot_positions p JOIN spots s ON s.id = p.spot_id WHERE s.site_id = ? ORDER BY s.rowid`).all(siteId) as
    { spot_id: string; area_id: string; x: number; y: number; updated_at: string }[])
    .map((r) => ({ spotId: r.spot_id, areaId: r.area_id, x: r.x, y: r.y, updatedAt: r.updated_at }));
  return { plans, positions };
}
