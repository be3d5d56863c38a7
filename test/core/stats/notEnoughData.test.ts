import { describe, expect, it } from 'vitest';
import { assertFiniteValues } from '../../../core/stats/assertFiniteValues';
import { notEnoughData } from '../../../core/stats/notEnoughData';

describe('notEnoughData', () => {
  it('builds the result the screens show', () => {
    expect(notEnoughData('needs at least 3 readings, got 2', 2)).toEqual({
      status: 'not-enough-data',
      reason: 'needs at least 3 readings, got 2',
      n: 2,
    });
  });
});

describe('assertFiniteValues', () => {
  it('names the function and the first bad index', () => {
    expect(() => assertFiniteValues([1, Number.NaN], 'mean')).toThrow('mean requires finite values (index 1 is NaN)');
    expect(() => assertFiniteValues([1, 2], 'mean')).not.toThrow();
    expect(() => assertFiniteValues([], 'mean')).not.toThrow();
  });
});
