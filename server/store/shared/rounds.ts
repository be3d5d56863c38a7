/** rounds and round_skips: what both store implementations share (row shapes and mapping). */
import type { Reading, Round, RoundSummary, Skip } from '../../../core/schemas';

export interface RoundRow {
  id: string;
  site_id: string;
  surveyor: string;
  started_at: string;
  ended_at: string | null;
  rh_percent: number | null;
  temperature_c: number | null;
  notes: string;
  planned_spot_ids: string;
  content_hash: string;
  created_at: string;
}

export interface SkipRow { id: string; round_id: string; spot_id: string; reason: string; at: string; created_at: string }

export function roundFromRow(r: RoundRow): Round {
  return {
    id: r.id, siteId: r.site_id, surveyor: r.surveyor, startedAt: r.started_at, endedAt: r.ended_at,
    rhPercent: r.rh_percent, temperatureC: r.temperature_c, notes: r.notes,
    plannedSpotIds: JSON.parse(r.planned_spot_ids) as string[], createdAt: r.created_at,
  };
}

export function skipFromRow(r: SkipRow): Skip {
  return { id: r.id, roundId: r.round_id, spotId: r.spot_id, reason: r.reason, at: r.at, createdAt: r.created_at };
}

/** The round's counts from its current, not deleted readings and its skips (see roundSummary). */
export function summarizeRound(round: Round, readings: Reading[], skips: Skip[]): RoundSummary {
  const measured = new Set(readings.map((r) => r.spotId));
  const skipped = new Set(skips.map((s) => s.spotId));
  return {
    round,
    readings: readings.length,
    spotsMeasured: measured.size,
    planned: round.plannedSpotIds.length,
    warnings: readings.filter((r) => r.verdict.level === 'warn').length,
    alarms: readings.filter((r) => r.verdict.level === 'alarm').length,
    skipped: skips.map(({ createdAt: _c, ...s }) => s),
    notMeasured: round.plannedSpotIds.filter((sid) => !measured.has(sid) && !skipped.has(sid)),
  };
}
