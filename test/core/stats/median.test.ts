import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { median } from '../../../core/stats/median';

describe('median', () => {
  it('takes the middle value, or the mean of the two middle values', () => {
    expect(median([3, 1, 4, 1, 5, 9])).toBe(3.5);
    expect(median([3, 1, 4, 1, 5])).toBe(3);
    expect(median([7])).toBe(7);
    expect(median([2, 2, 2])).toBe(2);
  });

  it('agrees with simple-statistics 7 median', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 80 }), (values) => {
        expect(median(values)).toBeCloseTo(ss.median(values), 6);
      }),
    );
  });

  it('throws a clear message on n = 0 and NaN', () => {
    expect(() => median([])).toThrow('median requires at least one value');
    expect(() => median([Number.NaN])).toThrow('finite values');
  });
});
