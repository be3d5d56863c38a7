import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { kendallVarianceS } from '../../../core/stats/kendallVarianceS';
import { tieGroupSizes } from '../../../core/stats/tieGroupSizes';

/** All permutations of 0..n-1 (Heap's algorithm). */
function permutations(n: number): number[][] {
  const a = Array.from({ length: n }, (_, i) => i);
  const out: number[][] = [a.slice()];
  const c = new Array<number>(n).fill(0);
  let i = 0;
  while (i < n) {
    if ((c[i] as number) < i) {
      const j = i % 2 === 0 ? 0 : (c[i] as number);
      [a[j], a[i]] = [a[i] as number, a[j] as number];
      out.push(a.slice());
      c[i] = (c[i] as number) + 1;
      i = 0;
    } else {
      c[i] = 0;
      i++;
    }
  }
  return out;
}

function kendallS(xs: number[], ys: number[]): number {
  let s = 0;
  for (let i = 0; i < xs.length; i++) {
    for (let j = i + 1; j < xs.length; j++) s += Math.sign((xs[j] as number) - (xs[i] as number)) * Math.sign((ys[j] as number) - (ys[i] as number));
  }
  return s;
}

describe('kendallVarianceS', () => {
  it('is n(n-1)(2n+5)/18 without ties (documented examples)', () => {
    expect(kendallVarianceS(10, [], [])).toBe(125);
    // MannKendall.jl's test suite: n = 100, var_s = 112750.
    expect(kendallVarianceS(100, [], [])).toBe(112750);
  });

  it('applies the Gilbert (1987) eq. 16.4 tie correction, worked by hand', () => {
    // n = 7 with value ties of sizes 2 and 3:
    // [7*6*19 - 2*1*9 - 3*2*11] / 18 = (798 - 18 - 66) / 18 = 714 / 18.
    expect(kendallVarianceS(7, [2, 3], [])).toBeCloseTo(714 / 18, 12);
  });

  it('equals the exact permutation variance of S, with ties in y and in x (Kendall 1975)', () => {
    // Under no association every assignment of the y values to the x values is
    // equally likely; the variance of S over all n! assignments is exactly what
    // Kendall's formula (ties in both rankings) must give.
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 3, maxLength: 7 }),
        fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 7, maxLength: 7 }),
        (ys, xsAll) => {
          const n = ys.length;
          const xs = xsAll.slice(0, n);
          let sum2 = 0;
          let count = 0;
          for (const perm of permutations(n)) {
            const s = kendallS(xs, perm.map((k) => ys[k] as number));
            sum2 += s * s;
            count++;
          }
          expect(kendallVarianceS(n, tieGroupSizes(ys), tieGroupSizes(xs))).toBeCloseTo(sum2 / count, 9);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('throws for n < 2', () => {
    expect(() => kendallVarianceS(1, [], [])).toThrow('integer n >= 2');
  });
});
