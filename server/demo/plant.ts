/**
 * The invented demo plant: "Quillmere Converting Works", a made-up film and
 * powder converter with an electronics sub-assembly shop. No real company,
 * person, product or place. Its set-up is plain data; demo/index.ts loads it
 * through the Store and generates the rounds.
 *
 * `baseVPerM` is the spot's typical field at its default distance in usual
 * humidity (about 48 % RH); the generator scales it with humidity, trend and noise.
 */
import { limitTemplate } from '../../core/hazard/templates';
import type { LimitRule } from '../../core/limits/evaluate';
import type { SpotInput } from '../../core/schemas';

export const SITE = {
  name: 'Quillmere Converting Works (demo)',
  timeZone: 'Europe/Berlin',
  notes: 'An invented plant for trying chargewalk: film converting with solvent inks, powder filling, electronics sub-assembly. Every name and number here is made up.',
};

export const SURVEYORS = ['Ilse Marwood-Tenn', 'Corvin Aldersley', 'Petra Nollhagen'];

const FIELD_SCREENING = 'common practice: screening level for a field meter, not from a standard; set your own';

/**
 * The starter template's rules without chargeC: its levels are transferred-charge
 * limits (charge passed in one discharge), while the estimate gives the total
 * charge on a roll or bag, which is far larger; this demo site judges those
 * objects by field, surface charge density and energy instead.
 */
const withoutCharge = (rules: LimitRule[]) => rules.filter((r) => r.metric !== 'chargeC');

export const LIMIT_SETS: Record<'hall' | 'powder' | 'epa' | 'general', { name: string; description: string; rules: LimitRule[] }> = {
  hall: {
    name: 'Film hall: zone 1, IIA (toluene inks)',
    description: 'Field screening levels plus the starter template for zone 1, gas group IIA.',
    rules: [
      { metric: 'fieldVPerM', warn: 100e3, alarm: 300e3, source: FIELD_SCREENING },
      ...withoutCharge(limitTemplate({ kind: 'hazardous', zone: 1, gasGroup: 'IIA' }).rules),
    ],
  },
  powder: {
    name: 'Powder room: zone 22 dust',
    description: 'Field screening levels, the dust\'s own MIE, and the starter template for dust zone 22.',
    rules: [
      { metric: 'fieldVPerM', warn: 100e3, alarm: 300e3, source: FIELD_SCREENING },
      { metric: 'energyJ', warn: null, alarm: 10e-3, source: "the starch blend's MIE, 10 mJ, from the site's own test (invented for the demo)" },
      ...withoutCharge(limitTemplate({ kind: 'dust', zone: 22 }).rules).filter((r) => r.metric !== 'energyJ'),
    ],
  },
  epa: {
    name: 'EPA: ANSI/ESD S20.20',
    description: 'Field at ESDS items and isolated conductors, for parts withstanding 100 V HBM or more.',
    rules: [
      { metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'alarm: 125 V/inch, ANSI/ESD S20.20-2021 8.3.1; warn: about half of it, site practice' },
      { metric: 'surfaceVoltageV', warn: null, alarm: 35, source: 'isolated conductors below 35 V, ANSI/ESD S20.20-2021, scope', appliesTo: ['conductor'] },
      { metric: 'bodyVoltageV', warn: null, alarm: 100, source: '100 V HBM programme scope, ANSI/ESD S20.20-2021, scope' },
    ],
  },
  general: {
    name: 'General: shocks to people',
    description: 'Starter template for areas without flammable atmospheres or ESDS items.',
    rules: [
      { metric: 'fieldVPerM', warn: 100e3, alarm: 300e3, source: FIELD_SCREENING },
      ...limitTemplate({ kind: 'general' }).rules,
    ],
  },
};

export type AreaKey = 'hall' | 'powder' | 'epa' | 'general';

