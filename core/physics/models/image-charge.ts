/**
 * Point charge q at height h above a grounded conducting plane, meter on the normal
 * through the charge at distance r above it (on the far side from the plane).
 *
 * Reference: method of images, Griffiths, Introduction to Electrodynamics, 4th ed.,
 * section 3.2.1; Jackson, Classical Electrodynamics, 3rd ed., section 2.2.
 * The image -q sits at depth h below the plane, i.e. at distance r + 2h from the meter.
 */
import { COULOMB_K } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { fieldWarnings, geometryFactorWarnings, requireFinite, requirePositive } from './common';

/**
 * Field: E = k q [1/r^2 - 1/(r + 2h)^2]. Near (r << h): k q / r^2; far (r >> h):
 * 2 k p / r^3 with p = 2 q h.
 * @param chargeC the real charge q, C
 * @param heightAboveGroundM height h of the charge above the grounded plane, m
 * @param distanceM distance r from the charge to the meter, m
 * @returns field at the meter, V/m
 * @example imageChargeField(1e-8, 0.01, 0.05) // 1.76083e4 V/m
 */
export function imageChargeField(chargeC: number, heightAboveGroundM: number, distanceM: number): number {
  requirePositive('heightAboveGroundM', heightAboveGroundM);
  requirePositive('distanceM', distanceM);
  const b = distanceM + 2 * heightAboveGroundM;
  return COULOMB_K * chargeC * (1 / (distanceM * distanceM) - 1 / (b * b));
}

/**
 * Real charge from the field: q = E / (k [1/r^2 - 1/(r + 2h)^2]) / f; dipoleMomentCM is
 * the moment of charge and image, p = 2 q h.
 * @param fieldVPerM field, V/m (signed)
 * @param distanceM distance r from the charge to the meter, m
 * @param heightAboveGroundM height h, m
 * @param geometryFactor meter geometry factor f, 1..2
 * @returns chargeC (C), dipoleMomentCM (C m)
 * @example imageChargeFromField({ fieldVPerM: 1.76083e4, distanceM: 0.05, heightAboveGroundM: 0.01 }).chargeC // 1e-8 C
 */
export function imageChargeFromField(args: { fieldVPerM: number; distanceM: number; heightAboveGroundM: number; geometryFactor?: number }): ModelResult {
  const { fieldVPerM, distanceM, heightAboveGroundM, geometryFactor = 1 } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const q = fieldVPerM / imageChargeField(1, heightAboveGroundM, distanceM) / geometryFactor;
  res.chargeC = q;
  res.dipoleMomentCM = 2 * q * heightAboveGroundM;
  if (distanceM > 3 * heightAboveGroundM) {
    res.warnings.push({
      code: 'dipole-like',
      message: `The meter is more than 3x the charge's height above ground away: the field falls off like a dipole's (1/r^3) and the charge estimate grows fast with any error in distance or height.`,
    });
  }
  res.warnings.push(...geometryFactorWarnings(geometryFactor), ...fieldWarnings(fieldVPerM));
  return res;
}
