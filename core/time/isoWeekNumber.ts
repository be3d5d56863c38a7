import { civilDateAddDays, civilDateToUtcMs, civilDateWeekday, type CivilDate } from './civilDate';

/** An ISO 8601 week: the week-numbering year and the week, 1–53. */
export interface IsoWeekNumber {
  readonly year: number;
  readonly week: number;
}

/**
 * The ISO 8601 week of a calendar date. Weeks run Monday to Sunday; week 1 is the
 * week holding the year's first Thursday (equivalently 4 January), so the week's
 * year is the year of its Thursday and can differ from the date's year around
 * New Year.
 *
 * Formula in words: move to the Thursday of the date's week (date + 3 - weekday,
 * weekday 0 = Monday); the week number is 1 + floor((day of year of that
 * Thursday - 1) / 7) and the year is that Thursday's year.
 *
 * Units: none. Reference: ISO 8601-1:2019, 3.2.2 (week calendar).
 *
 * Example: `isoWeekNumber({ year: 2024, month: 12, day: 30 })` is
 * { year: 2025, week: 1 }; 2021-01-03 is { year: 2020, week: 53 }.
 */
export function isoWeekNumber(date: CivilDate): IsoWeekNumber {
  const thursday = civilDateAddDays(date, 3 - civilDateWeekday(date));
  const jan1 = civilDateToUtcMs({ year: thursday.year, month: 1, day: 1 });
  const dayOfYear = Math.round((civilDateToUtcMs(thursday) - jan1) / 86_400_000) + 1;
  return { year: thursday.year, week: 1 + Math.floor((dayOfYear - 1) / 7) };
}

/** Number of ISO weeks in a week-numbering year: 52 or 53 (28 December is always in the last). */
export function isoWeeksInYear(year: number): number {
  return isoWeekNumber({ year, month: 12, day: 28 }).week;
}

/** 'YYYY-Www', e.g. '2024-W03'. */
export function formatIsoWeek({ year, week }: IsoWeekNumber): string {
  return `${String(year).padStart(4, '0')}-W${String(week).padStart(2, '0')}`;
}

/** The Monday that starts an ISO week (week 1 holds 4 January). */
export function mondayOfIsoWeek({ year, week }: IsoWeekNumber): CivilDate {
  const jan4: CivilDate = { year, month: 1, day: 4 };
  return civilDateAddDays(jan4, -civilDateWeekday(jan4) + 7 * (week - 1));
}
