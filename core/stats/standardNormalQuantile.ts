import { standardNormalCdf } from './standardNormalCdf';

/**
 * Quantile (inverse CDF) of the standard normal distribution: the z with
 * Phi(z) = p.
 *
 * Formula in words: start from the Abramowitz & Stegun 26.2.23 rational
 * approximation (error < 4.5e-4), then refine with Halley steps on
 * Phi(z) - p using the normal density phi(z) = exp(-z^2 / 2) / sqrt(2 pi),
 * until the step is below 1e-15 relative; the accuracy is then that of
 * {@link standardNormalCdf} (about 1e-15).
 *
 * Units: p is a probability in (0, 1); the result is in standard deviations.
 * Throws for p outside (0, 1) or NaN.
 *
 * Reference: Abramowitz & Stegun (1964), 26.2.23; Halley's method, e.g.
 * Press et al., Numerical Recipes, 3rd ed. (2007), 9.4.
 *
 * Example: `standardNormalQuantile(0.975)` is 1.959963984540054.
 */
export function standardNormalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`standardNormalQuantile requires p in (0, 1), got ${String(p)}`);
  if (p === 0.5) return 0;
  const q = p < 0.5 ? p : 1 - p;
  const t = Math.sqrt(-2 * Math.log(q));
  const guess = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  let z = p < 0.5 ? -guess : guess;
  for (let i = 0; i < 50; i++) {
    // Work in the tail that holds the precision: for z > 0 compare upper tails.
    // Phi(z) - p, written for z > 0 as (1 - p) - Phi(-z).
    const err = z > 0 ? 1 - p - standardNormalCdf(-z) : standardNormalCdf(z) - p;
    const density = Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI);
    if (density === 0) break;
    const u = err / density;
    const step = u / (1 + 0.5 * z * u);
    z -= step;
    if (Math.abs(step) <= 1e-15 * Math.max(1, Math.abs(z))) break;
  }
  return z;
}
