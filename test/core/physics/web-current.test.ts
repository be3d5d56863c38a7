/**
 * The moving-web current I = sigma w v (the charge a moving web carries off, as a current): the worked example
 * there (5 uC/m^2 on a 1.5 m web at 4 m/s is 30 uA), the same product computed with
 * the units of mathjs (a reference library from the registry, independent of our
 * unit code), and its chain with the sheet model.
 */
import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { sheetFromField, webChargeCurrentA } from '../../../core/physics/models';
import { EPSILON_0 } from '../../../core/physics/constants';

describe('moving web: I = sigma w v', () => {
  it('worked example (arithmetic): 5 uC/m^2, 1.5 m wide, 4 m/s gives 30 uA', () => {
    expect(webChargeCurrentA(5e-6, 1.5, 4)).toBeCloseTo(30e-6, 15);
  });

  it('agrees with mathjs unit arithmetic (C/m^2 x m x m/s = A)', () => {
    const i = unit('5 uC/m^2').multiply(unit('1.5 m')).multiply(unit('4 m/s'));
    expect(i.equalBase(unit('1 A'))).toBe(true);
    expect(webChargeCurrentA(5e-6, 1.5, 4) / i.toNumber('A')).toBeCloseTo(1, 12);
  });

  it('keeps the sign, is zero for a stopped web and refuses a negative speed or width', () => {
    expect(webChargeCurrentA(-2e-6, 1, 3)).toBeCloseTo(-6e-6, 15);
    expect(webChargeCurrentA(5e-6, 1.5, 0)).toBe(0);
    expect(() => webChargeCurrentA(5e-6, 1.5, -1)).toThrow(RangeError);
    expect(() => webChargeCurrentA(5e-6, 0, 1)).toThrow(RangeError);
  });

  it('from a field reading: an isolated web read at 100 kV/m (sigma = 2 eps0 E) on a 1.5 m line at 4 m/s', () => {
    const sigma = sheetFromField({ fieldVPerM: 1e5, gapM: 0.025 }).surfaceChargeDensityCPerM2!;
    expect(sigma).toBeCloseTo(2 * EPSILON_0 * 1e5, 18);
    expect(webChargeCurrentA(sigma, 1.5, 4)).toBeCloseTo(2 * EPSILON_0 * 1e5 * 6, 15); // about 10.6 uA
  });
});
