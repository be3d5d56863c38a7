/**
 * The tablet's offline round logic (client/round/logic.ts): what the screen
 * shows before the server has seen anything must match the server's rules.
 */
import { describe, expect, it } from 'vitest';
import { deriveLocal, revisionChains, routeOf, spotStats, summarizeRound, worseReading } from '../../client/round/logic';
import { backoffDelay } from '../../client/offline/backoff';
import type { LocalReading } from '../../client/offline/types';
import type { ReadingInput, SetupBundle } from '../../core/schemas';

const T0 = '2026-03-02T09:00:00.000Z';
const site = { id: 's1', name: 'Plant', timeZone: 'UTC', notes: '', createdAt: T0, updatedAt: T0 };
const bundle: SetupBundle = {
  site,
  areas: [
    { id: 'a2', siteId: 's1', name: 'Hall', kind: 'general', zone: null, gasGroup: null, substanceId: null, dustMieJ: null, limitSetId: null, notes: '', createdAt: T0, updatedAt: T0 },
    { id: 'a1', siteId: 's1', name: 'EPA', kind: 'epa', zone: null, gasGroup: null, substanceId: null, dustMieJ: null, limitSetId: 'l1', notes: '', createdAt: T0, updatedAt: T0 },
  ],
  spots: (['x', 'y', 'z', 'r'] as const).map((n, i) => ({
    id: n, areaId: i < 2 ? 'a1' : 'a2', name: `Spot ${n}`, code: n.toUpperCase(), objectKind: 'workstation' as const, materialClass: 'unknown' as const,
    model: null, geometry: {}, defaultDistance: { value: 10, unit: 'cm' as const }, distanceUncertaintyM: null,
    routePosition: [1, 0, 0, 1][i]!, notes: '', createdAt: T0, updatedAt: T0, retiredAt: n === 'r' ? T0 : null, retiredReason: n === 'r' ? 'gone' : null,
  })),
  meters: [{ id: 'm1', siteId: 's1', serial: 'S', label: 'A', modes: ['field', 'surface-voltage'], calibratedDistanceM: 0.0254, accuracyRel: 0.05, geometryFactor: 1, calibrationDue: '2026-02-28', defaultUnit: 'kV/m', createdAt: T0, updatedAt: T0 }],
  limitSets: [{ id: 'l1', siteId: 's1', name: 'EPA', description: '', rules: [{ metric: 'fieldVPerM', warn: 5000, alarm: 10000, source: 'test' }], createdAt: T0, updatedAt: T0 }],
};

function input(over: Partial<ReadingInput>): ReadingInput {
  return {
    id: 'r1', roundId: 'R', spotId: 'x', meterId: 'm1', takenAt: T0, value: 1, unit: 'kV/m', polarity: '+', meterRange: '',
    distance: { value: 10, unit: 'cm' }, distanceUncertaintyM: null, side: null, groundBehind: null, zeroed: true,
    rhPercent: null, temperatureC: null, process: null, note: '', ...over,
  };
}

describe('deriveLocal', () => {
  it('normalizes, judges against the area limit set and flags an overdue meter', () => {
    const r = deriveLocal(input({ value: 12.5, polarity: '-' }), bundle);
    expect(r.fieldVPerM).toBe(-12500);
    expect(r.distanceM).toBeCloseTo(0.1, 12);
    expect(r.verdict.level).toBe('alarm');
    expect(r.verdict.reason).toContain('alarm level');
    expect(r.meterCalibrationOverdue).toBe(true); // due 2026-02-28, taken 2026-03-02
    expect(r.origin).toBe('local');
  });
  it('gives ok with "no limit applies" in an area without a limit set', () => {
    const r = deriveLocal(input({ spotId: 'z', value: 99 }), bundle);
    expect(r.verdict.level).toBe('ok');
    expect(r.verdict.decidedBy).toBeNull();
  });
  it('converts surface-voltage mode with the calibrated distance: 1 kV at 1 inch is 39.37 kV/m', () => {
    expect(deriveLocal(input({ value: 1, unit: 'kV' }), bundle).fieldVPerM).toBeCloseTo(1000 / 0.0254, 9);
  });
});

