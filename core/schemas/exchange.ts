/**
 * The whole-site JSON export (GET /api/sites/:id/export.json) and what
 * POST /api/import/site.json accepts: set-up, rounds, skips, every reading
 * revision with its history, tombstones, kept conflicts, follow-ups with their
 * events, floor plans and spot positions. Stored inputs only: everything derived
 * (normalized field, verdicts, estimates) is recomputed after an import.
 */
import { z } from 'zod';
import { ReadingConflictSchema, SkipSchema } from './api';
import { Id, IdV7, IsoDate, IsoDateTime } from './common';
import { ReadingInputSchema } from './domain';
import { AreaSchema, LimitSetSchema, MeterSchema, RoundSchema, SiteSchema, SpotSchema } from './entities';
import { FollowUpEventSchema, FollowUpSchema } from './follow-ups';

export const SITE_EXPORT_FORMAT = 'chargewalk-site-export';
export const SITE_EXPORT_VERSION = 1;

/** One stored revision of a reading: its input as stored plus what the server kept beside it. */
export const StoredReadingSchema = ReadingInputSchema.safeExtend({
  receivedAt: IsoDateTime,
  supersedesId: IdV7.nullable(),
  correctionReason: z.string().min(1).max(500).nullable(),
  flags: z.array(z.object({ code: z.string().max(100), message: z.string().max(2000) })),
  /** The meter's calibrated distance and due date when the reading arrived. */
  meterCalibratedDistanceM: z.number().positive().nullable(),
  meterCalibrationDue: IsoDate,
}).meta({ id: 'StoredReading' });
export type StoredReadingExport = z.infer<typeof StoredReadingSchema>;

export const SiteExportSchema = z.object({
  format: z.literal(SITE_EXPORT_FORMAT, { error: `format must be '${SITE_EXPORT_FORMAT}'` }),
  version: z.literal(SITE_EXPORT_VERSION, { error: `version must be ${SITE_EXPORT_VERSION}` }),
  exportedAt: z.string(),
  site: SiteSchema.safeExtend({ id: Id }),
  limitSets: z.array(LimitSetSchema.safeExtend({ id: Id })),
  areas: z.array(AreaSchema.safeExtend({ id: Id })),
  spots: z.array(SpotSchema.safeExtend({ id: Id })),
  meters: z.array(MeterSchema.safeExtend({ id: Id })),
  rounds: z.array(RoundSchema),
  skips: z.array(SkipSchema),
  readings: z.array(StoredReadingSchema),
  tombstones: z.array(z.object({ readingId: Id, reason: z.string().min(1).max(500), at: IsoDateTime })),
  conflicts: z.array(ReadingConflictSchema.safeExtend({ id: Id, readingId: Id })),
  followUps: z.array(FollowUpSchema.safeExtend({ id: Id, spotId: Id })),
  followUpEvents: z.array(FollowUpEventSchema.safeExtend({ id: Id, followUpId: Id })),
  plans: z.array(z.object({
    areaId: Id,
    contentType: z.enum(['image/png', 'image/jpeg', 'image/svg+xml']),
    width: z.number().nullable(),
    height: z.number().nullable(),
    sha256: z.string(),
    uploadedAt: z.string(),
    base64: z.base64({ error: 'plan images are base64 text' }),
  })),
  positions: z.array(z.object({ spotId: Id, areaId: Id, x: z.number().min(0).max(1), y: z.number().min(0).max(1), updatedAt: z.string() })),
}).meta({ id: 'SiteExport', description: 'A whole site: set-up, rounds, skips, readings with their history, tombstones, conflicts, follow-ups, plans.' });
export type SiteExport = z.infer<typeof SiteExportSchema>;

export const SiteImportResultSchema = z.object({
  siteId: z.string(),
  counts: z.record(z.string(), z.number().int()),
}).meta({ id: 'SiteImportResult' });
export type SiteImportResult = z.infer<typeof SiteImportResultSchema>;
