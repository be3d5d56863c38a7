/**
 * The weekly hot-spot review (#/review, #/review/:isoWeek): the summary in plain
 * words, every measured spot ranked by severity, the spots that were due but not
 * measured, open follow-ups, and a button per row to open one. Printable on A4
 * and Letter (header with site, week and print date, the caution, rows never
 * split) and exportable as CSV. Default week: the last complete one (Monday review).
 */
import { h, replace } from '../ui/h';
import { verdictChip } from '../ui/verdict';
import { fmtField } from '../ui/format';
import { findingChip, followUpLine, openFollowUpForm } from '../ui/follow-up';
import { errorText, NetworkError } from '../api';
import { currentSetup } from '../app';
import { navigate } from '../router';
import { loadReview, reviewCsvUrl, type ReviewSpot, type WeeklyReview } from '../review-api';
import { formatPValue } from '../../core/stats/formatPValue';
import { civilDateAddDays, parseIsoWeek, previousWeek, weekFromMonday, weekOf, weekStart, type Week } from '../../core/time';
import { weekMonday } from '../../core/time/week';

export function nextWeek(w: Week): Week {
  return weekFromMonday(civilDateAddDays(weekMonday(w), 7), w.timeZone);
}

function num(x: unknown): number | null {
  return typeof x === 'number' && Number.isFinite(x) ? x : null;
}

function trendCell(s: ReviewSpot): { arrow: string; text: string; dir: string } {
  const t = s.trend;
  if (t.status !== 'ok' || !t.direction) return { arrow: '·', text: t.text || 'not enough data', dir: 'none' };
  const p = num(t.pValue) !== null ? formatPValue(t.pValue!) : '';
  if (t.direction === 'increasing') return { arrow: '↑', text: t.text || `rising (${p})`, dir: 'up' };
  if (t.direction === 'decreasing') return { arrow: '↓', text: t.text || `falling (${p})`, dir: 'down' };
  return { arrow: '→', text: t.text || `no trend (${p})`, dir: 'flat' };
}

function humidityCell(s: ReviewSpot): string {
  const rh = num(s.humidity.weekMedianRhPercent);
  if (rh === null) return '—';
  const raw = num(s.humidity.differencePoints);
  const d = raw === null ? null : Math.round(raw);
  return `${Math.round(rh)} %${d !== null ? ` (${d > 0 ? '+' : d < 0 ? '−' : '±'}${Math.abs(d)} vs usual)` : ''}`;
}

