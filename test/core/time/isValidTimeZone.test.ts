import { describe, expect, it } from 'vitest';
import { isValidTimeZone } from '../../../core/time/isValidTimeZone';

describe('isValidTimeZone', () => {
  it('accepts IANA names the runtime knows', () => {
    for (const tz of ['Europe/Berlin', 'America/Chicago', 'UTC', 'Asia/Kathmandu', 'Australia/Sydney']) expect(isValidTimeZone(tz)).toBe(true);
  });

  it('rejects unknown names, empty strings and non-strings without throwing', () => {
    for (const tz of ['Mars/Olympus', 'Europe/Berlinn', '', '   ', undefined, null, 42, {}]) expect(isValidTimeZone(tz)).toBe(false);
  });
});
