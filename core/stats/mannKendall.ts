import { assertFiniteValues } from './assertFiniteValues';
import { complementaryErrorFunction } from './complementaryErrorFunction';
import { kendallS } from './kendallS';
import { kendallVarianceS } from './kendallVarianceS';
import { notEnoughData, type NotEnoughData } from './notEnoughData';
import { tieGroupSizes } from './tieGroupSizes';

export type TrendDirection = 'increasing' | 'decreasing' | 'no trend';

/** Result of a Mann–Kendall test that could be computed. */
export interface MannKendallResult {
  readonly status: 'ok';
  /** Number of points. */
  readonly n: number;
  /** Kendall's S: concordant minus discordant pairs. */
  readonly s: number;
  /** Variance of S under no trend, tie-corrected (pairs squared). */
  readonly varianceS: number;
  /** Standard normal score with continuity correction. */
  readonly z: number;
  /** Two-sided p-value from the normal approximation. */
  readonly pValue: number;
  /** Kendall's tau-b (tau-a when there are no ties), in [-1, 1]. */
  readonly tau: number;
  /** Significance level used for `direction`. */
  readonly alpha: number;
  /** True when pValue < alpha. */
  readonly significant: boolean;
  readonly direction: TrendDirection;
  /** Sizes of the groups of tied values (y) and tied times (x). */
  readonly tieGroups: { readonly values: readonly number[]; readonly times: readonly number[] };
}

export interface MannKendallOptions {
  /**
   * Times (or any ordering variable) of the values; by default the values are
   * taken to be in time order, one per step. Pairs at an equal time count 0.
   */
  readonly xs?: ArrayLike<number>;
  /** Significance level for `direction`, in (0, 1); default 0.05. */
  readonly alpha?: number;
}

/**
 * Mann–Kendall test for a monotonic trend: do later values tend to be larger
 * (or smaller) than earlier ones, without assuming a straight line or normal
 * errors?
 *
 * Formula in words:
 * - S = sum over pairs i < j of sign(x_j - x_i) sign(y_j - y_i): +1 for each pair
 *   that rises with time, -1 for each that falls, 0 for ties in value or time
 *   (counted in O(n log n) by Knight's method, {@link kendallS});
 * - Var(S) with tie groups t (values) and u (times), {@link kendallVarianceS}
 *   (Gilbert 1987 eq. 16.4 when times are distinct);
 * - Z = (S - 1) / sqrt(Var S) if S > 0, 0 if S = 0, (S + 1) / sqrt(Var S) if S < 0
 *   (continuity correction, Gilbert eq. 16.5);
 * - two-sided p = 2 (1 - Phi(|Z|)) = erfc(|Z| / sqrt 2), with Cody's erfc;
 * - tau-b = S / sqrt((n0 - n1)(n0 - n2)), n0 = n(n-1)/2, n1 and n2 the tied
 *   pairs in values and in times;
 * - direction: 'increasing' or 'decreasing' by the sign of S when p < alpha,
 *   otherwise 'no trend'.
 * The normal approximation is used for every n >= 3; for n < 10 it is rough
 * (Gilbert tabulates exact probabilities there), slightly conservative with the
 * continuity correction.
 *
 * Units: S is a count of pairs; z, tau and p are dimensionless.
 * Throws on NaN or infinite input or xs of a different length. Fewer than 3
 * points, all values equal, or all at one time give `not-enough-data` with a
 * plain reason, never NaN.
 *
 * Reference: H. B. Mann (1945), "Nonparametric tests against trend",
 * Econometrica 13:245–259; M. G. Kendall (1975), Rank Correlation Methods, 4th
 * ed., Griffin; R. O. Gilbert (1987), Statistical Methods for Environmental
 * Pollution Monitoring, Van Nostrand Reinhold, ch. 16, eqs. 16.3–16.5 (equation
 * numbers from memory).
 *
 * Example: for 1, 2, ..., 100 in order, S = 4950, Var S = 112750,
 * Z = 14.73869998208331, tau = 1, direction 'increasing'.
 */
export function mannKendall(
  ys: ArrayLike<number>,
  options: MannKendallOptions = {},
): MannKendallResult | NotEnoughData {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new RangeError(`mannKendall requires alpha in (0, 1), got ${String(alpha)}`);
  const { xs } = options;
  if (xs !== undefined && xs.length !== ys.length) {
    throw new RangeError(`mannKendall requires xs and ys of equal length, got ${xs.length} and ${ys.length}`);
  }
  assertFiniteValues(ys, 'mannKendall');
  if (xs !== undefined) assertFiniteValues(xs, 'mannKendall');
  const n = ys.length;
  if (n < 3) return notEnoughData(`a trend test needs at least 3 readings, got ${n}`, n);

  const valueTies = tieGroupSizes(ys);
  const timeTies = xs === undefined ? [] : tieGroupSizes(xs);
  if (timeTies.length === 1 && timeTies[0] === n) {
    return notEnoughData('all readings are at one time: there is no time order to test', n);
  }
  if (valueTies.length === 1 && valueTies[0] === n) {
    return notEnoughData('all readings have the same value: there is no trend to test', n);
  }

  const s = kendallS(ys, xs);

  const varianceS = kendallVarianceS(n, valueTies, timeTies);
  if (!(varianceS > 0)) return notEnoughData('the readings have no variation to test once ties are counted', n);
  const sd = Math.sqrt(varianceS);
  const z = s > 0 ? (s - 1) / sd : s < 0 ? (s + 1) / sd : 0;
  const pValue = Math.min(1, complementaryErrorFunction(Math.abs(z) / Math.SQRT2));

  const n0 = (n * (n - 1)) / 2;
  let n1 = 0;
  for (const t of valueTies) n1 += (t * (t - 1)) / 2;
  let n2 = 0;
  for (const u of timeTies) n2 += (u * (u - 1)) / 2;
  const tau = s / Math.sqrt((n0 - n1) * (n0 - n2));

  const significant = pValue < alpha;
  const direction: TrendDirection = !significant || s === 0 ? 'no trend' : s > 0 ? 'increasing' : 'decreasing';
  return {
    status: 'ok',
    n,
    s,
    varianceS,
    z,
    pValue,
    tau,
    alpha,
    significant,
    direction,
    tieGroups: { values: valueTies, times: timeTies },
  };
}
