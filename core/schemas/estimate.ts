/**
 * Zod schemas of the estimation API (POST /api/estimate, POST /api/sweep and the
 * `chargewalk estimate|sweep` command): one source of truth for validation, the
 * TypeScript types and the OpenAPI document. Contract: issue 3.
 *
 * Validation messages name the field in plain words, e.g.
 * "geometry.radiusM is required for the sphere model", with the issue path
 * ['geometry', 'radiusM'].
 */
import { z } from 'zod';
import { finite } from './common';

export const ESTIMATE_MODELS = [
  'point', 'sphere', 'dipole-axis', 'dipole-broadside', 'image-charge', 'line', 'disk',
  'rectangle', 'sheet', 'layer-on-ground', 'conductor', 'bulk-cylinder',
] as const;
export type EstimateModel = (typeof ESTIMATE_MODELS)[number];

/** Models measured from the charge centre; every other model takes the gap to the object's surface. */
export const CENTRE_DISTANCE_MODELS: readonly EstimateModel[] = ['point', 'dipole-axis', 'dipole-broadside', 'image-charge'];

export const SWEEP_MODELS = ['point', 'sphere', 'line', 'dipole', 'sheet', 'disk', 'rectangle'] as const;
export type SweepModel = (typeof SWEEP_MODELS)[number];

const positive = (what: string) => finite(what).refine((v) => v > 0, `${what} must be greater than zero`);
const nonNegative = (what: string) => finite(what).refine((v) => v >= 0, `${what} must be zero or more`);

export const EstimateGeometrySchema = z.strictObject({
  radiusM: nonNegative('geometry.radiusM').optional()
    .describe('Radius, m: sphere, disk, bulk-cylinder container; cylinder radius for line (0 for a thin line).'),
  lengthM: positive('geometry.lengthM').optional().describe('Length, m: line (required); bulk-cylinder fill length (optional, gives chargeC).'),
  separationM: positive('geometry.separationM').optional()
    .describe('Pole separation, m: dipoles. Without it the far-field form is used and only the moment is given.'),
  heightAboveGroundM: positive('geometry.heightAboveGroundM').optional().describe("image-charge: the charge's height above the grounded surface, m."),
  widthM: positive('geometry.widthM').optional().describe("rectangle: full width, m; sheet: optional smallest size, m, for the 'sheet-too-small' check."),
  heightM: positive('geometry.heightM').optional().describe('rectangle: full height, m.'),
  thicknessM: positive('geometry.thicknessM').optional().describe('layer-on-ground: layer thickness, m.'),
  relativePermittivity: finite('geometry.relativePermittivity').refine((v) => v >= 1, 'geometry.relativePermittivity must be 1 or more').optional()
    .describe('layer-on-ground: relative permittivity of the layer (1 or more).'),
  groundBehindM: positive('geometry.groundBehindM').optional()
    .describe('sheet: distance from the sheet to the nearest ground behind it, m (optional; without it the isolated-sheet value).'),
  capacitanceF: positive('geometry.capacitanceF').optional().describe('conductor: capacitance to earth, F.'),
}, { error: (iss) => (iss.code === 'unrecognized_keys' ? `geometry has unknown field(s): ${iss.keys.join(', ')}` : 'geometry must be an object') })
  .meta({ id: 'EstimateGeometry', description: 'Geometry of the modelled object, SI; each field only where the model needs it.' });
export type EstimateGeometry = z.infer<typeof EstimateGeometrySchema>;

type GeometryField = keyof EstimateGeometry;
/** The geometry fields each model requires. */
export const REQUIRED_GEOMETRY: Readonly<Record<EstimateModel, readonly GeometryField[]>> = {
  point: [],
  sphere: ['radiusM'],
  'dipole-axis': [],
  'dipole-broadside': [],
  'image-charge': ['heightAboveGroundM'],
  line: ['lengthM'],
  disk: ['radiusM'],
  rectangle: ['widthM', 'heightM'],
  sheet: [],
  'layer-on-ground': ['thicknessM', 'relativePermittivity'],
  conductor: ['capacitanceF'],
  'bulk-cylinder': ['radiusM'],
};
/** Models whose radius must be above zero (line allows 0: a thin line). */
const RADIUS_POSITIVE: readonly EstimateModel[] = ['sphere', 'disk', 'bulk-cylinder'];

