/**
 * The reading entry panel: value on the number pad, polarity, unit, distance,
 * zeroed, side and note, with the normalized field and limit verdict shown
 * live as the digits go in. Used by the round screen (new readings) and the spot
 * screen (corrections, prefilled). Builds a ReadingInput; the caller saves it.
 */
import { h, replace } from './h';
import { numpad } from './numpad';
import { openSheet, pickOne } from './sheet';
import { verdictChip } from './verdict';
import { fmtDistance, fmtField } from './format';
import { estimateBlock, MODEL_LABEL } from './estimate-view';
import { VOLTS_PER_SURFACE_VOLTAGE_UNIT, isSurfaceVoltageUnit } from '../../core/units/field';
import { preview } from '../round/logic';
import { DISTANCE_UNITS, FIELD_UNITS, READING_UNITS, type DistanceUnit, type ReadingUnit } from '../../core/units';
import { SIDES, type Distance, type ReadingInput, type SetupBundle, type Spot } from '../../core/schemas';
import { isCalibrationOverdue } from '../../core/readings/derive';

export interface EntryDefaults {
  unit: ReadingUnit;
  polarity: '+' | '-';
  distance: Distance;
  zeroed: boolean;
  side: ReadingInput['side'];
  note: string;
  value: string;
  /** Less common details, kept on the panel from one reading to the next (ground behind resets per spot). */
  meterRange?: string;
  groundBehind?: Distance | null;
  distanceUncertaintyM?: number | null;
  process?: ReadingInput['process'];
}

type EntryValue = Pick<ReadingInput, 'value' | 'unit' | 'polarity' | 'distance' | 'side' | 'zeroed' | 'note' | 'meterRange' | 'groundBehind' | 'distanceUncertaintyM' | 'process'>;

export interface EntryPanel {
  /** The value display, polarity and unit. */
  valueEl: HTMLElement;
  /** Normalized field and verdict. */
  liveEl: HTMLElement;
  /** Distance, zeroed, side, note. */
  optionsEl: HTMLElement;
  padEl: HTMLElement;
  /** The reading as entered, or a message saying what is missing. */
  /** What the panel controls; the caller adds ids, time, ambient and the rest. */
  read(): { ok: true; value: EntryValue } | { ok: false; message: string };
  reset(defaults: Partial<EntryDefaults>): void;
  unit(): ReadingUnit;
  /** A line shown in the live box until the next digit ("Saved on this tablet …"). */
  flash(message: string, level?: 'ok' | 'warn' | 'alarm'): void;
  dispose(): void;
}

const DISTANCE_PRESETS: Record<DistanceUnit, number[]> = {
  mm: [10, 25, 50, 100, 150, 200, 300, 500],
  cm: [1, 2.5, 5, 10, 15, 20, 30, 50, 100],
  m: [0.025, 0.05, 0.1, 0.15, 0.2, 0.3, 0.5, 1],
  inch: [1, 2, 3, 4, 6, 8, 12, 24],
};

const SIDE_LABEL: Record<string, string> = {
  front: 'front', back: 'back', top: 'top', bottom: 'bottom', left: 'left', right: 'right', inside: 'inside', edge: 'edge',
  'free-span': 'free span (web between rollers)', 'over-roller': 'over a roller (reads low)', other: 'other',
};

export function unitsForMeter(bundle: SetupBundle, meterId: string | null): ReadingUnit[] {
  const m = bundle.meters.find((x) => x.id === meterId);
  if (m && m.modes.includes('surface-voltage') && m.calibratedDistanceM) {
    return m.modes.includes('field') ? [...READING_UNITS] : ['V', 'kV'];
  }
  return [...FIELD_UNITS];
}

