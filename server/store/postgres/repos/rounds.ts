/** rounds and round_skips: one walkaround, its planned spots, and the spots skipped with a reason. */
import type { Round, RoundInput, RoundSummary, Skip, SkipInput } from '../../../../core/schemas';
import { contentHash, toUtcIso } from '../../canonical';
import { conflict, invalid, notFound } from '../../errors';
import type { RoundFinishInput } from '../../store';
import type { Db } from '../db';
import { roundFromRow, skipFromRow, summarizeRound, type RoundRow, type SkipRow } from '../../shared/rounds';
import { listRoundReadings } from './readings';
import { requireSite } from './sites';
import { activeSpotIds } from './spots';

async function getRoundRow(db: Db, id: string): Promise<RoundRow | undefined> {
  return (await db.get('SELECT * FROM rounds WHERE id = ?', id)) as RoundRow | undefined;
}

export async function getRound(db: Db, id: string): Promise<Round | null> {
  const r = (await getRoundRow(db, id));
  return r ? roundFromRow(r) : null;
}

export async function listRounds(db: Db, siteId: string): Promise<Round[]> {
  return ((await db.all('SELECT * FROM rounds WHERE site_id = ? ORDER BY started_at DESC, id DESC', siteId)) as RoundRow[]).map(roundFromRow);
}

/** Inserts a round made by the tablet; an identical retry answers created false, other content with the same id is a conflict. */
export async function insertRound(db: Db, raw: RoundInput, now: string): Promise<{ round: Round; created: boolean }> {
  const input: RoundInput = { ...raw, startedAt: toUtcIso(raw.startedAt) };
  const hash = contentHash(input);
  const existing = (await getRoundRow(db, input.id));
  if (existing) {
    if (existing.content_hash === hash) return { round: roundFromRow(existing), created: false };
    throw conflict(`a different round with id ${input.id} is already stored`, ['id']);
  }
  (await requireSite(db, input.siteId));
  let planned: string[];
  if (input.plannedSpotIds === undefined) {
    planned = (await activeSpotIds(db, input.siteId));
  } else {
    const seen = new Set<string>();
    for (const [i, sid] of input.plannedSpotIds.entries()) {
      if (seen.has(sid)) throw invalid(`spot ${sid} is planned twice`, ['plannedSpotIds', i]);
      seen.add(sid);
      const r = (await db.get('SELECT site_id FROM spots WHERE id = ?', sid)) as { site_id: string } | undefined;
      if (!r) throw notFound(`no spot with id ${sid}`, ['plannedSpotIds', i]);
      if (r.site_id !== input.siteId) throw invalid('this spot belongs to another site', ['plannedSpotIds', i]);
    }
    planned = input.plannedSpotIds;
  }
  (await db.run(`INSERT INTO rounds (id, site_id, surveyor, started_at, ended_at, rh_percent, temperature_c, notes, planned_spot_ids,
              content_hash, created_at) VALUES (?, ?, ?, ?, NULL, ?, ?, ?, ?, ?, ?)`, input.id, input.siteId, input.surveyor, input.startedAt, input.rhPercent, input.temperatureC, input.notes,
      JSON.stringify(planned), hash, now));
  return { round: (await getRound(db, input.id))!, created: true };
}

export async function listSkips(db: Db, roundId: string): Promise<Skip[]> {
  return ((await db.all('SELECT * FROM round_skips WHERE round_id = ? ORDER BY at, id', roundId)) as SkipRow[]).map(skipFromRow);
}

/**
 * The round with its counts, all over current revisions that are not deleted:
 * readings, distinct spots measured, warnings and alarms (verdicts recomputed by
 * core/), skips with reasons, and planned spots neither measured nor skipped.
 */
export async function roundSummary(db: Db, id: string): Promise<RoundSummary | null> {
  const round = (await getRound(db, id));
  if (!round) return null;
  const readings = (await listRoundReadings(db, id));
  const skips = (await listSkips(db, id));
  return summarizeRound(round, readings, skips);
}

/** Sets the end of a round; finishing again with the same end is harmless, with another end a conflict. */
export async function finishRound(db: Db, id: string, finish: RoundFinishInput): Promise<void> {
  const row = (await getRoundRow(db, id));
  if (!row) throw notFound(`no round with id ${id}`, ['id']);
  const endedAt = toUtcIso(finish.endedAt);
  if (endedAt < row.started_at) throw invalid('the end of a round must not be before its start', ['endedAt']);
  if (row.ended_at !== null && row.ended_at !== endedAt) {
    throw conflict(`this round was already finished at ${row.ended_at}`, ['endedAt']);
  }
  (await db.run('UPDATE rounds SET ended_at = ?, notes = ? WHERE id = ?', endedAt, finish.notes ?? row.notes, id));
}

/** Records a skipped spot; an identical retry answers created false, other content with the same id is a conflict. */
export async function insertSkip(db: Db, roundId: string, raw: SkipInput, now: string): Promise<{ skip: Skip; created: boolean }> {
  const input: SkipInput = { ...raw, at: toUtcIso(raw.at) };
  if (input.roundId !== roundId) throw invalid('the round id in the body differs from the round in the path', ['roundId']);
  const round = (await getRoundRow(db, roundId));
  if (!round) throw notFound(`no round with id ${roundId}`, ['id']);
  const existing = (await db.get('SELECT * FROM round_skips WHERE id = ?', input.id)) as SkipRow | undefined;
  if (existing) {
    const same = existing.round_id === input.roundId && existing.spot_id === input.spotId && existing.reason === input.reason && existing.at === input.at;
    if (same) return { skip: skipFromRow(existing), created: false };
    throw conflict(`a different skip with id ${input.id} is already stored`, ['id']);
  }
  const spot = (await db.get('SELECT site_id FROM spots WHERE id = ?', input.spotId)) as { site_id: string } | undefined;
  if (!spot) throw notFound(`no spot with id ${input.spotId}`, ['spotId']);
  if (spot.site_id !== round.site_id) throw invalid('the spot belongs to another site than the round', ['spotId']);
  (await db.run('INSERT INTO round_skips (id, round_id, spot_id, reason, at, created_at) VALUES (?, ?, ?, ?, ?, ?)', input.id, roundId, input.spotId, input.reason, input.at, now));
  return { skip: skipFromRow((await db.get('SELECT * FROM round_skips WHERE id = ?', input.id)) as SkipRow), created: true };
}