export const EstimateRequestSchema = z.object({
  model: z.enum(ESTIMATE_MODELS, { error: `model must be one of ${ESTIMATE_MODELS.join(', ')}` })
    .describe('The idealised geometry the reading is interpreted with.'),
  fieldVPerM: finite('fieldVPerM').optional()
    .describe('Field at the meter, V/m, signed (polarity kept). Required for every model except conductor.'),
  potentialV: finite('potentialV').optional().describe("conductor only: the conductor's potential against earth, V (signed)."),
  distanceM: positive('distanceM').optional()
    .describe('m. From the meter to the charge for point, dipole-axis, dipole-broadside and image-charge; the gap from the meter to the surface for every other model. Not used by conductor.'),
  geometry: EstimateGeometrySchema.default({}),
  meterAccuracyRel: finite('meterAccuracyRel').refine((v) => v >= 0 && v < 1, 'meterAccuracyRel must be between 0 and 1').optional()
    .describe("The meter's relative accuracy as a standard uncertainty (default 0.05, common practice)."),
  distanceUncertaintyM: nonNegative('distanceUncertaintyM').optional()
    .describe('Standard uncertainty of distanceM, m (default: the larger of 5 mm and 10 % of the distance).'),
  geometryFactor: finite('geometryFactor').refine((v) => v >= 1 && v <= 2, 'geometryFactor must be between 1 and 2').optional()
    .describe('Meter geometry factor f (1 small probe .. 2 wide flat face, default 1); divides point-like estimates.'),
}).superRefine((req, ctx) => {
  const m = req.model;
  if (m === 'conductor') {
    if (req.potentialV === undefined) ctx.addIssue({ code: 'custom', path: ['potentialV'], message: 'potentialV is required for the conductor model' });
  } else {
    if (req.fieldVPerM === undefined) ctx.addIssue({ code: 'custom', path: ['fieldVPerM'], message: `fieldVPerM is required for the ${m} model` });
    if (req.distanceM === undefined) ctx.addIssue({ code: 'custom', path: ['distanceM'], message: `distanceM is required for the ${m} model` });
  }
  const g = req.geometry;
  for (const f of REQUIRED_GEOMETRY[m]) {
    if (g[f] === undefined) ctx.addIssue({ code: 'custom', path: ['geometry', f], message: `geometry.${f} is required for the ${m} model` });
  }
  if (RADIUS_POSITIVE.includes(m) && g.radiusM !== undefined && g.radiusM <= 0) {
    ctx.addIssue({ code: 'custom', path: ['geometry', 'radiusM'], message: `geometry.radiusM must be greater than zero for the ${m} model` });
  }
  if (m === 'dipole-axis' && g.separationM !== undefined && req.distanceM !== undefined && req.distanceM <= g.separationM / 2) {
    ctx.addIssue({ code: 'custom', path: ['distanceM'], message: 'distanceM must be greater than half of geometry.separationM for the dipole-axis model (the meter cannot sit between the poles)' });
  }
  if (m === 'line' && req.distanceM !== undefined && (g.radiusM ?? 0) + req.distanceM <= 0) {
    ctx.addIssue({ code: 'custom', path: ['distanceM'], message: 'distanceM must be greater than zero' });
  }
}).meta({ id: 'EstimateRequest', description: 'One reading interpreted with one model: POST /api/estimate body.' });
export type EstimateRequest = z.input<typeof EstimateRequestSchema>;
export type EstimateRequestParsed = z.output<typeof EstimateRequestSchema>;

const nullableNumber = z.number().nullable();
const interval = z.tuple([z.number(), z.number()]).nullable();

export const WarningSchema = z.object({
  code: z.string().describe('kebab-case code, e.g. not-far-field, meter-image, no-ground-behind-given'),
  message: z.string(),
}).meta({ id: 'EstimateWarning' });