export const AREAS: Record<AreaKey, { name: string; kind: 'epa' | 'hazardous' | 'general'; zone: 0 | 1 | 2 | 20 | 21 | 22 | null; gasGroup: 'IIA' | null; substanceId: string | null; dustMieJ: number | null; notes: string }> = {
  hall: {
    name: 'Hall C: film converting', kind: 'hazardous', zone: 1, gasGroup: 'IIA', substanceId: 'toluene', dustMieJ: null,
    notes: 'Gravure printing and slitting of BOPP and PET film with toluene / ethyl acetate inks. Measure free web spans, not over rollers.',
  },
  powder: {
    name: 'Room P2: powder filling', kind: 'hazardous', zone: 22, gasGroup: null, substanceId: null, dustMieJ: 10e-3,
    notes: 'Filling a food-grade starch blend from big bags into sacks and steel drums. Dust MIE from the site\'s own test (invented).',
  },
  epa: {
    name: 'Sub-assembly EPA', kind: 'epa', zone: null, gasGroup: null, substanceId: null, dustMieJ: null,
    notes: 'Hand soldering and board inspection. Parts down to 100 V HBM.',
  },
  general: {
    name: 'Dispatch and goods-in', kind: 'general', zone: null, gasGroup: null, substanceId: null, dustMieJ: null,
    notes: 'No flammable atmosphere; people get shocks from stretch film.',
  },
};

export type MeterKey = 'hall' | 'epa' | 'spare';

export interface DemoSpot {
  area: AreaKey;
  meter: MeterKey;
  spot: Omit<SpotInput, 'areaId' | 'routePosition' | 'notes' | 'distanceUncertaintyM'> & { notes?: string };
  baseVPerM: number;
  polarity: '+' | '-';
  /** How readings are usually entered at this spot. */
  unit: 'kV/m' | 'V/m' | 'V/inch' | 'V';
  /** What the tablet records as process state, when the spot belongs to a line. */
  process?: { material: string; lineSpeedMPerS: number | null };
  /** Growth per week (0.1 = +10 % a week, linear): the spot that trends up. */
  trendPerWeek?: number;
  /** How strongly the hall's humidity drives this spot (1 = like the others; 0: a web leaving a hot dryer is dry whatever the hall's air). */
  rhSensitivity?: number;
  /** Reading-to-reading scatter, standard deviation of ln|E| (default 0.22). */
  noiseSd?: number;
  /** Week index (0 = oldest) from which a fix cuts the field to `fixFactor`. */
  fixedFromWeek?: number;
  fixFactor?: number;
}

const cm = (value: number) => ({ value, unit: 'cm' as const });
const inch = (value: number) => ({ value, unit: 'inch' as const });

