import { civilDateAddDays, civilDateToIso, type CivilDate } from './civilDate';
import { formatIsoWeek, isoWeekNumber } from './isoWeekNumber';
import { startOfLocalDay } from './startOfLocalDay';

/**
 * A review week at a site: Monday 00:00 up to (not including) the next Monday
 * 00:00, on the site's wall clock. Because of DST a week is 167, 168 or 169 hours.
 */
export interface Week {
  /** First instant of the week, ms since the Unix epoch (inclusive). */
  readonly startMs: number;
  /** First instant of the next week, ms since the Unix epoch (exclusive). */
  readonly endMs: number;
  /** ISO 8601 week, 'YYYY-Www'. */
  readonly isoWeek: string;
  /** e.g. 'Week 12, 2024: Mon 18 Mar – Sun 24 Mar 2024'. */
  readonly label: string;
  /** IANA time zone the week is measured in. */
  readonly timeZone: string;
  /** The Monday, 'YYYY-MM-DD'. */
  readonly firstDay: string;
  /** The Sunday, 'YYYY-MM-DD'. */
  readonly lastDay: string;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

function dayText(d: CivilDate, weekday: string, withYear: boolean): string {
  return `${weekday} ${d.day} ${MONTHS[d.month - 1] ?? '?'}${withYear ? ` ${d.year}` : ''}`;
}

/**
 * Builds the {@link Week} that starts on `monday` in `timeZone`: both ends are
 * local midnights found with {@link startOfLocalDay}, so DST changes inside the
 * week are honoured. The label is English and locale-free, for print headers.
 *
 * Units: ms since the Unix epoch. Throws on an unknown time zone.
 *
 * Reference: ISO 8601-1:2019 (weeks start on Monday; week numbering).
 *
 * Example: `weekFromMonday({ year: 2024, month: 3, day: 25 }, 'Europe/Berlin')` runs
 * from 2024-03-24T23:00Z to 2024-03-31T22:00Z (167 h: summer time began on the
 * Sunday), isoWeek '2024-W13'.
 */
export function weekFromMonday(monday: CivilDate, timeZone: string): Week {
  const sunday = civilDateAddDays(monday, 6);
  const nextMonday = civilDateAddDays(monday, 7);
  const iso = isoWeekNumber(monday);
  const sameYear = monday.year === sunday.year;
  const label = `Week ${iso.week}, ${iso.year}: ${dayText(monday, 'Mon', !sameYear)} – ${dayText(sunday, 'Sun', true)}`;
  return {
    startMs: startOfLocalDay(monday, timeZone),
    endMs: startOfLocalDay(nextMonday, timeZone),
    isoWeek: formatIsoWeek(iso),
    label,
    timeZone,
    firstDay: civilDateToIso(monday),
    lastDay: civilDateToIso(sunday),
  };
}

/** The Monday of a {@link Week}, as a calendar date. */
export function weekMonday(week: Week): CivilDate {
  const [y, m, d] = week.firstDay.split('-').map(Number);
  return { year: y ?? NaN, month: m ?? NaN, day: d ?? NaN };
}
