import { assertFiniteValues } from './assertFiniteValues';

/**
 * Sample variance (unbiased, divisor n - 1), accumulated in one pass with
 * Welford's update, which stays accurate when the values are large and close
 * together (where "sum of squares minus square of sum" loses every digit).
 *
 * Formula in words: keep a running mean m and a running sum of squared deviations
 * M2; for the k-th value x, delta = x - m, m += delta / k, M2 += delta * (x - m);
 * the variance is M2 / (n - 1).
 *
 * Units: the square of the unit of the values. Throws when n < 2 (a variance of one
 * value is undefined) and on NaN or infinity.
 *
 * Reference: B. P. Welford (1962), "Note on a method for calculating corrected sums
 * of squares and products", Technometrics 4(3):419–420; Knuth, TAOCP vol. 2, 4.2.2.
 *
 * Example: `sampleVariance([2, 4, 4, 4, 5, 5, 7, 9])` is 32 / 7 = 4.571428...
 */
export function sampleVariance(values: ArrayLike<number>): number {
  if (values.length < 2) throw new RangeError('sampleVariance requires at least two values');
  assertFiniteValues(values, 'sampleVariance');
  let m = 0;
  let m2 = 0;
  for (let i = 0; i < values.length; i++) {
    const x = values[i] as number;
    const delta = x - m;
    m += delta / (i + 1);
    m2 += delta * (x - m);
  }
  return m2 / (values.length - 1);
}
