/**
 * The tablet's data layer. Reads: from the network when it answers, cached in
 * IndexedDB for offline use, falling back to that cache. Writes made during a
 * round go through the outbox (offline/outbox.ts) and never wait for the network.
 */
import { api, ApiError, NetworkError } from './api';
import {
  CorrectionInputSchema, ReadingInputSchema, RoundFinishSchema, RoundInputSchema, SkipInputSchema,
  TombstoneInputSchema, type CorrectionInput, type Reading, type ReadingInput, type Round, type RoundInput,
  type RoundSummary, type SetupBundle, type Site, type SkipInput,
} from '../core/schemas';
import { get, getAll, kvGet, kvSet, put, reqP, tx } from './offline/db';
import { enqueue, loadOutbox, outboxItems } from './offline/outbox';
import { kickSync } from './offline/sync';
import type { LocalReading, LocalRound, LocalSkip } from './offline/types';
import { deriveLocal } from './round/logic';

export interface Loaded<T> { data: T; fromCache: boolean; fetchedAt: string | null }

// ---------- reads ----------

export async function loadSites(): Promise<Loaded<Site[]>> {
  try {
    const r = await api<{ sites: Site[] }>('GET', '/api/sites');
    const fetchedAt = new Date().toISOString();
    await kvSet('sites', { sites: r.sites, fetchedAt });
    return { data: r.sites, fromCache: false, fetchedAt };
  } catch (e) {
    if (!(e instanceof NetworkError) && !(e instanceof ApiError && e.status >= 500)) throw e;
    const c = await kvGet<{ sites: Site[]; fetchedAt: string }>('sites');
    if (!c) throw e;
    return { data: c.sites, fromCache: true, fetchedAt: c.fetchedAt };
  }
}

const bundleMemo = new Map<string, Loaded<SetupBundle>>();

/** The set-up of a site; network first, IndexedDB when offline. */
export async function loadSetup(siteId: string, opts: { preferCache?: boolean } = {}): Promise<Loaded<SetupBundle>> {
  const memo = bundleMemo.get(siteId);
  if (opts.preferCache && memo) return memo;
  if (opts.preferCache) {
    const c = await get<{ siteId: string; bundle: SetupBundle; fetchedAt: string }>('setup', siteId);
    if (c) {
      const l = { data: c.bundle, fromCache: true, fetchedAt: c.fetchedAt };
      bundleMemo.set(siteId, l);
      void refreshSetup(siteId).catch(() => undefined);
      return l;
    }
  }
  try {
    return await refreshSetup(siteId);
  } catch (e) {
    if (e instanceof ApiError && e.status < 500) throw e;
    const c = await get<{ siteId: string; bundle: SetupBundle; fetchedAt: string }>('setup', siteId);
    if (!c) throw e;
    const l = { data: c.bundle, fromCache: true, fetchedAt: c.fetchedAt };
    bundleMemo.set(siteId, l);
    return l;
  }
}

export async function refreshSetup(siteId: string): Promise<Loaded<SetupBundle>> {
  const bundle = await api<SetupBundle>('GET', `/api/sites/${encodeURIComponent(siteId)}/setup`);
  const fetchedAt = new Date().toISOString();
  await put('setup', { siteId, bundle, fetchedAt });
  const l = { data: bundle, fromCache: false, fetchedAt };
  bundleMemo.set(siteId, l);
  return l;
}

/** Forget the memo after a set-up change so the next read goes to the server. */
export function invalidateSetup(siteId: string): void { bundleMemo.delete(siteId); }

/** Ids whose local copy must not be overwritten by an older server copy (writes still in the outbox). */
function protectedIds(): Set<string> {
  const ids = new Set<string>();
  for (const i of outboxItems()) {
    ids.add(i.entityId);
    if (i.targetId) ids.add(i.targetId);
  }
  return ids;
}

async function mergeServerReadings(readings: Reading[]): Promise<void> {
  await loadOutbox();
  const keep = protectedIds();
  await tx('readings', 'readwrite', (t) => {
    const s = t.objectStore('readings');
    for (const r of readings) if (!keep.has(r.id)) s.put({ ...r, origin: 'server' } satisfies LocalReading);
  });
}

/**
 * Caches what a round needs offline: the site's recent rounds and their readings,
 * so each spot shows its last readings with no network. Best effort.
 */
export async function refreshRecent(siteId: string, roundsToKeep = 3): Promise<void> {
  const r = await api<{ rounds: Round[] }>('GET', `/api/sites/${encodeURIComponent(siteId)}/rounds`);
  await loadOutbox();
  const keep = protectedIds();
  await tx('rounds', 'readwrite', async (t) => {
    const s = t.objectStore('rounds');
    for (const round of r.rounds.slice(0, 50)) {
      if (keep.has(round.id)) continue;
      const old = await reqP(s.get(round.id) as IDBRequest<LocalRound | undefined>);
      s.put({ ...round, origin: 'server', meterId: old?.meterId ?? null } satisfies LocalRound);
    }
  });
  for (const round of r.rounds.slice(0, roundsToKeep)) {
    const rr = await api<{ readings: Reading[] }>('GET', `/api/rounds/${encodeURIComponent(round.id)}/readings`);
    await mergeServerReadings(rr.readings);
  }
  await kvSet(`recent.${siteId}`, new Date().toISOString());
}

export async function roundsOfSite(siteId: string): Promise<LocalRound[]> {
  const rounds = await getAll<LocalRound>('rounds', 'bySite', siteId);
  return rounds.sort((a, b) => b.startedAt.localeCompare(a.startedAt));
}

export function getRound(id: string): Promise<LocalRound | undefined> {
  return get<LocalRound>('rounds', id);
}

