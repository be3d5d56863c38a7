/** Scenario tables for hazardVerdicts, thresholds with their published sources. */
import { describe, expect, it } from 'vitest';
import { CAUTION, hazardVerdicts, resolveAtmosphere, type HazardInput, type Verdict } from '../../../core/hazard/verdicts';
import { estimate } from '../../../core/physics/estimate';

const find = (vs: Verdict[], check: string) => {
  const v = vs.find((x) => x.check === check);
  if (v === undefined) throw new Error(`no verdict ${check}`);
  return v;
};

describe('conductor spark energy against the MIE', () => {
  it('200 pF drum at 5 kV in a IIA zone 1 area: 2.5 mJ > 0.25 mJ propane MIE -> alarm (NFPA 77 (2000) Table B.1)', () => {
    const est = estimate({ model: 'conductor', potentialV: 5000, geometry: { capacitanceF: 200e-12 } });
    const vs = hazardVerdicts({ area: { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }, objectKind: 'conductor', estimate: est });
    const v = find(vs, 'spark-energy');
    expect(v.level).toBe('alarm');
    expect(v.compared).toEqual({ quantity: 'energyJ', value: expect.closeTo(2.5e-3, 12), unit: 'J', threshold: 0.25e-3 });
    expect(v.source).toMatch(/NFPA 77 \(2000\) Table B\.1/);
    expect(v.reason).toMatch(/2\.5 mJ/);
    expect(v.caution.startsWith(CAUTION)).toBe(true);
    expect(v.caution).toMatch(/Assumed: a group IIA gas represented by Propane/);
  });

  it.each([
    // [potential V, capacitance F, area, expected level]  check values: arithmetic on the cited capacitances and MIEs
    [1500, 200e-12, { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }, 'ok'], // 0.225 mJ < 0.25 mJ
    [1600, 200e-12, { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }, 'alarm'], // above 1.58 kV
    [7000, 10e-12, { kind: 'hazardous', zone: 1, substanceId: 'propane' }, 'ok'], // below 7.07 kV on 10 pF
    [7100, 10e-12, { kind: 'hazardous', zone: 1, substanceId: 'propane' }, 'alarm'],
    [560, 100e-12, { kind: 'hazardous', zone: 0, substanceId: 'hydrogen' }, 'ok'], // below 566 V on 100 pF
    [570, 100e-12, { kind: 'hazardous', zone: 0, substanceId: 'hydrogen' }, 'alarm'],
    [4000, 100e-12, { kind: 'hazardous', zone: 21, dust: true }, 'ok'], // 0.8 mJ < 1 mJ fine dust
    [5000, 100e-12, { kind: 'hazardous', zone: 21 }, 'alarm'], // 1.25 mJ
  ] as const)('%s V on %s F in %j -> %s', (V, C, area, level) => {
    const vs = hazardVerdicts({ area: area as HazardInput['area'], objectKind: 'conductor', estimate: { potentialV: V, capacitanceF: C, energyJ: (C * V * V) / 2, chargeC: C * V } });
    expect(find(vs, 'spark-energy').level).toBe(level);
  });

  it('warns when only the upper end of the interval reaches the MIE', () => {
    const est = estimate({ model: 'conductor', potentialV: 1500, geometry: { capacitanceF: 200e-12 }, meterAccuracyRel: 0.05 });
    expect(find(hazardVerdicts({ area: { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }, objectKind: 'conductor', estimate: est }), 'spark-energy').level).toBe('warn');
  });

  it('no atmosphere given: the most sensitive group IIC is assumed and said', () => {
    const atm = resolveAtmosphere({ kind: 'hazardous' });
    expect(atm.mieJ).toBeCloseTo(0.016e-3, 12);
    expect(atm.assumption).toMatch(/IIC assumed/);
  });
});

describe('EPA (ANSI/ESD S20.20)', () => {
  it.each([
    [3000, 'ok'], [-3000, 'ok'], [4921, 'ok'], [4922, 'warn'], [6000, 'warn'], [8e4, 'alarm'],
  ] as const)('field %s V/m -> %s (125 V/inch = 4921 V/m; 2000 V/inch = 78.7 kV/m)', (E, level) => {
    const v = find(hazardVerdicts({ area: { kind: 'epa' }, objectKind: 'insulator', fieldVPerM: E }), 'esd-field');
    expect(v.level).toBe(level);
    expect(v.compared?.value).toBe(Math.abs(E));
  });

  it('isolated conductor at 50 V -> alarm, 20 V -> ok (35 V, ANSI/ESD S20.20-2021 scope)', () => {
    const at = (V: number) => find(hazardVerdicts({ area: { kind: 'epa' }, objectKind: 'conductor', estimate: { potentialV: V } }), 'esd-isolated-conductor');
    expect(at(50).level).toBe('alarm');
    expect(at(-20).level).toBe('ok');
    expect(at(50).source).toMatch(/S20\.20-2021/);
  });

  it('a person at 150 V in an EPA -> alarm against the 100 V HBM scope', () => {
    expect(find(hazardVerdicts({ area: { kind: 'epa' }, objectKind: 'person', estimate: { potentialV: 150 } }), 'esd-body-voltage').level).toBe('alarm');
  });

  it('missing field -> not-applicable with a reason', () => {
    const v = find(hazardVerdicts({ area: { kind: 'epa' }, objectKind: 'insulator' }), 'esd-field');
    expect(v.level).toBe('not-applicable');
    expect(v.compared).toBeNull();
  });
});

