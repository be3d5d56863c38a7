import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { quantileSorted } from '../../../core/stats/quantileSorted';

describe('quantileSorted (R type 7)', () => {
  it('matches the worked examples in its documentation and in Hyndman & Fan (1996) type 7', () => {
    expect(quantileSorted([1, 2, 3, 4], 0.25)).toBe(1.75);
    // simple-statistics' own doc example for quantileSorted.
    expect(quantileSorted([3, 6, 7, 8, 8, 9, 10, 13, 15, 16, 20], 0.5)).toBe(9);
    expect(quantileSorted([3, 6, 7, 8, 8, 9, 10, 13, 15, 16, 20], 0.25)).toBe(7.5);
    expect(quantileSorted([3, 6, 7, 8, 8, 9, 10, 13, 15, 16, 20], 0.75)).toBe(14);
  });

  it('returns the ends at p = 0 and p = 1, and the only value for n = 1', () => {
    expect(quantileSorted([2, 5, 9], 0)).toBe(2);
    expect(quantileSorted([2, 5, 9], 1)).toBe(9);
    expect(quantileSorted([42], 0.3)).toBe(42);
  });

  it('agrees with simple-statistics 7 quantileSorted (also type 7) on random samples', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 60 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (values, p) => {
          const sorted = [...values].sort((a, b) => a - b);
          const ours = quantileSorted(sorted, p);
          const theirs = ss.quantileSorted(sorted, p);
          expect(Math.abs(ours - theirs)).toBeLessThanOrEqual(1e-9 * (1 + Math.abs(theirs)));
        },
      ),
    );
  });

  it('throws a clear message on empty input and p out of range', () => {
    expect(() => quantileSorted([], 0.5)).toThrow('quantileSorted requires at least one value');
    expect(() => quantileSorted([1, 2], 1.5)).toThrow('p in [0, 1]');
    expect(() => quantileSorted([1, 2], -0.1)).toThrow('p in [0, 1]');
    expect(() => quantileSorted([1, 2], Number.NaN)).toThrow('p in [0, 1]');
    expect(() => quantileSorted([1, Number.NaN], 0.5)).toThrow('finite');
  });
});
