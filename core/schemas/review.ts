/**
 * Schemas of issue 4's answers and requests: the spot trend, the weekly hot-spot
 * review, floor plans and pins, spot labels, and CSV export and import of readings.
 * Follow-ups are in follow-ups.ts, the whole-site JSON export in exchange.ts.
 *
 * Names: SI quantities carry their unit (fieldVPerM, chargeC); "abs" marks a
 * magnitude (|E|); RH is in per cent (rhPercent) and its differences in RH points.
 */
import { z } from 'zod';
import { DISTANCE_UNITS } from '../units/distance';
import { READING_UNITS } from '../units/field';
import { DistanceSchema, finite, Id, IsoDateTime, text } from './common';
import { FollowUpSchema } from './follow-ups';

const level = z.enum(['ok', 'warn', 'alarm']);

// ---------- spot trend ----------
export const TREND_RANGES = ['4w', '13w', '1y', 'all'] as const;
export type TrendRange = (typeof TREND_RANGES)[number];

export const TrendQuerySchema = z.object({
  range: z.enum(TREND_RANGES, { error: 'range must be 4w, 13w, 1y or all' }).optional(),
});

export const TrendPointSchema = z.object({
  readingId: z.string(),
  takenAt: z.string(),
  /** Normalized signed field at the meter, V/m. */
  fieldVPerM: z.number(),
  level,
  /** The reading's relative humidity, else its round's; null when neither was noted. */
  rhPercent: z.number().nullable(),
  /** Estimated charge with the spot's model, C (signed); null without a model or when none could be made. */
  chargeC: z.number().nullable(),
  /** Estimated surface charge density with the spot's model, C/m^2 (signed); null where the model defines none (the sheet and layer models give only this). */
  surfaceChargeDensityCPerM2: z.number().nullable(),
}).meta({ id: 'TrendPoint' });

export const NotEnoughDataSchema = z.object({
  status: z.literal('not-enough-data'),
  reason: z.string(),
  n: z.number().int(),
}).meta({ id: 'NotEnoughData' });

export const TrendStatsSchema = z.object({
  status: z.literal('ok'),
  /** Points the statistics used (one per local day: the median |field| of the day's readings). */
  n: z.number().int(),
  basis: z.string(),
  /** Theil–Sen slope of |field|, V/m per 7 days, and its interval at 1 - alpha. */
  slopeVPerMPerWeek: z.number(),
  slopeLowerVPerMPerWeek: z.number(),
  slopeUpperVPerMPerWeek: z.number(),
  /** Mann–Kendall two-sided p-value, Kendall's tau and the direction at alpha. */
  pValue: z.number(),
  tau: z.number(),
  alpha: z.number(),
  significant: z.boolean(),
  direction: z.enum(['increasing', 'decreasing', 'no trend']),
  /** e.g. "rising by 1.2 kV/m a week (p = 0.003)". */
  sentence: z.string(),
}).meta({ id: 'TrendStats' });

export const HumidityRelationSchema = z.union([
  z.object({
    status: z.literal('ok'),
    n: z.number().int(),
    slopeLog10PerRhPoint: z.number(),
    percentChangePerRhPoint: z.number(),
    pValue: z.number(),
    rSquared: z.number(),
    significant: z.boolean(),
    sentence: z.string(),
  }),
  NotEnoughDataSchema,
]).meta({ id: 'HumidityRelation' });

export const FieldBandsSchema = z.object({
  /** |field| warn and alarm levels, V/m, from the area's limit set (null where the set has none). */
  warnVPerM: z.number().nullable(),
  alarmVPerM: z.number().nullable(),
  source: z.string(),
}).meta({ id: 'FieldBands' });

export const SpotTrendSchema = z.object({
  spot: z.object({ id: z.string(), code: z.string(), name: z.string(), areaId: z.string(), areaName: z.string(), model: z.string().nullable() }),
  range: z.object({ key: z.enum(TREND_RANGES), from: z.string().nullable(), to: z.string() }),
  bands: FieldBandsSchema.nullable(),
  points: z.array(TrendPointSchema),
  trendSummary: z.union([TrendStatsSchema, NotEnoughDataSchema]),
  humidity: HumidityRelationSchema,
  counts: z.object({
    readings: z.number().int(), ok: z.number().int(), warn: z.number().int(), alarm: z.number().int(),
    withHumidity: z.number().int(), withCharge: z.number().int(), days: z.number().int(),
  }),
}).meta({ id: 'SpotTrend', description: "A spot's readings over a range with its limit bands, robust trend and humidity relation." });
export type SpotTrend = z.infer<typeof SpotTrendSchema>;