export function entryPanel(opts: {
  bundle: SetupBundle;
  spot: () => Spot;
  meterId: () => string | null;
  defaults: EntryDefaults;
  onSubmit?: () => void;
}): EntryPanel {
  const { bundle } = opts;
  let st: EntryDefaults = { ...opts.defaults };
  let flashed: { message: string; level: 'ok' | 'warn' | 'alarm' } | null = null;

  const display = h('output', { class: 'value-display', dataset: { testid: 'value-display' }, 'aria-live': 'polite' });
  const polBtn = h('button', {
    type: 'button', class: 'btn pol-btn', dataset: { testid: 'polarity' }, 'aria-label': 'polarity',
    onclick: () => { st.polarity = st.polarity === '+' ? '-' : '+'; render(); },
  });
  const unitBtn = h('button', {
    type: 'button', class: 'btn unit-btn', dataset: { testid: 'unit' }, 'aria-label': 'unit',
    onclick: async () => {
      const u = await pickOne('Unit on the meter display', unitsForMeter(bundle, opts.meterId()).map((x) => ({
        value: x, label: x, hint: x === 'V' || x === 'kV' ? 'surface-voltage mode: volts at the calibrated distance' : undefined,
      })), st.unit);
      if (u) { st.unit = u; render(); }
    },
  });
  const valueEl = h('div', { class: 'value-row' }, polBtn, display, unitBtn);

  const fieldEl = h('div', { class: 'live-field', dataset: { testid: 'live-field' } });
  const verdictEl = h('div', { class: 'live-verdict', dataset: { testid: 'live-verdict' } });
  const estEl = h('div', { class: 'live-estimate', dataset: { testid: 'live-estimate' } });
  let estOpen = false; // the details stay open while digits change
  const liveEl = h('div', { class: 'live' }, fieldEl, verdictEl, estEl);

  const distBtn = h('button', { type: 'button', class: 'btn opt-btn', dataset: { testid: 'distance' }, onclick: () => void pickDistance() });
  const zeroBtn = h('button', {
    type: 'button', class: 'btn opt-btn', role: 'switch', dataset: { testid: 'zeroed' },
    onclick: () => { st.zeroed = !st.zeroed; render(); },
  });
  const sideBtn = h('button', {
    type: 'button', class: 'btn opt-btn', dataset: { testid: 'side' },
    onclick: async () => {
      const v = await pickOne('Side measured', [{ value: '', label: 'not given' }, ...SIDES.map((s) => ({ value: s, label: SIDE_LABEL[s] ?? s }))], st.side ?? '');
      if (v !== null) { st.side = v === '' ? null : (v as ReadingInput['side']); render(); }
    },
  });
  const noteBtn = h('button', { type: 'button', class: 'btn opt-btn', dataset: { testid: 'note' }, onclick: () => void editNote() });
  const moreBtn = h('button', { type: 'button', class: 'btn opt-btn', dataset: { testid: 'more' }, onclick: () => void editMore() });
  const optionsEl = h('div', { class: 'options-row' }, distBtn, zeroBtn, sideBtn, noteBtn, moreBtn);

  const pad = numpad({ label: 'Number pad for the reading', onChange: (v) => { st.value = v; render(); } });
  if (st.value) pad.set(st.value); // a correction starts from the value as entered
  const unbind = pad.bindKeyboard();
  const onEnter = (e: KeyboardEvent) => {
    if (e.key !== 'Enter' || !opts.onSubmit || !pad.el.isConnected) return;
    const t = e.target as HTMLElement | null;
    if (t && (t.tagName === 'TEXTAREA' || t.tagName === 'INPUT' || t.tagName === 'BUTTON' || t.closest('dialog'))) return;
    e.preventDefault();
    opts.onSubmit();
  };
  window.addEventListener('keydown', onEnter);

  async function pickDistance(): Promise<void> {
    let unit: DistanceUnit = st.distance.unit;
    let custom = '';
    const v = await openSheet('Distance from the object', (close) => {
      const presets = h('div', { class: 'pick-grid' });
      const unitRow = h('div', { class: 'seg' });
      const customOut = h('output', { class: 'value-display value-small' });
      const renderSheet = () => {
        replace(unitRow, DISTANCE_UNITS.map((u) => h('button', {
          type: 'button', class: `seg-btn${u === unit ? ' is-on' : ''}`, 'aria-pressed': String(u === unit),
          onclick: () => { unit = u; renderSheet(); },
        }, u)));
        replace(presets, DISTANCE_PRESETS[unit].map((d) => h('button', {
          type: 'button', class: `pick-btn${d === st.distance.value && unit === st.distance.unit ? ' is-on' : ''}`,
          onclick: () => close({ value: d, unit }),
        }, `${d} ${unit}`)));
        customOut.textContent = custom ? `${custom} ${unit}` : `other: type on the pad (${unit})`;
      };
      const p2 = numpad({ label: 'Number pad for the distance', maxLength: 6, onChange: (x) => { custom = x; renderSheet(); } });
      renderSheet();
      return [
        unitRow, presets,
        h('div', { class: 'custom-distance' }, customOut, p2.el,
          h('button', {
            type: 'button', class: 'btn btn-primary', onclick: () => {
              const n = Number(custom);
              if (custom && Number.isFinite(n) && n > 0) close({ value: n, unit });
            },
          }, 'Use this distance')),
      ];
    }, { wide: true }) as Distance | null;
    if (v) { st.distance = v; render(); }
  }

  async function editNote(): Promise<void> {
    const ta = h('textarea', { rows: 4, maxlength: 2000, class: 'note-input', 'aria-label': 'Note', dataset: { testid: 'note-input' } });
    ta.value = st.note;
    const v = await openSheet('Note', (close) => [
      ta,
      h('div', { class: 'row gap' },
        h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'note-done' }, onclick: () => close(ta.value) }, 'Done'),
        h('button', { type: 'button', class: 'btn', onclick: () => close('') }, 'Clear')),
    ]);
    if (typeof v === 'string') { st.note = v; render(); }
  }

  /**
   * Less common details in one sheet: meter range, the nearest ground behind the
   * object (a web over a roller reads low: the sheet model needs it), distance
   * uncertainty, and the process state (running or idle, material, line speed).
   */
  async function editMore(): Promise<void> {
    let range = st.meterRange ?? '';
    let ground: Distance | null = st.groundBehind ?? null;
    let du: number | null = st.distanceUncertaintyM ?? null;
    let proc: ReadingInput['process'] = st.process ?? null;
    const done = await openSheet('More about this reading', (close) => {
      const body = h('div', { class: 'more-sheet' });
      const speedPad = numpad({ label: 'Number pad for the line speed', maxLength: 5, onChange: (x) => {
        const n = Number(x);
        if (proc) proc = { ...proc, lineSpeedMPerS: x === '' || !Number.isFinite(n) ? null : n };
        speedOut.textContent = proc?.lineSpeedMPerS != null ? `${proc.lineSpeedMPerS} m/s` : 'not given';
      } });
      const speedOut = h('output', { class: 'value-display value-small', dataset: { testid: 'more-speed' } });
      const materialIn = h('input', { type: 'text', maxlength: 120, class: 'text-input', 'aria-label': 'Material on the line', dataset: { testid: 'more-material' } });
      materialIn.value = proc?.material ?? '';
      materialIn.addEventListener('input', () => { if (proc) proc = { ...proc, material: materialIn.value }; });
      const seg = <T extends string | number | null>(label: string, testid: string, options: { value: T; label: string }[], get: () => T, set: (v: T) => void) => {
        const row = h('div', { class: 'seg', role: 'group', 'aria-label': label, dataset: { testid } });
        const draw = () => replace(row, options.map((o) => h('button', {
          type: 'button', class: `seg-btn${o.value === get() ? ' is-on' : ''}`, 'aria-pressed': String(o.value === get()),
          onclick: () => { set(o.value); draw(); renderProc(); },
        }, o.label)));
        draw();
        return h('div', { class: 'more-row' }, h('span', { class: 'opt-label' }, label), row);
      };
      const groundKey = (g: Distance | null) => (g ? `${g.value} ${g.unit}` : 'none');
      const procSection = h('div', { class: 'more-proc' });
      const renderProc = () => {
        speedOut.textContent = proc?.lineSpeedMPerS != null ? `${proc.lineSpeedMPerS} m/s` : 'not given';
        replace(procSection, proc
          ? [h('label', { class: 'more-row' }, h('span', { class: 'opt-label' }, 'Material'), materialIn),
            h('div', { class: 'more-row' }, h('span', { class: 'opt-label' }, 'Line speed'), speedOut), speedPad.el]
          : []);
      };
      replace(body,
        seg<string>('Meter range', 'more-range', ['', '200 V', '2 kV', '20 kV', '200 kV', '2 MV'].map((v) => ({ value: v, label: v === '' ? 'not given' : v })), () => range, (v) => { range = v; }),
        seg<string>('Nearest ground behind the object', 'more-ground', ['none', '5 mm', '10 mm', '25 mm', '50 mm', '100 mm', '300 mm'].map((v) => ({ value: v, label: v === 'none' ? 'not known' : v })),
          () => groundKey(ground), (v) => { ground = v === 'none' ? null : { value: Number(v.split(' ')[0]), unit: 'mm' }; }),
        seg<number | null>('Distance uncertainty', 'more-du', [null, 0.002, 0.005, 0.01, 0.02, 0.05].map((v) => ({ value: v, label: v === null ? 'spot default' : `± ${v * 1000} mm` })), () => du, (v) => { du = v; }),
        seg<string>('Process', 'more-process', [{ value: 'none', label: 'not recorded' }, { value: 'running', label: 'running' }, { value: 'idle', label: 'idle' }],
          () => proc?.state ?? 'none', (v) => { proc = v === 'none' ? null : { state: v as 'running' | 'idle', material: proc?.material ?? materialIn.value, lineSpeedMPerS: proc?.lineSpeedMPerS ?? null }; }),
        procSection,
        h('p', { class: 'muted small' }, 'A web measured over a roller or next to a grounded frame reads low: give the gap to that ground so the estimate can allow for it.'),
        h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'more-done' }, onclick: () => close(true) }, 'Done'),
      );
      if (proc?.lineSpeedMPerS != null) speedPad.set(String(proc.lineSpeedMPerS));
      renderProc();
      return [body];
    }, { wide: true });
    if (done === true) {
      st.meterRange = range; st.groundBehind = ground; st.distanceUncertaintyM = du; st.process = proc;
      render();
    }
  }

  function current() {
    const value = st.value === '' ? NaN : Number(st.value);
    return {
      value, unit: st.unit, polarity: st.polarity, meterRange: st.meterRange ?? '', distance: st.distance,
      distanceUncertaintyM: st.distanceUncertaintyM ?? null, side: st.side, groundBehind: st.groundBehind ?? null,
      zeroed: st.zeroed, rhPercent: null, temperatureC: null, process: st.process ?? null, note: st.note,
    };
  }

  function render(): void {
    const units = unitsForMeter(bundle, opts.meterId());
    if (!units.includes(st.unit)) st.unit = units[0] ?? 'kV/m';
    polBtn.textContent = st.polarity === '-' ? '−' : '+';
    polBtn.classList.toggle('is-neg', st.polarity === '-');
    polBtn.setAttribute('aria-label', `polarity ${st.polarity === '-' ? 'negative' : 'positive'}; tap to change`);
    const shown = st.value === '' ? '' : `${st.polarity === '-' ? '−' : ''}${st.value}`;
    replace(display, st.value === '' ? h('span', { class: 'placeholder' }, '0') : shown);
    display.dataset.len = shown.length >= 8 ? 'xl' : shown.length >= 5 ? 'l' : 's';
    unitBtn.textContent = st.unit;
    distBtn.replaceChildren(h('span', { class: 'opt-label' }, 'Distance'), h('span', { class: 'opt-value' }, fmtDistance(st.distance)));
    zeroBtn.replaceChildren(h('span', { class: 'opt-label' }, 'Zeroed'), h('span', { class: 'opt-value' }, st.zeroed ? '✓ yes' : '✗ no'));
    zeroBtn.setAttribute('aria-checked', String(st.zeroed));
    zeroBtn.classList.toggle('is-warn', !st.zeroed);
    sideBtn.replaceChildren(h('span', { class: 'opt-label' }, 'Side'), h('span', { class: 'opt-value' }, st.side ? (SIDE_LABEL[st.side] ?? st.side) : '—'));
    noteBtn.replaceChildren(h('span', { class: 'opt-label' }, 'Note'), h('span', { class: 'opt-value note-preview' }, st.note ? st.note : '+ add'));
    const moreBits = [st.meterRange, st.groundBehind ? `ground ${fmtDistance(st.groundBehind)}` : '', st.process ? st.process.state : ''].filter(Boolean);
    moreBtn.replaceChildren(h('span', { class: 'opt-label' }, 'More'), h('span', { class: 'opt-value note-preview' }, moreBits.length ? moreBits.join(' · ') : 'range, ground, process'));

    const spot = opts.spot();
    const cur = current();
    const meter = bundle.meters.find((m) => m.id === opts.meterId());
    if (!Number.isFinite(cur.value)) {
      if (flashed) {
        replace(fieldEl, h('span', { class: 'saved-line', dataset: { testid: 'saved-line' } }, `✓ ${flashed.message}`));
        replace(verdictEl, verdictChip(flashed.level));
      } else {
        replace(fieldEl, h('span', { class: 'muted' }, 'Field at the meter: type the value'));
        replace(verdictEl);
      }
      replace(estEl, estimateHint(spot));
      return;
    }
    flashed = null;
    const d = preview({ ...cur, spotId: spot.id, meterId: opts.meterId() ?? '', takenAt: new Date().toISOString() }, bundle);
    if (!d) {
      replace(fieldEl, h('span', { class: 'error-text' }, meter?.calibratedDistanceM ? 'Cannot convert this value' : 'This unit needs the meter\'s calibrated distance (set-up → meters)'));
      replace(verdictEl);
      replace(estEl);
      return;
    }
    replace(fieldEl, h('span', { class: 'muted' }, 'Field at the meter '), h('strong', { class: 'field-si' }, fmtField(d.fieldVPerM)));
    // The charge estimate with the spot's model: headline with interval, hazard verdict, details folded (client/ui/estimate-view.ts).
    replace(estEl, estimateBlock({
      estimate: d.estimate, note: d.estimateNote, hazards: d.hazards, spot, sweepHref: `#/sweep/${spot.id}`, open: estOpen, onToggle: (o) => { estOpen = o; },
      reading: { fieldVPerM: d.fieldVPerM, distanceM: d.distanceM, potentialV: svPotential(cur) },
    }));
    replace(verdictEl, verdictChip(d.verdict.level, { big: true }), h('span', { class: 'verdict-reason' }, d.verdict.reason),
      meter && isCalibrationOverdue(meter.calibrationDue, new Date().toISOString()) ? h('span', { class: 'chip cal-chip' }, 'meter overdue') : null);
  }

  render();
  return {
    valueEl, liveEl, optionsEl, padEl: pad.el,
    read() {
      const c = current();
      if (st.value === '' || !Number.isFinite(c.value)) return { ok: false, message: 'Type the value on the pad first' };
      return { ok: true, value: {
        value: c.value, unit: c.unit, polarity: c.polarity, distance: c.distance, side: c.side, zeroed: c.zeroed, note: c.note,
        meterRange: c.meterRange, groundBehind: c.groundBehind, distanceUncertaintyM: c.distanceUncertaintyM, process: c.process,
      } };
    },
    flash(message, level = 'ok') { flashed = { message, level }; render(); },
    reset(d) {
      if (d.distance) { flashed = null; st.groundBehind = null; } // a new spot: its own ground behind
      st = { ...st, ...d };
      pad.set(st.value);
      render();
    },
    unit: () => st.unit,
    dispose() { unbind(); window.removeEventListener('keydown', onEnter); },
  };
}

/** Before the value is typed: which model the estimate will use, and the way to a sweep. */
function estimateHint(spot: Spot): HTMLElement | null {
  if (!spot.model) return null;
  return h('p', { class: 'est-headline est-hint muted', dataset: { testid: 'estimate-hint' } }, `Charge estimate: ${MODEL_LABEL[spot.model]} `,
    h('a', { class: 'btn btn-small', href: `#/sweep/${spot.id}`, dataset: { testid: 'sweep-link' } }, 'Sweep'), ' ',
    h('a', { class: 'btn btn-small btn-ghost est-how', href: '#/models' }, 'How?'));
}

/** A surface-voltage reading as a signed potential, V (the conductor model's input); null for a field reading. */
function svPotential(r: { value: number; unit: ReadingUnit; polarity: '+' | '-' }): number | null {
  return isSurfaceVoltageUnit(r.unit) ? (r.polarity === '-' ? -1 : 1) * r.value * VOLTS_PER_SURFACE_VOLTAGE_UNIT[r.unit] : null;
}