const R = (id: string, spotId: string, vPerM: number, level: 'ok' | 'warn' | 'alarm', extra: Partial<LocalReading> = {}): LocalReading => ({
  ...deriveLocal(input({ id, spotId }), bundle), fieldVPerM: vPerM,
  verdict: { level, decidedBy: null, checks: [], reason: level }, ...extra,
});

describe('routeOf', () => {
  it('orders by the bundle area order, then route position, and leaves retired spots out', () => {
    expect(routeOf(bundle).map((s) => s.id)).toEqual(['z', 'y', 'x']);
  });
});

describe('spotStats and worseReading', () => {
  it('has no worst or typical with no readings', () => {
    expect(spotStats([])).toEqual({ count: 0, worst: null, typicalAbsVPerM: null });
  });
  it('takes the worst by level then |field|, and the median of |field| as typical', () => {
    const rs = [R('1', 'x', -3000, 'ok'), R('2', 'x', 6000, 'warn'), R('3', 'x', -9000, 'warn'), R('4', 'x', 100, 'ok', { deleted: { reason: 'dup', at: T0 } })];
    const s = spotStats(rs);
    expect(s.count).toBe(3);
    expect(s.worst?.id).toBe('3');
    expect(s.typicalAbsVPerM).toBe(6000);
    expect(worseReading(R('a', 'x', 1, 'alarm'), R('b', 'x', 99999, 'warn')).id).toBe('a');
  });
});

describe('summarizeRound', () => {
  it('counts current readings, warnings, alarms, skipped and the planned spots not measured', () => {
    const readings = [
      R('1', 'x', 1, 'ok'), R('2', 'x', 6000, 'warn'), R('3', 'y', 12000, 'alarm'),
      R('4', 'y', 1, 'alarm', { supersededById: '5' }), // superseded: not counted
    ];
    const skips = [{ id: 'k', roundId: 'R', spotId: 'z', reason: 'No access', at: T0 }];
    const s = summarizeRound({ plannedSpotIds: ['x', 'y', 'z', 'w'] }, readings, skips);
    expect(s).toMatchObject({ readings: 3, spotsMeasured: 2, planned: 4, warnings: 1, alarms: 1, notMeasured: ['w'] });
    expect(s.skipped).toHaveLength(1);
  });
  it('is all zeros for an empty round', () => {
    expect(summarizeRound({ plannedSpotIds: [] }, [], [])).toMatchObject({ readings: 0, spotsMeasured: 0, planned: 0, notMeasured: [] });
  });
});

describe('revisionChains', () => {
  it('puts each current or deleted head first with its older revisions, newest chain first', () => {
    const a = R('a', 'x', 1, 'ok', { takenAt: '2026-03-02T09:00:00Z', supersededById: 'b' });
    const b = R('b', 'x', 2, 'ok', { takenAt: '2026-03-02T09:00:00Z', supersedesId: 'a', supersededById: 'c' });
    const c = R('c', 'x', 3, 'ok', { takenAt: '2026-03-02T09:00:00Z', supersedesId: 'b', correctionReason: 'typo' });
    const d = R('d', 'x', 4, 'ok', { takenAt: '2026-03-02T10:00:00Z', deleted: { reason: 'twice', at: T0 } });
    const chains = revisionChains([a, c, d, b]);
    expect(chains.map((ch) => [ch.head.id, ch.older.map((o) => o.id)])).toEqual([['d', []], ['c', ['b', 'a']]]);
  });
});

describe('backoffDelay', () => {
  it('doubles from 1 s with jitter in the upper half, capped at 60 s', () => {
    expect(backoffDelay(1, () => 0)).toBe(500);
    expect(backoffDelay(1, () => 1)).toBe(1000);
    expect(backoffDelay(3, () => 1)).toBe(4000);
    expect(backoffDelay(30, () => 1)).toBe(60000);
    expect(backoffDelay(30, () => 0)).toBe(30000);
  });
});
