// Site weeks (Monday 00:00 to Monday 00:00 in the site's IANA time zone) with
// Intl only; DST-correct. See each file for formula, units and an example.
export { civilDateAddDays, civilDateCompare, civilDateToIso, civilDateWeekday, type CivilDate } from './civilDate';
export { isValidTimeZone } from './isValidTimeZone';
export { formatIsoWeek, isoWeekNumber, isoWeeksInYear, mondayOfIsoWeek, type IsoWeekNumber } from './isoWeekNumber';
export { parseIsoWeek } from './parseIsoWeek';
export { previousWeek } from './previousWeek';
export { startOfLocalDay } from './startOfLocalDay';
export { weekFromMonday, weekMonday, type Week } from './week';
export { weekOf } from './weekOf';
export { weeksBack } from './weeksBack';
export { weekStart } from './weekStart';
export { zonedDateTime, zoneOffsetMs, type ZonedDateTime } from './zonedDateTime';
