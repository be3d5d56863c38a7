// Limit evaluation edges. The EPA numbers are ANSI/ESD S20.20-2021 8.3.1 (125 V/inch
// = 4921 V/m) and the isolated-conductor 35 V of its scope; the warn level is ours.
import { describe, expect, it } from 'vitest';
import { checkMetric, evaluateLimits, worseLevel, type LimitRule } from '../../../core/limits';

const field: LimitRule = { metric: 'fieldVPerM', warn: 2500, alarm: 4921.26, source: 'ANSI/ESD S20.20-2021 8.3.1' };
const volts: LimitRule = { metric: 'surfaceVoltageV', warn: null, alarm: 35, source: 'ANSI/ESD S20.20-2021 scope' };

describe('checkMetric', () => {
  it('below warn is ok and names the nearest level', () => {
    const c = checkMetric(field, 2499.99);
    expect(c.level).toBe('ok');
    expect(c.limit).toBe(2500);
    expect(c.reason).toMatch(/below the warn level/);
  });
  it('exactly at the warn level warns (limits are written "below X")', () => {
    expect(checkMetric(field, 2500).level).toBe('warn');
  });
  it('exactly at the alarm level alarms', () => {
    const c = checkMetric(field, 4921.26);
    expect(c.level).toBe('alarm');
    expect(c.limit).toBe(4921.26);
    expect(c.ratioToAlarm).toBeCloseTo(1, 12);
  });
  it('uses the magnitude: -6000 V/m alarms', () => {
    const c = checkMetric(field, -6000);
    expect(c.level).toBe('alarm');
    expect(c.value).toBe(6000);
  });
  it('alarm-only rules never warn', () => {
    expect(checkMetric(volts, 34.9).level).toBe('ok');
    expect(checkMetric(volts, 35).level).toBe('alarm');
  });
  it('a rule with neither level says so', () => {
    expect(checkMetric({ metric: 'chargeC', warn: null, alarm: null, source: 'x' }, 1).reason).toMatch(/no level set/);
  });
});

describe('evaluateLimits', () => {
  it('takes the worst level across metrics and says which decided', () => {
    const v = evaluateLimits([field, volts], { fieldVPerM: 3000, surfaceVoltageV: 40 });
    expect(v.level).toBe('alarm');
    expect(v.decidedBy?.metric).toBe('surfaceVoltageV');
    expect(v.checks).toHaveLength(2);
  });
  it('among equal levels the higher ratio to alarm decides', () => {
    const v = evaluateLimits([field, { ...volts, warn: 20 }], { fieldVPerM: 3000, surfaceVoltageV: 25 });
    expect(v.level).toBe('warn');
    expect(v.decidedBy?.metric).toBe('surfaceVoltageV'); // 25/35 = 0.71 > 3000/4921 = 0.61
  });
  it('skips metrics without a finite value', () => {
    const v = evaluateLimits([field, volts], { fieldVPerM: 100, surfaceVoltageV: NaN });
    expect(v.checks.map((c) => c.metric)).toEqual(['fieldVPerM']);
  });
  it('no applicable rule: ok, and says nothing was judged', () => {
    const v = evaluateLimits([], { fieldVPerM: 1e6 });
    expect(v.level).toBe('ok');
    expect(v.decidedBy).toBeNull();
    expect(v.reason).toMatch(/No limit/);
  });
  it('worseLevel', () => {
    expect(worseLevel('ok', 'warn')).toBe('warn');
    expect(worseLevel('alarm', 'warn')).toBe('alarm');
  });
});

describe('rules meant for one material class', () => {
  // ANSI/ESD S20.20-2021 scope: the 35 V level is for isolated conductors, not insulators.
  const conductorOnly: LimitRule = { ...volts, appliesTo: ['conductor'] };
  it('applies to conductors and to spots of unknown material (cautious)', () => {
    expect(evaluateLimits([conductorOnly], { surfaceVoltageV: 50 }, { materialClass: 'conductor' }).level).toBe('alarm');
    expect(evaluateLimits([conductorOnly], { surfaceVoltageV: 50 }, { materialClass: 'unknown' }).level).toBe('alarm');
    expect(evaluateLimits([conductorOnly], { surfaceVoltageV: 50 }).level).toBe('alarm');
  });
  it('is skipped for an insulator', () => {
    const v = evaluateLimits([field, conductorOnly], { fieldVPerM: 100, surfaceVoltageV: 50 }, { materialClass: 'insulator' });
    expect(v.level).toBe('ok');
    expect(v.checks.map((c) => c.metric)).toEqual(['fieldVPerM']);
  });
});