describe('insulating surfaces', () => {
  const sheet = (sigma: number, area: HazardInput['area'], chargeC: number | null = null) =>
    hazardVerdicts({ area, objectKind: 'insulator', estimate: { surfaceChargeDensityCPerM2: sigma, chargeC } });

  it('15 uC/m^2 in IIA zone 1 -> brush alarm; in a dust zone -> warn (brushes do not ignite dust clouds, CLC/TR 50404)', () => {
    expect(find(sheet(15e-6, { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }), 'brush-discharge').level).toBe('alarm');
    const dust = find(sheet(15e-6, { kind: 'hazardous', zone: 21 }), 'brush-discharge');
    expect(dust.level).toBe('warn');
    expect(dust.reason).toMatch(/do not ignite dust clouds/);
    expect(find(sheet(2e-6, { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }), 'brush-discharge').level).toBe('ok');
  });

  it('ammonia (MIE 14 mJ, above the ~4 mJ brush energy): a brush is a warning, not an alarm', () => {
    expect(find(sheet(15e-6, { kind: 'hazardous', zone: 1, substanceId: 'ammonia' }), 'brush-discharge').level).toBe('warn');
  });

  it('300 uC/m^2 (layer on a conductor) -> propagating-brush alarm, saying it needs a thin layer on a conductor (NFPA 77 (2000) 4.3.7)', () => {
    const v = find(sheet(-300e-6, { kind: 'hazardous', zone: 21 }), 'propagating-brush');
    expect(v.level).toBe('alarm');
    expect(v.source).toBe('NFPA 77 (2000) 4.3.7');
    expect(v.reason).toMatch(/thin insulating layer/);
    expect(find(sheet(20e-6, { kind: 'hazardous', zone: 21 }), 'propagating-brush').level).toBe('ok');
  });

  it('hydrogen area, 20 nC on an insulator: above the 12 nC minimum ignition charge (BGR 132 Annex G Table 14) and the 10 nC IIC transfer limit', () => {
    const vs = sheet(5e-6, { kind: 'hazardous', zone: 1, substanceId: 'hydrogen' }, 20e-9);
    expect(find(vs, 'ignition-charge').level).toBe('alarm');
    expect(find(vs, 'ignition-charge').source).toMatch(/BGR 132 Annex G Table 14/);
    const t = find(vs, 'transfer-charge');
    expect(t.level).toBe('warn'); // total vs per-discharge limit: a screening warn, never an alarm by itself
    expect(t.compared?.threshold).toBeCloseTo(10e-9, 18);
    expect(t.source).toMatch(/from memory/);
  });

  it('propane area, 50 nC: below 70 nC ignition charge and 60 nC IIA transfer limit -> ok', () => {
    const vs = sheet(5e-6, { kind: 'hazardous', zone: 1, substanceId: 'propane' }, 50e-9);
    expect(find(vs, 'ignition-charge').level).toBe('ok');
    expect(find(vs, 'transfer-charge').level).toBe('ok');
  });

  it('an insulator has no spark-energy verdict', () => {
    expect(find(sheet(5e-6, { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }), 'spark-energy').level).toBe('not-applicable');
  });
});

describe('shocks to people (TRBS 2131 / TRGS 727 Annex D)', () => {
  const person = (V: number, C = 200e-12) => hazardVerdicts({ area: { kind: 'general' }, objectKind: 'person', estimate: { potentialV: V, chargeC: C * V, energyJ: (C * V * V) / 2 } });
  it.each([[1000, 'ok'], [3000, 'warn'], [10000, 'alarm']] as const)('person at %s V -> shock-voltage %s', (V, level) => {
    expect(find(person(V), 'shock-voltage').level).toBe(level);
  });
  it('200 pF at 10 kV: 10 mJ and 2 uC, below 350 mJ / 50 uC -> shock-hazard ok; 300 pF at 50 kV (375 mJ) -> alarm', () => {
    expect(find(person(10000), 'shock-hazard').level).toBe('ok');
    expect(find(person(50000, 300e-12), 'shock-hazard').level).toBe('alarm');
  });
  it('every verdict carries a source and the caution', () => {
    for (const v of person(3000)) {
      expect(v.source.length).toBeGreaterThan(3);
      expect(v.caution).toContain('BG RCI ExInfo FAQ 2.1');
      expect(v.caution).toContain("site's safety standards");
    }
  });
});

describe('dust zones with the site\'s own dust MIE', () => {
  // W = C V^2 / 2 = 100 pF x (5 kV)^2 / 2 = 1.25 mJ (arithmetic); the fine-dust lower bound is
  // 1 mJ (Wikipedia "Static electricity", energies involved), the site's dust here 30 mJ.
  const estimate = { energyJ: 1.25e-3, potentialV: 5000, capacitanceF: 100e-12, chargeC: 5e-7, interval: null };
  it('uses the fine-dust lower bound when the site gave none', () => {
    const v = hazardVerdicts({ area: { kind: 'hazardous', zone: 22 }, objectKind: 'conductor', estimate });
    expect(v.find((x) => x.check === 'spark-energy')?.level).toBe('alarm');
  });
  it('uses the site\'s dust MIE when given', () => {
    const v = hazardVerdicts({ area: { kind: 'hazardous', zone: 22, dustMieJ: 30e-3 }, objectKind: 'conductor', estimate });
    const spark = v.find((x) => x.check === 'spark-energy');
    expect(spark?.level).toBe('ok');
    expect(spark?.compared?.threshold).toBe(30e-3);
  });
});
