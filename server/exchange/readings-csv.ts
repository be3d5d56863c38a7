/**
 * Every reading of a site in a range as CSV (GET /api/sites/:id/readings.csv): the
 * value and unit as entered, the normalized field, the distance as entered, the
 * charge estimate where the spot has a model, the verdict and its reason, RH,
 * temperature, meter, surveyor, round and reading ids. Corrections never erase:
 * superseded revisions are included and marked, deleted ones marked too; verdicts
 * and estimates are recomputed from the stored inputs (server/review/judge.ts).
 * Polarity is written as a word (positive, negative): a lone + or - would be
 * neutralised against formula injection by core/csv and read as text.
 */
import { toCsv } from '../../core/csv';
import type { SetupBundle } from '../../core/schemas';
import { zonedDateTime } from '../../core/time';
import { distanceToMetres } from '../../core/units/distance';
import { ReadingJudge } from '../review/judge';
import type { ExportedReading } from '../store/store';

export const READINGS_CSV_HEADER = [
  'reading id', 'revision', 'supersedes id', 'superseded by id', 'correction reason', 'deleted reason',
  'taken at (UTC)', 'taken at (site time)', 'spot code', 'spot', 'area', 'value', 'unit', 'polarity', 'field (V/m)',
  'distance', 'distance unit', 'distance (m)', 'model', 'charge estimate (C)', 'surface charge density estimate (C/m²)', 'verdict', 'verdict reason',
  'RH (%)', 'RH of the round (%)', 'temperature (°C)', 'meter serial', 'surveyor', 'round id', 'zeroed', 'note',
] as const;

function localText(ms: number, timeZone: string): string {
  const z = zonedDateTime(ms, timeZone);
  const p = (n: number) => String(n).padStart(2, '0');
  return `${String(z.year).padStart(4, '0')}-${p(z.month)}-${p(z.day)} ${p(z.hour)}:${p(z.minute)}:${p(z.second)}`;
}

/** 'current', 'superseded' (a correction replaced it), 'deleted', or 'superseded, deleted'. */
export function revisionState(r: Pick<ExportedReading, 'supersededById' | 'deleted'>): string {
  const parts: string[] = [];
  if (r.supersededById) parts.push('superseded');
  if (r.deleted) parts.push('deleted');
  return parts.length ? parts.join(', ') : 'current';
}

export function readingsCsv(setup: SetupBundle, readings: ExportedReading[]): string {
  const judge = new ReadingJudge(setup);
  const spots = new Map(setup.spots.map((s) => [s.id, s]));
  const areas = new Map(setup.areas.map((a) => [a.id, a.name]));
  const tz = setup.site.timeZone;
  const rows = readings.map((r) => {
    const j = judge.judge(r);
    const spot = spots.get(r.spotId);
    return [
      r.id, revisionState(r), r.supersedesId, r.supersededById, r.correctionReason, r.deleted?.reason ?? null,
      r.takenAt, localText(Date.parse(r.takenAt), tz), spot?.code ?? '', spot?.name ?? '', spot ? areas.get(spot.areaId) ?? '' : '',
      r.value, r.unit, r.polarity === '-' ? 'negative' : 'positive', j.fieldVPerM, r.distanceValue, r.distanceUnit, distanceToMetres(r.distanceValue, r.distanceUnit),
      spot?.model ?? null, j.chargeC, j.surfaceChargeDensityCPerM2, j.verdict.level, j.verdict.reason, r.readingRhPercent, r.roundRhPercent, r.temperatureC,
      r.meterSerial, r.surveyor, r.roundId, r.zeroed, r.note,
    ];
  });
  return toCsv([[...READINGS_CSV_HEADER], ...rows]);
}
