/** rounds and round_skips: one walkaround, its planned spots, and the spots skipped with a reason. */
import type { Round, RoundInput, RoundSummary, Skip, SkipInput } from '../../../../core/schemas';
import { contentHash, toUtcIso } from '../../canonical';
import { conflict, invalid, notFound } from '../../errors';
import type { RoundFinishInput } from '../../store';
import { stmt, type Db } from '../db';
import { roundFromRow, skipFromRow, summarizeRound, type RoundRow, type SkipRow } from '../../shared/rounds';
import { listRoundReadings } from './readings';
import { requireSite } from './sites';
import { activeSpotIds } from './spots';

function getRoundRow(db: Db, id: string): RoundRow | undefined {
  return stmt(db, 'SELECT * FROM rounds WHERE id = ?').get(id) as RoundRow | undefined;
}

export function getRound(db: Db, id: string): Round | null {
  const r = getRoundRow(db, id);
  return r ? roundFromRow(r) : null;
}

export function listRounds(db: Db, siteId: string): Round[] {
  return (stmt(db, 'SELECT * FROM rounds WHERE site_id = ? ORDER BY started_at DESC, id DESC').all(siteId) as RoundRow[]).map(roundFromRow);
}

/** Inserts a round made by the tablet; an identical retry answers created false, other content with the same id is a conflict. */
export function insertRound(db: Db, raw: RoundInput, now: string): { round: Round; created: boolean } {
  const input: RoundInput = { ...raw, startedAt: toUtcIso(raw.startedAt) };
  const hash = contentHash(input);
  const existing = getRoundRow(db, input.id);
  if (existing) {
    if (existing.content_hash === hash) return { round: roundFromRow(existing), created: false };
    throw conflict(`a different round with id ${input.id} is already stored`, ['id']);
  }
  requireSite(db, input.siteId);
  let planned: string[];
  if (input.plannedSpotIds === undefined) {
    planned = activeSpotIds(db, input.siteId);
  } else {
    const seen = new Set<string>();
    input.plannedSpotIds.forEach((sid, i) => {
      if (seen.has(sid)) throw invalid(`spot ${sid} is planned twice`, ['plannedSpotIds', i]);
      seen.add(sid);
      const r = stmt(db, 'SELECT site_id FROM spots WHERE id = ?').get(sid) as { site_id: string } | undefined;
      if (!r) throw notFound(`no spot with id ${sid}`, ['plannedSpotIds', i]);
      if (r.site_id !== input.siteId) throw invalid('this spot belongs to another site', ['plannedSpotIds', i]);
    });
    planned = input.plannedSpotIds;
  }
  stmt(db, `INSERT INTO rounds (id, site_id, surveyor, started_at, ended_at, rh_percent, temperature_c, notes, planned_spot_ids,
              content_hash, created_at) VALUES (?, ?, ?, ?, NULL, ?, ?, ?, ?, ?, ?)`)
    .run(input.id, input.siteId, input.surveyor, input.startedAt, input.rhPercent, input.temperatureC, input.notes,
      JSON.stringify(planned), hash, now);
  return { round: getRound(db, input.id)!, created: true };
}

export function listSkips(db: Db, roundId: string): Skip[] {
  return (stmt(db, 'SELECT * FROM round_skips WHERE round_id = ? ORDER BY at, id').all(roundId) as SkipRow[]).map(skipFromRow);
}

/**
 * The round with its counts, all over current revisions that are not deleted:
 * readings, distinct spots measured, warnings and alarms (verdicts recomputed by
 * core/), skips with reasons, and planned spots neither measured nor skipped.
 */
export function roundSummary(db: Db, id: string): RoundSummary | null {
  const round = getRound(db, id);
  if (!round) return null;
  const readings = listRoundReadings(db, id);
  const skips = listSkips(db, id);
  return summarizeRound(round, readings, skips);
}

/** Sets the end of a round; finishing again with the same end is harmless, with another end a conflict. */
export function finishRound(db: Db, id: string, finish: RoundFinishInput): void {
  const row = getRoundRow(db, id);
  if (!row) throw notFound(`no round with id ${id}`, ['id']);
  const endedAt = toUtcIso(finish.endedAt);
  if (endedAt < row.started_at) throw invalid('the end of a round must not be before its start', ['endedAt']);
  if (row.ended_at !== null && row.ended_at !== endedAt) {
    throw conflict(`this round was already finished at ${row.ended_at}`, ['endedAt']);
  }
  stmt(db, 'UPDATE rounds SET ended_at = ?, notes = ? WHERE id = ?').run(endedAt, finish.notes ?? row.notes, id);
}

/** Records a skipped spot; an identical retry answers created false, other content with the same id is a conflict. */
export function insertSkip(db: Db, roundId: string, raw: SkipInput, now: string): { skip: Skip; created: boolean } {
  const input: SkipInput = { ...raw, at: toUtcIso(raw.at) };
  if (input.roundId !== roundId) throw invalid('the round id in the body differs from the round in the path', ['roundId']);
  const round = getRoundRow(db, roundId);
  if (!round) throw notFound(`no round with id ${roundId}`, ['id']);
  const existing = stmt(db, 'SELECT * FROM round_skips WHERE id = ?').get(input.id) as SkipRow | undefined;
  if (existing) {
    const same = existing.round_id === input.roundId && existing.spot_id === input.spotId && existing.reason === input.reason && existing.at === input.at;
    if (same) return { skip: skipFromRow(existing), created: false };
    throw conflict(`a different skip with id ${input.id} is already stored`, ['id']);
  }
  const spot = stmt(db, 'SELECT site_id FROM spots WHERE id = ?').get(input.spotId) as { site_id: string } | undefined;
  if (!spot) throw notFound(`no spot with id ${input.spotId}`, ['spotId']);
  if (spot.site_id !== round.site_id) throw invalid('the spot belongs to another site than the round', ['spotId']);
  stmt(db, 'INSERT INTO round_skips (id, round_id, spot_id, reason, at, created_at) VALUES (?, ?, ?, ?, ?, ?)')
    .run(input.id, roundId, input.spotId, input.reason, input.at, now);
  return { skip: skipFromRow(stmt(db, 'SELECT * FROM round_skips WHERE id = ?').get(input.id) as SkipRow), created: true };
}
