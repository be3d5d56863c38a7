import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { previousWeek } from '../../../core/time/previousWeek';
import { weekOf } from '../../../core/time/weekOf';
import { weekStart } from '../../../core/time/weekStart';

describe('previousWeek', () => {
  it('steps back across New Year (documented example)', () => {
    expect(previousWeek(weekOf('2025-W01', 'UTC')).isoWeek).toBe('2024-W52');
    expect(previousWeek(weekOf('2021-W01', 'UTC')).isoWeek).toBe('2020-W53');
  });

  it('steps back by calendar days, not 168 h, across a DST change', () => {
    const after = weekOf('2024-W14', 'Europe/Berlin'); // the week after spring forward
    const before = previousWeek(after);
    expect(before.isoWeek).toBe('2024-W13');
    expect(before.endMs).toBe(after.startMs);
    expect(after.startMs - before.startMs).toBe(167 * 3_600_000);
  });

  it('always ends where the given week starts', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: Date.parse('2000-01-01T00:00:00Z'), max: Date.parse('2035-01-01T00:00:00Z') }),
        fc.constantFrom('Europe/Berlin', 'America/Chicago', 'Australia/Sydney'),
        (t, tz) => {
          const w = weekStart(t, tz);
          const p = previousWeek(w);
          expect(p.endMs).toBe(w.startMs);
          expect(p.timeZone).toBe(tz);
        },
      ),
      { numRuns: 200 },
    );
  });
});