export const SPOTS: DemoSpot[] = [
  // Hall C: film converting (zone 1, IIA)
  { area: 'hall', meter: 'hall', baseVPerM: 60e3, polarity: '-', unit: 'kV/m', process: { material: 'BOPP 30 µm', lineSpeedMPerS: 4.5 },
    spot: { name: 'Unwind roll, printer 2', code: 'C-01', objectKind: 'roll', materialClass: 'insulator', model: 'line', geometry: { radiusM: 0.35, lengthM: 1.6 }, defaultDistance: cm(10) } },
  { area: 'hall', meter: 'hall', baseVPerM: 45e3, polarity: '-', unit: 'kV/m', process: { material: 'BOPP 30 µm', lineSpeedMPerS: 4.5 },
    spot: { name: 'Web after unwind, free span', code: 'C-02', objectKind: 'web', materialClass: 'insulator', model: 'sheet', geometry: { widthM: 1.5, groundBehindM: 0.3 }, defaultDistance: cm(5) } },
  { area: 'hall', meter: 'hall', baseVPerM: 200, polarity: '-', unit: 'V/m', process: { material: 'BOPP 30 µm', lineSpeedMPerS: 4.5 },
    spot: { name: 'Web on impression roller, unit 3', code: 'C-03', objectKind: 'web', materialClass: 'insulator', model: 'layer-on-ground', geometry: { thicknessM: 30e-6, relativePermittivity: 2.2 }, defaultDistance: cm(5),
      notes: 'Film on a grounded roller reads low although the charge is there.' } },
  { area: 'hall', meter: 'hall', baseVPerM: 50e3, polarity: '-', unit: 'kV/m', process: { material: 'BOPP 30 µm', lineSpeedMPerS: 4.5 }, trendPerWeek: 0.2, rhSensitivity: 0, noiseSd: 0.1,
    spot: { name: 'Web at dryer exit', code: 'C-04', objectKind: 'web', materialClass: 'insulator', model: 'sheet', geometry: { widthM: 1.5, groundBehindM: 0.5 }, defaultDistance: cm(5),
      notes: 'Static bar after the dryer: check its cleaning schedule.' } },
  { area: 'hall', meter: 'hall', baseVPerM: 150e3, polarity: '-', unit: 'kV/m', process: { material: 'BOPP 30 µm', lineSpeedMPerS: 4.5 }, fixedFromWeek: 8, fixFactor: 0.18,
    spot: { name: 'Rewind roll, printer 2', code: 'C-05', objectKind: 'roll', materialClass: 'insulator', model: 'line', geometry: { radiusM: 0.4, lengthM: 1.6 }, defaultDistance: cm(10),
      notes: 'Ionising bar fitted before the rewind in week 9 (follow-up).' } },
  { area: 'hall', meter: 'hall', baseVPerM: 4e3, polarity: '+', unit: 'V',
    spot: { name: 'Ink drum, toluene / ethyl acetate blend', code: 'C-06', objectKind: 'drum', materialClass: 'conductor', model: 'conductor', geometry: { capacitanceF: 100e-12, radiusM: 0.29 }, defaultDistance: cm(5),
      notes: 'Earthing clamp on the drum before decanting.' } },
  { area: 'hall', meter: 'hall', baseVPerM: 20e3, polarity: '+', unit: 'kV/m',
    spot: { name: 'Ink tote (plastic IBC)', code: 'C-07', objectKind: 'tote', materialClass: 'insulator', model: 'rectangle', geometry: { widthM: 1.0, heightM: 1.0 }, defaultDistance: cm(10) } },
  { area: 'hall', meter: 'hall', baseVPerM: 8e3, polarity: '+', unit: 'V',
    spot: { name: 'Core cart at slitter', code: 'C-08', objectKind: 'cart', materialClass: 'conductor', model: 'conductor', geometry: { capacitanceF: 150e-12 }, defaultDistance: cm(10) } },
  { area: 'hall', meter: 'hall', baseVPerM: 12e3, polarity: '+', unit: 'V',
    spot: { name: 'Operator at rewind', code: 'C-09', objectKind: 'person', materialClass: 'person', model: 'conductor', geometry: { capacitanceF: 200e-12 }, defaultDistance: cm(10) } },
  { area: 'hall', meter: 'hall', baseVPerM: 35e3, polarity: '-', unit: 'kV/m',
    spot: { name: 'Edge-trim waste bin liner', code: 'C-10', objectKind: 'liner', materialClass: 'insulator', model: 'sheet', geometry: {}, defaultDistance: cm(10) } },

  // Room P2: powder filling (zone 22)
  { area: 'powder', meter: 'hall', baseVPerM: 110e3, polarity: '-', unit: 'kV/m', process: { material: 'starch blend', lineSpeedMPerS: null },
    spot: { name: 'Big-bag discharge spout', code: 'P-01', objectKind: 'bag', materialClass: 'insulator', model: 'line', geometry: { radiusM: 0.15, lengthM: 0.5 }, defaultDistance: cm(10) } },
  { area: 'powder', meter: 'hall', baseVPerM: 70e3, polarity: '-', unit: 'kV/m', process: { material: 'starch blend', lineSpeedMPerS: null },
    spot: { name: 'Hopper liner', code: 'P-02', objectKind: 'liner', materialClass: 'insulator', model: 'sheet', geometry: { groundBehindM: 0.02 }, defaultDistance: cm(10) } },
  { area: 'powder', meter: 'hall', baseVPerM: 6e3, polarity: '-', unit: 'V',
    spot: { name: 'Steel drum at filling head', code: 'P-03', objectKind: 'drum', materialClass: 'conductor', model: 'conductor', geometry: { capacitanceF: 100e-12, radiusM: 0.29 }, defaultDistance: cm(5) } },
  { area: 'powder', meter: 'hall', baseVPerM: 45e3, polarity: '-', unit: 'kV/m', process: { material: 'starch blend', lineSpeedMPerS: null },
    spot: { name: 'Filling hose', code: 'P-04', objectKind: 'hose', materialClass: 'insulator', model: 'line', geometry: { radiusM: 0.05, lengthM: 3 }, defaultDistance: cm(5) } },
  { area: 'powder', meter: 'spare', baseVPerM: 30e3, polarity: '-', unit: 'kV/m',
    spot: { name: 'Filled sacks on pallet', code: 'P-05', objectKind: 'bag', materialClass: 'insulator', model: 'rectangle', geometry: { widthM: 0.5, heightM: 0.8 }, defaultDistance: cm(10) } },
  { area: 'powder', meter: 'hall', baseVPerM: 18e3, polarity: '+', unit: 'V',
    spot: { name: 'Operator at filling head', code: 'P-06', objectKind: 'person', materialClass: 'person', model: 'conductor', geometry: { capacitanceF: 200e-12 }, defaultDistance: cm(10) } },
  { area: 'powder', meter: 'spare', baseVPerM: 40e3, polarity: '-', unit: 'kV/m',
    spot: { name: 'Plastic sampling scoop', code: 'P-07', objectKind: 'tool', materialClass: 'insulator', model: 'point', geometry: {}, defaultDistance: cm(5) } },

  // Sub-assembly EPA
  { area: 'epa', meter: 'epa', baseVPerM: 80, polarity: '+', unit: 'V/inch',
    spot: { name: 'Soldering station 1, mat', code: 'E-01', objectKind: 'workstation', materialClass: 'conductor', model: null, geometry: {}, defaultDistance: inch(1) } },
  { area: 'epa', meter: 'epa', baseVPerM: 120, polarity: '+', unit: 'V/inch',
    spot: { name: 'Soldering station 2, mat', code: 'E-02', objectKind: 'workstation', materialClass: 'conductor', model: null, geometry: {}, defaultDistance: inch(1) } },
  { area: 'epa', meter: 'epa', baseVPerM: 300, polarity: '-', unit: 'V/inch',
    spot: { name: 'Component reel cart', code: 'E-03', objectKind: 'cart', materialClass: 'insulator', model: null, geometry: {}, defaultDistance: inch(1) } },
  { area: 'epa', meter: 'epa', baseVPerM: 150, polarity: '+', unit: 'V',
    spot: { name: 'PCB tote (dissipative)', code: 'E-04', objectKind: 'tote', materialClass: 'conductor', model: 'conductor', geometry: { capacitanceF: 30e-12 }, defaultDistance: inch(1) } },
  { area: 'epa', meter: 'epa', baseVPerM: 550, polarity: '-', unit: 'V/inch',
    spot: { name: 'Bubble wrap at packing bench', code: 'E-05', objectKind: 'roll', materialClass: 'insulator', model: null, geometry: {}, defaultDistance: inch(1),
      notes: 'Process-essential insulator? Keep it at least 30 cm from boards.' } },
  { area: 'epa', meter: 'epa', baseVPerM: 90, polarity: '+', unit: 'V/inch',
    spot: { name: 'Inspector, seated, wrist strap', code: 'E-06', objectKind: 'person', materialClass: 'person', model: null, geometry: {}, defaultDistance: inch(1) } },
  { area: 'epa', meter: 'epa', baseVPerM: 450, polarity: '-', unit: 'V/inch',
    spot: { name: 'Tape dispenser, inspection bench', code: 'E-07', objectKind: 'tool', materialClass: 'insulator', model: null, geometry: {}, defaultDistance: inch(1) } },

  // Dispatch and goods-in
  { area: 'general', meter: 'hall', baseVPerM: 60e3, polarity: '-', unit: 'kV/m',
    spot: { name: 'Stretch wrapper film roll', code: 'G-01', objectKind: 'roll', materialClass: 'insulator', model: 'line', geometry: { radiusM: 0.1, lengthM: 0.5 }, defaultDistance: cm(10) } },
  { area: 'general', meter: 'hall', baseVPerM: 25e3, polarity: '+', unit: 'V',
    spot: { name: 'Forklift driver at dock door', code: 'G-02', objectKind: 'person', materialClass: 'person', model: 'conductor', geometry: { capacitanceF: 200e-12 }, defaultDistance: cm(10) } },
];

export const SKIP_REASONS = [
  'line stopped for a job change',
  'area closed for cleaning',
  'operator on break, station empty',
  'no access: forklift loading',
];
