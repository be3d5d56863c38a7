import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { studentTTwoSidedPValue as pT } from '../../../core/stats/studentTTwoSidedPValue';

/**
 * Exact two-sided tail of Student's t for integer df, Abramowitz & Stegun (1964)
 * 26.7.3 (finite sums in theta = atan(t / sqrt(df))). It loses relative accuracy
 * when p is tiny (1 minus a number near 1), so it is used for p > 1e-4 only.
 */
function exactTwoSidedP(t: number, df: number): number {
  const theta = Math.atan(Math.abs(t) / Math.sqrt(df));
  const s = Math.sin(theta);
  const c = Math.cos(theta);
  if (df % 2 === 0) {
    let term = 1;
    let sum = 1;
    for (let k = 1; k <= df / 2 - 1; k++) {
      term *= ((2 * k - 1) / (2 * k)) * c * c;
      sum += term;
    }
    return 1 - s * sum;
  }
  if (df === 1) return 1 - (2 * theta) / Math.PI;
  let term = c;
  let sum = c;
  for (let k = 1; k <= (df - 3) / 2; k++) {
    term *= ((2 * k) / (2 * k + 1)) * c * c;
    sum += term;
  }
  return 1 - (2 / Math.PI) * (theta + s * sum);
}

describe('studentTTwoSidedPValue', () => {
  it('gives the printed significance levels at table critical values', () => {
    // Student's t table (e.g. Fisher & Yates; any textbook), two-sided, to the
    // table's three decimals of t.
    expect(pT(2.228, 10)).toBeCloseTo(0.05, 4);
    expect(pT(2.086, 20)).toBeCloseTo(0.05, 4);
    expect(pT(3.169, 10)).toBeCloseTo(0.01, 4);
    expect(pT(1.812, 10)).toBeCloseTo(0.1, 3);
    expect(pT(12.706, 1)).toBeCloseTo(0.05, 4);
    expect(pT(2.042, 30)).toBeCloseTo(0.05, 4);
  });

  it('gives 0.05 at the exact 97.5 % point for df = 20', () => {
    // R: qt(0.975, 20) = 2.085963447265837 (from memory; the test confirms it to 1e-12).
    expect(Math.abs(pT(2.085963447265837, 20) - 0.05)).toBeLessThan(1e-12);
  });

  it('matches the exact closed forms of A&S 26.7.3 for integer df', () => {
    for (const df of [1, 2, 3, 4, 5, 9, 10, 11, 20, 30]) {
      for (const t of [0, 0.01, 0.5, 1, 1.96, 2.228, 3, 5]) {
        const exact = exactTwoSidedP(t, df);
        if (exact < 1e-4) continue;
        expect(Math.abs(pT(t, df) - exact)).toBeLessThanOrEqual(1e-12 * exact + 1e-15);
      }
    }
  });

  it('is exact for df = 1 (Cauchy) and df = 2 deep into the tails', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e6, noNaN: true }), (t) => {
        // Cauchy: P(|T| >= t) = (2 / pi) atan(1 / t); df = 2: 1 - t / sqrt(2 + t^2) = 2 / (sqrt(2 + t^2) (sqrt(2 + t^2) + t)).
        const cauchy = (2 / Math.PI) * Math.atan(1 / t);
        const r = Math.sqrt(2 + t * t);
        const df2 = 2 / (r * (r + t));
        expect(Math.abs(pT(t, 1) - cauchy)).toBeLessThanOrEqual(1e-12 * cauchy);
        expect(Math.abs(pT(t, 2) - df2)).toBeLessThanOrEqual(1e-12 * df2);
      }),
    );
  });

  it('tends to the normal tail for large df', () => {
    // 2 (1 - Phi(1.959963984540054)) = 0.05.
    expect(pT(1.959963984540054, 1e7)).toBeCloseTo(0.05, 6);
  });

  it('is symmetric in t, 1 at t = 0, 0 at infinity, and throws on bad df or NaN', () => {
    expect(pT(0, 5)).toBe(1);
    expect(pT(-2.5, 7)).toBe(pT(2.5, 7));
    expect(pT(Infinity, 3)).toBe(0);
    expect(pT(-Infinity, 3)).toBe(0);
    expect(() => pT(Number.NaN, 3)).toThrow('requires a number t');
    expect(() => pT(1, 0)).toThrow('df > 0');
    expect(() => pT(1, Infinity)).toThrow('df > 0');
  });
});
