/**
 * The outbox: every write the tablet makes (round start, reading, skip, round
 * finish, correction, delete) is appended here FIRST, in the same IndexedDB
 * transaction as the local copy of the record, and only then does the screen
 * update. Items leave the outbox only when the server acknowledged them
 * (stored or duplicate). Rejected (4xx) and conflicting items stay, flagged,
 * until someone looks at them: nothing is ever dropped silently.
 *
 * A small in-memory mirror answers "what is the state of reading X" synchronously
 * for rendering; other tabs are told about changes over a BroadcastChannel.
 */
import { getAll, reqP, tx, type StoreName } from './db';
import type { OutboxItem, OutboxStatus, SyncState } from './types';

let items: OutboxItem[] = [];
let loaded: Promise<void> | null = null;
const listeners = new Set<() => void>();
const channel = typeof BroadcastChannel !== 'undefined' ? new BroadcastChannel('chargewalk-outbox') : null;
channel?.addEventListener('message', () => { void reload(); });

export function loadOutbox(): Promise<void> {
  if (!loaded) loaded = reload();
  return loaded;
}

async function reload(): Promise<void> {
  const all = await getAll<OutboxItem>('outbox');
  // 'sending' is an in-memory state: after a reload it is simply pending again.
  items = all.map((i) => (i.status === 'sending' ? { ...i, status: 'pending' as const } : i));
  emit();
}

function emit(broadcast = false): void {
  for (const l of [...listeners]) {
    try { l(); } catch (e) { console.error(e); }
  }
  if (broadcast) channel?.postMessage('changed');
}

export function onOutboxChange(fn: () => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}

export function outboxItems(): readonly OutboxItem[] {
  return items;
}

/** Items the sync may send now, in write order. */
export function sendable(): OutboxItem[] {
  return items.filter((i) => i.status === 'pending').sort((a, b) => (a.seq ?? 0) - (b.seq ?? 0));
}

export function needsAttention(): OutboxItem[] {
  return items.filter((i) => i.status === 'rejected' || i.status === 'conflict');
}

/** The sync state of a record by its outbox key ('reading:<id>' ...); not in the outbox means on the server. */
export function syncStateOf(key: string): { state: SyncState; message: string | null } {
  const it = items.find((i) => i.key === key);
  if (!it) return { state: 'server', message: null };
  const state: SyncState = it.status === 'pending' ? 'local' : it.status;
  return { state, message: it.message };
}

export function readingSyncState(readingId: string): { state: SyncState; message: string | null } {
  const a = syncStateOf(`reading:${readingId}`);
  return a.state === 'server' ? syncStateOf(`correction:${readingId}`) : a;
}

/**
 * Appends items to the outbox and, in the same transaction, lets `alsoWrite`
 * put the local copies (round, reading, skip). Resolves after the commit.
 */
export async function enqueue(
  newItems: Omit<OutboxItem, 'seq' | 'status' | 'attempts' | 'message' | 'createdAt'>[],
  alsoStores: StoreName[] = [],
  alsoWrite?: (t: IDBTransaction) => void,
): Promise<void> {
  await loadOutbox();
  const now = new Date().toISOString();
  const full: OutboxItem[] = newItems.map((i) => ({ ...i, status: 'pending', attempts: 0, message: null, createdAt: now }));
  const stores: StoreName[] = ['outbox', ...alsoStores.filter((s) => s !== 'outbox')];
  await tx(stores, 'readwrite', async (t) => {
    const ob = t.objectStore('outbox');
    alsoWrite?.(t);
    for (const it of full) {
      const seq = await reqP(ob.add(it));
      it.seq = seq as number;
    }
  });
  items = [...items, ...full];
  emit(true);
}

/** Marks items in flight (memory only). */
export function markSending(keys: string[]): void {
  const set = new Set(keys);
  items = items.map((i) => (set.has(i.key) ? { ...i, status: 'sending' } : i));
  emit();
}

/** Back to pending after a failed attempt (network or server error). */
export async function markRetry(keys: string[], message: string): Promise<void> {
  await setStatus(keys, 'pending', message, true);
}

export async function markRejected(key: string, message: string): Promise<void> {
  await setStatus([key], 'rejected', message, true);
}

export async function markConflict(key: string, message: string): Promise<void> {
  await setStatus([key], 'conflict', message, true);
}

/** The user asks to send a rejected or conflicting item again. */
export async function retryItem(key: string): Promise<void> {
  await setStatus([key], 'pending', null, false);
}

async function setStatus(keys: string[], status: OutboxStatus, message: string | null, countAttempt: boolean): Promise<void> {
  const set = new Set(keys);
  const changed: OutboxItem[] = [];
  items = items.map((i) => {
    if (!set.has(i.key)) return i;
    const n = { ...i, status, message, attempts: i.attempts + (countAttempt ? 1 : 0) };
    changed.push(n);
    return n;
  });
  await tx('outbox', 'readwrite', (t) => {
    const s = t.objectStore('outbox');
    for (const c of changed) s.put({ ...c, status: c.status === 'sending' ? 'pending' : c.status });
  });
  emit(true);
}

/**
 * Removes acknowledged items and, in the same transaction, lets `alsoWrite`
 * store what the server answered (the stored reading ...).
 */
export async function removeAcked(keys: string[], alsoStores: StoreName[] = [], alsoWrite?: (t: IDBTransaction) => void): Promise<void> {
  if (keys.length === 0 && !alsoWrite) return;
  const set = new Set(keys);
  const gone = items.filter((i) => set.has(i.key));
  await tx(['outbox', ...alsoStores.filter((s) => s !== 'outbox')], 'readwrite', (t) => {
    const s = t.objectStore('outbox');
    for (const g of gone) if (g.seq !== undefined) s.delete(g.seq);
    alsoWrite?.(t);
  });
  items = items.filter((i) => !set.has(i.key));
  emit(true);
}

export interface OutboxCounts { readings: number; other: number; sending: number; attention: number }

export function outboxCounts(): OutboxCounts {
  let readings = 0; let other = 0; let sending = 0; let attention = 0;
  for (const i of items) {
    if (i.status === 'rejected' || i.status === 'conflict') { attention++; continue; }
    if (i.status === 'sending') sending++;
    if (i.kind === 'reading' || i.kind === 'correction') readings++;
    else other++;
  }
  return { readings, other, sending, attention };
}
