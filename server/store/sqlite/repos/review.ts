/**
 * The reads of the weekly review and the spot trend, and the kept weekly
 * aggregates (review_week_cache, migration 0004).
 *
 * Speed (bench/run.ts): a week of 500 spots is ~19k readings;
 * they come through readings_spot_time (spot_id, taken_at, ...) one spot at a
 * time. The weeks before (previous week, 8-week trend, 13-week humidity) are read
 * from the cache, filled once per complete week and dropped whenever a reading
 * taken in that week is stored, corrected or deleted (invalidateWeeks).
 */
import type { Round, Skip } from '../../../../core/schemas';
import type { LeanReading, TimeWindow, WeekAggregate } from '../../store';
import { stmt, type Db } from '../db';
import { DAY_MS, WEEK_CACHE_VERSION, absField, aggregateWeek, iso, rowToLean, type CacheRow, type LeanRow, type RoundRow, type SpotTuple } from '../../shared/review';
export { WEEK_CACHE_VERSION, absField, aggregateWeek };

const LEAN_COLUMNS = `r.id, r.spot_id, r.round_id, r.meter_id, r.taken_at, r.value, r.unit, r.polarity, r.distance_value, r.distance_unit,
  r.distance_uncertainty_m, r.ground_behind_value, r.ground_behind_unit, r.meter_calibrated_distance_m, r.meter_calibration_due, r.rh_percent`;
const CURRENT = `NOT EXISTS (SELECT 1 FROM readings c WHERE c.supersedes_id = r.id)
  AND NOT EXISTS (SELECT 1 FROM reading_tombstones t WHERE t.reading_id = r.id)`;

/** The week's current readings of every spot of a site (the review's main read; the benchmark's baseline runs it bare). */
export const SITE_WEEK_SQL = `SELECT ${LEAN_COLUMNS}
  FROM spots s JOIN readings r ON r.spot_id = s.id AND r.taken_at >= ? AND r.taken_at < ?
  WHERE s.site_id = ? AND ${CURRENT}`;

/** One spot's current readings in a range, oldest first (the trend's read; the benchmark's baseline runs it bare). */
export const SPOT_RANGE_SQL = `SELECT ${LEAN_COLUMNS}
  FROM readings r WHERE r.spot_id = ? AND r.taken_at >= ? AND r.taken_at < ? AND ${CURRENT}
  ORDER BY r.taken_at, r.id`;

/** RH of the rounds of readings that have none of their own (one small query). */
function roundRhFor(db: Db, rows: LeanRow[]): Map<string, number | null> {
  const ids = new Set<string>();
  for (const r of rows) if (r.rh_percent === null) ids.add(r.round_id);
  if (ids.size === 0) return new Map();
  const found = stmt(db, 'SELECT id, rh_percent FROM rounds WHERE id IN (SELECT value FROM json_each(?))').all(JSON.stringify([...ids])) as
    { id: string; rh_percent: number | null }[];
  return new Map(found.map((r) => [r.id, r.rh_percent]));
}

export function siteWeekReadings(db: Db, siteId: string, w: TimeWindow): LeanReading[] {
  const rows = stmt(db, SITE_WEEK_SQL).all(iso(w.startMs), iso(w.endMs), siteId) as LeanRow[];
  const rh = roundRhFor(db, rows);
  return rows.map((r) => rowToLean(r, rh));
}

export function spotRangeReadings(db: Db, spotId: string, fromMs: number | null, toMs: number): LeanReading[] {
  const rows = stmt(db, SPOT_RANGE_SQL).all(spotId, fromMs === null ? '' : iso(fromMs), iso(toMs)) as LeanRow[];
  const rh = roundRhFor(db, rows);
  return rows.map((r) => rowToLean(r, rh));
}

