import { describe, expect, it } from 'vitest';
import { zonedDateTime, zoneOffsetMs } from '../../../core/time/zonedDateTime';

describe('zonedDateTime and zoneOffsetMs', () => {
  it('reads wall-clock time through a DST gap (documented example)', () => {
    // EU rule: summer time begins 31 Mar 2024 at 01:00 UTC; Berlin jumps 02:00 -> 03:00.
    expect(zonedDateTime(Date.UTC(2024, 2, 31, 1, 0), 'Europe/Berlin')).toEqual({ year: 2024, month: 3, day: 31, hour: 3, minute: 0, second: 0 });
    expect(zonedDateTime(Date.UTC(2024, 2, 31, 0, 59, 59), 'Europe/Berlin')).toEqual({ year: 2024, month: 3, day: 31, hour: 1, minute: 59, second: 59 });
  });

  it('gives offsets in ms, including fractional-hour zones and ms instants', () => {
    expect(zoneOffsetMs(Date.UTC(2024, 0, 15), 'Europe/Berlin')).toBe(3_600_000);
    expect(zoneOffsetMs(Date.UTC(2024, 6, 15), 'America/Chicago')).toBe(-5 * 3_600_000);
    expect(zoneOffsetMs(Date.UTC(2024, 6, 15) + 999, 'Asia/Kathmandu')).toBe(5.75 * 3_600_000);
    expect(zoneOffsetMs(-1, 'UTC')).toBe(0);
  });

  it('throws on an unknown zone or a non-finite instant', () => {
    expect(() => zonedDateTime(0, 'Bad/Zone')).toThrow("unknown time zone 'Bad/Zone'");
    expect(() => zonedDateTime(Number.NaN, 'UTC')).toThrow('finite instant');
  });
});
