/**
 * Issue 4 in real Chromium with touch: a floor plan uploaded (an SVG made safe,
 * and a file type refused with the server's message), a spot placed by a touch
 * drag from the list and found in place after a reload, a pin tapped to open its
 * spot; the label sheet's QR codes read back (jsQR on the pixels the page drew)
 * to the spot's scan address; the scan screen with no camera and a typed code;
 * a CSV import whose preview lists the invalid rows by number.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import jsQR from 'jsqr';
import { startTestServer, type TestServer } from '../helpers/server';
import { call, makeFixture, type Fixture } from './fixtures';
import { LANDSCAPE, PORTRAIT, T, attr, count, openTablet, screenshot, text, type Tablet } from './browser';
import type { Page } from 'playwright-core';

let srv: TestServer;
let fx: Fixture;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  fx = await makeFixture(srv.baseUrl, { spotCount: 6, spotNames: ['Rework bench 3', 'Reel cart', 'Solder station 1', 'Film unwind roll A', 'Core cart', 'Tote rack'] });
  tab = await openTablet(srv.baseUrl, LANDSCAPE);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

const PLAN_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="800" viewBox="0 0 1200 800">
<rect x="0" y="0" width="1200" height="800" fill="#f4f6f8" stroke="#223" stroke-width="8"/>
<rect x="60" y="60" width="500" height="300" fill="none" stroke="#223" stroke-width="4"/>
<text x="80" y="110" font-size="40" font-family="sans-serif">Assembly EPA</text>
<rect x="640" y="60" width="500" height="680" fill="none" stroke="#223" stroke-width="4"/>
<text x="660" y="110" font-size="40" font-family="sans-serif">Bench row</text>
<script>alert('x')</script>
<image href="https://example.invalid/tracker.png" x="0" y="0" width="10" height="10"/>
</svg>`;

/** A touch drag through Chrome DevTools Protocol touch events (pointerType 'touch' in the page). */
async function touchDrag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }, steps = 12): Promise<void> {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x: from.x, y: from.y }] });
  for (let i = 1; i <= steps; i++) {
    const x = from.x + ((to.x - from.x) * i) / steps;
    const y = from.y + ((to.y - from.y) * i) / steps;
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x, y }] });
  }
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await cdp.detach();
}

async function centre(page: Page, selector: string): Promise<{ x: number; y: number }> {
  const b = await page.locator(selector).first().boundingBox();
  if (!b) throw new Error(`no box for ${selector}`);
  return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
}

