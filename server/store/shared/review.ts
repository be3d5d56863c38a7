/** The weekly review: what both store implementations share (row shapes, mapping, week aggregation). */
import { median } from '../../../core/stats';
import { normalizeReading, type ReadingUnit } from '../../../core/units/field';
import type { LeanReading, TimeWindow, WeekAggregate } from '../store';
import { DERIVE_VERSION } from '../reading-entity';

export const DAY_MS = 86_400_000;
/** Stamps the cached aggregates: bump when their computation (or the normalization, DERIVE_VERSION) changes. */
export const WEEK_CACHE_VERSION = DERIVE_VERSION * 1000 + 1;

export interface LeanRow {
  id: string;
  spot_id: string;
  round_id: string;
  meter_id: string;
  taken_at: string;
  value: number;
  unit: string;
  polarity: string;
  distance_value: number;
  distance_unit: string;
  distance_uncertainty_m: number | null;
  ground_behind_value: number | null;
  ground_behind_unit: string | null;
  meter_calibrated_distance_m: number | null;
  meter_calibration_due: string;
  rh_percent: number | null;
}

export const iso = (ms: number) => new Date(ms).toISOString();

export function rowToLean(r: LeanRow, roundRh: Map<string, number | null>): LeanReading {
  return {
    id: r.id, spotId: r.spot_id, roundId: r.round_id, meterId: r.meter_id, takenAt: r.taken_at, value: r.value,
    unit: r.unit as LeanReading['unit'], polarity: r.polarity as LeanReading['polarity'],
    distanceValue: r.distance_value, distanceUnit: r.distance_unit as LeanReading['distanceUnit'], distanceUncertaintyM: r.distance_uncertainty_m,
    groundBehindValue: r.ground_behind_value, groundBehindUnit: r.ground_behind_unit as LeanReading['groundBehindUnit'],
    meterCalibratedDistanceM: r.meter_calibrated_distance_m, meterCalibrationDue: r.meter_calibration_due,
    rhPercent: r.rh_percent ?? roundRh.get(r.round_id) ?? null,
  };
}

/** |E| of a lean reading, V/m, from its stored inputs. */
export function absField(r: { value: number; unit: ReadingUnit; polarity: '+' | '-'; meterCalibratedDistanceM: number | null }): number {
  return Math.abs(normalizeReading({ value: r.value, unit: r.unit, polarity: r.polarity, calibratedDistanceM: r.meterCalibratedDistanceM }));
}

/** Summarises a week from its readings (per spot and whole site). */
export function aggregateWeek(w: TimeWindow, readings: LeanReading[]): WeekAggregate {
  const bySpot = new Map<string, { fields: number[]; rh: number[] }>();
  const siteRh: number[] = [];
  for (const r of readings) {
    let g = bySpot.get(r.spotId);
    if (!g) {
      g = { fields: [], rh: [] };
      bySpot.set(r.spotId, g);
    }
    g.fields.push(absField(r));
    if (r.rhPercent !== null) {
      g.rh.push(r.rhPercent);
      siteRh.push(r.rhPercent);
    }
  }
  const spots: WeekAggregate['spots'] = new Map();
  for (const [spotId, g] of bySpot) {
    let max = 0;
    for (const f of g.fields) if (f > max) max = f;
    spots.set(spotId, { readings: g.fields.length, medianAbsFieldVPerM: median(g.fields), maxAbsFieldVPerM: max, medianRhPercent: g.rh.length ? median(g.rh) : null });
  }
  return { startMs: w.startMs, endMs: w.endMs, readings: readings.length, medianRhPercent: siteRh.length ? median(siteRh) : null, spots };
}

export interface CacheRow {
  start_ms: number;
  end_ms: number;
  readings: number;
  median_rh_percent: number | null;
  spots: string;
}

export type SpotTuple = [number, number, number, number | null];

export interface RoundRow {
  id: string; site_id: string; surveyor: string; started_at: string; ended_at: string | null; rh_percent: number | null;
  temperature_c: number | null; notes: string; planned_spot_ids: string; created_at: string;
}
