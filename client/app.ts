/** App-wide context: the chosen site and its set-up, shared by the top bar and the pages. */
import type { SetupBundle } from '../core/schemas';
import { loadSetup, loadSites, type Loaded } from './data';
import { prefs } from './state';

const listeners = new Set<() => void>();
let siteName: string | null = null;

export function onSiteChange(fn: () => void): () => void { listeners.add(fn); return () => listeners.delete(fn); }

export function currentSiteName(): string | null { return siteName; }

export function setSite(id: string | null, name: string | null): void {
  prefs.siteId = id;
  siteName = name;
  for (const l of [...listeners]) l();
}

/** The current site's set-up (cache first when asked: the round screen must open offline). */
export async function currentSetup(opts: { preferCache?: boolean } = {}): Promise<Loaded<SetupBundle> | null> {
  let id = prefs.siteId;
  if (!id) {
    // A deep link opened before any site was chosen (a label scanned, a review link
    // sent round): take the first site, as home would, rather than bouncing home.
    try {
      const first = (await loadSites()).data[0];
      if (!first) return null;
      setSite(first.id, first.name);
      id = first.id;
    } catch {
      return null;
    }
  }
  const l = await loadSetup(id, opts);
  if (siteName !== l.data.site.name) setSite(id, l.data.site.name);
  return l;
}
