import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { quickselect } from '../../../core/stats/quickselect';

describe('quickselect (Floyd–Rivest)', () => {
  it('puts the k-th smallest at k (documented example)', () => {
    const a = Float64Array.of(5, 1, 4, 2, 3);
    quickselect(a, 2);
    expect(a[2]).toBe(3);
  });

  it('partitions like a sort, for small and large (> 600) arrays', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 2000 }),
        fc.nat(),
        (values, seed) => {
          const k = seed % values.length;
          const a = Float64Array.from(values);
          quickselect(a, k);
          const sorted = Float64Array.from(values).sort();
          expect(a[k]).toBe(sorted[k]);
          for (let i = 0; i < k; i++) expect(a[i]).toBeLessThanOrEqual(a[k] as number);
          for (let i = k + 1; i < a.length; i++) expect(a[i]).toBeGreaterThanOrEqual(a[k] as number);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('throws for k out of range', () => {
    expect(() => quickselect(Float64Array.of(1, 2), 2)).toThrow('integer k in [0, 1]');
    expect(() => quickselect(Float64Array.of(1, 2), 0.5)).toThrow('integer k');
  });
});
