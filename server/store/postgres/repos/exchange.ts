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
import type { Db } from '../db';
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

/** A statement run many times (SQLite's prepared statement). */
function prep(db: Db, sql: string): { run: (...params: unknown[]) => Promise<{ changes: number }> } {
  return { run: (...params) => db.run(sql, ...params) };
}

const FULL_SELECT = `SELECT r.*, (SELECT c.id FROM readings c WHERE c.supersedes_id = r.id) AS superseded_by_id,
    t.reason AS tombstone_reason, t.at AS tombstone_at, rd.surveyor, rd.rh_percent AS round_rh, m.serial AS meter_serial
  FROM spots s JOIN readings r ON r.spot_id = s.id
  JOIN rounds rd ON rd.id = r.round_id
  LEFT JOIN meters m ON m.id = r.meter_id
  LEFT JOIN reading_tombstones t ON t.reading_id = r.id`;

/** Every revision of the site's readings taken in [from, to), oldest first (superseded and deleted ones too). */
export async function exportReadingRows(db: Db, siteId: string, fromMs: number | null, toMs: number | null): Promise<ExportedReading[]> {
  const rows = (await db.all(`${FULL_SELECT} WHERE s.site_id = ? AND r.taken_at >= ? AND r.taken_at < ? ORDER BY r.taken_at, r.id`, siteId, fromMs === null ? '' : iso(fromMs), toMs === null ? '9999' : iso(toMs))) as FullRow[];
  return rows.map(exportedReadingFromRow);
}

export async function existingReadingIds(db: Db, ids: string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = (await db.all('SELECT id FROM readings WHERE id IN (SELECT json_array_elements_text(?::json))', JSON.stringify(ids))) as { id: string }[];
  return new Set(rows.map((r) => r.id));
}

// ---------- whole-site JSON ----------

export async function exportSite(db: Db, siteId: string, now: string): Promise<SiteExport | null> {
  const site = (await getSite(db, siteId));
  if (!site) return null;
  const rounds = ((await db.all('SELECT * FROM rounds WHERE site_id = ? ORDER BY started_at, id', siteId)) as
    { id: string; site_id: string; surveyor: string; started_at: string; ended_at: string | null; rh_percent: number | null; temperature_c: number | null; notes: string; planned_spot_ids: string; created_at: string }[])
    .map((r) => ({
      id: r.id, siteId: r.site_id, surveyor: r.surveyor, startedAt: r.started_at, endedAt: r.ended_at, rhPercent: r.rh_percent,
      temperatureC: r.temperature_c, notes: r.notes, plannedSpotIds: JSON.parse(r.planned_spot_ids) as string[], createdAt: r.created_at,
    }));
  const skips = ((await db.all(`SELECT k.* FROM round_skips k JOIN rounds r ON r.id = k.round_id WHERE r.site_id = ? ORDER BY k.at, k.id`, siteId)) as
    { id: string; round_id: string; spot_id: string; reason: string; at: string; created_at: string }[])
    .map((k) => ({ id: k.id, roundId: k.round_id, spotId: k.spot_id, reason: k.reason, at: k.at, createdAt: k.created_at }));
  const rows = (await db.all(`${FULL_SELECT} WHERE s.site_id = ? ORDER BY r.taken_at, r.id`, siteId)) as FullRow[];
  const readings: StoredReadingExport[] = rows.map(storedReadingFromRow);
  const tombstones = tombstonesOf(rows);
  const conflicts = ((await db.all(`SELECT c.* FROM reading_conflicts c JOIN readings r ON r.id = c.reading_id JOIN spots s ON s.id = r.spot_id
    WHERE s.site_id = ? ORDER BY c.received_at, c.id`, siteId)) as { id: string; reading_id: string; payload: string; received_at: string }[])
    .map((c) => ({ id: c.id, readingId: c.reading_id, payload: JSON.parse(c.payload) as ReadingInput, receivedAt: c.received_at }));
  const { followUps, events } = (await exportSiteFollowUps(db, siteId));
  const { plans, positions } = (await exportPlans(db, siteId));
  return {
    format: 'chargewalk-site-export', version: 1, exportedAt: now, site,
    limitSets: (await listLimitSets(db, siteId)), areas: (await listAreas(db, siteId)), spots: (await listSiteSpots(db, siteId)), meters: (await listMeters(db, siteId)),
    rounds, skips, readings, tombstones, conflicts, followUps, followUpEvents: events,
    plans: plans.map(({ bytes, ...p }) => ({ ...p, base64: bytes.toString('base64') })),
    positions,
  };
}

