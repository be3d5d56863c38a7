/**
 * Issue 5, hostile input: markup and script fragments typed as names, a
 * surveyor and a note are shown as text on every screen, and nothing executes.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startTestServer, type TestServer } from '../helpers/server';
import { call, makeFixture, type Fixture } from './fixtures';
import { PORTRAIT, T, openTablet, screenshot, startRound, tapDigits, text, waitAllSent, type Tablet } from './browser';

const IMG = '<img src=x onerror=window.__pwned=1>';
const SCRIPT = '<script>window.__pwned=1</script>';
const NOTE = `${SCRIPT} and ${IMG} "quoted" & <b>bold</b>`;

let srv: TestServer;
let fx: Fixture;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  // The meter is also past its calibration date: every reading it makes is flagged.
  fx = await makeFixture(srv.baseUrl, { spotCount: 2, spotNames: [IMG, SCRIPT], siteName: `Plant ${SCRIPT}`, calibrationDue: '2020-01-31' });
  tab = await openTablet(srv.baseUrl, PORTRAIT);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

const pwned = () => tab.page.evaluate(() => (window as unknown as { __pwned?: unknown }).__pwned);
/** Elements the hostile text would have made if it had been parsed as markup. */
const injected = () => tab.page.evaluate(() => document.querySelectorAll('img, b, #view script, #topbar script, dialog script').length);

describe('hostile text is shown as text (issue 5)', () => {
  it('names, surveyor and note with markup render literally on every screen and never run', async () => {
    const { page } = tab;
    await page.goto('/');
    await expect.poll(text(page.locator('.site-name')), T).toBe(`Plant ${SCRIPT}`);
    await expect.poll(text(page.locator('.spot-links')), T).toContain(IMG);

    const roundId = await startRound(page, `${IMG} Surveyor`);
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe(IMG);
    await tapDigits(page, '2.5');
    await page.locator('[data-testid=note]').tap();
    await page.locator('[data-testid=note-input]').fill(NOTE);
    await page.locator('[data-testid=note-done]').tap();
    await expect.poll(text(page.locator('[data-testid=note] .note-preview')), T).toBe(NOTE);
    await page.locator('[data-testid=save]').tap();
    await expect.poll(text(page.locator('[data-testid=round-readings] .r-note')), T).toBe(NOTE);
    await expect.poll(text(page.locator('[data-testid=cal-banner]')), T).toContain('was due for calibration on 2020-01-31');
    await expect.poll(text(page.locator('[data-testid=round-readings] .cal-chip')), T).toBe('meter overdue');
    await page.locator('[data-testid=next]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe(SCRIPT);
    await waitAllSent(page);
    await screenshot(page, 'hostile-round-768x1024');

    // Stored exactly as typed.
    const stored = await call<{ readings: { note: string; meterCalibrationOverdue: boolean }[] }>(srv.baseUrl, 'GET', `/api/spots/${fx.spotIds[0]}/readings`);
    expect(stored.readings.map((r) => r.note)).toEqual([NOTE]);
    expect(stored.readings[0]?.meterCalibrationOverdue).toBe(true);

    // Summary, spot screen, set-up, after a reload (text from the server and from IndexedDB).
    await page.locator('[data-testid=finish]').tap();
    await page.locator('[data-testid=finish-confirm]').tap();
    await page.waitForURL(`**/#/round/${roundId}/summary`);
    await expect.poll(text(page.locator('.summary h1')), T).toContain(`${IMG} Surveyor`);
    await expect.poll(text(page.locator('.summary table')), T).toContain(IMG);
    await page.reload();
    await page.goto(`/#/spot/${fx.spotIds[0]}`);
    await expect.poll(text(page.locator('[data-testid=spot-title]')), T).toBe(IMG);
    await expect.poll(text(page.locator('.rev-note')), T).toBe(NOTE);
    await expect.poll(text(page.locator('.rev-meta')), T).toContain(`${IMG} Surveyor`);
    await page.goto('/#/setup/spots');
    await expect.poll(text(page.locator('.route-edit')), T).toContain(SCRIPT);
    await page.goto('/#/setup/sites');
    await expect.poll(text(page.locator('.setup-section .list')), T).toContain(`Plant ${SCRIPT}`);
    await screenshot(page, 'hostile-setup-768x1024');

    expect(await pwned()).toBeUndefined();
    expect(await injected()).toBe(0);
    expect(tab.errors).toEqual([]);
  }, 90_000);
});
