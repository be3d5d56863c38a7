/**
 * Issue 3 end to end in real Chromium with touch, on the invented demo site: enter a
 * reading on a roll spot (line model), see the charge estimate with its interval and
 * the hazard verdict; the same estimate beside the reading on the spot screen; run a
 * sweep and see the fitted log-log plot and the conclusion; save the sweep readings to
 * the round; read "How estimates are made". Screenshots at 768x1024 and 1024x768 go
 * to test-artifacts/.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startTestServer, type TestServer } from '../helpers/server';
import { call } from './fixtures';
import {
  LANDSCAPE, PORTRAIT, T, attr, count, openTablet, screenshot, startRound, tapDigits, text, waitAllSent, type Tablet,
} from './browser';
import type { Reading, SetupBundle, Site, Spot } from '../../core/schemas';

let srv: TestServer;
let tab: Tablet;
let roll: Spot;
let siteId: string;

beforeAll(async () => {
  srv = await startTestServer({ demo: true, clientDir: inject('clientDir') });
  const { sites } = await call<{ sites: Site[] }>(srv.baseUrl, 'GET', '/api/sites');
  siteId = sites[0]!.id;
  const setup = await call<SetupBundle>(srv.baseUrl, 'GET', `/api/sites/${siteId}/setup`);
  roll = setup.spots.find((s) => s.model === 'line' && s.objectKind === 'roll' && !s.retiredAt)!;
  tab = await openTablet(srv.baseUrl, PORTRAIT);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

/** Both orientations of the current screen. */
async function shots(name: string): Promise<void> {
  const { page } = tab;
  await page.setViewportSize(PORTRAIT);
  await page.waitForTimeout(150);
  await screenshot(page, `${name}-768x1024`);
  await page.setViewportSize(LANDSCAPE);
  await page.waitForTimeout(150);
  await screenshot(page, `${name}-1024x768`);
  await page.setViewportSize(PORTRAIT);
}

/** Non-transparent pixels on a canvas: the chart was really drawn. */
function inkedPixels(selector: string) {
  return () => tab.page.evaluate((sel) => {
    const c = document.querySelector<HTMLCanvasElement>(sel);
    if (!c || c.width === 0 || c.height === 0) return 0;
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let n = 0;
    for (let i = 3; i < d.length; i += 4) if (d[i]! > 0) n++;
    return n;
  }, selector);
}

const chartLoaded = () => tab.page.evaluate(() => performance.getEntriesByType('resource').some((e) => /sweep-chart/.test(e.name)));

