import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { pairwiseSlopesAtRanks } from '../../../core/stats/pairwiseSlopesAtRanks';

/** Reference: every slope, sorted, then interpolated at each rank. */
function bySorting(xs: Float64Array, ys: Float64Array, ranks: number[]): number[] {
  const slopes: number[] = [];
  for (let i = 0; i < xs.length; i++)
    for (let j = i + 1; j < xs.length; j++) {
      const dx = (xs[j] as number) - (xs[i] as number);
      if (dx !== 0) slopes.push(((ys[j] as number) - (ys[i] as number)) / dx);
    }
  slopes.sort((a, b) => a - b);
  return ranks.map((rank) => {
    const r = Math.min(Math.max(rank, 1), slopes.length);
    const lo = Math.floor(r);
    const a = slopes[lo - 1] as number;
    const b = (slopes[lo] ?? a) as number;
    return (r === lo || a === b ? a : a + (r - lo) * (b - a)) + 0;
  });
}

function pairsWithDistinctX(xs: Float64Array): number {
  let count = 0;
  for (let i = 0; i < xs.length; i++) for (let j = i + 1; j < xs.length; j++) if (xs[i] !== xs[j]) count++;
  return count;
}

describe('pairwiseSlopesAtRanks', () => {
  it('gives the documented example', () => {
    const xs = Float64Array.of(0, 1, 2, 3, 4, 5);
    const ys = Float64Array.of(6, 4, 1, 8, 7, 8);
    const [median, between] = pairwiseSlopesAtRanks(xs, ys, 15, [8, 2.5]);
    expect(median).toBeCloseTo(2 / 3, 15);
    expect(between).toBe(-2.25);
  });

  it('equals a full sort on small inputs (every slope stored), ties in x and y included', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 15 }), fc.integer({ min: -4, max: 4 })), { minLength: 2, maxLength: 40 }),
        fc.array(fc.double({ min: -5, max: 2000, noNaN: true }), { minLength: 1, maxLength: 4 }),
        (points, ranks) => {
          const xs = Float64Array.from(points, (p) => p[0]);
          const ys = Float64Array.from(points, (p) => p[1]);
          const pairs = pairsWithDistinctX(xs);
          if (pairs === 0) return;
          expect(pairwiseSlopesAtRanks(xs, ys, pairs, ranks)).toEqual(bySorting(xs, ys, ranks));
        },
      ),
    );
  });

  it('equals a full sort on large inputs (sampled bracket), exactly', () => {
    fc.assert(
      fc.property(fc.integer({ min: 210, max: 400 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), fc.boolean(), (n, seed, coarse) => {
        let state = seed;
        const next = () => {
          // 32-bit LCG (Numerical Recipes' ranqd1), exact in integer arithmetic.
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          return state / 4294967296;
        };
        // Times in ms with some repeats; values either continuous or coarse (many tied slopes).
        const xs = Float64Array.from({ length: n }, (_, i) => Date.UTC(2025, 0, 1) + Math.floor(i / 3) * 3_600_000 + (i % 3 === 2 ? 0 : i % 3) * 60_000);
        const ys = Float64Array.from({ length: n }, (_, i) => (coarse ? Math.round(next() * 5) : 100 + 0.01 * i + next() * 50));
        const pairs = pairsWithDistinctX(xs);
        const c = 1.96 * Math.sqrt((n * (n - 1) * (2 * n + 5)) / 18);
        const ranks = [(pairs + 1) / 2, (pairs - c) / 2, (pairs + c) / 2 + 1];
        expect(pairwiseSlopesAtRanks(xs, ys, pairs, ranks)).toEqual(bySorting(xs, ys, ranks));
      }),
      { numRuns: 15 },
    );
  });

  it('handles ranks at the very ends on the sampled path (bracket open to infinity)', () => {
    const n = 250;
    const xs = Float64Array.from({ length: n }, (_, i) => i);
    const ys = Float64Array.from({ length: n }, (_, i) => Math.sin(i * 7.1) * 10 + i);
    const pairs = (n * (n - 1)) / 2;
    const ranks = [1, 1.5, pairs, pairs - 0.25, -3, pairs + 10];
    expect(pairwiseSlopesAtRanks(xs, ys, pairs, ranks)).toEqual(bySorting(xs, ys, ranks));
  });
});
