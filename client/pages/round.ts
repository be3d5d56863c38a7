/**
 * The round screen: walk the route spot by spot. The current spot's entry panel
 * (number pad, polarity, unit, distance ...), the live verdict, this round's
 * readings of the spot with their sync state, the spot's last readings, and the
 * route with a status chip per spot. A routine reading is the digits and Save.
 */
import { z } from 'zod';
import { h, replace } from '../ui/h';
import { entryPanel, unitsForMeter } from '../ui/entry';
import { openSheet, pickOne, toast } from '../ui/sheet';
import { flagChips, syncChip, verdictChip } from '../ui/verdict';
import { fmtAsEntered, fmtDateTime, fmtDistance, fmtField, fmtTime } from '../ui/format';
import { currentSetup } from '../app';
import {
  fetchRound, fetchRoundReadings, finishRound, getRound, readingsOfRound, readingsOfSpot, saveReading, skipSpot, skipsOfRound,
} from '../data';
import { onOutboxChange, readingSyncState } from '../offline/outbox';
import { areaOf, isCurrent, routeOf, spotStats } from '../round/logic';
import { prefs } from '../state';
import { navigate } from '../router';
import { newId } from '../../core/ids/uuidv7';
import { isCalibrationOverdue } from '../../core/readings/derive';
import { AREA_KIND_LABEL, type Spot } from '../../core/schemas';
import type { LocalReading, LocalRound, LocalSkip } from '../offline/types';
import type { ReadingUnit } from '../../core/units';
import { followUpBanner } from '../round/follow-up-banner';

const SKIP_REASONS = [
  'No access (blocked, locked or in use)',
  'Line not running',
  'Object not present',
  'Unsafe to approach',
  'Meter problem',
  'Out of time',
];

