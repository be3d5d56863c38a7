/**
 * The spot screen's trend and follow-up sections (issue 4), kept out of spot.ts
 * so that file stays about readings and corrections.
 *
 * Trend: a range picker, the chart (chart.js, loaded on demand), the trend and
 * the humidity relation in words, and the readings of the range in a table.
 * For print the canvases are mirrored into <img> elements (print stylesheet
 * shows the images: a canvas may print blank or at screen size).
 *
 * Follow-ups: open and closed follow-ups of the spot with their history; open
 * one, close one (verifying reading or reason), reopen one.
 */
import type { Chart } from 'chart.js';
import { h, replace } from '../ui/h';
import { verdictChip } from '../ui/verdict';
import { fmtDateTime, fmtField } from '../ui/format';
import { closeFollowUpSheet, followUpCard, openFollowUpForm, reopenSheet } from '../ui/follow-up';
import { errorText, NetworkError } from '../api';
import {
  TREND_RANGES, TREND_RANGE_LABEL, followUpsOfSpot, getFollowUp, isNotEnough, loadTrend, reopenFollowUp,
  type FollowUp, type FollowUpWithEvents, type SpotTrend, type TrendRange,
} from '../review-api';
import { loadOpenFollowUps } from '../follow-ups';
import { onOutboxChange } from '../offline/outbox';
import { formatSi } from '../../core/units/format';
import { formatPValue } from '../../core/stats/formatPValue';
import type { SetupBundle, Spot } from '../../core/schemas';
import type { LocalReading } from '../offline/types';

const DAY = 86_400_000;
const RANGE_MS: Record<TrendRange, number | null> = { '4w': 28 * DAY, '13w': 91 * DAY, '1y': 365 * DAY, all: null };
const RANGE_WORDS: Record<TrendRange, string> = { '4w': 'the last 4 weeks', '13w': 'the last 13 weeks', '1y': 'the last year', all: 'all time' };

function pText(p: number): string {
  return Number.isFinite(p) && p >= 0 && p <= 1 ? formatPValue(p) : 'p not available';
}

/** The trend over the range in words. */
export function trendWords(t: SpotTrend['trendSummary']): string {
  if (isNotEnough(t)) return `Trend: not enough data (${t.reason}).`;
  const slope = t.slopeVPerMPerWeek;
  if (!Number.isFinite(slope)) return 'Trend: not enough data.';
  const ci = Number.isFinite(t.slopeLowerVPerMPerWeek) && Number.isFinite(t.slopeUpperVPerMPerWeek)
    ? `, ${Math.round((1 - t.alpha) * 100)} % interval ${signed(t.slopeLowerVPerMPerWeek)} to ${signed(t.slopeUpperVPerMPerWeek)}` : '';
  const head = t.significant && t.direction === 'increasing' ? 'Rising' : t.significant && t.direction === 'decreasing' ? 'Falling' : 'No significant trend';
  return `${head}: ${signed(slope)} per week (Theil–Sen slope of |field|${ci}); Mann–Kendall ${pText(t.pValue)}, ${t.significant ? 'significant' : 'not significant'} at ${Math.round(t.alpha * 100)} %; ${t.n} points (${t.basis}).`;
}

function signed(v: number): string {
  return `${v >= 0 ? '+' : '−'}${formatSi(Math.abs(v), 'V/m')}`;
}

/** The humidity relation in words. */
export function humidityWords(x: SpotTrend['humidity']): string {
  if (isNotEnough(x)) return `Humidity: not enough data (${x.reason}).`;
  const pct = x.percentChangePerRhPoint;
  if (!Number.isFinite(pct)) return 'Humidity: not enough data.';
  const what = !x.significant ? 'no significant relation to humidity in this range'
    : pct < 0 ? 'drier air goes with higher fields here' : 'more humid air goes with higher fields here (unusual: check the process)';
  return `Humidity: |field| changes by ${pct >= 0 ? '+' : '−'}${Math.abs(pct).toFixed(1)} % per RH point (slope of log₁₀|E| against RH ${x.slopeLog10PerRhPoint.toFixed(4)} per point, ${pText(x.pValue)}, R² ${Number.isFinite(x.rSquared) ? x.rSquared.toFixed(2) : '—'}, ${x.n} readings): ${what}.`;
}

