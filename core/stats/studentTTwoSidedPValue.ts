import { regularizedIncompleteBeta } from './regularizedIncompleteBeta';

/**
 * Two-sided p-value of Student's t distribution: P(|T| >= |t|) for T with `df`
 * degrees of freedom.
 *
 * Formula in words: P(|T| >= |t|) = I_x(df / 2, 1 / 2) with x = df / (df + t^2),
 * the regularized incomplete beta function (see {@link regularizedIncompleteBeta});
 * 1 - x is passed as t^2 / (df + t^2) so small t keeps full accuracy.
 *
 * Units: t dimensionless (an estimate over its standard error); df > 0 (need not
 * be an integer); the result is a probability in [0, 1]. |t| = Infinity gives 0.
 * Throws on NaN t or df <= 0.
 *
 * Reference: Abramowitz & Stegun (1964) 26.7.1 and 26.5.27; Press et al.,
 * Numerical Recipes, 3rd ed. (2007), 6.14.
 *
 * Example: `studentTTwoSidedPValue(2.228138851964938, 10)` is 0.05 (the 97.5 %
 * point of t with 10 df; tables print 2.228).
 */
export function studentTTwoSidedPValue(t: number, df: number): number {
  if (Number.isNaN(t)) throw new RangeError('studentTTwoSidedPValue requires a number t, got NaN');
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`studentTTwoSidedPValue requires finite df > 0, got ${String(df)}`);
  if (!Number.isFinite(t)) return 0;
  const t2 = t * t;
  const x = df / (df + t2);
  const oneMinusX = t2 / (df + t2);
  return regularizedIncompleteBeta(x, df / 2, 0.5, oneMinusX);
}
