import { civilDateAddDays } from './civilDate';
import { weekFromMonday, weekMonday, type Week } from './week';

/**
 * The week before `week`, in the same time zone: for "change from the previous
 * week" in the review.
 *
 * Formula in words: the Monday 7 calendar days earlier, then its local midnights
 * (not startMs - 7 x 24 h, which is off by an hour across a DST change).
 *
 * Units: ms since the Unix epoch in the result.
 *
 * Reference: ISO 8601-1:2019 (week dates).
 *
 * Example: `previousWeek(weekOf('2025-W01', 'UTC')).isoWeek` is '2024-W52'.
 */
export function previousWeek(week: Week): Week {
  return weekFromMonday(civilDateAddDays(weekMonday(week), -7), week.timeZone);
}
