/**
 * Follow-ups on the tablet. Opening and reopening talk to the server directly
 * (they happen at the desk or on the review, with a network: the screen says so
 * when there is none). Closing goes through the outbox like every write made on
 * the floor: queued behind its verifying reading, so the reading reaches the
 * server first, and sent when the network is back.
 *
 * Open follow-ups for the round screen offline: the set-up bundle carries them
 * (cached in IndexedDB with the set-up), and the latest list from the server is
 * also kept in kv 'followups.open.<siteId>' (fresher: it holds follow-ups opened
 * since the set-up was fetched).
 */
import { z } from 'zod';
import { api } from './api';
import { kvGet, put } from './offline/db';
import { enqueue, loadOutbox, outboxItems } from './offline/outbox';
import { kickSync } from './offline/sync';
import { prefs } from './state';
import { openFollowUpsOfSite } from './review-api';
import { FollowUpCloseSchema, FollowUpInputSchema, type FollowUp, type SetupBundle } from '../core/schemas';

/**
 * The form: the shared schema, plus what the form insists on (the issue's
 * "what to do, who, due date": who and when are optional for the API, not here).
 */
export const FollowUpFormSchema = FollowUpInputSchema.superRefine((f, ctx) => {
  if (!f.assignee.trim()) ctx.addIssue({ code: 'custom', path: ['assignee'], message: 'say who does it' });
  if (!f.dueDate) ctx.addIssue({ code: 'custom', path: ['dueDate'], message: 'give a due date' });
});
export type FollowUpFormInput = z.input<typeof FollowUpInputSchema>;

const cacheKey = (siteId: string) => `followups.open.${siteId}`;

interface Cached { list: FollowUp[]; fetchedAt: string }

/** Follow-up ids whose close waits in the outbox. */
function pendingCloses(): Set<string> {
  return new Set(outboxItems().filter((i) => i.kind === 'follow-up-close').map((i) => i.entityId));
}

/** The site's open follow-ups from the network (cached), or from the tablet when offline. */
export async function loadOpenFollowUps(siteId: string, opts: { preferCache?: boolean; bundle?: SetupBundle } = {}): Promise<{ list: FollowUp[]; fromCache: boolean }> {
  await loadOutbox();
  const pending = pendingCloses();
  const strip = (l: FollowUp[]) => l.filter((f) => !pending.has(f.id) && f.status === 'open');
  const cached = async () => {
    const c = await kvGet<Cached>(cacheKey(siteId));
    const fromBundle = opts.bundle?.followUps ?? [];
    // The newer of the two lists wins; the bundle's is dated by the set-up fetch.
    return c ? c.list : fromBundle;
  };
  if (opts.preferCache) {
    return { list: strip(await cached()), fromCache: true };
  }
  try {
    return { list: strip(await refreshOpenFollowUps(siteId)), fromCache: false };
  } catch {
    return { list: strip(await cached()), fromCache: true };
  }
}

export async function refreshOpenFollowUps(siteId: string): Promise<FollowUp[]> {
  const list = await openFollowUpsOfSite(siteId);
  await put('kv', { list, fetchedAt: new Date().toISOString() } satisfies Cached, cacheKey(siteId));
  return list;
}

/** Validates, sends, and adds the new follow-up to the offline cache. Needs the network. */
export async function openFollowUp(siteId: string, input: FollowUpFormInput): Promise<FollowUp> {
  const body = FollowUpFormSchema.parse({ ...input, by: input.by || prefs.surveyor || '' });
  const f = await api<FollowUp>('POST', '/api/follow-ups', body);
  const c = await kvGet<Cached>(cacheKey(siteId));
  await put('kv', { list: [...(c?.list ?? []).filter((x) => x.id !== f.id), f], fetchedAt: c?.fetchedAt ?? new Date().toISOString() } satisfies Cached, cacheKey(siteId));
  return f;
}

/**
 * Closes a follow-up through the outbox: with a verifying reading (its id; the
 * server checks it is current, of this spot, taken after the follow-up was
 * opened and within limits) or with a written reason. The cached open list drops
 * it in the same transaction.
 */
export async function closeFollowUp(siteId: string, f: FollowUp, how: { verifyingReadingId: string } | { reason: string }): Promise<void> {
  const body = FollowUpCloseSchema.parse({ ...how, by: prefs.surveyor ?? '' });
  const c = await kvGet<Cached>(cacheKey(siteId));
  await enqueue([{
    key: `follow-up-close:${f.id}:${Date.now()}`, kind: 'follow-up-close', entityId: f.id, roundId: null, spotId: f.spotId, targetId: null,
    path: `/api/follow-ups/${encodeURIComponent(f.id)}/close`, body,
  }], ['kv'], (t) => {
    if (c) t.objectStore('kv').put({ ...c, list: c.list.filter((x) => x.id !== f.id) } satisfies Cached, cacheKey(siteId));
  });
  kickSync();
}

/** True when a close of this follow-up waits in the outbox. */
export function closePending(id: string): boolean {
  return pendingCloses().has(id);
}
