import { quantile } from './quantile';

/**
 * Median: the middle value of the sorted sample, or the mean of the two middle
 * values when n is even (R type 7 quantile at p = 0.5).
 *
 * Units: the unit of the values. Throws on empty input, NaN or infinity.
 *
 * Reference: Hyndman & Fan (1996); any statistics text.
 *
 * Example: `median([3, 1, 4, 1, 5, 9])` is 3.5.
 */
export function median(values: ArrayLike<number>): number {
  if (values.length === 0) throw new RangeError('median requires at least one value');
  return quantile(values, 0.5);
}
