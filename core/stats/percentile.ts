import { quantile } from './quantile';

/**
 * Percentile on the 0–100 scale: `quantile(values, percent / 100)` with linear
 * interpolation (R type 7, numpy's default, Excel PERCENTILE.INC).
 *
 * Units: `percent` in per cent, 0 to 100; the result has the unit of the values.
 * Throws on empty input, NaN or infinity, and percent outside [0, 100].
 *
 * Reference: Hyndman & Fan (1996), definition 7.
 *
 * Example: `percentile([10, 20, 30, 40, 50], 90)` is 46.
 */
export function percentile(values: ArrayLike<number>, percent: number): number {
  if (!(percent >= 0 && percent <= 100)) {
    throw new RangeError(`percentile requires percent in [0, 100], got ${String(percent)}`);
  }
  return quantile(values, percent / 100);
}