export async function reviewPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const body = h('div', { class: 'page review-page' }, h('p', { class: 'muted' }, 'Loading…'));
  root.append(body);
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return () => undefined; }
  const bundle = setup.data;
  const tz = bundle.site.timeZone;
  const thisWeek = weekStart(Date.now(), tz);
  const week: Week = params.week && parseIsoWeek(params.week) ? weekOf(params.week, tz) : previousWeek(thisWeek);

  let alive = true;
  const draw = async () => {
    let r: WeeklyReview;
    try {
      r = await loadReview(bundle.site.id, week.isoWeek);
    } catch (e) {
      if (!alive) return;
      replace(body, weekBar(), h('p', { class: 'error-box' }, e instanceof NetworkError ? 'The review needs the network: it is computed on the server from every reading of the site.' : `No review: ${errorText(e)}`));
      return;
    }
    if (alive) render(r);
  };

  function weekBar(): HTMLElement {
    const isLatest = week.isoWeek >= thisWeek.isoWeek;
    return h('div', { class: 'review-bar no-print' },
      h('p', { class: 'week-label', dataset: { testid: 'week-label' } }, week.label),
      h('div', { class: 'row gap wrap' },
        h('a', { class: 'btn', href: `#/review/${previousWeek(week).isoWeek}`, dataset: { testid: 'week-prev' }, 'aria-label': 'previous week' }, '◀ Previous week'),
        isLatest ? h('span', { class: 'btn btn-ghost', 'aria-disabled': 'true' }, 'Next week ▶')
          : h('a', { class: 'btn', href: `#/review/${nextWeek(week).isoWeek}`, dataset: { testid: 'week-next' }, 'aria-label': 'next week' }, 'Next week ▶')),
      h('div', { class: 'row gap wrap' },
        h('button', { type: 'button', class: 'btn', dataset: { testid: 'print' }, onclick: () => window.print() }, 'Print'),
        h('a', { class: 'btn', href: reviewCsvUrl(bundle.site.id, week.isoWeek), download: `review-${week.isoWeek}.csv`, dataset: { testid: 'export-csv' } }, 'Export CSV'),
        h('a', { class: 'btn', href: '#/' }, 'Home')));
  }

  function render(r: WeeklyReview): void {
    const summary = r.summarySentences.length ? r.summarySentences : r.summary ? [r.summary] : [];
    const printed = new Date().toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
    const humidity = r.humidity.sentence;
    replace(body,
      h('header', { class: 'print-header print-only' },
        h('p', { class: 'ph-site' }, r.site.name),
        h('p', { class: 'ph-week' }, `Weekly hot-spot review · ${r.week.label}`),
        h('p', { class: 'ph-date' }, `Printed ${printed}`)),
      h('div', { class: 'screen-only' }, h('p', { class: 'eyebrow' }, r.site.name), h('h1', null, 'Weekly review')),
      weekBar(),
      h('section', { class: 'card review-summary', dataset: { testid: 'review-summary' } },
        h('h2', null, 'Summary'),
        summary.length ? h('ul', { class: 'summary-list' }, summary.map((s) => h('li', null, s))) : h('p', { class: 'muted' }, 'No readings this week.'),
        humidity && !summary.includes(humidity) ? h('p', { class: 'muted' }, humidity) : null,
        h('p', { class: 'muted review-counts' },
          `${r.counts.rounds} round${r.counts.rounds === 1 ? '' : 's'}, ${r.counts.readings} readings, ${r.counts.spotsMeasured} of ${r.counts.spotsDue} spots measured; `,
          `${r.counts.openFollowUps} open follow-up${r.counts.openFollowUps === 1 ? '' : 's'}${r.counts.overdueFollowUps ? ` (${r.counts.overdueFollowUps} overdue)` : ''}.`)),
      h('section', { class: 'card review-ranking' },
        h('h2', null, `Spots measured, worst first (${r.spots.length})`),
        r.spots.length === 0 ? h('p', { class: 'muted' }, 'No spot was measured this week.') : rankingTable(r.spots)),
      h('section', { class: 'card review-not-measured', dataset: { testid: 'not-measured' } },
        h('h2', null, `Due but not measured (${r.notMeasured.length})`),
        r.notMeasured.length === 0 ? h('p', { class: 'muted' }, 'Every spot on the route was measured.') : h('ul', { class: 'nm-list' }, r.notMeasured.map((n) => h('li', null,
          h('span', { class: 'code' }, n.code), ` ${n.name}`, h('span', { class: 'muted' }, ` · ${n.areaName}`),
          n.skipped.length ? h('span', { class: 'muted' }, ` · skipped: ${n.skipped.map((k) => k.reason).join('; ')}`) : null,
          n.openFollowUps ? h('span', { class: 'muted' }, ` · ${n.openFollowUps} open follow-up${n.openFollowUps === 1 ? '' : 's'}`) : null)))),
      h('section', { class: 'caution', dataset: { testid: 'caution' } }, h('h2', null, 'Caution'), h('p', null, r.caution)));
  }

  function rankingTable(spots: ReviewSpot[]): HTMLElement {
    return h('table', { class: 'table review-table', dataset: { testid: 'review-table' } },
      h('thead', null, h('tr', null,
        h('th', { class: 'c-rank' }, '#'), h('th', null, 'Spot'), h('th', null, 'Worst'), h('th', null, 'Median'),
        h('th', { title: 'readings at or above the warn level, of all readings' }, 'Over limit'), h('th', null, 'vs last week'), h('th', null, '8-week trend'),
        h('th', null, 'RH'), h('th', null, 'Open follow-ups'))),
      h('tbody', null, spots.map((s, i) => {
        const tr = trendCell(s);
        return h('tr', { class: `rv-row rv-${s.worstLevel}`, dataset: { spotId: s.spotId, rank: String(s.rank || i + 1) } },
          h('td', { class: 'c-rank num' }, String(s.rank || i + 1)),
          h('td', { class: 'c-spot' },
            h('a', { href: `#/spot/${s.spotId}`, class: 'rv-spot' }, h('span', { class: 'code' }, s.code), ' ', s.name),
            h('span', { class: 'rv-area' }, s.areaName)),
          h('td', { class: 'c-worst', dataset: { label: 'Worst' }, title: s.worstReason }, verdictChip(s.worstLevel), h('span', { class: 'num rv-val' }, s.worstText || fmtField(s.worstAbsFieldVPerM))),
          h('td', { class: 'num', dataset: { label: 'Median' } }, s.medianText || fmtField(s.medianAbsFieldVPerM)),
          h('td', { class: 'num c-exc', dataset: { label: 'Over limit' } }, String(s.exceedances.warn + s.exceedances.alarm),
            h('span', { class: 'muted rv-of' }, ` of ${s.readings}`),
            s.exceedances.alarm ? h('span', { class: 'rv-exc-detail' }, `${s.exceedances.alarm} in alarm`) : null),
          h('td', { dataset: { label: 'vs last week' } }, s.change?.text ?? 'not measured the week before'),
          h('td', { class: `c-trend trend-${tr.dir}`, dataset: { label: '8-week trend' } }, h('span', { class: 'trend-arrow', 'aria-hidden': 'true' }, tr.arrow), ` ${tr.text}`),
          h('td', { dataset: { label: 'RH (week median)' } }, humidityCell(s)),
          h('td', { class: 'c-fu', dataset: { testid: 'row-follow-ups', label: 'Open follow-ups' } },
            s.openFollowUps.length === 0 ? h('span', { class: 'muted' }, 'none')
              : s.openFollowUps.map((f) => h('div', { class: 'rv-fu', dataset: { followUpId: f.id } }, findingChip(f.findingClass),
                h('span', null, ` ${followUpLine(f).replace(/^Open follow-up: /, '')}${f.assignee ? ` · ${f.assignee}` : ''}`))),
            h('button', {
            type: 'button', class: 'btn btn-small no-print rv-fu-btn', dataset: { testid: 'row-open-follow-up' },
            onclick: async () => {
              const f = await openFollowUpForm({ siteId: bundle.site.id, spotId: s.spotId, spotLabel: `${s.code} ${s.name}` });
              if (f) await draw();
            },
          }, '+ Open a follow-up')));
      })));
  }

  await draw();
  return () => { alive = false; };
}
