// Unit conversions checked against an independent reference library:
// mathjs 15 units (unit(x, 'V/inch').toNumber('V/m')), and the exact inch of the
// 1959 international yard and pound agreement (0.0254 m).
import { describe, expect, it } from 'vitest';
import { unit as mathUnit } from 'mathjs';
import {
  DISTANCE_UNITS, FIELD_UNITS, distanceToMetres, fieldToVoltsPerMetre, formatSi, metresToDistance,
  normalizeReading, surfaceVoltageToVoltsPerMetre, voltsPerMetreToField,
} from '../../../core/units';

const MATHJS_FIELD: Record<(typeof FIELD_UNITS)[number], string> = {
  'V/m': 'V/m', 'kV/m': 'kV/m', 'V/cm': 'V/cm', 'kV/cm': 'kV/cm', 'V/inch': 'V/inch', 'kV/inch': 'kV/inch',
};
const MATHJS_DISTANCE: Record<(typeof DISTANCE_UNITS)[number], string> = { mm: 'mm', cm: 'cm', m: 'm', inch: 'inch' };

describe('field units against mathjs 15 units', () => {
  for (const u of FIELD_UNITS) {
    for (const v of [0, 1, 125, 2000, 3.7e-3, 9.99e5]) {
      it(`${v} ${u}`, () => {
        const reference = mathUnit(v, MATHJS_FIELD[u]).toNumber('V/m');
        if (v === 0) expect(fieldToVoltsPerMetre(v, u)).toBe(0);
        else expect(Math.abs(fieldToVoltsPerMetre(v, u) / reference - 1)).toBeLessThan(1e-14);
      });
    }
  }
  it('round trip V/m -> unit -> V/m is exact to 1e-15 relative', () => {
    for (const u of FIELD_UNITS) {
      const x = 12345.678;
      expect(Math.abs(fieldToVoltsPerMetre(voltsPerMetreToField(x, u), u) / x - 1)).toBeLessThan(1e-15);
    }
  });
  it('125 V/inch is 4921 V/m (FACTS: arithmetic on ANSI/ESD S20.20 8.3.1 limit)', () => {
    expect(fieldToVoltsPerMetre(125, 'V/inch')).toBeCloseTo(4921.2598, 3);
  });
});

describe('distance units against mathjs 15 units', () => {
  for (const u of DISTANCE_UNITS) {
    it(`${u}`, () => {
      for (const v of [0.5, 1, 25, 300]) {
        expect(distanceToMetres(v, u)).toBeCloseTo(mathUnit(v, MATHJS_DISTANCE[u]).toNumber('m'), 12);
        expect(metresToDistance(distanceToMetres(v, u), u)).toBeCloseTo(v, 12);
      }
    });
  }
  it('the inch is exactly 0.0254 m (international yard and pound agreement, 1959)', () => {
    expect(distanceToMetres(1, 'inch')).toBe(0.0254);
  });
});

describe('surface-voltage mode: E = V / dCal (the display is field x calibrated distance)', () => {
  it('1 kV at a 1-inch calibrated distance is 39.37 kV/m whatever the distance held', () => {
    expect(surfaceVoltageToVoltsPerMetre(1, 'kV', 0.0254)).toBeCloseTo(mathUnit(1, 'kV').toNumber('V') / 0.0254, 9);
  });
  it('requires a calibrated distance', () => {
    expect(() => surfaceVoltageToVoltsPerMetre(1, 'V', 0)).toThrow(/calibrated distance/);
    expect(() => normalizeReading({ value: 1, unit: 'kV', polarity: '+' })).toThrow(/calibrated distance/);
  });
  it('keeps the polarity', () => {
    expect(normalizeReading({ value: 2, unit: 'kV/inch', polarity: '-' })).toBeCloseTo(-78740.15748, 4);
    expect(normalizeReading({ value: 500, unit: 'V', polarity: '-', calibratedDistanceM: 0.025 })).toBe(-20000);
  });
});

describe('formatSi never crashes on bad values', () => {
  it.each([
    [4921.26, 'V/m', '4.92 kV/m'],
    [-1.2e-8, 'C', '−12.0 nC'],
    [0, 'V', '0 V'],
    [999.6, 'V', '1.00 kV'],
    [NaN, 'V', '—'],
    [Infinity, 'V', '—'],
    [null, 'V', '—'],
    [2.5e-3, 'J', '2.50 mJ'],
  ])('%s %s -> %s', (v, u, out) => {
    expect(formatSi(v as number, u)).toBe(out);
  });
});
