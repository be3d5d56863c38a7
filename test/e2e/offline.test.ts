/**
 * Issue 5 in real Chromium: a round walked with no network, a reload while still
 * offline (the service worker serves the shell, IndexedDB the set-up and the
 * outbox), then back online: every reading on the server exactly once. Then the
 * same with the connection dropping in the middle of a batch: the server stored
 * the batch but the tablet never saw the answer; the resend is acknowledged as
 * duplicates and nothing is stored twice.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page, Route } from 'playwright-core';
import { startTestServer, type TestServer } from '../helpers/server';
import { call, makeFixture } from './fixtures';
import {
  PORTRAIT, T, count, openTablet, screenshot, startRound, tapDigits, text, waitAllSent, waitServiceWorker, type Tablet,
} from './browser';

let srv: TestServer;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  await makeFixture(srv.baseUrl, { spotCount: 5 });
  tab = await openTablet(srv.baseUrl, PORTRAIT);
  // First visit online: the service worker installs and caches the shell; the
  // home page caches the site's set-up in IndexedDB.
  await tab.page.goto('/');
  await tab.page.locator('[data-testid=start-round]').waitFor();
  await waitServiceWorker(tab.page);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

/** Ten readings: two on each of the five spots, values 1.1, 1.2, ... so each is distinct. */
async function walkTenReadings(page: Page, base: number): Promise<string[]> {
  const values: string[] = [];
  for (let s = 0; s < 5; s++) {
    for (let k = 0; k < 2; k++) {
      const v = `${base}.${s * 2 + k}`;
      await tapDigits(page, v);
      await page.locator('[data-testid=save]').tap();
      await expect.poll(count(page.locator('[data-testid=round-readings] .reading-row')), T).toBe(k + 1);
      values.push(v);
    }
    if (s < 4) await page.locator('[data-testid=next]').tap();
  }
  return values;
}

async function serverReadings(roundId: string): Promise<{ id: string; value: number }[]> {
  return (await call<{ readings: { id: string; value: number }[] }>(srv.baseUrl, 'GET', `/api/rounds/${roundId}/readings`)).readings;
}

describe('offline rounds and exactly-once sync (issue 5)', () => {
  it('walks a round offline, survives a reload offline, and sends every reading once when back online', async () => {
    const { page, context } = tab;
    await context.setOffline(true);
    await expect.poll(text(page.locator('.tb-conn')), T).toBe('Offline');
    const roundId = await startRound(page, 'J. Marsh-Ito');
    const values = await walkTenReadings(page, 2);
    await expect.poll(text(page.locator('[data-testid=outbox-status]')), T).toContain('10 readings saved on this tablet, not yet sent');
    expect(await serverReadings(roundId).catch(() => [])).toEqual([]);

    // Reload with no network: the shell comes from the service worker, the round from IndexedDB.
    await page.reload();
    await page.locator('[data-testid=spot-name]').waitFor();
    await expect.poll(text(page.locator('[data-testid=outbox-status]')), T).toContain('10 readings saved on this tablet, not yet sent');
    await expect.poll(count(page.locator('.route-item[data-status=ok]')), T).toBe(5);
    await expect.poll(count(page.locator('[data-testid=round-readings] [data-sync=local]')), T).toBe(2);
    await page.goto('/#/outbox');
    await expect.poll(text(page.locator('.outbox h2')), T).toContain('Waiting to be sent (11)'); // the round start and 10 readings
    await screenshot(page, 'offline-outbox-768x1024');
    await page.goto(`/#/round/${roundId}/summary`);
    await expect.poll(text(page.locator('[data-testid=sum-readings] .stat-value')), T).toBe('10');
    await expect.poll(text(page.locator('[data-testid=summary-sync]')), T).toContain('10 readings of this round saved on this tablet');
    await screenshot(page, 'offline-summary-768x1024');

    // Back online: the outbox empties by itself.
    await context.setOffline(false);
    await waitAllSent(page, 30_000);
    const stored = await serverReadings(roundId);
    expect(stored).toHaveLength(10);
    expect(new Set(stored.map((r) => r.id)).size).toBe(10);
    expect(stored.map((r) => r.value).sort((a, b) => a - b)).toEqual(values.map(Number).sort((a, b) => a - b));
    await expect.poll(text(page.locator('[data-testid=summary-sync]')), T).toContain('Everything in this round is on the server');
    expect(tab.errors).toEqual([]);
  }, 120_000);

  it('stores a batch exactly once when the connection drops after the server stored it', async () => {
    const { page, context } = tab;
    await page.goto('/');
    await page.locator('[data-testid=start-round]').waitFor();
    await context.setOffline(true);
    const roundId = await startRound(page, 'J. Marsh-Ito');
    await walkTenReadings(page, 3);

    // The first POST /api/readings reaches the server (which commits it) and then
    // the connection "drops": the tablet sees a network error instead of the acks.
    const seen: { attempt: number; sent: number; statuses: string[] }[] = [];
    let attempt = 0;
    await page.route('**/api/readings', async (route: Route) => {
      attempt++;
      const n = attempt;
      const sent = (route.request().postDataJSON() as { readings: unknown[] }).readings.length;
      const res = await route.fetch();
      const body = await res.json() as { acks: { status: string }[] };
      seen.push({ attempt: n, sent, statuses: body.acks.map((a) => a.status) });
      if (n === 1) await route.abort('connectionreset');
      else await route.fulfill({ response: res });
    });
    await context.setOffline(false);
    await waitAllSent(page, 30_000);
    await page.unroute('**/api/readings');

    expect(seen[0]).toEqual({ attempt: 1, sent: 10, statuses: Array(10).fill('stored') });
    expect(seen[1]).toEqual({ attempt: 2, sent: 10, statuses: Array(10).fill('duplicate') });
    expect(seen).toHaveLength(2);
    const stored = await serverReadings(roundId);
    expect(stored).toHaveLength(10);
    expect(new Set(stored.map((r) => r.id)).size).toBe(10);
    await expect.poll(count(page.locator('[data-testid=round-readings] [data-sync=server]')), T).toBe(2);
    expect(tab.errors).toEqual([]);
  }, 120_000);
});
