/**
 * Derived values of a reading, computed from its stored inputs and the set-up it
 * was taken in. Server and tablet call the same function, so a verdict shown
 * offline is the verdict the server stores.
 */
import { evaluateLimits, type LimitRule, type LimitVerdict } from '../limits/evaluate';
import type { LimitMetric } from '../limits/metrics';
import { distanceToMetres, type DistanceUnit } from '../units/distance';
import { normalizeReading, type Polarity, type ReadingUnit } from '../units/field';

export interface ReadingCore {
  value: number;
  unit: ReadingUnit;
  polarity: Polarity;
  distance: { value: number; unit: DistanceUnit };
  takenAt: string;
}

export interface MeterCore {
  calibratedDistanceM: number | null;
  calibrationDue: string; // YYYY-MM-DD
}

export interface DerivedReading {
  fieldVPerM: number;
  distanceM: number;
  meterCalibrationOverdue: boolean;
  metrics: Partial<Record<LimitMetric, number>>;
  verdict: LimitVerdict;
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

/**
 * Normalizes the reading and evaluates it against the limit rules.
 * `extraMetrics` carries values from a charge estimate (chargeC, surfaceChargeDensityCPerM2,
 * energyJ) when the spot has a model.
 * Throws RangeError when a surface-voltage reading has no calibrated distance (the
 * server checks this earlier and answers 400).
 */
export function deriveReading(
  reading: ReadingCore,
  meter: MeterCore | null,
  rules: readonly LimitRule[],
  opts: { materialClass?: string; extraMetrics?: Partial<Record<LimitMetric, number | null>> } = {},
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
  for (const [k, v] of Object.entries(opts.extraMetrics ?? {})) {
    if (typeof v === 'number' && Number.isFinite(v)) metrics[k as LimitMetric] = Math.abs(v);
  }
  return {
    fieldVPerM,
    distanceM,
    meterCalibrationOverdue: meter ? isCalibrationOverdue(meter.calibrationDue, reading.takenAt) : false,
    metrics,
    verdict: evaluateLimits(rules, metrics),
  };
}
