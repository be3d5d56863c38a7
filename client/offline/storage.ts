/**
 * Asks the browser to keep this origin's storage (IndexedDB: the outbox, the
 * set-up, recent readings) instead of treating it as best-effort data that it
 * may clear when the tablet runs low on space. Browsers grant it on their own
 * terms (Chromium: installed apps and engaged sites; Safari: installed web
 * apps), so the outbox page says which one this tablet got.
 */
export type StorageMode = 'persistent' | 'best-effort' | 'unknown';

let pending: Promise<StorageMode> | null = null;

export function keepStorage(): Promise<StorageMode> {
  pending ??= (async () => {
    const s = typeof navigator !== 'undefined' ? navigator.storage : undefined;
    if (!s?.persisted || !s.persist) return 'unknown';
    try {
      if (await s.persisted()) return 'persistent';
      return (await s.persist()) ? 'persistent' : 'best-effort';
    } catch {
      return 'unknown';
    }
  })();
  return pending;
}

export const STORAGE_MODE_TEXT: Record<StorageMode, string> = {
  persistent: 'Storage: kept. This browser keeps readings saved on this tablet until they are sent.',
  'best-effort': 'Storage: best effort. The browser may clear saved data when the tablet runs out of space; install the app (Add to home screen) and send readings when the network is there.',
  unknown: 'Storage: this browser does not say whether it keeps saved data; send readings when the network is there.',
};
