import { describe, expect, it } from 'vitest';
import { weekOf } from '../../../core/time/weekOf';
import { weeksBack } from '../../../core/time/weeksBack';

describe('weeksBack', () => {
  it('lists the n weeks ending with the given one, oldest first (documented example)', () => {
    expect(weeksBack(weekOf('2024-W02', 'UTC'), 3).map((w) => w.isoWeek)).toEqual(['2023-W52', '2024-W01', '2024-W02']);
    expect(weeksBack(weekOf('2024-W02', 'UTC'), 1).map((w) => w.isoWeek)).toEqual(['2024-W02']);
  });

  it('gives 13 contiguous weeks across a DST change, 13 x 168 h - 1 h long in all', () => {
    const weeks = weeksBack(weekOf('2024-W20', 'America/Chicago'), 13);
    expect(weeks).toHaveLength(13);
    for (let i = 1; i < weeks.length; i++) expect(weeks[i]?.startMs).toBe(weeks[i - 1]?.endMs);
    const first = weeks[0];
    const last = weeks[12];
    if (first === undefined || last === undefined) throw new Error('13 weeks expected');
    expect(first.isoWeek).toBe('2024-W08');
    // W08..W20 2024 contains spring forward (10 Mar) only.
    expect(last.endMs - first.startMs).toBe((13 * 168 - 1) * 3_600_000);
  });

  it('throws unless n is a whole number >= 1', () => {
    const w = weekOf('2024-W02', 'UTC');
    expect(() => weeksBack(w, 0)).toThrow('weeksBack requires a whole number of weeks >= 1, got 0');
    expect(() => weeksBack(w, 2.5)).toThrow('whole number');
    expect(() => weeksBack(w, Number.NaN)).toThrow('whole number');
  });
});
