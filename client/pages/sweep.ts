/**
 * The sweep screen (#/sweep/:spotId): readings of one object at three or more
 * distances, fitted on the tablet with core sweep() (works offline), plotted on
 * log-log axes with each ranked model's fitted curve, with the fall-off exponent, the
 * ranking, the chosen model's charge with its interval, the residuals, the conclusion
 * in words and the warnings. The readings can be saved as readings of the open round
 * through the outbox. chart.js is loaded only here (dynamic import).
 */
import type { Chart } from 'chart.js';
import { h, replace } from '../ui/h';
import { toast } from '../ui/sheet';
import { fmtWithInterval } from '../ui/estimate-view';
import '../ui/estimate.css';
import { openSpotPage } from './spot-page-base';
import { roundsOfSite, saveReading, getRound } from '../data';
import { prefs } from '../state';
import { fittedCurve, sweep } from '../../core/physics/sweep';
import { SweepRequestSchema, type SweepModel, type SweepResponse } from '../../core/schemas/estimate';
import { DISTANCE_UNITS, FIELD_UNITS, distanceToMetres, type DistanceUnit, type FieldUnit } from '../../core/units';
import { normalizeReading } from '../../core/units/field';
import { formatSignificant } from '../../core/units/format';
import { newId } from '../../core/ids/uuidv7';
import type { Spot } from '../../core/schemas';
import type { LocalRound } from '../offline/types';

const COLORS = ['#0047b3', '#b3001b', '#0b6e2f', '#8a5a00', '#5b2a86', '#00707a', '#3a4350'];

const SWEEP_LABEL: Record<SweepModel, string> = {
  point: 'point', sphere: 'sphere', line: 'line / cylinder', dipole: 'dipole', sheet: 'sheet', disk: 'disk', rectangle: 'rectangle',
};
const AMPLITUDE: Record<string, { label: string; unit: string }> = {
  chargeC: { label: 'charge', unit: 'C' },
  lineChargeDensityCPerM: { label: 'line charge', unit: 'C/m' },
  dipoleMomentCM: { label: 'dipole moment', unit: 'C·m' },
  surfaceChargeDensityCPerM2: { label: 'surface charge', unit: 'C/m²' },
};

interface Row { d: string; v: string }

function parseNum(s: string): number | null {
  const t = s.trim().replace(',', '.');
  if (t === '') return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : NaN;
}

function sweepGeometry(spot: Spot): Record<string, number> {
  const g = spot.geometry ?? {};
  const out: Record<string, number> = {};
  if (g.radiusM !== undefined && g.radiusM > 0 && spot.model !== 'line') out.radiusM = g.radiusM;
  if (g.lengthM !== undefined) out.lengthM = g.lengthM;
  if (g.widthM !== undefined && g.heightM !== undefined) { out.widthM = g.widthM; out.heightM = g.heightM; }
  return out;
}

/** A log-spaced grid from a to b (n points). */
function logGrid(a: number, b: number, n: number): number[] {
  const la = Math.log(a); const lb = Math.log(b);
  return Array.from({ length: n }, (_, i) => Math.exp(la + ((lb - la) * i) / (n - 1)));
}

