/**
 * Issue 2, the round screen held in gloves: at 768x1024 and 1024x768 the pad,
 * Save, Previous/Next and Skip stay on the screen however many readings a spot
 * gets (several readings of one spot are normal), and every control on the
 * round screen is at least 48 CSS px in both directions.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { startTestServer, type TestServer } from '../helpers/server';
import { makeFixture } from './fixtures';
import { LANDSCAPE, PORTRAIT, T, count, openTablet, screenshot, startRound, tapDigits, type Tablet } from './browser';

let srv: TestServer;
let tab: Tablet;

beforeAll(async () => {
  srv = await startTestServer({ clientDir: inject('clientDir') });
  await makeFixture(srv.baseUrl, { spotCount: 2 });
  tab = await openTablet(srv.baseUrl, PORTRAIT);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

/** Bottom edges of the entry controls and the document height, scrolled to the top. */
async function layout(page: Page) {
  return page.evaluate(() => {
    window.scrollTo(0, 0);
    const bottom = (sel: string) => document.querySelector(sel)!.getBoundingClientRect().bottom;
    const small = [...document.querySelectorAll<HTMLElement>('.round-page button, .round-page a[href]')]
      .filter((e) => { const r = e.getBoundingClientRect(); return r.width > 0 && (r.width < 48 || r.height < 48); })
      .map((e) => `${e.textContent?.trim()} ${Math.round(e.getBoundingClientRect().width)}x${Math.round(e.getBoundingClientRect().height)}`);
    return {
      viewport: window.innerHeight,
      scrollHeight: document.documentElement.scrollHeight,
      save: bottom('[data-testid=save]'), skip: bottom('[data-testid=skip]'), key0: bottom('.entry .numpad [data-key="0"]'),
      small,
    };
  });
}

describe('round screen layout on a tablet (issue 2)', () => {
  it('keeps the pad and Save on screen after many readings of one spot, with 48 px targets, in both orientations', async () => {
    const { page } = tab;
    await page.goto('/');
    await startRound(page, 'L. Brandt');
    for (let i = 0; i < 6; i++) {
      await tapDigits(page, `3.${i}`); // a routine reading: the digits, then one tap on Save
      await page.locator('[data-testid=save]').tap();
      await expect.poll(count(page.locator('[data-testid=round-readings] .reading-row')), T).toBe(i + 1);
    }
    for (const vp of [PORTRAIT, LANDSCAPE]) {
      await page.setViewportSize(vp);
      await page.waitForTimeout(200);
      const l = await layout(page);
      expect(l.small, `${vp.width}x${vp.height}`).toEqual([]);
      expect(l.save, `${vp.width}x${vp.height} Save`).toBeLessThanOrEqual(l.viewport);
      expect(l.key0, `${vp.width}x${vp.height} pad`).toBeLessThanOrEqual(l.viewport);
      if (vp === PORTRAIT) {
        expect(l.skip).toBeLessThanOrEqual(l.viewport);
        expect(l.scrollHeight).toBeLessThanOrEqual(l.viewport);
      }
      await screenshot(page, `round-many-readings-${vp.width}x${vp.height}`);
    }
    expect(tab.errors).toEqual([]);
  }, 90_000);
});
