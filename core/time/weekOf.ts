import { isValidTimeZone } from './isValidTimeZone';
import { mondayOfIsoWeek } from './isoWeekNumber';
import { parseIsoWeek } from './parseIsoWeek';
import { weekFromMonday, type Week } from './week';

/**
 * The site week for an ISO week string, e.g. the week a review URL names.
 *
 * Formula in words: parse 'YYYY-Www'; its Monday is 4 January of that year moved
 * back to its Monday, plus 7 (ww - 1) days; the week runs between the local
 * midnights of that Monday and the next (see {@link weekStart}).
 *
 * Units: ms since the Unix epoch in the result. Throws a RangeError on a string
 * that is not an ISO week (including week 53 of a 52-week year) or an unknown
 * time zone.
 *
 * Reference: ISO 8601-1:2019 (week dates).
 *
 * Example: `weekOf('2024-W10', 'America/Chicago')` runs from
 * 2024-03-04T06:00Z to 2024-03-11T05:00Z (167 h; DST began Sunday 10 March).
 */
export function weekOf(isoWeek: string, timeZone: string): Week {
  const parsed = parseIsoWeek(isoWeek);
  if (parsed === null) throw new RangeError(`weekOf: '${String(isoWeek)}' is not an ISO week like '2024-W12'`);
  if (!isValidTimeZone(timeZone)) throw new RangeError(`weekOf: unknown time zone '${String(timeZone)}'`);
  return weekFromMonday(mondayOfIsoWeek(parsed), timeZone);
}
