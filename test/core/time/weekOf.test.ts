import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { weekOf } from '../../../core/time/weekOf';
import { weekStart } from '../../../core/time/weekStart';

describe('weekOf', () => {
  it('gives the documented Chicago DST week', () => {
    const w = weekOf('2024-W10', 'America/Chicago');
    expect(w.startMs).toBe(Date.parse('2024-03-04T06:00:00Z'));
    expect(w.endMs).toBe(Date.parse('2024-03-11T05:00:00Z'));
  });

  it('finds week 1 by 4 January (ISO 8601), across year ends', () => {
    expect(weekOf('2025-W01', 'UTC').firstDay).toBe('2024-12-30');
    expect(weekOf('2021-W01', 'UTC').firstDay).toBe('2021-01-04');
    expect(weekOf('2020-W53', 'UTC').firstDay).toBe('2020-12-28');
    expect(weekOf('2026-W53', 'UTC').lastDay).toBe('2027-01-03');
  });

  it('round-trips with weekStart for any instant', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.parse('1990-01-01T00:00:00Z'), max: Date.parse('2040-01-01T00:00:00Z') }),
        fc.constantFrom('Europe/Berlin', 'America/Chicago', 'Pacific/Auckland', 'UTC'),
        (t, tz) => {
          const w = weekStart(t, tz);
          expect(weekOf(w.isoWeek, tz)).toEqual(w);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('rejects strings that are not ISO weeks, and unknown zones', () => {
    for (const bad of ['2021-W53', '2024-W00', '2024-W54', '2024W12', '2024-W1', '24-W12', '', '2024-12-01']) {
      expect(() => weekOf(bad, 'UTC')).toThrow(`weekOf: '${bad}' is not an ISO week like '2024-W12'`);
    }
    expect(() => weekOf('2024-W12', 'Nowhere/Town')).toThrow("weekOf: unknown time zone 'Nowhere/Town'");
  });
});
