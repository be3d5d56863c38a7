import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { sampleVariance } from '../../../core/stats/sampleVariance';

describe('sampleVariance (Welford)', () => {
  it('computes the documented example', () => {
    expect(sampleVariance([2, 4, 4, 4, 5, 5, 7, 9])).toBeCloseTo(32 / 7, 14);
  });

  it('survives a large offset where the textbook one-pass formula fails', () => {
    // Welford (1962) / Knuth 4.2.2's classic case: 1e9 + {4, 7, 13, 16} has variance 30.
    expect(sampleVariance([1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16])).toBe(30);
    const naive = (xs: number[]) => {
      const n = xs.length;
      const s = xs.reduce((a, b) => a + b, 0);
      const s2 = xs.reduce((a, b) => a + b * b, 0);
      return (s2 - (s * s) / n) / (n - 1);
    };
    expect(naive([1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16])).not.toBe(30);
  });

  it('agrees with simple-statistics 7 sampleVariance', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 2, maxLength: 100 }), (values) => {
        const theirs = ss.sampleVariance(values);
        expect(Math.abs(sampleVariance(values) - theirs)).toBeLessThanOrEqual(1e-7 * (1 + theirs));
      }),
    );
  });

  it('is 0 for equal values and throws for n < 2 or NaN', () => {
    expect(sampleVariance([3, 3, 3])).toBe(0);
    expect(() => sampleVariance([1])).toThrow('sampleVariance requires at least two values');
    expect(() => sampleVariance([])).toThrow('at least two values');
    expect(() => sampleVariance([1, Number.NaN])).toThrow('finite values');
  });
});
