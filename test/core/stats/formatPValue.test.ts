import { describe, expect, it } from 'vitest';
import { formatPValue } from '../../../core/stats/formatPValue';

describe('formatPValue', () => {
  it('writes p the way reports do (APA 7th ed. 6.36)', () => {
    expect(formatPValue(0.0031)).toBe('p = 0.003');
    expect(formatPValue(0.0004)).toBe('p < 0.001');
    expect(formatPValue(0)).toBe('p < 0.001');
    expect(formatPValue(0.049)).toBe('p = 0.049');
    expect(formatPValue(0.0996)).toBe('p = 0.10');
    expect(formatPValue(0.4123)).toBe('p = 0.41');
    expect(formatPValue(1)).toBe('p = 1.00');
  });

  it('throws outside [0, 1]', () => {
    expect(() => formatPValue(Number.NaN)).toThrow('p in [0, 1]');
    expect(() => formatPValue(1.2)).toThrow('p in [0, 1]');
  });
});
