import { describe, expect, it } from 'vitest';
import { formatIsoWeek, isoWeekNumber, isoWeeksInYear, mondayOfIsoWeek } from '../../../core/time/isoWeekNumber';
import { parseIsoWeek } from '../../../core/time/parseIsoWeek';

describe('isoWeekNumber', () => {
  it('follows ISO 8601 around New Year (examples as in the ISO week-date tables)', () => {
    expect(isoWeekNumber({ year: 2024, month: 12, day: 30 })).toEqual({ year: 2025, week: 1 });
    expect(isoWeekNumber({ year: 2021, month: 1, day: 3 })).toEqual({ year: 2020, week: 53 });
    expect(isoWeekNumber({ year: 2021, month: 1, day: 4 })).toEqual({ year: 2021, week: 1 });
    expect(isoWeekNumber({ year: 2008, month: 12, day: 29 })).toEqual({ year: 2009, week: 1 });
    expect(isoWeekNumber({ year: 2010, month: 1, day: 3 })).toEqual({ year: 2009, week: 53 });
  });

  it('counts 53-week years (Jan 1 a Thursday, or a Wednesday in a leap year)', () => {
    expect([2015, 2020, 2026, 2032].map(isoWeeksInYear)).toEqual([53, 53, 53, 53]);
    expect([2019, 2021, 2024, 2025].map(isoWeeksInYear)).toEqual([52, 52, 52, 52]);
  });

  it('formats, parses and finds the Monday', () => {
    expect(formatIsoWeek({ year: 2024, week: 3 })).toBe('2024-W03');
    expect(parseIsoWeek('2020-W53')).toEqual({ year: 2020, week: 53 });
    expect(parseIsoWeek('2021-W53')).toBeNull();
    expect(parseIsoWeek(2024)).toBeNull();
    expect(mondayOfIsoWeek({ year: 2025, week: 1 })).toEqual({ year: 2024, month: 12, day: 30 });
  });
});
