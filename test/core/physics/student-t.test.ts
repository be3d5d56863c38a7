import { describe, expect, it } from 'vitest';
import { lgamma } from 'mathjs';
import { studentT975 } from '../../../core/physics/student-t';
import { integrate } from './helpers';

/** Student t density, written from its definition with mathjs 15's lgamma function. */
function tPdf(x: number, nu: number): number {
  return (Math.exp(lgamma((nu + 1) / 2) - lgamma(nu / 2)) / Math.sqrt(nu * Math.PI)) * (1 + (x * x) / nu) ** (-(nu + 1) / 2);
}

describe('studentT975', () => {
  it.each([1, 2, 3, 5, 10, 29, 30, 31, 40, 60, 120, 1000])('P(0 < T < t975(%i)) = 0.475 by quadrature of the density (mathjs lgamma)', (nu) => {
    // Outside check: numerical integral of the t density (mathjs 15 lgamma); tolerance 5e-5 covers the 4-decimal table.
    const p = integrate((x) => tPdf(x, nu), 0, studentT975(nu), 1e-12);
    expect(Math.abs(p - 0.475)).toBeLessThan(5e-5);
  });

  it('matches Abramowitz and Stegun Table 26.10 values', () => {
    // Source: Abramowitz & Stegun (1964) Table 26.10: 12.706, 2.228, 2.042, 2.021, 2.000, 1.980.
    expect(studentT975(1)).toBeCloseTo(12.706, 3);
    expect(studentT975(10)).toBeCloseTo(2.228, 3);
    expect(studentT975(30)).toBeCloseTo(2.042, 3);
    expect(studentT975(40)).toBeCloseTo(2.021, 3);
    expect(studentT975(60)).toBeCloseTo(2.0, 3);
    expect(studentT975(120)).toBeCloseTo(1.98, 3);
  });

  it('rejects non-integer or non-positive degrees of freedom', () => {
    expect(() => studentT975(0)).toThrow(/positive whole number/);
    expect(() => studentT975(2.5)).toThrow(/positive whole number/);
    expect(() => studentT975(Number.NaN)).toThrow(/positive whole number/);
  });
});
