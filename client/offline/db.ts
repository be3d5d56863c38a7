/**
 * IndexedDB behind a small promise wrapper. One database, a few object stores:
 *
 *   outbox    every write the tablet makes, in order (autoIncrement `seq`), until
 *             the server acknowledged it; rejected and conflicting items stay
 *   rounds    rounds started on this tablet or seen on the server
 *   readings  readings of this tablet plus recent server readings (per spot, per round)
 *   skips     skipped spots of rounds
 *   setup     the last known set-up bundle per site (areas, spots, meters, limit sets)
 *   kv        small values (site list, last refresh times)
 *
 * A transaction resolves when IndexedDB reports `complete`, i.e. the write is
 * durable as far as the browser guarantees; callers update the screen after that.
 */
export const DB_NAME = 'chargewalk';
const DB_VERSION = 1;

export type StoreName = 'outbox' | 'rounds' | 'readings' | 'skips' | 'setup' | 'kv';

let dbPromise: Promise<IDBDatabase> | null = null;

export function openDb(): Promise<IDBDatabase> {
  if (dbPromise) return dbPromise;
  dbPromise = new Promise<IDBDatabase>((resolve, reject) => {
    const req = indexedDB.open(DB_NAME, DB_VERSION);
    req.onupgradeneeded = () => {
      const db = req.result;
      if (!db.objectStoreNames.contains('outbox')) {
        const s = db.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true });
        s.createIndex('byKey', 'key', { unique: true });
      }
      if (!db.objectStoreNames.contains('rounds')) {
        const s = db.createObjectStore('rounds', { keyPath: 'id' });
        s.createIndex('bySite', 'siteId');
      }
      if (!db.objectStoreNames.contains('readings')) {
        const s = db.createObjectStore('readings', { keyPath: 'id' });
        s.createIndex('bySpot', 'spotId');
        s.createIndex('byRound', 'roundId');
      }
      if (!db.objectStoreNames.contains('skips')) {
        const s = db.createObjectStore('skips', { keyPath: 'id' });
        s.createIndex('byRound', 'roundId');
      }
      if (!db.objectStoreNames.contains('setup')) db.createObjectStore('setup', { keyPath: 'siteId' });
      if (!db.objectStoreNames.contains('kv')) db.createObjectStore('kv');
    };
    req.onsuccess = () => {
      const db = req.result;
      // Another tab upgrading the schema: let it, reopen on next use.
      db.onversionchange = () => { db.close(); dbPromise = null; };
      resolve(db);
    };
    req.onerror = () => { dbPromise = null; reject(req.error ?? new Error('IndexedDB open failed')); };
    req.onblocked = () => { /* another tab holds an old version; onsuccess follows when it closes */ };
  });
  return dbPromise;
}

export function reqP<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB request failed'));
  });
}

/**
 * Runs `fn` inside one transaction over `stores` and resolves with its result
 * once the transaction has completed (committed). If `fn` throws or a request
 * fails the whole transaction is aborted and nothing is written.
 */
export async function tx<T>(
  stores: StoreName | StoreName[],
  mode: IDBTransactionMode,
  fn: (t: IDBTransaction) => T | Promise<T>,
): Promise<T> {
  const db = await openDb();
  const t = db.transaction(stores, mode, { durability: 'strict' } as IDBTransactionOptions);
  const done = new Promise<void>((resolve, reject) => {
    t.oncomplete = () => resolve();
    t.onabort = () => reject(t.error ?? new Error('IndexedDB transaction aborted'));
    t.onerror = () => reject(t.error ?? new Error('IndexedDB transaction failed'));
  });
  let result: T;
  try {
    result = await fn(t);
  } catch (e) {
    try { t.abort(); } catch { /* already finished */ }
    await done.catch(() => undefined);
    throw e;
  }
  await done;
  return result;
}

export function getAll<T>(store: StoreName, index?: string, key?: IDBValidKey | IDBKeyRange): Promise<T[]> {
  return tx(store, 'readonly', (t) => {
    const s = t.objectStore(store);
    const src = index ? s.index(index) : s;
    return reqP(src.getAll(key) as IDBRequest<T[]>);
  });
}

export function get<T>(store: StoreName, key: IDBValidKey): Promise<T | undefined> {
  return tx(store, 'readonly', (t) => reqP(t.objectStore(store).get(key) as IDBRequest<T | undefined>));
}

export function put(store: StoreName, value: unknown, key?: IDBValidKey): Promise<void> {
  return tx(store, 'readwrite', async (t) => { await reqP(t.objectStore(store).put(value, key)); });
}

export function putMany(store: StoreName, values: unknown[]): Promise<void> {
  return tx(store, 'readwrite', (t) => {
    const s = t.objectStore(store);
    for (const v of values) s.put(v);
  });
}

export async function kvGet<T>(key: string): Promise<T | undefined> {
  return get<T>('kv', key);
}

export async function kvSet(key: string, value: unknown): Promise<void> {
  await put('kv', value, key);
}
