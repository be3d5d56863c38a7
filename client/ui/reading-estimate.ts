/**
 * The estimate block of a stored reading (spot screen): the reading's own estimate
 * and hazard verdicts as the server or the tablet derived them; for a reading cached
 * before readings carried them, derived here with the same core function.
 */
import { estimateBlock } from './estimate-view';
import { deriveReading } from '../../core/readings/derive';
import { isSurfaceVoltageUnit, VOLTS_PER_SURFACE_VOLTAGE_UNIT } from '../../core/units/field';
import type { Reading, SetupBundle } from '../../core/schemas';

export function readingEstimateBlock(r: Reading, bundle: SetupBundle): HTMLElement | null {
  const spot = bundle.spots.find((s) => s.id === r.spotId);
  if (!spot?.model) return null;
  let { estimate, estimateNote, hazards } = r;
  if (estimate === undefined) {
    try {
      const meter = bundle.meters.find((m) => m.id === r.meterId) ?? null;
      const d = deriveReading(r, meter, [], { spot, area: bundle.areas.find((a) => a.id === spot.areaId) ?? null });
      ({ estimate, estimateNote, hazards } = d);
    } catch {
      return null;
    }
  }
  const potentialV = isSurfaceVoltageUnit(r.unit) ? (r.polarity === '-' ? -1 : 1) * r.value * VOLTS_PER_SURFACE_VOLTAGE_UNIT[r.unit] : null;
  const webCurrent = spot.model === 'sheet' || spot.model === 'layer-on-ground' ? { widthM: spot.geometry?.widthM, speedMPerS: r.process?.lineSpeedMPerS } : null;
  const el = estimateBlock({ estimate, note: estimateNote, hazards, spot, webCurrent, reading: { fieldVPerM: r.fieldVPerM, distanceM: r.distanceM, potentialV } });
  el?.classList.add('rev-estimate');
  return el;
}
