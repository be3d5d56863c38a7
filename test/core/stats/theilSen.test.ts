import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { theilSen, type TheilSenFit } from '../../../core/stats/theilSen';

function ok(result: ReturnType<typeof theilSen>): TheilSenFit {
  if (result.status !== 'ok') throw new Error(`expected a fit, got not-enough-data: ${result.reason}`);
  return result;
}

describe('theilSen', () => {
  it("reproduces R zyp.sen's slope and intercept (r-help, 6 Nov 2012)", () => {
    // x = 0..5, y = 6, 4, 1, 8, 7, 8: zyp.sen gives Intercept 4.5000000, x 0.6666667.
    const fit = ok(theilSen([0, 1, 2, 3, 4, 5], [6, 4, 1, 8, 7, 8]));
    expect(fit.slope).toBeCloseTo(2 / 3, 14);
    expect(fit.intercept).toBeCloseTo(4.5, 12);
    expect(fit.pairs).toBe(15);
  });

  it('computes the Sen (1968) / Gilbert (1987) 95 % interval, worked by hand', () => {
    // Same data. The 15 slopes, sorted: -3, -2.5, -2, -1, 0, 0.25, 0.4, 2/3, 1, 1,
    // 1, 2, 7/3, 3, 7. One tie group in y (two 8s): Var S = (6*5*17 - 2*1*9) / 18
    // = 27.333; C = 1.959964 * sqrt(27.333) = 10.2469; lower rank (15 - C) / 2 =
    // 2.3765 -> -2.5 + 0.3765 * 0.5 = -2.3117; upper rank (15 + C) / 2 + 1 =
    // 13.6235 -> 7/3 + 0.6235 * (3 - 7/3) = 2.7490.
    const fit = ok(theilSen([0, 1, 2, 3, 4, 5], [6, 4, 1, 8, 7, 8]));
    const c = 1.959963984540054 * Math.sqrt(492 / 18);
    const lowerRank = (15 - c) / 2;
    const upperRank = (15 + c) / 2 + 1;
    expect(fit.slopeLower).toBeCloseTo(-2.5 + (lowerRank - 2) * 0.5, 12);
    expect(fit.slopeUpper).toBeCloseTo(7 / 3 + (upperRank - 13) * (3 - 7 / 3), 12);
    expect(fit.slopeLower).toBeCloseTo(-2.3117, 4);
    expect(fit.slopeUpper).toBeCloseTo(2.749, 3);
    expect(fit.intervalClamped).toBe(false);
  });

  it('reproduces the Ipaper.jl slope_mk docstring slope (0.04)', () => {
    // jl-pkgs/Ipaper.jl: slope = 0.040000000000000036 for these data at x = 1..10.
    const ys = [4.81, 4.17, 4.41, 3.59, 5.87, 3.83, 6.03, 4.89, 4.32, 4.69];
    expect(ok(theilSen(ys.map((_, i) => i + 1), ys)).slope).toBeCloseTo(0.04, 12);
  });

  it('recovers the exact slope and intercept of a noiseless line, with x in epoch ms', () => {
    const t0 = Date.UTC(2025, 0, 6);
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 365 * 24 }), { minLength: 2, maxLength: 40 }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        (hours, perHour, level) => {
          const xs = hours.map((h) => t0 + h * 3_600_000);
          const ys = hours.map((h) => level + perHour * h);
          const fit = ok(theilSen(xs, ys));
          const perMs = perHour / 3_600_000;
          expect(Math.abs(fit.slope - perMs)).toBeLessThanOrEqual(1e-9 * (Math.abs(perMs) + 1e-9));
          // The level at the centre needs no huge intercept: check it there.
          const expectedAtCentre = level + perHour * ((fit.xCentre - t0) / 3_600_000);
          expect(fit.yAtCentre).toBeCloseTo(expectedAtCentre, 6);
          // A noiseless line: every pairwise slope is equal, so the interval collapses.
          expect(Math.abs(fit.slopeUpper - fit.slopeLower)).toBeLessThanOrEqual(1e-9 * (Math.abs(perMs) + 1e-9));
        },
      ),
    );
  });

  it('flips the sign of the slope when y is negated', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.integer({ min: 0, max: 1000 }), { minLength: 2, maxLength: 30 }),
        fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true }), { minLength: 30, maxLength: 30 }),
        (xs, ysAll) => {
          const ys = ysAll.slice(0, xs.length);
          const a = ok(theilSen(xs, ys));
          const b = ok(theilSen(xs, ys.map((v) => -v)));
          expect(b.slope).toBeCloseTo(-a.slope, 9);
          expect(b.slopeLower).toBeCloseTo(-a.slopeUpper, 9);
          expect(b.slopeUpper).toBeCloseTo(-a.slopeLower, 9);
        },
      ),
    );
  });

  it('is robust to 20 % outliers where least squares is not', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10, max: 60 }),
        fc.double({ min: -10, max: 10, noNaN: true }),
        fc.integer({ min: 0, max: 1_000_000 }),
        (n, slope, seed) => {
          const xs = Array.from({ length: n }, (_, i) => i);
          const ys = xs.map((x) => 5 + slope * x);
          // Corrupt 20 % of the points (rounded down) with wild values: the points
          // whose hash ranks lowest, so the set varies with the seed.
          const outliers = Math.floor(n * 0.2);
          const hash = (i: number) => Math.imul(i + 1, 2654435761) ^ seed;
          const used = xs.slice().sort((a, b) => hash(a) - hash(b)).slice(0, outliers);
          for (const i of used) ys[i] = (seed % 2 === 0 ? 1 : -1) * 1e6 + i * 1e4;
          const fit = ok(theilSen(xs, ys));
          // 64 % of the pairs are clean and share the true slope, which holds the median.
          expect(fit.slope).toBeCloseTo(slope, 9);
          if (outliers > 0) {
            const ols = ss.linearRegression(xs.map((x, i) => [x, ys[i] as number]));
            expect(Math.abs(ols.m - slope)).toBeGreaterThan(Math.abs(fit.slope - slope));
          }
        },
      ),
    );
  });

  it('skips pairs with equal x (ties in time)', () => {
    // Two readings at x = 1; the vertical pair (1, 2)-(1, 4) would be an infinite slope.
    const fit = ok(theilSen([0, 1, 1, 2], [0, 2, 4, 4]));
    expect(fit.pairs).toBe(5);
    // Slopes: 2, 4, 2, 2, 0 -> median 2.
    expect(fit.slope).toBe(2);
  });

  it('clamps the interval to the extreme slopes when there are too few pairs', () => {
    const fit = ok(theilSen([0, 1, 2], [0, 1, 3]));
    expect(fit.intervalClamped).toBe(true);
    expect(fit.slopeLower).toBe(1);
    expect(fit.slopeUpper).toBe(2);
  });

  it('agrees with simple-statistics 7 linearRegression on data that fits both (symmetric noise)', () => {
    const xs = Array.from({ length: 21 }, (_, i) => i);
    const ys = xs.map((x, i) => 3 + 0.5 * x + (i % 2 === 0 ? 0.1 : -0.1));
    const ols = ss.linearRegression(xs.map((x, i) => [x, ys[i] as number]));
    expect(ok(theilSen(xs, ys)).slope).toBeCloseTo(ols.m, 2);
  });

  describe('degenerate input', () => {
    it('n = 0 and n = 1 give not-enough-data', () => {
      expect(theilSen([], [])).toEqual({ status: 'not-enough-data', reason: 'a trend line needs at least 2 points, got 0', n: 0 });
      expect(theilSen([1], [1]).status).toBe('not-enough-data');
    });

    it('all points at one x give not-enough-data', () => {
      const r = theilSen([5, 5, 5], [1, 2, 3]);
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toContain('one time');
    });

    it('all y equal gives slope 0 with a zero-width interval, not NaN', () => {
      const fit = ok(theilSen([1, 2, 3, 4], [7, 7, 7, 7]));
      expect(fit.slope).toBe(0);
      expect(fit.intercept).toBe(7);
      expect([fit.slopeLower, fit.slopeUpper]).toEqual([0, 0]);
    });

    it('never returns NaN for arbitrary finite input', () => {
      fc.assert(
        fc.property(fc.array(fc.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true })), { maxLength: 12 }), (pairs) => {
          const r = theilSen(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
          for (const value of Object.values(r)) if (typeof value === 'number') expect(Number.isNaN(value)).toBe(false);
        }),
      );
    });

    it('throws on NaN, mismatched lengths and a bad confidence', () => {
      expect(() => theilSen([1, 2, Number.NaN], [1, 2, 3])).toThrow('theilSen requires finite values (index 2 is NaN)');
      expect(() => theilSen([1, 2], [1])).toThrow('equal length');
      expect(() => theilSen([1, 2], [1, 2], { confidence: 1 })).toThrow('confidence in (0, 1)');
    });
  });
});
