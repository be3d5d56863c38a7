import { describe, expect, it } from 'vitest';
import { civilDateAddDays, civilDateCompare, civilDateToIso, civilDateWeekday } from '../../../core/time/civilDate';

describe('civilDate', () => {
  it('adds days across month, leap-day and year ends (documented example)', () => {
    expect(civilDateAddDays({ year: 2024, month: 2, day: 28 }, 2)).toEqual({ year: 2024, month: 3, day: 1 });
    expect(civilDateAddDays({ year: 2023, month: 2, day: 28 }, 1)).toEqual({ year: 2023, month: 3, day: 1 });
    expect(civilDateAddDays({ year: 2025, month: 1, day: 2 }, -7)).toEqual({ year: 2024, month: 12, day: 26 });
  });

  it('numbers weekdays from Monday = 0 (ISO 8601)', () => {
    expect(civilDateWeekday({ year: 2024, month: 3, day: 18 })).toBe(0);
    expect(civilDateWeekday({ year: 2024, month: 3, day: 24 })).toBe(6);
  });

  it('formats and compares', () => {
    expect(civilDateToIso({ year: 987, month: 3, day: 5 })).toBe('0987-03-05');
    expect(civilDateCompare({ year: 2024, month: 3, day: 5 }, { year: 2024, month: 3, day: 6 })).toBeLessThan(0);
    expect(civilDateCompare({ year: 2024, month: 3, day: 5 }, { year: 2024, month: 3, day: 5 })).toBe(0);
  });
});
