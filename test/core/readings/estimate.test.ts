// deriveReading with the spot's model and the area: the reading becomes an estimate
// (core/physics estimate()) whose charge, surface charge density and energy join the
// limit evaluation, plus hazard verdicts (core/hazard). Closed forms are checked
// against the closed forms; thresholds against their published sources.
import { describe, expect, it } from 'vitest';
import { EPSILON_0 } from '../../../core/physics/constants';
import { estimate } from '../../../core/physics/estimate';
import { hazardVerdicts } from '../../../core/hazard/verdicts';
import { limitTemplate } from '../../../core/hazard/templates';
import { deriveReading, type ReadingCore } from '../../../core/readings/derive';
import { estimateRequestFor, hazardAreaOf, SV_AS_POTENTIAL_WARNING } from '../../../core/readings/estimate';
import { ReadingSchema } from '../../../core/schemas/entities';

const at = '2026-03-02T09:00:00Z';
const meter = { calibratedDistanceM: 0.0254, calibrationDue: '2099-12-31', accuracyRel: 0.05, geometryFactor: 1 };
const reading = (over: Partial<ReadingCore> = {}): ReadingCore => ({
  value: 20, unit: 'kV/m', polarity: '-', distance: { value: 10, unit: 'cm' }, takenAt: at, ...over,
});
// The demo's unwind roll (server/demo/plant.ts C-01): a line model, radius 0.35 m, length 1.6 m.
const roll = { model: 'line' as const, geometry: { radiusM: 0.35, lengthM: 1.6 }, materialClass: 'insulator', distanceUncertaintyM: null };
const zone1IIA = { kind: 'hazardous' as const, zone: 1 as const, gasGroup: 'IIA' as const, substanceId: null, dustMieJ: null };

describe('deriveReading without a spot or area (backward compatible)', () => {
  it('gives no estimate, no note and no hazards, and the same verdict as before', () => {
    const rules = [{ metric: 'fieldVPerM' as const, warn: 2500, alarm: 4921.26, source: 'ANSI/ESD S20.20-2021 8.3.1' }];
    const d = deriveReading(reading(), meter, rules);
    expect(d.estimate).toBeNull();
    expect(d.estimateNote).toBeNull();
    expect(d.hazards).toEqual([]);
    expect(d.verdict.level).toBe('alarm');
    expect(Object.keys(d.metrics).sort()).toEqual(['fieldVPerM', 'surfaceVoltageV']);
  });
  it('a spot without a model gives no estimate and no note', () => {
    const d = deriveReading(reading(), meter, [], { spot: { ...roll, model: null } });
    expect(d.estimate).toBeNull();
    expect(d.estimateNote).toBeNull();
  });
});

describe('deriveReading with the spot model (line: a roll)', () => {
  const rules = limitTemplate({ kind: 'hazardous', zone: 1, gasGroup: 'IIA' }).rules;
  const d = deriveReading(reading(), meter, rules, { spot: roll, area: zone1IIA });

  it('runs estimate() with the reading, the geometry and the meter accuracy', () => {
    const direct = estimate({ model: 'line', fieldVPerM: -20000, distanceM: 0.1, geometry: { radiusM: 0.35, lengthM: 1.6 }, meterAccuracyRel: 0.05, geometryFactor: 1 });
    expect(d.estimate).toEqual(direct);
    // Finite line (Griffiths, Introduction to Electrodynamics, Example 2.1): E = lambda/(2 pi eps0 rho) (L/2)/sqrt(rho^2 + (L/2)^2), rho = a + g = 0.45 m; Q = lambda L.
    const rho = 0.45; const half = 0.8;
    const lambda = -20000 * 2 * Math.PI * EPSILON_0 * rho * Math.sqrt(rho ** 2 + half ** 2) / half;
    expect(d.estimate!.chargeC!).toBeCloseTo(lambda * 1.6, 15);
    expect(d.estimate!.chargeC!).toBeLessThan(0); // polarity kept
    const [lo, hi] = d.estimate!.interval.chargeC!;
    expect(lo).toBeLessThan(d.estimate!.chargeC!);
    expect(hi).toBeGreaterThan(d.estimate!.chargeC!);
  });

  it('feeds charge and surface charge density into the limit evaluation (magnitudes)', () => {
    expect(d.metrics.chargeC).toBeCloseTo(Math.abs(d.estimate!.chargeC!), 20);
    expect(d.metrics.surfaceChargeDensityCPerM2).toBeCloseTo(Math.abs(d.estimate!.surfaceChargeDensityCPerM2!), 20);
    // ~0.9 uC on the roll against the IIA transferred-charge limit of 60 nC (from memory, IEC 60079-0 / IEC 60079-32-2)
    expect(d.verdict.level).toBe('alarm');
    expect(['chargeC', 'surfaceChargeDensityCPerM2']).toContain(d.verdict.decidedBy?.metric);
  });

  it('gives the hazard verdicts of core/hazard for the area and the object', () => {
    const direct = hazardVerdicts({ area: hazardAreaOf(zone1IIA), objectKind: 'insulator', estimate: d.estimate, fieldVPerM: d.fieldVPerM });
    expect(d.hazards).toEqual(direct);
    const transfer = d.hazards.find((v) => v.check === 'transfer-charge')!;
    expect(transfer.level).toBe('warn');
    expect(transfer.compared?.threshold).toBeCloseTo(60e-9, 20);
    expect(transfer.caution).toMatch(/qualified people/);
  });

  it('caller extraMetrics win over the estimate', () => {
    const e = deriveReading(reading(), meter, rules, { spot: roll, extraMetrics: { chargeC: 1e-9 } });
    expect(e.metrics.chargeC).toBe(1e-9);
  });
});

