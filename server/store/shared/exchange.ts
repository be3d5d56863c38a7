/** Data in and out: what both store implementations share (row shape, mapping, import order). */
import type { ReadingInput, SiteExport, StoredReadingExport } from '../../../core/schemas';
import type { ExportedReading } from '../store';

export interface FullRow {
  id: string; round_id: string; spot_id: string; meter_id: string; taken_at: string; received_at: string; value: number; unit: string;
  polarity: string; meter_range: string; distance_value: number; distance_unit: string; distance_uncertainty_m: number | null;
  side: string | null; ground_behind_value: number | null; ground_behind_unit: string | null; zeroed: number; rh_percent: number | null;
  temperature_c: number | null; process: string | null; note: string; meter_calibrated_distance_m: number | null; meter_calibration_due: string;
  supersedes_id: string | null; correction_reason: string | null; flags: string;
  superseded_by_id: string | null; tombstone_reason: string | null; tombstone_at: string | null;
  surveyor: string; round_rh: number | null; meter_serial: string | null;
}

export const iso = (ms: number) => new Date(ms).toISOString();

export function inputOf(r: FullRow): ReadingInput {
  return {
    id: r.id, roundId: r.round_id, spotId: r.spot_id, meterId: r.meter_id, takenAt: r.taken_at,
    value: r.value, unit: r.unit as ReadingInput['unit'], polarity: r.polarity as ReadingInput['polarity'], meterRange: r.meter_range,
    distance: { value: r.distance_value, unit: r.distance_unit as ReadingInput['distance']['unit'] },
    distanceUncertaintyM: r.distance_uncertainty_m, side: r.side as ReadingInput['side'],
    groundBehind: r.ground_behind_value === null || r.ground_behind_unit === null
      ? null : { value: r.ground_behind_value, unit: r.ground_behind_unit as ReadingInput['distance']['unit'] },
    zeroed: r.zeroed === 1, rhPercent: r.rh_percent, temperatureC: r.temperature_c,
    process: r.process === null ? null : JSON.parse(r.process) as ReadingInput['process'], note: r.note,
  };
}

/** Parents before their corrections (a correction references the revision it supersedes). */
export function historyOrder(readings: StoredReadingExport[]): StoredReadingExport[] {
  const byId = new Map(readings.map((r) => [r.id, r]));
  const depth = new Map<string, number>();
  const depthOf = (r: StoredReadingExport): number => {
    const known = depth.get(r.id);
    if (known !== undefined) return known;
    let d = 0;
    let cur: StoredReadingExport | undefined = r;
    const seen = new Set<string>();
    while (cur?.supersedesId && !seen.has(cur.id)) {
      seen.add(cur.id);
      cur = byId.get(cur.supersedesId);
      d++;
    }
    depth.set(r.id, d);
    return d;
  };
  return [...readings].sort((a, b) => depthOf(a) - depthOf(b));
}

/** A row as one line of the CSV export. */
export function exportedReadingFromRow(r: FullRow): ExportedReading {
  return {
    id: r.id, spotId: r.spot_id, roundId: r.round_id, meterId: r.meter_id, takenAt: r.taken_at, value: r.value,
    unit: r.unit as ExportedReading['unit'], polarity: r.polarity as ExportedReading['polarity'],
    distanceValue: r.distance_value, distanceUnit: r.distance_unit as ExportedReading['distanceUnit'], distanceUncertaintyM: r.distance_uncertainty_m,
    groundBehindValue: r.ground_behind_value, groundBehindUnit: r.ground_behind_unit as ExportedReading['groundBehindUnit'],
    meterCalibratedDistanceM: r.meter_calibrated_distance_m, meterCalibrationDue: r.meter_calibration_due,
    rhPercent: r.rh_percent ?? r.round_rh, readingRhPercent: r.rh_percent, roundRhPercent: r.round_rh, temperatureC: r.temperature_c,
    zeroed: r.zeroed === 1, note: r.note, surveyor: r.surveyor, meterSerial: r.meter_serial ?? '',
    supersedesId: r.supersedes_id, supersededById: r.superseded_by_id, correctionReason: r.correction_reason,
    deleted: r.tombstone_reason === null || r.tombstone_at === null ? null : { reason: r.tombstone_reason, at: r.tombstone_at },
  };
}

/** A row as a reading revision of the whole-site JSON export. */
export function storedReadingFromRow(r: FullRow): StoredReadingExport {
  return {
    ...inputOf(r), receivedAt: r.received_at, supersedesId: r.supersedes_id, correctionReason: r.correction_reason,
    flags: JSON.parse(r.flags) as StoredReadingExport['flags'], meterCalibratedDistanceM: r.meter_calibrated_distance_m,
    meterCalibrationDue: r.meter_calibration_due,
  };
}

/** The tombstones of the whole-site JSON export, from the rows of every revision. */
export function tombstonesOf(rows: FullRow[]): SiteExport['tombstones'] {
  return rows.filter((r) => r.tombstone_reason !== null && r.tombstone_at !== null)
    .map((r) => ({ readingId: r.id, reason: r.tombstone_reason!, at: r.tombstone_at! }));
}

/** The ids of an export to look for before importing it: what, table, ids. */
export function collisionChecks(data: SiteExport): [string, string, string[]][] {
  return [
    ['site', 'sites', [data.site.id]],
    ['limit set', 'limit_sets', data.limitSets.map((x) => x.id)],
    ['area', 'areas', data.areas.map((x) => x.id)],
    ['spot', 'spots', data.spots.map((x) => x.id)],
    ['meter', 'meters', data.meters.map((x) => x.id)],
    ['round', 'rounds', data.rounds.map((x) => x.id)],
    ['skip', 'round_skips', data.skips.map((x) => x.id)],
    ['reading', 'readings', data.readings.map((x) => x.id)],
    ['follow-up', 'follow_ups', data.followUps.map((x) => x.id)],
  ];
}
