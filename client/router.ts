/**
 * Hash router: '#/round/:id/summary' style patterns. Each page renders into the
 * view element and may return a cleanup function, called before the next page.
 */
export type Params = Record<string, string>;
export type Page = (root: HTMLElement, params: Params) => void | (() => void) | Promise<void | (() => void)>;

interface Route { parts: string[]; page: Page }

const routes: Route[] = [];
let cleanup: (() => void) | null = null;
let renderSeq = 0;

export function route(pattern: string, page: Page): void {
  routes.push({ parts: pattern.split('/').filter(Boolean), page });
}

export function match(hash: string): { page: Page; params: Params } | null {
  const path = hash.replace(/^#/, '').split('?')[0] ?? '';
  const parts = path.split('/').filter(Boolean).map((p) => { try { return decodeURIComponent(p); } catch { return p; } });
  for (const r of routes) {
    if (r.parts.length !== parts.length) continue;
    const params: Params = {};
    let ok = true;
    r.parts.forEach((p, i) => {
      const v = parts[i]!;
      if (p.startsWith(':')) params[p.slice(1)] = v;
      else if (p !== v) ok = false;
    });
    if (ok) return { page: r.page, params };
  }
  return null;
}

export function navigate(hash: string): void {
  if (location.hash === hash) void render();
  else location.hash = hash;
}

export async function render(): Promise<void> {
  const root = document.getElementById('view');
  if (!root) return;
  const seq = ++renderSeq;
  if (cleanup) { try { cleanup(); } catch (e) { console.error(e); } cleanup = null; }
  const m = match(location.hash || '#/') ?? match('#/');
  root.replaceChildren();
  document.getElementById('toasts')?.replaceChildren(); // messages belong to the screen they were made on
  root.scrollTop = 0;
  window.scrollTo(0, 0);
  if (!m) return;
  try {
    const c = await m.page(root, m.params);
    if (seq !== renderSeq) { if (typeof c === 'function') c(); return; }
    cleanup = typeof c === 'function' ? c : null;
  } catch (e) {
    console.error(e);
    if (seq === renderSeq) {
      const p = document.createElement('p');
      p.className = 'error-box';
      p.textContent = `This screen could not open: ${(e as Error).message}`;
      root.append(p);
    }
  }
}

export function startRouter(): void {
  window.addEventListener('hashchange', () => { void render(); });
  void render();
}
