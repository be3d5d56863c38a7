/**
 * readings, reading_tombstones, reading_conflicts: the append-only log of field
 * readings. A correction is a new row whose supersedes_id names the revision it
 * replaces; the current revision is the one no other row supersedes; a delete is
 * a tombstone row. Nothing here ever UPDATEs or DELETEs a reading (triggers refuse).
 *
 * Rows map to the Reading entity in one place (rowToStored + toReadingEntity), with
 * derived values recomputed by core/ from the stored inputs.
 */
import { newId } from '../../../../core/ids/uuidv7';
import type { LimitRule } from '../../../../core/limits/evaluate';
import { deriveReading } from '../../../../core/readings/derive';
import type { CorrectionInput, Reading, ReadingAck, ReadingConflict, ReadingInput } from '../../../../core/schemas';
import { isSurfaceVoltageUnit } from '../../../../core/units/field';
import { contentHash } from '../../canonical';
import { conflict, invalid, notFound } from '../../errors';
import { DERIVE_VERSION, type ReadingFlag } from '../../reading-entity';
import { stmt, type Db } from '../db';
import { normalizeInput, readingPart, toEntities, type ReadingRow } from '../../shared/readings';
import { parseRules } from './limit-sets';

/** A reading with what its derived values need: the spot (material, model, geometry), its area (kind, limit rules) and the meter. */
const READING_COLUMNS = `
  SELECT r.*,
    (SELECT c.id FROM readings c WHERE c.supersedes_id = r.id) AS superseded_by_id,
    t.reason AS tombstone_reason, t.at AS tombstone_at,
    s.material_class AS spot_material_class, ls.rules AS limit_rules,
    s.model AS spot_model, s.geometry AS spot_geometry, s.distance_uncertainty_m AS spot_distance_uncertainty_m,
    a.kind AS area_kind, a.zone AS area_zone, a.gas_group AS area_gas_group, a.substance_id AS area_substance_id,
    a.dust_mie_j AS area_dust_mie_j, m.accuracy_rel AS meter_accuracy_rel, m.geometry_factor AS meter_geometry_factor`;
const READING_JOINS = `
  JOIN spots s ON s.id = r.spot_id
  JOIN areas a ON a.id = s.area_id
  LEFT JOIN limit_sets ls ON ls.id = a.limit_set_id
  LEFT JOIN meters m ON m.id = r.meter_id
  LEFT JOIN reading_tombstones t ON t.reading_id = r.id`;
const SELECT_READING = `${READING_COLUMNS} FROM readings r ${READING_JOINS}`;

const CURRENT = 'NOT EXISTS (SELECT 1 FROM readings c WHERE c.supersedes_id = r.id)';
const NOT_DELETED = 't.reading_id IS NULL';

export function getReadingEntity(db: Db, id: string): Reading | null {
  const r = stmt(db, `${SELECT_READING} WHERE r.id = ?`).get(id) as ReadingRow | undefined;
  return r ? toEntities([r])[0]! : null;
}

export function getReadingsByIds(db: Db, ids: string[]): Map<string, Reading> {
  if (ids.length === 0) return new Map();
  const rows = stmt(db, `${SELECT_READING} WHERE r.id IN (SELECT value FROM json_each(?))`).all(JSON.stringify(ids)) as ReadingRow[];
  const entities = toEntities(rows);
  return new Map(entities.map((e) => [e.id, e]));
}

/** Every revision of the reading `id` belongs to, oldest first. */
export function readingHistory(db: Db, id: string): Reading[] {
  const rows = stmt(db, `
    WITH RECURSIVE
      back(id, sup) AS (
        SELECT id, supersedes_id FROM readings WHERE id = ?
        UNION ALL SELECT r.id, r.supersedes_id FROM readings r JOIN back ON r.id = back.sup),
      origin(id) AS (SELECT id FROM back WHERE sup IS NULL),
      fwd(id, depth) AS (
        SELECT id, 0 FROM origin
        UNION ALL SELECT r.id, fwd.depth + 1 FROM readings r JOIN fwd ON r.supersedes_id = fwd.id)
    ${READING_COLUMNS} FROM fwd JOIN readings r ON r.id = fwd.id ${READING_JOINS}
    ORDER BY fwd.depth`).all(id) as ReadingRow[];
  return toEntities(rows);
}

export function listSpotReadings(db: Db, spotId: string, opts: { history: boolean; limit: number }): Reading[] {
  const where = opts.history ? 'r.spot_id = ?' : `r.spot_id = ? AND ${CURRENT} AND ${NOT_DELETED}`;
  const rows = stmt(db, `${SELECT_READING} WHERE ${where} ORDER BY r.taken_at DESC, r.id DESC LIMIT ?`)
    .all(spotId, opts.limit) as ReadingRow[];
  return toEntities(rows);
}

