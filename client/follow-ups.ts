/**
 * Follow-ups on the tablet. Opening and reopening talk to the server directly
 * (they happen at the desk or on the review, with a network: the screen says so
 * when there is none). Closing goes through the outbox like every write made on
 * the floor: queued behind its verifying reading, so the reading reaches the
 * server first, and sent when the network is back.
 *
 * The site's open follow-ups are cached in IndexedDB (kv 'followups.open.<siteId>')
 * with the set-up, so the round screen shows them with no network.
 */
import { z } from 'zod';
import { kvGet, put } from './offline/db';
import { enqueue, loadOutbox, outboxItems } from './offline/outbox';
import { kickSync } from './offline/sync';
import {
  FINDING_CLASSES, createFollowUp, openFollowUpsOfSite, type FollowUp, type FollowUpInput,
} from './review-api';
import { IsoDate } from '../core/schemas';

/**
 * The follow-up form, checked before sending. Mirrors what the server checks;
 * TODO(lead): replace with the shared schema from core/schemas once the server side
 * exports one (core/schemas/review.ts was not there when this was written).
 */
export const FollowUpFormSchema = z.object({
  spotId: z.string().min(1),
  openedFromReadingId: z.string().optional(),
  findingClass: z.enum(FINDING_CLASSES, { error: 'pick the finding class' }),
  action: z.string().trim().min(1, 'say what is to be done').max(2000, 'at most 2000 characters'),
  assignee: z.string().trim().min(1, 'say who does it').max(120, 'at most 120 characters'),
  dueDate: IsoDate,
});

export const CloseReasonSchema = z.object({
  reason: z.string().trim().min(3, 'write why it is closed without a reading').max(2000, 'at most 2000 characters'),
});

const cacheKey = (siteId: string) => `followups.open.${siteId}`;

interface Cached { list: FollowUp[]; fetchedAt: string }

/** Follow-up ids whose close waits in the outbox. */
function pendingCloses(): Set<string> {
  return new Set(outboxItems().filter((i) => i.kind === 'follow-up-close').map((i) => i.entityId));
}

/** The site's open follow-ups from the network (cached), or the cache when offline. */
export async function loadOpenFollowUps(siteId: string, opts: { preferCache?: boolean } = {}): Promise<{ list: FollowUp[]; fromCache: boolean; fetchedAt: string | null }> {
  await loadOutbox();
  const pending = pendingCloses();
  const strip = (l: FollowUp[]) => l.filter((f) => !pending.has(f.id));
  if (opts.preferCache) {
    const c = await kvGet<Cached>(cacheKey(siteId));
    if (c) {
      void refreshOpenFollowUps(siteId).catch(() => undefined);
      return { list: strip(c.list), fromCache: true, fetchedAt: c.fetchedAt };
    }
  }
  try {
    const list = await refreshOpenFollowUps(siteId);
    return { list: strip(list), fromCache: false, fetchedAt: new Date().toISOString() };
  } catch {
    const c = await kvGet<Cached>(cacheKey(siteId));
    return { list: strip(c?.list ?? []), fromCache: true, fetchedAt: c?.fetchedAt ?? null };
  }
}

export async function refreshOpenFollowUps(siteId: string): Promise<FollowUp[]> {
  const list = await openFollowUpsOfSite(siteId);
  await put('kv', { list, fetchedAt: new Date().toISOString() } satisfies Cached, cacheKey(siteId));
  return list;
}

/** Validates, sends, and adds the new follow-up to the offline cache. Needs the network. */
export async function openFollowUp(siteId: string, input: FollowUpInput): Promise<FollowUp> {
  const body = FollowUpFormSchema.parse(input);
  const f = await createFollowUp(body);
  const c = await kvGet<Cached>(cacheKey(siteId));
  await put('kv', { list: [...(c?.list ?? []).filter((x) => x.id !== f.id), f], fetchedAt: c?.fetchedAt ?? new Date().toISOString() } satisfies Cached, cacheKey(siteId));
  return f;
}

/**
 * Closes a follow-up through the outbox: with a verifying reading (its id; the
 * server checks it is within limits and of this spot) or with a written reason.
 * The cached open list drops it in the same transaction.
 */
export async function closeFollowUp(siteId: string, f: FollowUp, how: { verifyingReadingId: string } | { reason: string }): Promise<void> {
  const body = 'reason' in how ? CloseReasonSchema.parse(how) : { verifyingReadingId: how.verifyingReadingId };
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
