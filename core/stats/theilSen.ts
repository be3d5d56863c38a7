import { assertFiniteValues } from './assertFiniteValues';
import { kendallVarianceS } from './kendallVarianceS';
import { mean } from './mean';
import { median } from './median';
import { notEnoughData, type NotEnoughData } from './notEnoughData';
import { pairwiseSlopesAtRanks } from './pairwiseSlopesAtRanks';
import { standardNormalQuantile } from './standardNormalQuantile';
import { tieGroupSizes } from './tieGroupSizes';

/** A Theil–Sen line with a rank-based confidence interval for its slope. */
export interface TheilSenFit {
  readonly status: 'ok';
  /** Number of points. */
  readonly n: number;
  /** Number of pairs with distinct x, whose slopes were ranked. */
  readonly pairs: number;
  /** Median of pairwise slopes, in y units per x unit. */
  readonly slope: number;
  /** y at x = 0 (y units). With x in epoch ms prefer `yAtCentre`. */
  readonly intercept: number;
  /** Mean of x, the point the line was fitted around (x units). */
  readonly xCentre: number;
  /** Fitted y at `xCentre`: the median of y - slope (x - xCentre) (y units). */
  readonly yAtCentre: number;
  /** Lower and upper confidence limits of the slope (y units per x unit). */
  readonly slopeLower: number;
  readonly slopeUpper: number;
  /** Confidence level of the interval, e.g. 0.95. */
  readonly confidence: number;
  /**
   * True when there are too few pairs to reach the requested confidence: the
   * interval was clamped to the smallest and largest pairwise slope.
   */
  readonly intervalClamped: boolean;
}

export interface TheilSenOptions {
  /** Confidence level of the slope interval, in (0, 1); default 0.95. */
  readonly confidence?: number;
}

/**
 * Theil–Sen robust line: the slope is the median of the slopes of all pairs of
 * points with different x, the intercept the median of y - slope x. Up to about
 * 29 % of the points can be wild without moving the slope far (breakdown point
 * 1 - 1/sqrt(2)); no normality is assumed.
 *
 * Formula in words:
 * - slope b = median over i < j with x_i != x_j of (y_j - y_i) / (x_j - x_i);
 *   pairs with equal x are skipped (Sen 1968's treatment of ties in x);
 * - x is centred on its mean first, so with times in epoch ms the level
 *   `yAtCentre` = median(y - b (x - mean x)) is computed without cancellation;
 *   `intercept` = yAtCentre - b mean(x), so the median residual is zero (Dietz
 *   1989's A1m form; Conover's median(y) - b median(x) differs slightly);
 * - confidence interval (Sen 1968; Hollander & Wolfe 1999, ch. 9; Gilbert 1987,
 *   ch. 16): with N ranked slopes, C = z_(1 - alpha/2) sqrt(Var S) (Var S with
 *   ties, {@link kendallVarianceS}), the limits are the slopes of rank
 *   (N - C) / 2 and (N + C) / 2 + 1, interpolated between neighbours
 *   ({@link pairwiseSlopesAtRanks}: exact, O(n^2) time, without storing every
 *   slope when n is large).
 *
 * Units: slope in y units per x unit (V/m per ms when x is epoch ms).
 * Throws on NaN or infinite input, or lengths that differ; fewer than two
 * points, or all at one x, give `not-enough-data`.
 *
 * Reference: H. Theil (1950), Proc. Kon. Ned. Akad. Wetensch. A 53; P. K. Sen
 * (1968), "Estimates of the regression coefficient based on Kendall's tau",
 * JASA 63:1379–1389; M. Hollander and D. A. Wolfe (1999), Nonparametric
 * Statistical Methods, 2nd ed., ch. 9; Helsel & Hirsch (2002), USGS TWRI 4-A3,
 * ch. 10 (Kendall–Theil robust line).
 *
 * Example: `theilSen([0, 1, 2, 3, 4, 5], [6, 4, 1, 8, 7, 8])` has slope 2/3 and
 * intercept 4.5 (as R's zyp.sen reports for these data).
 */
export function theilSen(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  options: TheilSenOptions = {},
): TheilSenFit | NotEnoughData {
  const confidence = options.confidence ?? 0.95;
  if (!(confidence > 0 && confidence < 1)) throw new RangeError(`theilSen requires confidence in (0, 1), got ${String(confidence)}`);
  if (xs.length !== ys.length) throw new RangeError(`theilSen requires xs and ys of equal length, got ${xs.length} and ${ys.length}`);
  assertFiniteValues(xs, 'theilSen');
  assertFiniteValues(ys, 'theilSen');
  const n = xs.length;
  if (n < 2) return notEnoughData(`a trend line needs at least 2 points, got ${n}`, n);

  const xCentre = mean(xs);
  const xc = new Float64Array(n);
  for (let i = 0; i < n; i++) xc[i] = (xs[i] as number) - xCentre;

  // Pairs with distinct x: all pairs less those inside groups of tied x.
  const xTies = tieGroupSizes(xc);
  let pairCount = (n * (n - 1)) / 2;
  for (const u of xTies) pairCount -= (u * (u - 1)) / 2;
  if (pairCount === 0) return notEnoughData('all points are at one time (x): no slope can be estimated', n);

  const yv = Float64Array.from(ys);
  const varianceS = kendallVarianceS(n, tieGroupSizes(ys), xTies);
  const z = standardNormalQuantile(1 - (1 - confidence) / 2);
  const c = z * Math.sqrt(Math.max(varianceS, 0));
  const lowerRank = (pairCount - c) / 2;
  const upperRank = (pairCount + c) / 2 + 1;
  const intervalClamped = lowerRank < 1 || upperRank > pairCount;
  const [slope, slopeLower, slopeUpper] = pairwiseSlopesAtRanks(xc, yv, pairCount, [(pairCount + 1) / 2, lowerRank, upperRank]) as [
    number,
    number,
    number,
  ];
  if (!Number.isFinite(slope)) return tooExtremeFor(n);

  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = (ys[i] as number) - slope * (xc[i] as number);
  if (!residuals.every(Number.isFinite)) return tooExtremeFor(n);
  const yAtCentre = median(residuals);
  const intercept = yAtCentre - slope * xCentre;

  if (![intercept, yAtCentre, slopeLower, slopeUpper].every(Number.isFinite)) return tooExtremeFor(n);

  return {
    status: 'ok',
    n,
    pairs: pairCount,
    slope,
    intercept,
    xCentre,
    yAtCentre,
    slopeLower,
    slopeUpper,
    confidence,
    intervalClamped,
  };
}

function tooExtremeFor(n: number): NotEnoughData {
  return notEnoughData('the times are too close together or the values too large to estimate a slope numerically', n);
}
