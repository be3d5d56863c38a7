/**
 * #/data: data in and out.
 * - Export the site's readings as CSV for a date range, and the whole site as JSON.
 * - Import readings from a CSV (paper transcribed, another logger): paste or pick
 *   a file, map its columns to our fields (guessed from the header names), give
 *   defaults for what the file lacks, preview with every invalid row listed by
 *   row number and reason, then import all valid rows in one go; the answer
 *   counts what was stored and what was already there (re-importing adds nothing).
 * - Import a whole site (JSON export) into an empty instance.
 * Imports and exports need the network.
 */
import { h, replace } from '../ui/h';
import { errorText } from '../api';
import { currentSetup } from '../app';
import { invalidateSetup } from '../data';
import { fmtDateTime, fmtDistance, fmtField } from '../ui/format';
import { navigate } from '../router';
import { commitImport, importSite, previewImport, readingsCsvUrl, siteJsonUrl } from '../review-api';
import type { ImportProblem } from '../../core/schemas';
import { parseCsv } from '../../core/csv';
import { DISTANCE_UNITS, READING_UNITS } from '../../core/units';

/** Our fields a CSV column can fill, with the header words that guess them. */
export const IMPORT_FIELDS: { key: string; label: string; required?: boolean; guess: RegExp }[] = [
  { key: 'spot', label: 'Spot (code or name)', required: true, guess: /^(spot[ _-]?)?code$|^spot$|label|tag/i },
  { key: 'takenAt', label: 'Date and time', required: true, guess: /taken|time|date|when|timestamp/i },
  { key: 'value', label: 'Value as read', required: true, guess: /^(value|reading|field|display|read)(\b|[ _(])/i },
  { key: 'unit', label: 'Unit', guess: /^unit|units/i },
  { key: 'polarity', label: 'Polarity (+/−)', guess: /polar|sign/i },
  { key: 'distance', label: 'Distance', guess: /^dist(ance)?(\b|[ _(])/i },
  { key: 'distanceUnit', label: 'Distance unit', guess: /dist(ance)?[ _-]?unit/i },
  { key: 'rhPercent', label: 'RH %', guess: /^rh|humid/i },
  { key: 'temperatureC', label: 'Temperature °C', guess: /temp/i },
  { key: 'meter', label: 'Meter (serial or label)', guess: /meter|instrument|serial/i },
  { key: 'surveyor', label: 'Surveyor', guess: /surveyor|operator|by|who|inspector/i },
  { key: 'note', label: 'Note', guess: /note|comment|remark/i },
  { key: 'zeroed', label: 'Meter zeroed (yes/no)', guess: /zero/i },
];

/** Column guesses by header name: each field takes the first unused header that matches. */
export function guessMapping(headers: string[]): Record<string, string> {
  const used = new Set<string>();
  const out: Record<string, string> = {};
  // distanceUnit before distance, so 'distance unit' is not taken as the distance.
  const order = [...IMPORT_FIELDS].sort((a, b) => (a.key === 'distanceUnit' ? -1 : b.key === 'distanceUnit' ? 1 : 0));
  for (const f of order) {
    const hit = headers.find((hd) => !used.has(hd) && f.guess.test(hd.trim()));
    if (hit !== undefined) { out[f.key] = hit; used.add(hit); }
  }
  return out;
}

/** Invalid rows by row: one line per row, its reasons joined. */
function byRow(problems: ImportProblem[]): { row: number; reasons: string[] }[] {
  const m = new Map<number, string[]>();
  for (const p of problems) m.set(p.row, [...(m.get(p.row) ?? []), p.field && !p.reason.includes(p.field) ? `${p.field}: ${p.reason}` : p.reason]);
  return [...m.entries()].sort((a, b) => a[0] - b[0]).map(([row, reasons]) => ({ row, reasons }));
}

export async function dataPage(root: HTMLElement): Promise<void> {
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return; }
  const b = setup.data;
  const siteId = b.site.id;
  const page = h('div', { class: 'page data-page' });
  root.append(page);

  // ---------- export ----------
  const today = new Date();
  const iso = (d: Date) => d.toISOString().slice(0, 10);
  const fromIn = h('input', { type: 'date', value: iso(new Date(today.getTime() - 91 * 86_400_000)), 'aria-label': 'From' });
  const toIn = h('input', { type: 'date', value: iso(today), 'aria-label': 'To' });
  const csvLink = h('a', { class: 'btn btn-primary', dataset: { testid: 'export-readings' } }, 'Download readings CSV');
  const updateLink = () => {
    csvLink.href = readingsCsvUrl(siteId, fromIn.value, toIn.value);
    csvLink.setAttribute('download', `readings-${fromIn.value || 'start'}-to-${toIn.value || 'now'}.csv`);
  };
  fromIn.addEventListener('input', updateLink);
  toIn.addEventListener('input', updateLink);
  updateLink();

  // ---------- CSV import ----------
  const text = h('textarea', { rows: 8, class: 'note-input csv-text', placeholder: 'Paste CSV here (first line: column names), or pick a file', spellcheck: 'false', dataset: { testid: 'csv-text' } });
  const file = h('input', { type: 'file', accept: '.csv,text/csv,text/plain', class: 'file-input', 'aria-label': 'CSV file' });
  const delim = h('select', { 'aria-label': 'Delimiter' }, [['auto', 'guess'], [',', 'comma ,'], [';', 'semicolon ;'], ['\t', 'tab']].map(([v, l]) => h('option', { value: v }, l)));
  const mapEl = h('div', { class: 'map-grid', dataset: { testid: 'csv-mapping' } });
  const meterSel = h('select', { 'aria-label': 'Default meter' }, h('option', { value: '' }, '(from the file)'), b.meters.map((m) => h('option', { value: m.id }, m.label || m.serial)));
  const unitSel = h('select', { 'aria-label': 'Default unit' }, h('option', { value: '' }, '(from the file)'), READING_UNITS.map((u) => h('option', { value: u }, u)));
  const distIn = h('input', { type: 'text', inputmode: 'decimal', placeholder: 'e.g. 10', 'aria-label': 'Default distance' });
  const distUnit = h('select', { 'aria-label': 'Default distance unit' }, DISTANCE_UNITS.map((u) => h('option', { value: u, selected: u === 'cm' ? true : undefined }, u)));
  const surveyorIn = h('input', { type: 'text', maxlength: 120, placeholder: 'Name', 'aria-label': 'Default surveyor' });
  const previewEl = h('div', { class: 'preview', dataset: { testid: 'csv-preview' }, 'aria-live': 'polite' });
  const previewBtn = h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'csv-preview-btn' }, onclick: () => void preview() }, 'Preview');
  let headers: string[] = [];
  let mapping: Record<string, string> = {};

  const delimiterOf = (t: string): string => {
    if (delim.value !== 'auto') return delim.value;
    const first = t.split(/\r?\n/, 1)[0] ?? '';
    const counts = [',', ';', '\t'].map((d) => [d, first.split(d).length] as const).sort((x, y) => y[1] - x[1]);
    return counts[0]![1] > 1 ? counts[0]![0] : ',';
  };

  const readHeaders = () => {
    const t = text.value;
    replace(previewEl);
    if (!t.trim()) { headers = []; renderMapping(); return; }
    try {
      const rows = parseCsv(t.split(/\r?\n/).slice(0, 2).join('\n'), delimiterOf(t)).rows;
      headers = (rows[0] ?? []).map((x) => x.trim()).filter((x) => x !== '');
      mapping = guessMapping(headers);
    } catch (e) {
      headers = [];
      replace(previewEl, h('p', { class: 'error-box' }, `Cannot read the CSV: ${(e as Error).message}`));
    }
    renderMapping();
  };

  function renderMapping(): void {
    if (!headers.length) { replace(mapEl, h('p', { class: 'muted' }, 'Paste or pick a CSV to map its columns.')); return; }
    replace(mapEl, IMPORT_FIELDS.map((f) => {
      const sel = h('select', { dataset: { field: f.key }, 'aria-label': `Column for ${f.label}` },
        h('option', { value: '' }, '(not in the file)'),
        headers.map((hd) => h('option', { value: hd, selected: mapping[f.key] === hd ? true : undefined }, hd)));
      sel.addEventListener('change', () => { if (sel.value) mapping[f.key] = sel.value; else delete mapping[f.key]; });
      return h('label', { class: 'map-row' }, h('span', { class: 'map-label' }, f.label, f.required ? h('span', { class: 'req' }, ' *') : null), sel);
    }));
  }

  text.addEventListener('input', () => { clearTimeout(readT); readT = setTimeout(readHeaders, 250); });
  let readT: ReturnType<typeof setTimeout> | undefined;
  delim.addEventListener('change', readHeaders);
  file.addEventListener('change', async () => {
    const f = file.files?.[0];
    if (!f) return;
    text.value = await f.text();
    readHeaders();
  });

  function payload(skipInvalid: boolean) {
    const defaults: Record<string, unknown> = {};
    if (meterSel.value) defaults.meterId = meterSel.value;
    if (unitSel.value) defaults.unit = unitSel.value;
    const d = Number(distIn.value.replace(',', '.'));
    if (distIn.value.trim() && Number.isFinite(d) && d > 0) defaults.distance = { value: d, unit: distUnit.value };
    if (surveyorIn.value.trim()) defaults.surveyor = surveyorIn.value.trim();
    return { csv: text.value, delimiter: delimiterOf(text.value), header: true, mapping, defaults, skipInvalid };
  }

  function missingRequired(): string[] {
    return IMPORT_FIELDS.filter((f) => f.required && !mapping[f.key]).map((f) => f.label);
  }

  async function preview(): Promise<void> {
    if (!text.value.trim()) { replace(previewEl, h('p', { class: 'error-box' }, 'Paste a CSV or pick a file first.')); return; }
    const miss = missingRequired();
    if (miss.length) { replace(previewEl, h('p', { class: 'error-box' }, `Pick the column for: ${miss.join(', ')}.`)); return; }
    replace(previewEl, h('p', { class: 'muted' }, 'Checking every row…'));
    try {
      const r = await previewImport(siteId, payload(true));
      const invalid = byRow(r.invalid);
      const fresh = r.valid - r.alreadyImported;
      replace(previewEl,
        h('p', { class: `banner ${invalid.length ? 'banner-warn' : 'banner-ok'}`, dataset: { testid: 'preview-counts' } },
          `${r.rows} rows: ${r.valid} valid${r.alreadyImported ? ` (${r.alreadyImported} already stored)` : ''}, ${invalid.length} invalid.`),
        invalid.length ? h('div', null,
          h('h3', null, 'Invalid rows (left out)'),
          h('ul', { class: 'invalid-rows', dataset: { testid: 'invalid-rows' } }, invalid.map((x) => h('li', { dataset: { row: String(x.row) } },
            h('strong', null, `Row ${x.row}`), `: ${x.reasons.join('; ')}`)))) : null,
        r.sample.length ? h('details', { class: 'import-sample' }, h('summary', null, `First valid rows (${r.sample.length})`),
          h('table', { class: 'table' },
            h('thead', null, h('tr', null, ['Row', 'Spot', 'Taken', 'As read', 'Field', 'Distance', 'RH', 'Surveyor'].map((c) => h('th', null, c)))),
            h('tbody', null, r.sample.map((x) => h('tr', null,
              h('td', null, String(x.row)), h('td', null, x.spotCode), h('td', null, fmtDateTime(x.takenAt)),
              h('td', null, `${x.polarity === '-' ? '−' : '+'}${x.value} ${x.unit}`), h('td', null, fmtField(x.fieldVPerM)),
              h('td', null, fmtDistance(x.distance)), h('td', null, x.rhPercent === null ? '—' : `${x.rhPercent} %`), h('td', null, x.surveyor)))))) : null,
        fresh > 0 ? h('button', {
          type: 'button', class: 'btn btn-primary btn-big', dataset: { testid: 'csv-commit' }, onclick: () => void commit(),
        }, `Import ${fresh} new valid row${fresh === 1 ? '' : 's'}${invalid.length ? ` (leave out ${invalid.length} invalid)` : ''}`)
          : h('p', { class: 'muted' }, r.valid ? 'Every valid row is already stored: nothing to import.' : 'Nothing to import.'));
    } catch (e) {
      replace(previewEl, h('p', { class: 'error-box' }, `Preview failed: ${errorText(e)}`));
    }
  }

  async function commit(): Promise<void> {
    replace(previewEl, h('p', { class: 'muted' }, 'Importing…'));
    try {
      const r = await commitImport(siteId, payload(true));
      const left = byRow(r.invalid).length;
      replace(previewEl, h('p', { class: 'banner banner-ok', dataset: { testid: 'import-result' } },
        `Imported in one go: ${r.stored} stored, ${r.duplicates} already there${r.conflicts ? `, ${r.conflicts} conflicting (kept for review)` : ''}${left ? `, ${left} invalid rows left out` : ''}; ${r.rounds} import round${r.rounds === 1 ? '' : 's'}.`));
    } catch (e) {
      replace(previewEl, h('p', { class: 'error-box' }, `Nothing imported: ${errorText(e)}`));
    }
  }

  // ---------- site JSON import ----------
  const jsonFile = h('input', { type: 'file', accept: '.json,application/json', class: 'file-input', 'aria-label': 'Site JSON file' });
  const jsonMsg = h('div', { 'aria-live': 'polite' });
  jsonFile.addEventListener('change', async () => {
    const f = jsonFile.files?.[0];
    jsonFile.value = '';
    if (!f) return;
    let body: unknown;
    try { body = JSON.parse(await f.text()); } catch { replace(jsonMsg, h('p', { class: 'error-box' }, `${f.name} is not JSON.`)); return; }
    replace(jsonMsg, h('p', { class: 'muted' }, `Importing ${f.name}…`));
    try {
      const r = await importSite(body);
      invalidateSetup(siteId);
      const counts = Object.entries(r.counts).map(([k, v]) => `${v} ${k}`).join(', ');
      replace(jsonMsg, h('p', { class: 'banner banner-ok' }, `Site imported${counts ? `: ${counts}` : ''}.`));
    } catch (e) {
      replace(jsonMsg, h('p', { class: 'error-box' }, `Not imported: ${errorText(e)}`));
    }
  });

  replace(page,
    h('div', { class: 'row between wrap' }, h('div', null, h('p', { class: 'eyebrow' }, b.site.name), h('h1', null, 'Data in and out')), h('a', { class: 'btn', href: '#/' }, 'Home')),
    h('section', { class: 'card' },
      h('h2', null, 'Export'),
      h('div', { class: 'row gap wrap' },
        h('label', { class: 'field inline' }, h('span', null, 'From'), fromIn),
        h('label', { class: 'field inline' }, h('span', null, 'To'), toIn),
        csvLink),
      h('p', { class: 'muted' }, 'Raw value and unit as entered, normalized field, estimate, verdict, RH, meter, surveyor; corrections marked.'),
      h('div', { class: 'row gap wrap' }, h('a', { class: 'btn', href: siteJsonUrl(siteId), download: 'site.json', dataset: { testid: 'export-site' } }, 'Download the whole site (JSON)'))),
    h('section', { class: 'card csv-import' },
      h('h2', null, 'Import readings from CSV'),
      h('div', { class: 'row gap wrap' }, h('label', { class: 'btn file-btn' }, 'Pick a CSV file…', file), h('label', { class: 'field inline' }, h('span', null, 'Delimiter'), delim)),
      text,
      h('h3', null, 'Columns'),
      mapEl,
      h('h3', null, 'Defaults for what the file does not say'),
      h('div', { class: 'map-grid' },
        h('label', { class: 'map-row' }, h('span', { class: 'map-label' }, 'Meter'), meterSel),
        h('label', { class: 'map-row' }, h('span', { class: 'map-label' }, 'Unit'), unitSel),
        h('div', { class: 'map-row' }, h('span', { class: 'map-label' }, 'Distance'), h('div', { class: 'row gap' }, distIn, distUnit)),
        h('label', { class: 'map-row' }, h('span', { class: 'map-label' }, 'Surveyor'), surveyorIn)),
      h('p', { class: 'field-hint' }, 'Defaults fill empty cells. Plain numbers in a distance column take the unit of the default distance.'),
      h('div', { class: 'row gap' }, previewBtn),
      previewEl),
    h('section', { class: 'card' },
      h('h2', null, 'Import a whole site (JSON)'),
      h('p', { class: 'muted' }, 'For moving a site to a new, empty chargewalk. An instance that already holds data refuses it.'),
      h('label', { class: 'btn file-btn' }, 'Pick a site JSON file…', jsonFile),
      jsonMsg));
  renderMapping();
}
