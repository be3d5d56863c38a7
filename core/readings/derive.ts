/**
 * Derived values of a reading, computed from its stored inputs and the set-up it
 * was taken in. Server and tablet call the same function, so a verdict shown
 * offline is the verdict the server stores.
 */
import { evaluateLimits, type LimitRule, type LimitVerdict } from '../limits/evaluate';
import type { LimitMetric } from '../limits/metrics';
import { distanceToMetres, type DistanceUnit } from '../units/distance';
import { isSurfaceVoltageUnit, normalizeReading, VOLTS_PER_SURFACE_VOLTAGE_UNIT, type Polarity, type ReadingUnit } from '../units/field';
import {
  readingEstimate, type AreaHazardContext, type EstimateNote, type SpotEstimateContext,
} from './estimate';
import type { EstimateResponse } from '../schemas/estimate';
import type { Verdict } from '../hazard/verdicts';

export type { AreaHazardContext, EstimateNote, SpotEstimateContext } from './estimate';

export interface ReadingCore {
  value: number;
  unit: ReadingUnit;
  polarity: Polarity;
  distance: { value: number; unit: DistanceUnit };
  takenAt: string;
  /** Per-reading distance standard uncertainty, m (else the spot's default). */
  distanceUncertaintyM?: number | null;
  /** Nearest ground behind the object (sheet model), as entered. */
  groundBehind?: { value: number; unit: DistanceUnit } | null;
}

export interface MeterCore {
  calibratedDistanceM: number | null;
  calibrationDue: string; // YYYY-MM-DD
  /** Stated accuracy as a fraction of the reading (estimate interval); default 0.05. */
  accuracyRel?: number | null;
  /** Divides point-like estimates (1 small probe .. 2 wide flat face); default 1. */
  geometryFactor?: number | null;
}

export interface DerivedReading {
  fieldVPerM: number;
  distanceM: number;
  meterCalibrationOverdue: boolean;
  metrics: Partial<Record<LimitMetric, number>>;
  verdict: LimitVerdict;
  /** The charge estimate with the spot's model (null when the spot has none, or it could not be made: see estimateNote). */
  estimate: EstimateResponse | null;
  /** Why there is no estimate, or what it assumed; null when nothing to say. */
  estimateNote: EstimateNote | null;
  /** Hazard verdicts for the area (empty without an area). */
  hazards: Verdict[];
}

/**
 * A meter is overdue when the reading was taken after the end of its calibration due date (UTC).
 * @example isCalibrationOverdue('2026-01-31', '2026-02-01T08:00:00Z') // true
 */
export function isCalibrationOverdue(calibrationDue: string, takenAt: string): boolean {
  const due = Date.parse(`${calibrationDue}T23:59:59.999Z`);
  const at = Date.parse(takenAt);
  if (!Number.isFinite(due) || !Number.isFinite(at)) return false;
  return at > due;
}

export interface DeriveOptions {
  materialClass?: string;
  /** Metrics from elsewhere; they win over the estimate's own. */
  extraMetrics?: Partial<Record<LimitMetric, number | null>>;
  /** The spot's model and geometry: with a model, the reading is turned into a charge estimate. */
  spot?: SpotEstimateContext | null;
  /** The spot's area: gives the hazard verdicts. */
  area?: AreaHazardContext | null;
}

/**
 * Normalizes the reading and evaluates it against the limit rules.
 * With `opts.spot` (a model set), the reading is also interpreted with that model
 * (core/physics estimate(), see core/readings/estimate.ts) and the estimate's chargeC,
 * surfaceChargeDensityCPerM2 and energyJ join the limit evaluation; with `opts.area`
 * the hazard verdicts (core/hazard) are given too. An estimate that cannot be made
 * never throws: estimate is null and estimateNote says why.
 * `extraMetrics` carries values from elsewhere and wins over the estimate's.
 * Throws RangeError when a surface-voltage reading has no calibrated distance (the
 * server checks this earlier and answers 400).
 */
export function deriveReading(
  reading: ReadingCore,
  meter: MeterCore | null,
  rules: readonly LimitRule[],
  opts: DeriveOptions = {},
): DerivedReading {
  const fieldVPerM = normalizeReading({
    value: reading.value, unit: reading.unit, polarity: reading.polarity,
    calibratedDistanceM: meter?.calibratedDistanceM ?? null,
  });
  const distanceM = distanceToMetres(reading.distance.value, reading.distance.unit);
  const metrics: Partial<Record<LimitMetric, number>> = { fieldVPerM: Math.abs(fieldVPerM) };
  if (meter?.calibratedDistanceM) {
    const sv = Math.abs(fieldVPerM) * meter.calibratedDistanceM;
    metrics.surfaceVoltageV = sv;
    if (opts.materialClass === 'person') metrics.bodyVoltageV = sv;
  }
  const materialClass = opts.materialClass ?? opts.spot?.materialClass;
  const est = opts.spot || opts.area
    ? readingEstimate({
      fieldVPerM, distanceM,
      potentialV: isSurfaceVoltageUnit(reading.unit) ? (reading.polarity === '-' ? -1 : 1) * reading.value * VOLTS_PER_SURFACE_VOLTAGE_UNIT[reading.unit] : null,
      distanceUncertaintyM: reading.distanceUncertaintyM ?? null,
      groundBehindM: reading.groundBehind ? distanceToMetres(reading.groundBehind.value, reading.groundBehind.unit) : null,
      meterAccuracyRel: meter?.accuracyRel ?? null,
      geometryFactor: meter?.geometryFactor ?? null,
      materialClass: materialClass ?? null,
    }, opts.spot ?? null, opts.area ?? null)
    : { estimate: null, note: null, hazards: [] };
  if (est.estimate) {
    for (const k of ['chargeC', 'surfaceChargeDensityCPerM2', 'energyJ'] as const) {
      const v = est.estimate[k];
      if (typeof v === 'number' && Number.isFinite(v)) metrics[k] = Math.abs(v);
    }
  }
  for (const [k, v] of Object.entries(opts.extraMetrics ?? {})) {
    if (typeof v === 'number' && Number.isFinite(v)) metrics[k as LimitMetric] = Math.abs(v);
  }
  return {
    fieldVPerM,
    distanceM,
    meterCalibrationOverdue: meter ? isCalibrationOverdue(meter.calibrationDue, reading.takenAt) : false,
    metrics,
    verdict: evaluateLimits(rules, metrics, { materialClass: materialClass ?? null }),
    estimate: est.estimate,
    estimateNote: est.note,
    hazards: est.hazards,
  };
}
