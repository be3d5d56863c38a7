/**
 * Serves the built tablet client (dist/client by default) with an SPA fallback:
 * any GET outside /api that is not a file answers index.html. index.html, the
 * service worker and the manifest are served with no-cache (so an update reaches
 * the tablet); Vite's hashed files under /assets/ are immutable.
 * When the client is not built, pages answer 503 with a plain explanation while
 * the API keeps working.
 */
import { existsSync } from 'node:fs';
import { basename, join } from 'node:path';
import express, { type Router } from 'express';

const NO_CACHE = new Set(['index.html', 'sw.js', 'service-worker.js', 'registerSW.js', 'manifest.webmanifest', 'manifest.json']);

export function clientIsBuilt(clientDir: string): boolean {
  return existsSync(join(clientDir, 'index.html'));
}

const NOT_BUILT_PAGE = `<!doctype html><html lang="en"><meta charset="utf-8"><title>chargewalk: client not built</title>
<body><h1>The tablet client is not built</h1><p>The API works at <a href="/api/health">/api/health</a>.
Build the app with <code>npm run build</code>, or start with <code>npm start</code>, which builds it.</p></body></html>`;

export function staticClient(clientDir: string): Router {
  const router = express.Router();
  router.use(express.static(clientDir, {
    index: false,
    redirect: false,
    setHeaders(res, path) {
      const name = basename(path);
      if (NO_CACHE.has(name)) res.setHeader('Cache-Control', 'no-cache');
      else if (/[\\/]assets[\\/]/.test(path)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
      else res.setHeader('Cache-Control', 'no-cache');
      if (name === 'sw.js' || name === 'service-worker.js') res.setHeader('Service-Worker-Allowed', '/');
    },
  }));
  router.use((req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path.startsWith('/api/') || req.path === '/api') {
      next();
      return;
    }
    // A missing file (e.g. /assets/old-hash.js) is a 404, not the app's HTML.
    if (/\.[A-Za-z0-9]+$/.test(req.path) && !req.path.endsWith('.html')) {
      res.status(404).type('text/plain').send('not found');
      return;
    }
    if (!clientIsBuilt(clientDir)) {
      res.status(503).type('html').setHeader('Cache-Control', 'no-store').send(NOT_BUILT_PAGE);
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(join(clientDir, 'index.html'));
  });
  return router;
}
