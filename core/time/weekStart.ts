import { civilDateAddDays, civilDateWeekday } from './civilDate';
import { isValidTimeZone } from './isValidTimeZone';
import { weekFromMonday, type Week } from './week';
import { zonedDateTime } from './zonedDateTime';

/**
 * The site week (Monday 00:00 to next Monday 00:00 local time) that holds an
 * instant.
 *
 * Formula in words: read the instant's local calendar date in `timeZone` with
 * Intl; step back to that week's Monday (weekday 0 = Monday); the week starts at
 * that Monday's local midnight and ends at the next Monday's local midnight,
 * each converted to UTC with the offset actually in force at that midnight (so a
 * week holding a DST change is 167 or 169 hours long).
 *
 * Units: `instant` is a Date or ms since the Unix epoch; startMs/endMs are ms since
 * the epoch, start inclusive, end exclusive. Throws a RangeError on an unknown
 * time zone or an invalid instant.
 *
 * Reference: ISO 8601-1:2019 (Monday-first weeks, week numbers); IANA time-zone
 * rules via ECMA-402 Intl.DateTimeFormat.
 *
 * Example: `weekStart(Date.UTC(2024, 2, 27, 12), 'Europe/Berlin')` is
 * { startMs: Date.UTC(2024, 2, 24, 23), endMs: Date.UTC(2024, 2, 31, 22),
 *   isoWeek: '2024-W13', label: 'Week 13, 2024: Mon 25 Mar – Sun 31 Mar 2024', ... }.
 */
export function weekStart(instant: Date | number, timeZone: string): Week {
  if (!isValidTimeZone(timeZone)) throw new RangeError(`weekStart: unknown time zone '${String(timeZone)}'`);
  const ms = instant instanceof Date ? instant.getTime() : instant;
  if (typeof ms !== 'number' || !Number.isFinite(ms)) throw new RangeError('weekStart requires a valid instant');
  const local = zonedDateTime(ms, timeZone);
  const monday = civilDateAddDays(local, -civilDateWeekday(local));
  return weekFromMonday(monday, timeZone);
}
