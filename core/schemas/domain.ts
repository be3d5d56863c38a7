/**
 * Zod schemas of the set-up and logging payloads: the one source of truth for
 * validation (server and client forms), TypeScript types and the OpenAPI document.
 *
 * Naming: lowerCamelCase; SI quantities carry their unit in the name
 * (distanceM, fieldVPerM); values as entered keep their unit beside them.
 */
import { z } from 'zod';
import { LIMIT_METRICS } from '../limits/metrics';
import {
  DistanceSchema, finite, Id, IdV7, IsoDate, IsoDateTime, ReadingUnitSchema, requiredText, RhPercent,
  TemperatureC, text,
} from './common';

// ---------- site ----------
export const SiteInputSchema = z.object({
  id: Id.optional(),
  name: requiredText('site name', 120),
  timeZone: requiredText('time zone', 64).refine(isTimeZone, 'time zone must be an IANA name such as Europe/Berlin'),
  notes: text('notes', 2000).default(''),
}).meta({ id: 'SiteInput' });
export type SiteInput = z.infer<typeof SiteInputSchema>;

function isTimeZone(tz: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

// ---------- limit sets ----------
export const LimitMetricSchema = z.enum(LIMIT_METRICS, { error: `metric must be one of ${LIMIT_METRICS.join(', ')}` });
const limitLevel = (what: string) => finite(what).refine((v) => v > 0, `${what} must be greater than zero`).nullable();

export const LimitRuleSchema = z.object({
  metric: LimitMetricSchema,
  warn: limitLevel('warn level'),
  alarm: limitLevel('alarm level'),
  source: requiredText('source', 300),
  /** Material classes the rule is meant for; absent or empty: every spot. */
  appliesTo: z.array(z.enum(['conductor', 'insulator', 'person', 'unknown'], { error: 'appliesTo holds conductor, insulator, person or unknown' })).max(4).optional(),
}).superRefine((r, ctx) => {
  if (r.warn === null && r.alarm === null) ctx.addIssue({ code: 'custom', path: ['alarm'], message: 'give a warn level, an alarm level or both' });
  if (r.warn !== null && r.alarm !== null && r.warn > r.alarm) ctx.addIssue({ code: 'custom', path: ['warn'], message: 'warn level must not be above the alarm level' });
}).meta({ id: 'LimitRule', description: 'Warn and alarm levels (SI magnitudes) for one metric, with the source of the numbers.' });

export const LimitSetInputSchema = z.object({
  id: Id.optional(),
  siteId: Id,
  name: requiredText('limit set name', 120),
  description: text('description', 2000).default(''),
  rules: z.array(LimitRuleSchema).max(20, 'at most 20 rules').superRefine((rules, ctx) => {
    const seen = new Set<string>();
    rules.forEach((r, i) => {
      if (seen.has(r.metric)) ctx.addIssue({ code: 'custom', path: [i, 'metric'], message: `metric ${r.metric} appears twice` });
      seen.add(r.metric);
    });
  }),
}).meta({ id: 'LimitSetInput' });
export type LimitSetInput = z.infer<typeof LimitSetInputSchema>;

// ---------- areas ----------
export const AREA_KINDS = ['epa', 'hazardous', 'general'] as const;
export const AREA_KIND_LABEL: Record<(typeof AREA_KINDS)[number], string> = {
  epa: 'ESD protected area (EPA)',
  hazardous: 'Hazardous zone',
  general: 'General',
};
export const ZONES = [0, 1, 2, 20, 21, 22] as const;
export const GAS_GROUPS = ['IIA', 'IIB', 'IIC'] as const;

export const AreaInputSchema = z.object({
  id: Id.optional(),
  siteId: Id,
  name: requiredText('area name', 120),
  kind: z.enum(AREA_KINDS, { error: 'kind must be epa, hazardous or general' }),
  zone: z.union([z.literal(0), z.literal(1), z.literal(2), z.literal(20), z.literal(21), z.literal(22)], { error: 'zone must be 0, 1, 2, 20, 21 or 22' }).nullable().default(null),
  gasGroup: z.enum(GAS_GROUPS, { error: 'gas group must be IIA, IIB or IIC' }).nullable().default(null),
  /** Substance id from the substance table (sets the MIE and minimum ignition charge). */
  substanceId: text('substance', 64).nullable().default(null),
  /** Minimum ignition energy of the dust, J, when the site knows it (dust zones). */
  dustMieJ: finite('dust MIE').refine((v) => v > 0, 'dust MIE must be greater than zero').nullable().default(null),
  limitSetId: Id.nullable().default(null),
  notes: text('notes', 2000).default(''),
}).superRefine((a, ctx) => {
  if (a.kind === 'hazardous' && a.zone === null) ctx.addIssue({ code: 'custom', path: ['zone'], message: 'a hazardous zone needs its zone number' });
  if (a.kind !== 'hazardous' && a.zone !== null) ctx.addIssue({ code: 'custom', path: ['zone'], message: 'only a hazardous zone has a zone number' });
  if (a.zone !== null && a.zone >= 20 && a.gasGroup !== null) ctx.addIssue({ code: 'custom', path: ['gasGroup'], message: 'dust zones (20, 21, 22) take no gas group' });
  if (a.kind !== 'hazardous' && a.gasGroup !== null) ctx.addIssue({ code: 'custom', path: ['gasGroup'], message: 'only a hazardous zone has a gas group' });
}).meta({ id: 'AreaInput' });
export type AreaInput = z.infer<typeof AreaInputSchema>;

// ---------- spots ----------
export const OBJECT_KINDS = [
  'workstation', 'roll', 'web', 'drum', 'tote', 'bag', 'liner', 'container', 'cart', 'hose', 'panel', 'person', 'tool', 'other',
] as const;
/** What the object is made of, electrically: decides which hazard checks apply. */
export const MATERIAL_CLASSES = ['conductor', 'insulator', 'person', 'unknown'] as const;
export const ESTIMATE_MODELS = [
  'point', 'sphere', 'dipole-axis', 'dipole-broadside', 'image-charge', 'line', 'disk', 'rectangle', 'sheet',
  'layer-on-ground', 'conductor', 'bulk-cylinder',
] as const;

const positiveM = (what: string) => finite(what).refine((v) => v > 0, `${what} must be greater than zero`).refine((v) => v <= 1000, `${what} is too large`);

/** Geometry of the spot's object, SI; each field only where its model needs it. */
export const SpotGeometrySchema = z.object({
  radiusM: finite('radius').refine((v) => v >= 0 && v <= 1000, 'radius must be between 0 and 1000 m').optional(),
  lengthM: positiveM('length').optional(),
  separationM: positiveM('separation').optional(),
  heightAboveGroundM: positiveM('height above ground').optional(),
  widthM: positiveM('width').optional(),
  heightM: positiveM('height').optional(),
  thicknessM: positiveM('thickness').optional(),
  relativePermittivity: finite('relative permittivity').refine((v) => v >= 1 && v <= 1000, 'relative permittivity must be between 1 and 1000').optional(),
  groundBehindM: positiveM('ground behind').optional(),
  capacitanceF: finite('capacitance').refine((v) => v > 0 && v < 1, 'capacitance must be greater than zero (farads)').optional(),
}).strict().meta({ id: 'SpotGeometry' });
export type SpotGeometry = z.infer<typeof SpotGeometrySchema>;

export const SpotInputSchema = z.object({
  id: Id.optional(),
  areaId: Id,
  name: requiredText('spot name', 120),
  /** Short code printed on the spot's label, unique within the site. */
  code: requiredText('code', 16).regex(/^[A-Za-z0-9][A-Za-z0-9-]*$/, 'code may hold letters, digits and dashes'),
  objectKind: z.enum(OBJECT_KINDS, { error: `object kind must be one of ${OBJECT_KINDS.join(', ')}` }),
  materialClass: z.enum(MATERIAL_CLASSES, { error: 'material must be conductor, insulator, person or unknown' }).default('unknown'),
  model: z.enum(ESTIMATE_MODELS, { error: `model must be one of ${ESTIMATE_MODELS.join(', ')}` }).nullable().default(null),
  geometry: SpotGeometrySchema.default({}),
  defaultDistance: DistanceSchema,
  /** Default uncertainty of the distance for this spot, m. */
  distanceUncertaintyM: finite('distance uncertainty').refine((v) => v >= 0 && v <= 10, 'distance uncertainty must be between 0 and 10 m').nullable().default(null),
  routePosition: z.number().int('route position must be a whole number').min(0, 'route position must not be negative').max(100000).default(0),
  notes: text('notes', 2000).default(''),
}).meta({ id: 'SpotInput' });
export type SpotInput = z.infer<typeof SpotInputSchema>;

export const RouteOrderSchema = z.object({
  spotIds: z.array(Id).min(1, 'give at least one spot').max(5000),
}).meta({ id: 'RouteOrder' });

// ---------- meters ----------
export const METER_MODES = ['field', 'surface-voltage'] as const;
export const MeterInputSchema = z.object({
  id: Id.optional(),
  siteId: Id,
  serial: requiredText('serial number', 64),
  label: text('label', 120).default(''),
  modes: z.array(z.enum(METER_MODES, { error: 'mode must be field or surface-voltage' })).min(1, 'give at least one reading mode').max(2),
  /** Calibrated distance for surface-voltage mode, m (commonly 1 inch = 0.0254 m). */
  calibratedDistanceM: positiveM('calibrated distance').nullable().default(null),
  /** Stated accuracy as a fraction of the reading (0.05 = ±5 %). */
  accuracyRel: finite('accuracy').refine((v) => v >= 0 && v <= 1, 'accuracy must be a fraction between 0 and 1 (0.05 = ±5 %)').default(0.05),
  /** Divides point-like estimates; 1 for a small probe, up to 2 for a wide flat grounded face. */
  geometryFactor: finite('geometry factor').refine((v) => v >= 1 && v <= 2, 'geometry factor must be between 1 and 2').default(1),
  calibrationDue: IsoDate,
  defaultUnit: ReadingUnitSchema.default('kV/m'),
}).superRefine((m, ctx) => {
  if (m.modes.includes('surface-voltage') && m.calibratedDistanceM === null) {
    ctx.addIssue({ code: 'custom', path: ['calibratedDistanceM'], message: 'surface-voltage mode needs the calibrated distance' });
  }
  if ((m.defaultUnit === 'V' || m.defaultUnit === 'kV') && !m.modes.includes('surface-voltage')) {
    ctx.addIssue({ code: 'custom', path: ['defaultUnit'], message: 'V and kV are surface-voltage units: add that mode or pick a field unit' });
  }
}).meta({ id: 'MeterInput' });
export type MeterInput = z.infer<typeof MeterInputSchema>;

// ---------- rounds ----------
export const RoundInputSchema = z.object({
  /** Made by the client (UUIDv7) so a round can start offline and a retry is harmless. */
  id: IdV7,
  siteId: Id,
  surveyor: requiredText('surveyor', 120),
  startedAt: IsoDateTime,
  rhPercent: RhPercent.nullable().default(null),
  temperatureC: TemperatureC.nullable().default(null),
  notes: text('notes', 2000).default(''),
  /** Spots planned for this round; defaults to every active spot of the site, in route order. */
  plannedSpotIds: z.array(Id).max(5000).optional(),
}).meta({ id: 'RoundInput' });
export type RoundInput = z.infer<typeof RoundInputSchema>;

export const RoundFinishSchema = z.object({
  endedAt: IsoDateTime,
  notes: text('notes', 2000).optional(),
}).meta({ id: 'RoundFinish' });

export const SkipInputSchema = z.object({
  id: IdV7,
  roundId: Id,
  spotId: Id,
  reason: requiredText('reason', 500),
  at: IsoDateTime,
}).meta({ id: 'SkipInput' });
export type SkipInput = z.infer<typeof SkipInputSchema>;

// ---------- readings ----------
export const POLARITIES = ['+', '-'] as const;
export const SIDES = ['front', 'back', 'top', 'bottom', 'left', 'right', 'inside', 'edge', 'free-span', 'over-roller', 'other'] as const;

export const ProcessStateSchema = z.object({
  state: z.enum(['running', 'idle'], { error: 'process state must be running or idle' }),
  material: text('material', 120).default(''),
  lineSpeedMPerS: finite('line speed').refine((v) => v >= 0 && v <= 100, 'line speed must be between 0 and 100 m/s').nullable().default(null),
}).meta({ id: 'ProcessState' });

/** A reading as the tablet sends it. */
export const ReadingInputSchema = z.object({
  id: IdV7,
  roundId: Id,
  spotId: Id,
  meterId: Id,
  takenAt: IsoDateTime,
  /** Magnitude as read off the display (polarity separate). */
  value: finite('value').refine((v) => v >= 0, 'value is the magnitude on the display: enter the sign with polarity').refine((v) => v <= 1e9, 'value is too large'),
  unit: ReadingUnitSchema,
  polarity: z.enum(POLARITIES, { error: 'polarity must be + or -' }),
  meterRange: text('meter range', 40).default(''),
  distance: DistanceSchema,
  /** Per-reading distance uncertainty, m; else the spot's default applies. */
  distanceUncertaintyM: finite('distance uncertainty').refine((v) => v >= 0 && v <= 10, 'distance uncertainty must be between 0 and 10 m').nullable().default(null),
  side: z.enum(SIDES, { error: `side must be one of ${SIDES.join(', ')}` }).nullable().default(null),
  groundBehind: DistanceSchema.nullable().default(null),
  zeroed: z.boolean({ error: 'zeroed must be true or false' }),
  rhPercent: RhPercent.nullable().default(null),
  temperatureC: TemperatureC.nullable().default(null),
  process: ProcessStateSchema.nullable().default(null),
  note: text('note', 2000).default(''),
}).meta({ id: 'ReadingInput' });
export type ReadingInput = z.infer<typeof ReadingInputSchema>;

const MAX_BATCH = 500;
/** POST /api/readings takes one reading or { readings: [...] }. */
export const ReadingBatchSchema = z.object({
  readings: z.array(ReadingInputSchema).min(1, 'give at least one reading').max(MAX_BATCH, `at most ${MAX_BATCH} readings per batch`),
}).meta({ id: 'ReadingBatch' });

export const CorrectionInputSchema = ReadingInputSchema.extend({
  reason: requiredText('reason', 500),
}).meta({ id: 'CorrectionInput', description: 'A corrected reading: a new revision (new id) that supersedes the old one.' });
export type CorrectionInput = z.infer<typeof CorrectionInputSchema>;

export const TombstoneInputSchema = z.object({
  reason: requiredText('reason', 500),
}).meta({ id: 'TombstoneInput' });

