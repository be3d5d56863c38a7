/**
 * Hazard verdicts: an estimate (and the field at the meter) judged against the sourced
 * thresholds of facts.ts for the area it was taken in. Each verdict names the numbers
 * compared, the threshold's source and a caution saying what was assumed.
 *
 * Levels: 'alarm' when the central value reaches the threshold; 'warn' when only the
 * upper end of the estimate's interval reaches it (or the check itself is a warning
 * level); 'ok' below; 'not-applicable' when the check does not apply to the area or
 * object, or the estimate does not give the quantity (the reason says which).
 */
import type { QuantityName } from '../physics/types';
import { FACTS, TRANSFER_CHARGE_LIMIT, gasGroupForMie, type GasGroup } from './facts';
import { substanceById } from './substances';
import { representativeMie } from './templates';

/** Said with every verdict. */
export const CAUTION = "A screening check, not a safety assessment: it defers to the site's safety standards, local codes and qualified people. A field-meter reading alone cannot judge whether a discharge would ignite (BG RCI ExInfo FAQ 2.1); the numbers are equivalent charges for an idealised geometry.";

export type VerdictLevel = 'ok' | 'warn' | 'alarm' | 'not-applicable';

export interface HazardArea {
  kind: 'epa' | 'hazardous' | 'general';
  zone?: 0 | 1 | 2 | 20 | 21 | 22 | null;
  gasGroup?: GasGroup | null;
  dust?: boolean;
  substanceId?: string | null;
  /** An explicit MIE for the atmosphere, J (overrides substance and group). */
  mieJ?: number | null;
  /** The site's own minimum ignition energy of the dust, J (dust zones); else the fine-dust lower bound. */
  dustMieJ?: number | null;
}

export type ObjectKind = 'conductor' | 'insulator' | 'person' | 'unknown';

/** The parts of an EstimateResponse the verdicts read. */
export type EstimateLike = Partial<Record<QuantityName, number | null>> & {
  interval?: Partial<Record<QuantityName, readonly [number, number] | null>> | null;
};

export interface HazardInput {
  area: HazardArea;
  objectKind: ObjectKind;
  estimate?: EstimateLike | null;
  /** Field at the meter, V/m (signed). */
  fieldVPerM?: number | null;
}

export interface Verdict {
  check: string;
  level: VerdictLevel;
  compared: { quantity: string; value: number; unit: string; threshold: number } | null;
  reason: string;
  source: string;
  caution: string;
}

function si(v: number, unit: string): string {
  const a = Math.abs(v);
  const pre: [number, string][] = [[1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'u'], [1e-9, 'n'], [1e-12, 'p']];
  if (unit === 'V/m' || a === 0) return `${Number(v.toPrecision(3))} ${unit}`;
  for (const [f, p] of pre) if (a >= f) return `${Number((v / f).toPrecision(3))} ${p}${unit}`;
  return `${v.toExponential(2)} ${unit}`;
}

interface Atmosphere {
  mieJ: number;
  mieLabel: string;
  mieSource: string;
  group: GasGroup | 'III';
  groupLabel: string;
  gas: boolean;
  dust: boolean;
  assumption: string;
  minIgnitionChargeC: number | null;
  minIgnitionChargeSource: string | null;
  substanceName: string | null;
}

