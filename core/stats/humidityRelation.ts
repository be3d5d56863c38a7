import { formatPValue } from './formatPValue';
import { linearRegression } from './linearRegression';
import type { NotEnoughData } from './notEnoughData';

/** One reading for the humidity relation. */
export interface HumidityReading {
  /** Relative humidity, in % RH (0 to 100). */
  readonly rh: number;
  /** Normalized field, in V/m (sign = polarity; only the magnitude is used). */
  readonly fieldVPerM: number;
}

/** Readings left out of the fit, by reason. */
export interface HumidityExclusions {
  /** Readings with a field of exactly 0 V/m (log of zero is undefined). */
  readonly zeroField: number;
  /** Readings with a missing or non-finite field or RH, or RH outside 0–100 %. */
  readonly invalid: number;
}

export interface HumidityRelation {
  readonly status: 'ok';
  /** Readings used in the fit. */
  readonly n: number;
  /** Slope of log10 |E| against RH, in decades per RH point (per % RH). */
  readonly slopeLog10PerRhPoint: number;
  /** (10^slope - 1) * 100: per cent change of |E| per RH point (negative = falls). */
  readonly percentChangePerRhPoint: number;
  /** Two-sided p-value of the slope (Student's t, n - 2 df). */
  readonly pValue: number;
  readonly rSquared: number;
  readonly alpha: number;
  readonly significant: boolean;
  readonly excluded: HumidityExclusions;
  /** Plain sentence, e.g. "field falls by 9 % per RH point (p = 0.003)". */
  readonly sentence: string;
}

export type HumidityNotEnoughData = NotEnoughData & { readonly excluded: HumidityExclusions };

export interface HumidityRelationOptions {
  /** Significance level, in (0, 1); default 0.05. */
  readonly alpha?: number;
}

/**
 * How the field at a spot depends on the relative humidity: the least-squares
 * slope of log10 |E| against RH, its significance, and a sentence for the spot
 * page. Charging usually falls steeply as the air gets wetter, so a
 * significant negative slope says dry air explains part of the high readings.
 *
 * Formula in words: keep readings with finite RH in [0, 100] and a finite,
 * non-zero field; fit log10 |E| = a + b RH by OLS ({@link linearRegression});
 * the field changes by (10^b - 1) * 100 per cent per RH point; p is the t test of
 * b = 0. The sentence reads "field falls by 9 % per RH point (p = 0.003)";
 * when p >= alpha it starts "no clear relation to humidity: ...". Excluded zero
 * fields are counted and named in the sentence.
 *
 * Units: rh in % RH; fieldVPerM in V/m (magnitude used); slope in decades of
 * field per % RH; percent change in % per % RH.
 * Fewer than 3 usable readings, all at one RH, or all the same |E| give
 * `not-enough-data` with the exclusions, never NaN.
 *
 * Reference: the log-linear (exponential) model is an empirical choice: body
 * voltages and surface charging change by an order of magnitude across the RH
 * range (Wikipedia "Static electricity": walking on vinyl, 12 kV at 15 % RH vs 1.5 kV at 80 % RH), so
 * the log of the field, not the field, is taken as linear in RH. The regression
 * and its t test: N. R. Draper and H. Smith (1998), Applied Regression Analysis,
 * 3rd ed., ch. 1 and 3.
 *
 * Example: readings (rh 20, 10000 V/m), (30, 1000), (40, 100), (50, 10) give a
 * slope of -0.1 decade per RH point: "field falls by 21 % per RH point
 * (p < 0.001)".
 */
export function humidityRelation(
  readings: readonly HumidityReading[],
  options: HumidityRelationOptions = {},
): HumidityRelation | HumidityNotEnoughData {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`humidityRelation requires alpha in (0, 1), got ${String(alpha)}`);
  const rhs: number[] = [];
  const logs: number[] = [];
  let zeroField = 0;
  let invalid = 0;
  for (const r of readings) {
    if (!Number.isFinite(r.rh) || r.rh < 0 || r.rh > 100 || !Number.isFinite(r.fieldVPerM)) {
      invalid++;
    } else if (r.fieldVPerM === 0) {
      zeroField++;
    } else {
      rhs.push(r.rh);
      logs.push(Math.log10(Math.abs(r.fieldVPerM)));
    }
  }
  const excluded: HumidityExclusions = { zeroField, invalid };
  const note = exclusionNote(excluded);
  const n = rhs.length;
  const fail = (reason: string): HumidityNotEnoughData => ({
    status: 'not-enough-data',
    reason: reason + note,
    n,
    excluded,
  });
  if (n < 3) return fail(`the humidity relation needs at least 3 readings with humidity and a non-zero field, got ${n}`);
  const fit = linearRegression(rhs, logs);
  if (fit.status !== 'ok') {
    if (rhs.every((v) => v === rhs[0])) return fail('all readings are at the same humidity');
    return fail('all readings have the same field: there is no variation to relate to humidity');
  }
  const percent = (Math.pow(10, fit.slope) - 1) * 100;
  const significant = fit.pValue < alpha;
  const change = `field ${percent < 0 ? 'falls' : 'rises'} by ${formatPercent(Math.abs(percent))} % per RH point (${formatPValue(fit.pValue)})`;
  const sentence = (significant ? change : `no clear relation to humidity: ${change}`) + note;
  return {
    status: 'ok',
    n,
    slopeLog10PerRhPoint: fit.slope,
    percentChangePerRhPoint: percent,
    pValue: fit.pValue,
    rSquared: fit.rSquared,
    alpha,
    significant,
    excluded,
    sentence,
  };
}

function formatPercent(p: number): string {
  if (p >= 0.95) return String(Math.round(p));
  if (p >= 0.05) return p.toFixed(1);
  return 'less than 0.1';
}

function exclusionNote({ zeroField, invalid }: HumidityExclusions): string {
  const parts: string[] = [];
  if (zeroField > 0) parts.push(`${zeroField} zero ${zeroField === 1 ? 'reading' : 'readings'} excluded`);
  if (invalid > 0) parts.push(`${invalid} ${invalid === 1 ? 'reading' : 'readings'} without valid humidity or field excluded`);
  return parts.length === 0 ? '' : `; ${parts.join(', ')}`;
}
