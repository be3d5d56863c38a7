/**
 * Data in and out: every reading revision of a site for the CSV export, and the
 * whole-site JSON export and its import into another instance (ids, times and
 * history kept; content hashes and the derived field column recomputed).
 */
import type { ReadingInput, SiteExport, StoredReadingExport } from '../../../../core/schemas';
import { normalizeReading } from '../../../../core/units/field';
import { contentHash } from '../../canonical';
import { conflict } from '../../errors';
import type { ExportedReading } from '../../store';
import { DERIVE_VERSION } from '../../reading-entity';
import { stmt, type Db } from '../db';
import {
  collisionChecks, exportedReadingFromRow, historyOrder, iso, storedReadingFromRow, tombstonesOf, type FullRow,
} from '../../shared/exchange';
import { listAreas } from './areas';
import { exportSiteFollowUps } from './follow-ups';
import { listLimitSets } from './limit-sets';
import { listMeters } from './meters';
import { exportPlans } from './plans';
import { getSite } from './sites';
import { listSiteSpots } from './spots';

const FULL_SELECT = `SELECT r.*, (SELECT c.id FROM readings c WHERE c.supersedes_id = r.id) AS superseded_by_id,
    t.reason AS tombstone_reason, t.at AS tombstone_at, rd.surveyor, rd.rh_percent AS round_rh, m.serial AS meter_serial
  FROM spots s JOIN readings r ON r.spot_id = s.id
  JOIN rounds rd ON rd.id = r.round_id
  LEFT JOIN meters m ON m.id = r.meter_id
  LEFT JOIN reading_tombstones t ON t.reading_id = r.id`;

/** Every revision of the site's readings taken in [from, to), oldest first (superseded and deleted ones too). */
export function exportReadingRows(db: Db, siteId: string, fromMs: number | null, toMs: number | null): ExportedReading[] {
  const rows = stmt(db, `${FULL_SELECT} WHERE s.site_id = ? AND r.taken_at >= ? AND r.taken_at < ? ORDER BY r.taken_at, r.id`)
    .all(siteId, fromMs === null ? '' : iso(fromMs), toMs === null ? '9999' : iso(toMs)) as FullRow[];
  return rows.map(exportedReadingFromRow);
}

export function existingReadingIds(db: Db, ids: string[]): Set<string> {
  if (ids.length === 0) return new Set();
  const rows = stmt(db, 'SELECT id FROM readings WHERE id IN (SELECT value FROM json_each(?))').all(JSON.stringify(ids)) as { id: string }[];
  return new Set(rows.map((r) => r.id));
}

// ---------- whole-site JSON ----------

export function exportSite(db: Db, siteId: string, now: string): SiteExport | null {
  const site = getSite(db, siteId);
  if (!site) return null;
  const rounds = (stmt(db, 'SELECT * FROM rounds WHERE site_id = ? ORDER BY started_at, id').all(siteId) as
    { id: string; site_id: string; surveyor: string; started_at: string; ended_at: string | null; rh_percent: number | null; temperature_c: number | null; notes: string; planned_spot_ids: string; created_at: string }[])
    .map((r) => ({
      id: r.id, siteId: r.site_id, surveyor: r.surveyor, startedAt: r.started_at, endedAt: r.ended_at, rhPercent: r.rh_percent,
      temperatureC: r.temperature_c, notes: r.notes, plannedSpotIds: JSON.parse(r.planned_spot_ids) as string[], createdAt: r.created_at,
    }));
  const skips = (stmt(db, `SELECT k.* FROM round_skips k JOIN rounds r ON r.id = k.round_id WHERE r.site_id = ? ORDER BY k.at, k.id`).all(siteId) as
    { id: string; round_id: string; spot_id: string; reason: string; at: string; created_at: string }[])
    .map((k) => ({ id: k.id, roundId: k.round_id, spotId: k.spot_id, reason: k.reason, at: k.at, createdAt: k.created_at }));
  const rows = stmt(db, `${FULL_SELECT} WHERE s.site_id = ? ORDER BY r.taken_at, r.id`).all(siteId) as FullRow[];
  const readings: StoredReadingExport[] = rows.map(storedReadingFromRow);
  const tombstones = tombstonesOf(rows);
  const conflicts = (stmt(db, `SELECT c.* FROM reading_conflicts c JOIN readings r ON r.id = c.reading_id JOIN spots s ON s.id = r.spot_id
    WHERE s.site_id = ? ORDER BY c.received_at, c.id`).all(siteId) as { id: string; reading_id: string; payload: string; received_at: string }[])
    .map((c) => ({ id: c.id, readingId: c.reading_id, payload: JSON.parse(c.payload) as ReadingInput, receivedAt: c.received_at }));
  const { followUps, events } = exportSiteFollowUps(db, siteId);
  const { plans, positions } = exportPlans(db, siteId);
  return {
    format: 'chargewalk-site-export', version: 1, exportedAt: now, site,
    limitSets: listLimitSets(db, siteId), areas: listAreas(db, siteId), spots: listSiteSpots(db, siteId), meters: listMeters(db, siteId),
    rounds, skips, readings, tombstones, conflicts, followUps, followUpEvents: events,
    plans: plans.map(({ bytes, ...p }) => ({ ...p, base64: bytes.toString('base64') })),
    positions,
  };
}

