/**
 * The spot screen: every reading of the spot, newest first, with the value as
 * entered, the normalized field, the verdict (colour and word), RH, meter,
 * surveyor and note. Corrections show as history: each superseded revision is
 * struck through with the reason; deleted readings stay visible as tombstones.
 */
import { z } from 'zod';
import { h, replace } from '../ui/h';
import { entryPanel } from '../ui/entry';
import { readingEstimateBlock } from '../ui/reading-estimate';
import { openSheet, toast } from '../ui/sheet';
import { flagChips, syncChip, verdictChip } from '../ui/verdict';
import { fmtAsEntered, fmtDateTime, fmtDistance, fmtField } from '../ui/format';
import { openSpotPage } from './spot-page-base';
import { correctReading, deleteReading, getRound, loadSpotHistory, readingsOfSpot } from '../data';
import { onOutboxChange, readingSyncState } from '../offline/outbox';
import { areaOf, revisionChains } from '../round/logic';
import { newId } from '../../core/ids/uuidv7';
import { AREA_KIND_LABEL, type SetupBundle } from '../../core/schemas';
import type { LocalReading } from '../offline/types';
import { spotFollowUpsSection, spotTrendSection } from './spot-trend';

const CORRECTION_REASONS = ['Wrong value typed', 'Wrong polarity', 'Wrong unit', 'Wrong distance', 'Wrong spot'];

export async function spotPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const spotId = params.id!;
  const opened = await openSpotPage(root, spotId, 'spot-page');
  if (!opened.spot) return () => undefined;
  const { body, bundle, spot } = opened;
  const area = areaOf(bundle, spot);
  const listEl = h('div', { class: 'revisions', dataset: { testid: 'spot-readings' } });
  const sourceEl = h('p', { class: 'muted' });
  const surveyors = new Map<string, string>();
  let readings: LocalReading[] = [];
  // Issue 4: follow-ups (with history) and the trend, above the reading history.
  const followUps = spotFollowUpsSection(bundle, spot, () => readings);
  const trend = spotTrendSection(spot);
  replace(body,
    h('div', { class: 'row between wrap' },
      h('div', null,
        h('p', { class: 'eyebrow' }, `${area?.name ?? ''}${area ? ` · ${AREA_KIND_LABEL[area.kind]}` : ''}`),
        h('h1', { dataset: { testid: 'spot-title' } }, spot.name),
        h('p', { class: 'spot-meta' }, h('span', { class: 'code' }, spot.code), ` ${spot.objectKind} · ${spot.materialClass} · default distance ${fmtDistance(spot.defaultDistance)}`),
        spot.retiredAt ? h('p', { class: 'banner banner-info' }, `Retired ${fmtDateTime(spot.retiredAt)}`) : null),
      h('div', { class: 'row gap wrap no-print' },
        h('a', { class: 'btn', href: `#/sweep/${spot.id}`, dataset: { testid: 'spot-sweep' } }, 'Sweep (several distances)'),
        h('a', { class: 'btn no-print', href: '#/' }, 'Home'))),
    spot.notes ? h('p', { class: 'spot-notes' }, spot.notes) : null,
    followUps.el,
    trend.el,
    h('h2', { class: 'section-title' }, 'Readings and corrections'),
    sourceEl,
    listEl);

  const load = async () => {
    const r = await loadSpotHistory(spotId);
    readings = r.readings;
    sourceEl.textContent = r.fromCache ? 'Offline: readings kept on this tablet.' : '';
    for (const rid of new Set(readings.map((x) => x.roundId))) {
      if (!surveyors.has(rid)) {
        const round = await getRound(rid);
        if (round) surveyors.set(rid, round.surveyor);
      }
    }
    render();
  };

  const render = () => {
    const chains = revisionChains(readings);
    replace(listEl, chains.length === 0 ? h('p', { class: 'muted' }, 'No readings yet.') : chains.map(({ head, older }) => h('article', {
      class: `rev-card${head.deleted ? ' is-deleted' : ''}`, dataset: { readingId: head.id },
    },
    revisionRow(head, bundle, surveyors, true),
    older.length ? h('details', { class: 'rev-history', open: true },
      h('summary', null, `History: ${older.length} earlier revision${older.length === 1 ? '' : 's'}`),
      h('ol', null, older.map((o, i) => h('li', null, revisionRow(o, bundle, surveyors, false, (i === 0 ? head : older[i - 1]!).correctionReason))))) : null,
    !head.deleted ? h('div', { class: 'row gap no-print' },
      h('button', { type: 'button', class: 'btn', dataset: { testid: 'correct' }, onclick: () => void correct(head) }, 'Correct'),
      h('button', { type: 'button', class: 'btn btn-danger-outline', dataset: { testid: 'delete' }, onclick: () => void remove(head) }, 'Delete')) : null)));
  };

  async function correct(old: LocalReading): Promise<void> {
    const reasonIn = h('input', { type: 'text', class: 'input-big', placeholder: 'Why is it corrected?', maxlength: 500, dataset: { path: 'reason', testid: 'correction-reason' } });
    const err = h('p', { class: 'field-error', dataset: { errorFor: 'reason' } });
    const panel = entryPanel({
      bundle: bundle!, spot: () => spot!, meterId: () => old.meterId,
      defaults: { unit: old.unit, polarity: old.polarity, distance: old.distance, zeroed: old.zeroed, side: old.side, note: old.note, value: String(old.value),
        meterRange: old.meterRange, groundBehind: old.groundBehind, distanceUncertaintyM: old.distanceUncertaintyM, process: old.process },
    });
    const done = await openSheet(`Correct the reading of ${fmtDateTime(old.takenAt)}`, (close) => {
      const submit = async () => {
        const e = panel.read();
        if (!e.ok) { err.textContent = e.message; return; }
        try {
          await correctReading(old, {
            ...old, ...e.value, id: newId(), reason: reasonIn.value.trim(),
          }, bundle!);
          close(true);
        } catch (x) {
          if (x instanceof z.ZodError) err.textContent = x.issues.map((i) => i.message).join('; ');
          else err.textContent = (x as Error).message;
        }
      };
      return [
        h('div', { class: 'correction-form' },
          h('div', null, panel.valueEl, panel.liveEl, panel.optionsEl,
            h('div', { class: 'field' }, h('label', null, 'Reason'),
              h('div', { class: 'pick-row wrap' }, CORRECTION_REASONS.map((r) => h('button', { type: 'button', class: 'pick-btn', onclick: () => { reasonIn.value = r; } }, r))),
              reasonIn, err)),
          h('div', null, panel.padEl,
            h('button', { type: 'button', class: 'btn btn-primary btn-big', dataset: { testid: 'save-correction' }, onclick: () => void submit() }, 'Save correction'))),
      ];
    }, { wide: true });
    panel.dispose();
    if (done === true) { toast('Correction saved on this tablet'); readings = await readingsOfSpot(spotId); render(); }
  }

  async function remove(old: LocalReading): Promise<void> {
    const reasonIn = h('input', { type: 'text', class: 'input-big', placeholder: 'Why is it deleted?', maxlength: 500, dataset: { testid: 'delete-reason' } });
    const err = h('p', { class: 'field-error' });
    const done = await openSheet('Delete this reading', (close) => [
      h('p', { class: 'sheet-message' }, `${fmtAsEntered(old)} at ${fmtDistance(old.distance)}, ${fmtDateTime(old.takenAt)}. It stays in the history, struck through, with your reason.`),
      h('div', { class: 'pick-row wrap' }, ['Entered twice', 'Wrong spot', 'Meter not zeroed', 'Test entry'].map((r) => h('button', { type: 'button', class: 'pick-btn', onclick: () => { reasonIn.value = r; } }, r))),
      reasonIn, err,
      h('div', { class: 'row gap' },
        h('button', {
          type: 'button', class: 'btn btn-danger', dataset: { testid: 'confirm-delete' }, onclick: async () => {
            try { await deleteReading(old, reasonIn.value.trim()); close(true); } catch (x) {
              err.textContent = x instanceof z.ZodError ? x.issues.map((i) => i.message).join('; ') : (x as Error).message;
            }
          },
        }, 'Delete'),
        h('button', { type: 'button', class: 'btn', onclick: () => close(false) }, 'Cancel')),
    ]);
    if (done === true) { toast('Deletion saved on this tablet'); readings = await readingsOfSpot(spotId); render(); }
  }

  await load();
  void followUps.refresh();
  let t: ReturnType<typeof setTimeout> | null = null;
  const off = onOutboxChange(() => {
    if (!t) t = setTimeout(async () => { t = null; readings = await readingsOfSpot(spotId); render(); }, 200);
  });
  return () => { off(); if (t) clearTimeout(t); followUps.dispose(); trend.dispose(); };
}

