import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { weekStart } from '../../../core/time/weekStart';
import { zonedDateTime } from '../../../core/time/zonedDateTime';

const H = 3_600_000;
const utc = (iso: string) => Date.parse(iso);

// Expected instants come from the published DST rules (EU: last Sunday of March
// and October at 01:00 UTC; US: second Sunday of March and first Sunday of
// November at 02:00 local) and the zones' standard offsets (CET +1, CST -6).
describe('weekStart', () => {
  it('Europe/Berlin, spring forward week (2024-03-31): 167 hours', () => {
    const w = weekStart(utc('2024-03-27T12:00:00Z'), 'Europe/Berlin');
    expect(w.startMs).toBe(utc('2024-03-24T23:00:00Z')); // Mon 25 Mar 00:00 CET
    expect(w.endMs).toBe(utc('2024-03-31T22:00:00Z')); // Mon 1 Apr 00:00 CEST
    expect((w.endMs - w.startMs) / H).toBe(167);
    expect(w.isoWeek).toBe('2024-W13');
    expect(w.label).toBe('Week 13, 2024: Mon 25 Mar – Sun 31 Mar 2024');
    expect(w.firstDay).toBe('2024-03-25');
    expect(w.lastDay).toBe('2024-03-31');
    expect(w.timeZone).toBe('Europe/Berlin');
  });

  it('Europe/Berlin, fall back week (2024-10-27): 169 hours', () => {
    const w = weekStart(new Date('2024-10-27T01:30:00Z'), 'Europe/Berlin'); // the repeated hour
    expect(w.startMs).toBe(utc('2024-10-20T22:00:00Z')); // Mon 21 Oct 00:00 CEST
    expect(w.endMs).toBe(utc('2024-10-27T23:00:00Z')); // Mon 28 Oct 00:00 CET
    expect((w.endMs - w.startMs) / H).toBe(169);
    expect(w.isoWeek).toBe('2024-W43');
  });

  it('America/Chicago, spring forward week (2024-03-10): 167 hours', () => {
    const w = weekStart(utc('2024-03-10T08:30:00Z'), 'America/Chicago'); // Sun 03:30 CDT, just after the gap
    expect(w.startMs).toBe(utc('2024-03-04T06:00:00Z')); // Mon 4 Mar 00:00 CST
    expect(w.endMs).toBe(utc('2024-03-11T05:00:00Z')); // Mon 11 Mar 00:00 CDT
    expect((w.endMs - w.startMs) / H).toBe(167);
    expect(w.isoWeek).toBe('2024-W10');
  });

  it('America/Chicago, fall back week (2024-11-03): 169 hours', () => {
    const w = weekStart(utc('2024-11-03T06:30:00Z'), 'America/Chicago'); // 01:30 CDT, the first of two
    expect(w.startMs).toBe(utc('2024-10-28T05:00:00Z'));
    expect(w.endMs).toBe(utc('2024-11-04T06:00:00Z'));
    expect((w.endMs - w.startMs) / H).toBe(169);
    expect(w.isoWeek).toBe('2024-W44');
  });

  it('an ordinary week is 168 hours, and a UTC week starts at 00:00Z', () => {
    const w = weekStart(utc('2024-06-12T10:00:00Z'), 'UTC');
    expect(w.startMs).toBe(utc('2024-06-10T00:00:00Z'));
    expect(w.endMs - w.startMs).toBe(168 * H);
  });

  it('puts the boundary instants in the right week', () => {
    const tz = 'Europe/Berlin';
    const w = weekStart(utc('2024-03-27T12:00:00Z'), tz);
    expect(weekStart(w.startMs, tz).startMs).toBe(w.startMs); // Monday 00:00 local belongs to its week
    expect(weekStart(w.endMs - 1, tz).startMs).toBe(w.startMs); // Sunday 23:59:59.999
    expect(weekStart(w.endMs, tz).startMs).toBe(w.endMs); // next Monday 00:00 starts the next week
    expect(weekStart(w.startMs - 1, tz).endMs).toBe(w.startMs);
  });

  it('uses the local date, not the UTC date (Sunday evening in Chicago is Monday in UTC)', () => {
    const w = weekStart(utc('2024-06-17T03:00:00Z'), 'America/Chicago'); // Sun 16 Jun 22:00 CDT
    expect(w.firstDay).toBe('2024-06-10');
    const tokyo = weekStart(utc('2024-06-16T20:00:00Z'), 'Asia/Tokyo'); // Mon 17 Jun 05:00 JST
    expect(tokyo.firstDay).toBe('2024-06-17');
    expect(tokyo.startMs).toBe(utc('2024-06-16T15:00:00Z'));
  });

  it('handles odd offsets and the southern hemisphere', () => {
    expect(weekStart(utc('2024-06-12T10:00:00Z'), 'Asia/Kolkata').startMs).toBe(utc('2024-06-09T18:30:00Z'));
    expect(weekStart(utc('2024-06-12T10:00:00Z'), 'Asia/Kathmandu').startMs).toBe(utc('2024-06-09T18:15:00Z'));
    // Sydney leaves DST on Sun 7 Apr 2024 (03:00 AEDT -> 02:00 AEST): 169 h.
    const syd = weekStart(utc('2024-04-03T00:00:00Z'), 'Australia/Sydney');
    expect(syd.startMs).toBe(utc('2024-03-31T13:00:00Z')); // Mon 1 Apr 00:00 AEDT (+11)
    expect((syd.endMs - syd.startMs) / H).toBe(169);
  });

  it('labels a week that spans New Year with its ISO year', () => {
    const w = weekStart(utc('2025-01-01T12:00:00Z'), 'Europe/Berlin');
    expect(w.isoWeek).toBe('2025-W01');
    expect(w.label).toBe('Week 1, 2025: Mon 30 Dec 2024 – Sun 5 Jan 2025');
    expect(weekStart(utc('2021-01-03T12:00:00Z'), 'UTC').isoWeek).toBe('2020-W53');
  });

  it('holds for any instant: contains it, starts on a local Monday 00:00, lasts 167–169 h', () => {
    const zones = ['Europe/Berlin', 'America/Chicago', 'Australia/Sydney', 'Asia/Kolkata', 'UTC', 'America/Sao_Paulo'];
    fc.assert(
      fc.property(fc.integer({ min: utc('2000-01-01T00:00:00Z'), max: utc('2035-12-31T00:00:00Z') }), fc.constantFrom(...zones), (t, tz) => {
        const w = weekStart(t, tz);
        expect(w.startMs).toBeLessThanOrEqual(t);
        expect(t).toBeLessThan(w.endMs);
        expect([167, 168, 169]).toContain((w.endMs - w.startMs) / H);
        const local = zonedDateTime(w.startMs, tz);
        expect([local.hour, local.minute, local.second]).toEqual([0, 0, 0]);
        expect(new Date(Date.UTC(local.year, local.month - 1, local.day)).getUTCDay()).toBe(1);
      }),
      { numRuns: 300 },
    );
  });

  it('throws a clear error on an unknown time zone or an invalid instant', () => {
    expect(() => weekStart(0, 'Mars/Olympus')).toThrow("weekStart: unknown time zone 'Mars/Olympus'");
    expect(() => weekStart(Number.NaN, 'UTC')).toThrow('weekStart requires a valid instant');
    expect(() => weekStart(new Date('not a date'), 'UTC')).toThrow('valid instant');
  });
});
