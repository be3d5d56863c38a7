/** meters: a field meter with its modes, calibrated distance, accuracy and calibration due date. */
import { newId } from '../../../../core/ids/uuidv7';
import type { Meter, MeterInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import type { Db } from '../db';
import { meterFromRow, type MeterRow } from '../../shared/meters';
import { requireSite } from './sites';

export async function getMeter(db: Db, id: string): Promise<Meter | null> {
  const r = (await db.get('SELECT * FROM meters WHERE id = ?', id)) as MeterRow | undefined;
  return r ? meterFromRow(r) : null;
}

export async function listMeters(db: Db, siteId: string): Promise<Meter[]> {
  return ((await db.all('SELECT * FROM meters WHERE site_id = ? ORDER BY serial, id', siteId)) as MeterRow[]).map(meterFromRow);
}

async function checkSerialFree(db: Db, siteId: string, serial: string, exceptId: string | null): Promise<void> {
  if ((await db.get('SELECT 1 FROM meters WHERE site_id = ? AND serial = ? AND id IS DISTINCT FROM ?', siteId, serial, exceptId))) {
    throw conflict(`another meter of this site already has the serial number ${serial}`, ['serial']);
  }
}

export async function insertMeter(db: Db, input: MeterInput, now: string): Promise<Meter> {
  (await requireSite(db, input.siteId));
  const id = input.id ?? newId();
  if (input.id && (await getMeter(db, id))) throw conflict(`a meter with id ${id} already exists`, ['id']);
  (await checkSerialFree(db, input.siteId, input.serial, null));
  (await db.run(`INSERT INTO meters (id, site_id, serial, label, modes, calibrated_distance_m, accuracy_rel, geometry_factor,
              calibration_due, default_unit, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`, id, input.siteId, input.serial, input.label, JSON.stringify(input.modes), input.calibratedDistanceM,
      input.accuracyRel, input.geometryFactor, input.calibrationDue, input.defaultUnit, now, now));
  return (await getMeter(db, id))!;
}

export async function updateMeter(db: Db, id: string, input: MeterInput, now: string): Promise<Meter> {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const old = (await getMeter(db, id));
  if (!old) throw notFound(`no meter with id ${id}`, ['id']);
  if (old.siteId !== input.siteId) throw invalid('a meter cannot move to another site', ['siteId']);
  (await checkSerialFree(db, input.siteId, input.serial, id));
  (await db.run(`UPDATE meters SET serial = ?, label = ?, modes = ?, calibrated_distance_m = ?, accuracy_rel = ?, geometry_factor = ?,
              calibration_due = ?, default_unit = ?, updated_at = ? WHERE id = ?`, input.serial, input.label, JSON.stringify(input.modes), input.calibratedDistanceM, input.accuracyRel,
      input.geometryFactor, input.calibrationDue, input.defaultUnit, now, id));
  return (await getMeter(db, id))!;
}
