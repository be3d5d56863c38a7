/**
 * Electric dipole: charges +q and -q at separation d, meter at distance r from the
 * centre, either on the axis or on the perpendicular bisector (broadside).
 *
 * Reference: superposition of two Coulomb fields; far-field forms
 * E = 2 k p / r^3 (axis) and k p / r^3 (broadside) from Griffiths, Introduction to
 * Electrodynamics, 4th ed., section 3.4.4, eq. 3.103.
 *
 * Sign convention: chargeC is the pole nearer the meter on the axis (its sign is the
 * sign of the reading). On the broadside the field runs parallel to the dipole axis,
 * so a meter facing the dipole sees mainly its magnitude; the sign is carried as read.
 */
import { COULOMB_K } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { fieldWarnings, geometryFactorWarnings, requireFinite, requirePositive } from './common';

/** Ratio r / d below which an exact-separation dipole is flagged as not far field (the far-field form would be off by more than about 10 %). */
const FAR_FIELD_RATIO = 3;

/**
 * Exact on-axis field: E = k q [1/(r - d/2)^2 - 1/(r + d/2)^2], r > d/2.
 * @param chargeC pole charge q (the nearer pole), C
 * @param separationM pole separation d, m
 * @param distanceM distance r from the dipole centre to the meter, m (> d/2)
 * @returns field, V/m
 * @example dipoleAxisField(1e-9, 0.01, 0.05) // 1467.21 V/m
 */
export function dipoleAxisField(chargeC: number, separationM: number, distanceM: number): number {
  requirePositive('separationM', separationM);
  requirePositive('distanceM', distanceM);
  if (distanceM <= separationM / 2) throw new RangeError('distanceM must be greater than half the separation for the dipole-axis model');
  const a = distanceM - separationM / 2;
  const b = distanceM + separationM / 2;
  return COULOMB_K * chargeC * (1 / (a * a) - 1 / (b * b));
}

/**
 * Exact broadside field magnitude: E = k q d / (r^2 + d^2/4)^(3/2).
 * @param chargeC pole charge q, C
 * @param separationM pole separation d, m
 * @param distanceM distance r from the dipole centre along the bisector, m
 * @returns field, V/m
 * @example dipoleBroadsideField(1e-9, 0.01, 0.05) // 708.35 V/m
 */
export function dipoleBroadsideField(chargeC: number, separationM: number, distanceM: number): number {
  requirePositive('separationM', separationM);
  requirePositive('distanceM', distanceM);
  const s = distanceM * distanceM + (separationM * separationM) / 4;
  return (COULOMB_K * chargeC * separationM) / (s * Math.sqrt(s));
}

/**
 * Far-field on-axis field of a moment p: E = 2 k p / r^3.
 * @param momentCM dipole moment p = q d, C m
 * @param distanceM distance r, m
 * @returns field, V/m
 * @example dipoleAxisFarField(1e-11, 0.05) // 1438.01 V/m
 */
export function dipoleAxisFarField(momentCM: number, distanceM: number): number {
  requirePositive('distanceM', distanceM);
  return (2 * COULOMB_K * momentCM) / distanceM ** 3;
}

/**
 * Far-field broadside field of a moment p: E = k p / r^3.
 * @example dipoleBroadsideFarField(1e-11, 0.05) // 719.00 V/m
 */
export function dipoleBroadsideFarField(momentCM: number, distanceM: number): number {
  requirePositive('distanceM', distanceM);
  return (COULOMB_K * momentCM) / distanceM ** 3;
}

function dipoleInverse(
  orientation: 'axis' | 'broadside',
  args: { fieldVPerM: number; distanceM: number; separationM?: number | null; geometryFactor?: number },
): ModelResult {
  const { fieldVPerM, distanceM, separationM = null, geometryFactor = 1 } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  requirePositive('distanceM', distanceM);
  const res = emptyResult();
  if (separationM === null) {
    const unit = orientation === 'axis' ? dipoleAxisFarField(1, distanceM) : dipoleBroadsideFarField(1, distanceM);
    res.dipoleMomentCM = fieldVPerM / unit / geometryFactor;
    res.warnings.push({
      code: 'far-field-assumed',
      message: 'No separation given: the far-field form was used (valid only when the distance is large against the separation); it gives the dipole moment only, not the pole charge.',
    });
  } else {
    const unit = orientation === 'axis' ? dipoleAxisField(1, separationM, distanceM) : dipoleBroadsideField(1, separationM, distanceM);
    const q = fieldVPerM / unit / geometryFactor;
    res.chargeC = q;
    res.dipoleMomentCM = q * separationM;
    if (distanceM < FAR_FIELD_RATIO * separationM) {
      res.warnings.push({
        code: 'not-far-field',
        message: `The distance (${distanceM} m) is less than ${FAR_FIELD_RATIO}x the separation (${separationM} m): the exact two-charge form was used, but the result depends strongly on where the charges really sit.`,
      });
    }
  }
  res.warnings.push(...geometryFactorWarnings(geometryFactor), ...fieldWarnings(fieldVPerM));
  return res;
}

/**
 * Dipole on axis from the field: with separation d, q = E / (k [1/(r - d/2)^2 - 1/(r + d/2)^2]) / f
 * and p = q d; without d, the far field p = r^3 E / (2 k) / f (chargeC null).
 *
 * @param fieldVPerM field, V/m (signed)
 * @param distanceM distance r from the dipole centre, m
 * @param separationM separation d, m, or null for the far-field form
 * @param geometryFactor meter geometry factor f, 1..2
 * @returns chargeC (pole charge, C) and dipoleMomentCM (C m)
 * @example dipoleAxisFromField({ fieldVPerM: 1438.01, distanceM: 0.05 }).dipoleMomentCM // 1e-11 C m
 */
export function dipoleAxisFromField(args: { fieldVPerM: number; distanceM: number; separationM?: number | null; geometryFactor?: number }): ModelResult {
  return dipoleInverse('axis', args);
}

/**
 * Dipole broadside from the field: with separation d, q = E (r^2 + d^2/4)^(3/2) / (k d) / f
 * and p = q d; without d, p = r^3 E / k / f (chargeC null).
 * @example dipoleBroadsideFromField({ fieldVPerM: 719.0, distanceM: 0.05 }).dipoleMomentCM // 1e-11 C m
 */
export function dipoleBroadsideFromField(args: { fieldVPerM: number; distanceM: number; separationM?: number | null; geometryFactor?: number }): ModelResult {
  return dipoleInverse('broadside', args);
}
