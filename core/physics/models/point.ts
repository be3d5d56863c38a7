/**
 * Point charge in free space.
 *
 * Reference: Coulomb's law, Griffiths, Introduction to Electrodynamics, 4th ed., eq. 2.4;
 * Jackson, Classical Electrodynamics, 3rd ed., section 1.2.
 */
import { COULOMB_K, EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { fieldWarnings, geometryFactorWarnings, requireFinite, requirePositive } from './common';

/**
 * Field of a point charge: E = k Q / r^2 (k = 1 / (4 pi eps0)), signed like Q.
 *
 * @param chargeC charge Q, C (signed)
 * @param distanceM distance r from the charge to the meter, m (> 0)
 * @returns field E at the meter, V/m (signed, positive pointing away from a positive charge)
 * @example pointChargeField(10e-9, 0.03) // 9.98617e4 V/m: 10 nC seen 3 cm away
 */
export function pointChargeField(chargeC: number, distanceM: number): number {
  requirePositive('distanceM', distanceM);
  return (COULOMB_K * chargeC) / (distanceM * distanceM);
}

/**
 * Charge of a point charge from the field it makes: Q = 4 pi eps0 r^2 E / f, where f
 * is the meter geometry factor (1 to 2, default 1) that divides point-like estimates.
 * Returns only chargeC (no area, no capacitance: a point has none).
 *
 * @param fieldVPerM field at the meter, V/m (signed)
 * @param distanceM distance r from the charge centre to the meter, m
 * @param geometryFactor meter geometry factor f, dimensionless, 1..2
 * @returns ModelResult with chargeC in C and warnings ('meter-image' or 'geometry-factor-applied', 'field-above-breakdown')
 * @example pointChargeFromField({ fieldVPerM: 1e5, distanceM: 0.03 }).chargeC // 1.00138e-8 C (about 10 nC)
 */
export function pointChargeFromField(args: { fieldVPerM: number; distanceM: number; geometryFactor?: number }): ModelResult {
  const { fieldVPerM, distanceM, geometryFactor = 1 } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  requirePositive('distanceM', distanceM);
  const r = emptyResult();
  r.chargeC = (4 * Math.PI * EPSILON_0 * distanceM * distanceM * fieldVPerM) / geometryFactor;
  r.warnings.push(...geometryFactorWarnings(geometryFactor), ...fieldWarnings(fieldVPerM));
  return r;
}
