import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { kendallS } from '../../../core/stats/kendallS';

function bruteForce(ys: number[], xs?: number[]): number {
  let s = 0;
  for (let i = 0; i < ys.length; i++)
    for (let j = i + 1; j < ys.length; j++) {
      const dx = xs === undefined ? 1 : Math.sign((xs[j] as number) - (xs[i] as number));
      s += dx * Math.sign((ys[j] as number) - (ys[i] as number));
    }
  return s;
}

describe("kendallS (Knight's O(n log n) method)", () => {
  it('gives the documented example and the trivial cases', () => {
    expect(kendallS([1, 2, 2, 3, 3, 3, 4])).toBe(17);
    expect(kendallS([])).toBe(0);
    expect(kendallS([5])).toBe(0);
    expect(kendallS([3, 2, 1])).toBe(-3);
    // 1..100 in order: S = 4950 (MannKendall.jl test suite).
    expect(kendallS(Array.from({ length: 100 }, (_, i) => i + 1))).toBe(4950);
  });

  it('equals the O(n^2) definition, with ties in values and in times', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 30 }), fc.integer({ min: -6, max: 6 })), { maxLength: 300 }),
        fc.boolean(),
        (pairs, withTimes) => {
          const ys = pairs.map((p) => p[1]);
          const xs = withTimes ? pairs.map((p) => p[0]) : undefined;
          expect(kendallS(ys, xs)).toBe(bruteForce(ys, xs));
        },
      ),
    );
  });

  it('does not change its input', () => {
    const ys = [3, 1, 2];
    const xs = [2, 0, 1];
    kendallS(ys, xs);
    expect(ys).toEqual([3, 1, 2]);
    expect(xs).toEqual([2, 0, 1]);
  });
});
