import { describe, expect, it } from 'vitest';
import { startOfLocalDay } from '../../../core/time/startOfLocalDay';

describe('startOfLocalDay', () => {
  it('is local 00:00 converted with the offset in force then (documented example)', () => {
    expect(startOfLocalDay({ year: 2024, month: 3, day: 25 }, 'Europe/Berlin')).toBe(Date.UTC(2024, 2, 24, 23));
    expect(startOfLocalDay({ year: 2024, month: 7, day: 1 }, 'Europe/Berlin')).toBe(Date.UTC(2024, 5, 30, 22));
  });

  it('takes the first instant of the day where midnight is skipped (Chile, 8 Sep 2024)', () => {
    // America/Santiago went from -04 to -03 at 00:00 on Sunday 8 Sep 2024: the day
    // starts at 01:00 -03 = 04:00 UTC (tz database, Chile rules).
    expect(startOfLocalDay({ year: 2024, month: 9, day: 8 }, 'America/Santiago')).toBe(Date.UTC(2024, 8, 8, 4));
  });

  it('takes the single midnight after clocks go back across it (Chile, 7 Apr 2024)', () => {
    // At 00:00 -03 on 7 Apr 2024 clocks went back to 23:00 -04 on 6 Apr; 00:00 on 7 Apr is then 04:00 UTC.
    expect(startOfLocalDay({ year: 2024, month: 4, day: 7 }, 'America/Santiago')).toBe(Date.UTC(2024, 3, 7, 4));
  });

  it('throws on an unknown time zone', () => {
    expect(() => startOfLocalDay({ year: 2024, month: 1, day: 1 }, 'No/Zone')).toThrow("unknown time zone 'No/Zone'");
  });
});
