import { assertFiniteValues } from './assertFiniteValues';
import { quantileSorted } from './quantileSorted';

/**
 * Quantile of an unsorted sample (R type 7, linear interpolation; see
 * {@link quantileSorted}). Sorts a copy; the input is not changed.
 *
 * Units: `p` is a fraction in [0, 1]; the result has the unit of the values.
 * Throws on empty input, NaN or infinity, and p outside [0, 1].
 *
 * Reference: Hyndman & Fan (1996), definition 7.
 *
 * Example: `quantile([4, 1, 3, 2], 0.25)` is 1.75.
 */
export function quantile(values: ArrayLike<number>, p: number): number {
  if (values.length === 0) throw new RangeError('quantile requires at least one value');
  assertFiniteValues(values, 'quantile');
  const sorted = Float64Array.from(values).sort();
  return quantileSorted(sorted, p);
}
