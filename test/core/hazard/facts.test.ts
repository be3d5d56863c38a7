/** The facts table, the substance picker and the templates against their published sources, named beside each check. */
import { describe, expect, it } from 'vitest';
import { CDM_CLASSES, FACTS, HBM_CLASSES, TRANSFER_CHARGE_LIMIT, gasGroupForMie, sensitivityClass } from '../../../core/hazard/facts';
import { SUBSTANCES, substanceById } from '../../../core/hazard/substances';
import { LIMIT_TEMPLATES, limitTemplate, personVoltageForEnergy } from '../../../core/hazard/templates';
import { LimitRuleSchema } from '../../../core/schemas/domain';

const REL = 1e-9;
const close = (a: number, b: number) => expect(Math.abs(a - b) / Math.abs(b)).toBeLessThan(REL);

describe('facts table', () => {
  it('every fact has a positive finite value, an SI unit and a source', () => {
    for (const [id, f] of Object.entries(FACTS)) {
      expect(Number.isFinite(f.value), id).toBe(true);
      expect(f.unit.length, id).toBeGreaterThan(0);
      expect(f.source.length, id).toBeGreaterThan(5);
      if ('high' in f) expect(f.high, id).toBeGreaterThan(f.value);
    }
  });

  it('ESD programme limits: ANSI/ESD S20.20-2021 (125 V/inch = 4921 V/m, 35 V, 100 V HBM), IEC 61340-5-1 5000 V/m from memory', () => {
    expect(FACTS.esdFieldLimit.value).toBeCloseTo(4921.26, 2);
    expect(FACTS.esdFieldLimit.source).toMatch(/S20\.20-2021 8\.3\.1/);
    expect(FACTS.esdFieldFar.value).toBeCloseTo(78740.16, 2); // 2000 V/inch
    expect(FACTS.isolatedConductorLimit.value).toBe(35);
    expect(FACTS.s2020ScopeHbm.value).toBe(100);
    expect(FACTS.iec61340FieldLimit.value).toBe(5000);
    expect(FACTS.iec61340FieldLimit.source).toMatch(/from memory/);
  });

  it('HBM / CDM classes (JS-001 / JS-002, from memory)', () => {
    expect(sensitivityClass(49, HBM_CLASSES)).toBe('0Z');
    expect(sensitivityClass(125, HBM_CLASSES)).toBe('0B');
    expect(sensitivityClass(1999, HBM_CLASSES)).toBe('1C');
    expect(sensitivityClass(8000, HBM_CLASSES)).toBe('3B');
    expect(sensitivityClass(124, CDM_CLASSES)).toBe('C0a');
    expect(sensitivityClass(750, CDM_CLASSES)).toBe('C2b');
    expect(sensitivityClass(1000, CDM_CLASSES)).toBe('C3');
  });

  it('gas-group MIE bands (BG RCI ExInfo FAQ 8.G.1 Table 1)', () => {
    expect(gasGroupForMie(0.25e-3)).toBe('IIA');
    expect(gasGroupForMie(0.2e-3)).toBe('IIA');
    expect(gasGroupForMie(0.07e-3)).toBe('IIB');
    expect(gasGroupForMie(0.02e-3)).toBe('IIC');
    expect(gasGroupForMie(0.016e-3)).toBe('IIC');
  });

  it('ignition thresholds: propagating brush 250 uC/m^2 (NFPA 77 (2000) 4.3.7), transfer limits 60/25/10/200 nC (from memory)', () => {
    close(FACTS.propagatingBrushSurfaceChargeDensity.value, 250e-6);
    expect(FACTS.propagatingBrushSurfaceChargeDensity.source).toBe('NFPA 77 (2000) 4.3.7');
    close(TRANSFER_CHARGE_LIMIT.IIA.value, 60e-9);
    close(TRANSFER_CHARGE_LIMIT.IIB.value, 25e-9);
    close(TRANSFER_CHARGE_LIMIT.IIC.value, 10e-9);
    close(TRANSFER_CHARGE_LIMIT.III.value, 200e-9);
    expect(TRANSFER_CHARGE_LIMIT.IIC.source).toMatch(/from memory/);
    close(FACTS.brushDischargeEnergy.value, 4e-3);
    close(FACTS.fineDustMie.value, 1e-3);
  });

  it('capacitances (NFPA 77 (2000) Table A.3.1.5; BG RCI ExInfo FAQ 7.15)', () => {
    close(FACTS.capacitancePersonDesign.value, 200e-12);
    close(FACTS.capacitanceDrum.value, 10e-12);
    close(FACTS.capacitanceDrum.high, 100e-12);
    close(FACTS.capacitanceAutomobile.value, 500e-12);
    close(FACTS.capacitanceTankCar.value, 1000e-12);
    close(FACTS.capacitanceDrumOnPallet.value, 70e-12);
    expect(FACTS.capacitanceSpherePerMetre.value).toBeCloseTo(111.265e-12, 15);
  });

  it('people (TRBS 2131 / TRGS 727 Annex D): 2 kV perceptible, 10 kV painful, 350 mJ / 50 uC hazard', () => {
    expect(FACTS.shockPerceptibleVoltage.value).toBe(2000);
    expect(FACTS.shockPainfulVoltage.value).toBe(10000);
    close(FACTS.personHazardEnergy.value, 0.35);
    close(FACTS.personHazardCharge.value, 50e-6);
    expect(FACTS.personHazardEnergy.source).toMatch(/TRBS 2131 \/ TRGS 727 Annex D/);
  });
});

