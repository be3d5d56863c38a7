/**
 * The Reading entity (core/schemas/entities.ts) from a stored revision: stored
 * inputs plus the derived values core/readings/derive.ts computes from them.
 * Backend-independent: every store maps its rows to StoredReading and calls this,
 * so an answer never depends on which database kept the reading.
 */
import type { LimitRule } from '../../core/limits/evaluate';
import { deriveReading, type AreaHazardContext, type SpotEstimateContext } from '../../core/readings/derive';
import type { Reading, ReadingInput } from '../../core/schemas';

/**
 * Version of the derived cache kept beside the inputs (readings.field_v_per_m).
 * Bump it when the normalization in core/ changes, so stale cache rows can be found.
 */
export const DERIVE_VERSION = 1;

export interface ReadingFlag {
  code: string;
  message: string;
}

export interface StoredReading {
  /** The input as stored (times in UTC). */
  input: ReadingInput;
  receivedAt: string;
  supersedesId: string | null;
  supersededById: string | null;
  correctionReason: string | null;
  deleted: { reason: string; at: string } | null;
  flags: ReadingFlag[];
  /** The meter's calibrated distance and due date when the reading arrived. */
  meterCalibratedDistanceM: number | null;
  meterCalibrationDue: string;
}

export interface ReadingContext {
  /** Rules of the limit set of the spot's area (none when the area has no limit set). */
  rules: readonly LimitRule[];
  /** The spot's material class (person readings also give a body voltage). */
  materialClass: string;
  /** The spot's estimation model and geometry: with a model the reading gets a charge estimate. */
  spot?: SpotEstimateContext | null;
  /** The spot's area: gives the hazard verdicts. */
  area?: AreaHazardContext | null;
  /** The meter's current accuracy and geometry factor (the estimate's interval and point-like models). */
  meter?: { accuracyRel: number | null; geometryFactor: number | null } | null;
}

export function toReadingEntity(stored: StoredReading, ctx: ReadingContext): Reading {
  const meter = {
    calibratedDistanceM: stored.meterCalibratedDistanceM, calibrationDue: stored.meterCalibrationDue,
    accuracyRel: ctx.meter?.accuracyRel ?? null, geometryFactor: ctx.meter?.geometryFactor ?? null,
  };
  const d = deriveReading(stored.input, meter, ctx.rules, { materialClass: ctx.materialClass, spot: ctx.spot ?? null, area: ctx.area ?? null });
  return {
    ...stored.input,
    receivedAt: stored.receivedAt,
    fieldVPerM: d.fieldVPerM,
    distanceM: d.distanceM,
    supersedesId: stored.supersedesId,
    supersededById: stored.supersededById,
    correctionReason: stored.correctionReason,
    deleted: stored.deleted,
    flags: stored.flags,
    meterCalibrationOverdue: d.meterCalibrationOverdue,
    verdict: d.verdict,
    estimate: d.estimate,
    estimateNote: d.estimateNote,
    hazards: d.hazards,
  };
}