// ---------- weekly review ----------
export const ReviewQuerySchema = z.object({
  week: z.string({ error: 'week must be an ISO week like 2026-W09' }).regex(/^\d{4}-W\d{2}$/, 'week must be an ISO week like 2026-W09').optional(),
});

export const ReviewWeekSchema = z.object({
  isoWeek: z.string(),
  startMs: z.number(),
  endMs: z.number(),
  /** The same instants as ISO 8601 UTC. */
  start: z.string(),
  end: z.string(),
  label: z.string(),
  timeZone: z.string(),
}).meta({ id: 'ReviewWeek' });

export const ReviewTrendSchema = z.object({
  weeks: z.number().int(),
  status: z.enum(['ok', 'not-enough-data']),
  direction: z.enum(['increasing', 'decreasing', 'no trend']).nullable(),
  pValue: z.number().nullable(),
  slopeVPerMPerWeek: z.number().nullable(),
  /** e.g. "rising (p = 0.004)" or the reason there is no trend. */
  text: z.string(),
}).meta({ id: 'ReviewTrend' });

export const ReviewSpotSchema = z.object({
  rank: z.number().int(),
  spotId: z.string(),
  code: z.string(),
  name: z.string(),
  areaId: z.string(),
  areaName: z.string(),
  readings: z.number().int(),
  worstAbsFieldVPerM: z.number(),
  medianAbsFieldVPerM: z.number(),
  worstLevel: level,
  /** The highest ratio of any checked metric to its alarm level (null when no rule has an alarm level). */
  worstRatioToAlarm: z.number().nullable(),
  /** Why the worst reading was judged as it was. */
  worstReason: z.string(),
  exceedances: z.object({ warn: z.number().int(), alarm: z.number().int() }),
  change: z.object({
    basis: z.literal('ratio of weekly medians of |field|'),
    previousMedianAbsFieldVPerM: z.number(),
    ratio: z.number(),
    text: z.string(),
  }).nullable(),
  trend: ReviewTrendSchema,
  humidity: z.object({
    weekMedianRhPercent: z.number().nullable(),
    siteUsualRhPercent: z.number().nullable(),
    differencePoints: z.number().nullable(),
  }),
  openFollowUps: z.array(FollowUpSchema),
  /** Display text, e.g. "52.3 kV/m". */
  worstText: z.string(),
  medianText: z.string(),
}).meta({ id: 'ReviewSpot' });

export const NotMeasuredSpotSchema = z.object({
  spotId: z.string(),
  code: z.string(),
  name: z.string(),
  areaName: z.string(),
  /** Rounds of the week that planned the spot (0: no round planned it; it is due as an active spot on the route). */
  plannedInRounds: z.number().int(),
  skipped: z.array(z.object({ reason: z.string(), at: z.string() })),
  openFollowUps: z.number().int(),
}).meta({ id: 'NotMeasuredSpot' });

export const WeeklyReviewSchema = z.object({
  site: z.object({ id: z.string(), name: z.string(), timeZone: z.string() }),
  week: ReviewWeekSchema,
  generatedAt: z.string(),
  /** Plain sentences, e.g. "3 spots in alarm, 2 of them in Hall C: film converting." */
  summary: z.string(),
  summarySentences: z.array(z.string()),
  spots: z.array(ReviewSpotSchema),
  notMeasured: z.array(NotMeasuredSpotSchema),
  humidity: z.object({
    weekMedianRhPercent: z.number().nullable(),
    /** Median of the weekly medians of the 13 weeks before. */
    usualMedianRhPercent: z.number().nullable(),
    differencePoints: z.number().nullable(),
    usualWeeks: z.number().int(),
    sentence: z.string(),
  }),
  counts: z.object({
    rounds: z.number().int(), readings: z.number().int(), spotsMeasured: z.number().int(), spotsDue: z.number().int(),
    spotsInAlarm: z.number().int(), spotsInWarn: z.number().int(), openFollowUps: z.number().int(), overdueFollowUps: z.number().int(),
  }),
  openFollowUps: z.array(FollowUpSchema),
  caution: z.string(),
}).meta({ id: 'WeeklyReview', description: 'The weekly hot-spot review of a site: ranked spots, spots due but not measured, humidity, follow-ups.' });
export type WeeklyReview = z.infer<typeof WeeklyReviewSchema>;
export type ReviewSpot = z.infer<typeof ReviewSpotSchema>;

