/**
 * Starter limit-set templates, built ONLY from the sourced values in facts.ts (and the
 * substance table), per area kind: 'epa' (electronics ESD protected area),
 * 'hazardous' (gas/vapour zone 0, 1 or 2 and group IIA, IIB or IIC), 'dust' (zone 20,
 * 21 or 22) and 'general'. Every rule carries its source; sites edit them.
 * Levels are SI magnitudes; a value at a level counts as reaching it.
 */
import type { LimitRule } from '../limits/evaluate';
import { FACTS, GAS_GROUP_REPRESENTATIVE, TRANSFER_CHARGE_LIMIT, type GasGroup } from './facts';
import { substanceById } from './substances';

export type TemplateKind = 'epa' | 'hazardous' | 'dust' | 'general';
export type GasZone = 0 | 1 | 2;
export type DustZone = 20 | 21 | 22;

export interface LimitTemplate {
  id: string;
  kind: TemplateKind;
  name: string;
  description: string;
  zone: GasZone | DustZone | null;
  gasGroup: GasGroup | null;
  rules: LimitRule[];
}

/** Representative MIE of a gas group, J, with its source (the group's representative substance). */
export function representativeMie(group: GasGroup): { mieJ: number; source: string; substance: string } {
  const id = GAS_GROUP_REPRESENTATIVE[group];
  const s = substanceById(id);
  if (s === undefined) throw new Error(`substance ${id} missing from the table`);
  return { mieJ: s.mieJ, source: `${s.name}, representative of ${group} (BG RCI ExInfo FAQ 8.G.1 Table 1): MIE ${s.mieSource}`, substance: s.name };
}

/**
 * Body voltage at which a person's spark reaches an energy: V = sqrt(2 W / C), C = 200 pF
 * design value (NFPA 77 (2000) Table A.3.1.5).
 * @example personVoltageForEnergy(0.25e-3) // 1581.1 V (propane)
 */
export function personVoltageForEnergy(energyJ: number): number {
  return Math.sqrt((2 * energyJ) / FACTS.capacitancePersonDesign.value);
}

function epa(): LimitTemplate {
  return {
    id: 'epa', kind: 'epa', zone: null, gasGroup: null,
    name: 'ESD protected area (ANSI/ESD S20.20)',
    description: 'Field near ESDS items, isolated conductors and people, for parts withstanding 100 V HBM or more.',
    rules: [
      { metric: 'fieldVPerM', warn: FACTS.cdm50FieldPractice.value, alarm: FACTS.esdFieldLimit.value, source: `alarm: 125 V/inch, ${FACTS.esdFieldLimit.source}; warn: 50 V/inch, ${FACTS.cdm50FieldPractice.source}` },
      { metric: 'surfaceVoltageV', warn: null, alarm: FACTS.isolatedConductorLimit.value, source: `isolated conductors below 35 V, ${FACTS.isolatedConductorLimit.source}`, appliesTo: ['conductor'] },
      { metric: 'bodyVoltageV', warn: null, alarm: FACTS.s2020ScopeHbm.value, source: `100 V HBM programme scope, ${FACTS.s2020ScopeHbm.source}` },
    ],
  };
}

function hazardous(zone: GasZone, group: GasGroup): LimitTemplate {
  const rep = representativeMie(group);
  const bandLow = group === 'IIA'
    ? { v: FACTS.gasGroupIIAMinMie.value, src: `IIA band lower bound 0.20 mJ, ${FACTS.gasGroupIIAMinMie.source}` }
    : group === 'IIB'
      ? { v: FACTS.gasGroupIIBMie.value, src: `IIB band lower bound 0.02 mJ, ${FACTS.gasGroupIIBMie.source}` }
      : (() => { const cs2 = substanceById('carbon-disulfide'); return { v: cs2?.mieJ ?? FACTS.gasGroupIICMaxMie.value, src: `carbon disulfide MIE 0.009 mJ, ${cs2?.mieSource ?? ''}` }; })();
  const transfer = TRANSFER_CHARGE_LIMIT[group];
  const vAlarm = personVoltageForEnergy(rep.mieJ);
  const vWarn = FACTS.personSparkVoltage.value < vAlarm ? FACTS.personSparkVoltage.value : null;
  const insulatorLevels = zone === 2
    ? { note: 'zone 2: warn only (chargeable-area limits normally none in zone 2, from memory, IEC TS 60079-32-1)' }
    : { note: '' };
  return {
    id: `hazardous-zone${zone}-${group}`, kind: 'hazardous', zone, gasGroup: group,
    name: `Hazardous area zone ${zone}, gas group ${group}`,
    description: `Flammable gas or vapour, group ${group} (${rep.substance} MIE ${rep.mieJ * 1e3} mJ). Conductors must be earthed; insulators judged by surface charge density and transferred charge. ${insulatorLevels.note}`.trim(),
    rules: [
      { metric: 'energyJ', warn: bandLow.v, alarm: rep.mieJ, source: `alarm: ${rep.source}; warn: ${bandLow.src}` },
      zone === 2
        ? { metric: 'chargeC', warn: transfer.value, alarm: null, source: `transferred-charge limit ${group} ${transfer.value * 1e9} nC, ${transfer.source}; ${insulatorLevels.note}`, appliesTo: ['insulator'] }
        : { metric: 'chargeC', warn: null, alarm: transfer.value, source: `transferred-charge limit ${group} ${transfer.value * 1e9} nC, ${transfer.source}`, appliesTo: ['insulator'] },
      zone === 2
        ? { metric: 'surfaceChargeDensityCPerM2', warn: FACTS.brushDischargeOnsetSurfaceChargeDensity.value, alarm: null, source: `brush-discharge onset, ${FACTS.brushDischargeOnsetSurfaceChargeDensity.source}; ${insulatorLevels.note}` }
        : { metric: 'surfaceChargeDensityCPerM2', warn: null, alarm: FACTS.brushDischargeOnsetSurfaceChargeDensity.value, source: `brush-discharge onset, ${FACTS.brushDischargeOnsetSurfaceChargeDensity.source}; brush discharges (up to about 4 mJ) ignite most gases and vapours, ${FACTS.brushDischargeEnergy.source}` },
      { metric: 'bodyVoltageV', warn: vWarn, alarm: vAlarm, source: `alarm: arithmetic V = sqrt(2 MIE / C) with C = 200 pF (${FACTS.capacitancePersonDesign.source}) and ${rep.substance}'s MIE${vWarn === null ? '' : `; warn: sparks from a person from about 1 kV, ${FACTS.personSparkVoltage.source}`}` },
    ],
  };
}

