/**
 * CSV import of readings recorded elsewhere (paper transcribed, another logger):
 * the user maps columns to our fields; every row is checked with the same schema
 * as a reading from the tablet, and every invalid row is listed by its line number
 * in the file and the reason. Nothing is stored here: the route previews, or
 * commits all valid rows in one transaction (Store.importReadings).
 *
 * Re-importing the same file adds nothing: each reading id is derived from the site
 * and the row's content (server/exchange/ids.ts), so the ingest answers 'duplicate'.
 * Rows go into one import round per local day and surveyor, whose id and content
 * are derived the same way (started at local midnight, planned spots none).
 *
 * Times: ISO 8601 with an offset or Z, or a local time of the site without one
 * ("2026-02-03 07:45" or "2026-02-03T07:45:10"). Values: a number, with a decimal
 * point (or a decimal comma when the delimiter is not a comma); a negative value
 * sets the polarity unless a polarity column says otherwise.
 */
import { parseCsv } from '../../core/csv';
import {
  ReadingInputSchema, type ImportProblem, type ReadingImport, type ReadingInput, type RoundInput, type SetupBundle,
} from '../../core/schemas';
import { civilDateAddDays, startOfLocalDay, zonedDateTime, zoneOffsetMs } from '../../core/time';
import { DISTANCE_UNITS, type DistanceUnit } from '../../core/units/distance';
import { isSurfaceVoltageUnit, normalizeReading, READING_UNITS, type ReadingUnit } from '../../core/units/field';
import { HttpError } from '../http/errors';
import { canonicalJson } from '../store/canonical';
import { deterministicUuidV7 } from './ids';

export const MAX_IMPORT_ROWS = 50_000;

export interface PreparedRow {
  row: number;
  input: ReadingInput;
  spotCode: string;
  surveyor: string;
  fieldVPerM: number;
}

export interface PreparedImport {
  rows: number;
  columns: string[];
  valid: PreparedRow[];
  invalid: ImportProblem[];
  /** Import rounds of the valid rows, by id. */
  rounds: Map<string, { input: RoundInput; endedAt: string }>;
}

const bad = (path: string, message: string) => new HttpError(400, 'invalid', `the import is not valid: ${path}: ${message}`, [{ path, message }]);

function sniffDelimiter(csv: string): string {
  const first = csv.slice(0, csv.search(/\r?\n|$/));
  const count = (c: string) => first.split(c).length - 1;
  if (count(';') > count(',') && count(';') >= count('\t')) return ';';
  if (count('\t') > count(',')) return '\t';
  return ',';
}

function parseNumber(text: string, decimalComma: boolean): number | null {
  const t = text.trim().replace(/\s/g, '');
  if (/^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(t)) return Number(t);
  if (decimalComma && /^[+-]?\d+,\d+$/.test(t)) return Number(t.replace(',', '.'));
  return null;
}

const LOCAL_TIME = /^(\d{4})-(\d{2})-(\d{2})[ T](\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,3}))?)?$/;
const WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/;

/** ms since the epoch of a time as the file gives it; null when it is not one. */
export function parseImportTime(text: string, timeZone: string): number | null {
  const t = text.trim();
  if (WITH_OFFSET.test(t)) {
    const ms = Date.parse(t);
    return Number.isFinite(ms) ? ms : null;
  }
  const m = LOCAL_TIME.exec(t);
  if (!m) return null;
  const n = (i: number) => Number(m[i] ?? 0);
  const [y, mo, d, h, mi, s] = [n(1), n(2), n(3), n(4), n(5), n(6)];
  const frac = m[7] === undefined ? 0 : Number(m[7].padEnd(3, '0'));
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || s > 59) return null;
  const wall = Date.UTC(y, mo - 1, d, h, mi, s, frac);
  if (new Date(wall).getUTCDate() !== d) return null; // 31 February
  let ms = wall - zoneOffsetMs(wall, timeZone);
  const o2 = zoneOffsetMs(ms, timeZone);
  if (wall - o2 !== ms) ms = wall - o2;
  return ms;
}

const POLARITY: Record<string, '+' | '-'> = { '+': '+', '-': '-', pos: '+', neg: '-', positive: '+', negative: '-', p: '+', n: '-' };
const BOOL: Record<string, boolean> = { yes: true, no: false, true: true, false: false, '1': true, '0': false, y: true, n: false, ja: true, nein: false };

function readingUnit(text: string): ReadingUnit | null {
  const t = text.trim().toLowerCase().replace('/in', '/inch').replace('/inchch', '/inch');
  return READING_UNITS.find((u) => u.toLowerCase() === t) ?? null;
}

function distanceUnit(text: string): DistanceUnit | null {
  const t = text.trim().toLowerCase();
  if (t === 'in' || t === '"' || t === 'inches') return 'inch';
  return DISTANCE_UNITS.find((u) => u === t) ?? null;
}

