// Accept / reject tables for the set-up and logging schemas: every rejection must
// name the field (path) and say what is wrong in plain words.
import { describe, expect, it } from 'vitest';
import {
  AreaInputSchema, LimitSetInputSchema, MeterInputSchema, ReadingBatchSchema, ReadingInputSchema, RoundInputSchema,
  SiteInputSchema, SpotInputSchema, issuesToFields,
} from '../../../core/schemas';

const SITE = '0190a3c8-5b1e-7cc4-8e2a-1f2b3c4d5e6f';
const V7 = '0190a3c8-5b1e-7cc4-8e2a-1f2b3c4d5e70';
const V4 = '3b241101-e2bb-4255-8caf-4136c566a962';

const reading = {
  id: V7, roundId: V7, spotId: SITE, meterId: SITE, takenAt: '2026-03-02T09:15:00Z',
  value: 1.2, unit: 'kV/m', polarity: '-', distance: { value: 25, unit: 'mm' }, zeroed: true,
};

function firstField(result: { success: boolean; error?: unknown }) {
  if (result.success) return null;
  return issuesToFields(result.error as never)[0];
}

describe('ReadingInputSchema', () => {
  it('accepts a routine reading and fills defaults', () => {
    const r = ReadingInputSchema.parse(reading);
    expect(r.note).toBe('');
    expect(r.process).toBeNull();
    expect(r.groundBehind).toBeNull();
  });
  it.each([
    ['unknown unit', { unit: 'kV/ft' }, 'unit', /unit must be one of/],
    ['negative distance', { distance: { value: -1, unit: 'mm' } }, 'distance.value', /greater than zero/],
    ['zero distance', { distance: { value: 0, unit: 'mm' } }, 'distance.value', /greater than zero/],
    ['string value', { value: '12' }, 'value', /must be a number/],
    ['NaN value', { value: NaN }, 'value', /number/],
    ['negative value', { value: -3 }, 'value', /polarity/],
    ['bad polarity', { polarity: 'neg' }, 'polarity', /\+ or -/],
    ['random (v4) id', { id: V4 }, 'id', /version 7/],
    ['bad time', { takenAt: 'yesterday' }, 'takenAt', /ISO 8601/],
    ['RH above 100', { rhPercent: 120 }, 'rhPercent', /between 0 and 100/],
    ['zeroed missing', { zeroed: undefined }, 'zeroed', /true or false/],
    ['long note', { note: 'x'.repeat(2001) }, 'note', /at most 2000/],
    ['bad side', { side: 'under' }, 'side', /side must be one of/],
  ])('rejects %s naming the field', (_name, patch, path, message) => {
    const f = firstField(ReadingInputSchema.safeParse({ ...reading, ...patch }));
    expect(f?.path).toBe(path);
    expect(f?.message).toMatch(message);
  });
  it('a missing field is reported as required', () => {
    const { spotId: _drop, ...rest } = reading;
    const f = firstField(ReadingInputSchema.safeParse(rest));
    expect(f?.path).toBe('spotId');
  });
  it('a batch names the index of the bad reading', () => {
    const f = firstField(ReadingBatchSchema.safeParse({ readings: [reading, { ...reading, distance: { value: 5, unit: 'yd' } }] }));
    expect(f?.path).toBe('readings.1.distance.unit');
  });
  it('an empty batch is rejected', () => {
    expect(firstField(ReadingBatchSchema.safeParse({ readings: [] }))?.path).toBe('readings');
  });
});

describe('set-up schemas', () => {
  it('site time zone must be IANA', () => {
    expect(SiteInputSchema.safeParse({ name: 'Plant', timeZone: 'Europe/Berlin' }).success).toBe(true);
    expect(firstField(SiteInputSchema.safeParse({ name: 'Plant', timeZone: 'Mars/Olympus' }))?.path).toBe('timeZone');
  });
  it('a hazardous area needs a zone; dust zones take no gas group', () => {
    expect(firstField(AreaInputSchema.safeParse({ siteId: SITE, name: 'Hall', kind: 'hazardous' }))?.path).toBe('zone');
    expect(firstField(AreaInputSchema.safeParse({ siteId: SITE, name: 'Room', kind: 'hazardous', zone: 21, gasGroup: 'IIB' }))?.path).toBe('gasGroup');
    expect(AreaInputSchema.safeParse({ siteId: SITE, name: 'Hall', kind: 'hazardous', zone: 1, gasGroup: 'IIA' }).success).toBe(true);
    expect(firstField(AreaInputSchema.safeParse({ siteId: SITE, name: 'EPA', kind: 'epa', zone: 1 }))?.path).toBe('zone');
    expect(firstField(AreaInputSchema.safeParse({ siteId: SITE, name: 'EPA', kind: 'epa', zone: 3 }))?.path).toBe('zone');
  });
  it('spot code and geometry are checked', () => {
    const spot = { areaId: SITE, name: 'Unwind roll', code: 'FH-01', objectKind: 'roll', defaultDistance: { value: 10, unit: 'cm' } };
    expect(SpotInputSchema.safeParse(spot).success).toBe(true);
    expect(firstField(SpotInputSchema.safeParse({ ...spot, code: 'FH 01' }))?.path).toBe('code');
    expect(firstField(SpotInputSchema.safeParse({ ...spot, geometry: { radiusM: -1 } }))?.path).toBe('geometry.radiusM');
    expect(firstField(SpotInputSchema.safeParse({ ...spot, geometry: { diameter: 1 } }))?.path).toBe('geometry');
  });
  it('a surface-voltage meter needs its calibrated distance', () => {
    const meter = { siteId: SITE, serial: 'FM-1', modes: ['field', 'surface-voltage'], calibrationDue: '2027-01-31' };
    expect(firstField(MeterInputSchema.safeParse(meter))?.path).toBe('calibratedDistanceM');
    expect(MeterInputSchema.safeParse({ ...meter, calibratedDistanceM: 0.0254 }).success).toBe(true);
    expect(firstField(MeterInputSchema.safeParse({ ...meter, calibratedDistanceM: 0.0254, geometryFactor: 3 }))?.path).toBe('geometryFactor');
    expect(firstField(MeterInputSchema.safeParse({ ...meter, modes: ['field'], defaultUnit: 'kV' }))?.path).toBe('defaultUnit');
  });
  it('limit rules: warn not above alarm, one rule per metric, at least one level', () => {
    const base = { siteId: SITE, name: 'EPA limits' };
    const rule = { metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'ANSI/ESD S20.20-2021 8.3.1' };
    expect(LimitSetInputSchema.safeParse({ ...base, rules: [rule] }).success).toBe(true);
    expect(firstField(LimitSetInputSchema.safeParse({ ...base, rules: [{ ...rule, warn: 6000 }] }))?.path).toBe('rules.0.warn');
    expect(firstField(LimitSetInputSchema.safeParse({ ...base, rules: [rule, rule] }))?.path).toBe('rules.1.metric');
    expect(firstField(LimitSetInputSchema.safeParse({ ...base, rules: [{ ...rule, warn: null, alarm: null }] }))?.path).toBe('rules.0.alarm');
  });
  it('a round id is made by the client and time-ordered', () => {
    const round = { id: V7, siteId: SITE, surveyor: 'A. Surveyor', startedAt: '2026-03-02T08:00:00+01:00' };
    expect(RoundInputSchema.safeParse(round).success).toBe(true);
    expect(firstField(RoundInputSchema.safeParse({ ...round, id: V4 }))?.path).toBe('id');
  });
});
