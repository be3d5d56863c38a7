/**
 * Helpers shared by the model modules: argument checks, the capacitance-derived
 * quantities, and the plausibility warnings every model runs.
 */
import { AIR_BREAKDOWN_V_PER_M, MAX_SURFACE_CHARGE_DENSITY } from '../constants';
import type { ModelResult, PhysicsWarning } from '../types';

/** Throws "<name> must be a finite number greater than zero" unless x > 0 and finite. */
export function requirePositive(name: string, x: number): void {
  if (!Number.isFinite(x) || x <= 0) throw new RangeError(`${name} must be a finite number greater than zero`);
}

/** Throws unless x >= 0 and finite. */
export function requireNonNegative(name: string, x: number): void {
  if (!Number.isFinite(x) || x < 0) throw new RangeError(`${name} must be a finite number, zero or more`);
}

/** Throws unless x is finite (any sign). */
export function requireFinite(name: string, x: number): void {
  if (!Number.isFinite(x)) throw new RangeError(`${name} must be a finite number`);
}

/**
 * Fills potentialV = Q / C and energyJ = Q^2 / (2 C) from a charge (C) and a
 * capacitance (F), in place. Reference: Griffiths, Introduction to Electrodynamics,
 * 4th ed., sections 2.5.4 (capacitors) and 2.4.3 (energy of a charge distribution).
 * @example withCapacitance(r, 1e-9, 1e-10) // potentialV 10, energyJ 5e-9
 */
export function withCapacitance(result: ModelResult, chargeC: number, capacitanceF: number): ModelResult {
  result.capacitanceF = capacitanceF;
  result.potentialV = chargeC / capacitanceF;
  result.energyJ = (chargeC * chargeC) / (2 * capacitanceF);
  return result;
}

/** Warning 'field-above-breakdown' when |E| at the meter exceeds 3 MV/m (not credible: check the unit). */
export function fieldWarnings(fieldVPerM: number): PhysicsWarning[] {
  if (Math.abs(fieldVPerM) > AIR_BREAKDOWN_V_PER_M) {
    return [{
      code: 'field-above-breakdown',
      message: `The field at the meter, ${Math.abs(fieldVPerM).toExponential(3)} V/m, is above the breakdown field of air (about 3 MV/m): not credible, check the reading's unit.`,
    }];
  }
  return [];
}

/**
 * Warning 'above-air-breakdown-density' when |sigma| exceeds eps0 x 3 MV/m
 * (26.6 uC/m^2): a single charged surface in air cannot hold that much.
 */
export function densityWarnings(sigma: number | null): PhysicsWarning[] {
  if (sigma !== null && Math.abs(sigma) > MAX_SURFACE_CHARGE_DENSITY) {
    return [{
      code: 'above-air-breakdown-density',
      message: `The surface charge density, ${(Math.abs(sigma) * 1e6).toPrecision(3)} uC/m^2, is above what a single surface in air can hold (about ${(MAX_SURFACE_CHARGE_DENSITY * 1e6).toPrecision(3)} uC/m^2): the model or the distance is wrong, discharges are happening, or it is a double layer (a thin layer on a conductor).`,
    }];
  }
  return [];
}

/**
 * Applies the meter geometry factor f (1 to 2; 1 for a small probe, up to 2 for a
 * wide grounded flat face) to a point-like estimate: the free-space value is divided
 * by f. Returns the warnings: 'geometry-factor-applied' when f != 1, else the
 * 'meter-image' caution (the grounded meter face may raise the reading up to 2x).
 */
export function geometryFactorWarnings(f: number): PhysicsWarning[] {
  if (!Number.isFinite(f) || f < 1 || f > 2) throw new RangeError('geometryFactor must be between 1 and 2');
  if (f !== 1) {
    return [{
      code: 'geometry-factor-applied',
      message: `The meter geometry factor ${f} was applied: the free-space estimate was divided by ${f}.`,
    }];
  }
  return [{
    code: 'meter-image',
    message: 'The grounded meter face acts as a mirror for a small charge close to it and can raise the reading up to 2x: the charge may be as low as half this value.',
  }];
}