export async function sweepPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const spotId = params.spotId!;
  const opened = await openSpotPage(root, spotId, 'sweep-page');
  if (!opened.spot) return () => undefined;
  const { body, bundle, spot } = opened;

  // The round the readings can be saved to: ?round=<id>, else the newest open round of the site on this tablet.
  const q = new URLSearchParams(location.hash.split('?')[1] ?? '');
  let round: LocalRound | undefined = q.get('round') ? await getRound(q.get('round')!) : undefined;
  if (!round || round.endedAt) round = (await roundsOfSite(bundle.site.id)).find((r) => !r.endedAt);
  const meterId = round?.meterId ?? prefs.meterFor(bundle.site.id) ?? bundle.meters[0]?.id ?? null;
  const meter = bundle.meters.find((m) => m.id === meterId);

  let dUnit: DistanceUnit = spot.defaultDistance.unit;
  let fUnit: FieldUnit = meter && (FIELD_UNITS as readonly string[]).includes(meter.defaultUnit) ? meter.defaultUnit as FieldUnit : 'kV/m';
  let polarity: '+' | '-' = '+';
  let zeroed = true;
  const d0 = spot.defaultDistance.value;
  let rows: Row[] = [d0, 2 * d0, 4 * d0].map((d) => ({ d: String(Number(d.toPrecision(6))), v: '' }));
  let result: SweepResponse | null = null;
  let chart: Chart | null = null;
  let saved = false;

  const geometry = sweepGeometry(spot);
  const rowsEl = h('div', { class: 'sweep-rows', dataset: { testid: 'sweep-rows' } });
  const unitsEl = h('div', { class: 'sweep-units' });
  const msgEl = h('div', { class: 'sweep-msg', 'aria-live': 'polite' });
  const resultEl = h('div', { class: 'sweep-result', dataset: { testid: 'sweep-result' } });
  const canvas = h('canvas', { dataset: { testid: 'sweep-chart' }, role: 'img', 'aria-label': 'Readings and fitted curves, log-log' });
  const chartBox = h('div', { class: 'sweep-chart', hidden: true }, canvas);
  const saveEl = h('div', { class: 'sweep-actions' });
  const area = bundle.areas.find((a) => a.id === spot.areaId);

  replace(body,
    h('div', { class: 'row between wrap' },
      h('div', null,
        h('p', { class: 'eyebrow' }, `Sweep · ${area?.name ?? ''}`),
        h('h1', { dataset: { testid: 'sweep-title' } }, spot.name),
        h('p', { class: 'spot-meta' }, h('span', { class: 'code' }, spot.code),
          ` ${spot.objectKind} · ${spot.materialClass}${spot.model ? ` · spot model: ${spot.model}` : ''}${Object.keys(geometry).length ? ` · ${Object.entries(geometry).map(([k, v]) => `${k.replace(/M$/, '')} ${formatSignificant(v)} m`).join(', ')}` : ''}`)),
      h('div', { class: 'row gap wrap no-print' },
        round ? h('a', { class: 'btn', href: `#/round/${round.id}` }, 'Back to the round') : null,
        h('a', { class: 'btn', href: `#/spot/${spot.id}` }, 'Spot history'),
        h('a', { class: 'btn btn-ghost', href: '#/models' }, 'How?'))),
    h('p', { class: 'muted' }, 'Read the same object at three or more distances from its surface (e.g. 1×, 2× and 4× the usual distance), same polarity. The fit tells from the fall-off what kind of source it is and how much charge it carries.'),
    h('div', { class: 'sweep-grid' },
      h('section', { class: 'card' },
        h('h2', null, 'Readings'),
        unitsEl,
        h('div', { class: 'sweep-head', 'aria-hidden': 'true' }, h('span', null, '#'), h('span', null, `Distance (${dUnit})`), h('span', null, 'Reading'), h('span', null, '')),
        rowsEl,
        h('div', { class: 'row gap wrap', style: 'margin-top:10px' },
          h('button', { type: 'button', class: 'btn', dataset: { testid: 'sweep-add' }, onclick: () => { rows = [...rows, { d: '', v: '' }]; renderRows(); focusRow(rows.length - 1, 'd'); } }, '+ Add a distance')),
        msgEl,
        saveEl),
      h('section', { class: 'card' }, h('h2', null, 'Fit'), chartBox, resultEl)));

  function renderUnits(): void {
    replace(unitsEl,
      h('div', null, h('p', { class: 'eyebrow' }, 'Distance unit'),
        h('div', { class: 'seg', role: 'group', 'aria-label': 'Distance unit' }, DISTANCE_UNITS.map((u) => h('button', {
          type: 'button', class: `seg-btn${u === dUnit ? ' is-on' : ''}`, 'aria-pressed': String(u === dUnit), dataset: { unit: u },
          onclick: () => { dUnit = u; renderAll(); },
        }, u)))),
      h('div', null, h('p', { class: 'eyebrow' }, 'Field unit and polarity'),
        h('div', { class: 'row gap' },
          h('button', {
            type: 'button', class: `btn pol-btn${polarity === '-' ? ' is-neg' : ''}`, style: 'min-height:48px;min-width:56px;font-size:1.6rem',
            'aria-label': `polarity ${polarity === '-' ? 'negative' : 'positive'}; tap to change`, dataset: { testid: 'sweep-polarity' },
            onclick: () => { polarity = polarity === '+' ? '-' : '+'; renderAll(); },
          }, polarity === '-' ? '−' : '+'),
          (() => {
            const sel = h('select', { 'aria-label': 'Field unit', dataset: { testid: 'sweep-unit' } }, FIELD_UNITS.map((u) => h('option', { value: u, selected: u === fUnit ? true : undefined }, u)));
            sel.addEventListener('change', () => { fUnit = sel.value as FieldUnit; renderAll(); });
            return sel;
          })())));
    const head = body.querySelector('.sweep-head');
    if (head) replace(head as HTMLElement, h('span', null, '#'), h('span', null, `Distance (${dUnit})`), h('span', null, `Reading (${fUnit})`), h('span', null, ''));
  }

  function focusRow(i: number, which: 'd' | 'v'): void {
    rowsEl.querySelector<HTMLInputElement>(`[data-row="${i}"][data-col="${which}"]`)?.focus();
  }

  function renderRows(): void {
    replace(rowsEl, rows.map((r, i) => {
      const din = h('input', {
        type: 'text', inputmode: 'decimal', autocomplete: 'off', value: r.d, 'aria-label': `Distance ${i + 1} (${dUnit})`,
        dataset: { row: String(i), col: 'd', testid: `sweep-d-${i}` },
      });
      const vin = h('input', {
        type: 'text', inputmode: 'decimal', autocomplete: 'off', value: r.v, 'aria-label': `Reading ${i + 1} (${fUnit})`, placeholder: fUnit,
        dataset: { row: String(i), col: 'v', testid: `sweep-v-${i}` },
      });
      din.addEventListener('input', () => { rows[i]!.d = din.value; schedule(); });
      vin.addEventListener('input', () => { rows[i]!.v = vin.value; schedule(); });
      return h('div', { class: 'sweep-row' },
        h('span', { class: 'idx' }, String(i + 1)), din, vin,
        h('button', {
          type: 'button', class: 'btn btn-icon', 'aria-label': `Remove reading ${i + 1}`, disabled: rows.length <= 3 ? true : undefined,
          onclick: () => { rows = rows.filter((_, j) => j !== i); renderAll(); },
        }, '✕'));
    }));
  }

  let timer: ReturnType<typeof setTimeout> | null = null;
  function schedule(): void {
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => { timer = null; void compute(); }, 150);
  }

  function readingsSI(): { readings: { distanceM: number; fieldVPerM: number }[]; bad: { i: number; col: 'd' | 'v'; message: string }[] } {
    const readings: { distanceM: number; fieldVPerM: number }[] = [];
    const bad: { i: number; col: 'd' | 'v'; message: string }[] = [];
    rows.forEach((r, i) => {
      const d = parseNum(r.d); const v = parseNum(r.v);
      if (v === null) return; // not typed yet: the row is simply not used
      if (d === null || Number.isNaN(d) || d <= 0) { bad.push({ i, col: 'd', message: `distance ${i + 1} must be a number greater than zero` }); return; }
      if (Number.isNaN(v) || v <= 0) { bad.push({ i, col: 'v', message: `reading ${i + 1} must be a number greater than zero (polarity is set once above)` }); return; }
      readings.push({ distanceM: distanceToMetres(d, dUnit), fieldVPerM: normalizeReading({ value: v, unit: fUnit, polarity, calibratedDistanceM: null }) });
    });
    return { readings, bad };
  }

  async function compute(): Promise<void> {
    for (const el of rowsEl.querySelectorAll('input')) el.removeAttribute('aria-invalid');
    const { readings, bad } = readingsSI();
    for (const b of bad) rowsEl.querySelector(`[data-row="${b.i}"][data-col="${b.col}"]`)?.setAttribute('aria-invalid', 'true');
    result = null;
    if (bad.length) {
      replace(msgEl, h('p', { class: 'field-error' }, bad.map((b) => b.message).join('; ')));
    } else if (readings.length < 3) {
      replace(msgEl, h('p', { class: 'muted', dataset: { testid: 'sweep-need' } }, `Enter at least 3 readings at different distances (${readings.length} so far).`));
    } else {
      const parsed = SweepRequestSchema.safeParse({ readings, geometry });
      if (!parsed.success) {
        replace(msgEl, h('p', { class: 'field-error' }, parsed.error.issues.map((i) => i.message).join('; ')));
      } else {
        try {
          result = sweep(parsed.data);
          replace(msgEl);
        } catch (e) {
          replace(msgEl, h('p', { class: 'field-error' }, (e as Error).message));
        }
      }
    }
    await renderResult(readings);
    renderSave(readings.length);
  }

  async function renderResult(readings: { distanceM: number; fieldVPerM: number }[]): Promise<void> {
    if (!result) {
      chartBox.hidden = true;
      replace(resultEl, h('p', { class: 'muted' }, 'The fit appears here as soon as three readings are in.'));
      return;
    }
    const r = result;
    const dF = distanceToMetres(1, dUnit);
    const fF = Math.abs(normalizeReading({ value: 1, unit: fUnit, polarity: '+', calibratedDistanceM: null }));
    const ds = readings.map((x) => x.distanceM);
    const grid = logGrid(Math.min(...ds) / 1.5, Math.max(...ds) * 1.5, 48);
    const colorOf = new Map(r.ranking.map((f, i) => [f.model, COLORS[i % COLORS.length]!]));
    const plot = {
      readings: readings.map((x) => ({ x: x.distanceM / dF, y: Math.abs(x.fieldVPerM) / fF })),
      curves: r.ranking.map((f) => ({
        label: `${SWEEP_LABEL[f.model]}${f.model === r.best.model ? ' (chosen)' : ''}`, color: colorOf.get(f.model)!, best: f.model === r.best.model,
        points: fittedCurve(f, grid).map((y, i) => ({ x: grid[i]! / dF, y: Math.abs(y) / fF })),
      })),
      xLabel: `distance from the surface (${dUnit})`, yLabel: `|field| (${fUnit})`,
    };

    const b = r.best;
    const main = b.chargeC !== null ? { label: 'Charge', text: fmtWithInterval(b.chargeC, b.chargeInterval, 'C') }
      : b.lineChargeDensityCPerM !== null ? { label: 'Line charge', text: fmtWithInterval(b.lineChargeDensityCPerM, b.lineChargeDensityInterval, 'C/m') }
        : b.dipoleMomentCM !== null ? { label: 'Dipole moment', text: fmtWithInterval(b.dipoleMomentCM, b.dipoleMomentInterval, 'C·m') }
          : b.surfaceChargeDensityCPerM2 !== null ? { label: 'Surface charge', text: fmtWithInterval(b.surfaceChargeDensityCPerM2, b.surfaceChargeDensityInterval, 'C/m²') } : null;
    const extra = [
      b.chargeC !== null && b.lineChargeDensityCPerM !== null ? `line charge ${fmtWithInterval(b.lineChargeDensityCPerM, b.lineChargeDensityInterval, 'C/m')}` : null,
      b.depthM !== null ? `charge centre ${formatSignificant(b.depthM / dF)} ${dUnit} behind the surface` : null,
    ].filter(Boolean).join(' · ');

    replace(resultEl,
      h('p', { class: 'sweep-conclusion', dataset: { testid: 'sweep-conclusion' } }, r.conclusion),
      h('p', { class: 'sweep-best', dataset: { testid: 'sweep-best' } }, h('strong', null, `Chosen: ${SWEEP_LABEL[b.model]} model. `),
        main ? [`${main.label} `, h('strong', null, main.text)] : null, extra ? h('span', { class: 'muted' }, ` · ${extra}`) : null),
      h('p', { class: 'sweep-exponent', dataset: { testid: 'sweep-exponent' } },
        `Fall-off exponent m = ${formatSignificant(r.exponent)} ± ${formatSignificant(r.exponentStdErr)} `,
        h('span', { class: 'muted' }, '(|E| ~ 1/dᵐ: 0 sheet, 1 long line, 2 point, 3 dipole; from the surface a point reads below 2)')),
      r.warnings.length ? h('ul', { class: 'est-warnings', dataset: { testid: 'sweep-warnings' } }, r.warnings.map((w) => h('li', null, h('span', { class: 'est-warn-icon', 'aria-hidden': 'true' }, '!'), ` ${w.message}`))) : null,
      h('h3', null, `Models ranked by ${r.rankedBy === 'aicc' ? 'AICc' : 'AIC'}`),
      h('table', { class: 'table sweep-table', dataset: { testid: 'sweep-ranking' } },
        h('thead', null, h('tr', null, h('th', null, 'model'), h('th', null, `Δ${r.rankedBy === 'aicc' ? 'AICc' : 'AIC'}`), h('th', null, 'rms scatter'), h('th', null, 'fitted'))),
        h('tbody', null, r.ranking.map((f) => h('tr', { class: f.model === b.model ? 'is-best' : '' },
          h('td', null, h('span', { class: 'swatch', style: `background:${colorOf.get(f.model)}` }), SWEEP_LABEL[f.model]),
          h('td', null, f.deltaAicc === null ? '—' : formatSignificant(f.deltaAicc, 2)),
          h('td', null, `${formatSignificant(f.rmsLog * 100, 2)} %`),
          h('td', null, `${AMPLITUDE[f.amplitudeName]?.label ?? f.amplitudeName} ${fmtWithInterval(f.amplitude, null, AMPLITUDE[f.amplitudeName]?.unit ?? '')}${f.offsetM !== null && f.offsetFitted ? `, depth ${formatSignificant(f.offsetM / dF)} ${dUnit}` : ''}`))))),
      h('p', { class: 'muted' }, `Δ${r.rankedBy === 'aicc' ? 'AICc' : 'AIC'} below 2: the data cannot tell the models apart. rms scatter: typical misfit of the readings (log scale).`),
      h('h3', null, 'Residuals of the chosen model'),
      h('table', { class: 'table sweep-table', dataset: { testid: 'sweep-residuals' } },
        h('thead', null, h('tr', null, h('th', null, `distance (${dUnit})`), h('th', null, `reading (${fUnit})`), h('th', null, `fitted (${fUnit})`), h('th', null, 'residual'))),
        h('tbody', null, r.residuals.map((x) => h('tr', null,
          h('td', null, formatSignificant(x.distanceM / dF)), h('td', null, formatSignificant(x.fieldVPerM / fF)),
          h('td', null, formatSignificant(x.fittedVPerM / fF)), h('td', null, `${x.residualLog >= 0 ? '+' : '−'}${formatSignificant(Math.abs(Math.expm1(x.residualLog)) * 100, 2)} %`))))),
      h('p', { class: 'muted' }, `Interval: ${b.intervalMethod}`),
      h('p', { class: 'est-caution' }, 'An equivalent charge for an idealised geometry, not a measured charge: the meter, the operator and nearby grounds change the field. Defer to the site\'s safety standards and qualified people. ', h('a', { href: '#/models', class: 'link' }, 'How estimates are made'), '.'));

    chartBox.hidden = false;
    let mod: typeof import('../ui/sweep-chart');
    try {
      mod = await import('../ui/sweep-chart');
    } catch {
      // Offline before the sweep screen was ever opened online: the plot module is not cached yet; the fit above stands.
      replace(chartBox, h('p', { class: 'muted' }, 'The plot is not on this tablet yet: open the sweep screen once with a connection. The fit below does not need it.'));
      return;
    }
    if (!canvas.isConnected) return;
    chart = mod.drawSweepChart(canvas, plot, chart);
    canvas.dataset.drawn = String(plot.readings.length);
  }

  function renderSave(n: number): void {
    if (!round) {
      replace(saveEl, h('p', { class: 'muted' }, 'No round is open on this tablet: start one to keep these readings.'));
      return;
    }
    if (saved) {
      replace(saveEl, h('p', { class: 'banner banner-ok', dataset: { testid: 'sweep-saved' } }, `Saved ${n} readings to the round of ${round.surveyor} (on this tablet; they sync when online).`));
      return;
    }
    replace(saveEl,
      h('button', {
        type: 'button', class: `btn opt-btn${zeroed ? '' : ' is-warn'}`, role: 'switch', 'aria-checked': String(zeroed),
        onclick: () => { zeroed = !zeroed; renderSave(n); },
      }, h('span', { class: 'opt-label' }, 'Zeroed'), h('span', { class: 'opt-value' }, zeroed ? '✓ yes' : '✗ no')),
      h('button', {
        type: 'button', class: 'btn btn-primary', dataset: { testid: 'sweep-save' }, disabled: result === null || !meterId ? true : undefined,
        onclick: () => void saveAll(),
      }, `Save ${n} reading${n === 1 ? '' : 's'} to the open round`),
      !meterId ? h('p', { class: 'error-text' }, 'Pick a meter on the round screen first.') : null);
  }

  async function saveAll(): Promise<void> {
    if (!round || !meterId || !result) return;
    const t0 = Date.now();
    const list = rows.map((r) => ({ d: parseNum(r.d), v: parseNum(r.v) })).filter((x): x is { d: number; v: number } => x.d !== null && x.v !== null && x.d > 0 && x.v > 0);
    try {
      for (const [i, x] of list.entries()) {
        await saveReading({
          id: newId(), roundId: round.id, spotId: spot!.id, meterId, takenAt: new Date(t0 + i).toISOString(),
          value: x.v, unit: fUnit, polarity, meterRange: '', distance: { value: x.d, unit: dUnit }, distanceUncertaintyM: null,
          side: null, groundBehind: null, zeroed, rhPercent: round.rhPercent, temperatureC: round.temperatureC, process: null,
          note: `sweep ${i + 1}/${list.length}`,
        }, bundle!);
      }
      saved = true;
      toast(`Saved ${list.length} sweep readings on this tablet`);
      renderSave(list.length);
    } catch (e) {
      toast(`Not saved: ${(e as Error).message}`, 'error');
    }
  }

  function renderAll(): void {
    renderUnits();
    renderRows();
    void compute();
  }

  renderAll();
  return () => { if (timer) clearTimeout(timer); chart?.destroy(); };
}
