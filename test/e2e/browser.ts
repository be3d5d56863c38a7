/**
 * Real Chromium for the browser tests: Debian's /usr/bin/chromium driven by
 * playwright-core, a fresh profile per test file, touch enabled, tablet sizes.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Locator, type Page } from 'playwright-core';

export const PORTRAIT = { width: 768, height: 1024 };
export const LANDSCAPE = { width: 1024, height: 768 };
export const ARTIFACTS = join(process.cwd(), 'test-artifacts');

export interface Tablet {
  context: BrowserContext;
  page: Page;
  errors: string[];
  close(): Promise<void>;
}

export async function openTablet(baseUrl: string, viewport = PORTRAIT): Promise<Tablet> {
  const profile = mkdtempSync(join(tmpdir(), 'chargewalk-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport, hasTouch: true, isMobile: false, baseURL: baseUrl,
  });
  const page = context.pages()[0] ?? await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  return {
    context, page, errors,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(ARTIFACTS, { recursive: true });
  const path = join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path, fullPage: false });
  return path;
}

/** Types digits on the on-screen pad of the reading entry by tapping its keys. */
export async function tapDigits(page: Page, digits: string, scope = '.entry'): Promise<void> {
  for (const d of digits) await page.locator(`${scope} .numpad [data-key="${d}"]`).tap();
}

/** Waits until the top bar says everything is on the server. */
export async function waitAllSent(page: Page, timeout = 20_000): Promise<void> {
  await page.locator('[data-testid=outbox-status]', { hasText: 'All on the server' }).waitFor({ timeout });
}

/**
 * Waits until the service worker controls the page and has cached the shell:
 * index.html and every bundle the current document loaded.
 * (page.waitForFunction does not await a promise, so this polls page.evaluate.)
 */
export async function waitServiceWorker(page: Page, timeout = 30_000): Promise<void> {
  const until = Date.now() + timeout;
  for (;;) {
    const ready = await page.evaluate(async () => {
      if (!navigator.serviceWorker.controller) return false;
      const wanted = ['/', ...[...document.querySelectorAll<HTMLScriptElement | HTMLLinkElement>('script[src], link[rel=stylesheet]')]
        .map((e) => new URL(e instanceof HTMLScriptElement ? e.src : e.href).pathname)];
      for (const k of await caches.keys()) {
        const c = await caches.open(k);
        const hits = await Promise.all(wanted.map((u) => c.match(u)));
        if (hits.every(Boolean)) return true;
      }
      return false;
    });
    if (ready) return;
    if (Date.now() > until) throw new Error('the service worker did not take control and cache the shell in time');
    await page.waitForTimeout(200);
  }
}

/** Starts a round from home: surveyor typed once, RH on the pad, the first meter. */
export async function startRound(page: Page, surveyor: string, rh = '41'): Promise<string> {
  await page.locator('[data-testid=start-round]').tap();
  await page.locator('input[aria-label="Surveyor name"]').fill(surveyor);
  await page.locator('[data-testid=rh]').tap();
  for (const d of rh) await page.locator(`.round-start .numpad [data-key="${d}"]`).tap();
  await page.locator('[data-testid=start]').tap();
  await page.locator('[data-testid=spot-name]').waitFor();
  const m = /#\/round\/([0-9a-f-]{36})/.exec(page.url());
  if (!m) throw new Error(`not on a round page: ${page.url()}`);
  return m[1]!;
}

/** Poll sources for vitest's expect.poll (playwright-core has no expect of its own); none of them waits by itself. */
export const T = { timeout: 15_000, interval: 100 };
export const text = (l: Locator) => () => l.allTextContents().then((a) => a.map((s) => s.trim()).join(' | '));
export const count = (l: Locator) => () => l.count();
export const attr = (l: Locator, name: string) => () => l.evaluateAll((els, n) => els[0]?.getAttribute(n) ?? null, name);
