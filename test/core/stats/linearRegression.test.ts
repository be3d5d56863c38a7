import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as ss from 'simple-statistics';
import { linearRegression, type LinearRegressionFit } from '../../../core/stats/linearRegression';

function ok(result: ReturnType<typeof linearRegression>): LinearRegressionFit {
  if (result.status !== 'ok') throw new Error(`expected a fit, got not-enough-data: ${result.reason}`);
  return result;
}

describe('linearRegression', () => {
  it("reproduces Anscombe's quartet, set I (Anscombe 1973)", () => {
    // F. J. Anscombe (1973), "Graphs in statistical analysis", Am. Stat. 27(1):17–21:
    // y = 3.00 + 0.500 x, standard error of slope 0.118, t = 4.24, r^2 = 0.67.
    // R's summary(lm(y1 ~ x1, anscombe)) prints p-value 0.00217 (from memory).
    const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5];
    const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68];
    const fit = ok(linearRegression(x, y));
    expect(fit.slope).toBeCloseTo(0.5, 3);
    expect(fit.intercept).toBeCloseTo(3.0, 3);
    expect(fit.slopeStandardError).toBeCloseTo(0.118, 3);
    expect(fit.t).toBeCloseTo(4.24, 2);
    expect(fit.rSquared).toBeCloseTo(0.67, 2);
    expect(fit.degreesOfFreedom).toBe(9);
    expect(fit.pValue).toBeCloseTo(0.00217, 5);
  });

  it('computes the documented hand example', () => {
    // x = 1..5, y = 2, 4, 5, 4, 5: Sxx = 10, Sxy = 6, Syy = 6, SSE = 2.4.
    const fit = ok(linearRegression([1, 2, 3, 4, 5], [2, 4, 5, 4, 5]));
    expect(fit.slope).toBeCloseTo(0.6, 14);
    expect(fit.intercept).toBeCloseTo(2.2, 14);
    expect(fit.rSquared).toBeCloseTo(0.6, 14);
    expect(fit.slopeStandardError).toBeCloseTo(Math.sqrt(0.08), 14);
    expect(fit.t).toBeCloseTo(0.6 / Math.sqrt(0.08), 13);
    // df = 3, A&S 26.7.3 closed form: p = 1 - (2/pi)(theta + sin(theta) cos(theta)), theta = atan(t / sqrt 3).
    const theta = Math.atan(fit.t / Math.sqrt(3));
    expect(fit.pValue).toBeCloseTo(1 - (2 / Math.PI) * (theta + Math.sin(theta) * Math.cos(theta)), 13);
  });

  it('agrees with simple-statistics 7 linearRegression, rSquared and sampleCorrelation', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.double({ min: -1e3, max: 1e3, noNaN: true })), {
          minLength: 3,
          maxLength: 50,
        }),
        (pairs) => {
          const xs = pairs.map((p) => p[0]);
          const ys = pairs.map((p) => p[1]);
          const fit = linearRegression(xs, ys);
          if (fit.status !== 'ok') return;
          const sxx = ss.sampleVariance(xs) * (xs.length - 1);
          if (sxx < 1e-6 || ss.sampleVariance(ys) < 1e-6) return; // near-degenerate: comparisons are ill-conditioned
          const theirs = ss.linearRegression(pairs.map((p) => [p[0], p[1]]));
          expect(fit.slope).toBeCloseTo(theirs.m, 6);
          expect(fit.intercept).toBeCloseTo(theirs.b, 3);
          const line = ss.linearRegressionLine(theirs);
          expect(fit.rSquared).toBeCloseTo(ss.rSquared(pairs.map((p) => [p[0], p[1]]), line), 6);
          expect(fit.rSquared).toBeCloseTo(ss.sampleCorrelation(xs, ys) ** 2, 6);
        },
      ),
    );
  });

  it('centres x: a fit against epoch ms matches the same fit against hours', () => {
    const t0 = Date.UTC(2025, 5, 1);
    const hours = [0, 5, 9, 30, 41, 77, 100];
    const ys = [3.1, 3.9, 4.4, 6.2, 7.3, 10.1, 12.6];
    const inHours = ok(linearRegression(hours, ys));
    const inMs = ok(linearRegression(hours.map((h) => t0 + h * 3_600_000), ys));
    expect(inMs.slope * 3_600_000).toBeCloseTo(inHours.slope, 10);
    expect(inMs.pValue).toBeCloseTo(inHours.pValue, 10);
    expect(inMs.rSquared).toBeCloseTo(inHours.rSquared, 10);
  });

  it('flips the slope and t, keeps p, when y is negated', () => {
    const a = ok(linearRegression([1, 2, 3, 4, 5, 6], [1, 3, 2, 5, 4, 6]));
    const b = ok(linearRegression([1, 2, 3, 4, 5, 6], [-1, -3, -2, -5, -4, -6]));
    expect(b.slope).toBeCloseTo(-a.slope, 14);
    expect(b.t).toBeCloseTo(-a.t, 12);
    expect(b.pValue).toBeCloseTo(a.pValue, 14);
  });

  it('an exact fit has se = 0, infinite t and p = 0, not NaN', () => {
    const fit = ok(linearRegression([1, 2, 3], [2, 4, 6]));
    expect(fit.slopeStandardError).toBe(0);
    expect(fit.t).toBe(Infinity);
    expect(fit.pValue).toBe(0);
    expect(fit.rSquared).toBe(1);
  });

  describe('degenerate input gives not-enough-data', () => {
    it.each([
      ['n = 0', [], [], 'at least 3 points, got 0'],
      ['n = 1', [1], [1], 'at least 3 points, got 1'],
      ['n = 2', [1, 2], [1, 2], 'at least 3 points, got 2'],
      ['all x equal', [3, 3, 3], [1, 2, 3], 'all x values are equal'],
      ['all y equal', [1, 2, 3], [5, 5, 5], 'all y values are equal'],
    ])('%s', (_name, xs, ys, reason) => {
      const r = linearRegression(xs, ys);
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toContain(reason);
    });

    it('spreads that underflow or overflow double precision (found by fast-check)', () => {
      // x differs only by a subnormal-scale amount: (dx)^2 underflows to 0.
      const tiny = linearRegression([0, -2.7766408203216993e-191, 0, 0], [4.7e-133, 0, 2.8e-145, 0]);
      expect(tiny).toEqual({ status: 'not-enough-data', reason: 'the values are too close together or too large to fit numerically', n: 4 });
      expect(linearRegression([-1e200, 0, 1e200], [1, 2, 4]).status).toBe('not-enough-data');
    });

    it('never returns NaN for arbitrary finite input', () => {
      fc.assert(
        fc.property(fc.array(fc.tuple(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.double({ noNaN: true, noDefaultInfinity: true })), { maxLength: 12 }), (pairs) => {
          const r = linearRegression(pairs.map((p) => p[0]), pairs.map((p) => p[1]));
          for (const value of Object.values(r)) if (typeof value === 'number') expect(Number.isNaN(value)).toBe(false);
        }),
      );
    });

    it('throws on NaN and mismatched lengths', () => {
      expect(() => linearRegression([1, 2, 3], [1, Number.NaN, 3])).toThrow('linearRegression requires finite values');
      expect(() => linearRegression([1, 2, 3], [1, 2])).toThrow('equal length');
    });
  });
});
