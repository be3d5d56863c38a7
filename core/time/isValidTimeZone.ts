/**
 * True when `timeZone` is an IANA time-zone name (e.g. "Europe/Berlin",
 * "America/Chicago", "UTC") that this JavaScript runtime's Intl knows.
 *
 * Formula in words: ask Intl.DateTimeFormat to use the zone; it throws a
 * RangeError for unknown names. Names are matched case-insensitively by Intl;
 * use the canonical spelling when storing.
 *
 * Units: none. Never throws.
 *
 * Reference: ECMA-402 (ECMAScript Internationalization API), 11.1.2
 * (IsValidTimeZoneName); IANA Time Zone Database.
 *
 * Example: `isValidTimeZone('Europe/Berlin')` is true; `isValidTimeZone('Mars/Olympus')`
 * is false.
 */
export function isValidTimeZone(timeZone: unknown): timeZone is string {
  if (typeof timeZone !== 'string' || timeZone.trim() === '') return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone });
    return true;
  } catch {
    return false;
  }
}
