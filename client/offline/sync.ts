/**
 * Sends the outbox to the server, in write order, until it is empty.
 *
 * - Readings go in batches of up to 100 consecutive readings per POST /api/readings;
 *   anything else (round start, skip, finish, correction, delete) goes alone, in
 *   its place in the order, so a round always exists before its readings.
 * - The server acknowledges by id: stored or duplicate (a harmless retry) remove the
 *   item; conflict keeps it, flagged for review.
 * - A network error or a 5xx stops the pass and retries later with exponential
 *   back-off and full jitter (1 s, 2 s, 4 s ... up to 60 s); the 'online' event and
 *   'Send now' retry at once.
 * - A 4xx keeps the item, flagged 'rejected' with the server's message; a batch that
 *   was refused as a whole is resent reading by reading so one bad reading never holds
 *   back the others.
 * - One tab syncs at a time (Web Locks), so two open tabs never double-send.
 */
import { api, ApiError, NetworkError, isRetryable } from '../api';
import type { Reading, ReadingAck, RoundSummary } from '../../core/schemas';
import {
  loadOutbox, markConflict, markRejected, markRetry, markSending, removeAcked, sendable,
} from './outbox';
import type { LocalReading, OutboxItem } from './types';
import { backoffDelay } from './backoff';

export const BATCH_SIZE = 100;

export interface SyncStatus {
  running: boolean;
  /** Consecutive failed passes. */
  failures: number;
  nextRetryAt: number | null;
  lastError: string | null;
  lastSuccessAt: number | null;
  online: boolean;
}

const status: SyncStatus = {
  running: false, failures: 0, nextRetryAt: null, lastError: null, lastSuccessAt: null,
  online: typeof navigator === 'undefined' ? true : navigator.onLine,
};
const listeners = new Set<() => void>();
let timer: ReturnType<typeof setTimeout> | null = null;
let again = false;

export function syncStatus(): Readonly<SyncStatus> { return status; }
export function onSyncChange(fn: () => void): () => void { listeners.add(fn); return () => listeners.delete(fn); }
function emit(): void { for (const l of [...listeners]) l(); }

/** Starts the sync: runs now and whenever the browser comes back online. */
export function startSync(): void {
  window.addEventListener('online', () => { status.online = true; sendNow(); });
  window.addEventListener('offline', () => { status.online = false; emit(); });
  // A safety net: every 30 s try again if something is waiting (navigator.onLine can lie).
  setInterval(() => { if (!status.running && status.nextRetryAt === null && sendable().length) void runSync(); }, 30_000);
  void runSync();
}

/** 'Send now' and the online event: forget the back-off and run at once. */
export function sendNow(): void {
  status.failures = 0;
  if (timer) { clearTimeout(timer); timer = null; }
  status.nextRetryAt = null;
  void runSync();
}

/** Called after a write was queued. */
export function kickSync(): void {
  if (status.nextRetryAt !== null) return; // waiting out a back-off: the write goes with the next pass
  void runSync();
}

export async function runSync(): Promise<void> {
  if (status.running) { again = true; return; }
  status.running = true;
  emit();
  try {
    await loadOutbox();
    const locks = typeof navigator !== 'undefined' ? navigator.locks : undefined;
    if (locks) await locks.request('chargewalk-sync', () => pass());
    else await pass();
  } finally {
    status.running = false;
    emit();
  }
  if (again) { again = false; if (status.nextRetryAt === null) void runSync(); }
}

/** Sends until the outbox has nothing sendable or a retryable failure stops it. */
async function pass(): Promise<void> {
  for (;;) {
    const queue = sendable();
    const head = queue[0];
    if (!head) break;
    let group: OutboxItem[];
    if (head.kind === 'reading') {
      group = [];
      for (const it of queue) {
        if (it.kind !== 'reading' || group.length >= BATCH_SIZE) break;
        group.push(it);
      }
    } else group = [head];
    markSending(group.map((g) => g.key));
    try {
      if (head.kind === 'reading') await sendReadings(group);
      else await sendOne(head);
      status.failures = 0;
      status.lastError = null;
      status.lastSuccessAt = Date.now();
      emit();
    } catch (e) {
      if (isRetryable(e) || !(e instanceof ApiError)) {
        const msg = e instanceof Error ? e.message : String(e);
        await markRetry(group.map((g) => g.key), msg);
        status.failures++;
        status.lastError = msg;
        const delay = backoffDelay(status.failures);
        status.nextRetryAt = Date.now() + delay;
        if (timer) clearTimeout(timer);
        timer = setTimeout(() => { timer = null; status.nextRetryAt = null; void runSync(); }, delay);
        emit();
        return;
      }
      // A 4xx for a single item: keep it, flagged, and go on with the rest.
      await markRejected(head.key, describe(e));
    }
  }
}

