import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mannKendall, type MannKendallResult } from '../../../core/stats/mannKendall';

function ok(result: ReturnType<typeof mannKendall>): MannKendallResult {
  if (result.status !== 'ok') throw new Error(`expected a result, got not-enough-data: ${result.reason}`);
  return result;
}

describe('mannKendall', () => {
  it('reproduces the MannKendall.jl test suite for 1..100', () => {
    // mmhs013/MannKendall.jl test/runtests.jl (a port of pyMannKendall):
    // s = 4950, var_s = 112750, z = 14.73869998208331, tau = 1, trend 'increasing'.
    const r = ok(mannKendall(Array.from({ length: 100 }, (_, i) => i + 1)));
    expect(r.s).toBe(4950);
    expect(r.varianceS).toBe(112750);
    expect(r.z).toBeCloseTo(14.73869998208331, 12);
    expect(r.tau).toBe(1);
    expect(r.direction).toBe('increasing');
    expect(r.pValue).toBeLessThan(1e-40);
  });

  it('reproduces the Ipaper.jl slope_mk docstring example (n = 10, no ties)', () => {
    // jl-pkgs/Ipaper.jl, ext/IpaperSlopeExt/slope_mk.jl docstring:
    // mkTrend([4.81, 4.17, 4.41, 3.59, 5.87, 3.83, 6.03, 4.89, 4.32, 4.69])
    // gives z0 = 0.35777087639996635, pval0 = 0.7205147871362552.
    const r = ok(mannKendall([4.81, 4.17, 4.41, 3.59, 5.87, 3.83, 6.03, 4.89, 4.32, 4.69]));
    expect(r.s).toBe(5);
    expect(r.varianceS).toBe(125);
    expect(r.z).toBeCloseTo(0.35777087639996635, 14);
    expect(r.pValue).toBeCloseTo(0.7205147871362552, 13);
    expect(r.direction).toBe('no trend');
  });

  it('applies the tie correction of Gilbert (1987) eq. 16.4, worked by hand', () => {
    // y = 1, 2, 2, 3, 3, 3, 4 (n = 7, tie groups of 2 and 3): no pair falls, so
    // S = 21 pairs - 1 - 3 tied pairs = 17; Var S = (798 - 18 - 66) / 18 = 39.667;
    // Z = (17 - 1) / sqrt(39.667) = 2.54043; p = 2 (1 - Phi(2.54043)) = 0.011072;
    // tau-b = 17 / sqrt((21 - 4) * 21) = 0.899735.
    const r = ok(mannKendall([1, 2, 2, 3, 3, 3, 4]));
    expect(r.s).toBe(17);
    expect(r.varianceS).toBeCloseTo(714 / 18, 12);
    expect(r.z).toBeCloseTo(16 / Math.sqrt(714 / 18), 12);
    expect(r.pValue).toBeCloseTo(0.011072, 5);
    expect(r.tau).toBeCloseTo(17 / Math.sqrt(17 * 21), 12);
    expect(r.tieGroups.values).toEqual([2, 3]);
    expect(r.direction).toBe('increasing');
  });

  it('computes S as the brute-force sum of sign products, with or without times', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 20 }), fc.integer({ min: -5, max: 5 })), { minLength: 3, maxLength: 30 }),
        (pairs) => {
          const xs = pairs.map((p) => p[0]);
          const ys = pairs.map((p) => p[1]);
          const r = mannKendall(ys, { xs });
          let s = 0;
          for (let i = 0; i < xs.length; i++)
            for (let j = i + 1; j < xs.length; j++) s += Math.sign((xs[j] as number) - (xs[i] as number)) * Math.sign((ys[j] as number) - (ys[i] as number));
          if (r.status === 'ok') {
            expect(r.s).toBe(s);
            expect(r.pValue).toBeGreaterThanOrEqual(0);
            expect(r.pValue).toBeLessThanOrEqual(1);
            expect(Math.abs(r.tau)).toBeLessThanOrEqual(1 + 1e-12);
            expect(Number.isFinite(r.z)).toBe(true);
          } else {
            expect(r.reason.length).toBeGreaterThan(0);
          }
        },
      ),
    );
  });

  it('gives the same answer whatever order (time, value) pairs are listed in', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 1000 }), { minLength: 3, maxLength: 25 }),
        fc.array(fc.integer({ min: 0, max: 100 }), { minLength: 25, maxLength: 25 }),
        (xs, ysAll) => {
          const ys = ysAll.slice(0, xs.length);
          const order = xs.map((x, i) => [x, i] as const).sort((a, b) => a[0] - b[0]).map((p) => p[1]);
          const a = mannKendall(ys, { xs });
          const b = mannKendall(order.map((i) => ys[i] as number));
          expect(a).toEqual(b.status === 'ok' ? { ...b, tieGroups: { values: b.tieGroups.values, times: [] } } : b);
        },
      ),
    );
  });

  it('is invariant under strictly increasing transforms of the values', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 3, maxLength: 40 }), (ys) => {
        const base = mannKendall(ys);
        for (const f of [(v: number) => 3 * v + 7, (v: number) => v * v * v, (v: number) => Math.exp(v / 10)]) {
          expect(mannKendall(ys.map(f))).toEqual(base);
        }
      }),
    );
  });

  it('flips the sign of S, z and tau (same p) when the values are negated', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 3, maxLength: 40 }), (ys) => {
        const a = mannKendall(ys);
        const b = mannKendall(ys.map((v) => -v));
        if (a.status !== 'ok' || b.status !== 'ok') {
          expect(a.status).toBe(b.status);
          return;
        }
        expect(b.s).toBe(0 - a.s);
        expect(b.z).toBe(a.z === 0 ? 0 : -a.z);
        expect(b.pValue).toBe(a.pValue);
        expect(b.tau).toBeCloseTo(-a.tau, 14);
      }),
    );
  });

  it('says "decreasing" for a significant fall and respects alpha', () => {
    const falling = [10, 9, 8, 8, 7, 5, 6, 4, 3, 2, 1];
    expect(ok(mannKendall(falling)).direction).toBe('decreasing');
    const r = ok(mannKendall([1, 3, 2, 4, 3, 5]));
    expect(ok(mannKendall([1, 3, 2, 4, 3, 5], { alpha: Math.min(0.999, r.pValue + 0.01) })).direction).toBe('increasing');
    expect(ok(mannKendall([1, 3, 2, 4, 3, 5], { alpha: r.pValue / 2 })).direction).toBe('no trend');
  });

  describe('degenerate input gives not-enough-data with a reason, never NaN', () => {
    it.each([
      ['n = 0', [] as number[], 'at least 3 readings, got 0'],
      ['n = 1', [5], 'at least 3 readings, got 1'],
      ['n = 2', [5, 6], 'at least 3 readings, got 2'],
      ['all values equal', [4, 4, 4, 4, 4], 'same value'],
    ])('%s', (_name, ys, reason) => {
      const r = mannKendall(ys);
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') {
        expect(r.reason).toContain(reason);
        expect(r.n).toBe(ys.length);
      }
    });

    it('all readings at one time', () => {
      const r = mannKendall([1, 2, 3, 4], { xs: [7, 7, 7, 7] });
      expect(r).toEqual({ status: 'not-enough-data', reason: 'all readings are at one time: there is no time order to test', n: 4 });
    });

    it('throws on NaN, Infinity, mismatched lengths and a bad alpha', () => {
      expect(() => mannKendall([1, Number.NaN, 3])).toThrow('mannKendall requires finite values (index 1 is NaN)');
      expect(() => mannKendall([1, 2, 3], { xs: [1, Infinity, 3] })).toThrow('index 1 is Infinity');
      expect(() => mannKendall([1, 2, 3], { xs: [1, 2] })).toThrow('equal length');
      expect(() => mannKendall([1, 2, 3], { alpha: 0 })).toThrow('alpha in (0, 1)');
    });
  });
});