/** Ids of the export that are already stored here, by table (the first few). */
async function collisions(db: Db, data: SiteExport): Promise<string | null> {
  const checks = collisionChecks(data);
  for (const [what, table, ids] of checks) {
    if (ids.length === 0) continue;
    const hit = await db.get(`SELECT id FROM ${table} WHERE id IN (SELECT json_array_elements_text(?::json)) LIMIT 1`, JSON.stringify(ids)) as { id: string } | undefined;
    if (hit) return `a ${what} with id ${hit.id} is already stored here`;
  }
  return null;
}

/** Inserts a checked export (call in a write transaction). Conflict when an id exists. */
export async function importSite(db: Db, data: SiteExport): Promise<Record<string, number>> {
  const clash = (await collisions(db, data));
  if (clash) {
    throw conflict(`${clash}: a site export goes into an instance that does not hold this site (an empty one, or another plant's)`,
      clash.startsWith('a site ') ? ['site', 'id'] : []);
  }
  const s = data.site;
  await db.run('INSERT INTO sites (id, name, time_zone, notes, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?)',
    s.id, s.name, s.timeZone, s.notes, s.createdAt, s.updatedAt);
  const ls = prep(db, 'INSERT INTO limit_sets (id, site_id, name, description, rules, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.limitSets) await ls.run(x.id, s.id, x.name, x.description, JSON.stringify(x.rules), x.createdAt, x.updatedAt);
  const ar = prep(db, `INSERT INTO areas (id, site_id, name, kind, zone, gas_group, substance_id, dust_mie_j, limit_set_id, notes, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.areas) await ar.run(x.id, s.id, x.name, x.kind, x.zone, x.gasGroup, x.substanceId, x.dustMieJ, x.limitSetId, x.notes, x.createdAt, x.updatedAt);
  const sp = prep(db, `INSERT INTO spots (id, site_id, area_id, name, code, object_kind, material_class, model, geometry, default_distance_value,
      default_distance_unit, distance_uncertainty_m, route_position, notes, retired_at, retired_reason, created_at, updated_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.spots) {
    await sp.run(x.id, s.id, x.areaId, x.name, x.code, x.objectKind, x.materialClass, x.model, JSON.stringify(x.geometry), x.defaultDistance.value,
      x.defaultDistance.unit, x.distanceUncertaintyM, x.routePosition, x.notes, x.retiredAt, x.retiredReason, x.createdAt, x.updatedAt);
  }
  const me = prep(db, `INSERT INTO meters (id, site_id, serial, label, modes, calibrated_distance_m, accuracy_rel, geometry_factor, calibration_due,
      default_unit, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.meters) {
    await me.run(x.id, s.id, x.serial, x.label, JSON.stringify(x.modes), x.calibratedDistanceM, x.accuracyRel, x.geometryFactor, x.calibrationDue,
      x.defaultUnit, x.createdAt, x.updatedAt);
  }
  const ro = prep(db, `INSERT INTO rounds (id, site_id, surveyor, started_at, ended_at, rh_percent, temperature_c, notes, planned_spot_ids,
      content_hash, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.rounds) {
    const input = { id: x.id, siteId: s.id, surveyor: x.surveyor, startedAt: x.startedAt, rhPercent: x.rhPercent, temperatureC: x.temperatureC, notes: x.notes, plannedSpotIds: x.plannedSpotIds };
    await ro.run(x.id, s.id, x.surveyor, x.startedAt, x.endedAt, x.rhPercent, x.temperatureC, x.notes, JSON.stringify(x.plannedSpotIds), contentHash(input), x.createdAt);
  }
  const sk = prep(db, 'INSERT INTO round_skips (id, round_id, spot_id, reason, at, created_at) VALUES (?, ?, ?, ?, ?, ?)');
  for (const x of data.skips) await sk.run(x.id, x.roundId, x.spotId, x.reason, x.at, x.createdAt);
  const re = prep(db, `INSERT INTO readings (id, round_id, spot_id, meter_id, taken_at, received_at, value, unit, polarity, meter_range,
      distance_value, distance_unit, distance_uncertainty_m, side, ground_behind_value, ground_behind_unit, zeroed, rh_percent, temperature_c,
      process, note, meter_calibrated_distance_m, meter_calibration_due, supersedes_id, correction_reason, content_hash, field_v_per_m,
      derive_version, flags) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of historyOrder(data.readings)) {
    const { receivedAt, supersedesId, correctionReason, flags, meterCalibratedDistanceM, meterCalibrationDue, ...input } = x;
    const takenAt = new Date(input.takenAt).toISOString();
    const stored: ReadingInput = { ...input, takenAt };
    const field = normalizeReading({ value: input.value, unit: input.unit, polarity: input.polarity, calibratedDistanceM: meterCalibratedDistanceM });
    await re.run(input.id, input.roundId, input.spotId, input.meterId, takenAt, receivedAt, input.value, input.unit, input.polarity, input.meterRange,
      input.distance.value, input.distance.unit, input.distanceUncertaintyM, input.side, input.groundBehind?.value ?? null,
      input.groundBehind?.unit ?? null, input.zeroed ? 1 : 0, input.rhPercent, input.temperatureC,
      input.process === null ? null : JSON.stringify(input.process), input.note, meterCalibratedDistanceM, meterCalibrationDue,
      supersedesId, correctionReason, contentHash(stored), Number.isFinite(field) ? field : 0, DERIVE_VERSION, JSON.stringify(flags));
  }
  const tb = prep(db, 'INSERT INTO reading_tombstones (reading_id, reason, at) VALUES (?, ?, ?)');
  for (const x of data.tombstones) await tb.run(x.readingId, x.reason, x.at);
  const co = prep(db, 'INSERT INTO reading_conflicts (id, reading_id, payload, content_hash, received_at) VALUES (?, ?, ?, ?, ?)');
  for (const x of data.conflicts) await co.run(x.id, x.readingId, JSON.stringify(x.payload), contentHash(x.payload), x.receivedAt);
  const fu = prep(db, `INSERT INTO follow_ups (id, site_id, spot_id, opened_from_reading_id, finding_class, action, assignee, due_date, status,
      opened_by, closed_at, closed_by_reading_id, closed_reason, closed_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`);
  for (const x of data.followUps) {
    await fu.run(x.id, s.id, x.spotId, x.openedFromReadingId, x.findingClass, x.action, x.assignee, x.dueDate, x.status, x.openedBy, x.closedAt,
      x.closedByReadingId, x.closedReason, x.closedBy, x.createdAt, x.updatedAt);
  }
  const ev = prep(db, 'INSERT INTO follow_up_events (id, follow_up_id, kind, at, "by", reading_id, reason, detail) VALUES (?, ?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.followUpEvents) await ev.run(x.id, x.followUpId, x.kind, x.at, x.by, x.readingId, x.reason, JSON.stringify(x.detail));
  const pl = prep(db, 'INSERT INTO area_plans (area_id, content_type, bytes, width, height, sha256, uploaded_at) VALUES (?, ?, ?, ?, ?, ?, ?)');
  for (const x of data.plans) await pl.run(x.areaId, x.contentType, Buffer.from(x.base64, 'base64'), x.width, x.height, x.sha256, x.uploadedAt);
  const po = prep(db, 'INSERT INTO spot_positions (spot_id, area_id, x, y, updated_at) VALUES (?, ?, ?, ?, ?)');
  for (const x of data.positions) await po.run(x.spotId, x.areaId, x.x, x.y, x.updatedAt);
  return {
    limitSets: data.limitSets.length, areas: data.areas.length, spots: data.spots.length, meters: data.meters.length,
    rounds: data.rounds.length, skips: data.skips.length, readings: data.readings.length, tombstones: data.tombstones.length,
    conflicts: data.conflicts.length, followUps: data.followUps.length, followUpEvents: data.followUpEvents.length,
    plans: data.plans.length, positions: data.positions.length,
  };
}