describe('substances (NFPA 77 (2000) Table B.1; BGR 132 Annex G Table 14)', () => {
  it.each([
    ['propane', 0.25e-3, 70e-9, 'IIA'], ['hydrogen', 0.016e-3, 12e-9, 'IIC'], ['acetylene', 0.017e-3, null, 'IIC'],
    ['carbon-disulfide', 0.009e-3, null, 'IIC'], ['ethylene', 0.07e-3, 32e-9, 'IIB'], ['benzene', 0.2e-3, 45e-9, 'IIA'],
    ['cyclohexane', 0.22e-3, null, 'IIA'], ['methane', 0.28e-3, 70e-9, 'IIA'], ['butane', 0.25e-3, 60e-9, 'IIA'],
    ['acetone', 0.55e-3, 127e-9, 'IIA'], ['ethyl-acetate', 0.46e-3, 120e-9, 'IIA'], ['ammonia', 14e-3, null, 'IIA'],
  ] as const)('%s: MIE %s J, ignition charge %s C, group %s', (id, mie, q, group) => {
    const s = substanceById(id);
    expect(s).toBeDefined();
    close(s?.mieJ as number, mie);
    if (q === null) expect(s?.minIgnitionChargeC).toBeNull();
    else close(s?.minIgnitionChargeC as number, q);
    expect(s?.gasGroup).toBe(group);
  });

  it('keeps the NFPA value as an alternative where BGR 132 is lower (acetone 1.15 mJ, ammonia 680 mJ)', () => {
    close(substanceById('acetone')?.mieAlternatives[0]?.mieJ as number, 1.15e-3);
    close(substanceById('ammonia')?.mieAlternatives[0]?.mieJ as number, 680e-3);
  });

  it('every substance has sources and unique ids', () => {
    expect(new Set(SUBSTANCES.map((s) => s.id)).size).toBe(SUBSTANCES.length);
    for (const s of SUBSTANCES) {
      expect(s.mieSource.length).toBeGreaterThan(5);
      expect(s.minIgnitionChargeC === null).toBe(s.minIgnitionChargeSource === null);
    }
  });
});

describe('limit templates', () => {
  it('every rule of every template is a valid LimitRule (core/schemas/domain LimitRuleSchema) with a source', () => {
    expect(LIMIT_TEMPLATES.length).toBe(2 + 3 + 9);
    for (const t of LIMIT_TEMPLATES) {
      const metrics = t.rules.map((r) => r.metric);
      expect(new Set(metrics).size, t.id).toBe(metrics.length);
      for (const r of t.rules) {
        const parsed = LimitRuleSchema.safeParse(r);
        expect(parsed.error?.issues ?? [], `${t.id} ${r.metric}`).toEqual([]);
      }
    }
  });

  it('epa: field warn 50 V/inch, alarm 125 V/inch; isolated conductors 35 V', () => {
    const t = limitTemplate({ kind: 'epa' });
    const field = t.rules.find((r) => r.metric === 'fieldVPerM');
    expect(field?.alarm).toBe(FACTS.esdFieldLimit.value);
    expect(field?.warn).toBe(FACTS.cdm50FieldPractice.value);
    expect(t.rules.find((r) => r.metric === 'surfaceVoltageV')?.alarm).toBe(35);
  });

  it('hazardous zone 1 IIA: energy alarm at propane 0.25 mJ; person voltage alarm 1.58 kV (arithmetic: V = sqrt(2 W / C), 200 pF, NFPA 77 Table A.3.1.5)', () => {
    const t = limitTemplate({ kind: 'hazardous', zone: 1, gasGroup: 'IIA' });
    close(t.rules.find((r) => r.metric === 'energyJ')?.alarm as number, 0.25e-3);
    expect(t.rules.find((r) => r.metric === 'bodyVoltageV')?.alarm).toBeCloseTo(1581.1, 1);
    close(t.rules.find((r) => r.metric === 'chargeC')?.alarm as number, 60e-9);
    expect(personVoltageForEnergy(0.016e-3)).toBeCloseTo(400, 6);
  });

  it('hazardous IIC: energy alarm at hydrogen 0.016 mJ; zone 2 insulator rules are warn-only', () => {
    const t = limitTemplate({ kind: 'hazardous', zone: 2, gasGroup: 'IIC' });
    close(t.rules.find((r) => r.metric === 'energyJ')?.alarm as number, 0.016e-3);
    expect(t.rules.find((r) => r.metric === 'chargeC')?.alarm).toBeNull();
    close(t.rules.find((r) => r.metric === 'chargeC')?.warn as number, 10e-9);
  });

  it('dust: 1 mJ, 200 nC, propagating brush 250 uC/m^2; general: 2 kV / 10 kV and 350 mJ', () => {
    const d = limitTemplate({ kind: 'dust', zone: 21 });
    close(d.rules.find((r) => r.metric === 'energyJ')?.alarm as number, 1e-3);
    close(d.rules.find((r) => r.metric === 'surfaceChargeDensityCPerM2')?.alarm as number, 250e-6);
    const g = limitTemplate({ kind: 'general' });
    expect(g.rules.find((r) => r.metric === 'bodyVoltageV')).toMatchObject({ warn: 2000, alarm: 10000 });
    close(g.rules.find((r) => r.metric === 'energyJ')?.alarm as number, 0.35);
  });
});