/** A round not on this tablet yet (opened from a link): fetch it and keep it. */
export async function fetchRound(id: string): Promise<{ round: LocalRound; summary: RoundSummary } | null> {
  try {
    const summary = await api<RoundSummary>('GET', `/api/rounds/${encodeURIComponent(id)}`);
    const old = await getRound(id);
    const round: LocalRound = { ...summary.round, origin: 'server', meterId: old?.meterId ?? null };
    if (!old || old.origin === 'server') await put('rounds', round);
    return { round: old && old.origin === 'local' ? { ...round, ...old } : round, summary };
  } catch (e) {
    if (e instanceof ApiError && e.status === 404) return null;
    throw e;
  }
}

export async function fetchRoundReadings(id: string): Promise<void> {
  const rr = await api<{ readings: Reading[] }>('GET', `/api/rounds/${encodeURIComponent(id)}/readings`);
  await mergeServerReadings(rr.readings);
}

export function readingsOfRound(roundId: string): Promise<LocalReading[]> {
  return getAll<LocalReading>('readings', 'byRound', roundId);
}

export function readingsOfSpot(spotId: string): Promise<LocalReading[]> {
  return getAll<LocalReading>('readings', 'bySpot', spotId);
}

export function skipsOfRound(roundId: string): Promise<LocalSkip[]> {
  return getAll<LocalSkip>('skips', 'byRound', roundId);
}

/** The spot's readings with every revision, from the server (cached) or the tablet alone. */
export async function loadSpotHistory(spotId: string): Promise<{ readings: LocalReading[]; fromCache: boolean }> {
  try {
    const r = await api<{ readings: Reading[] }>('GET', `/api/spots/${encodeURIComponent(spotId)}/readings?history=1&limit=200`);
    await mergeServerReadings(r.readings);
    return { readings: await readingsOfSpot(spotId), fromCache: false };
  } catch (e) {
    if (e instanceof ApiError && e.status < 500) throw e;
    return { readings: await readingsOfSpot(spotId), fromCache: true };
  }
}

// ---------- writes (through the outbox) ----------

/** Validates with the shared schema; throws the ZodError for the form to show. */
export async function startRound(input: RoundInput, meterId: string | null): Promise<LocalRound> {
  const body = RoundInputSchema.parse(input);
  const round: LocalRound = {
    ...body, plannedSpotIds: body.plannedSpotIds ?? [], endedAt: null, createdAt: new Date().toISOString(), origin: 'local', meterId,
  };
  await enqueue([{ key: `round:${body.id}`, kind: 'round', entityId: body.id, roundId: body.id, spotId: null, targetId: null, path: '/api/rounds', body }],
    ['rounds'], (t) => { t.objectStore('rounds').put(round); });
  kickSync();
  return round;
}

export async function saveReading(input: ReadingInput, bundle: SetupBundle): Promise<LocalReading> {
  const body = ReadingInputSchema.parse(input);
  const local = deriveLocal(body, bundle);
  await enqueue([{ key: `reading:${body.id}`, kind: 'reading', entityId: body.id, roundId: body.roundId, spotId: body.spotId, targetId: null, path: '/api/readings', body }],
    ['readings'], (t) => { t.objectStore('readings').put(local); });
  kickSync();
  return local;
}

export async function skipSpot(input: SkipInput): Promise<LocalSkip> {
  const body = SkipInputSchema.parse(input);
  const local: LocalSkip = { ...body, origin: 'local' };
  await enqueue([{ key: `skip:${body.id}`, kind: 'skip', entityId: body.id, roundId: body.roundId, spotId: body.spotId, targetId: null, path: `/api/rounds/${encodeURIComponent(body.roundId)}/skips`, body }],
    ['skips'], (t) => { t.objectStore('skips').put(local); });
  kickSync();
  return local;
}

export async function finishRound(round: LocalRound, endedAt: string, notes?: string): Promise<void> {
  const body = RoundFinishSchema.parse(notes ? { endedAt, notes } : { endedAt });
  await enqueue([{ key: `finish:${round.id}`, kind: 'finish', entityId: round.id, roundId: round.id, spotId: null, targetId: null, path: `/api/rounds/${encodeURIComponent(round.id)}/finish`, body }],
    ['rounds'], (t) => { t.objectStore('rounds').put({ ...round, endedAt, notes: notes ?? round.notes }); });
  kickSync();
}

export async function correctReading(old: LocalReading, input: CorrectionInput, bundle: SetupBundle): Promise<LocalReading> {
  const body = CorrectionInputSchema.parse(input);
  const { reason, ...reading } = body;
  const local = deriveLocal(reading, bundle, { supersedesId: old.id, correctionReason: reason });
  await enqueue([{ key: `correction:${body.id}`, kind: 'correction', entityId: body.id, roundId: body.roundId, spotId: body.spotId, targetId: old.id, path: `/api/readings/${encodeURIComponent(old.id)}/corrections`, body }],
    ['readings'], (t) => {
      const s = t.objectStore('readings');
      s.put({ ...old, supersededById: body.id });
      s.put(local);
    });
  kickSync();
  return local;
}

export async function deleteReading(old: LocalReading, reason: string): Promise<void> {
  const body = TombstoneInputSchema.parse({ reason });
  await enqueue([{ key: `tombstone:${old.id}`, kind: 'tombstone', entityId: old.id, roundId: old.roundId, spotId: old.spotId, targetId: old.id, path: `/api/readings/${encodeURIComponent(old.id)}/tombstone`, body }],
    ['readings'], (t) => { t.objectStore('readings').put({ ...old, deleted: { reason: body.reason, at: new Date().toISOString() } }); });
  kickSync();
}