describe('floor plan, labels, scan and CSV import (issue 4)', () => {
  it('uploads a plan, refuses other files, and places a spot by touch-drag that is still there after a reload', async () => {
    const { page } = tab;
    await page.goto('/');
    await page.locator('.site-name').waitFor();
    await page.locator('[data-testid=nav-plans]').tap();
    await page.locator('[data-testid=plan-area]').first().tap();
    await page.waitForURL(`**/#/plan/${fx.areaIds[0]}`);
    await expect.poll(count(page.locator('[data-testid=unplaced-item]')), T).toBe(3);

    // A text file is refused with the server's message.
    await page.locator('[data-testid=plan-file]').setInputFiles({ name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('not a plan') });
    await expect.poll(text(page.locator('[data-testid=plan-error]')), T).toMatch(/Not uploaded: .+/);

    // An SVG with a script and an outside image: stored without them, and the screen says what was removed.
    await page.locator('[data-testid=plan-file]').setInputFiles({ name: 'hall.svg', mimeType: 'image/svg+xml', buffer: Buffer.from(PLAN_SVG) });
    await expect.poll(text(page.locator('[data-testid=plan-removed]')), T).toMatch(/script/i);
    await page.locator('.plan-img').waitFor({ state: 'visible' });
    await expect.poll(() => page.locator('.plan-img').evaluate((i: HTMLImageElement) => i.naturalWidth), T).toBeGreaterThan(0);

    // Touch-drag the first unplaced spot onto the plan at (30 %, 40 %).
    const img = await page.locator('.plan-img').boundingBox();
    if (!img) throw new Error('no plan image');
    const target = { x: img.x + img.width * 0.3, y: img.y + img.height * 0.4 };
    const spotId = (await page.locator('[data-testid=unplaced-item]').first().getAttribute('data-spot-id'))!;
    await touchDrag(page, await centre(page, `[data-testid=unplaced-item][data-spot-id="${spotId}"]`), target);
    const pin = page.locator(`.pin-layer .pin[data-spot-id="${spotId}"]`);
    await expect.poll(count(pin), T).toBe(1);
    await expect.poll(async () => {
      const r = await call<{ pins: { spotId: string; position: { x: number; y: number } | null }[] }>(srv.baseUrl, 'GET', `/api/areas/${fx.areaIds[0]}/pins`);
      return r.pins.find((p) => p.spotId === spotId)?.position ?? null;
    }, T).toMatchObject({ x: expect.closeTo(0.3, 1), y: expect.closeTo(0.4, 1) });

    // Move it by dragging the pin itself to (70 %, 60 %).
    const to = { x: img.x + img.width * 0.7, y: img.y + img.height * 0.6 };
    await touchDrag(page, await centre(page, `.pin-layer .pin[data-spot-id="${spotId}"]`), to);
    await expect.poll(async () => {
      const r = await call<{ pins: { spotId: string; position: { x: number; y: number } | null }[] }>(srv.baseUrl, 'GET', `/api/areas/${fx.areaIds[0]}/pins`);
      const p = r.pins.find((x) => x.spotId === spotId)?.position;
      return p ? [Math.round(p.x * 100), Math.round(p.y * 100)] : null;
    }, T).toEqual([70, 60]);

    // After a reload the pin is where it was put, labelled with the code AND the verdict word.
    await page.reload();
    await expect.poll(count(pin), T).toBe(1);
    await expect.poll(text(pin), T).toMatch(/T0\d\s*none/);
    const box = (await pin.boundingBox())!;
    const img2 = (await page.locator('.plan-img').boundingBox())!;
    expect((box.x + box.width / 2 - img2.x) / img2.width).toBeCloseTo(0.7, 1);
    expect((box.y + box.height / 2 - img2.y) / img2.height).toBeCloseTo(0.6, 1);
    expect(box.height).toBeGreaterThanOrEqual(48);
    await screenshot(page, 'plan-1024x768');
    await page.setViewportSize(PORTRAIT);
    await screenshot(page, 'plan-768x1024');
    await page.setViewportSize(LANDSCAPE);

    // A tap (no drag) on the pin opens the spot.
    await pin.tap();
    await page.waitForURL(`**/#/spot/${spotId}`);
    expect(tab.errors).toEqual([]);
  }, 120_000);

  it('prints labels whose QR codes read back to the spot scan address', async () => {
    const { page } = tab;
    const api = await call<{ labels: { spotId: string; code: string; url: string }[] }>(srv.baseUrl, 'GET', `/api/sites/${fx.siteId}/labels`);
    await page.goto('/#/labels');
    const imgs = page.locator('[data-testid=label-grid] img.label-qr');
    await expect.poll(count(imgs), T).toBe(6);
    await expect.poll(() => imgs.first().evaluate((i: HTMLImageElement) => i.complete && i.naturalWidth > 0), T).toBe(true);
    await screenshot(page, 'labels-1024x768');
    await page.setViewportSize(PORTRAIT);
    await screenshot(page, 'labels-768x1024');
    await page.setViewportSize(LANDSCAPE);
    // The pixels the page drew for the first label, decoded with jsQR.
    const px = await imgs.first().evaluate((i: HTMLImageElement) => {
      const c = document.createElement('canvas');
      c.width = 400; c.height = 400;
      const g = c.getContext('2d')!;
      g.fillStyle = '#fff'; g.fillRect(0, 0, 400, 400);
      g.drawImage(i, 20, 20, 360, 360);
      return Array.from(g.getImageData(0, 0, 400, 400).data);
    });
    const decoded = jsQR(Uint8ClampedArray.from(px), 400, 400);
    const code = await page.locator('.label-card').first().getAttribute('data-code');
    const label = api.labels.find((l) => l.code === code)!;
    expect(decoded?.data).toBe(label.url);
    expect(decoded?.data).toContain(`#/scan/${code}`);
    const pdf = await page.pdf({ format: 'A4' });
    expect(pdf.length).toBeGreaterThan(1000);
  }, 60_000);

  it('scan: says there is no camera, and a typed code opens the spot', async () => {
    const { page } = tab;
    await page.goto('/#/scan');
    await expect.poll(text(page.locator('[data-testid=scan-status]')), T).toMatch(/camera|HTTPS/i);
    await expect.poll(text(page.locator('[data-testid=scan-status]')), T).toMatch(/Type the code/);
    await screenshot(page, 'scan-1024x768');
    await page.locator('[data-testid=scan-code]').fill('T02');
    await page.locator('[data-testid=scan-open]').tap();
    await page.waitForURL(`**/#/spot/${fx.spotIds[1]}`);
    await page.goto('/#/scan/NOPE-9');
    await expect.poll(text(page.locator('[data-testid=scan-status]')), T).toContain('No spot with the code NOPE-9');
  }, 60_000);

  it('CSV import: maps columns, lists each invalid row by number, imports the valid rows once', async () => {
    const { page } = tab;
    const csv = [
      'Spot,Taken at,Value,Unit,Distance,RH',
      'T01,2026-01-05 10:00,1.2,kV/m,10,40',
      'T02,2026-01-05 10:05,abc,kV/m,10,40',
      'T99,2026-01-05 10:10,2.0,kV/m,10,40',
      'T03,2026-01-05 10:15,3.4,kV/m,10,41',
    ].join('\n');
    await page.goto('/#/data');
    await page.locator('[data-testid=csv-text]').fill(csv);
    await expect.poll(() => page.locator('select[data-field=spot]').inputValue(), T).toBe('Spot');
    await expect.poll(() => page.locator('select[data-field=takenAt]').inputValue(), T).toBe('Taken at');
    await expect.poll(() => page.locator('select[data-field=value]').inputValue(), T).toBe('Value');
    await expect.poll(() => page.locator('select[data-field=rhPercent]').inputValue(), T).toBe('RH');
    await page.locator('select[aria-label="Default meter"]').selectOption(fx.meterId);
    await page.locator('input[aria-label="Default distance"]').fill('10');
    await page.locator('select[aria-label="Default distance unit"]').selectOption('cm');
    await page.locator('input[aria-label="Default surveyor"]').fill('Imported from paper');
    await page.locator('[data-testid=csv-preview-btn]').tap();
    const invalid = page.locator('[data-testid=invalid-rows] li');
    await expect.poll(count(invalid), T).toBe(2);
    await expect.poll(attr(invalid.first(), 'data-row'), T).toBe('3');
    await expect.poll(text(invalid.first()), T).toMatch(/^Row 3: .+/);
    await expect.poll(text(invalid.nth(1)), T).toMatch(/^Row 4: .*T99/);
    await expect.poll(text(page.locator('[data-testid=preview-counts]')), T).toContain('2 valid');
    await screenshot(page, 'data-import-1024x768');
    await page.setViewportSize(PORTRAIT);
    await screenshot(page, 'data-import-768x1024');
    await page.setViewportSize(LANDSCAPE);
    await page.locator('[data-testid=csv-commit]').tap();
    await expect.poll(text(page.locator('[data-testid=import-result]')), T).toContain('2 stored');
    // Again: nothing new.
    await page.locator('[data-testid=csv-preview-btn]').tap();
    await expect.poll(text(page.locator('[data-testid=preview-counts]')), T).toContain('2 already stored');
    const r = await call<{ readings: unknown[] }>(srv.baseUrl, 'GET', `/api/spots/${fx.spotIds[0]}/readings`);
    expect(r.readings).toHaveLength(1);
    expect(tab.errors).toEqual([]);
  }, 60_000);
});
