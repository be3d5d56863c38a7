/** meters: a field meter with its modes, calibrated distance, accuracy and calibration due date. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Meter, MeterInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { meterFromRow, type MeterRow } from '../../shared/meters';
import { requireSite } from './sites';

export function getMeter(db: Db, id: string): Meter | null {
  const r = stmt(db, 'SELECT * FROM meters WHERE id = ?').get(id) as MeterRow | undefined;
  return r ? meterFromRow(r) : null;
}

export function listMeters(db: Db, siteId: string): Meter[] {
  return (stmt(db, 'SELECT * FROM meters WHERE site_id = ? ORDER BY serial, id').all(siteId) as MeterRow[]).map(meterFromRow);
}

function checkSerialFree(db: Db, siteId: string, serial: string, exceptId: string | null): void {
  if (stmt(db, 'SELECT 1 FROM meters WHERE site_id = ? AND serial = ? AND id IS NOT ?').get(siteId, serial, exceptId)) {
    throw conflict(`another meter of this site already has the serial number ${serial}`, ['serial']);
  }
}

export function insertMeter(db: Db, input: MeterInput, now: string): Meter {
  requireSite(db, input.siteId);
  const id = input.id ?? newId();
  if (input.id && getMeter(db, id)) throw conflict(`a meter with id ${id} already exists`, ['id']);
  checkSerialFree(db, input.siteId, input.serial, null);
  stmt(db, `INSERT INTO meters (id, site_id, serial, label, modes, calibrated_distance_m, accuracy_rel, geometry_factor,
              calibration_due, default_unit, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`)
    .run(id, input.siteId, input.serial, input.label, JSON.stringify(input.modes), input.calibratedDistanceM,
      input.accuracyRel, input.geometryFactor, input.calibrationDue, input.defaultUnit, now, now);
  return getMeter(db, id)!;
}

export function updateMeter(db: Db, id: string, input: MeterInput, now: string): Meter {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const old = getMeter(db, id);
  if (!old) throw notFound(`no meter with id ${id}`, ['id']);
  if (old.siteId !== input.siteId) throw invalid('a meter cannot move to another site', ['siteId']);
  checkSerialFree(db, input.siteId, input.serial, id);
  stmt(db, `UPDATE meters SET serial = ?, label = ?, modes = ?, calibrated_distance_m = ?, accuracy_rel = ?, geometry_factor = ?,
              calibration_due = ?, default_unit = ?, updated_at = ? WHERE id = ?`)
    .run(input.serial, input.label, JSON.stringify(input.modes), input.calibratedDistanceM, input.accuracyRel,
      input.geometryFactor, input.calibrationDue, input.defaultUnit, now, id);
  return getMeter(db, id)!;
}