/** Resolves the atmosphere of an area: explicit MIE, else the substance, else the gas group's representative, else dust (1 mJ), else IIC assumed. */
export function resolveAtmosphere(area: HazardArea): Atmosphere {
  const dust = area.dust === true || area.zone === 20 || area.zone === 21 || area.zone === 22;
  const sub = area.substanceId ? substanceById(area.substanceId) : undefined;
  if (area.substanceId && sub === undefined) throw new RangeError(`unknown substance ${area.substanceId}`);
  let gas = sub !== undefined || area.gasGroup != null || area.mieJ != null;
  let mieJ: number, mieLabel: string, mieSource: string, assumption: string;
  let group: GasGroup | 'III';
  if (area.mieJ != null) {
    mieJ = area.mieJ; mieLabel = 'the MIE given for the area'; mieSource = "site's value"; assumption = `atmosphere MIE ${si(mieJ, 'J')} as given`;
    group = area.gasGroup ?? sub?.gasGroup ?? gasGroupForMie(mieJ);
  } else if (sub !== undefined) {
    mieJ = sub.mieJ; mieLabel = `${sub.name}'s MIE`; mieSource = sub.mieSource; assumption = `${sub.name} in its most easily ignited mixture`;
    group = area.gasGroup ?? sub.gasGroup;
  } else if (area.gasGroup != null) {
    const rep = representativeMie(area.gasGroup);
    mieJ = rep.mieJ; mieLabel = `the MIE of ${rep.substance} (representative of ${area.gasGroup})`; mieSource = rep.source; assumption = `a group ${area.gasGroup} gas represented by ${rep.substance}`;
    group = area.gasGroup;
  } else if (dust && area.dustMieJ != null && area.dustMieJ > 0) {
    mieJ = area.dustMieJ; mieLabel = 'the dust MIE given for the area'; mieSource = "site's value"; assumption = `a cloud of the site's dust (MIE ${si(mieJ, 'J')} as given), no gas`;
    group = 'III';
  } else if (dust) {
    mieJ = FACTS.fineDustMie.value; mieLabel = 'the lower bound for fine dust clouds'; mieSource = FACTS.fineDustMie.source; assumption = 'a fine dust cloud (MIE from 1 mJ), no gas';
    group = 'III';
  } else {
    const rep = representativeMie('IIC');
    mieJ = rep.mieJ; mieLabel = `the MIE of ${rep.substance} (IIC: no atmosphere given, the most sensitive assumed)`; mieSource = rep.source; assumption = 'no substance, gas group or dust given: the most sensitive group IIC assumed';
    group = 'IIC';
    gas = true;
  }
  if (dust && gas) {
    // Hybrid: the more sensitive atmosphere decides energy; transfer limit of the gas group.
    mieJ = Math.min(mieJ, area.dustMieJ != null && area.dustMieJ > 0 ? area.dustMieJ : FACTS.fineDustMie.value);
    assumption += ' with combustible dust present';
  }
  return {
    mieJ, mieLabel, mieSource, group, groupLabel: group === 'III' ? 'group III (dust)' : `group ${group}`, gas, dust, assumption,
    minIgnitionChargeC: sub?.minIgnitionChargeC ?? null, minIgnitionChargeSource: sub?.minIgnitionChargeSource ?? null,
    substanceName: sub?.name ?? null,
  };
}

/**
 * Hazard verdicts for one estimate in one area.
 *
 * Checks: epa: 'esd-field' (|E| vs 125 V/inch = 4921 V/m and 2000 V/inch, ANSI/ESD S20.20),
 * 'esd-isolated-conductor' (35 V), 'esd-body-voltage' (100 V HBM scope); hazardous:
 * 'spark-energy' (conductor or person W = Q^2/(2C) vs the atmosphere's MIE),
 * 'brush-discharge' (insulator sigma vs the brush onset), 'propagating-brush'
 * (250 uC/m^2, NFPA 77 (2000) 4.3.7), 'ignition-charge' (|Q| vs the substance's minimum
 * ignition charge, BGR 132 Annex G Table 14), 'transfer-charge' (|Q| vs 60/25/10/200 nC by
 * group, from memory); every area: 'shock-voltage' (2 kV perceptible, 10 kV painful) and
 * 'shock-hazard' (350 mJ or 50 uC; TRBS 2131 / TRGS 727 Annex D) for people and conductors.
 *
 * @param input area, objectKind, estimate quantities (SI, signed; intervals optional), fieldVPerM (V/m)
 * @returns the verdicts, in the order above
 * @example hazardVerdicts({ area: { kind: 'hazardous', zone: 1, gasGroup: 'IIA' }, objectKind: 'conductor',
 *   estimate: { energyJ: 2.5e-3, potentialV: 5000, chargeC: 1e-6 } }).find((v) => v.check === 'spark-energy')?.level // 'alarm'
 */
