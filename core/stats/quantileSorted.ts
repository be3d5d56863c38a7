/**
 * Quantile of an already ascending-sorted sample by linear interpolation between
 * order statistics: Hyndman & Fan (1996) definition 7, the default of R's
 * `quantile()` (type = 7), numpy's `percentile` ("linear"), Excel's PERCENTILE.INC
 * and simple-statistics' `quantileSorted`.
 *
 * Formula in words: h = (n - 1) * p (0-based position); the result is
 * x[floor(h)] + (h - floor(h)) * (x[floor(h) + 1] - x[floor(h)]).
 *
 * Units: `p` is a fraction in [0, 1]; the result has the unit of the values.
 * The caller guarantees ascending order (not checked: that would cost a pass).
 * Throws on empty input, on p outside [0, 1] or NaN, and if an interpolated
 * value is not finite.
 *
 * Reference: R. J. Hyndman and Y. Fan (1996), "Sample quantiles in statistical
 * packages", The American Statistician 50(4):361–365.
 *
 * Example: `quantileSorted([1, 2, 3, 4], 0.25)` is 1.75 (h = 0.75).
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new RangeError('quantileSorted requires at least one value');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantileSorted requires p in [0, 1], got ${String(p)}`);
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  const a = sorted[lo] as number;
  const b = sorted[hi] as number;
  const fraction = h - lo;
  // Written as a + f (b - a) so equal neighbours give exactly that value.
  const q = fraction === 0 ? a : a + fraction * (b - a);
  if (!Number.isFinite(q)) throw new RangeError('quantileSorted requires finite values');
  return q;
}
