import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { percentile } from '../../../core/stats/percentile';

describe('percentile', () => {
  it('is the type 7 quantile at percent / 100 (documented example)', () => {
    expect(percentile([10, 20, 30, 40, 50], 90)).toBe(46);
    expect(percentile([10, 20, 30, 40, 50], 0)).toBe(10);
    expect(percentile([10, 20, 30, 40, 50], 100)).toBe(50);
  });

  it('matches numpy.percentile / R quantile type 7 on a textbook set', () => {
    // Wikipedia "Percentile", second variant (C = 1, = numpy "linear"), from memory:
    // 40th percentile of 15, 20, 35, 40, 50 is 29 (h = 1.6, 20 + 0.6 * 15). Also simple-statistics 7.
    expect(percentile([15, 20, 35, 40, 50], 40)).toBeCloseTo(29, 12);
    expect(percentile([15, 20, 35, 40, 50], 40)).toBeCloseTo(ss.quantile([15, 20, 35, 40, 50], 0.4), 12);
  });

  it('throws outside 0 to 100 and on empty input', () => {
    expect(() => percentile([1], 101)).toThrow('percent in [0, 100]');
    expect(() => percentile([1], -1)).toThrow('percent in [0, 100]');
    expect(() => percentile([], 50)).toThrow('at least one value');
  });
});