const quantityShape = {
  chargeC: nullableNumber.describe('Charge, C (signed). Dipoles: the charge of each pole. image-charge: the real charge.'),
  surfaceChargeDensityCPerM2: nullableNumber.describe('Surface charge density, C/m^2.'),
  lineChargeDensityCPerM: nullableNumber.describe('Line charge density, C/m.'),
  dipoleMomentCM: nullableNumber.describe('Dipole moment, C m.'),
  spaceChargeDensityCPerM3: nullableNumber.describe('Space charge density, C/m^3.'),
  potentialV: nullableNumber.describe('Potential against earth, V.'),
  capacitanceF: nullableNumber.describe('Capacitance, F.'),
  energyJ: nullableNumber.describe('Stored energy, J.'),
};

export const EstimateResponseSchema = z.object({
  model: z.enum(ESTIMATE_MODELS),
  ...quantityShape,
  interval: z.object({
    chargeC: interval, surfaceChargeDensityCPerM2: interval, lineChargeDensityCPerM: interval, dipoleMomentCM: interval,
    spaceChargeDensityCPerM3: interval, potentialV: interval, capacitanceF: interval, energyJ: interval,
  }).describe('[low, high] for each quantity (low <= high also for negative values); null where the quantity is null.'),
  intervalMethod: z.string().describe('How the intervals were made.'),
  warnings: z.array(WarningSchema),
}).meta({ id: 'EstimateResponse', description: 'Equivalent charge quantities for an idealised geometry, with intervals and validity warnings.' });
export type EstimateResponse = z.infer<typeof EstimateResponseSchema>;

// ---------- sweep ----------
export const SweepReadingSchema = z.object({
  distanceM: positive('distanceM').describe("Gap from the meter to the object's surface, m."),
  fieldVPerM: finite('fieldVPerM').refine((v) => v !== 0, 'fieldVPerM must not be zero in a sweep (the fit works on log |E|)').describe('Field at the meter, V/m, signed.'),
}).meta({ id: 'SweepReading' });

export const SweepGeometrySchema = z.strictObject({
  radiusM: positive('geometry.radiusM').optional().describe('Sphere or disk radius, m (adds the sphere and disk models).'),
  lengthM: positive('geometry.lengthM').optional().describe('Line length, m (the line model uses the finite-line form).'),
  widthM: positive('geometry.widthM').optional().describe('Rectangle full width, m (with heightM adds the rectangle model).'),
  heightM: positive('geometry.heightM').optional().describe('Rectangle full height, m.'),
}, { error: (iss) => (iss.code === 'unrecognized_keys' ? `geometry has unknown field(s): ${iss.keys.join(', ')}` : 'geometry must be an object') })
  .meta({ id: 'SweepGeometry' });

export const SweepRequestSchema = z.object({
  readings: z.array(SweepReadingSchema, { error: 'readings must be a list of { distanceM, fieldVPerM }' })
    .min(3, 'a sweep needs at least 3 readings').max(200, 'at most 200 readings'),
  models: z.array(z.enum(SWEEP_MODELS, { error: `models must be among ${SWEEP_MODELS.join(', ')}` })).min(1, 'models must name at least one model').optional()
    .describe('Candidate models (default: all that the geometry allows).'),
  geometry: SweepGeometrySchema.default({}),
}).superRefine((req, ctx) => {
  const signs = new Set(req.readings.map((r) => Math.sign(r.fieldVPerM)));
  if (signs.size > 1) {
    const first = Math.sign(req.readings[0]?.fieldVPerM ?? 0);
    const i = req.readings.findIndex((r) => Math.sign(r.fieldVPerM) !== first);
    ctx.addIssue({ code: 'custom', path: ['readings', i, 'fieldVPerM'], message: 'all readings of a sweep must have the same polarity (one object, one sign)' });
  }
  if (req.readings.length >= 3 && new Set(req.readings.map((r) => r.distanceM)).size < 2) {
    ctx.addIssue({ code: 'custom', path: ['readings'], message: 'a sweep needs readings at two or more different distances' });
  }
  const g = req.geometry;
  const needs: Partial<Record<SweepModel, keyof typeof g>> = { sphere: 'radiusM', disk: 'radiusM', rectangle: 'widthM' };
  for (const m of req.models ?? []) {
    const f = needs[m];
    if (f !== undefined && g[f] === undefined) ctx.addIssue({ code: 'custom', path: ['geometry', f], message: `geometry.${f} is required for the ${m} model` });
    if (m === 'rectangle' && g.heightM === undefined) ctx.addIssue({ code: 'custom', path: ['geometry', 'heightM'], message: 'geometry.heightM is required for the rectangle model' });
  }
  if ((g.widthM === undefined) !== (g.heightM === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['geometry', g.widthM === undefined ? 'widthM' : 'heightM'], message: 'give both geometry.widthM and geometry.heightM for a rectangle' });
  }
}).meta({ id: 'SweepRequest', description: 'Readings of one object at three or more distances: POST /api/sweep body.' });
export type SweepRequest = z.input<typeof SweepRequestSchema>;

