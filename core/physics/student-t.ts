/**
 * Two-sided 95 % quantile of Student's t distribution, t_{0.975}(nu).
 *
 * Table values for nu = 1..30 from Abramowitz and Stegun, Handbook of Mathematical
 * Functions (1964), Table 26.10 (4 decimals); above 30 the Cornish-Fisher expansion
 * about the normal quantile z = 1.959964 (A&S 26.7.5), good to better than 1e-4.
 */
const T975: readonly number[] = [
  12.7062, 4.3027, 3.1824, 2.7764, 2.5706, 2.4469, 2.3646, 2.306, 2.2622, 2.2281,
  2.201, 2.1788, 2.1604, 2.1448, 2.1314, 2.1199, 2.1098, 2.1009, 2.093, 2.086,
  2.0796, 2.0739, 2.0687, 2.0639, 2.0595, 2.0555, 2.0518, 2.0484, 2.0452, 2.0423,
];

/** The standard normal 0.975 quantile. */
export const Z975 = 1.959963984540054;

/**
 * t_{0.975}(nu): the half-width multiplier of a 95 % confidence interval with nu
 * degrees of freedom.
 * @param degreesOfFreedom nu, a positive integer
 * @returns the quantile (dimensionless)
 * @example studentT975(1) // 12.7062; studentT975(10) // 2.2281; studentT975(120) // 1.9799
 */
export function studentT975(degreesOfFreedom: number): number {
  if (!Number.isInteger(degreesOfFreedom) || degreesOfFreedom < 1) throw new RangeError('studentT975 requires a positive whole number of degrees of freedom');
  const tabled = T975[degreesOfFreedom - 1];
  if (tabled !== undefined) return tabled;
  const z = Z975;
  const n = degreesOfFreedom;
  const z3 = z ** 3, z5 = z ** 5, z7 = z ** 7;
  return z + (z3 + z) / (4 * n) + (5 * z5 + 16 * z3 + 3 * z) / (96 * n * n) + (3 * z7 + 19 * z5 + 17 * z3 - 15 * z) / (384 * n ** 3);
}