export function hazardVerdicts(input: HazardInput): Verdict[] {
  const { area, objectKind } = input;
  const est: EstimateLike = input.estimate ?? {};
  const q = (name: QuantityName): number | null => {
    const v = est[name];
    return v === undefined || v === null || !Number.isFinite(v) ? null : v;
  };
  const high = (name: QuantityName): number | null => {
    const iv = est.interval?.[name];
    return iv ? Math.max(Math.abs(iv[0]), Math.abs(iv[1])) : null;
  };
  const out: Verdict[] = [];
  const push = (check: string, level: VerdictLevel, compared: Verdict['compared'], reason: string, source: string, assumed: string) => {
    out.push({ check, level, compared, reason, source, caution: `${CAUTION} Assumed: ${assumed}.` });
  };
  const na = (check: string, reason: string, source: string, assumed = 'nothing beyond the inputs') => push(check, 'not-applicable', null, reason, source, assumed);
  /** alarm at/above threshold; warn if the interval's upper end reaches it; else ok. */
  const grade = (value: number, threshold: number, name: QuantityName | null): VerdictLevel => {
    if (Math.abs(value) >= threshold) return 'alarm';
    const h = name === null ? null : high(name);
    return h !== null && h >= threshold ? 'warn' : 'ok';
  };
  const isConductorLike = objectKind === 'conductor' || objectKind === 'person';
  const isInsulatorLike = objectKind === 'insulator' || objectKind === 'unknown';
  const V = q('potentialV');
  const W = q('energyJ');
  const Q = q('chargeC');
  const sigma = q('surfaceChargeDensityCPerM2');

  if (area.kind === 'epa') {
    const E = input.fieldVPerM ?? null;
    const lim = FACTS.esdFieldLimit.value;
    const far = FACTS.esdFieldFar.value;
    if (E === null || !Number.isFinite(E)) {
      na('esd-field', 'No field reading given.', FACTS.esdFieldLimit.source);
    } else {
      const a = Math.abs(E);
      if (a >= far) {
        push('esd-field', 'alarm', { quantity: 'fieldVPerM', value: a, unit: 'V/m', threshold: far },
          `The field ${si(a, 'V/m')} is above 2000 V/inch (${si(far, 'V/m')}): keep this item at least 30 cm (12 in) from ESDS items, or neutralise it.`,
          FACTS.esdFieldFar.source, 'the reading is the field where ESDS items are or could be handled');
      } else if (a >= lim) {
        push('esd-field', 'warn', { quantity: 'fieldVPerM', value: a, unit: 'V/m', threshold: lim },
          `The field ${si(a, 'V/m')} is at or above 125 V/inch (${si(lim, 'V/m')}; IEC 61340-5-1 uses ${si(FACTS.iec61340FieldLimit.value, 'V/m')}, from memory): a process-essential insulator must be kept at least 2.5 cm (1 in) from ESDS items (from memory, S20.20-2014 8.3), or neutralised.`,
          `${FACTS.esdFieldLimit.source}; ${FACTS.esdFieldNearDistance.source}`, 'the reading is the field at the position of ESDS items');
      } else {
        push('esd-field', 'ok', { quantity: 'fieldVPerM', value: a, unit: 'V/m', threshold: lim },
          `The field ${si(a, 'V/m')} is below 125 V/inch (${si(lim, 'V/m')}).`, FACTS.esdFieldLimit.source, 'the reading is the field at the position of ESDS items');
      }
    }
    if (objectKind !== 'conductor') na('esd-isolated-conductor', 'Not an isolated conductor.', FACTS.isolatedConductorLimit.source);
    else if (V === null) na('esd-isolated-conductor', "No potential: measure it by contact voltmeter or use the conductor model; a field meter's surface-voltage display equals the potential only for a large flat target.", FACTS.isolatedConductorLimit.source);
    else {
      const lvl = grade(V, FACTS.isolatedConductorLimit.value, 'potentialV');
      push('esd-isolated-conductor', lvl, { quantity: 'potentialV', value: Math.abs(V), unit: 'V', threshold: FACTS.isolatedConductorLimit.value },
        `The isolated conductor is at ${si(Math.abs(V), 'V')}; ANSI/ESD S20.20 keeps isolated conductors below 35 V${lvl === 'ok' ? '' : ': earth it'}.`,
        FACTS.isolatedConductorLimit.source, 'the conductor can touch ESDS items');
    }
    if (objectKind !== 'person') na('esd-body-voltage', 'Not a person.', FACTS.s2020ScopeHbm.source);
    else if (V === null) na('esd-body-voltage', 'No body voltage given.', FACTS.s2020ScopeHbm.source);
    else {
      const lvl = grade(V, FACTS.s2020ScopeHbm.value, 'potentialV');
      push('esd-body-voltage', lvl, { quantity: 'bodyVoltageV', value: Math.abs(V), unit: 'V', threshold: FACTS.s2020ScopeHbm.value },
        `The body voltage ${si(Math.abs(V), 'V')} is ${lvl === 'ok' ? 'below' : 'at or above'} the 100 V HBM withstand that an S20.20 programme protects.`,
        FACTS.s2020ScopeHbm.source, 'parts of 100 V HBM or more are handled');
    }
  }

  if (area.kind === 'hazardous') {
    const atm = resolveAtmosphere(area);
    // Spark energy of a conductor or person.
    if (!isConductorLike && objectKind !== 'unknown') {
      na('spark-energy', 'An insulator has no single potential: its discharges are brush discharges (see the brush checks).', atm.mieSource, atm.assumption);
    } else if (W === null) {
      na('spark-energy', 'No stored energy: it needs a capacitance (conductor, sphere, disk or line model, or a measured capacitance).', atm.mieSource, atm.assumption);
    } else {
      const lvl = grade(W, atm.mieJ, 'energyJ');
      push('spark-energy', lvl, { quantity: 'energyJ', value: Math.abs(W), unit: 'J', threshold: atm.mieJ },
        `A spark could release up to ${si(Math.abs(W), 'J')}${V !== null ? ` (at ${si(Math.abs(V), 'V')})` : ''}; ${atm.mieLabel} is ${si(atm.mieJ, 'J')}. ${lvl === 'alarm' ? 'The spark could ignite the atmosphere: earth the object.' : lvl === 'warn' ? "The upper end of the estimate's interval reaches the MIE." : 'Below the MIE.'} Conductive parts above 10 pF must be earthed (${FACTS.earthingCapacitanceThreshold.source}).`,
        atm.mieSource, `${atm.assumption}; the whole stored energy goes into one spark`);
    }
    // Brush discharges from insulators.
    const onset = FACTS.brushDischargeOnsetSurfaceChargeDensity.value;
    if (!isInsulatorLike) {
      na('brush-discharge', 'Not an insulating surface.', FACTS.brushDischargeOnsetSurfaceChargeDensity.source, atm.assumption);
      na('propagating-brush', 'Not an insulating surface.', FACTS.propagatingBrushSurfaceChargeDensity.source, atm.assumption);
    } else if (sigma === null) {
      na('brush-discharge', 'No surface charge density: use a sheet, disk, rectangle, layer or line model.', FACTS.brushDischargeOnsetSurfaceChargeDensity.source, atm.assumption);
      na('propagating-brush', 'No surface charge density: use a sheet, disk, rectangle, layer or line model.', FACTS.propagatingBrushSurfaceChargeDensity.source, atm.assumption);
    } else {
      const s = Math.abs(sigma);
      const brushIgnites = atm.gas && atm.mieJ <= FACTS.brushDischargeEnergy.value;
      let lvl = grade(s, onset, 'surfaceChargeDensityCPerM2');
      if (lvl === 'alarm' && !brushIgnites) lvl = 'warn';
      const what = brushIgnites
        ? `brush discharges (equivalent energy up to about 4 mJ; 5-10 mJ in the positive-electrode case, AIChE CCPS) can ignite ${atm.mieLabel.replace(/^the /, '')} at ${si(atm.mieJ, 'J')}`
        : atm.gas ? `brush discharges (up to about 4 mJ) are unlikely to ignite an atmosphere of MIE ${si(atm.mieJ, 'J')}, but the positive-electrode case may reach 5-10 mJ (AIChE CCPS)`
          : 'brush discharges do not ignite dust clouds (CLC/TR 50404), but would ignite solvent vapour if any is present';
      push('brush-discharge', lvl, { quantity: 'surfaceChargeDensityCPerM2', value: s, unit: 'C/m^2', threshold: onset },
        `Surface charge density ${si(s, 'C/m^2')} against a brush-discharge onset of about ${si(onset, 'C/m^2')} (from memory): ${s >= onset ? what : 'below the onset'}.`,
        `${FACTS.brushDischargeOnsetSurfaceChargeDensity.source}; ${FACTS.brushDischargeEnergy.source}`, `${atm.assumption}; a grounded object (e.g. a finger or tool) can approach the surface`);
      const pb = FACTS.propagatingBrushSurfaceChargeDensity.value;
      const pLvl = grade(s, pb, 'surfaceChargeDensityCPerM2');
      push('propagating-brush', pLvl, { quantity: 'surfaceChargeDensityCPerM2', value: s, unit: 'C/m^2', threshold: pb },
        `Surface charge density ${si(s, 'C/m^2')} against the propagating-brush threshold ${si(pb, 'C/m^2')}. A propagating brush discharge (possibly over 1 J, ignites gases, vapours and dusts) is only possible with a thin insulating layer (under 8 mm) on a conductor; a free surface in air cannot hold more than about 26.5 uC/m^2${s > FACTS.maxSurfaceChargeDensity.value ? ', so this value means a layer on a conductor, or a wrong model or distance' : ''}.`,
        FACTS.propagatingBrushSurfaceChargeDensity.source, `${atm.assumption}; the layer-on-ground model if a backing is present`);
    }
    // Minimum ignition charge of a named substance.
    if (atm.minIgnitionChargeC === null || atm.minIgnitionChargeSource === null) {
      na('ignition-charge', atm.substanceName === null ? 'No substance named: the minimum ignition charge is tabled per substance.' : `No minimum ignition charge tabled for ${atm.substanceName}.`, 'BGR 132 Annex G Table 14', atm.assumption);
    } else if (Q === null) {
      na('ignition-charge', 'No charge in the estimate.', atm.minIgnitionChargeSource, atm.assumption);
    } else {
      const lvl = grade(Q, atm.minIgnitionChargeC, 'chargeC');
      push('ignition-charge', lvl, { quantity: 'chargeC', value: Math.abs(Q), unit: 'C', threshold: atm.minIgnitionChargeC },
        `Estimated charge ${si(Math.abs(Q), 'C')} against ${atm.substanceName}'s minimum ignition charge ${si(atm.minIgnitionChargeC, 'C')}${lvl === 'ok' ? '' : ': a discharge transferring this much could ignite it'}.`,
        atm.minIgnitionChargeSource, `${atm.assumption}; the whole estimated charge could be transferred in one discharge (an upper bound)`);
    }
    // Transfer-charge limits by group (insulating parts).
    const tl = TRANSFER_CHARGE_LIMIT[atm.group];
    if (!isInsulatorLike) {
      na('transfer-charge', 'The transferred-charge limits are for insulating parts.', tl.source, atm.assumption);
    } else if (Q === null) {
      na('transfer-charge', 'No charge in the estimate.', tl.source, atm.assumption);
    } else {
      // The limit bounds the charge passed in ONE discharge; the estimate is the whole
      // charge on the object, of which a brush discharge takes only a part. So reaching
      // the limit is a reason to look closer (warn), never an alarm on its own.
      const graded = grade(Q, tl.value, 'chargeC');
      const lvl: VerdictLevel = graded === 'alarm' ? 'warn' : graded;
      push('transfer-charge', lvl, { quantity: 'chargeC', value: Math.abs(Q), unit: 'C', threshold: tl.value },
        `Estimated charge ${si(Math.abs(Q), 'C')} against the transferred-charge limit ${si(tl.value, 'C')} for ${atm.groupLabel} (from memory). A single discharge from an insulator transfers only part of its charge, so this is a pessimistic screening: ${lvl === 'warn' ? 'worth a closer look (brush-discharge and ignition-charge checks), not an alarm by itself' : 'below the limit even if all of it transferred'}.`,
        tl.source, `${atm.assumption}; the whole charge transfers`);
    }
  }

  // Shocks to people: a charged person, or a person touching a charged conductor.
  if (!isConductorLike) {
    na('shock-voltage', 'Shocks come from charged people and conductors.', FACTS.shockPerceptibleVoltage.source);
    na('shock-hazard', 'Shocks come from charged people and conductors.', FACTS.personHazardEnergy.source);
  } else {
    if (V === null) na('shock-voltage', 'No potential in the estimate.', FACTS.shockPerceptibleVoltage.source);
    else {
      const a = Math.abs(V);
      const lvl: VerdictLevel = a >= FACTS.shockPainfulVoltage.value ? 'alarm' : a >= FACTS.shockPerceptibleVoltage.value ? 'warn' : 'ok';
      push('shock-voltage', lvl, { quantity: objectKind === 'person' ? 'bodyVoltageV' : 'potentialV', value: a, unit: 'V', threshold: lvl === 'alarm' ? FACTS.shockPainfulVoltage.value : FACTS.shockPerceptibleVoltage.value },
        `${objectKind === 'person' ? 'Body voltage' : 'Potential'} ${si(a, 'V')}: shocks are perceptible from about 2 kV and painful from about 10 kV${lvl === 'alarm' ? ' (painful: a startle can cause a fall or a dropped load)' : lvl === 'warn' ? ' (perceptible)' : ''}.`,
        FACTS.shockPerceptibleVoltage.source, 'a person discharges through a small contact area');
    }
    if (W === null && Q === null) na('shock-hazard', 'No energy or charge in the estimate.', FACTS.personHazardEnergy.source);
    else {
      const overW = W !== null && Math.abs(W) > FACTS.personHazardEnergy.value;
      const overQ = Q !== null && Math.abs(Q) > FACTS.personHazardCharge.value;
      const useW = W !== null && (overW || !overQ);
      push('shock-hazard', overW || overQ ? 'alarm' : 'ok',
        useW ? { quantity: 'energyJ', value: Math.abs(W as number), unit: 'J', threshold: FACTS.personHazardEnergy.value }
          : { quantity: 'chargeC', value: Math.abs(Q as number), unit: 'C', threshold: FACTS.personHazardCharge.value },
        `${W !== null ? `Energy ${si(Math.abs(W), 'J')}` : ''}${W !== null && Q !== null ? ', ' : ''}${Q !== null ? `charge ${si(Math.abs(Q), 'C')}` : ''}: a shock is a hazard to people above 350 mJ or 50 uC${overW || overQ ? ' - this is above' : ''}.`,
        FACTS.personHazardEnergy.source, 'the whole energy and charge pass through the person');
    }
  }
  return out;
}
