/**
 * Issue 5 in real Chromium: the set-up changes on the server while the tablet is
 * offline, and a resent id meets different content on the server. Two readings
 * are taken offline; meanwhile the server retires the first spot, and another
 * client stores a different reading under the second reading's id. Back online:
 * the first is stored and shown flagged "spot retired" (round screen, summary,
 * spot screen); the second is reported as a conflict on the tablet and kept for
 * review on the server, never applied over the stored one and never dropped.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { v7 as uuidv7 } from 'uuid';
import { startTestServer, type TestServer } from '../helpers/server';
import { call, makeFixture, type Fixture } from './fixtures';
import { PORTRAIT, T, attr, count, openTablet, screenshot, startRound, tapDigits, text, type Tablet } from './browser';

let srv: TestServer;
let fx: Fixture;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  fx = await makeFixture(srv.baseUrl, { spotCount: 3, spotNames: ['Rework <b>bench</b> 3', 'Film unwind roll A', 'Tote rack'] });
  tab = await openTablet(srv.baseUrl, PORTRAIT);
  await tab.page.goto('/');
  await tab.page.locator('[data-testid=start-round]').waitFor(); // set-up cached in IndexedDB
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

interface ServerReading { id: string; value: number; flags: { code: string; message: string }[] }

describe('set-up changed while offline, and a conflicting resend (issue 5)', () => {
  it('keeps a reading of a spot retired meanwhile, flagged on every screen, and shows a conflict kept for review', async () => {
    const { page, context } = tab;
    await context.setOffline(true);
    await expect.poll(text(page.locator('.tb-conn')), T).toBe('Offline');
    const roundId = await startRound(page, 'K. Varga');

    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Rework <b>bench</b> 3');
    await tapDigits(page, '1.5');
    await page.locator('[data-testid=save]').tap();
    const row0 = page.locator('[data-testid=round-readings] .reading-row');
    await expect.poll(count(row0), T).toBe(1);
    await expect.poll(attr(row0.locator('[data-sync]'), 'data-sync'), T).toBe('local');
    await expect.poll(text(row0.locator('[data-sync]')), T).toBe('saved on this tablet');
    const retiredReadingId = (await row0.getAttribute('data-reading-id'))!;

    await page.locator('[data-testid=next]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Film unwind roll A');
    await tapDigits(page, '2.5');
    await page.locator('[data-testid=save]').tap();
    await expect.poll(count(page.locator('[data-testid=round-readings] .reading-row')), T).toBe(1);
    const conflictReadingId = (await page.locator('[data-testid=round-readings] .reading-row').getAttribute('data-reading-id'))!;
    expect(retiredReadingId).not.toBe(conflictReadingId);

    // Meanwhile, on the server: the first spot is retired, and another client
    // stores a different reading (9 kV/m, another round) under the second reading's id.
    await call(srv.baseUrl, 'POST', `/api/spots/${fx.spotIds[0]}/retire`, { reason: 'Bench removed in the re-layout' });
    const otherRound = uuidv7();
    await call(srv.baseUrl, 'POST', '/api/rounds', { id: otherRound, siteId: fx.siteId, surveyor: 'Other tablet', startedAt: new Date().toISOString() });
    const held = await call<{ acks: { status: string }[] }>(srv.baseUrl, 'POST', '/api/readings', {
      id: conflictReadingId, roundId: otherRound, spotId: fx.spotIds[1], meterId: fx.meterId, takenAt: new Date().toISOString(),
      value: 9, unit: 'kV/m', polarity: '+', distance: { value: 10, unit: 'cm' }, zeroed: true,
    });
    expect(held.acks.map((a) => a.status)).toEqual(['stored']);

    // Back online: the outbox syncs by itself.
    await context.setOffline(false);
    const here = page.locator('[data-testid=round-readings] .reading-row');
    await expect.poll(attr(here.locator('[data-sync]'), 'data-sync'), { ...T, timeout: 30_000 }).toBe('conflict');
    await expect.poll(text(here.locator('[data-sync]')), T).toContain('kept for review');

    // The server kept its own reading and the resent one for review: nothing overwritten, nothing dropped.
    const kept = await call<{ reading: ServerReading }>(srv.baseUrl, 'GET', `/api/readings/${conflictReadingId}`);
    expect(kept.reading.value).toBe(9);
    const conflicts = await call<{ conflicts: unknown[] }>(srv.baseUrl, 'GET', '/api/conflicts');
    expect(JSON.stringify(conflicts)).toContain(conflictReadingId);
    expect(JSON.stringify(conflicts)).toContain('2.5');

    // The reading of the retired spot is stored once, flagged, and the tablet shows the flag.
    const stored = await call<{ reading: ServerReading }>(srv.baseUrl, 'GET', `/api/readings/${retiredReadingId}`);
    expect(stored.reading.value).toBe(1.5);
    expect(stored.reading.flags.map((f) => f.code)).toEqual(['spot-retired']);
    const inRound = await call<{ readings: ServerReading[] }>(srv.baseUrl, 'GET', `/api/rounds/${roundId}/readings`);
    expect(inRound.readings.map((r) => r.id)).toEqual([retiredReadingId]);

    await page.locator('[data-testid=prev]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Rework <b>bench</b> 3');
    const flagged = page.locator('[data-testid=round-readings] .reading-row');
    await expect.poll(attr(flagged.locator('[data-sync]'), 'data-sync'), T).toBe('server');
    await expect.poll(text(flagged.locator('[data-testid=reading-flag]')), T).toBe('⚑ spot retired');
    await screenshot(page, 'offline-retired-flag-768x1024');

    // The outbox lists the conflict under "Needs attention".
    await page.goto('/#/outbox');
    await expect.poll(text(page.locator('.outbox h2').first()), T).toBe('Needs attention (1)');
    await expect.poll(count(page.locator('.outbox [data-sync=conflict]')), T).toBe(1);
    // It asked the browser to keep its storage, and says in words what it got.
    const persisted = await page.evaluate(() => navigator.storage.persisted());
    await expect.poll(attr(page.locator('[data-testid=storage-mode]'), 'data-mode'), T).toBe(persisted ? 'persistent' : 'best-effort');
    await expect.poll(text(page.locator('[data-testid=storage-mode]')), T).toMatch(/^Storage: (kept|best effort)\./);

    // The round summary's table flags it too.
    await page.goto(`/#/round/${roundId}/summary`);
    await expect.poll(text(page.locator('table [data-testid=reading-flag]')), T).toBe('⚑ spot retired');

    // The spot screen shows the flag in words, with the reason the spot was retired.
    await page.goto(`/#/spot/${fx.spotIds[0]}`);
    const flag = page.locator('[data-testid=spot-readings] [data-testid=reading-flag]');
    await expect.poll(count(flag), T).toBe(1);
    await expect.poll(text(flag), T).toContain('Bench removed in the re-layout');
    await expect.poll(text(page.locator('[data-testid=spot-title]')), T).toBe('Rework <b>bench</b> 3'); // text, not markup
    await screenshot(page, 'offline-retired-spot-768x1024');
    expect(tab.errors).toEqual([]);
  }, 120_000);
});
