import { civilDateAddDays } from './civilDate';
import { weekFromMonday, weekMonday, type Week } from './week';

/**
 * The `n` weeks ending with `week` (inclusive), oldest first, in the same time
 * zone: the window for "trend over the last 8 weeks" or "the site's usual
 * humidity over 13 weeks". To end with the week before, pass
 * `previousWeek(week)`. The whole window is [result[0].startMs, result[n-1].endMs).
 *
 * Formula in words: the Mondays 7 (n - 1), ..., 7, 0 calendar days before the
 * week's Monday, each turned into a week between local midnights.
 *
 * Units: n is a count of weeks; ms since the Unix epoch in the result.
 * Throws unless n is a whole number >= 1.
 *
 * Reference: ISO 8601-1:2019 (week dates).
 *
 * Example: `weeksBack(weekOf('2024-W02', 'UTC'), 3).map((w) => w.isoWeek)` is
 * ['2023-W52', '2024-W01', '2024-W02'].
 */
export function weeksBack(week: Week, n: number): Week[] {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`weeksBack requires a whole number of weeks >= 1, got ${String(n)}`);
  const monday = weekMonday(week);
  const weeks: Week[] = [];
  for (let i = n - 1; i >= 0; i--) weeks.push(weekFromMonday(civilDateAddDays(monday, -7 * i), week.timeZone));
  return weeks;
}
