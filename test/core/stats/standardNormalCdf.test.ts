import { describe, expect, it } from 'vitest';
import * as ss from 'simple-statistics';
import { standardNormalCdf as phi } from '../../../core/stats/standardNormalCdf';

describe('standardNormalCdf', () => {
  it('matches published values', () => {
    // The 97.5 % point is 1.959963984540054 (Abramowitz & Stegun 26.2, Table 26.5);
    // at the rounded 1.959964 Phi differs from 0.975 by 9e-10.
    expect(Math.abs(phi(1.959964) - 0.975)).toBeLessThan(1e-9);
    expect(phi(1.959963984540054)).toBeCloseTo(0.975, 15);
    // A&S Table 26.1: Q(3) = 1 - P(3) = 0.00134989803163 (more digits from mpmath, from memory).
    expect(Math.abs(phi(-3) - 0.0013498980316301) / 0.0013498980316301).toBeLessThan(1e-13);
    // Phi(-8) = 6.22096057427178e-16: a lower tail that 1 - Phi(8) would lose entirely.
    expect(Math.abs(phi(-8) - 6.22096057427178e-16) / 6.22096057427178e-16).toBeLessThan(1e-12);
    expect(phi(0)).toBe(0.5);
    expect(phi(1)).toBeCloseTo(0.8413447460685429, 15);
  });

  it('agrees with simple-statistics 7 cumulativeStdNormalProbability (a 4-decimal table)', () => {
    // simple-statistics looks z up in a table rounded to 0.01 in z and 1e-4 in
    // probability, so compare at the table's grid with a 1e-4 tolerance.
    for (let i = -300; i <= 300; i++) {
      const z = i / 100;
      expect(Math.abs(phi(z) - ss.cumulativeStdNormalProbability(z))).toBeLessThanOrEqual(1e-4);
    }
  });

  it('has the limits and symmetry Phi(-z) = 1 - Phi(z)', () => {
    expect(phi(-Infinity)).toBe(0);
    expect(phi(Infinity)).toBe(1);
    for (const z of [0.1, 0.7, 1.3, 2.5, 4]) expect(phi(-z) + phi(z)).toBeCloseTo(1, 15);
    expect(() => phi(Number.NaN)).toThrow('standardNormalCdf requires a number');
  });
});