// ---------- floor plans ----------
export const PlanInfoSchema = z.object({
  areaId: z.string(),
  contentType: z.enum(['image/png', 'image/jpeg', 'image/svg+xml']),
  bytes: z.number().int(),
  width: z.number().nullable(),
  height: z.number().nullable(),
  sha256: z.string(),
  uploadedAt: z.string(),
}).meta({ id: 'PlanInfo' });
export type PlanInfo = z.infer<typeof PlanInfoSchema>;

export const PlanUploadSchema = PlanInfoSchema.safeExtend({
  /** What sanitizing an SVG removed, in plain words (empty for PNG and JPEG). */
  removed: z.array(z.string()),
}).meta({ id: 'PlanUpload' });

const fraction = (what: string) => finite(what).refine((v) => v >= 0 && v <= 1, `${what} must be between 0 and 1 (a fraction of the plan)`);

export const SpotPositionInputSchema = z.object({
  /** From the plan's left edge, 0..1; null (with y null) unplaces the spot. */
  x: fraction('x').nullable(),
  /** From the plan's top edge, 0..1. */
  y: fraction('y').nullable(),
}).superRefine((p, ctx) => {
  if ((p.x === null) !== (p.y === null)) ctx.addIssue({ code: 'custom', path: [p.x === null ? 'x' : 'y'], message: 'give both x and y, or both null to unplace the spot' });
}).meta({ id: 'SpotPositionInput' });

export const SpotPositionSchema = z.object({
  spotId: z.string(),
  areaId: z.string(),
  /** null when the spot is not placed on its area's plan. */
  position: z.object({ x: z.number(), y: z.number() }).nullable(),
}).meta({ id: 'SpotPosition' });
export type SpotPosition = z.infer<typeof SpotPositionSchema>;

export const PinSchema = z.object({
  spotId: z.string(),
  code: z.string(),
  name: z.string(),
  position: z.object({ x: z.number(), y: z.number() }).nullable(),
  /** Latest current reading's verdict; null when the spot has no reading. */
  latest: z.object({ readingId: z.string(), takenAt: z.string(), level, fieldVPerM: z.number() }).nullable(),
  /** Status in words, never colour alone: "Alarm", "Warn", "OK", "No reading". */
  label: z.string(),
  /** e.g. "C-05 · Alarm · 52.3 kV/m". */
  text: z.string(),
}).meta({ id: 'Pin' });
export type Pin = z.infer<typeof PinSchema>;

export const PinListSchema = z.object({
  areaId: z.string(),
  plan: PlanInfoSchema.nullable(),
  pins: z.array(PinSchema),
}).meta({ id: 'PinList' });

export const PlanDeletedSchema = z.object({ areaId: z.string(), deleted: z.boolean() }).meta({ id: 'PlanDeleted' });

// ---------- labels ----------
export const LabelsQuerySchema = z.object({
  /** Absolute address the labels point to, e.g. https://chargewalk.plant.example (default: the address of this request). */
  base: z.url({ protocol: /^https?$/, error: 'base must be an http(s) address like https://chargewalk.example' }).optional(),
});

export const LabelSchema = z.object({
  spotId: z.string(),
  code: z.string(),
  name: z.string(),
  areaName: z.string(),
  /** The app path that opens the spot in the current round. */
  path: z.string(),
  /** The same as an absolute address: what the QR code holds. */
  url: z.string(),
  /** The QR code as an SVG document. */
  qrSvg: z.string(),
}).meta({ id: 'Label' });
export const LabelListSchema = z.object({ labels: z.array(LabelSchema) }).meta({ id: 'LabelList' });

export const SpotByCodeQuerySchema = z.object({
  siteId: Id,
});

