import type { CivilDate } from './civilDate';
import { isValidTimeZone } from './isValidTimeZone';

/** Wall-clock date and time in a time zone, to the second. */
export interface ZonedDateTime extends CivilDate {
  readonly hour: number;
  readonly minute: number;
  readonly second: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (f === undefined) {
    if (!isValidTimeZone(timeZone)) throw new RangeError(`unknown time zone '${timeZone}'`);
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      era: 'short',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

/**
 * The wall-clock date and time shown in `timeZone` at the instant `ms`, read
 * from Intl.DateTimeFormat (the runtime's IANA database, DST included).
 *
 * Units: ms since the Unix epoch (UTC); fields as on a calendar and a 24-hour clock.
 * Throws on an unknown time zone or a non-finite instant.
 *
 * Reference: ECMA-402, 11.5.5 (FormatDateTimeToParts); IANA Time Zone Database.
 *
 * Example: `zonedDateTime(Date.UTC(2024, 2, 31, 1, 0), 'Europe/Berlin')` is
 * 2024-03-31 03:00:00 (summer time began that second; 02:00–03:00 does not exist).
 */
export function zonedDateTime(ms: number, timeZone: string): ZonedDateTime {
  if (!Number.isFinite(ms)) throw new RangeError(`zonedDateTime requires a finite instant, got ${String(ms)}`);
  const parts = formatterFor(timeZone).formatToParts(ms);
  let year = 0;
  let month = 0;
  let day = 0;
  let hour = 0;
  let minute = 0;
  let second = 0;
  let bc = false;
  for (const p of parts) {
    switch (p.type) {
      case 'year': year = Number(p.value); break;
      case 'month': month = Number(p.value); break;
      case 'day': day = Number(p.value); break;
      case 'hour': hour = Number(p.value) % 24; break;
      case 'minute': minute = Number(p.value); break;
      case 'second': second = Number(p.value); break;
      case 'era': bc = p.value.startsWith('B'); break;
      default: break;
    }
  }
  if (bc) year = 1 - year;
  return { year, month, day, hour, minute, second };
}

/**
 * Offset of `timeZone` from UTC at the instant `ms`, in ms (local = UTC + offset;
 * +3 600 000 for CET, -18 000 000 for CDT).
 */
export function zoneOffsetMs(ms: number, timeZone: string): number {
  const z = zonedDateTime(ms, timeZone);
  const d = new Date(0);
  d.setUTCFullYear(z.year, z.month - 1, z.day);
  d.setUTCHours(z.hour, z.minute, z.second, 0);
  const wholeSeconds = ms - (((ms % 1000) + 1000) % 1000);
  return d.getTime() - wholeSeconds;
}
