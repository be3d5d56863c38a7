import { sumCompensated } from './sumCompensated';

/**
 * Arithmetic mean: the compensated sum of the values divided by their count.
 *
 * Units: the unit of the values. Throws on empty input and on NaN or infinity.
 *
 * Reference: any statistics text; the summation is Neumaier's (see
 * {@link sumCompensated}), so the mean of many large, close values (times in ms,
 * fields in V/m) is not spoiled by rounding.
 *
 * Example: `mean([2, 4, 4, 4, 5, 5, 7, 9])` is 5.
 */
export function mean(values: ArrayLike<number>): number {
  if (values.length === 0) throw new RangeError('mean requires at least one value');
  return sumCompensated(values) / values.length;
}