describe('distance uncertainty, ground behind, meter', () => {
  it("uses the reading's distance uncertainty, else the spot's", () => {
    const spot = { ...roll, distanceUncertaintyM: 0.02 };
    const a = deriveReading(reading({ distanceUncertaintyM: 0.001 }), meter, [], { spot });
    const b = deriveReading(reading({ distanceUncertaintyM: null }), meter, [], { spot });
    const c = deriveReading(reading(), meter, [], { spot: roll });
    expect(a.estimate!.intervalMethod).toContain('distance 1 mm');
    expect(b.estimate!.intervalMethod).toContain('distance 20 mm');
    expect(c.estimate!.intervalMethod).toContain('default'); // max(5 mm, 10 % of d)
    const width = (x: typeof a) => x.estimate!.interval.chargeC![1] - x.estimate!.interval.chargeC![0];
    expect(width(a)).toBeLessThan(width(b));
  });

  it("sheet: the reading's ground behind overrides the spot geometry (three-plane model)", () => {
    const sheet = { model: 'sheet' as const, geometry: { widthM: 1.5, groundBehindM: 0.3 }, materialClass: 'insulator' };
    const withSpot = deriveReading(reading({ distance: { value: 5, unit: 'cm' } }), meter, [], { spot: sheet });
    const withReading = deriveReading(reading({ distance: { value: 5, unit: 'cm' }, groundBehind: { value: 2, unit: 'cm' } }), meter, [], { spot: sheet });
    // Three-plane model (Gauss law between grounded planes): sigma = eps0 E (a + b) / b
    expect(withSpot.estimate!.surfaceChargeDensityCPerM2!).toBeCloseTo(EPSILON_0 * -20000 * (0.05 + 0.3) / 0.3, 18);
    expect(withReading.estimate!.surfaceChargeDensityCPerM2!).toBeCloseTo(EPSILON_0 * -20000 * (0.05 + 0.02) / 0.02, 18);
  });

  it("the meter's geometry factor divides a point-like estimate", () => {
    const point = { model: 'point' as const, geometry: {}, materialClass: 'insulator' };
    const f1 = deriveReading(reading(), meter, [], { spot: point });
    const f2 = deriveReading(reading(), { ...meter, geometryFactor: 2 }, [], { spot: point });
    expect(f2.estimate!.chargeC! / f1.estimate!.chargeC!).toBeCloseTo(0.5, 12);
    // Point charge (Coulomb): Q = 4 pi eps0 r^2 E
    expect(f1.estimate!.chargeC!).toBeCloseTo(4 * Math.PI * EPSILON_0 * 0.01 * -20000, 18);
  });
});

describe('conductor model', () => {
  const person = { model: 'conductor' as const, geometry: { capacitanceF: 200e-12 }, materialClass: 'person' };
  it('takes the surface-voltage display as the potential and says so', () => {
    const d = deriveReading(reading({ value: 2, unit: 'kV', polarity: '+' }), meter, [], { spot: person, area: { kind: 'general' } });
    // People check values (arithmetic on NFPA 77 (2000) Table A.3.1.5): 200 pF at 10 kV -> 2 uC, 10 mJ; so 2 kV -> 0.4 uC, 0.4 mJ (Q = C V, W = C V^2 / 2).
    expect(d.estimate!.chargeC!).toBeCloseTo(400e-9, 15);
    expect(d.estimate!.energyJ!).toBeCloseTo(0.4e-3, 12);
    expect(d.estimate!.warnings).toContainEqual(SV_AS_POTENTIAL_WARNING);
    expect(d.metrics.energyJ).toBeCloseTo(0.4e-3, 12);
    // perceptible from about 2 kV (TRBS 2131 section 6 / TRGS 727 Annex D)
    expect(d.hazards.find((v) => v.check === 'shock-voltage')?.level).toBe('warn');
  });
  it('a field reading gives no estimate and a note, never an exception', () => {
    const d = deriveReading(reading(), meter, [], { spot: person });
    expect(d.estimate).toBeNull();
    expect(d.estimateNote?.code).toBe('conductor-needs-potential');
  });
});

