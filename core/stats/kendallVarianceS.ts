/**
 * Variance of Kendall's S statistic under the null hypothesis of no association,
 * with the correction for ties in y (the values) and in x (the times).
 *
 * Formula in words, with n points, tie groups of sizes t in y and u in x:
 *   Var(S) = [n(n-1)(2n+5) - sum t(t-1)(2t+5) - sum u(u-1)(2u+5)] / 18
 *          + [sum t(t-1)(t-2)] [sum u(u-1)(u-2)] / [9 n(n-1)(n-2)]
 *          + [sum t(t-1)] [sum u(u-1)] / [2 n(n-1)].
 * With no ties in x (one reading per time) the last two terms vanish and this is
 * Gilbert (1987) eq. 16.4, the Mann–Kendall variance; with no ties at all it is
 * n(n-1)(2n+5)/18.
 *
 * Units: S counts pairs, so Var(S) is in pairs squared. Throws for n < 2.
 *
 * Reference: M. G. Kendall (1975), Rank Correlation Methods, 4th ed., eq. 4.4
 * (ties in both rankings); R. O. Gilbert (1987), Statistical Methods for
 * Environmental Pollution Monitoring, eq. 16.4.
 *
 * Example: `kendallVarianceS(10, [], [])` is 125; `kendallVarianceS(100, [], [])`
 * is 112750.
 */
export function kendallVarianceS(n: number, yTieSizes: readonly number[], xTieSizes: readonly number[]): number {
  if (!Number.isInteger(n) || n < 2) throw new RangeError(`kendallVarianceS requires an integer n >= 2, got ${String(n)}`);
  let yMain = 0;
  let yCubic = 0;
  let yPairs = 0;
  for (const t of yTieSizes) {
    yMain += t * (t - 1) * (2 * t + 5);
    yCubic += t * (t - 1) * (t - 2);
    yPairs += t * (t - 1);
  }
  let xMain = 0;
  let xCubic = 0;
  let xPairs = 0;
  for (const u of xTieSizes) {
    xMain += u * (u - 1) * (2 * u + 5);
    xCubic += u * (u - 1) * (u - 2);
    xPairs += u * (u - 1);
  }
  let variance = (n * (n - 1) * (2 * n + 5) - yMain - xMain) / 18;
  if (n > 2) variance += (yCubic * xCubic) / (9 * n * (n - 1) * (n - 2));
  variance += (yPairs * xPairs) / (2 * n * (n - 1));
  return variance;
}