// ---------- readings CSV export ----------
const dateOrDateTime = z.union([z.iso.date(), IsoDateTime], { error: 'must be a date (YYYY-MM-DD, the site\'s calendar) or a date and time with offset' });
export const ReadingsCsvQuerySchema = z.object({
  from: dateOrDateTime.optional(),
  to: dateOrDateTime.optional(),
});

// ---------- readings CSV import ----------
export const IMPORT_FIELDS = [
  'spot', 'takenAt', 'value', 'unit', 'polarity', 'distance', 'distanceUnit', 'rhPercent', 'temperatureC', 'meter', 'surveyor', 'note', 'zeroed',
] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];

const column = z.union([
  z.number().int('a column index is a whole number (0 is the first column)').min(0, 'a column index is 0 or more').max(1000),
  z.string().trim().min(1, 'a column header must not be empty').max(200),
], { error: 'map each field to a column index (0 is the first) or a header text' });

export const ReadingImportSchema = z.object({
  csv: z.string({ error: 'csv must be the file\'s text' }).min(1, 'the CSV text is empty').max(20_000_000, 'the CSV text is larger than 20 MB: split the file'),
  /** One character; default: comma, or semicolon when the first line has more semicolons than commas. */
  delimiter: z.string().length(1, 'delimiter must be one character').optional(),
  /** The first line holds column headers (default true). */
  header: z.boolean().default(true),
  mapping: z.partialRecord(z.enum(IMPORT_FIELDS, { error: `mapping keys must be among ${IMPORT_FIELDS.join(', ')}` }), column)
    .refine((m) => m.spot !== undefined, { message: 'map the spot column (its code or name)', path: ['spot'] })
    .refine((m) => m.takenAt !== undefined, { message: 'map the column with the time of the reading', path: ['takenAt'] })
    .refine((m) => m.value !== undefined, { message: 'map the column with the value', path: ['value'] }),
  defaults: z.object({
    meterId: Id.optional(),
    unit: z.enum(READING_UNITS, { error: `unit must be one of ${READING_UNITS.join(', ')}` }).optional(),
    distance: DistanceSchema.optional(),
    surveyor: text('surveyor', 120).optional(),
    /** Whether the meter was zeroed, when the file does not say (default true). */
    zeroed: z.boolean().optional(),
  }).default({}),
  /** Import the valid rows and leave the invalid ones out (default: any invalid row stops the import). */
  skipInvalid: z.boolean().default(false),
}).meta({ id: 'ReadingImport', description: `CSV import of readings. Times without an offset are the site's local time. Distance units: ${DISTANCE_UNITS.join(', ')}.` });
export type ReadingImport = z.infer<typeof ReadingImportSchema>;

export const ImportProblemSchema = z.object({
  /** 1-based line number in the file where the row starts. */
  row: z.number().int(),
  field: z.string(),
  reason: z.string(),
}).meta({ id: 'ImportProblem' });
export type ImportProblem = z.infer<typeof ImportProblemSchema>;

export const ImportSampleSchema = z.object({
  row: z.number().int(),
  spotCode: z.string(),
  takenAt: z.string(),
  value: z.number(),
  unit: z.string(),
  polarity: z.enum(['+', '-']),
  fieldVPerM: z.number(),
  distance: DistanceSchema,
  rhPercent: z.number().nullable(),
  surveyor: z.string(),
  readingId: z.string(),
});

export const ImportPreviewSchema = z.object({
  rows: z.number().int(),
  valid: z.number().int(),
  invalid: z.array(ImportProblemSchema),
  /** Valid rows already stored by an earlier import of the same content. */
  alreadyImported: z.number().int(),
  /** Import rounds the rows fall into (one per local day and surveyor). */
  rounds: z.number().int(),
  columns: z.array(z.string()),
  sample: z.array(ImportSampleSchema),
}).meta({ id: 'ImportPreview' });
export type ImportPreview = z.infer<typeof ImportPreviewSchema>;

export const ImportResultSchema = z.object({
  rows: z.number().int(),
  valid: z.number().int(),
  invalid: z.array(ImportProblemSchema),
  stored: z.number().int(),
  duplicates: z.number().int(),
  conflicts: z.number().int(),
  rounds: z.number().int(),
}).meta({ id: 'ImportResult' });
export type ImportResult = z.infer<typeof ImportResultSchema>;
