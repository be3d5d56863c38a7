/**
 * The charge estimate of a reading, as the entry panel and the spot screen show it:
 * a one-line headline ("Charge −42.0 nC (−58.3 … −30.1 nC), line / cylinder model"),
 * the worst hazard verdict as colour AND word, and, folded, the model's inputs, the
 * validity warnings, every applicable hazard verdict with the numbers compared and
 * the source, and the caution. Plain DOM; user text only ever as text nodes.
 */
import './estimate.css';
import { h, type Child } from './h';
import { verdictChip } from './verdict';
import { formatSi, formatSignificant } from '../../core/units/format';
import { CAUTION, type Verdict } from '../../core/hazard/verdicts';
import { CENTRE_DISTANCE_MODELS, type EstimateModel, type EstimateResponse } from '../../core/schemas/estimate';
import { webChargeCurrentA } from '../../core/physics/models/sheet';
import type { EstimateNote, SpotEstimateContext } from '../../core/readings/estimate';

export const MODEL_LABEL: Record<EstimateModel, string> = {
  point: 'point model',
  sphere: 'sphere model',
  'dipole-axis': 'dipole (on axis) model',
  'dipole-broadside': 'dipole (broadside) model',
  'image-charge': 'charge over ground (image) model',
  line: 'line / cylinder model',
  disk: 'disk model',
  rectangle: 'rectangle model',
  sheet: 'sheet model',
  'layer-on-ground': 'layer on a grounded backing model',
  conductor: 'conductor (Q = C·V) model',
  'bulk-cylinder': 'bulk contents model (indicative)',
};

const QUANTITY: { key: keyof EstimateResponse['interval']; label: string; unit: string }[] = [
  { key: 'chargeC', label: 'Charge', unit: 'C' },
  { key: 'surfaceChargeDensityCPerM2', label: 'Surface charge', unit: 'C/m²' },
  { key: 'dipoleMomentCM', label: 'Dipole moment', unit: 'C·m' },
  { key: 'lineChargeDensityCPerM', label: 'Line charge', unit: 'C/m' },
  { key: 'spaceChargeDensityCPerM3', label: 'Space charge', unit: 'C/m³' },
  { key: 'potentialV', label: 'Potential', unit: 'V' },
  { key: 'energyJ', label: 'Energy', unit: 'J' },
  { key: 'capacitanceF', label: 'Capacitance', unit: 'F' },
];

const CHECK_LABEL: Record<string, string> = {
  'esd-field': 'ESD field near ESDS items',
  'esd-isolated-conductor': 'Isolated conductor (ESD)',
  'esd-body-voltage': 'Body voltage (ESD)',
  'spark-energy': 'Spark energy vs MIE',
  'brush-discharge': 'Brush discharge',
  'propagating-brush': 'Propagating brush discharge',
  'ignition-charge': 'Minimum ignition charge',
  'transfer-charge': 'Transferred charge',
  'shock-voltage': 'Shock to people (voltage)',
  'shock-hazard': 'Shock hazard to people',
};

const PREFIXES: [number, string][] = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f']];

/** A value and its interval with one SI prefix: "−42.0 nC (−58.3 … −30.1 nC)". */
export function fmtWithInterval(value: number, interval: readonly [number, number] | null, unit: string): string {
  const abs = Math.abs(value);
  const [f, p] = PREFIXES.find(([x]) => abs >= x * 0.9995) ?? PREFIXES[PREFIXES.length - 1]!;
  // No-break spaces keep a number with its unit (and the interval's ends together) when a line wraps.
  const v = `${formatSignificant(value / f)}\u00a0${p}${unit}`;
  if (!interval) return v;
  return `${v} (${formatSignificant(interval[0] / f)}\u00a0… ${formatSignificant(interval[1] / f)}\u00a0${p}${unit})`;
}

/** The quantity the headline shows: the charge where the model gives one, else the first defined. */
export function headline(est: EstimateResponse): { label: string; text: string } | null {
  for (const q of QUANTITY) {
    const v = est[q.key];
    if (typeof v === 'number' && Number.isFinite(v)) return { label: q.label, text: fmtWithInterval(v, est.interval[q.key], q.unit) };
  }
  return null;
}

const GEOMETRY_LABEL: Record<string, [string, string]> = {
  radiusM: ['radius', 'm'], lengthM: ['length', 'm'], separationM: ['pole separation', 'm'], heightAboveGroundM: ['height above ground', 'm'],
  widthM: ['width', 'm'], heightM: ['height', 'm'], thicknessM: ['layer thickness', 'm'], relativePermittivity: ['εr', ''],
  groundBehindM: ['ground behind', 'm'], capacitanceF: ['capacitance', 'F'],
};

