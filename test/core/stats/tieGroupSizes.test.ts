import { describe, expect, it } from 'vitest';
import { tieGroupSizes } from '../../../core/stats/tieGroupSizes';

describe('tieGroupSizes', () => {
  it('lists groups of two or more, in ascending order of value', () => {
    expect(tieGroupSizes([5, 3, 5, 7, 3, 5])).toEqual([2, 3]);
    expect(tieGroupSizes([1, 2, 3])).toEqual([]);
    expect(tieGroupSizes([])).toEqual([]);
    expect(tieGroupSizes([4, 4, 4, 4])).toEqual([4]);
  });

  it('compares exactly (no rounding)', () => {
    expect(tieGroupSizes([1.2, 1.2000001])).toEqual([]);
  });
});
