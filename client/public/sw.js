// chargewalk service worker: makes the app open with no network.
//
// What it caches: the app shell only (index.html, the hashed JS/CSS bundles it
// references, the manifest and icons), in a versioned cache. Cache-first with
// update: the shell is served from the cache at once and refreshed in the
// background; when a fresh index.html names new bundles they are fetched into
// the cache too, so the next start (online or not) gets a consistent shell.
//
// What it never touches: /api. Records live in IndexedDB (outbox, set-up,
// readings), and every API call goes straight to the network, so the outbox
// is the only source of truth for "saved on this tablet" versus "on the server".
//
// A plain JS file in public/ (not bundled) so it is served at /sw.js and its
// scope is the whole app.
const VERSION = 'v1';
const CACHE = `chargewalk-shell-${VERSION}`;
const STATIC = ['/', '/manifest.webmanifest', '/icons/icon.svg', '/icons/icon-192.png', '/icons/icon-512.png'];

/** The bundles an index.html refers to (script src, link href under /assets/). */
function assetsOf(html) {
  const out = new Set();
  const re = /(?:src|href)="(\/assets\/[^"]+)"/g;
  let m;
  while ((m = re.exec(html))) out.add(m[1]);
  return [...out];
}

/** Lazily loaded chunks a bundle imports: Vite writes them as "./name-hash.js" beside it. */
function chunksOf(js) {
  const out = new Set();
  const re = /["'`]\.\/([A-Za-z0-9_.-]+\.(?:js|css))["'`]/g;
  let m;
  while ((m = re.exec(js))) out.add(`/assets/${m[1]}`);
  return [...out];
}

/**
 * Puts a bundle in the cache (unless there already), then the chunks it imports,
 * so screens loaded on demand (charts) open offline too.
 */
async function cacheAsset(cache, url, seen) {
  if (seen.has(url)) return;
  seen.add(url);
  let res = await cache.match(url);
  if (!res) {
    const r = await fetch(url, { cache: 'no-store' });
    if (!r.ok) return;
    await cache.put(url, r.clone());
    res = r;
  }
  if (url.endsWith('.js')) {
    const js = await res.text();
    await Promise.all(chunksOf(js).map((u) => cacheAsset(cache, u, seen)));
  }
}

async function precache() {
  const cache = await caches.open(CACHE);
  const res = await fetch('/', { cache: 'no-store' });
  if (!res.ok) throw new Error(`shell fetch failed: ${res.status}`);
  const html = await res.clone().text();
  await Promise.all(STATIC.slice(1).map(async (u) => {
    try {
      const r = await fetch(u, { cache: 'no-store' });
      if (r.ok) await cache.put(u, r);
    } catch { /* an icon missing must not block the shell */ }
  }));
  const seen = new Set();
  await Promise.all(assetsOf(html).map((u) => cacheAsset(cache, u, seen)));
  // index.html last: it is the key the tests and the fetch handler look for.
  await cache.put('/', res);
}

self.addEventListener('install', (event) => {
  event.waitUntil(precache().then(() => self.skipWaiting()));
});

self.addEventListener('activate', (event) => {
  event.waitUntil((async () => {
    for (const key of await caches.keys()) {
      if (key.startsWith('chargewalk-shell-') && key !== CACHE) await caches.delete(key);
    }
    await self.clients.claim();
  })());
});

/** Background refresh of the shell: new index.html -> fetch the bundles it names. */
async function refreshShell(cache) {
  try {
    const res = await fetch('/', { cache: 'no-store' });
    if (!res.ok) return;
    const html = await res.clone().text();
    const seen = new Set();
    await Promise.all(assetsOf(html).map((u) => cacheAsset(cache, u, seen)));
    // Only switch index.html once every bundle it names is in the cache.
    await cache.put('/', res);
  } catch { /* offline: keep what we have */ }
}

self.addEventListener('fetch', (event) => {
  const req = event.request;
  if (req.method !== 'GET') return;
  const url = new URL(req.url);
  if (url.origin !== self.location.origin) return;
  if (url.pathname.startsWith('/api/') || url.pathname === '/api') return; // straight to the network

  if (req.mode === 'navigate') {
    // Every navigation is the single-page shell (hash routes).
    event.respondWith((async () => {
      const cache = await caches.open(CACHE);
      const cached = await cache.match('/');
      const update = refreshShell(cache);
      if (cached) { event.waitUntil(update); return cached; }
      try { return await fetch(req); } catch { return new Response('chargewalk is offline and not cached yet.', { status: 503, headers: { 'content-type': 'text/plain' } }); }
    })());
    return;
  }

  event.respondWith((async () => {
    const cache = await caches.open(CACHE);
    const cached = await cache.match(req, { ignoreSearch: false });
    if (cached) {
      // Hashed bundles never change; other files refresh in the background.
      if (!url.pathname.startsWith('/assets/')) {
        event.waitUntil(fetch(req).then((r) => (r.ok ? cache.put(req, r) : undefined)).catch(() => undefined));
      }
      return cached;
    }
    const res = await fetch(req);
    if (res.ok && (url.pathname.startsWith('/assets/') || url.pathname.startsWith('/icons/'))) {
      await cache.put(req, res.clone());
    }
    return res;
  })());
});