function dust(zone: DustZone): LimitTemplate {
  const mie = FACTS.fineDustMie.value;
  const vAlarm = personVoltageForEnergy(mie);
  return {
    id: `dust-zone${zone}`, kind: 'dust', zone, gasGroup: null,
    name: `Combustible dust, zone ${zone}`,
    description: 'Dust clouds: fine dusts from about 1 mJ. Brush discharges do not ignite dust clouds; propagating brush discharges do.',
    rules: [
      { metric: 'energyJ', warn: null, alarm: mie, source: `fine dusts 1-50 mJ (lower bound), ${FACTS.fineDustMie.source}` },
      { metric: 'chargeC', warn: null, alarm: FACTS.transferChargeIII.value, source: `transferred-charge limit group III 200 nC, ${FACTS.transferChargeIII.source}`, appliesTo: ['insulator'] },
      { metric: 'surfaceChargeDensityCPerM2', warn: FACTS.brushDischargeOnsetSurfaceChargeDensity.value, alarm: FACTS.propagatingBrushSurfaceChargeDensity.value, source: `warn: brush-discharge onset, ${FACTS.brushDischargeOnsetSurfaceChargeDensity.source}; alarm: propagating brush 250 uC/m^2 (thin layer on a conductor), ${FACTS.propagatingBrushSurfaceChargeDensity.source}` },
      { metric: 'bodyVoltageV', warn: FACTS.personSparkVoltage.value, alarm: vAlarm, source: `alarm: arithmetic V = sqrt(2 x 1 mJ / 200 pF) (${FACTS.capacitancePersonDesign.source}; ${FACTS.fineDustMie.source}); warn: sparks from a person from about 1 kV, ${FACTS.personSparkVoltage.source}` },
    ],
  };
}

function general(): LimitTemplate {
  return {
    id: 'general', kind: 'general', zone: null, gasGroup: null,
    name: 'General workplace (shocks to people)',
    description: 'No flammable atmosphere and no ESDS items: nuisance and hazardous shocks to people.',
    rules: [
      { metric: 'bodyVoltageV', warn: FACTS.shockPerceptibleVoltage.value, alarm: FACTS.shockPainfulVoltage.value, source: `perceptible from about 2 kV, painful from about 10 kV: ${FACTS.shockPerceptibleVoltage.source}` },
      { metric: 'energyJ', warn: FACTS.shockPerceptibleEnergy.value, alarm: FACTS.personHazardEnergy.value, source: `warn: perceptible 0.5 mJ, ${FACTS.shockPerceptibleEnergy.source}; alarm: hazard above 350 mJ, ${FACTS.personHazardEnergy.source}` },
      { metric: 'chargeC', warn: null, alarm: FACTS.personHazardCharge.value, source: `hazard above 50 uC transferred, ${FACTS.personHazardCharge.source}` },
    ],
  };
}

/**
 * One starter template.
 * @param opts kind, and for 'hazardous' zone (0|1|2) and gasGroup, for 'dust' zone (20|21|22)
 * @returns the template with its rules (LimitRule: metric, warn, alarm, source)
 * @example limitTemplate({ kind: 'hazardous', zone: 1, gasGroup: 'IIA' }).rules[0] // energyJ warn 2e-4, alarm 2.5e-4
 */
export function limitTemplate(opts: { kind: 'epa' } | { kind: 'general' } | { kind: 'hazardous'; zone: GasZone; gasGroup: GasGroup } | { kind: 'dust'; zone: DustZone }): LimitTemplate {
  switch (opts.kind) {
    case 'epa': return epa();
    case 'general': return general();
    case 'hazardous': return hazardous(opts.zone, opts.gasGroup);
    case 'dust': return dust(opts.zone);
  }
}

/** Every starter template: epa, general, dust zones 20-22, hazardous zones 0-2 x IIA/IIB/IIC. */
export const LIMIT_TEMPLATES: readonly LimitTemplate[] = [
  epa(),
  general(),
  ...([20, 21, 22] as const).map((z) => dust(z)),
  ...([0, 1, 2] as const).flatMap((z) => (['IIA', 'IIB', 'IIC'] as const).map((g) => hazardous(z, g))),
];