/** Theil–Sen intercept for the drawn line: the median of |E| - slope * t (Sen 1968). */
function medianOf(xs: number[]): number {
  const a = [...xs].sort((p, q) => p - q);
  const m = Math.floor(a.length / 2);
  return a.length % 2 ? a[m]! : (a[m - 1]! + a[m]!) / 2;
}

export function spotTrendSection(spot: Spot): { el: HTMLElement; dispose(): void } {
  let range: TrendRange = '13w';
  let log = false;
  let data: SpotTrend | null = null;
  let chart: Chart | null = null;
  let charge: Chart | null = null;
  let seq = 0;
  let alive = true;

  const picker = h('div', { class: 'seg trend-range', role: 'radiogroup', 'aria-label': 'Range' });
  const logBtn = h('button', { type: 'button', class: 'btn btn-small', 'aria-pressed': 'false', dataset: { testid: 'trend-log' }, onclick: () => { log = !log; draw(); } }, 'Log scale');
  const canvas = h('canvas', { class: 'trend-canvas', 'aria-label': `Trend of ${spot.name}: |field| with warn and alarm bands and RH`, role: 'img' });
  const canvasBox = h('div', { class: 'chart-box trend-box' }, canvas);
  const img = h('img', { class: 'chart-print', alt: `Trend chart of ${spot.name}` });
  const chargeCanvas = h('canvas', { class: 'trend-canvas', 'aria-label': 'Estimated charge over time', role: 'img' });
  const chargeBox = h('div', { class: 'chart-box charge-box' }, chargeCanvas);
  const chargeImg = h('img', { class: 'chart-print', alt: `Estimated charge of ${spot.name}` });
  const chargeTitle = h('h3', null, 'Estimated charge');
  const chargeWrap = h('div', { class: 'charge-wrap', hidden: true, dataset: { testid: 'trend-estimate' } }, chargeTitle, chargeBox, chargeImg);
  const status = h('p', { class: 'muted', dataset: { testid: 'trend-status' } }, 'Loading the trend…');
  const words = h('div', { class: 'trend-words', dataset: { testid: 'trend-words' } });
  const table = h('div', { class: 'trend-table-wrap' });

  const el = h('section', { class: 'card trend-section', dataset: { testid: 'spot-trend' } },
    h('div', { class: 'row between wrap gap' }, h('h2', null, 'Trend'), h('div', { class: 'row gap wrap no-print' }, picker, logBtn)),
    status, canvasBox, img, chargeWrap, words, table);

  const renderPicker = () => replace(picker, TREND_RANGES.map((r) => h('button', {
    type: 'button', class: `seg-btn${r === range ? ' is-on' : ''}`, role: 'radio', 'aria-checked': String(r === range), dataset: { range: r },
    onclick: () => { if (r !== range) { range = r; renderPicker(); void load(); } },
  }, TREND_RANGE_LABEL[r])));

  async function load(): Promise<void> {
    const my = ++seq;
    status.textContent = 'Loading the trend…';
    try {
      const d = await loadTrend(spot.id, range);
      if (my !== seq || !alive) return;
      data = d;
      status.textContent = d.points.length === 0 ? `No readings in ${RANGE_WORDS[range]}.` : '';
      await draw();
    } catch (e) {
      if (my !== seq || !alive) return;
      status.textContent = e instanceof NetworkError ? 'The trend needs the network: it is computed on the server from every reading.' : `No trend: ${errorText(e)}`;
      status.className = 'error-box';
    }
  }

  async function draw(): Promise<void> {
    logBtn.setAttribute('aria-pressed', String(log));
    logBtn.classList.toggle('is-on', log);
    if (!data) return;
    const d = data;
    const points = d.points.map((p) => ({
      t: Date.parse(p.takenAt), fieldVPerM: p.fieldVPerM, level: p.level, rh: p.rhPercent ?? null, chargeC: p.chargeC ?? null, sigma: p.surfaceChargeDensityCPerM2 ?? null,
    })).filter((p) => Number.isFinite(p.t));
    const now = Date.now();
    const span = RANGE_MS[range];
    const toMs = d.range.to ? Date.parse(d.range.to) : now;
    const fromMs = d.range.from ? Date.parse(d.range.from) : span ? toMs - span : Math.min(...points.map((p) => p.t), toMs - 7 * DAY);
    let t: { centreMs: number; level: number; slopePerMs: number } | null = null;
    const ts = d.trendSummary;
    if (!isNotEnough(ts) && Number.isFinite(ts.slopeVPerMPerWeek) && points.length >= 2) {
      const slopePerMs = ts.slopeVPerMPerWeek / (7 * DAY);
      t = { centreMs: 0, level: medianOf(points.map((p) => Math.abs(p.fieldVPerM) - slopePerMs * p.t)), slopePerMs };
    }
    const cd = {
      points, warn: d.bands?.warnVPerM ?? null, alarm: d.bands?.alarmVPerM ?? null, trendLine: t,
      fromMs: Number.isFinite(fromMs) ? fromMs : now - 91 * DAY, toMs: Number.isFinite(toMs) ? toMs : now, log,
    };
    const mod = await import('../ui/trend-chart');
    if (!alive) return;
    chart = mod.drawTrendChart(canvas, cd, chart);
    img.src = chart.toBase64Image('image/png', 1);
    const hasQ = spot.model !== null && points.some((p) => p.chargeC !== null && Number.isFinite(p.chargeC));
    const hasSigma = !hasQ && spot.model !== null && points.some((p) => p.sigma !== null && Number.isFinite(p.sigma));
    const hasCharge = hasQ || hasSigma;
    chargeWrap.hidden = !hasCharge;
    chargeTitle.textContent = hasSigma ? 'Estimated surface charge density' : 'Estimated charge';
    chargeCanvas.setAttribute('aria-label', hasSigma ? 'Estimated surface charge density over time' : 'Estimated charge over time');
    if (hasCharge) {
      charge = mod.drawChargeChart(chargeCanvas, cd, charge, hasSigma ? 'sigma' : 'charge');
      chargeImg.src = charge.toBase64Image('image/png', 1);
    } else { charge?.destroy(); charge = null; }
    replace(words,
      h('p', { dataset: { testid: 'trend-sentence' } }, trendWords(d.trendSummary)),
      h('p', { dataset: { testid: 'humidity-sentence' } }, humidityWords(d.humidity)),
      d.bands && (d.bands.warnVPerM !== null || d.bands.alarmVPerM !== null)
        ? h('p', { class: 'muted' }, `Bands: WARN from ${formatSi(d.bands.warnVPerM, 'V/m')}, ALARM from ${formatSi(d.bands.alarmVPerM, 'V/m')}${d.bands.source ? ` (${d.bands.source})` : ''}. Plotted as magnitude; polarity is in the table.`)
        : h('p', { class: 'muted' }, 'No field limits apply to this spot. Plotted as magnitude; polarity is in the table.'));
    renderTable(d);
  }

  function renderTable(d: SpotTrend): void {
    const rows = [...d.points].sort((a, b) => b.takenAt.localeCompare(a.takenAt));
    const hasQ = rows.some((p) => p.chargeC !== null && p.chargeC !== undefined);
    const hasSigma = !hasQ && rows.some((p) => p.surfaceChargeDensityCPerM2 !== null && p.surfaceChargeDensityCPerM2 !== undefined);
    const hasCharge = hasQ || hasSigma;
    const estOf = (p: typeof rows[number]): string => {
      const v = hasQ ? p.chargeC : p.surfaceChargeDensityCPerM2;
      return v === null || v === undefined ? '—' : formatSi(v, hasQ ? 'C' : 'C/m²');
    };
    replace(table, rows.length === 0 ? null : h('table', { class: 'table trend-table', dataset: { testid: 'trend-table' } },
      h('caption', null, `Readings, ${RANGE_WORDS[range]} (${rows.length})`),
      h('thead', null, h('tr', null, h('th', null, 'When'), h('th', null, 'Field'), h('th', null, 'Verdict'), h('th', null, 'RH'), hasCharge ? h('th', null, hasQ ? 'Est. charge' : 'Est. surface charge') : null)),
      h('tbody', null, rows.map((p) => h('tr', null,
        h('td', null, fmtDateTime(p.takenAt)),
        h('td', { class: 'num' }, fmtField(p.fieldVPerM)),
        h('td', null, verdictChip(p.level)),
        h('td', { class: 'num' }, p.rhPercent === null || p.rhPercent === undefined ? '—' : `${p.rhPercent} %`),
        hasCharge ? h('td', { class: 'num' }, estOf(p)) : null)))));
  }

  renderPicker();
  void load();
  return {
    el,
    dispose() { alive = false; chart?.destroy(); charge?.destroy(); },
  };
}

