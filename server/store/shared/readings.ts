/** readings: what both store implementations share (row shape, row-to-entity mapping, input normalization). */
import type { LimitRule } from '../../../core/limits/evaluate';
import type { AreaHazardContext, SpotEstimateContext } from '../../../core/readings/derive';
import type { CorrectionInput, Reading, ReadingInput } from '../../../core/schemas';
import { toUtcIso } from '../canonical';
import { toReadingEntity, type ReadingContext, type ReadingFlag, type StoredReading } from '../reading-entity';
import { parseRules } from './limit-sets';

export interface ReadingRow {
  id: string;
  round_id: string;
  spot_id: string;
  meter_id: string;
  taken_at: string;
  received_at: string;
  value: number;
  unit: string;
  polarity: string;
  meter_range: string;
  distance_value: number;
  distance_unit: string;
  distance_uncertainty_m: number | null;
  side: string | null;
  ground_behind_value: number | null;
  ground_behind_unit: string | null;
  zeroed: number;
  rh_percent: number | null;
  temperature_c: number | null;
  process: string | null;
  note: string;
  meter_calibrated_distance_m: number | null;
  meter_calibration_due: string;
  supersedes_id: string | null;
  correction_reason: string | null;
  content_hash: string;
  field_v_per_m: number;
  derive_version: number;
  flags: string;
  // joined
  superseded_by_id: string | null;
  tombstone_reason: string | null;
  tombstone_at: string | null;
  spot_material_class: string;
  limit_rules: string | null;
  // joined for the charge estimate and hazard verdicts (core/readings/estimate.ts)
  spot_model: string | null;
  spot_geometry: string;
  spot_distance_uncertainty_m: number | null;
  area_kind: string;
  area_zone: number | null;
  area_gas_group: string | null;
  area_substance_id: string | null;
  area_dust_mie_j: number | null;
  meter_accuracy_rel: number | null;
  meter_geometry_factor: number | null;
}

function inputFromRow(r: ReadingRow): ReadingInput {
  return {
    id: r.id, roundId: r.round_id, spotId: r.spot_id, meterId: r.meter_id, takenAt: r.taken_at,
    value: r.value, unit: r.unit as ReadingInput['unit'], polarity: r.polarity as ReadingInput['polarity'],
    meterRange: r.meter_range,
    distance: { value: r.distance_value, unit: r.distance_unit as ReadingInput['distance']['unit'] },
    distanceUncertaintyM: r.distance_uncertainty_m, side: r.side as ReadingInput['side'],
    groundBehind: r.ground_behind_value === null || r.ground_behind_unit === null
      ? null : { value: r.ground_behind_value, unit: r.ground_behind_unit as ReadingInput['distance']['unit'] },
    zeroed: r.zeroed === 1, rhPercent: r.rh_percent, temperatureC: r.temperature_c,
    process: r.process === null ? null : JSON.parse(r.process) as ReadingInput['process'],
    note: r.note,
  };
}

function rowToStored(r: ReadingRow): StoredReading {
  return {
    input: inputFromRow(r),
    receivedAt: r.received_at,
    supersedesId: r.supersedes_id,
    supersededById: r.superseded_by_id,
    correctionReason: r.correction_reason,
    deleted: r.tombstone_reason === null || r.tombstone_at === null ? null : { reason: r.tombstone_reason, at: r.tombstone_at },
    flags: JSON.parse(r.flags) as ReadingFlag[],
    meterCalibratedDistanceM: r.meter_calibrated_distance_m,
    meterCalibrationDue: r.meter_calibration_due,
  };
}

/** Maps rows to entities, parsing each distinct limit set's rules once. */
export function toEntities(rows: ReadingRow[]): Reading[] {
  const rulesCache = new Map<string | null, LimitRule[]>();
  const geometryCache = new Map<string, SpotEstimateContext['geometry']>();
  return rows.map((r) => {
    let rules = rulesCache.get(r.limit_rules);
    if (!rules) {
      rules = parseRules(r.limit_rules);
      rulesCache.set(r.limit_rules, rules);
    }
    return toReadingEntity(rowToStored(r), { rules, materialClass: r.spot_material_class, ...estimateContext(r, geometryCache) });
  });
}

/** The spot, area and meter parts of a row that the estimate and hazard verdicts need. */
function estimateContext(r: ReadingRow, geometryCache: Map<string, SpotEstimateContext['geometry']>): Pick<ReadingContext, 'spot' | 'area' | 'meter'> {
  let geometry = geometryCache.get(r.spot_geometry);
  if (geometry === undefined) {
    geometry = JSON.parse(r.spot_geometry) as SpotEstimateContext['geometry'];
    geometryCache.set(r.spot_geometry, geometry);
  }
  return {
    spot: { model: r.spot_model as SpotEstimateContext['model'], geometry, materialClass: r.spot_material_class, distanceUncertaintyM: r.spot_distance_uncertainty_m },
    area: {
      kind: r.area_kind as AreaHazardContext['kind'], zone: r.area_zone as AreaHazardContext['zone'],
      gasGroup: r.area_gas_group as AreaHazardContext['gasGroup'], substanceId: r.area_substance_id, dustMieJ: r.area_dust_mie_j,
    },
    meter: { accuracyRel: r.meter_accuracy_rel, geometryFactor: r.meter_geometry_factor },
  };
}

/** The input as stored: times in UTC, so text order is time order and a retry hashes the same. */
export function normalizeInput(input: ReadingInput): ReadingInput {
  return { ...input, takenAt: toUtcIso(input.takenAt) };
}

/** The reading-input part of a correction (its reason is kept beside it, not hashed). */
export function readingPart(input: CorrectionInput): ReadingInput {
  const { reason: _reason, ...rest } = input;
  return rest;
}
