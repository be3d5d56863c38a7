import { assertFiniteValues } from './assertFiniteValues';

/**
 * Sum of `values` with Neumaier's compensated summation (the Kahan–Babuška
 * algorithm): a running correction term keeps the low-order bits that plain
 * left-to-right addition drops, so the error does not grow with n.
 *
 * Formula in words: add each value to the running sum; add the part lost to
 * rounding (found by re-subtracting, larger magnitude first) to a separate
 * compensation; the result is sum + compensation.
 *
 * Units: the unit of the values. Empty input sums to 0.
 *
 * Reference: A. Neumaier (1974), "Rundungsfehleranalyse einiger Verfahren zur
 * Summation endlicher Summen", ZAMM 54:39–51; W. Kahan (1965), CACM 8(1):40.
 *
 * Example: `sumCompensated([1, 1e100, 1, -1e100])` is 2 (plain addition gives 0).
 */
export function sumCompensated(values: ArrayLike<number>): number {
  assertFiniteValues(values, 'sumCompensated');
  let sum = 0;
  let compensation = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i] as number;
    const t = sum + v;
    if (Math.abs(sum) >= Math.abs(v)) compensation += sum - t + v;
    else compensation += v - t + sum;
    sum = t;
  }
  return sum + compensation;
}
