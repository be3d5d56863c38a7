/**
 * A calendar date with no time zone attached ("civil" date, proleptic Gregorian),
 * and the small arithmetic the week functions need. Computed through Date.UTC,
 * which has no DST, so adding days is exact.
 *
 * Units: month 1–12, day 1–31; weekday 0 = Monday ... 6 = Sunday (ISO 8601).
 *
 * Reference: ISO 8601-1:2019 (calendar dates, week days).
 *
 * Example: `civilDateAddDays({ year: 2024, month: 2, day: 28 }, 2)` is
 * { year: 2024, month: 3, day: 1 }; `civilDateWeekday({ year: 2024, month: 3, day: 18 })`
 * is 0 (a Monday).
 */
export interface CivilDate {
  readonly year: number;
  readonly month: number;
  readonly day: number;
}

const MS_PER_DAY = 86_400_000;

/** ms of 00:00 UTC on `date` (valid for years 0–99 too, unlike Date.UTC). */
export function civilDateToUtcMs(date: CivilDate): number {
  const d = new Date(0);
  d.setUTCFullYear(date.year, date.month - 1, date.day);
  d.setUTCHours(0, 0, 0, 0);
  return d.getTime();
}

/** The UTC calendar date of an instant. */
export function civilDateFromUtcMs(ms: number): CivilDate {
  const d = new Date(ms);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
}

/** `date` plus `days` calendar days (negative goes back). */
export function civilDateAddDays(date: CivilDate, days: number): CivilDate {
  return civilDateFromUtcMs(civilDateToUtcMs(date) + days * MS_PER_DAY);
}

/** ISO weekday: 0 = Monday ... 6 = Sunday. */
export function civilDateWeekday(date: CivilDate): number {
  return (new Date(civilDateToUtcMs(date)).getUTCDay() + 6) % 7;
}

/** 'YYYY-MM-DD'. */
export function civilDateToIso(date: CivilDate): string {
  return `${String(date.year).padStart(4, '0')}-${String(date.month).padStart(2, '0')}-${String(date.day).padStart(2, '0')}`;
}

/** Orders dates: negative, zero or positive like a comparator. */
export function civilDateCompare(a: CivilDate, b: CivilDate): number {
  return a.year - b.year || a.month - b.month || a.day - b.day;
}
