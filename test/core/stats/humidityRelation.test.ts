import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { humidityRelation, type HumidityRelation } from '../../../core/stats/humidityRelation';

function ok(result: ReturnType<typeof humidityRelation>): HumidityRelation {
  if (result.status !== 'ok') throw new Error(`expected a relation, got not-enough-data: ${result.reason}`);
  return result;
}

const readings = (rows: [number, number][]) => rows.map(([rh, fieldVPerM]) => ({ rh, fieldVPerM }));

describe('humidityRelation', () => {
  it('reads a tenfold fall per 10 RH points as 21 % per point (documented example)', () => {
    const r = ok(humidityRelation(readings([[20, 1e4], [30, 1e3], [40, 100], [50, 10]])));
    expect(r.slopeLog10PerRhPoint).toBeCloseTo(-0.1, 12);
    expect(r.percentChangePerRhPoint).toBeCloseTo((Math.pow(10, -0.1) - 1) * 100, 10);
    expect(r.sentence).toBe('field falls by 21 % per RH point (p < 0.001)');
    expect(r.n).toBe(4);
  });

  it('matches simple-statistics 7 linearRegression on log10|E| against RH, and uses |E|', () => {
    const rows: [number, number][] = [
      [18, -5200], [22, 4100], [25, -3900], [31, 2500], [35, 2700], [41, -1500], [47, 1200], [55, 800],
    ];
    const r = ok(humidityRelation(readings(rows)));
    const theirs = ss.linearRegression(rows.map(([rh, e]) => [rh, Math.log10(Math.abs(e))]));
    expect(r.slopeLog10PerRhPoint).toBeCloseTo(theirs.m, 12);
    expect(r.significant).toBe(true);
    expect(r.sentence).toMatch(/^field falls by \d+ % per RH point \(p [<=] 0\.\d+\)$/);
  });

  it('says "no clear relation" when the slope is not significant', () => {
    const r = ok(humidityRelation(readings([[30, 1000], [31, 1500], [32, 900], [33, 1400], [34, 1100]])));
    expect(r.significant).toBe(false);
    expect(r.sentence).toMatch(/^no clear relation to humidity: field (rises|falls) by .* % per RH point \(p = 0\.\d\d\)$/);
  });

  it('excludes zero fields and invalid readings, and says how many', () => {
    const r = ok(
      humidityRelation([
        ...readings([[20, 1e4], [30, 1e3], [40, 0], [50, 10], [45, 0]]),
        { rh: Number.NaN, fieldVPerM: 500 },
        { rh: 120, fieldVPerM: 500 },
      ]),
    );
    expect(r.n).toBe(3);
    expect(r.excluded).toEqual({ zeroField: 2, invalid: 2 });
    expect(r.sentence).toBe(
      'field falls by 21 % per RH point (p < 0.001); 2 zero readings excluded, 2 readings without valid humidity or field excluded',
    );
  });

  describe('degenerate input gives not-enough-data, never NaN', () => {
    it('no readings, one, two', () => {
      for (const rows of [[], [[30, 100]], [[30, 100], [40, 10]]] as [number, number][][]) {
        const r = humidityRelation(readings(rows));
        expect(r.status).toBe('not-enough-data');
        if (r.status === 'not-enough-data') expect(r.reason).toContain(`at least 3 readings with humidity and a non-zero field, got ${rows.length}`);
      }
    });

    it('too few once zero fields are excluded, naming the exclusions', () => {
      const r = humidityRelation(readings([[20, 100], [30, 0], [40, 0], [50, 5]]));
      expect(r).toEqual({
        status: 'not-enough-data',
        reason: 'the humidity relation needs at least 3 readings with humidity and a non-zero field, got 2; 2 zero readings excluded',
        n: 2,
        excluded: { zeroField: 2, invalid: 0 },
      });
    });

    it('all at one RH', () => {
      const r = humidityRelation(readings([[35, 100], [35, 200], [35, 300]]));
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toBe('all readings are at the same humidity');
    });

    it('all the same |E|', () => {
      const r = humidityRelation(readings([[20, 100], [30, -100], [40, 100]]));
      expect(r.status).toBe('not-enough-data');
      if (r.status === 'not-enough-data') expect(r.reason).toContain('same field');
    });

    it('throws on a bad alpha', () => {
      expect(() => humidityRelation([], { alpha: 2 })).toThrow('alpha in (0, 1)');
    });
  });
});
