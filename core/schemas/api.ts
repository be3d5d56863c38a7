/**
 * Envelopes of the API's list and status answers, and the small request bodies
 * that have no entity of their own. Entities themselves live in entities.ts.
 */
import { z } from 'zod';
import { requiredText } from './common';
import { LimitRuleSchema, ReadingInputSchema, SkipInputSchema } from './domain';
import {
  AreaSchema, ReadingAckSchema, ReadingSchema, RoundSchema, SiteSchema, SpotSchema,
} from './entities';

export const RetireInputSchema = z.object({
  reason: requiredText('reason', 500),
}).meta({ id: 'RetireInput' });

/** GET /api/spots/:id/readings?history=1&limit=100 */
export const ReadingListQuerySchema = z.object({
  history: z.enum(['0', '1', 'true', 'false'], { error: 'history must be 0 or 1' }).optional(),
  limit: z.string({ error: 'limit must be a whole number' }).regex(/^\d{1,6}$/, 'limit must be a whole number')
    .transform(Number).pipe(z.number().int().min(1, 'limit must be at least 1').max(1000, 'limit must be at most 1000'))
    .optional(),
});

export const HealthSchema = z.object({
  status: z.enum(['ok', 'degraded']),
  database: z.object({
    kind: z.string(),
    ok: z.boolean(),
    schemaVersion: z.number().int(),
    /** Result of the quick_check run at start-up ('ok' or the first problems found). */
    quickCheck: z.string(),
  }),
}).meta({ id: 'Health' });
export type Health = z.infer<typeof HealthSchema>;

export const SkipSchema = SkipInputSchema.safeExtend({ createdAt: z.string() }).meta({ id: 'Skip' });
export type Skip = z.infer<typeof SkipSchema>;

/** A resent reading whose content differed from the stored one: kept for review, never applied. */
export const ReadingConflictSchema = z.object({
  id: z.string(),
  readingId: z.string(),
  payload: ReadingInputSchema,
  receivedAt: z.string(),
}).meta({ id: 'ReadingConflict' });
export type ReadingConflict = z.infer<typeof ReadingConflictSchema>;

export const SiteListSchema = z.object({ sites: z.array(SiteSchema) }).meta({ id: 'SiteList' });
export const RoundListSchema = z.object({ rounds: z.array(RoundSchema) }).meta({ id: 'RoundList' });
export const SpotListSchema = z.object({ spots: z.array(SpotSchema) }).meta({ id: 'SpotList' });
export const AreaListSchema = z.object({ areas: z.array(AreaSchema) }).meta({ id: 'AreaList' });
export const ReadingListSchema = z.object({ readings: z.array(ReadingSchema) }).meta({ id: 'ReadingList' });
export const ReadingAcksSchema = z.object({ acks: z.array(ReadingAckSchema) }).meta({ id: 'ReadingAcks' });
export const ReadingWithHistorySchema = z.object({
  reading: ReadingSchema,
  /** Every revision of this reading, oldest first (the original, its corrections; deleted ones too). */
  history: z.array(ReadingSchema),
}).meta({ id: 'ReadingWithHistory' });
export const ConflictListSchema = z.object({ conflicts: z.array(ReadingConflictSchema) }).meta({ id: 'ConflictList' });

/** A starter limit set (core/hazard/templates.ts); every rule names its source. */
export const LimitTemplateSchema = z.object({
  id: z.string(),
  kind: z.enum(['epa', 'hazardous', 'dust', 'general']),
  name: z.string(),
  description: z.string(),
  zone: z.number().int().nullable(),
  gasGroup: z.enum(['IIA', 'IIB', 'IIC']).nullable(),
  rules: z.array(LimitRuleSchema),
}).meta({ id: 'LimitTemplate' });
export const LimitTemplateListSchema = z.object({ templates: z.array(LimitTemplateSchema) }).meta({ id: 'LimitTemplateList' });
