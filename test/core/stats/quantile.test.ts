import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { quantile } from '../../../core/stats/quantile';

describe('quantile', () => {
  it('sorts a copy and leaves the input alone', () => {
    const values = [4, 1, 3, 2];
    expect(quantile(values, 0.25)).toBe(1.75);
    expect(values).toEqual([4, 1, 3, 2]);
  });

  it('agrees with simple-statistics 7 quantile on unsorted random samples', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 1, maxLength: 50 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (values, p) => {
          expect(quantile(values, p)).toBeCloseTo(ss.quantile(values, p), 9);
        },
      ),
    );
  });

  it('is monotone in p', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 1, maxLength: 30 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (values, p1, p2) => {
          const [lo, hi] = p1 <= p2 ? [p1, p2] : [p2, p1];
          expect(quantile(values, lo)).toBeLessThanOrEqual(quantile(values, hi) + 1e-9);
        },
      ),
    );
  });

  it('throws on empty input, NaN and Infinity', () => {
    expect(() => quantile([], 0.5)).toThrow('quantile requires at least one value');
    expect(() => quantile([1, Number.NaN], 0.5)).toThrow('quantile requires finite values (index 1 is NaN)');
    expect(() => quantile([Infinity, 1], 0.5)).toThrow('index 0 is Infinity');
  });
});
