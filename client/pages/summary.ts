/**
 * Round summary: readings, warnings, alarms, skipped, planned versus measured,
 * not measured. Computed on the tablet from its own records (works offline);
 * the server's own summary is shown beside it when it answers.
 */
import { h, replace } from '../ui/h';
import { flagChips, verdictChip, syncChip } from '../ui/verdict';
import { fmtAsEntered, fmtDateTime, fmtDistance, fmtField } from '../ui/format';
import { currentSetup } from '../app';
import { fetchRound, fetchRoundReadings, getRound, readingsOfRound, skipsOfRound } from '../data';
import { onOutboxChange, readingSyncState, syncStateOf } from '../offline/outbox';
import { isCurrent, summarizeRound } from '../round/logic';
import type { RoundSummary, Spot } from '../../core/schemas';

export async function summaryPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const roundId = params.id!;
  const body = h('div', { class: 'page summary' }, h('p', { class: 'muted' }, 'Loading…'));
  root.append(body);
  const setup = await currentSetup({ preferCache: true });
  let round = await getRound(roundId);
  let server: RoundSummary | null = null;
  const onServer = syncStateOf(`round:${roundId}`).state === 'server';
  if (onServer || !round) {
    const f = await fetchRound(roundId).catch(() => null);
    if (f) {
      server = f.summary;
      round = round ?? f.round;
      await fetchRoundReadings(roundId).catch(() => undefined);
    }
  }
  if (!round) { replace(body, h('p', { class: 'error-box' }, 'This round is not on this tablet and the server cannot be reached.')); return () => undefined; }
  const theRound = round;
  const spots = new Map<string, Spot>((setup?.data.spots ?? []).map((s) => [s.id, s]));
  const spotName = (id: string) => { const s = spots.get(id); return s ? `${s.code} ${s.name}` : id; };

  const render = async () => {
    const readings = await readingsOfRound(roundId);
    const skips = await skipsOfRound(roundId);
    const planned = theRound.plannedSpotIds.length ? theRound : { plannedSpotIds: server?.round.plannedSpotIds ?? [] };
    const local = summarizeRound(planned, readings, server ? [...server.skipped, ...skips.filter((k) => !server!.skipped.some((s) => s.id === k.id))] : skips);
    const cur = readings.filter(isCurrent).sort((a, b) => a.takenAt.localeCompare(b.takenAt));
    const pending = cur.filter((r) => readingSyncState(r.id).state !== 'server').length;
    const finishState = syncStateOf(`finish:${roundId}`).state;
    const stat = (label: string, value: number | string, cls = '', testid = '') =>
      h('div', { class: `stat ${cls}`, dataset: testid ? { testid } : undefined }, h('span', { class: 'stat-value' }, String(value)), h('span', { class: 'stat-label' }, label));
    replace(body,
      h('div', { class: 'row between wrap' },
        h('div', null,
          h('p', { class: 'eyebrow' }, 'Round summary'),
          h('h1', null, `${fmtDateTime(theRound.startedAt)} · ${theRound.surveyor}`),
          h('p', { class: 'muted' }, `RH ${theRound.rhPercent === null ? '—' : `${theRound.rhPercent} %`} · temp. ${theRound.temperatureC === null ? '—' : `${theRound.temperatureC} °C`} · ${theRound.endedAt ? `finished ${fmtDateTime(theRound.endedAt)}` : 'not finished'}`)),
        h('div', { class: 'row gap no-print' },
          !theRound.endedAt ? h('a', { class: 'btn btn-primary', href: `#/round/${roundId}` }, 'Back to the round') : null,
          h('button', { type: 'button', class: 'btn', onclick: () => window.print() }, 'Print'),
          h('a', { class: 'btn', href: '#/' }, 'Home'))),
      h('p', { class: `banner ${pending || finishState !== 'server' ? 'banner-info' : 'banner-ok'}`, dataset: { testid: 'summary-sync' } },
        pending ? `${pending} reading${pending === 1 ? '' : 's'} of this round saved on this tablet, not yet sent. The summary is computed here.`
          : finishState !== 'server' ? 'The round is saved on this tablet; the finish is not yet on the server.'
            : 'Everything in this round is on the server.'),
      h('div', { class: 'stats' },
        stat('readings', local.readings, '', 'sum-readings'),
        stat('planned', local.planned),
        stat('measured', local.spotsMeasured, '', 'sum-measured'),
        stat('warnings', local.warnings, local.warnings ? 'stat-warn' : '', 'sum-warnings'),
        stat('alarms', local.alarms, local.alarms ? 'stat-alarm' : '', 'sum-alarms'),
        stat('skipped', local.skipped.length, '', 'sum-skipped'),
        stat('not measured', local.notMeasured.length, '', 'sum-not-measured'),
        local.overdueMeterReadings ? stat('meter overdue', local.overdueMeterReadings, 'stat-warn') : null),
      server ? h('p', { class: 'muted', dataset: { testid: 'server-summary' } },
        `On the server: ${server.readings} readings, ${server.spotsMeasured} of ${server.planned} spots, ${server.warnings} warnings, ${server.alarms} alarms, ${server.skipped.length} skipped.`) : null,
      cur.some((r) => r.verdict.level !== 'ok') ? h('section', { class: 'card' },
        h('h2', null, 'Alarms and warnings'),
        h('ul', { class: 'reading-list' }, cur.filter((r) => r.verdict.level !== 'ok')
          .sort((a, b) => (a.verdict.level === b.verdict.level ? 0 : a.verdict.level === 'alarm' ? -1 : 1))
          .map((r) => h('li', { class: 'reading-row' },
            verdictChip(r.verdict.level),
            h('a', { class: 'link', href: `#/spot/${r.spotId}` }, spotName(r.spotId)),
            h('span', { class: 'r-value' }, fmtAsEntered(r)),
            h('span', { class: 'r-field' }, fmtField(r.fieldVPerM)),
            h('span', { class: 'verdict-reason' }, r.verdict.reason))))) : null,
      h('section', { class: 'card' },
        h('h2', null, 'Readings'),
        cur.length === 0 ? h('p', { class: 'muted' }, 'No readings.') : h('table', { class: 'table' },
          h('thead', null, h('tr', null, ...['Spot', 'As entered', 'Distance', 'Field', 'Verdict', 'Where'].map((t) => h('th', null, t)))),
          h('tbody', null, cur.map((r) => {
            const s = readingSyncState(r.id);
            return h('tr', null,
              h('td', null, h('a', { class: 'link', href: `#/spot/${r.spotId}` }, spotName(r.spotId))),
              h('td', null, fmtAsEntered(r), r.meterCalibrationOverdue ? h('span', { class: 'chip cal-chip' }, 'meter overdue') : null, ...flagChips(r.flags)),
              h('td', null, fmtDistance(r.distance)),
              h('td', null, fmtField(r.fieldVPerM)),
              h('td', null, verdictChip(r.verdict.level)),
              h('td', null, syncChip(s.state, s.message)));
          })))),
      h('section', { class: 'card' },
        h('h2', null, 'Skipped'),
        local.skipped.length === 0 ? h('p', { class: 'muted' }, 'None.') : h('ul', { class: 'list' }, local.skipped.map((k) => h('li', null, `${spotName(k.spotId)}: ${k.reason}`)))),
      h('section', { class: 'card' },
        h('h2', null, 'Not measured'),
        local.notMeasured.length === 0 ? h('p', { class: 'muted' }, 'Every planned spot was measured or skipped.')
          : h('ul', { class: 'list', dataset: { testid: 'not-measured' } }, local.notMeasured.map((id) => h('li', null, spotName(id))))),
    );
  };
  await render();
  let t: ReturnType<typeof setTimeout> | null = null;
  const off = onOutboxChange(() => { if (!t) t = setTimeout(() => { t = null; void render(); }, 200); });
  return () => { off(); if (t) clearTimeout(t); };
}