/** Open and closed follow-ups of the spot, with history; open, close, reopen. */
export function spotFollowUpsSection(bundle: SetupBundle, spot: Spot, readings: () => LocalReading[]): { el: HTMLElement; refresh(): Promise<void>; dispose(): void } {
  const list = h('div', { class: 'fu-list', dataset: { testid: 'spot-follow-ups' } });
  const note = h('p', { class: 'muted' });
  const el = h('section', { class: 'card fu-section' },
    h('div', { class: 'row between wrap gap' }, h('h2', null, 'Follow-ups'),
      h('button', {
        type: 'button', class: 'btn no-print', dataset: { testid: 'fu-open' }, onclick: async () => {
          const worst = readings().filter((r) => r.supersededById === null && r.deleted === null).sort((a, b) => b.takenAt.localeCompare(a.takenAt))[0];
          const f = await openFollowUpForm({ siteId: bundle.site.id, spotId: spot.id, spotLabel: `${spot.code} ${spot.name}`, openedFromReadingId: worst && worst.verdict.level !== 'ok' ? worst.id : null });
          if (f) await refresh();
        },
      }, 'Open a follow-up')),
    note, list);
  let items: (FollowUp | FollowUpWithEvents)[] = [];

  async function refresh(): Promise<void> {
    try {
      const all = await followUpsOfSpot(spot.id);
      // History comes with each follow-up's own answer.
      items = await Promise.all(all.map((f) => getFollowUp(f.id).catch(() => f)));
      note.textContent = '';
    } catch {
      const c = await loadOpenFollowUps(bundle.site.id, { preferCache: true, bundle });
      items = c.list.filter((f) => f.spotId === spot.id);
      note.textContent = 'Offline: open follow-ups as cached on this tablet (history needs the network).';
    }
    render();
  }

  function render(): void {
    const open = items.filter((f) => f.status === 'open');
    const closed = items.filter((f) => f.status !== 'open');
    replace(list,
      items.length === 0 ? h('p', { class: 'muted' }, 'No follow-ups for this spot.') : null,
      open.map((f) => followUpCard(f, { history: true, onClose: (x) => void close(x) })),
      closed.length ? h('details', { class: 'fu-closed' }, h('summary', null, `Closed (${closed.length})`),
        closed.map((f) => followUpCard(f, { history: true, onReopen: (x) => void reopen(x) }))) : null);
  }

  async function close(f: FollowUp): Promise<void> {
    if (await closeFollowUpSheet(bundle.site.id, f, readings())) render();
  }
  async function reopen(f: FollowUp): Promise<void> {
    if (await reopenSheet(f, (reason) => reopenFollowUp(f.id, reason))) await refresh();
  }

  let t: ReturnType<typeof setTimeout> | null = null;
  const off = onOutboxChange(() => {
    if (!t) t = setTimeout(() => { t = null; void refresh(); }, 600);
  });
  return { el, refresh, dispose() { off(); if (t) clearTimeout(t); } };
}