describe('bad set-up never throws', () => {
  it('a sphere of radius 0: estimate null with a note', () => {
    const d = deriveReading(reading(), meter, [], { spot: { model: 'sphere', geometry: { radiusM: 0 } } });
    expect(d.estimate).toBeNull();
    expect(d.estimateNote?.code).toBe('estimate-not-possible');
    expect(d.estimateNote?.message).toMatch(/radiusM/);
  });
  it('a line without its length: estimate null with a note naming the field', () => {
    const d = deriveReading(reading(), meter, [], { spot: { model: 'line', geometry: {} } });
    expect(d.estimate).toBeNull();
    expect(d.estimateNote?.message).toMatch(/geometry\.lengthM is required/);
  });
  it('an unknown substance: the verdicts fall back to the gas group, with a note', () => {
    const d = deriveReading(reading(), meter, [], { spot: roll, area: { ...zone1IIA, substanceId: 'unobtainium' } });
    expect(d.estimate).not.toBeNull();
    expect(d.estimateNote?.code).toBe('unknown-substance');
    expect(d.hazards.length).toBeGreaterThan(0);
  });
  it('estimateRequestFor leaves the meter accuracy out when it is not below 1', () => {
    const r = estimateRequestFor({ fieldVPerM: 1, distanceM: 0.1, potentialV: null, distanceUncertaintyM: null, groundBehindM: null, meterAccuracyRel: 1, geometryFactor: null, materialClass: null }, roll);
    expect('request' in r && r.request.meterAccuracyRel).toBe(undefined);
  });
});

describe('areas', () => {
  it('a dust zone judges spark energy against the fine-dust lower bound (conservative) unless the site gave its dust MIE', () => {
    const drum = { model: 'conductor' as const, geometry: { capacitanceF: 100e-12 }, materialClass: 'conductor' };
    // 100 pF at 5 kV: W = C V^2 / 2 = 1.25 mJ; fine dusts 1-50 mJ (Wikipedia "Static electricity", energies involved)
    const d = deriveReading(reading({ value: 5, unit: 'kV', polarity: '+' }), meter, [], { spot: drum, area: { kind: 'hazardous', zone: 21, gasGroup: null, substanceId: null, dustMieJ: null } });
    const spark = d.hazards.find((v) => v.check === 'spark-energy')!;
    expect(spark.compared?.threshold).toBeCloseTo(1e-3, 15);
    expect(spark.compared?.value).toBeCloseTo(1.25e-3, 12);
    expect(spark.level).toBe('alarm');
    const own = deriveReading(reading({ value: 5, unit: 'kV', polarity: '+' }), meter, [], { spot: drum, area: { kind: 'hazardous', zone: 21, gasGroup: null, substanceId: null, dustMieJ: 5e-3 } });
    const ownSpark = own.hazards.find((v) => v.check === 'spark-energy')!;
    expect(ownSpark.compared?.threshold).toBeCloseTo(5e-3, 15);
    expect(ownSpark.level).toBe('ok');
  });
  it('a named substance gives the minimum ignition charge check (BGR 132 Annex G Table 14)', () => {
    const d = deriveReading(reading({ value: 0.2 }), meter, [], { spot: roll, area: { ...zone1IIA, substanceId: 'propane' } });
    const q = d.hazards.find((v) => v.check === 'ignition-charge')!;
    expect(q.compared?.threshold).toBeCloseTo(70e-9, 20); // propane 70 nC (PTB data)
    expect(q.source).toMatch(/BGR 132/);
  });
});

describe('the Reading entity schema', () => {
  it('accepts a reading with its estimate, note and hazards, and one without them', () => {
    const d = deriveReading(reading(), meter, [], { spot: roll, area: zone1IIA });
    const base = {
      id: '01890a5d-ac96-774b-bcce-b302099a8057', roundId: '01890a5d-ac96-774b-bcce-b302099a8058', spotId: '01890a5d-ac96-774b-bcce-b302099a8059',
      meterId: '01890a5d-ac96-774b-bcce-b302099a805a', takenAt: at, value: 20, unit: 'kV/m', polarity: '-', distance: { value: 10, unit: 'cm' },
      zeroed: true, receivedAt: at, fieldVPerM: d.fieldVPerM, distanceM: d.distanceM, supersedesId: null, supersededById: null,
      correctionReason: null, deleted: null, flags: [], meterCalibrationOverdue: false, verdict: d.verdict,
    };
    expect(ReadingSchema.safeParse(base).success).toBe(true);
    const full = ReadingSchema.safeParse({ ...base, estimate: d.estimate, estimateNote: d.estimateNote, hazards: d.hazards });
    expect(full.success).toBe(true);
  });
});
