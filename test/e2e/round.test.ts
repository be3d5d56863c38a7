/**
 * Issue 2 end to end in real Chromium at 768x1024 with touch: start a round,
 * enter readings for three spots (one over its alarm level), see the verdicts,
 * finish, reload, and find the readings on the spot screen. Screenshots of every
 * screen at 768x1024 and 1024x768 go to test-artifacts/.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startTestServer, type TestServer } from '../helpers/server';
import { call, makeFixture, type Fixture } from './fixtures';
import {
  LANDSCAPE, PORTRAIT, T, attr, count, openTablet, screenshot, startRound, tapDigits, text, waitAllSent, type Tablet,
} from './browser';

let srv: TestServer;
let fx: Fixture;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  // Limit set: field warn 5 kV/m, alarm 10 kV/m (test/e2e/fixtures.ts).
  fx = await makeFixture(srv.baseUrl, { spotCount: 4, spotNames: ['Rework bench 3', 'Film unwind roll A', 'Solder station 1', 'Tote rack'] });
  tab = await openTablet(srv.baseUrl, PORTRAIT);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

describe('a round on the tablet (issue 2)', () => {
  it('walks three spots with touch, shows verdicts, finishes, and finds the readings after a reload', async () => {
    const { page } = tab;
    await page.goto('/');
    await page.locator('.site-name', { hasText: 'Test plant Northfield' }).waitFor();
    await screenshot(page, 'home-768x1024');
    await page.setViewportSize(LANDSCAPE);
    await screenshot(page, 'home-1024x768');
    await page.setViewportSize(PORTRAIT);

    const roundId = await startRound(page, 'R. Okonkwo-Lind', '38');

    // Spot 1: a routine reading: digits, then Save (unit and distance prefilled).
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Rework bench 3');
    await expect.poll(text(page.locator('[data-testid=unit]')), T).toBe('kV/m');
    await expect.poll(text(page.locator('[data-testid=distance]')), T).toContain('10 cm');
    await tapDigits(page, '1.2');
    await expect.poll(text(page.locator('[data-testid=live-field]')), T).toContain('1.20 kV/m');
    await expect.poll(attr(page.locator('[data-testid=live-verdict] [data-verdict]'), 'data-verdict'), T).toBe('ok');
    await page.locator('[data-testid=save]').tap();
    await expect.poll(count(page.locator('[data-testid=round-readings] .reading-row')), T).toBe(1);

    // Spot 2: over the warn level (5 kV/m).
    await page.locator('[data-testid=next]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Film unwind roll A');
    await tapDigits(page, '6.5');
    await expect.poll(attr(page.locator('[data-testid=live-verdict] [data-verdict]'), 'data-verdict'), T).toBe('warn');
    await page.locator('[data-testid=save]').tap();
    await expect.poll(count(page.locator('[data-testid=round-readings] [data-verdict=warn]')), T).toBe(1);

    // Spot 3: negative and over the alarm level (10 kV/m): digits + polarity + Save.
    await page.locator('[data-testid=next]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe('Solder station 1');
    await page.locator('[data-testid=polarity]').tap();
    await tapDigits(page, '12.5');
    await expect.poll(text(page.locator('[data-testid=value-display]')), T).toBe('−12.5');
    await expect.poll(text(page.locator('[data-testid=live-field]')), T).toContain('−12.5 kV/m');
    const verdict = page.locator('[data-testid=live-verdict]');
    await expect.poll(attr(verdict.locator('[data-verdict]'), 'data-verdict'), T).toBe('alarm');
    await expect.poll(text(verdict), T).toContain('ALARM'); // a word, not colour alone
    await expect.poll(text(verdict), T).toContain('at or above the alarm level 10.0 kV/m');
    await screenshot(page, 'round-entry-768x1024');
    await page.setViewportSize(LANDSCAPE);
    await screenshot(page, 'round-entry-1024x768');
    await page.setViewportSize(PORTRAIT);
    await page.locator('[data-testid=save]').tap();
    await expect.poll(count(page.locator('[data-testid=round-readings] [data-verdict=alarm]')), T).toBe(1);

    // The route shows each spot's worst verdict.
    await waitAllSent(page);
    await expect.poll(attr(page.locator(`.route-item[data-spot-id="${fx.spotIds[0]}"]`), 'data-status'), T).toBe('ok');
    await expect.poll(attr(page.locator(`.route-item[data-spot-id="${fx.spotIds[1]}"]`), 'data-status'), T).toBe('warn');
    await expect.poll(attr(page.locator(`.route-item[data-spot-id="${fx.spotIds[2]}"]`), 'data-status'), T).toBe('alarm');
    await expect.poll(attr(page.locator(`.route-item[data-spot-id="${fx.spotIds[3]}"]`), 'data-status'), T).toBe('not yet');
    await expect.poll(count(page.locator('[data-testid=cal-banner]')), T).toBe(0);
    await expect.poll(count(page.locator('[data-testid=round-readings] [data-sync=server]')), T).toBe(1);

    // Skip the fourth spot with a reason from the pick-list.
    await page.locator('[data-testid=next]').tap();
    await page.locator('[data-testid=skip]').tap();
    await page.locator('dialog[open] .pick', { hasText: 'Line not running' }).tap();
    await expect.poll(attr(page.locator(`.route-item[data-spot-id="${fx.spotIds[3]}"]`), 'data-status'), T).toBe('skipped');

    // Finish -> summary.
    await page.locator('[data-testid=finish]').tap();
    await page.locator('[data-testid=finish-confirm]').tap();
    await page.waitForURL(`**/#/round/${roundId}/summary`);
    await expect.poll(text(page.locator('[data-testid=sum-readings] .stat-value')), T).toBe('3');
    await expect.poll(text(page.locator('[data-testid=sum-warnings] .stat-value')), T).toBe('1');
    await expect.poll(text(page.locator('[data-testid=sum-alarms] .stat-value')), T).toBe('1');
    await expect.poll(text(page.locator('[data-testid=sum-skipped] .stat-value')), T).toBe('1');
    await expect.poll(text(page.locator('[data-testid=sum-not-measured] .stat-value')), T).toBe('0');
    await waitAllSent(page);
    await screenshot(page, 'summary-768x1024');
    await page.setViewportSize(LANDSCAPE);
    await screenshot(page, 'summary-1024x768');
    await page.setViewportSize(PORTRAIT);

    // The server agrees.
    const summary = await call<{ readings: number; warnings: number; alarms: number; skipped: { reason: string }[]; round: { endedAt: string | null } }>(srv.baseUrl, 'GET', `/api/rounds/${roundId}`);
    expect(summary).toMatchObject({ readings: 3, warnings: 1, alarms: 1 });
    expect(summary.skipped.map((k) => k.reason)).toEqual(['Line not running']);
    expect(summary.round.endedAt).not.toBeNull();

    // Reload, then the spot screen of the alarm spot shows the reading.
    await page.reload();
    await page.goto(`/#/spot/${fx.spotIds[2]}`);
    await expect.poll(text(page.locator('[data-testid=spot-title]')), T).toBe('Solder station 1');
    const card = page.locator('[data-testid=spot-readings] .rev-card');
    await expect.poll(count(card), T).toBe(1);
    await expect.poll(text(card), T).toContain('−12.5 kV/m');
    await expect.poll(attr(card.locator('[data-verdict]'), 'data-verdict'), T).toBe('alarm');
    await expect.poll(text(card), T).toContain('R. Okonkwo-Lind');
    await expect.poll(text(card), T).toContain('RH 38 %');
    await screenshot(page, 'spot-768x1024');

    // Correct it (history kept, struck through with the reason), as the spot screen offers.
    await card.locator('[data-testid=correct]').tap();
    const sheet = page.locator('dialog[open]');
    await sheet.locator('.numpad [data-key=back]').tap();
    await sheet.locator('.numpad [data-key="4"]').tap();
    await sheet.locator('[data-testid=correction-reason]').fill('Wrong value typed');
    await sheet.locator('[data-testid=save-correction]').tap();
    await expect.poll(text(page.locator('[data-testid=spot-readings] .rev-head .rev-value').first()), T).toBe('−12.4 kV/m');
    await expect.poll(count(page.locator('[data-state=superseded] .is-struck')), T).toBe(1);
    await expect.poll(text(page.locator('[data-testid=superseded-reason]')), T).toContain('Wrong value typed');
    await expect.poll(text(page.locator('.rev-head .rev-meta').first()), T).toContain('RH 38 %'); // kept from the original
    await waitAllSent(page);
    const hist = await call<{ readings: { id: string; supersededById: string | null; value: number }[] }>(srv.baseUrl, 'GET', `/api/spots/${fx.spotIds[2]}/readings?history=1`);
    expect(hist.readings.map((r) => r.value).sort()).toEqual([12.4, 12.5]);
    await page.reload();
    await expect.poll(count(page.locator('[data-state=superseded] .is-struck')), T).toBe(1);
    await page.setViewportSize(LANDSCAPE);
    await screenshot(page, 'spot-1024x768');

    // Every spot with a reading has exactly one on the server.
    for (const [i, n] of [[0, 1], [1, 1], [3, 0]] as const) {
      const r = await call<{ readings: unknown[] }>(srv.baseUrl, 'GET', `/api/spots/${fx.spotIds[i]}/readings`);
      expect(r.readings).toHaveLength(n);
    }
    expect(tab.errors).toEqual([]);
  }, 120_000);

  it('shows the set-up screens and puts schema messages beside their fields', async () => {
    const { page } = tab;
    await page.setViewportSize(PORTRAIT);
    await page.goto('/#/setup/spots');
    await expect.poll(count(page.locator('.route-edit .list-row')), T).toBe(4);
    await screenshot(page, 'setup-spots-768x1024');
    await page.setViewportSize(LANDSCAPE);
    await page.goto('/#/setup/limit-sets');
    await page.locator('.rule-summary').first().waitFor();
    await screenshot(page, 'setup-limit-sets-1024x768');

    // A meter with no serial and a bad accuracy: messages beside the fields, nothing sent.
    await page.goto('/#/setup/meters');
    await page.locator('[data-testid=new]').tap();
    const form = page.locator('form.form');
    await form.locator('[data-path=accuracyRel]').fill('7');
    await form.locator('[data-testid=save-form]').tap();
    await expect.poll(text(form.locator('[data-error-for=serial]')), T).toBe('serial number is required');
    await expect.poll(text(form.locator('[data-error-for=accuracyRel]')), T).toContain('accuracy must be a fraction');
    await expect.poll(attr(form.locator('[data-path=serial]'), 'aria-invalid'), T).toBe('true');
    await screenshot(page, 'setup-meter-errors-1024x768');
    const meters = await call<{ meters: unknown[] }>(srv.baseUrl, 'GET', `/api/sites/${fx.siteId}/setup`);
    expect(meters.meters).toHaveLength(1);

    // Route order: move the second spot of the first area up.
    await page.goto('/#/setup/spots');
    await page.locator('.route-edit').first().locator('button[aria-label="move Film unwind roll A up"]').tap();
    await expect.poll(text(page.locator('.route-edit').first().locator('.list-row').first()), T).toContain('Film unwind roll A');
    const setup = await call<{ spots: { name: string; routePosition: number; areaId: string }[] }>(srv.baseUrl, 'GET', `/api/sites/${fx.siteId}/setup`);
    const first = setup.spots.filter((s) => s.areaId === fx.areaIds[0]).sort((a, b) => a.routePosition - b.routePosition)[0];
    expect(first?.name).toBe('Film unwind roll A');
    expect(tab.errors).toEqual([]);
  }, 60_000);
});