const fitParams = {
  amplitude: z.number().describe('The fitted main quantity, SI, signed: chargeC (point, sphere), lineChargeDensityCPerM (line), dipoleMomentCM (dipole), surfaceChargeDensityCPerM2 (sheet, disk, rectangle).'),
  amplitudeName: z.enum(['chargeC', 'lineChargeDensityCPerM', 'dipoleMomentCM', 'surfaceChargeDensityCPerM2']),
  offsetM: z.number().nullable().describe('Fitted or fixed depth of the charge centre behind the surface, m; null for models without one.'),
};

export const SweepModelFitSchema = z.object({
  model: z.enum(SWEEP_MODELS),
  ...fitParams,
  parameterCount: z.number().int().describe('Fitted parameters (amplitude and free offset), without the residual variance.'),
  offsetFitted: z.boolean(),
  geometry: z.object({ radiusM: z.number().optional(), lengthM: z.number().optional(), widthM: z.number().optional(), heightM: z.number().optional() }),
  rss: z.number().describe('Residual sum of squares of ln |E|.'),
  rmsLog: z.number().describe('Root mean square residual of ln |E|.'),
  aic: z.number(),
  aicc: z.number().nullable().describe('AICc; null when n <= K + 1 (K = parameters + 1 for the variance).'),
  deltaAicc: z.number().nullable().describe('Difference to the best model in the ranking criterion (AICc, or AIC when AICc is not defined for every model).'),
}).meta({ id: 'SweepModelFit' });

export const SweepResponseSchema = z.object({
  exponent: z.number().describe('Fall-off exponent m of |E| ~ d^-m from the log-log least squares fit (0 sheet, 1 long line, 2 point, 3 dipole).'),
  exponentStdErr: z.number(),
  rankedBy: z.enum(['aicc', 'aic']),
  best: z.object({
    model: z.enum(SWEEP_MODELS),
    chargeC: nullableNumber,
    chargeInterval: interval,
    depthM: nullableNumber.describe('Depth of the charge centre behind the surface, m (point, line, dipole).'),
    lineChargeDensityCPerM: nullableNumber,
    lineChargeDensityInterval: interval,
    dipoleMomentCM: nullableNumber,
    dipoleMomentInterval: interval,
    surfaceChargeDensityCPerM2: nullableNumber,
    surfaceChargeDensityInterval: interval,
    intervalMethod: z.string(),
    fit: SweepModelFitSchema,
  }),
  ranking: z.array(SweepModelFitSchema),
  residuals: z.array(z.object({ distanceM: z.number(), fieldVPerM: z.number(), fittedVPerM: z.number(), residualLog: z.number() })),
  conclusion: z.string(),
  warnings: z.array(WarningSchema),
}).meta({ id: 'SweepResponse' });
export type SweepResponse = z.infer<typeof SweepResponseSchema>;
export type SweepModelFit = z.infer<typeof SweepModelFitSchema>;
