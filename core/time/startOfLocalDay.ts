import { civilDateCompare, civilDateToUtcMs, type CivilDate } from './civilDate';
import { zonedDateTime, zoneOffsetMs } from './zonedDateTime';

const MS_PER_DAY = 86_400_000;

/**
 * The first instant of a calendar day in a time zone: local 00:00, or, where the
 * clocks skip midnight (a DST gap at 00:00, as in America/Santiago or
 * America/Havana), the first instant that shows that date. Where midnight occurs
 * twice (clocks set back across it), the earlier one.
 *
 * Formula in words: take the date's 00:00 as if it were UTC (g); the true instant
 * is g - offset for the offset in force then, which is one of the offsets found
 * at g - 1 day, g and g + 1 day; keep the candidates whose local time really is
 * date 00:00:00 and return the earliest. If none (midnight skipped), search
 * by bisection for the first instant whose local date is the date.
 *
 * Units: ms since the Unix epoch (UTC). Throws on an unknown time zone.
 *
 * Reference: ECMA-402 / IANA tz database via Intl; the result is what TC39
 * Temporal's ZonedDateTime.prototype.startOfDay() defines (earliest midnight, or
 * the first instant after a gap).
 *
 * Example: `startOfLocalDay({ year: 2024, month: 3, day: 25 }, 'Europe/Berlin')`
 * is Date.UTC(2024, 2, 24, 23, 0) (00:00 CET = 23:00 UTC the evening before).
 */
export function startOfLocalDay(date: CivilDate, timeZone: string): number {
  const g = civilDateToUtcMs(date);
  const offsets = new Set([zoneOffsetMs(g - MS_PER_DAY, timeZone), zoneOffsetMs(g, timeZone), zoneOffsetMs(g + MS_PER_DAY, timeZone)]);
  let best = Infinity;
  for (const o of offsets) {
    const t = g - o;
    const z = zonedDateTime(t, timeZone);
    if (civilDateCompare(z, date) === 0 && z.hour === 0 && z.minute === 0 && z.second === 0 && t < best) best = t;
  }
  if (best !== Infinity) return best;
  // Midnight does not exist that day: the first instant showing `date`.
  let lo = g - 2 * MS_PER_DAY; // local date certainly before `date`
  let hi = g + MS_PER_DAY; // local date certainly on or after `date`
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (civilDateCompare(zonedDateTime(mid, timeZone), date) >= 0) hi = mid;
    else lo = mid;
  }
  return hi;
}