/** The model's inputs in words: what was read, at what distance, with which geometry. */
export function inputsText(model: EstimateModel, spot: SpotEstimateContext | null, reading: { fieldVPerM: number; distanceM: number; potentialV?: number | null }): string {
  const parts: string[] = [];
  if (model === 'conductor') parts.push(`potential ${formatSi(reading.potentialV ?? null, 'V')} (surface-voltage display)`);
  else {
    parts.push(`field ${formatSi(reading.fieldVPerM, 'V/m')}`);
    parts.push(`${CENTRE_DISTANCE_MODELS.includes(model) ? 'distance to the charge' : 'gap to the surface'} ${formatSi(reading.distanceM, 'm')}`);
  }
  for (const [k, v] of Object.entries(spot?.geometry ?? {})) {
    if (typeof v !== 'number') continue;
    const [label, unit] = GEOMETRY_LABEL[k] ?? [k, ''];
    parts.push(unit ? `${label} ${formatSi(v, unit)}` : `${label} ${formatSignificant(v)}`);
  }
  return parts.join(' · ');
}

const RANK: Record<Verdict['level'], number> = { 'not-applicable': -1, ok: 0, warn: 1, alarm: 2 };

/**
 * The charge current a moving web carries off, I = sigma w v (the charge a moving web carries off, as a current), in words;
 * null unless the estimate has a surface charge density and the width and a running line speed are known.
 * @example webCurrentText(sheetEstimate(5e-6), { widthM: 1.5, speedMPerS: 4 }) // 'Charge carried off by the moving web: I = σ·w·v = 30 µA ...'
 */
export function webCurrentText(est: EstimateResponse, web: EstimateViewInput['webCurrent']): string | null {
  const sigma = est.surfaceChargeDensityCPerM2;
  const w = web?.widthM;
  const v = web?.speedMPerS;
  if (typeof sigma !== 'number' || !w || !v || v <= 0) return null;
  const i = webChargeCurrentA(sigma, w, v);
  return `Charge carried off by the moving web: I = σ·w·v = ${nb(formatSi(i, 'A'))} (width ${nb(formatSi(w, 'm'))}, line speed ${formatSignificant(v, 3)} m/s): `
    + 'the current a neutraliser must return; it makes lines at different speeds comparable. A web charged + on one face and − on the other reads near zero yet can discharge.';
}

/** The applicable verdicts, worst first. */
export function applicable(hazards: readonly Verdict[] | undefined): Verdict[] {
  return (hazards ?? []).filter((v) => v.level !== 'not-applicable').sort((a, b) => RANK[b.level] - RANK[a.level]);
}

/** A formatted quantity with its inner space made no-break. */
const nb = (s: string): string => s.replace(' ', '\u00a0');

function compared(v: Verdict): string | null {
  if (!v.compared) return null;
  const unit = v.compared.unit.replace('^2', '²');
  return `${nb(formatSi(v.compared.value, unit))} vs ${nb(formatSi(v.compared.threshold, unit))}`;
}

function levelChip(level: Verdict['level']): HTMLElement {
  return level === 'not-applicable' ? h('span', { class: 'chip chip-todo' }, 'n/a') : verdictChip(level);
}

export interface EstimateViewInput {
  estimate: EstimateResponse | null | undefined;
  note?: EstimateNote | null;
  hazards?: readonly Verdict[];
  spot: SpotEstimateContext | null;
  reading: { fieldVPerM: number; distanceM: number; potentialV?: number | null };
  /** A moving web: its width (spot geometry) and the line speed (reading's process state); gives I = sigma w v. */
  webCurrent?: { widthM: number | null | undefined; speedMPerS: number | null | undefined } | null;
  /** Where the Sweep link goes (omitted: no link). */
  sweepHref?: string;
  /** Unfold the details at first. */
  open?: boolean;
  /** Told when the details are folded or unfolded (the entry keeps them open while digits change). */
  onToggle?: (open: boolean) => void;
}

/**
 * The estimate block. Null when the spot has no model (nothing to show).
 * Folded it is two short lines: the headline quantity with its interval and model, and
 * the worst hazard verdict beside the Details button; unfolded it adds the inputs, the
 * other quantities, the interval method, the warnings, every applicable verdict with
 * the numbers compared and the source, the caution, and the Sweep and How links.
 * @example estimateBlock({ estimate, hazards, spot, reading: { fieldVPerM: -2e4, distanceM: 0.1 } })
 */