/** The cached aggregates of these weeks (those present, of this version, with the same end). */
export function cachedWeeks(db: Db, siteId: string, timeZone: string, weeks: TimeWindow[], withSpots = true): Map<number, WeekAggregate> {
  const out = new Map<number, WeekAggregate>();
  if (weeks.length === 0) return out;
  const starts = weeks.map((w) => w.startMs);
  const rows = stmt(db, `SELECT start_ms, end_ms, readings, median_rh_percent, ${withSpots ? 'spots' : "'{}' AS spots"}
    FROM review_week_cache WHERE site_id = ? AND start_ms >= ? AND start_ms <= ? AND time_zone = ? AND version = ?`)
    .all(siteId, Math.min(...starts), Math.max(...starts), timeZone, WEEK_CACHE_VERSION) as CacheRow[];
  const ends = new Map(weeks.map((w) => [w.startMs, w.endMs]));
  for (const r of rows) {
    if (ends.get(r.start_ms) !== r.end_ms) continue;
    const spots: WeekAggregate['spots'] = new Map();
    for (const [spotId, t] of Object.entries(JSON.parse(r.spots) as Record<string, SpotTuple>)) {
      spots.set(spotId, { readings: t[0], medianAbsFieldVPerM: t[1], maxAbsFieldVPerM: t[2], medianRhPercent: t[3] });
    }
    out.set(r.start_ms, { startMs: r.start_ms, endMs: r.end_ms, readings: r.readings, medianRhPercent: r.median_rh_percent, spots });
  }
  return out;
}

/** Computes and keeps the aggregates of complete weeks (call in a write transaction). */
export function fillWeekCache(db: Db, siteId: string, timeZone: string, weeks: TimeWindow[], now: string): Map<number, WeekAggregate> {
  const out = new Map<number, WeekAggregate>();
  const ins = stmt(db, `INSERT INTO review_week_cache (site_id, start_ms, time_zone, end_ms, readings, median_rh_percent, spots, version, computed_at)
    VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)
    ON CONFLICT (site_id, start_ms, time_zone) DO UPDATE SET end_ms = excluded.end_ms, readings = excluded.readings,
      median_rh_percent = excluded.median_rh_percent, spots = excluded.spots, version = excluded.version, computed_at = excluded.computed_at`);
  for (const w of weeks) {
    const agg = aggregateWeek(w, siteWeekReadings(db, siteId, w));
    const spots: Record<string, SpotTuple> = {};
    for (const [spotId, x] of agg.spots) spots[spotId] = [x.readings, x.medianAbsFieldVPerM, x.maxAbsFieldVPerM, x.medianRhPercent];
    ins.run(siteId, w.startMs, timeZone, w.endMs, agg.readings, agg.medianRhPercent, JSON.stringify(spots), WEEK_CACHE_VERSION, now);
    out.set(w.startMs, agg);
  }
  return out;
}

/**
 * Drops the kept aggregates of the week holding `takenAt` at the spot's site (any
 * time zone): called in the transaction that stores, corrects or deletes a reading.
 */
export function invalidateWeeks(db: Db, spotId: string, takenAt: string): void {
  const t = Date.parse(takenAt);
  if (!Number.isFinite(t)) return;
  // A site week is at most 169 hours long, so its start lies within 8 days before t.
  stmt(db, `DELETE FROM review_week_cache WHERE site_id = (SELECT site_id FROM spots WHERE id = ?)
    AND start_ms > ? AND start_ms <= ? AND end_ms > ?`).run(spotId, t - 8 * DAY_MS, t, t);
}

/** Drops every kept aggregate of a site (e.g. its time zone changed). */
export function invalidateSite(db: Db, siteId: string): void {
  stmt(db, 'DELETE FROM review_week_cache WHERE site_id = ?').run(siteId);
}

/** Rounds started in the window, and their skips. */
export function roundsInWindow(db: Db, siteId: string, w: TimeWindow): { rounds: Round[]; skips: Skip[] } {
  const rows = stmt(db, 'SELECT * FROM rounds WHERE site_id = ? AND started_at >= ? AND started_at < ? ORDER BY started_at, id')
    .all(siteId, iso(w.startMs), iso(w.endMs)) as RoundRow[];
  const rounds: Round[] = rows.map((r) => ({
    id: r.id, siteId: r.site_id, surveyor: r.surveyor, startedAt: r.started_at, endedAt: r.ended_at, rhPercent: r.rh_percent,
    temperatureC: r.temperature_c, notes: r.notes, plannedSpotIds: JSON.parse(r.planned_spot_ids) as string[], createdAt: r.created_at,
  }));
  const skips = rounds.length === 0 ? [] : (stmt(db, `SELECT * FROM round_skips WHERE round_id IN (SELECT value FROM json_each(?)) ORDER BY at, id`)
    .all(JSON.stringify(rounds.map((r) => r.id))) as { id: string; round_id: string; spot_id: string; reason: string; at: string; created_at: string }[])
    .map((s) => ({ id: s.id, roundId: s.round_id, spotId: s.spot_id, reason: s.reason, at: s.at, createdAt: s.created_at }));
  return { rounds, skips };
}
