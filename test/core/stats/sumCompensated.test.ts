import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { sumCompensated } from '../../../core/stats/sumCompensated';

describe('sumCompensated (Neumaier)', () => {
  it('keeps what plain addition drops (documented example)', () => {
    expect(sumCompensated([1, 1e100, 1, -1e100])).toBe(2);
    expect([1, 1e100, 1, -1e100].reduce((a, b) => a + b, 0)).toBe(0);
  });

  it('sums 0.1 ten times to 1 exactly, and the empty sum is 0', () => {
    expect(sumCompensated(new Array<number>(10).fill(0.1))).toBe(1);
    expect(sumCompensated([])).toBe(0);
  });

  it('agrees with simple-statistics 7 sum (also Kahan-compensated)', () => {
    const values = Array.from({ length: 1000 }, (_, i) => Math.sin(i) * 1e6);
    expect(sumCompensated(values)).toBeCloseTo(ss.sum(values), 6);
  });

  it('throws on NaN', () => {
    expect(() => sumCompensated([Number.NaN])).toThrow('sumCompensated requires finite values');
  });
});
