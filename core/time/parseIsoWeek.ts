import { isoWeeksInYear, type IsoWeekNumber } from './isoWeekNumber';

/**
 * Reads an ISO 8601 week string 'YYYY-Www' (e.g. '2024-W12'), or returns null
 * when it is not one: wrong shape, week 0, or week 53 in a year that has only 52.
 *
 * Units: none. Never throws.
 *
 * Reference: ISO 8601-1:2019, 5.2.3.3 (week date, extended format, reduced to
 * the week).
 *
 * Example: `parseIsoWeek('2020-W53')` is { year: 2020, week: 53 };
 * `parseIsoWeek('2021-W53')` is null (2021 has 52 ISO weeks).
 */
export function parseIsoWeek(text: unknown): IsoWeekNumber | null {
  if (typeof text !== 'string') return null;
  const m = /^(\d{4})-W(\d{2})$/.exec(text);
  if (m === null) return null;
  const year = Number(m[1]);
  const week = Number(m[2]);
  if (week < 1 || week > isoWeeksInYear(year)) return null;
  return { year, week };
}