/** Ids of the export that are already stored here, by table (the first few). */
function collisions(db: Db, data: SiteExport): string | null {
  const checks = collisionChecks(data);
  for (const [what, table, ids] of checks) {
    if (ids.length === 0) continue;
    const hit = db.prepare(`SELECT id FROM ${table} WHERE id IN (SELECT value FROM json_each(?)) LIMIT 1`).get(JSON.stringify(ids)) as { id: string } | undefined;
    if (hit) return `a ${what} with id ${hit.id} is already stored here`;
  }
  return null;
}

/** Inserts a checked export (call in a write transaction). Conflict when an id exists. */
export function importSite(db: Db, data: SiteExport): Record<string, number> {
  const clash = collisions(db, data);
  if (clash) {
    throw conflict(`${clash}: a site export goes into an instance that does not hold this site (an empty one, or another plant's)`,
      clash.startsWith('a site ') ? ['site', 'id'] : []);
  }
  const s = data.site;
  db.prepare('INSERT INTO sites (id, name, time_zone, notes, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)')
    .run(s.id, s.name, s.timeZone, s.notes, s.createdAt, s.updatedAt);
  const ls = db.prepare('INSERT INTO limit_sets (id, site_id, name, description, rules, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.limitSets) ls.run(x.id, s.id, x.name, x.description, JSON.stringify(x.rules), x.createdAt, x.updatedAt);
  const ar = db.prepare(`INSERT INTO areas (id, site_id, name, kind, zone, gas_group, substance_id, dust_mie_j, limit_set_id, notes, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.areas) ar.run(x.id, s.id, x.name, x.kind, x.zone, x.gasGroup, x.substanceId, x.dustMieJ, x.limitSetId, x.notes, x.createdAt, x.updatedAt);
  const sp = db.prepare(`INSERT INTO spots (id, site_id, area_id, name, code, object_kind, material_class, model, geometry, default_distance_value,
      default_distance_unit, distance_uncertainty_m, route_position, notes, retired_at, retired_reason, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.spots) {
    sp.run(x.id, s.id, x.areaId, x.name, x.code, x.objectKind, x.materialClass, x.model, JSON.stringify(x.geometry), x.defaultDistance.value,
      x.defaultDistance.unit, x.distanceUncertaintyM, x.routePosition, x.notes, x.retiredAt, x.retiredReason, x.createdAt, x.updatedAt);
  }
  const me = db.prepare(`INSERT INTO meters (id, site_id, serial, label, modes, calibrated_distance_m, accuracy_rel, geometry_factor, calibration_due,
      default_unit, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.meters) {
    me.run(x.id, s.id, x.serial, x.label, JSON.stringify(x.modes), x.calibratedDistanceM, x.accuracyRel, x.geometryFactor, x.calibrationDue,
      x.defaultUnit, x.createdAt, x.updatedAt);
  }
  const ro = db.prepare(`INSERT INTO rounds (id, site_id, surveyor, started_at, ended_at, rh_percent, temperature_c, notes, planned_spot_ids,
      content_hash, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.rounds) {
    const input = { id: x.id, siteId: s.id, surveyor: x.surveyor, startedAt: x.startedAt, rhPercent: x.rhPercent, temperatureC: x.temperatureC, notes: x.notes, plannedSpotIds: x.plannedSpotIds };
    ro.run(x.id, s.id, x.surveyor, x.startedAt, x.endedAt, x.rhPercent, x.temperatureC, x.notes, JSON.stringify(x.plannedSpotIds), contentHash(input), x.createdAt);
  }
  const sk = db.prepare('INSERT INTO round_skips (id, round_id, spot_id, reason, at, created_at) VALUES (?, ?, ?, ?, ?, ?)');
  for (const x of data.skips) sk.run(x.id, x.roundId, x.spotId, x.reason, x.at, x.createdAt);
  const re = db.prepare(`INSERT INTO readings (id, round_id, spot_id, meter_id, taken_at, received_at, value, unit, polarity, meter_range,
      distance_value, distance_unit, distance_uncertainty_m, side, ground_behind_value, ground_behind_unit, zeroed, rh_percent, temperature_c,
      process, note, meter_calibrated_distance_m, meter_calibration_due, supersedes_id, correction_reason, content_hash, field_v_per_m,
      derive_version, flags) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of historyOrder(data.readings)) {
    const { receivedAt, supersedesId, correctionReason, flags, meterCalibratedDistanceM, meterCalibrationDue, ...input } = x;
    const takenAt = new Date(input.takenAt).toISOString();
    const stored: ReadingInput = { ...input, takenAt };
    const field = normalizeReading({ value: input.value, unit: input.unit, polarity: input.polarity, calibratedDistanceM: meterCalibratedDistanceM });
    re.run(input.id, input.roundId, input.spotId, input.meterId, takenAt, receivedAt, input.value, input.unit, input.polarity, input.meterRange,
      input.distance.value, input.distance.unit, input.distanceUncertaintyM, input.side, input.groundBehind?.value ?? null,
      input.groundBehind?.unit ?? null, input.zeroed ? 1 : 0, input.rhPercent, input.temperatureC,
      input.process === null ? null : JSON.stringify(input.process), input.note, meterCalibratedDistanceM, meterCalibrationDue,
      supersedesId, correctionReason, contentHash(stored), Number.isFinite(field) ? field : 0, DERIVE_VERSION, JSON.stringify(flags));
  }
  const tb = db.prepare('INSERT INTO reading_tombstones (reading_id, reason, at) VALUES (?, ?, ?)');
  for (const x of data.tombstones) tb.run(x.readingId, x.reason, x.at);
  const co = db.prepare('INSERT INTO reading_conflicts (id, reading_id, payload, content_hash, received_at) VALUES (?, ?, ?, ?, ?)');
  for (const x of data.conflicts) co.run(x.id, x.readingId, JSON.stringify(x.payload), contentHash(x.payload), x.receivedAt);
  const fu = db.prepare(`INSERT INTO follow_ups (id, site_id, spot_id, opened_from_reading_id, finding_class, action, assignee, due_date, status,
      opened_by, closed_at, closed_by_reading_id, closed_reason, closed_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.followUps) {
    fu.run(x.id, s.id, x.spotId, x.openedFromReadingId, x.findingClass, x.action, x.assignee, x.dueDate, x.status, x.openedBy, x.closedAt,
      x.closedByReadingId, x.closedReason, x.closedBy, x.createdAt, x.updatedAt);
  }
  const ev = db.prepare('INSERT INTO follow_up_events (id, follow_up_id, kind, at, by, reading_id, reason, detail) VALUES (?, ?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.followUpEvents) ev.run(x.id, x.followUpId, x.kind, x.at, x.by, x.readingId, x.reason, JSON.stringify(x.detail));
  const pl = db.prepare('INSERT INTO area_plans (area_id, content_type, bytes, width, height, sha256, uploaded_at) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.plans) pl.run(x.areaId, x.contentType, Buffer.from(x.base64, 'base64'), x.width, x.height, x.sha256, x.uploadedAt);
  const po = db.prepare('INSERT INTO spot_positions (spot_id, area_id, x, y, updated_at) VALUES (?, ?, ?, ?, ?)');
  for (const x of data.positions) po.run(x.spotId, x.areaId, x.x, x.y, x.updatedAt);
  return {
    limitSets: data.limitSets.length, areas: data.areas.length, spots: data.spots.length, meters: data.meters.length,
    rounds: data.rounds.length, skips: data.skips.length, readings: data.readings.length, tombstones: data.tombstones.length,
    conflicts: data.conflicts.length, followUps: data.followUps.length, followUpEvents: data.followUpEvents.length,
    plans: data.plans.length, positions: data.positions.length,
  };
}