function revisionRow(r: LocalReading, bundle: SetupBundle, surveyors: Map<string, string>, isHead: boolean, supersededReason: string | null = null): HTMLElement {
  const meter = bundle.meters.find((m) => m.id === r.meterId);
  const sync = readingSyncState(r.id);
  const superseded = r.supersededById !== null;
  const struck = superseded || r.deleted !== null;
  const main = h('div', { class: `rev-main${struck ? ' is-struck' : ''}` },
    h('span', { class: 'rev-value' }, fmtAsEntered(r)),
    h('span', { class: 'r-field' }, fmtField(r.fieldVPerM)),
    verdictChip(r.verdict.level),
    h('span', { class: 'muted' }, `@ ${fmtDistance(r.distance)}`));
  return h('div', { class: `rev${isHead ? ' rev-head' : ''}`, dataset: { readingId: r.id, state: r.deleted ? 'deleted' : superseded ? 'superseded' : 'current' } },
    h('p', { class: 'rev-when' }, fmtDateTime(r.takenAt), ' ', syncChip(sync.state, sync.message),
      r.meterCalibrationOverdue ? h('span', { class: 'chip cal-chip' }, 'meter overdue') : null,
      ...flagChips(r.flags, { long: true })),
    main,
    readingEstimateBlock(r, bundle),
    h('p', { class: 'rev-meta' },
      `RH ${r.rhPercent === null ? '—' : `${r.rhPercent} %`} · meter ${meter ? (meter.label || meter.serial) : '—'} · ${surveyors.get(r.roundId) ?? 'surveyor —'}${r.zeroed ? '' : ' · not zeroed'}${r.side ? ` · ${r.side}` : ''}`),
    r.note ? h('p', { class: 'rev-note' }, r.note) : null,
    h('p', { class: 'verdict-reason' }, r.verdict.reason),
    isHead && r.correctionReason ? h('p', { class: 'rev-reason' }, `Corrected revision. Reason: ${r.correctionReason}`) : null,
    superseded ? h('p', { class: 'rev-reason', dataset: { testid: 'superseded-reason' } }, `Superseded by a correction${supersededReason ? `: ${supersededReason}` : ''}`) : null,
    r.deleted ? h('p', { class: 'rev-reason' }, `Deleted ${fmtDateTime(r.deleted.at)}: ${r.deleted.reason}`) : null);
}

