/**
 * The facts of the trade as typed records: every value in SI with its unit
 * and its source exactly as named there ('common practice' or 'from memory' where no
 * published copy was seen). Limit templates and verdicts take their numbers from here
 * only, so a test can hold each number against its published source.
 */
import { EPSILON_0, INCH_M } from '../physics/constants';

/** One sourced value. `high` is the top of a range when the fact is a range (value is then the low end). */
export interface Fact {
  value: number;
  high?: number;
  /** SI unit of value and high. */
  unit: string;
  /** Standard and clause, textbook, 'common practice' or 'from memory'. */
  source: string;
  note?: string;
}

const V_PER_INCH = 1 / INCH_M;
const mJ = 1e-3;
const nC = 1e-9;
const pF = 1e-12;

export const FACTS = {
  // ---- constants ----
  vacuumPermittivity: { value: EPSILON_0, unit: 'F/m', source: 'CODATA 2022 (NIST)' },
  airBreakdownField: { value: 3e6, unit: 'V/m', source: 'standard physics; Wikipedia "Brush discharge"' },
  maxSurfaceChargeDensity: { value: 26.5e-6, unit: 'C/m^2', source: 'AIChE CCPS Process Safety Glossary, "Surface Charge Density"', note: 'one-sided, before breakdown (= eps0 x 3 MV/m)' },
  insulatorBreakdownStrength: { value: 1e6, high: 1e9, unit: 'V/m', source: 'AIChE CCPS glossary, "Breakdown Strength"' },

  // ---- ESD control programmes ----
  s2020ScopeHbm: { value: 100, unit: 'V', source: 'ANSI/ESD S20.20-2021, scope', note: 'parts withstanding >= 100 V HBM' },
  s2020ScopeCdm: { value: 200, unit: 'V', source: 'ANSI/ESD S20.20-2021, scope', note: 'parts withstanding >= 200 V CDM' },
  isolatedConductorLimit: { value: 35, unit: 'V', source: 'ANSI/ESD S20.20-2021, scope', note: 'keep isolated conductors below 35 V' },
  esdFieldLimit: { value: 125 * V_PER_INCH, unit: 'V/m', source: 'ANSI/ESD S20.20-2021 8.3.1 (as quoted in public ESDA forum answers)', note: '125 V/inch = 4921 V/m where ESDS items are handled' },
  esdFieldFar: { value: 2000 * V_PER_INCH, unit: 'V/m', source: 'ANSI/ESD S20.20 (1999 and 2014 wording, quoted publicly)', note: 'process-essential insulator above 2000 V/inch: keep it >= 12 in (30 cm) away' },
  esdFieldFarDistance: { value: 12 * INCH_M, unit: 'm', source: 'ANSI/ESD S20.20 (1999 and 2014 wording, quoted publicly)' },
  esdFieldNearDistance: { value: INCH_M, unit: 'm', source: 'from memory (S20.20-2014 8.3)', note: 'process-essential insulator above 125 V/inch: keep >= 1 in (2.5 cm) away' },
  iec61340FieldLimit: { value: 5000, unit: 'V/m', source: 'from memory (IEC 61340-5-1)', note: 'field at the ESDS position' },
  cdm50FieldPractice: { value: 50 * V_PER_INCH, unit: 'V/m', source: 'ESDA public forum answer (practice, not a standard)', note: 'sites protecting 50 V CDM parts may set e.g. 50 V/inch' },
  hbmNetworkCapacitance: { value: 100 * pF, unit: 'F', source: 'ANSI/ESDA/JEDEC JS-001', note: '100 pF through 1500 ohm' },
  hbmNetworkResistance: { value: 1500, unit: 'ohm', source: 'ANSI/ESDA/JEDEC JS-001' },
  safeHbm: { value: 500, unit: 'V', source: 'JEDEC JEP155', note: 'safe with a standard ESD control process' },
  safeCdm: { value: 250, unit: 'V', source: 'JEDEC JEP157' },
  meterCalibratedDistance: { value: INCH_M, unit: 'm', source: 'common practice', note: 'usual calibrated distance 1 inch; others exist (1/2 in, 4 in)' },

  // ---- ignition ----
  gasGroupIIAMinMie: { value: 0.2 * mJ, unit: 'J', source: 'BG RCI ExInfo FAQ 8.G.1, Table 1', note: 'IIA >= 0.20 mJ' },
  gasGroupIIBMie: { value: 0.02 * mJ, high: 0.2 * mJ, unit: 'J', source: 'BG RCI ExInfo FAQ 8.G.1, Table 1', note: 'IIB 0.02-0.20 mJ' },
  gasGroupIICMaxMie: { value: 0.02 * mJ, unit: 'J', source: 'BG RCI ExInfo FAQ 8.G.1, Table 1', note: 'IIC <= 0.02 mJ' },
  fineDustMie: { value: 1 * mJ, high: 50 * mJ, unit: 'J', source: 'Wikipedia "Static electricity", energies involved', note: 'fine dust clouds 1-50 mJ' },
  coarseDustMie: { value: 40 * mJ, high: 1000 * mJ, unit: 'J', source: 'Wikipedia "Static electricity", energies involved' },
  brushDischargeEnergy: { value: 4 * mJ, unit: 'J', source: 'CLC/TR 50404 as quoted by Wikipedia "Brush discharge"; IEC TS 60079-32-1 (from memory)', note: 'up to about 3-4 mJ: ignites most gases and vapours, not dust clouds' },
  brushDischargePositiveEnergy: { value: 5 * mJ, high: 10 * mJ, unit: 'J', source: 'AIChE CCPS glossary, "Brush Discharge"', note: 'positive-electrode case; disagrees with 4 mJ; 4 mJ is the default' },
  bulkingDischargeEnergy: { value: 10 * mJ, high: 20 * mJ, unit: 'J', source: 'AIChE CCPS glossary, "Bulking Brush Discharge"' },
  propagatingBrushEnergy: { value: 1000 * mJ, unit: 'J', source: 'AIChE CCPS glossary, "Propagating Brush Discharge"', note: 'may exceed 1000 mJ; ignites dusts' },
  propagatingBrushSurfaceChargeDensity: { value: 250e-6, unit: 'C/m^2', source: 'NFPA 77 (2000) 4.3.7', note: 'insulating layer < 8 mm thick on a conductor with surface charge density > 250 uC/m^2' },
  propagatingBrushMaxLayerThickness: { value: 8e-3, unit: 'm', source: 'NFPA 77 (2000) 4.3.7' },
  propagatingBrushMinBreakdownVoltage: { value: 4000, unit: 'V', source: 'from memory (Britton; Glor criterion)', note: 'no propagating brush if the layer breaks down below 4 kV' },
  brushDischargeOnsetSurfaceChargeDensity: {
    value: 10e-6, unit: 'C/m^2', source: 'from memory (order of magnitude for incendive brush discharges from charged insulators; no published value at hand)',
    note: 'brush discharges to a grounded electrode need a surface charge density of the order of 10 uC/m^2 (air holds at most 26.5)',
  },
  earthingCapacitanceThreshold: { value: 10 * pF, unit: 'F', source: 'TRBS 2153 8.3.5 (forerunner of TRGS 727)', note: 'earth conductive parts above 10 pF' },
  earthedLeakageResistance: { value: 1e6, unit: 'ohm', source: 'TRBS 2153 8.3.3 / TRGS 727 8.3' },
  transferChargeIIA: { value: 60 * nC, unit: 'C', source: 'from memory (IEC 60079-0, charge-transfer test of IEC 60079-32-2)', note: 'groups I and IIA' },
  transferChargeIIB: { value: 25 * nC, unit: 'C', source: 'from memory (IEC 60079-0, charge-transfer test of IEC 60079-32-2)' },
  transferChargeIIC: { value: 10 * nC, unit: 'C', source: 'from memory (IEC 60079-0, charge-transfer test of IEC 60079-32-2)' },
  transferChargeIII: { value: 200 * nC, unit: 'C', source: 'from memory (IEC 60079-0, charge-transfer test of IEC 60079-32-2)', note: 'group III (dust)' },
  imperceptibleIgnitingSpark: { value: 0.2 * mJ, unit: 'J', source: 'Wikipedia "Static electricity"', note: 'a spark that can ignite while below human perception' },

  // ---- capacitances ----
  capacitanceMetalScoop: { value: 10 * pF, high: 20 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5' },
  capacitanceDrum: { value: 10 * pF, high: 100 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5', note: 'oil or solvent drum' },
  capacitancePerson: { value: 100 * pF, high: 300 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5; Wikipedia "Body capacitance"', note: '200 pF design value; up to about 400 pF' },
  capacitancePersonDesign: { value: 200 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5; Wikipedia "Body capacitance"' },
  capacitanceAutomobile: { value: 500 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5' },
  capacitanceTankCar: { value: 1000 * pF, unit: 'F', source: 'NFPA 77 (2000) Table A.3.1.5' },
  capacitanceDrumOnPallet: { value: 70 * pF, unit: 'F', source: 'BG RCI ExInfo FAQ 7.15', note: '200 L steel drum on a dry wooden pallet 70 mm thick' },
  capacitanceDrumOnFilm: { value: 35e-9, unit: 'F', source: 'BG RCI ExInfo FAQ 7.15', note: 'same drum on a 140 um plastic film' },
  capacitanceMediumContainer: { value: 50 * pF, high: 300 * pF, unit: 'F', source: 'from memory (IEC TS 60079-32-1 table)', note: '250-500 L' },
  capacitanceMajorPlant: { value: 100 * pF, high: 1000 * pF, unit: 'F', source: 'from memory (IEC TS 60079-32-1 table)' },
  capacitanceSpherePerMetre: { value: 4 * Math.PI * EPSILON_0, unit: 'F/m', source: 'physics (isolated sphere C = 4 pi eps0 a)' },

  // ---- people ----
  bodyVoltageUnnoticed: { value: 3000, unit: 'V', source: 'Wikipedia "Static electricity" / "Body capacitance"', note: 'people do not notice below about 3 kV' },
  shockPerceptibleVoltage: { value: 2000, unit: 'V', source: 'TRBS 2131 section 6 / TRGS 727 Annex D (German technical rules)' },
  shockPerceptibleEnergy: { value: 0.5 * mJ, unit: 'J', source: 'TRBS 2131 section 6 / TRGS 727 Annex D (German technical rules)' },
  shockPainfulVoltage: { value: 10000, unit: 'V', source: 'TRBS 2131 section 6 / TRGS 727 Annex D (German technical rules)' },
  personHazardCharge: { value: 50e-6, unit: 'C', source: 'TRBS 2131 / TRGS 727 Annex D' },
  personHazardEnergy: { value: 350 * mJ, unit: 'J', source: 'TRBS 2131 / TRGS 727 Annex D' },
  seriousHealthRiskEnergy: { value: 5000 * mJ, unit: 'J', source: 'IEC/TS 60479-2 as quoted by Wikipedia "Static electricity"' },
  personSparkVoltage: { value: 1000, unit: 'V', source: 'TRGS 727 as cited by BAuA', note: 'sparks from a person from about 1 kV' },
  bodyVoltageCommonMax: { value: 25000, unit: 'V', source: 'Wikipedia "Static electricity"', note: 'commonly 1-10 kV; up to 20-25 kV' },

  // ---- humidity ----
  humidityLowRisk: { value: 40, unit: '%RH', source: 'common practice; AATCC 134 context', note: '40 % RH or more usually no problem; humidity is no substitute for earthing' },
  humiditySharpRise: { value: 30, unit: '%RH', source: 'common practice; AATCC 134 context', note: 'charging rises sharply below about 30 % RH' },
  walkingVinylDry: { value: 12000, unit: 'V', source: 'Wikipedia "Static electricity"', note: 'walking on vinyl at 15 % RH (1.5 kV at 80 % RH)' },
  walkingVinylHumid: { value: 1500, unit: 'V', source: 'Wikipedia "Static electricity"', note: 'walking on vinyl at 80 % RH' },
  personChargingDry: { value: 20000, unit: 'V', source: 'Talebzadeh et al., IEEE Trans. EMC 58(4), 2016', note: 'can exceed 20 kV at 22 C, 5 % RH' },
  esdQualificationHumidity: { value: 12, unit: '%RH', source: 'In Compliance Magazine, "Does an ESD Control Program Require Humidity Controls?"', note: '12 +/- 3 % RH, 23 C' },
} as const satisfies Record<string, Fact>;

export type FactId = keyof typeof FACTS;

/** Representative substance of each gas group (BG RCI ExInfo FAQ 8.G.1, Table 1). */
export const GAS_GROUP_REPRESENTATIVE = { IIA: 'propane', IIB: 'ethylene', IIC: 'hydrogen' } as const;
export type GasGroup = keyof typeof GAS_GROUP_REPRESENTATIVE;

/** Transfer-charge limit by group (from memory, IEC 60079-0 / IEC 60079-32-2). */
export const TRANSFER_CHARGE_LIMIT: Readonly<Record<GasGroup | 'III', Fact>> = {
  IIA: FACTS.transferChargeIIA, IIB: FACTS.transferChargeIIB, IIC: FACTS.transferChargeIIC, III: FACTS.transferChargeIII,
};

/** Chargeable insulating area limits by zone and group, m^2 (from memory, IEC TS 60079-32-1); zone 2: normally none. */
export const CHARGEABLE_AREA_LIMIT_M2: Readonly<Record<0 | 1, Record<GasGroup, number>>> = {
  0: { IIA: 50e-4, IIB: 25e-4, IIC: 4e-4 },
  1: { IIA: 100e-4, IIB: 100e-4, IIC: 20e-4 },
};
export const CHARGEABLE_AREA_SOURCE = 'from memory (IEC TS 60079-32-1)';

/** A device sensitivity class: [min, max) withstand voltage in V (max null: open). */
export interface SensitivityClass { id: string; minV: number; maxV: number | null }

/** HBM classes, ANSI/ESDA/JEDEC JS-001 (from memory; 0A-3B match quoted JS-001 tables). */
export const HBM_CLASSES: readonly SensitivityClass[] = [
  { id: '0Z', minV: 0, maxV: 50 }, { id: '0A', minV: 50, maxV: 125 }, { id: '0B', minV: 125, maxV: 250 },
  { id: '1A', minV: 250, maxV: 500 }, { id: '1B', minV: 500, maxV: 1000 }, { id: '1C', minV: 1000, maxV: 2000 },
  { id: '2', minV: 2000, maxV: 4000 }, { id: '3A', minV: 4000, maxV: 8000 }, { id: '3B', minV: 8000, maxV: null },
];
export const HBM_CLASSES_SOURCE = 'from memory (0A-3B match quoted ANSI/ESDA/JEDEC JS-001 tables)';

/** CDM classes, ANSI/ESDA/JEDEC JS-002 (from memory). */
export const CDM_CLASSES: readonly SensitivityClass[] = [
  { id: 'C0a', minV: 0, maxV: 125 }, { id: 'C0b', minV: 125, maxV: 250 }, { id: 'C1', minV: 250, maxV: 500 },
  { id: 'C2a', minV: 500, maxV: 750 }, { id: 'C2b', minV: 750, maxV: 1000 }, { id: 'C3', minV: 1000, maxV: null },
];
export const CDM_CLASSES_SOURCE = 'from memory (ANSI/ESDA/JEDEC JS-002)';

/**
 * The class a withstand voltage falls in.
 * @param withstandV device withstand voltage, V
 * @param classes HBM_CLASSES or CDM_CLASSES
 * @returns the class id
 * @example sensitivityClass(300, HBM_CLASSES) // '1A'
 */
export function sensitivityClass(withstandV: number, classes: readonly SensitivityClass[]): string {
  const c = classes.find((k) => withstandV >= k.minV && (k.maxV === null || withstandV < k.maxV));
  if (c === undefined) throw new RangeError('withstand voltage must be zero or more');
  return c.id;
}

/**
 * The gas group a minimum ignition energy falls in, by the MIE bands of BG RCI ExInfo
 * FAQ 8.G.1 Table 1 (IIA >= 0.20 mJ; IIB 0.02-0.20 mJ; IIC <= 0.02 mJ).
 * @param mieJ minimum ignition energy, J
 * @returns 'IIA' | 'IIB' | 'IIC'
 * @example gasGroupForMie(0.25e-3) // 'IIA'; gasGroupForMie(0.016e-3) // 'IIC'
 */
export function gasGroupForMie(mieJ: number): GasGroup {
  if (mieJ >= FACTS.gasGroupIIAMinMie.value) return 'IIA';
  if (mieJ > FACTS.gasGroupIICMaxMie.value) return 'IIB';
  return 'IIC';
}
