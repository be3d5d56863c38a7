import { assertFiniteValues } from './assertFiniteValues';
import { mean } from './mean';
import { notEnoughData, type NotEnoughData } from './notEnoughData';
import { studentTTwoSidedPValue } from './studentTTwoSidedPValue';

/** An ordinary least-squares line with the test of its slope against zero. */
export interface LinearRegressionFit {
  readonly status: 'ok';
  readonly n: number;
  /** Slope, in y units per x unit. */
  readonly slope: number;
  /** y at x = 0 (y units). With large x (epoch ms) prefer `yAtCentre`. */
  readonly intercept: number;
  /** Mean of x (x units). */
  readonly xCentre: number;
  /** Fitted y at the mean of x, which is the mean of y (y units). */
  readonly yAtCentre: number;
  /** Coefficient of determination, in [0, 1]. */
  readonly rSquared: number;
  /** Standard error of the slope (y units per x unit). */
  readonly slopeStandardError: number;
  /** slope / slopeStandardError; +-Infinity for an exact fit. */
  readonly t: number;
  /** n - 2. */
  readonly degreesOfFreedom: number;
  /** Two-sided p-value of t under slope = 0. */
  readonly pValue: number;
}

/**
 * Simple linear regression by ordinary least squares, with the t test of the
 * slope.
 *
 * Formula in words (two passes, x and y centred on their means for accuracy):
 * - Sxx = sum (x - mean x)^2, Sxy = sum (x - mean x)(y - mean y), Syy likewise;
 * - slope b = Sxy / Sxx, intercept a = mean y - b mean x;
 * - SSE = sum of squared residuals; r^2 = Sxy^2 / (Sxx Syy);
 * - standard error of b = sqrt(SSE / (n - 2) / Sxx); t = b / se;
 * - p = P(|T| >= |t|) for Student's t with n - 2 degrees of freedom
 *   ({@link studentTTwoSidedPValue}: incomplete beta, Numerical Recipes / Lentz).
 *
 * Units: slope in y units per x unit; r^2, t and p dimensionless.
 * Throws on NaN or infinite input, or lengths that differ. Fewer than 3 points,
 * all x equal, or all y equal give `not-enough-data` (no slope, or nothing to
 * explain), never NaN.
 *
 * Reference: N. R. Draper and H. Smith (1998), Applied Regression Analysis, 3rd
 * ed., ch. 1 and 3; Helsel & Hirsch (2002), USGS TWRI 4-A3, ch. 9.
 *
 * Example: `linearRegression([1, 2, 3, 4, 5], [2, 4, 5, 4, 5])` gives slope 0.6,
 * intercept 2.2, r^2 = 0.6, se = 0.2828..., t = 2.1213..., p = 0.1240...
 */
export function linearRegression(xs: ArrayLike<number>, ys: ArrayLike<number>): LinearRegressionFit | NotEnoughData {
  if (xs.length !== ys.length) {
    throw new RangeError(`linearRegression requires xs and ys of equal length, got ${xs.length} and ${ys.length}`);
  }
  assertFiniteValues(xs, 'linearRegression');
  assertFiniteValues(ys, 'linearRegression');
  const n = xs.length;
  if (n < 3) return notEnoughData(`a regression needs at least 3 points, got ${n}`, n);
  const xCentre = mean(xs);
  const yCentre = mean(ys);
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = (xs[i] as number) - xCentre;
    const dy = (ys[i] as number) - yCentre;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!allDiffer(xs)) return notEnoughData('all x values are equal: no slope can be estimated', n);
  if (!allDiffer(ys)) return notEnoughData('all y values are equal: there is no variation to explain', n);
  // Spreads that under- or overflow double precision (|dx| < 1e-154 or > 1e154).
  if (!(sxx > 0 && sxx < Infinity && syy > 0 && syy < Infinity)) {
    return notEnoughData('the values are too close together or too large to fit numerically', n);
  }
  const slope = sxy / sxx;
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = (ys[i] as number) - yCentre - slope * ((xs[i] as number) - xCentre);
    sse += r * r;
  }
  const degreesOfFreedom = n - 2;
  // (Sxy / Sxx)(Sxy / Syy) rather than Sxy^2 / (Sxx Syy), which overflows sooner.
  const rSquared = Math.min(1, Math.max(0, slope * (sxy / syy)));
  const slopeStandardError = Math.sqrt(sse / degreesOfFreedom / sxx);
  let t: number;
  if (slopeStandardError > 0) t = slope / slopeStandardError;
  else t = slope > 0 ? Infinity : slope < 0 ? -Infinity : 0;
  const intercept = yCentre - slope * xCentre;
  if (Number.isNaN(t) || ![slope, intercept, rSquared, slopeStandardError].every(Number.isFinite)) {
    return notEnoughData('the values are too close together or too large to fit numerically', n);
  }
  const pValue = studentTTwoSidedPValue(t, degreesOfFreedom);
  return {
    status: 'ok',
    n,
    slope,
    intercept,
    xCentre,
    yAtCentre: yCentre,
    rSquared,
    slopeStandardError,
    t,
    degreesOfFreedom,
    pValue,
  };
}

/** True when not every value equals the first (exact comparison). */
function allDiffer(values: ArrayLike<number>): boolean {
  const first = values[0];
  for (let i = 1; i < values.length; i++) if (values[i] !== first) return true;
  return false;
}