export async function roundPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const roundId = params.id!;
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return () => undefined; }
  const bundle = setup.data;
  let round: LocalRound | undefined = await getRound(roundId);
  if (!round) {
    const f = await fetchRound(roundId).catch(() => null);
    if (f) { round = f.round; await fetchRoundReadings(roundId).catch(() => undefined); }
  }
  if (!round) {
    root.append(h('div', { class: 'page' }, h('p', { class: 'error-box' }, 'This round is not on this tablet and the server does not know it.'), h('a', { class: 'btn', href: '#/' }, 'Home')));
    return () => undefined;
  }
  if (round.endedAt) { navigate(`#/round/${roundId}/summary`); return () => undefined; }
  const theRound: LocalRound = round;

  const route = (() => {
    const active = routeOf(bundle);
    const planned = theRound.plannedSpotIds.length ? theRound.plannedSpotIds : active.map((s) => s.id);
    const byId = new Map(bundle.spots.map((s) => [s.id, s]));
    const list = planned.map((id) => byId.get(id)).filter((s): s is Spot => !!s);
    return list.length ? list : active;
  })();
  if (route.length === 0) {
    root.append(h('div', { class: 'page' }, h('p', { class: 'error-box' }, 'This site has no spots yet. Add spots under Set-up.'), h('a', { class: 'btn', href: '#/setup/spots' }, 'Set-up → Spots')));
    return () => undefined;
  }

  let meterId: string | null = theRound.meterId ?? prefs.meterFor(bundle.site.id) ?? bundle.meters[0]?.id ?? null;
  const posKey = `chargewalk.roundpos.${roundId}`;
  let index = Math.min(route.length - 1, Math.max(0, Number(localStorage.getItem(posKey) ?? 0) || 0));
  // '#/round/<id>?spot=<spotId>' (a scanned label) opens that spot.
  const wanted = new URLSearchParams(location.hash.split('?')[1] ?? '').get('spot');
  let wantedMissing = false;
  if (wanted) {
    const i = route.findIndex((s) => s.id === wanted);
    if (i >= 0) index = i; else wantedMissing = true;
    history.replaceState(null, '', `#/round/${roundId}`); // a reload stays on the spot walked to since
  }
  let readings: LocalReading[] = await readingsOfRound(roundId);
  let skips: LocalSkip[] = await skipsOfRound(roundId);
  let spotHistory: LocalReading[] = [];
  let roundUnit: ReadingUnit | null = null;

  const spot = () => route[index]!;
  const meter = () => bundle.meters.find((m) => m.id === meterId) ?? null;
  const defaultUnit = (): ReadingUnit => {
    const units = unitsForMeter(bundle, meterId);
    const u = roundUnit ?? meter()?.defaultUnit ?? 'kV/m';
    return units.includes(u) ? u : (units[0] ?? 'kV/m');
  };

  // ---------- layout ----------
  const head = h('section', { class: 'round-head' });
  const banner = h('div', { class: 'banner-slot' });
  const routeEl = h('nav', { class: 'route', 'aria-label': 'Route' });
  const routeToggle = h('button', { type: 'button', class: 'btn btn-small route-toggle', 'aria-expanded': 'false', onclick: () => toggleRoute() });
  const spotHead = h('div', { class: 'spot-head' });
  const spotReadingsEl = h('div', { class: 'spot-readings' });
  const saveBtn = h('button', { type: 'button', class: 'btn btn-primary btn-save', dataset: { testid: 'save' }, onclick: () => void save() }, 'Save');
  const prevBtn = h('button', { type: 'button', class: 'btn btn-nav', dataset: { testid: 'prev' }, onclick: () => go(index - 1) }, '◀ Previous');
  const nextBtn = h('button', { type: 'button', class: 'btn btn-nav', dataset: { testid: 'next' }, onclick: () => go(index + 1) }, 'Next ▶');
  const skipBtn = h('button', { type: 'button', class: 'btn btn-skip', dataset: { testid: 'skip' }, onclick: () => void skip() }, 'Skip spot');

  const fuBanner = followUpBanner(bundle, (spotId) => [...readings, ...spotHistory].filter((r) => r.spotId === spotId));
  const entry = entryPanel({
    bundle, spot, meterId: () => meterId,
    defaults: { unit: defaultUnit(), polarity: '+', distance: spot().defaultDistance, zeroed: true, side: null, note: '', value: '' },
    onSubmit: () => void save(),
  });

  const page = h('div', { class: 'round-page' },
    head, banner,
    h('div', { class: 'round-body' },
      routeEl,
      h('section', { class: 'entry', 'aria-label': 'Reading entry' },
        h('div', { class: 'e-head' }, spotHead, fuBanner.el),
        h('div', { class: 'e-hist' }, spotReadingsEl),
        h('div', { class: 'e-value' }, entry.valueEl),
        h('div', { class: 'e-live' }, entry.liveEl),
        h('div', { class: 'e-opts' }, entry.optionsEl),
        h('div', { class: 'e-pad' }, entry.padEl,
          h('div', { class: 'pad-actions' }, saveBtn, h('div', { class: 'nav-pair' }, prevBtn, nextBtn), skipBtn)))));
  root.append(page);

  function toggleRoute(force?: boolean): void {
    const open = force ?? !page.classList.contains('route-open');
    page.classList.toggle('route-open', open);
    routeToggle.setAttribute('aria-expanded', String(open));
  }

  // ---------- rendering ----------
  function statusOf(s: Spot): { label: string; node: HTMLElement } {
    const mine = readings.filter((r) => r.spotId === s.id && isCurrent(r));
    if (mine.length) {
      const st = spotStats(mine);
      return { label: st.worst!.verdict.level, node: verdictChip(st.worst!.verdict.level) };
    }
    if (skips.some((k) => k.spotId === s.id)) return { label: 'skipped', node: h('span', { class: 'chip chip-skip' }, '⤼ skipped') };
    return { label: 'not yet', node: h('span', { class: 'chip chip-todo' }, 'not yet') };
  }

  function renderHead(): void {
    const measured = new Set(readings.filter(isCurrent).map((r) => r.spotId)).size;
    const m = meter();
    replace(head,
      h('div', { class: 'rh-info' },
        h('span', { class: 'rh-who' }, theRound.surveyor),
        h('span', { class: 'rh-air' }, `RH ${theRound.rhPercent === null ? '—' : `${theRound.rhPercent} %`} · temp. ${theRound.temperatureC === null ? '—' : `${theRound.temperatureC} °C`}`)),
      h('div', { class: 'rh-actions' },
        h('button', { type: 'button', class: 'btn btn-small', dataset: { testid: 'meter' }, onclick: () => void pickMeter() }, m ? (m.label || m.serial) : 'Pick meter'),
        routeToggle,
        h('a', { class: 'btn btn-small', href: '#/scan', dataset: { testid: 'round-scan' } }, 'Scan label'),
        h('button', { type: 'button', class: 'btn btn-small btn-finish', dataset: { testid: 'finish' }, onclick: () => void finish() }, 'Finish')));
    replace(routeToggle, `Route ${measured}/${route.length}`);
    replace(banner, m && isCalibrationOverdue(m.calibrationDue, new Date().toISOString())
      ? h('div', { class: 'banner banner-warn', role: 'alert', dataset: { testid: 'cal-banner' } },
        `▲ Meter ${m.label || m.serial} was due for calibration on ${m.calibrationDue}. Every reading it makes is flagged "meter overdue".`)
      : !m ? h('div', { class: 'banner banner-warn' }, 'Pick the meter you carry before saving readings.') : null);
  }

  function renderRoute(): void {
    const groups: { areaName: string; spots: { s: Spot; i: number }[] }[] = [];
    route.forEach((s, i) => {
      const name = areaOf(bundle, s)?.name ?? 'Area';
      const last = groups[groups.length - 1];
      if (last && last.areaName === name) last.spots.push({ s, i });
      else groups.push({ areaName: name, spots: [{ s, i }] });
    });
    replace(routeEl, groups.map((g) => h('div', { class: 'route-group' },
      h('h3', null, g.areaName),
      h('ol', { class: 'route-list' }, g.spots.map(({ s, i }) => {
        const st = statusOf(s);
        return h('li', null, h('button', {
          type: 'button', class: `route-item${i === index ? ' is-current' : ''}`, 'aria-current': i === index ? 'step' : undefined,
          dataset: { spotId: s.id, status: st.label },
          onclick: () => { go(i); toggleRoute(false); },
        }, h('span', { class: 'code' }, s.code), h('span', { class: 'route-name' }, s.name), st.node));
      })))));
  }

  function renderSpot(): void {
    const s = spot();
    const area = areaOf(bundle, s);
    replace(spotHead,
      h('p', { class: 'eyebrow' }, `${index + 1} of ${route.length} · ${area?.name ?? ''}${area ? ` · ${area.zone !== null ? `zone ${area.zone}${area.gasGroup ? ` ${area.gasGroup}` : ''}` : AREA_KIND_LABEL[area.kind]}` : ''}`),
      h('h1', { class: 'spot-name', dataset: { testid: 'spot-name' } }, s.name),
      h('p', { class: 'spot-meta' }, h('span', { class: 'code' }, s.code), ` ${s.objectKind} · ${s.materialClass} · default ${fmtDistance(s.defaultDistance)} `,
        h('a', { href: `#/spot/${s.id}`, class: 'link link-touch', dataset: { testid: 'spot-history' } }, 'spot history')));
    fuBanner.show(s.id);
    prevBtn.disabled = index === 0;
    nextBtn.disabled = index === route.length - 1;
    renderSpotReadings();
  }

  function renderSpotReadings(): void {
    const s = spot();
    const mine = readings.filter((r) => r.spotId === s.id && isCurrent(r)).sort((a, b) => b.takenAt.localeCompare(a.takenAt));
    const st = spotStats(mine);
    const earlier = spotHistory.filter((r) => r.roundId !== roundId && isCurrent(r)).sort((a, b) => b.takenAt.localeCompare(a.takenAt)).slice(0, 3);
    const skip = skips.find((k) => k.spotId === s.id);
    replace(spotReadingsEl,
      skip ? h('p', { class: 'chip chip-skip' }, `Skipped: ${skip.reason}`) : null,
      mine.length ? h('div', { class: 'this-round' },
        h('p', { class: 'stats-line' },
          h('span', null, `This round: ${mine.length} reading${mine.length === 1 ? '' : 's'}`),
          h('span', null, ' · worst ', verdictChip(st.worst!.verdict.level), ` ${fmtField(st.worst!.fieldVPerM)}`),
          h('span', null, ` · typical ${fmtField(st.typicalAbsVPerM)}`)),
        h('ul', { class: 'reading-list compact', dataset: { testid: 'round-readings' } }, mine.map((r) => readingRow(r))))
        : null,
      h('div', { class: 'earlier' },
        h('span', { class: 'muted' }, 'Last readings: '),
        earlier.length === 0 ? h('span', { class: 'muted' }, 'none on this tablet') : earlier.map((r) =>
          h('span', { class: 'earlier-item' }, verdictChip(r.verdict.level), ` ${fmtAsEntered(r)} @ ${fmtDistance(r.distance)} · ${fmtDateTime(r.takenAt)}`))));
  }

  function readingRow(r: LocalReading): HTMLElement {
    const sync = readingSyncState(r.id);
    return h('li', { class: 'reading-row', dataset: { readingId: r.id } },
      h('span', { class: 'r-time' }, fmtTime(r.takenAt)),
      h('span', { class: 'r-value' }, fmtAsEntered(r)),
      h('span', { class: 'r-field' }, fmtField(r.fieldVPerM)),
      verdictChip(r.verdict.level),
      r.meterCalibrationOverdue ? h('span', { class: 'chip cal-chip' }, 'meter overdue') : null,
      ...flagChips(r.flags),
      !r.zeroed ? h('span', { class: 'chip chip-todo' }, 'not zeroed') : null,
      syncChip(sync.state, sync.message),
      r.note ? h('span', { class: 'r-note' }, r.note) : null);
  }

  async function loadSpotHistory(): Promise<void> {
    const id = spot().id;
    const list = await readingsOfSpot(id);
    if (spot().id === id) { spotHistory = list; renderSpotReadings(); }
  }

  function go(i: number): void {
    if (i < 0 || i >= route.length) return;
    index = i;
    localStorage.setItem(posKey, String(index));
    entry.reset({ value: '', polarity: '+', distance: spot().defaultDistance, side: null, note: '', zeroed: true, unit: defaultUnit() });
    spotHistory = [];
    renderSpot();
    renderRoute();
    void loadSpotHistory();
    routeEl.querySelector('.is-current')?.scrollIntoView({ block: 'nearest' });
  }

  // ---------- actions ----------
  let saving = false;
  async function save(): Promise<void> {
    if (saving) return;
    const e = entry.read();
    if (!e.ok) { toast(e.message, 'warn'); return; }
    if (!meterId) { toast('Pick the meter first', 'warn'); void pickMeter(); return; }
    saving = true;
    saveBtn.disabled = true;
    try {
      roundUnit = entry.unit();
      const r = await saveReading({
        ...e.value, id: newId(), roundId, spotId: spot().id, meterId, takenAt: new Date().toISOString(),
        rhPercent: theRound.rhPercent, temperatureC: theRound.temperatureC,
      }, bundle);
      readings = [...readings, r];
      entry.reset({ value: '', note: '' });
      entry.flash(`Saved on this tablet: ${fmtAsEntered(r)} = ${fmtField(r.fieldVPerM)}`, r.verdict.level);
      fuBanner.afterSave(r);
      renderHead(); renderSpotReadings(); renderRoute();
    } catch (err) {
      if (err instanceof z.ZodError) toast(err.issues.map((i) => i.message).join('; '), 'error');
      else toast(`Not saved: ${(err as Error).message}`, 'error');
    } finally {
      saving = false;
      saveBtn.disabled = false;
    }
  }

  async function skip(): Promise<void> {
    const free = h('input', { type: 'text', class: 'input-big', placeholder: 'Other reason', maxlength: 500, 'aria-label': 'Other reason', dataset: { testid: 'skip-other' } });
    const reason = await openSheet(`Skip ${spot().name}`, (close) => [
      h('div', { class: 'pick-list' }, SKIP_REASONS.map((r) => h('button', { type: 'button', class: 'pick', onclick: () => close(r) }, r))),
      h('div', { class: 'row gap' }, free, h('button', { type: 'button', class: 'btn btn-primary', onclick: () => { if (free.value.trim()) close(free.value.trim()); } }, 'Skip with this reason')),
    ]) as string | null;
    if (!reason) return;
    try {
      const k = await skipSpot({ id: newId(), roundId, spotId: spot().id, reason, at: new Date().toISOString() });
      skips = [...skips, k];
      renderRoute(); renderSpotReadings();
      toast('Skipped; saved on this tablet');
      if (index < route.length - 1) go(index + 1);
    } catch (err) {
      toast(`Not saved: ${(err as Error).message}`, 'error');
    }
  }

  async function pickMeter(): Promise<void> {
    const now = new Date().toISOString();
    const v = await pickOne('Meter', bundle.meters.map((m) => ({
      value: m.id, label: m.label || m.serial,
      hint: isCalibrationOverdue(m.calibrationDue, now) ? `calibration overdue (due ${m.calibrationDue})` : `due ${m.calibrationDue}`,
    })), meterId);
    if (v) {
      meterId = v;
      prefs.setMeterFor(bundle.site.id, v);
      entry.reset({ unit: defaultUnit() });
      renderHead();
    }
  }

  async function finish(): Promise<void> {
    const measured = new Set(readings.filter(isCurrent).map((r) => r.spotId));
    const skipped = new Set(skips.map((k) => k.spotId));
    const notMeasured = route.filter((s) => !measured.has(s.id) && !skipped.has(s.id));
    const notes = h('textarea', { rows: 3, maxlength: 2000, class: 'note-input', 'aria-label': 'Round notes', placeholder: 'Notes for this round (optional)' });
    const ok = await openSheet('Finish the round', (close) => [
      h('p', { class: 'sheet-message' }, `${measured.size} of ${route.length} spots measured, ${skipped.size} skipped, ${notMeasured.length} not measured.`),
      notMeasured.length ? h('p', { class: 'muted' }, `Not measured: ${notMeasured.map((s) => s.code).join(', ')}`) : null,
      notes,
      h('div', { class: 'row gap' },
        h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'finish-confirm' }, onclick: () => close(true) }, 'Finish round'),
        h('button', { type: 'button', class: 'btn', onclick: () => close(false) }, 'Keep walking')),
    ]);
    if (ok !== true) return;
    await finishRound(theRound, new Date().toISOString(), notes.value.trim() || undefined);
    localStorage.removeItem(posKey);
    navigate(`#/round/${roundId}/summary`);
  }

  // ---------- live sync state ----------
  let pendingRefresh: ReturnType<typeof setTimeout> | null = null;
  const off = onOutboxChange(() => {
    if (pendingRefresh) return;
    pendingRefresh = setTimeout(async () => {
      pendingRefresh = null;
      readings = await readingsOfRound(roundId);
      skips = await skipsOfRound(roundId);
      renderSpotReadings();
    }, 150);
  });

  renderHead();
  go(index);
  if (wantedMissing) toast('The scanned spot is not on this round\'s route', 'warn');
  return () => {
    off();
    entry.dispose();
    if (pendingRefresh) clearTimeout(pendingRefresh);
  };
}