/** The column index of each mapped field; 400 naming mapping.<field> when a header is not in the file. */
function resolveMapping(mapping: ReadingImport['mapping'], header: string[] | null): Map<string, number> {
  const out = new Map<string, number>();
  for (const [field, col] of Object.entries(mapping)) {
    if (col === undefined) continue;
    if (typeof col === 'number') {
      if (header && col >= header.length) throw bad(`mapping.${field}`, `column ${col} does not exist: the file has ${header.length} columns (0 is the first)`);
      out.set(field, col);
      continue;
    }
    if (!header) throw bad(`mapping.${field}`, 'map by column index (0 is the first) when the file has no header line');
    const i = header.findIndex((h) => h.trim().toLowerCase() === col.toLowerCase());
    if (i < 0) throw bad(`mapping.${field}`, `no column named '${col.slice(0, 60)}' in the first line (columns: ${header.slice(0, 30).join(', ')})`);
    out.set(field, i);
  }
  return out;
}

/** Checks and maps every row; throws HttpError 400 only for problems of the whole request. */
export function prepareImport(setup: SetupBundle, body: ReadingImport): PreparedImport {
  const siteId = setup.site.id;
  const tz = setup.site.timeZone;
  const delimiter = body.delimiter ?? sniffDelimiter(body.csv);
  let parsed;
  try {
    parsed = parseCsv(body.csv, delimiter);
  } catch (e) {
    throw bad('csv', (e as Error).message);
  }
  const header = body.header ? parsed.rows[0] ?? [] : null;
  const dataRows = body.header ? parsed.rows.slice(1) : parsed.rows;
  const dataLines = body.header ? parsed.lines.slice(1) : parsed.lines;
  if (dataRows.length === 0) throw bad('csv', 'the file has no data rows');
  if (dataRows.length > MAX_IMPORT_ROWS) throw bad('csv', `the file has ${dataRows.length} rows; import at most ${MAX_IMPORT_ROWS} at a time`);
  const columns = header ?? Array.from({ length: Math.max(...dataRows.map((r) => r.length)) }, (_, i) => `column ${i}`);
  const cols = resolveMapping(body.mapping, header);

  const meters = new Map(setup.meters.map((m) => [m.id, m]));
  const metersBySerial = new Map(setup.meters.map((m) => [m.serial.toLowerCase(), m]));
  const defaults = body.defaults;
  if (defaults.meterId !== undefined && !meters.has(defaults.meterId)) throw bad('defaults.meterId', 'no meter with this id at this site');
  const spotsByCode = new Map(setup.spots.map((s) => [s.code.toLowerCase(), s]));
  const spotsByName = new Map<string, typeof setup.spots>();
  for (const s of setup.spots) {
    const k = s.name.trim().toLowerCase();
    spotsByName.set(k, [...(spotsByName.get(k) ?? []), s]);
  }
  const decimalComma = delimiter !== ',';

  const valid: PreparedRow[] = [];
  const invalid: ImportProblem[] = [];
  const rounds: PreparedImport['rounds'] = new Map();
  dataRows.forEach((cells, i) => {
    const row = dataLines[i]!;
    const problems: ImportProblem[] = [];
    const problem = (field: string, reason: string) => problems.push({ row, field, reason });
    const cell = (field: string): string | undefined => {
      const c = cols.get(field);
      return c === undefined ? undefined : (cells[c] ?? '').trim();
    };

    const spotText = cell('spot') ?? '';
    let spot = spotsByCode.get(spotText.toLowerCase());
    if (!spot) {
      const byName = spotsByName.get(spotText.toLowerCase()) ?? [];
      if (byName.length === 1) spot = byName[0];
      else if (byName.length > 1) problem('spot', `'${spotText}' is the name of ${byName.length} spots: use the spot code`);
    }
    if (!spot && spotText === '') problem('spot', 'the spot is empty');
    else if (!spot && problems.length === 0) problem('spot', `no spot of this site has the code or name '${spotText.slice(0, 80)}'`);

    const timeText = cell('takenAt') ?? '';
    const takenMs = timeText === '' ? null : parseImportTime(timeText, tz);
    if (takenMs === null) {
      problem('takenAt', timeText === '' ? 'the time is empty' : `'${timeText.slice(0, 40)}' is not a time like 2026-02-03 07:45 (site time) or 2026-02-03T06:45:00Z`);
    }

    const valueText = cell('value') ?? '';
    const signed = valueText === '' ? null : parseNumber(valueText, decimalComma);
    if (signed === null) problem('value', valueText === '' ? 'the value is empty' : `'${valueText.slice(0, 40)}' is not a number`);
    let polarity: '+' | '-' = signed !== null && signed < 0 ? '-' : '+';
    const polText = cell('polarity');
    if (polText !== undefined && polText !== '') {
      const p = POLARITY[polText.toLowerCase()];
      if (p) polarity = p;
      else problem('polarity', `'${polText.slice(0, 20)}' is not a polarity (+ or -)`);
    }

    const unitText = cell('unit');
    const unit = unitText !== undefined && unitText !== '' ? readingUnit(unitText) : defaults.unit ?? null;
    if (unit === null) {
      problem('unit', unitText ? `'${unitText.slice(0, 20)}' is not a unit (${READING_UNITS.join(', ')})` : 'no unit: map a unit column or give a default unit');
    }

    let distance: { value: number; unit: DistanceUnit } | null = null;
    const distText = cell('distance');
    if (distText !== undefined && distText !== '') {
      const m = /^([+-]?[\d.,]+)\s*([A-Za-z"]+)?$/.exec(distText);
      const value = m ? parseNumber(m[1]!, decimalComma) : null;
      const du = m?.[2] ? distanceUnit(m[2]) : cell('distanceUnit') ? distanceUnit(cell('distanceUnit')!) : defaults.distance?.unit ?? null;
      if (value === null) problem('distance', `'${distText.slice(0, 30)}' is not a distance like 10 or 10 cm`);
      else if (du === null) problem('distanceUnit', `no distance unit (${DISTANCE_UNITS.join(', ')}): map a distance-unit column, write it beside the number, or give a default distance`);
      else distance = { value, unit: du };
    } else if (defaults.distance) {
      distance = defaults.distance;
    } else {
      problem('distance', 'no distance: map a distance column or give a default distance');
    }

    const num = (field: 'rhPercent' | 'temperatureC'): number | null => {
      const t = cell(field);
      if (t === undefined || t === '') return null;
      const v = parseNumber(t.replace(/%$/, ''), decimalComma);
      if (v === null) problem(field, `'${t.slice(0, 20)}' is not a number`);
      return v;
    };
    const rhPercent = num('rhPercent');
    const temperatureC = num('temperatureC');

    const meterText = cell('meter');
    const meter = meterText !== undefined && meterText !== '' ? metersBySerial.get(meterText.toLowerCase()) : defaults.meterId ? meters.get(defaults.meterId) : undefined;
    if (!meter) problem('meter', meterText ? `no meter of this site has the serial '${meterText.slice(0, 40)}'` : 'no meter: map a meter (serial) column or give a default meter');
    if (meter && unit && isSurfaceVoltageUnit(unit) && meter.calibratedDistanceM === null) {
      problem('unit', `meter ${meter.serial} has no calibrated distance, so a surface-voltage reading (${unit}) cannot be converted to a field`);
    }

    const surveyor = (cell('surveyor') || defaults.surveyor || '').trim();
    if (surveyor === '') problem('surveyor', 'no surveyor: map a surveyor column or give a default surveyor');

    let zeroed = defaults.zeroed ?? true;
    const zText = cell('zeroed');
    if (zText !== undefined && zText !== '') {
      const z = BOOL[zText.toLowerCase()];
      if (z === undefined) problem('zeroed', `'${zText.slice(0, 10)}' is not yes or no`);
      else zeroed = z;
    }

    if (problems.length === 0 && spot && takenMs !== null && signed !== null && unit && distance && meter) {
      const local = zonedDateTime(takenMs, tz);
      const day = `${String(local.year).padStart(4, '0')}-${String(local.month).padStart(2, '0')}-${String(local.day).padStart(2, '0')}`;
      const dayStart = startOfLocalDay(local, tz);
      const roundId = deterministicUuidV7(dayStart, 'chargewalk-import-round', siteId, day, surveyor);
      const draft = {
        roundId, spotId: spot.id, meterId: meter.id, takenAt: new Date(takenMs).toISOString(), value: Math.abs(signed), unit, polarity,
        distance, rhPercent, temperatureC, zeroed, note: cell('note') ?? '', meterRange: '', distanceUncertaintyM: null, side: null,
        groundBehind: null, process: null,
      };
      const id = deterministicUuidV7(takenMs, 'chargewalk-import-reading', siteId, canonicalJson(draft));
      const r = ReadingInputSchema.safeParse({ ...draft, id });
      if (!r.success) {
        for (const issue of r.error.issues) {
          const top = String(issue.path[0] ?? 'value');
          problem(top === 'distance' ? 'distance' : top, issue.message);
        }
      } else {
        if (!rounds.has(roundId)) {
          const nextDay = startOfLocalDay(civilDateAddDays(local, 1), tz);
          rounds.set(roundId, {
            input: { id: roundId, siteId, surveyor, startedAt: new Date(dayStart).toISOString(), rhPercent: null, temperatureC: null, notes: 'Imported from a CSV file', plannedSpotIds: [] },
            endedAt: new Date(Math.max(dayStart, nextDay - 1)).toISOString(),
          });
        }
        valid.push({
          row, input: r.data, spotCode: spot.code, surveyor,
          fieldVPerM: normalizeReading({ value: r.data.value, unit: r.data.unit, polarity: r.data.polarity, calibratedDistanceM: meter.calibratedDistanceM }),
        });
      }
    }
    invalid.push(...problems);
  });
  return { rows: dataRows.length, columns, valid, invalid, rounds };
}
