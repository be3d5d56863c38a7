import { describe, expect, it } from 'vitest';
import { deriveReading, isCalibrationOverdue } from '../../../core/readings/derive';

const rules = [
  // ANSI/ESD S20.20-2021 8.3.1: < 125 V/inch (4921 V/m) where ESDS items are handled
  { metric: 'fieldVPerM' as const, warn: 2500, alarm: 4921.26, source: 'ANSI/ESD S20.20-2021 8.3.1' },
  // ANSI/ESD S20.20-2021 scope: isolated conductors below 35 V
  { metric: 'surfaceVoltageV' as const, warn: null, alarm: 35, source: 'ANSI/ESD S20.20-2021 scope' },
];
const meter = { calibratedDistanceM: 0.0254, calibrationDue: '2026-06-30' };

describe('deriveReading', () => {
  it('normalizes, keeps the sign and judges the magnitude', () => {
    const d = deriveReading({ value: 130, unit: 'V/inch', polarity: '-', distance: { value: 1, unit: 'inch' }, takenAt: '2026-03-02T09:00:00Z' }, meter, rules);
    expect(d.fieldVPerM).toBeCloseTo(-5118.11, 2);
    expect(d.distanceM).toBe(0.0254);
    expect(d.verdict.level).toBe('alarm');
    // surface voltage shown by the meter = E x dCal = 130 V: above 35 V as well
    expect(d.metrics.surfaceVoltageV).toBeCloseTo(130, 9);
  });
  it('surface-voltage readings use the calibrated distance', () => {
    const d = deriveReading({ value: 20, unit: 'V', polarity: '+', distance: { value: 25, unit: 'mm' }, takenAt: '2026-03-02T09:00:00Z' }, meter, rules);
    expect(d.fieldVPerM).toBeCloseTo(787.4, 1);
    expect(d.verdict.level).toBe('ok');
  });
  it('flags a meter past its calibration due date', () => {
    expect(isCalibrationOverdue('2026-06-30', '2026-06-30T23:00:00Z')).toBe(false);
    expect(isCalibrationOverdue('2026-06-30', '2026-07-01T00:00:01Z')).toBe(true);
    const d = deriveReading({ value: 1, unit: 'kV/m', polarity: '+', distance: { value: 1, unit: 'cm' }, takenAt: '2026-08-01T00:00:00Z' }, meter, rules);
    expect(d.meterCalibrationOverdue).toBe(true);
  });
  it('estimate metrics join the evaluation', () => {
    const d = deriveReading({ value: 1, unit: 'kV/m', polarity: '+', distance: { value: 1, unit: 'cm' }, takenAt: '2026-03-02T09:00:00Z' }, null,
      [{ metric: 'energyJ', warn: 0.1e-3, alarm: 0.25e-3, source: 'NFPA 77 (2000) Table B.1, propane' }], { extraMetrics: { energyJ: 1e-3 } });
    expect(d.verdict.level).toBe('alarm');
    expect(d.verdict.decidedBy?.metric).toBe('energyJ');
  });
});