export function listRoundReadings(db: Db, roundId: string): Reading[] {
  const rows = stmt(db, `${SELECT_READING} WHERE r.round_id = ? AND ${CURRENT} AND ${NOT_DELETED} ORDER BY r.taken_at, r.id`)
    .all(roundId) as ReadingRow[];
  return toEntities(rows);
}

// ---------- writing ----------

interface RoundRef { site_id: string }
interface SpotRef { site_id: string; code: string; name: string; retired_at: string | null; retired_reason: string | null; material_class: string; rules: string | null }
interface MeterRef { site_id: string; serial: string; calibrated_distance_m: number | null; calibration_due: string }

/** Look-ups of the set-up a batch refers to, cached for the length of one transaction. */
class RefCache {
  private rounds = new Map<string, RoundRef | undefined>();
  private spots = new Map<string, SpotRef | undefined>();
  private meters = new Map<string, MeterRef | undefined>();
  private rules = new Map<string | null, LimitRule[]>();

  constructor(private readonly db: Db) {}

  round(id: string): RoundRef | undefined {
    if (!this.rounds.has(id)) this.rounds.set(id, stmt(this.db, 'SELECT site_id FROM rounds WHERE id = ?').get(id) as RoundRef | undefined);
    return this.rounds.get(id);
  }

  spot(id: string): SpotRef | undefined {
    if (!this.spots.has(id)) {
      this.spots.set(id, stmt(this.db, `
        SELECT s.site_id, s.code, s.name, s.retired_at, s.retired_reason, s.material_class, ls.rules
        FROM spots s JOIN areas a ON a.id = s.area_id LEFT JOIN limit_sets ls ON ls.id = a.limit_set_id
        WHERE s.id = ?`).get(id) as SpotRef | undefined);
    }
    return this.spots.get(id);
  }

  meter(id: string): MeterRef | undefined {
    if (!this.meters.has(id)) {
      this.meters.set(id, stmt(this.db, 'SELECT site_id, serial, calibrated_distance_m, calibration_due FROM meters WHERE id = ?')
        .get(id) as MeterRef | undefined);
    }
    return this.meters.get(id);
  }

  rulesOf(json: string | null): LimitRule[] {
    let r = this.rules.get(json);
    if (!r) {
      r = parseRules(json);
      this.rules.set(json, r);
    }
    return r;
  }
}

function existingHash(db: Db, id: string): { content_hash: string; supersedes_id: string | null; correction_reason: string | null } | undefined {
  return stmt(db, 'SELECT content_hash, supersedes_id, correction_reason FROM readings WHERE id = ?').get(id) as
    { content_hash: string; supersedes_id: string | null; correction_reason: string | null } | undefined;
}

/**
 * Checks the set-up a reading refers to and inserts it. Field paths start with `at`
 * (e.g. [3] for the fourth reading of a batch, [] for a single one).
 */
function insertChecked(
  db: Db, refs: RefCache, input: ReadingInput, hash: string, at: (string | number)[],
  opts: { receivedAt: string; supersedesId?: string; correctionReason?: string },
): void {
  const round = refs.round(input.roundId);
  if (!round) throw notFound(`no round with id ${input.roundId}: send the round before its readings`, [...at, 'roundId']);
  const spot = refs.spot(input.spotId);
  if (!spot) throw notFound(`no spot with id ${input.spotId}`, [...at, 'spotId']);
  const meter = refs.meter(input.meterId);
  if (!meter) throw notFound(`no meter with id ${input.meterId}`, [...at, 'meterId']);
  if (spot.site_id !== round.site_id) throw invalid('the spot belongs to another site than the round', [...at, 'spotId']);
  if (meter.site_id !== round.site_id) throw invalid('the meter belongs to another site than the round', [...at, 'meterId']);
  if (isSurfaceVoltageUnit(input.unit) && !(meter.calibrated_distance_m !== null && meter.calibrated_distance_m > 0)) {
    throw invalid(`meter ${meter.serial} has no calibrated distance, so a surface-voltage reading (${input.unit}) cannot be converted to a field: enter the field unit the meter shows, or set the meter's calibrated distance`, [...at, 'unit']);
  }
  const flags: ReadingFlag[] = [];
  if (spot.retired_at !== null) {
    flags.push({
      code: 'spot-retired',
      message: `spot ${spot.code} (${spot.name}) was retired at ${spot.retired_at}${spot.retired_reason ? ` (${spot.retired_reason})` : ''}; the reading is kept`,
    });
  }
  const derived = deriveReading(input, { calibratedDistanceM: meter.calibrated_distance_m, calibrationDue: meter.calibration_due },
    refs.rulesOf(spot.rules), { materialClass: spot.material_class });
  stmt(db, `INSERT INTO readings (id, round_id, spot_id, meter_id, taken_at, received_at, value, unit, polarity, meter_range,
      distance_value, distance_unit, distance_uncertainty_m, side, ground_behind_value, ground_behind_unit, zeroed, rh_percent,
      temperature_c, process, note, meter_calibrated_distance_m, meter_calibration_due, supersedes_id, correction_reason,
      content_hash, field_v_per_m, derive_version, flags)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`).run(
    input.id, input.roundId, input.spotId, input.meterId, input.takenAt, opts.receivedAt, input.value, input.unit, input.polarity,
    input.meterRange, input.distance.value, input.distance.unit, input.distanceUncertaintyM, input.side,
    input.groundBehind?.value ?? null, input.groundBehind?.unit ?? null, input.zeroed ? 1 : 0, input.rhPercent, input.temperatureC,
    input.process === null ? null : JSON.stringify(input.process), input.note, meter.calibrated_distance_m, meter.calibration_due,
    opts.supersedesId ?? null, opts.correctionReason ?? null, hash, derived.fieldVPerM, DERIVE_VERSION, JSON.stringify(flags),
  );
}

