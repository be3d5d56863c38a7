import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { logGamma } from '../../../core/stats/logGamma';

describe('logGamma (Lanczos)', () => {
  it('matches exact values: ln((n-1)!) and ln Gamma(1/2) = ln sqrt(pi)', () => {
    let factorial = 1;
    for (let n = 1; n <= 20; n++) {
      if (n > 1) factorial *= n - 1;
      expect(Math.abs(logGamma(n) - Math.log(factorial))).toBeLessThan(1e-13 * Math.max(1, Math.log(factorial)));
    }
    expect(logGamma(0.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI)), 14);
    // Gamma(3/2) = sqrt(pi) / 2; Gamma(1/3) = 2.678938534707747 (A&S 6.1.9 table).
    expect(logGamma(1.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI) / 2), 14);
    expect(logGamma(1 / 3)).toBeCloseTo(Math.log(2.678938534707747), 13);
  });

  it('agrees with simple-statistics 7 gammaln', () => {
    for (const x of [0.1, 0.5, 1.7, 3.3, 10.5, 50, 171.5]) {
      expect(Math.abs(logGamma(x) - ss.gammaln(x))).toBeLessThan(1e-10 * Math.max(1, Math.abs(logGamma(x))));
    }
  });

  it('throws for x <= 0, NaN and infinity', () => {
    expect(() => logGamma(0)).toThrow('logGamma requires a finite x > 0');
    expect(() => logGamma(-1)).toThrow('x > 0');
    expect(() => logGamma(Number.NaN)).toThrow('x > 0');
    expect(() => logGamma(Infinity)).toThrow('x > 0');
  });
});
