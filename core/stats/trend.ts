import { mannKendall, type TrendDirection } from './mannKendall';
import { notEnoughData, type NotEnoughData } from './notEnoughData';
import { theilSen } from './theilSen';

/** Milliseconds in 7 days of 24 h (a trend rate, not a calendar week). */
export const MS_PER_WEEK = 7 * 24 * 60 * 60 * 1000;

/** One reading of a time series. */
export interface TrendPoint {
  /** Time of the reading, in ms since the Unix epoch (UTC). */
  readonly t: number;
  /** The value, in the caller's unit (e.g. normalized field, V/m). */
  readonly v: number;
}

export interface TrendSummary {
  readonly status: 'ok';
  /** Points used. */
  readonly n: number;
  /** Points left out because t or v was not a finite number. */
  readonly excluded: number;
  /** Theil–Sen slope in value units per 7 days (604 800 000 ms). */
  readonly slopePerWeek: number;
  /** Confidence limits of the slope, value units per 7 days, at 1 - alpha. */
  readonly slopeLowerPerWeek: number;
  readonly slopeUpperPerWeek: number;
  /** True when too few pairs to reach 1 - alpha: the limits are the extreme pairwise slopes. */
  readonly intervalClamped: boolean;
  /** Level of the Theil–Sen line at `centreMs` (value units). */
  readonly levelAtCentre: number;
  /** Mean time of the points, ms since the epoch. */
  readonly centreMs: number;
  /** Mann–Kendall two-sided p-value, Kendall's tau-b, S and z. */
  readonly pValue: number;
  readonly tau: number;
  readonly s: number;
  readonly z: number;
  readonly alpha: number;
  readonly significant: boolean;
  /** From Mann–Kendall at alpha: the sign of S if significant, else 'no trend'. */
  readonly direction: TrendDirection;
  /** First and last time in the data (ms since the epoch). */
  readonly firstMs: number;
  readonly lastMs: number;
}

export interface TrendSummaryOptions {
  /** Significance level, in (0, 1); default 0.05. The slope interval is at 1 - alpha. */
  readonly alpha?: number;
}

/**
 * The robust trend of a spot over a range: how fast the value changes per week
 * (Theil–Sen), whether the change is more than noise (Mann–Kendall), and which way.
 *
 * Formula in words: drop points whose t or v is not finite; Mann–Kendall on v
 * with the times as x (readings at the same time count as tied); Theil–Sen on
 * (t, v) with t centred on its mean; the slope per ms times 604 800 000 gives the
 * rate per 7 days, and its interval is the Sen (1968) interval at 1 - alpha.
 *
 * Units: t in epoch ms; the slope in value units per week; p, tau, z
 * dimensionless. Fewer than 3 points, all values equal, or all at one time give
 * `not-enough-data` with a plain reason, never NaN.
 *
 * Reference: Helsel & Hirsch (2002), Statistical Methods in Water Resources,
 * USGS TWRI 4-A3, ch. 12 (Mann–Kendall test with the Kendall–Theil slope);
 * Gilbert (1987), ch. 16; see {@link mannKendall} and {@link theilSen}.
 *
 * Example: weekly readings 100, 110, 120, 130 V/m give slopePerWeek 10,
 * S = 6, p = 0.0894 (n = 4: the normal approximation with continuity
 * correction), direction 'no trend' at alpha 0.05.
 */
export function trendSummary(points: readonly TrendPoint[], options: TrendSummaryOptions = {}): TrendSummary | NotEnoughData {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`trendSummary requires alpha in (0, 1), got ${String(alpha)}`);
  const ts: number[] = [];
  const vs: number[] = [];
  let excluded = 0;
  let firstMs = Infinity;
  let lastMs = -Infinity;
  for (const p of points) {
    if (!Number.isFinite(p.t) || !Number.isFinite(p.v)) {
      excluded++;
      continue;
    }
    ts.push(p.t);
    vs.push(p.v);
    if (p.t < firstMs) firstMs = p.t;
    if (p.t > lastMs) lastMs = p.t;
  }
  const note = excluded > 0 ? ` (${excluded} ${excluded === 1 ? 'reading' : 'readings'} without a valid time or value excluded)` : '';
  const mk = mannKendall(vs, { xs: ts, alpha });
  if (mk.status !== 'ok') return notEnoughData(mk.reason + note, mk.n);
  const fit = theilSen(ts, vs, { confidence: 1 - alpha });
  if (fit.status !== 'ok') return notEnoughData(fit.reason + note, fit.n);
  return {
    status: 'ok',
    n: mk.n,
    excluded,
    slopePerWeek: fit.slope * MS_PER_WEEK,
    slopeLowerPerWeek: fit.slopeLower * MS_PER_WEEK,
    slopeUpperPerWeek: fit.slopeUpper * MS_PER_WEEK,
    intervalClamped: fit.intervalClamped,
    levelAtCentre: fit.yAtCentre,
    centreMs: fit.xCentre,
    pValue: mk.pValue,
    tau: mk.tau,
    s: mk.s,
    z: mk.z,
    alpha,
    significant: mk.significant,
    direction: mk.direction,
    firstMs,
    lastMs,
  };
}
