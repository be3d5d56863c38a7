/**
 * Issue 4 end to end in real Chromium with touch, on the invented demo site:
 * open last week's review at 1024x768, see the summary and the ranking, open a
 * follow-up on the top spot, reach that spot on a round (through its label's
 * #/scan/CODE address) and see the follow-up there, close it with a verifying
 * reading within limits; print the review to PDF (Chromium's own print) and find
 * the table and the caution in the PDF's text; the spot screen's trend.
 * Screenshots at 1024x768 and 768x1024 go to test-artifacts/.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { startTestServer, type TestServer } from '../helpers/server';
import { call } from './fixtures';
import { ARTIFACTS, LANDSCAPE, PORTRAIT, T, attr, count, openTablet, screenshot, startRound, tapDigits, text, waitAllSent, type Tablet } from './browser';
import { pdfText, squash } from './pdf-text';
import { previousWeek, weekStart } from '../../core/time';
import type { FollowUpWithEvents, WeeklyReview } from '../../core/schemas';

let srv: TestServer;
let tab: Tablet;
let siteId: string;
let isoWeek: string;
let review: WeeklyReview;

beforeAll(async () => {
  srv = await startTestServer({ demo: true, clientDir: inject('clientDir') });
  const { sites } = await call<{ sites: { id: string; timeZone: string }[] }>(srv.baseUrl, 'GET', '/api/sites');
  siteId = sites[0]!.id;
  // The tablet opens the last complete week of the site by default (the Monday review).
  isoWeek = previousWeek(weekStart(Date.now(), sites[0]!.timeZone)).isoWeek;
  review = await call<WeeklyReview>(srv.baseUrl, 'GET', `/api/sites/${siteId}/review?week=${isoWeek}`);
  tab = await openTablet(srv.baseUrl, LANDSCAPE);
});

afterAll(async () => {
  await tab?.close();
  await srv?.close();
});

describe('weekly review, follow-ups and the spot trend (issue 4)', () => {
  it('ranks last week, opens a follow-up on the top spot, shows it on the round and closes it with a verifying reading', async () => {
    const { page } = tab;
    expect(review.spots.length).toBeGreaterThan(3);
    const top = review.spots[0]!;

    await page.goto('/');
    await page.locator('.site-name').waitFor();
    await page.locator('[data-testid=nav-review]').tap();
    await page.locator('[data-testid=review-table]').waitFor();
    await expect.poll(text(page.locator('[data-testid=week-label]')), T).toContain(review.week.label.split(':')[0]!);
    // The summary in words, and the ranking in the server's order, worst first.
    await expect.poll(text(page.locator('[data-testid=review-summary] li').first()), T).toBe(review.summarySentences[0]);
    const rows = page.locator('[data-testid=review-table] tbody tr');
    await expect.poll(count(rows), T).toBe(review.spots.length);
    await expect.poll(attr(rows.first(), 'data-spot-id'), T).toBe(top.spotId);
    await expect.poll(text(rows.first().locator('.c-worst')), T).toContain(top.worstLevel.toUpperCase()); // a word, not colour alone
    await expect.poll(text(page.locator('[data-testid=caution]')), T).toContain(review.caution.slice(0, 40));
    await screenshot(page, 'review-1024x768');
    await page.setViewportSize(PORTRAIT);
    await screenshot(page, 'review-768x1024');
    await page.setViewportSize(LANDSCAPE);

    // Open a follow-up on the top spot: class, action, who, due date.
    await rows.first().locator('[data-testid=row-open-follow-up]').tap();
    const sheet = page.locator('dialog[open]');
    await sheet.locator('[data-testid=fu-save]').tap(); // empty: the form says what is missing
    await expect.poll(text(sheet.locator('.field-error')), T).toContain('say who does it');
    await sheet.locator('.seg-btn[data-value=major-nonconformance]').tap();
    await sheet.locator('textarea').fill('Fit an ionising bar before the rewind and check its cleaning');
    await sheet.locator('input[data-path=assignee]').fill('M. Varga-Lind');
    await screenshot(page, 'follow-up-form-1024x768');
    await sheet.locator('[data-testid=fu-save]').tap();
    await expect.poll(count(page.locator('dialog[open]')), T).toBe(0);
    await expect.poll(text(rows.first().locator('[data-testid=row-follow-ups]')), T).toContain('Fit an ionising bar');
    await screenshot(page, 'review-with-follow-up-1024x768');
    const open = await call<{ followUps: FollowUpWithEvents[] }>(srv.baseUrl, 'GET', `/api/spots/${top.spotId}/follow-ups`);
    const fu = open.followUps.find((f) => f.action.startsWith('Fit an ionising bar'))!;
    expect(fu).toMatchObject({ status: 'open', findingClass: 'major-nonconformance', assignee: 'M. Varga-Lind' });

    // A round: the label's address (#/scan/CODE) opens the spot in it, and the banner shows the follow-up.
    await page.goto('/');
    await page.locator('.site-name').waitFor();
    const roundId = await startRound(page, 'M. Varga-Lind', '44');
    await page.goto(`/#/scan/${encodeURIComponent(top.code)}`);
    await page.waitForURL(`**/#/round/${roundId}`);
    await expect.poll(text(page.locator('[data-testid=spot-name]')), T).toBe(top.name);
    const banner = page.locator('[data-testid=fu-banner]');
    await expect.poll(text(banner), T).toContain('Open follow-up: Fit an ionising bar');
    await expect.poll(text(banner), T).toContain('due');
    await screenshot(page, 'round-follow-up-1024x768');
    await page.setViewportSize(PORTRAIT);
    await screenshot(page, 'round-follow-up-768x1024');
    await page.setViewportSize(LANDSCAPE);

    // A reading within limits, then "Close follow-up with this reading".
    await tapDigits(page, '1');
    await expect.poll(attr(page.locator('[data-testid=live-verdict] [data-verdict]'), 'data-verdict'), T).toBe('ok');
    await page.locator('[data-testid=save]').tap();
    await page.locator('[data-testid=fu-close-with-this]').tap();
    await expect.poll(count(banner), T).toBe(0);
    await waitAllSent(page);
    const closed = await call<FollowUpWithEvents>(srv.baseUrl, 'GET', `/api/follow-ups/${fu.id}`);
    expect(closed.status).toBe('closed');
    expect(closed.closedByReadingId).not.toBeNull();
    const reading = await call<{ reading: { spotId: string; verdict: { level: string }; roundId: string } }>(srv.baseUrl, 'GET', `/api/readings/${closed.closedByReadingId}`);
    expect(reading.reading).toMatchObject({ spotId: top.spotId, roundId, verdict: { level: 'ok' } });
    expect(closed.events.map((e) => e.kind)).toEqual(['opened', 'closed']);

    // The spot screen shows it closed, with its history.
    await page.goto(`/#/spot/${top.spotId}`);
    const card = page.locator(`[data-testid=spot-follow-ups] [data-follow-up-id="${fu.id}"]`);
    await page.locator('.fu-closed > summary').tap();
    await expect.poll(text(card.locator('[data-testid=fu-closed-how]')), T).toContain('with a verifying reading');
    expect(tab.errors).toEqual([]);
  }, 180_000);

  it('closes a follow-up with a written reason while offline; the outbox sends it when the network is back', async () => {
    const { page, context } = tab;
    const spot = review.spots[1]!;
    const fu = await call<{ id: string }>(srv.baseUrl, 'POST', '/api/follow-ups', {
      spotId: spot.spotId, findingClass: 'observation', action: 'Check the earthing clamp', assignee: 'R. Ilves', dueDate: '2099-01-31',
    });
    await page.goto(`/#/spot/${spot.spotId}`);
    const card = page.locator(`[data-testid=spot-follow-ups] [data-follow-up-id="${fu.id}"]`);
    await expect.poll(attr(card, 'data-status'), T).toBe('open');
    await context.setOffline(true);
    await card.locator('[data-testid=fu-close]').tap();
    const sheet = page.locator('dialog[open]');
    await sheet.locator('[data-testid=fu-reason]').fill('Clamp replaced; the drum was taken out of service');
    await sheet.locator('[data-testid=fu-close-reason]').tap();
    await expect.poll(text(page.locator('[data-testid=outbox-status]')), T).toContain('1 change saved on this tablet');
    expect((await call<{ status: string }>(srv.baseUrl, 'GET', `/api/follow-ups/${fu.id}`)).status).toBe('open');
    await context.setOffline(false);
    await waitAllSent(page);
    const closed = await call<FollowUpWithEvents>(srv.baseUrl, 'GET', `/api/follow-ups/${fu.id}`);
    expect(closed).toMatchObject({ status: 'closed', closedReason: 'Clamp replaced; the drum was taken out of service', closedByReadingId: null });
    expect(tab.errors).toEqual([]);
  }, 60_000);

  it('prints the review to PDF with the table and the caution', async () => {
    const { page } = tab;
    await page.goto(`/#/review/${isoWeek}`);
    await page.locator('[data-testid=review-table]').waitFor();
    const pdf = await page.pdf({ format: 'A4', printBackground: true });
    mkdirSync(ARTIFACTS, { recursive: true });
    writeFileSync(join(ARTIFACTS, 'review-A4.pdf'), pdf);
    const letter = await page.pdf({ format: 'Letter', printBackground: true });
    writeFileSync(join(ARTIFACTS, 'review-Letter.pdf'), letter);
    for (const doc of [pdf, letter]) {
      const txt = squash(pdfText(doc));
      expect(txt).toContain(squash(review.site.name)); // the print header
      expect(txt).toContain(squash(`Weekly hot-spot review · ${review.week.label}`));
      expect(txt).toContain('Printed');
      for (const s of review.spots.slice(0, 5)) expect(txt).toContain(squash(`${s.code} ${s.name}`));
      expect(txt).toContain(squash(review.spots[0]!.worstLevel.toUpperCase()));
      expect(txt.toLowerCase()).toContain('caution');
      expect(txt).toContain(squash(review.caution));
      // No screen controls on paper.
      expect(txt).not.toContain('Openafollow-up');
      expect(txt).not.toContain('ExportCSV');
    }
  }, 60_000);

  it('shows the spot trend with bands, the trend in words and the readings table', async () => {
    const { page } = tab;
    const c04 = review.spots.find((s) => s.code === 'C-04') ?? review.spots[0]!;
    await page.goto(`/#/spot/${c04.spotId}`);
    await page.locator('[data-testid=trend-table] tbody tr').first().waitFor();
    await expect.poll(text(page.locator('[data-testid=trend-sentence]')), T).toMatch(/Theil–Sen|not enough data/);
    await expect.poll(text(page.locator('[data-testid=humidity-sentence]')), T).toMatch(/RH|not enough data/);
    await page.locator('[data-testid=spot-trend] .seg-btn[data-range="1y"]').tap();
    await expect.poll(text(page.locator('[data-testid=trend-table] caption')), T).toContain('the last year');
    // The chart is mirrored into an image for print.
    await expect.poll(attr(page.locator('[data-testid=spot-trend] img.chart-print').first(), 'src'), T).toMatch(/^data:image\/png/);
    await page.locator('[data-testid=spot-trend]').scrollIntoViewIfNeeded();
    await screenshot(page, 'spot-trend-1024x768');
    await page.setViewportSize(PORTRAIT);
    await page.locator('[data-testid=spot-trend]').scrollIntoViewIfNeeded();
    await screenshot(page, 'spot-trend-768x1024');
    const pdf = await page.pdf({ format: 'A4' });
    writeFileSync(join(ARTIFACTS, 'spot-trend-A4.pdf'), pdf);
    expect(squash(pdfText(pdf))).toContain('Trend');
    await page.setViewportSize(LANDSCAPE);
    expect(tab.errors).toEqual([]);
  }, 60_000);
});
