import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { regularizedIncompleteBeta as ibeta } from '../../../core/stats/regularizedIncompleteBeta';

describe('regularizedIncompleteBeta (Numerical Recipes betacf, modified Lentz)', () => {
  it('matches closed forms', () => {
    // I_0.5(2, 3) = 11/16 (binomial: P(at least 2 of 4 successes at p = 0.5)).
    expect(ibeta(0.5, 2, 3)).toBeCloseTo(11 / 16, 14);
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 0.999, noNaN: true }), fc.double({ min: 0.1, max: 40, noNaN: true }), (x, a) => {
        // A&S 26.5.?: I_x(a, 1) = x^a and I_x(1, b) = 1 - (1 - x)^b.
        expect(ibeta(x, a, 1)).toBeCloseTo(Math.pow(x, a), 12);
        expect(ibeta(x, 1, a)).toBeCloseTo(1 - Math.pow(1 - x, a), 12);
        // Symmetry: I_x(a, b) = 1 - I_(1-x)(b, a); and I_0.5(a, a) = 1/2.
        expect(ibeta(x, a, 2.5) + ibeta(1 - x, 2.5, a)).toBeCloseTo(1, 12);
        expect(ibeta(0.5, a, a)).toBeCloseTo(0.5, 12);
      }),
    );
  });

  it('is 0 at x = 0 and 1 at x = 1, and increasing in x', () => {
    expect(ibeta(0, 2, 3)).toBe(0);
    expect(ibeta(1, 2, 3)).toBe(1);
    let prev = 0;
    for (let x = 0.01; x < 1; x += 0.01) {
      const v = ibeta(x, 3.5, 0.5);
      expect(v).toBeGreaterThanOrEqual(prev);
      prev = v;
    }
  });

  it('throws on arguments out of range', () => {
    expect(() => ibeta(1.1, 1, 1)).toThrow('x in [0, 1]');
    expect(() => ibeta(Number.NaN, 1, 1)).toThrow('x in [0, 1]');
    expect(() => ibeta(0.5, 0, 1)).toThrow('a > 0 and b > 0');
    expect(() => ibeta(0.5, 1, -2)).toThrow('a > 0 and b > 0');
  });
});
