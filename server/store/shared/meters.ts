/** meters: what both store implementations share (row shape and mapping). */
import type { Meter } from '../../../core/schemas';

export interface MeterRow {
  id: string;
  site_id: string;
  serial: string;
  label: string;
  modes: string;
  calibrated_distance_m: number | null;
  accuracy_rel: number;
  geometry_factor: number;
  calibration_due: string;
  default_unit: string;
  created_at: string;
  updated_at: string;
}

export function meterFromRow(r: MeterRow): Meter {
  return {
    id: r.id, siteId: r.site_id, serial: r.serial, label: r.label, modes: JSON.parse(r.modes) as Meter['modes'],
    calibratedDistanceM: r.calibrated_distance_m, accuracyRel: r.accuracy_rel, geometryFactor: r.geometry_factor,
    calibrationDue: r.calibration_due, defaultUnit: r.default_unit as Meter['defaultUnit'],
    createdAt: r.created_at, updatedAt: r.updated_at,
  };
}
