// The HTTP shell: security headers, the static tablet client with SPA fallback
// and cache rules, the page shown when the client is not built, and health.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../helpers/server';
import { loadMigrations } from '../../server/store/sqlite/migrate';

let withClient: TestServer;
let noClient: TestServer;
const clientDir = mkdtempSync(join(tmpdir(), 'chargewalk-fake-client-'));

beforeAll(async () => {
  mkdirSync(join(clientDir, 'assets'));
  writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>chargewalk</title><div id="app"></div>');
  writeFileSync(join(clientDir, 'sw.js'), 'self.addEventListener("fetch", () => {});');
  writeFileSync(join(clientDir, 'assets', 'index-abc123.js'), 'console.log(1);');
  withClient = await startTestServer({ clientDir });
  noClient = await startTestServer();
});
afterAll(async () => {
  await withClient.close();
  await noClient.close();
  rmSync(clientDir, { recursive: true, force: true });
});

describe('security headers', () => {
  it('are on API answers and pages', async () => {
    for (const url of [`${withClient.baseUrl}/api/health`, `${withClient.baseUrl}/`]) {
      const r = await fetch(url);
      expect(r.headers.get('x-content-type-options')).toBe('nosniff');
      expect(r.headers.get('referrer-policy')).toBe('no-referrer');
      expect(r.headers.get('content-security-policy')).toContain("script-src 'self'");
      expect(r.headers.get('content-security-policy')).toContain("frame-ancestors 'none'");
      expect(r.headers.get('x-powered-by')).toBeNull();
    }
  });
});

describe('static client', () => {
  it('serves index.html at / and for any app path (SPA fallback), not cached', async () => {
    for (const path of ['/', '/round/123', '/spots/abc?x=1']) {
      const r = await fetch(`${withClient.baseUrl}${path}`);
      expect(r.status).toBe(200);
      expect(r.headers.get('content-type')).toContain('text/html');
      expect(r.headers.get('cache-control')).toBe('no-cache');
      expect(await r.text()).toContain('<div id="app">');
    }
  });

  it('serves the service worker with no-cache and hashed assets as immutable; a missing asset is 404', async () => {
    const sw = await fetch(`${withClient.baseUrl}/sw.js`);
    expect(sw.status).toBe(200);
    expect(sw.headers.get('cache-control')).toBe('no-cache');
    const asset = await fetch(`${withClient.baseUrl}/assets/index-abc123.js`);
    expect(asset.headers.get('cache-control')).toContain('immutable');
    expect((await fetch(`${withClient.baseUrl}/assets/index-old999.js`)).status).toBe(404);
    const api404 = await fetch(`${withClient.baseUrl}/api/nope`);
    expect(api404.status).toBe(404);
    expect(await api404.json()).toEqual({ error: { code: 'not-found', message: 'no API route GET /api/nope; see /api/openapi.json' } });
  });

  it('says the client is not built (503) while the API works', async () => {
    const page = await fetch(`${noClient.baseUrl}/`);
    expect(page.status).toBe(503);
    expect(await page.text()).toContain('npm run build');
    const health = await fetch(`${noClient.baseUrl}/api/health`);
    expect(health.status).toBe(200);
    expect(await health.json()).toEqual({ status: 'ok', database: { kind: 'sqlite', ok: true, schemaVersion: loadMigrations().length, quickCheck: 'ok' } });
  });
});
