import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { mean } from '../../../core/stats/mean';

describe('mean', () => {
  it('computes the documented example', () => {
    expect(mean([2, 4, 4, 4, 5, 5, 7, 9])).toBe(5);
  });

  it('stays exact for large, close values (epoch ms)', () => {
    const t0 = Date.UTC(2024, 0, 1);
    expect(mean([t0 + 1, t0 + 2, t0 + 3])).toBe(t0 + 2);
  });

  it('agrees with simple-statistics 7 mean', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1e9, max: 1e9, noNaN: true }), { minLength: 1, maxLength: 100 }), (values) => {
        const theirs = ss.mean(values);
        expect(Math.abs(mean(values) - theirs)).toBeLessThanOrEqual(1e-6 * (1 + Math.abs(theirs)));
      }),
    );
  });

  it('throws on n = 0, NaN and Infinity (never returns NaN)', () => {
    expect(() => mean([])).toThrow('mean requires at least one value');
    expect(() => mean([1, Number.NaN])).toThrow('index 1 is NaN');
    expect(() => mean([-Infinity])).toThrow('index 0 is -Infinity');
  });
});