export function estimateBlock(inp: EstimateViewInput): HTMLElement | null {
  const model = inp.spot?.model ?? null;
  if (model === null) return null;
  const est = inp.estimate ?? null;
  const hz = applicable(inp.hazards);
  const worst = hz[0];
  const head = est ? headline(est) : null;

  const headlineEl = h('p', { class: 'est-headline', dataset: { testid: 'estimate-headline' } },
    head ? [h('span', { class: 'est-label' }, `${head.label} `), h('strong', { class: 'est-value' }, head.text), h('span', { class: 'est-model' }, `, ${MODEL_LABEL[model]}`)]
      : h('span', { class: 'muted' }, inp.note?.message ?? `No estimate with the ${MODEL_LABEL[model]}.`));

  const details: Child[] = [];
  if (est) {
    details.push(h('p', { class: 'est-inputs' }, h('strong', null, 'Inputs: '), inputsText(model, inp.spot, inp.reading)));
    const others = QUANTITY.filter((q) => q.label !== head?.label && typeof est[q.key] === 'number')
      .map((q) => `${q.label} ${fmtWithInterval(est[q.key] as number, est.interval[q.key], q.unit)}`);
    if (others.length) details.push(h('ul', { class: 'est-quantities' }, others.map((t) => h('li', null, t))));
    const web = webCurrentText(est, inp.webCurrent);
    if (web) details.push(h('p', { class: 'est-web-current', dataset: { testid: 'web-current' } }, web));
    details.push(h('p', { class: 'est-method muted' }, `Interval: ${est.intervalMethod}`));
    if (est.warnings.length) {
      details.push(h('ul', { class: 'est-warnings', dataset: { testid: 'estimate-warnings' } }, est.warnings.map((w) =>
        h('li', null, h('span', { class: 'est-warn-icon', 'aria-hidden': 'true' }, '!'), ` ${w.message}`))));
    }
  }
  if (inp.note && est) details.push(h('p', { class: 'est-note' }, inp.note.message));
  if (hz.length) {
    details.push(h('ul', { class: 'est-verdicts', dataset: { testid: 'estimate-verdicts' } }, hz.map((v) => h('li', { class: `est-verdict est-${v.level}` },
      h('p', { class: 'est-v-head' }, levelChip(v.level), ' ', h('strong', null, CHECK_LABEL[v.check] ?? v.check),
        compared(v) ? h('span', { class: 'est-compared' }, ` — ${compared(v)}`) : null),
      h('p', null, v.reason),
      h('p', { class: 'est-source' }, `Source: ${v.source}`),
      h('p', { class: 'est-assumed muted' }, v.caution.startsWith(CAUTION) ? v.caution.slice(CAUTION.length).trim() : v.caution)))));
  }
  details.push(h('p', { class: 'est-caution', dataset: { testid: 'estimate-caution' } }, CAUTION),
    h('p', { class: 'row gap wrap' },
      inp.sweepHref ? h('a', { class: 'btn btn-small', href: inp.sweepHref, dataset: { testid: 'sweep-link' } }, 'Sweep: read at several distances') : null,
      h('a', { class: 'btn btn-small', href: '#/models' }, 'How estimates are made')));

  let open = inp.open === true;
  const panel = h('div', { class: 'est-details', dataset: { testid: 'estimate-details' }, hidden: open ? undefined : true }, details);
  const toggle = h('button', {
    type: 'button', class: 'btn btn-small est-toggle', 'aria-expanded': String(open), dataset: { testid: 'estimate-toggle' },
    onclick: () => {
      open = !open;
      panel.hidden = !open;
      toggle.setAttribute('aria-expanded', String(open));
      toggle.textContent = open ? 'Less ▴' : 'Details ▾';
      inp.onToggle?.(open);
    },
  }, open ? 'Less ▴' : 'Details ▾');

  const row = h('div', { class: 'est-row' },
    worst
      ? h('p', { class: 'est-hazard', dataset: { testid: 'estimate-hazard', level: worst.level } },
        levelChip(worst.level), ' ', h('span', { class: 'est-check' }, CHECK_LABEL[worst.check] ?? worst.check),
        compared(worst) ? h('span', { class: 'est-compared' }, `: ${compared(worst)}`) : null)
      : h('p', { class: 'est-hazard muted' }, hz.length === 0 && inp.hazards?.length ? 'No hazard check applies here' : ''),
    toggle);
  return h('div', { class: 'estimate', dataset: { testid: 'estimate', model } }, headlineEl, row, panel);
}