/**
 * Stores a batch in the caller's transaction. Throws (and so rolls the whole batch
 * back) on an unknown round, spot or meter; answers one ack per reading.
 */
export function ingestReadings(db: Db, inputs: ReadingInput[], receivedAt: string): { id: string; status: ReadingAck['status']; message?: string }[] {
  const refs = new RefCache(db);
  return inputs.map((raw, i) => {
    const input = normalizeInput(raw);
    const hash = contentHash(input);
    const existing = existingHash(db, input.id);
    if (existing) {
      if (existing.content_hash === hash) return { id: input.id, status: 'duplicate' as const, message: 'already stored (a resent copy); not stored again' };
      stmt(db, `INSERT INTO reading_conflicts (id, reading_id, payload, content_hash, received_at) VALUES (?, ?, ?, ?, ?)
                ON CONFLICT (reading_id, content_hash) DO NOTHING`)
        .run(newId(), input.id, JSON.stringify(input), hash, receivedAt);
      return {
        id: input.id, status: 'conflict' as const,
        message: 'a different reading with this id is already stored; this one is kept for review (GET /api/conflicts) and was not applied',
      };
    }
    insertChecked(db, refs, input, hash, [i], { receivedAt });
    return { id: input.id, status: 'stored' as const };
  });
}

/** Whether a revision may still be corrected or deleted: it must be current and not deleted. */
function revisionState(db: Db, id: string): { exists: boolean; supersededBy: string | null; deleted: boolean } {
  const r = stmt(db, `SELECT (SELECT c.id FROM readings c WHERE c.supersedes_id = r.id) AS superseded_by,
      EXISTS (SELECT 1 FROM reading_tombstones t WHERE t.reading_id = r.id) AS deleted
    FROM readings r WHERE r.id = ?`).get(id) as { superseded_by: string | null; deleted: number } | undefined;
  return r ? { exists: true, supersededBy: r.superseded_by, deleted: r.deleted === 1 } : { exists: false, supersededBy: null, deleted: false };
}

/** Inserts a correction of revision `id` in the caller's transaction; created false for an identical retry. */
export function correctReading(db: Db, id: string, correction: CorrectionInput, receivedAt: string): { created: boolean } {
  const input = normalizeInput(readingPart(correction));
  const hash = contentHash(input);
  const state = revisionState(db, id);
  if (!state.exists) throw notFound(`no reading with id ${id}`, ['id']);
  const existing = existingHash(db, input.id);
  if (existing) {
    if (existing.supersedes_id === id && existing.content_hash === hash && existing.correction_reason === correction.reason) {
      return { created: false };
    }
    throw conflict(`a reading with id ${input.id} already exists: a correction needs a new id`, ['id']);
  }
  if (state.supersededBy !== null) {
    throw conflict(`this revision is already corrected by ${state.supersededBy}: correct the current revision`);
  }
  if (state.deleted) throw conflict('this reading is deleted: a deleted reading cannot be corrected');
  insertChecked(db, new RefCache(db), input, hash, [], { receivedAt, supersedesId: id, correctionReason: correction.reason });
  return { created: true };
}

export function tombstoneReading(db: Db, id: string, reason: string, at: string): void {
  const state = revisionState(db, id);
  if (!state.exists) throw notFound(`no reading with id ${id}`, ['id']);
  if (state.deleted) throw conflict('this reading is already deleted');
  if (state.supersededBy !== null) {
    throw conflict(`this revision is superseded by ${state.supersededBy}: delete the current revision`);
  }
  stmt(db, 'INSERT INTO reading_tombstones (reading_id, reason, at) VALUES (?, ?, ?)').run(id, reason, at);
}

interface ConflictRow { id: string; reading_id: string; payload: string; received_at: string }

export function listConflicts(db: Db): ReadingConflict[] {
  return (stmt(db, 'SELECT id, reading_id, payload, received_at FROM reading_conflicts ORDER BY received_at DESC, id DESC').all() as ConflictRow[])
    .map((r) => ({ id: r.id, readingId: r.reading_id, payload: JSON.parse(r.payload) as ReadingInput, receivedAt: r.received_at }));
}
