/**
 * Shapes the API answers with: stored inputs plus server-kept fields and derived
 * values. Inputs are validated by domain.ts; these document responses (OpenAPI)
 * and type the client.
 */
import { z } from 'zod';
import { LimitMetricSchema } from './domain';
import { EstimateResponseSchema } from './estimate';
import { EstimateNoteSchema, HazardVerdictSchema } from './hazard';
import { FollowUpSchema } from './follow-ups';
import {
  AreaInputSchema, LimitSetInputSchema, MeterInputSchema, ReadingInputSchema,
  RoundInputSchema, SiteInputSchema, SkipInputSchema, SpotInputSchema,
} from './domain';

const withId = { id: z.string() };
const timestamps = { createdAt: z.string(), updatedAt: z.string() };

export const SiteSchema = SiteInputSchema.safeExtend({ ...withId, ...timestamps }).meta({ id: 'Site' });
export const LimitSetSchema = LimitSetInputSchema.safeExtend({ ...withId, ...timestamps }).meta({ id: 'LimitSet' });
export const AreaSchema = AreaInputSchema.safeExtend({ ...withId, ...timestamps }).meta({ id: 'Area' });
export const SpotSchema = SpotInputSchema.safeExtend({
  ...withId, ...timestamps,
  /** Set when the spot was retired: readings stay, the route skips it. */
  retiredAt: z.string().nullable(),
  retiredReason: z.string().nullable(),
}).meta({ id: 'Spot' });
export const MeterSchema = MeterInputSchema.safeExtend({ ...withId, ...timestamps }).meta({ id: 'Meter' });

export const MetricCheckSchema = z.object({
  metric: LimitMetricSchema,
  level: z.enum(['ok', 'warn', 'alarm']),
  value: z.number(),
  limit: z.number().nullable(),
  ratioToAlarm: z.number().nullable(),
  source: z.string(),
  reason: z.string(),
}).meta({ id: 'MetricCheck' });

export const LimitVerdictSchema = z.object({
  level: z.enum(['ok', 'warn', 'alarm']),
  decidedBy: MetricCheckSchema.nullable(),
  checks: z.array(MetricCheckSchema),
  reason: z.string(),
}).meta({ id: 'LimitVerdict' });

/** A stored reading revision with its derived values (recomputed from the stored inputs). */
export const ReadingSchema = ReadingInputSchema.safeExtend({
  receivedAt: z.string(),
  /** Normalized signed field at the meter, V/m. */
  fieldVPerM: z.number(),
  distanceM: z.number(),
  /** The revision this one corrects, or null for an original reading. */
  supersedesId: z.string().nullable(),
  /** The revision that corrects this one, or null when this is the current revision. */
  supersededById: z.string().nullable(),
  correctionReason: z.string().nullable(),
  deleted: z.object({ reason: z.string(), at: z.string() }).nullable(),
  /** Set-up problems found when the reading arrived (spot removed or retired while offline, meter unknown ...). */
  flags: z.array(z.object({ code: z.string(), message: z.string() })),
  meterCalibrationOverdue: z.boolean(),
  verdict: LimitVerdictSchema,
  /** The charge estimate with the spot's model (null: no model, or none possible; see estimateNote). */
  estimate: EstimateResponseSchema.nullable().optional(),
  /** Why there is no estimate, or what the hazard checks assumed. */
  estimateNote: EstimateNoteSchema.nullable().optional(),
  /** Hazard verdicts for the spot's area (core/hazard), each with its source and caution. */
  hazards: z.array(HazardVerdictSchema).optional(),
}).meta({ id: 'Reading' });
export type Reading = z.infer<typeof ReadingSchema>;

export const ReadingAckSchema = z.object({
  id: z.string(),
  status: z.enum(['stored', 'duplicate', 'conflict']),
  message: z.string().optional(),
  reading: ReadingSchema.optional(),
}).meta({ id: 'ReadingAck', description: 'stored: newly committed; duplicate: the same reading was already stored (harmless retry); conflict: same id with different content, kept for review, not applied.' });

export const RoundSchema = RoundInputSchema.safeExtend({
  plannedSpotIds: z.array(z.string()),
  endedAt: z.string().nullable(),
  createdAt: z.string(),
}).meta({ id: 'Round' });

export const RoundSummarySchema = z.object({
  round: RoundSchema,
  readings: z.number().int(),
  spotsMeasured: z.number().int(),
  planned: z.number().int(),
  warnings: z.number().int(),
  alarms: z.number().int(),
  skipped: z.array(SkipInputSchema),
  notMeasured: z.array(z.string()),
}).meta({ id: 'RoundSummary' });

export const SetupBundleSchema = z.object({
  site: SiteSchema,
  areas: z.array(AreaSchema),
  spots: z.array(SpotSchema),
  meters: z.array(MeterSchema),
  limitSets: z.array(LimitSetSchema),
  /** Open follow-ups, so the round screen shows them at their spot offline too (the server always sends the list). */
  followUps: z.array(FollowUpSchema).optional(),
}).meta({ id: 'SetupBundle', description: 'Everything a tablet needs to walk the site offline.' });

export type Site = z.infer<typeof SiteSchema>;
export type LimitSet = z.infer<typeof LimitSetSchema>;
export type Area = z.infer<typeof AreaSchema>;
export type Spot = z.infer<typeof SpotSchema>;
export type Meter = z.infer<typeof MeterSchema>;
export type Round = z.infer<typeof RoundSchema>;
export type RoundSummary = z.infer<typeof RoundSummarySchema>;
export type SetupBundle = z.infer<typeof SetupBundleSchema>;
export type ReadingAck = z.infer<typeof ReadingAckSchema>;