function describe(e: ApiError): string {
  const f = e.fields.map((x) => `${x.path.replace(/^readings\.\d+\./, '')}: ${x.message}`).join('; ');
  return f ? `${e.message} (${f})` : e.message;
}

async function sendReadings(batch: OutboxItem[]): Promise<void> {
  let res: { acks: ReadingAck[] };
  try {
    res = await api<{ acks: ReadingAck[] }>('POST', '/api/readings', { readings: batch.map((b) => b.body) });
  } catch (e) {
    if (!(e instanceof ApiError) || isRetryable(e)) throw e;
    if (batch.length === 1) throw e;
    // The batch was refused whole (nothing stored). Mark the readings the answer names,
    // then resend the others one by one so each gets its own verdict.
    const named = new Map<number, string[]>();
    for (const f of e.fields) {
      const m = /^readings\.(\d+)\.?(.*)$/.exec(f.path);
      if (m) named.set(Number(m[1]), [...(named.get(Number(m[1])) ?? []), `${m[2] || 'reading'}: ${f.message}`]);
    }
    const rest: OutboxItem[] = [];
    for (const [i, it] of batch.entries()) {
      const msgs = named.get(i);
      if (msgs) await markRejected(it.key, `${e.message} (${msgs.join('; ')})`);
      else rest.push(it);
    }
    if (named.size === 0) {
      for (const it of rest) {
        try { await sendReadings([it]); } catch (e2) {
          if (e2 instanceof ApiError && !isRetryable(e2)) await markRejected(it.key, describe(e2));
          else throw e2;
        }
      }
    } else {
      await markRetry(rest.map((r) => r.key), 'sent again after another reading of its batch was refused');
    }
    return;
  }
  const acked = new Map((res.acks ?? []).map((a) => [a.id, a]));
  const done: string[] = [];
  const stored: Reading[] = [];
  const missing: string[] = [];
  for (const it of batch) {
    const ack = acked.get(it.entityId);
    if (!ack) { missing.push(it.key); continue; }
    if (ack.status === 'stored' || ack.status === 'duplicate') {
      done.push(it.key);
      if (ack.reading) stored.push(ack.reading);
    } else {
      await markConflict(it.key, ack.message ?? 'the server holds a different reading with this id; kept for review');
    }
  }
  await removeAcked(done, ['readings'], (t) => {
    const s = t.objectStore('readings');
    for (const r of stored) s.put({ ...r, origin: 'server' } satisfies LocalReading);
  });
  if (missing.length) throw new NetworkError(`the server did not acknowledge ${missing.length} reading(s)`);
}

async function sendOne(it: OutboxItem): Promise<void> {
  try {
    switch (it.kind) {
      case 'round':
        await api('POST', it.path, it.body);
        break;
      case 'skip':
        await api('POST', it.path, it.body);
        break;
      case 'finish':
        await api<RoundSummary>('POST', it.path, it.body);
        break;
      case 'follow-up-close':
        // Queued behind its verifying reading, so the reading is on the server first.
        await api('POST', it.path, it.body);
        break;
      case 'correction': {
        const r = await api<Reading>('POST', it.path, it.body);
        await removeAcked([it.key], ['readings'], (t) => { t.objectStore('readings').put({ ...r, origin: 'server' }); });
        return;
      }
      case 'tombstone': {
        const r = await api<Reading>('POST', it.path, it.body);
        await removeAcked([it.key], ['readings'], (t) => { t.objectStore('readings').put({ ...r, origin: 'server' }); });
        return;
      }
      default:
        throw new ApiError(400, 'invalid', `unknown outbox item ${String(it.kind)}`);
    }
  } catch (e) {
    if (!(e instanceof ApiError) || e.status !== 409) throw e;
    // A 409 after a lost answer can be our own earlier success: look before flagging.
    if (await alreadyApplied(it)) { await removeAcked([it.key]); return; }
    await markConflict(it.key, e.message);
    return;
  }
  await removeAcked([it.key]);
}

async function alreadyApplied(it: OutboxItem): Promise<boolean> {
  try {
    if (it.kind === 'finish') return true; // finishing a finished round changes nothing
    if (it.kind === 'follow-up-close') {
      const r = await api<{ status?: string; followUp?: { status?: string } }>('GET', `/api/follow-ups/${encodeURIComponent(it.entityId)}`);
      return (r.followUp?.status ?? r.status) === 'closed';
    }
    if (it.kind === 'correction') {
      await api('GET', `/api/readings/${encodeURIComponent(it.entityId)}`);
      return true;
    }
    if (it.kind === 'tombstone') {
      const r = await api<{ reading: Reading }>('GET', `/api/readings/${encodeURIComponent(it.entityId)}`);
      return r.reading.deleted !== null;
    }
  } catch { /* not found or unreachable: report the conflict */ }
  return false;
}