describe('charge estimates and sweeps on the tablet (issue 3)', () => {
  it('shows the estimate with its interval and hazard verdict while a reading is entered on a roll', async () => {
    const { page } = tab;
    expect(roll).toBeDefined();
    await page.goto('/');
    await page.locator('[data-testid=start-round]').waitFor();
    const roundId = await startRound(page, 'T. Varga-Lund', '28');

    // Go to the roll through the route list.
    await page.locator('.route-toggle').tap();
    await page.locator(`.route-item[data-spot-id="${roll.id}"]`).tap();
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe(roll.name);
    await expect.poll(text(page.locator('[data-testid=estimate-hint]')), T).toContain('line / cylinder model');

    // Negative 25 kV/m at the spot's default 10 cm.
    await page.locator('[data-testid=polarity]').tap();
    await tapDigits(page, '25');
    await expect.poll(text(page.locator('[data-testid=live-field]')), T).toContain('−25.0 kV/m');
    const headline = page.locator('[data-testid=estimate-headline]');
    await expect.poll(text(headline), T).toMatch(/^Charge −[\d.]+\s[nµ]C \(−[\d.]+\s… −[\d.]+\s[nµ]C\), line \/ cylinder model$/);
    // The hazard verdict: colour AND word, with the numbers compared.
    const hazard = page.locator('[data-testid=estimate-hazard]');
    await expect.poll(attr(hazard, 'data-level'), T).toMatch(/^(ok|warn|alarm)$/);
    await expect.poll(text(hazard), T).toMatch(/(OK|WARN|ALARM)/);
    await expect.poll(text(hazard), T).toContain(' vs ');
    // Routine entry stays compact: the details are folded until asked for.
    expect(await page.locator('[data-testid=estimate-details]').evaluate((d) => (d as HTMLElement).hidden)).toBe(true);
    expect(await chartLoaded()).toBe(false); // chart.js is not loaded on the round screen
    await shots('estimate-entry');

    await page.locator('[data-testid=estimate-toggle]').tap();
    await expect.poll(text(page.locator('[data-testid=estimate-verdicts]')), T).toContain('Source:');
    await expect.poll(text(page.locator('[data-testid=estimate-details]')), T).toContain('Inputs: field −25.0 kV/m · gap to the surface 100 mm');
    await expect.poll(text(page.locator('[data-testid=estimate-caution]')), T).toContain('qualified people');
    // The details stay open while the value changes.
    await tapDigits(page, '0');
    await expect.poll(text(page.locator('[data-testid=live-field]')), T).toContain('−250 kV/m');
    expect(await page.locator('[data-testid=estimate-details]').evaluate((d) => (d as HTMLElement).hidden)).toBe(false);
    await expect.poll(attr(page.locator('[data-testid=estimate-toggle]'), 'aria-expanded'), T).toBe('true');
    await shots('estimate-entry-details');
    await page.locator('.entry .numpad [data-key="back"]').tap();
    await expect.poll(text(page.locator('[data-testid=live-field]')), T).toContain('−25.0 kV/m');

    await page.locator('[data-testid=save]').tap();
    await expect.poll(count(page.locator('[data-testid=round-readings] .reading-row')), T).toBe(1);
    await waitAllSent(page);
    const stored = await call<{ readings: Reading[] }>(srv.baseUrl, 'GET', `/api/rounds/${roundId}/readings`);
    const r = stored.readings[0]!;
    expect(r.estimate?.model).toBe('line');
    expect(r.estimate!.chargeC!).toBeLessThan(0);
    expect(r.hazards!.length).toBeGreaterThan(0);

    // The spot screen shows the same estimate beside the reading.
    await page.goto(`/#/spot/${roll.id}`);
    const card = page.locator(`.rev-card[data-reading-id="${r.id}"] .rev-estimate [data-testid=estimate-headline]`);
    await expect.poll(text(card), T).toMatch(/^Charge −[\d.]+\s[nµ]C \(−[\d.]+\s… −[\d.]+\s[nµ]C\), line \/ cylinder model$/);
    await shots('estimate-spot');
    expect(tab.errors).toEqual([]);
  }, 120_000);

  it('fits a sweep, plots it on log-log axes and saves the readings to the open round', async () => {
    const { page } = tab;
    await page.goto(`/#/spot/${roll.id}`);
    await page.locator('[data-testid=spot-sweep]').tap();
    await expect.poll(text(page.locator('[data-testid=sweep-title]')), T).toBe(roll.name);
    await expect.poll(text(page.locator('[data-testid=sweep-need]')), T).toContain('at least 3 readings');
    // Distances prefilled from the spot's default (10, 20, 40 cm); readings typed in kV/m.
    expect(await page.locator('[data-testid=sweep-d-0]').inputValue()).toBe('10');
    expect(await page.locator('[data-testid=sweep-d-2]').inputValue()).toBe('40');
    await page.locator('[data-testid=sweep-polarity]').tap();
    await page.locator('[data-testid=sweep-v-0]').fill('30');
    await page.locator('[data-testid=sweep-v-1]').fill('19');
    await page.locator('[data-testid=sweep-add]').tap();
    await page.locator('[data-testid=sweep-d-3]').fill('60');
    await page.locator('[data-testid=sweep-v-3]').fill('7.5');
    await page.locator('[data-testid=sweep-v-2]').fill('11');

    await expect.poll(attr(page.locator('[data-testid=sweep-chart]'), 'data-drawn'), T).toBe('4');
    await expect.poll(inkedPixels('[data-testid=sweep-chart]'), T).toBeGreaterThan(2000);
    expect(await chartLoaded()).toBe(true);
    await expect.poll(text(page.locator('[data-testid=sweep-conclusion]')), T).toMatch(/\w{4,}.*\w{4,}/);
    await expect.poll(text(page.locator('[data-testid=sweep-exponent]')), T).toMatch(/m = [\d.]+ ± [\d.]+/);
    await expect.poll(text(page.locator('[data-testid=sweep-best]')), T).toMatch(/Chosen: .+ model\./);
    await expect.poll(count(page.locator('[data-testid=sweep-ranking] tbody tr')), T).toBeGreaterThan(2);
    await expect.poll(count(page.locator('[data-testid=sweep-residuals] tbody tr')), T).toBe(4);
    await shots('sweep');
    await page.screenshot({ path: 'test-artifacts/sweep-full-768x1024.png', fullPage: true });

    // The round opened in the first test is open on this tablet: save the four readings to it.
    await page.locator('[data-testid=sweep-save]').tap();
    await page.locator('[data-testid=sweep-saved]').waitFor({ timeout: 15_000 });
    await waitAllSent(page);
    const { rounds } = await call<{ rounds: { id: string; surveyor: string }[] }>(srv.baseUrl, 'GET', `/api/sites/${siteId}/rounds`);
    const mine = rounds.find((x) => x.surveyor === 'T. Varga-Lund')!;
    const stored = await call<{ readings: Reading[] }>(srv.baseUrl, 'GET', `/api/rounds/${mine.id}/readings`);
    const sweepReadings = stored.readings.filter((x) => x.note.startsWith('sweep '));
    expect(sweepReadings.map((x) => x.distance.value).sort((a, b) => a - b)).toEqual([10, 20, 40, 60]);
    expect(sweepReadings.every((x) => x.polarity === '-' && x.unit === 'kV/m' && x.spotId === roll.id)).toBe(true);
    expect(tab.errors).toEqual([]);
  }, 120_000);

  it('bad sweep input is marked at the field; "How estimates are made" explains every model', async () => {
    const { page } = tab;
    await page.goto(`/#/sweep/${roll.id}`);
    await page.locator('[data-testid=sweep-v-0]').fill('-3');
    await expect.poll(attr(page.locator('[data-testid=sweep-v-0]'), 'aria-invalid'), T).toBe('true');
    await page.goto('/#/models');
    await expect.poll(text(page.locator('[data-testid=models-title]')), T).toBe('How estimates are made');
    await expect.poll(count(page.locator('.model-card')), T).toBe(12);
    await expect.poll(text(page.locator('.models-page')), T).toContain('web over a roller reads low');
    // The moving-web current with its worked example (arithmetic), the double layer, the bulk sphere, the plausibility limits
    await expect.poll(text(page.locator('[data-testid=models-web-current]')), T).toContain('5 µC/m² × 1.5 m × 4 m/s = 30 µA');
    await expect.poll(text(page.locator('[data-testid=models-web-current]')), T).toMatch(/double layer/);
    await expect.poll(text(page.locator('[data-model=bulk-cylinder]')), T).toContain('ρ·R/(3ε0)');
    await expect.poll(text(page.locator('[data-testid=models-plausibility]')), T).toMatch(/26\.6 µC\/m²[\s\S]*3 MV\/m/);
    await shots('models');

    // The area form's substance picker: the substance table with MIE and source.
    await page.goto('/#/setup/areas');
    await page.locator('.list-row', { hasText: 'Hall C' }).locator('button', { hasText: 'Edit' }).tap();
    const picker = page.locator('select[data-path="substanceId"]');
    await picker.waitFor();
    const options = await picker.locator('option').allTextContents();
    expect(options.length).toBeGreaterThan(20);
    // MIE propane 0.25 mJ, NFPA 77 (2000) Table B.1; minimum ignition charge 70 nC (BGR 132 Annex G Table 14)
    expect(options.find((o) => o.startsWith('Propane'))).toMatch(/MIE 0\.25 mJ \(NFPA 77 \(2000\) Table B\.1\).*ignition charge 70 nC/);
    await picker.scrollIntoViewIfNeeded();
    await shots('setup-area-substance');
    expect(tab.errors).toEqual([]);
  }, 60_000);
});
