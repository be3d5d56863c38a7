import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { MS_PER_WEEK, trendSummary, type TrendSummary } from '../../../core/stats/trend';

function ok(result: ReturnType<typeof trendSummary>): TrendSummary {
  if (result.status !== 'ok') throw new Error(`expected a trend, got not-enough-data: ${result.reason}`);
  return result;
}

const t0 = Date.UTC(2025, 0, 6, 8, 0);
const DAY = 86_400_000;

describe('trendSummary', () => {
  it('gives the documented example: 10 per week, S = 6, p = 0.0894, no trend at n = 4', () => {
    const r = ok(trendSummary([100, 110, 120, 130].map((v, i) => ({ t: t0 + i * MS_PER_WEEK, v }))));
    expect(r.slopePerWeek).toBeCloseTo(10, 9);
    expect(r.s).toBe(6);
    // Var S = 4*3*13/18 = 8.667; Z = 5 / sqrt(8.667) = 1.69842; p = 0.089429.
    expect(r.pValue).toBeCloseTo(0.089429, 5);
    expect(r.direction).toBe('no trend');
    expect(r.n).toBe(4);
    expect(r.firstMs).toBe(t0);
    expect(r.lastMs).toBe(t0 + 3 * MS_PER_WEEK);
  });

  it('recovers the rate per week of a noiseless daily series and calls it increasing', () => {
    fc.assert(
      fc.property(fc.integer({ min: 10, max: 120 }), fc.double({ min: 0.5, max: 500, noNaN: true }), (days, perWeek) => {
        const points = Array.from({ length: days }, (_, i) => ({ t: t0 + i * DAY, v: 1000 + (perWeek * i) / 7 }));
        const r = ok(trendSummary(points));
        expect(r.slopePerWeek).toBeCloseTo(perWeek, 6);
        expect(r.direction).toBe('increasing');
        expect(r.significant).toBe(true);
      }),
    );
  });

  it('finds a rising trend under noise and 20 % outliers, with the true rate inside the interval', () => {
    const points = Array.from({ length: 52 }, (_, i) => {
      const noise = Math.sin(i * 12.9898) * 40;
      const outlier = i % 5 === 0 ? (i % 10 === 0 ? 5000 : -5000) : 0;
      return { t: t0 + i * MS_PER_WEEK, v: 800 + 25 * i + noise + outlier };
    });
    const r = ok(trendSummary(points));
    expect(r.direction).toBe('increasing');
    expect(r.slopeLowerPerWeek).toBeLessThanOrEqual(25);
    expect(r.slopeUpperPerWeek).toBeGreaterThanOrEqual(25);
    expect(Math.abs(r.slopePerWeek - 25)).toBeLessThan(5);
  });

  it('says decreasing when values fall, and the slope sign flips with the values', () => {
    const up = Array.from({ length: 12 }, (_, i) => ({ t: t0 + i * MS_PER_WEEK, v: 50 + 3 * i + (i % 3) }));
    const down = up.map((p) => ({ t: p.t, v: -p.v }));
    const a = ok(trendSummary(up));
    const b = ok(trendSummary(down));
    expect(b.direction).toBe('decreasing');
    expect(b.slopePerWeek).toBeCloseTo(-a.slopePerWeek, 9);
    expect(b.pValue).toBe(a.pValue);
  });

  it('does not depend on the order the points come in', () => {
    const points = [5, 9, 7, 12, 11, 15, 14].map((v, i) => ({ t: t0 + i * 3 * DAY, v }));
    expect(trendSummary([...points].reverse())).toEqual(trendSummary(points));
  });

  it('drops points with a non-finite time or value and counts them', () => {
    const points = [
      ...[1, 2, 3, 4, 5].map((v, i) => ({ t: t0 + i * MS_PER_WEEK, v })),
      { t: Number.NaN, v: 3 },
      { t: t0, v: Infinity },
    ];
    const r = ok(trendSummary(points));
    expect(r.n).toBe(5);
    expect(r.excluded).toBe(2);
  });

  describe('degenerate input gives not-enough-data, never NaN', () => {
    it.each([
      ['no readings', []],
      ['one reading', [{ t: t0, v: 5 }]],
      ['two readings', [{ t: t0, v: 5 }, { t: t0 + DAY, v: 6 }]],
    ])('%s', (_name, points) => {
      const r = trendSummary(points);
      expect(r).toEqual({ status: 'not-enough-data', reason: `a trend test needs at least 3 readings, got ${points.length}`, n: points.length });
    });

    it('all values equal', () => {
      const r = trendSummary([1, 2, 3, 4].map((i) => ({ t: t0 + i * DAY, v: 120 })));
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toContain('same value');
    });

    it('all readings at one time', () => {
      const r = trendSummary([100, 200, 300].map((v) => ({ t: t0, v })));
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toContain('one time');
    });

    it('too few once invalid points are dropped, saying so', () => {
      const r = trendSummary([{ t: t0, v: 1 }, { t: t0 + DAY, v: 2 }, { t: t0 + 2 * DAY, v: Number.NaN }]);
      expect(r).toEqual({
        status: 'not-enough-data',
        reason: 'a trend test needs at least 3 readings, got 2 (1 reading without a valid time or value excluded)',
        n: 2,
      });
    });

    it('every ok result is free of NaN for arbitrary finite input', () => {
      fc.assert(
        fc.property(
          fc.array(fc.record({ t: fc.integer({ min: t0, max: t0 + 60 * DAY }), v: fc.integer({ min: -3, max: 3 }) }), { maxLength: 40 }),
          (points) => {
            const r = trendSummary(points);
            for (const value of Object.values(r)) if (typeof value === 'number') expect(Number.isNaN(value)).toBe(false);
          },
        ),
      );
    });
  });
});
