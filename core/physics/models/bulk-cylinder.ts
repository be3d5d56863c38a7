/**
 * Charged bulk contents (powder or liquid with uniform space charge density rho) in a
 * long cylindrical container of radius R, or (variant) a sphere. Indicative only:
 * real fill, wall and earthing change the field.
 *
 * Reference: Gauss's law for a uniformly charged cylinder / sphere, Griffiths,
 * Introduction to Electrodynamics, 4th ed., Problems 2.16 and Example 2.3 (field outside
 * lambda / (2 pi eps0 r), inside rho r / (2 eps0)).
 */
import { AIR_BREAKDOWN_V_PER_M, EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult, type PhysicsWarning } from '../types';
import { fieldWarnings, requireFinite, requireNonNegative, requirePositive } from './common';

/**
 * Field at gap g outside a long uniformly charged cylinder: E = rho R^2 / (2 eps0 (R + g)); at the wall (g = 0) rho R / (2 eps0).
 * @param rhoCPerM3 space charge density rho, C/m^3
 * @param radiusM container radius R, m
 * @param gapM gap g from the wall to the meter, m
 * @returns field, V/m
 * @example bulkCylinderField(1e-5, 0.5, 0) // 2.8235e5 V/m at the wall of a 1 m diameter container at 10 uC/m^3
 */
export function bulkCylinderField(rhoCPerM3: number, radiusM: number, gapM: number): number {
  requirePositive('radiusM', radiusM);
  requireNonNegative('gapM', gapM);
  return (rhoCPerM3 * radiusM * radiusM) / (2 * EPSILON_0 * (radiusM + gapM));
}

/**
 * Field at gap g outside a uniformly charged sphere: E = rho R^3 / (3 eps0 (R + g)^2); at the wall rho R / (3 eps0).
 * @example bulkSphereField(1e-5, 0.5, 0) // 1.8823e5 V/m
 */
export function bulkSphereField(rhoCPerM3: number, radiusM: number, gapM: number): number {
  requirePositive('radiusM', radiusM);
  requireNonNegative('gapM', gapM);
  const r = radiusM + gapM;
  return (rhoCPerM3 * radiusM ** 3) / (3 * EPSILON_0 * r * r);
}

function bulkWarnings(wallFieldVPerM: number): PhysicsWarning[] {
  const out: PhysicsWarning[] = [{
    code: 'indicative-only',
    message: 'Bulk space-charge model: indicative only (uniform charge, long container, no nearby grounds). Larger containers hold less charge density before breakdown.',
  }];
  if (Math.abs(wallFieldVPerM) > AIR_BREAKDOWN_V_PER_M) {
    out.push({
      code: 'wall-field-above-breakdown',
      message: `The implied field at the wall, ${Math.abs(wallFieldVPerM).toExponential(2)} V/m, is above the breakdown field of air: discharges are likely in the container, or the model does not fit.`,
    });
  }
  return out;
}

/**
 * Space charge density from the field outside a cylinder: rho = 2 eps0 E (R + g) / R^2;
 * charge per metre lambda = rho pi R^2; chargeC = lambda L when the length is given.
 * @param fieldVPerM field, V/m
 * @param radiusM container radius R, m
 * @param gapM gap g from the wall, m
 * @param lengthM optional fill length, m
 * @returns spaceChargeDensityCPerM3 (C/m^3), lineChargeDensityCPerM (C/m), chargeC (C or null)
 * @example bulkCylinderFromField({ fieldVPerM: 2.8235e5, radiusM: 0.5, gapM: 0 }).spaceChargeDensityCPerM3 // 1e-5 C/m^3
 */
export function bulkCylinderFromField(args: { fieldVPerM: number; radiusM: number; gapM: number; lengthM?: number | null }): ModelResult {
  const { fieldVPerM, radiusM, gapM, lengthM = null } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const rho = fieldVPerM / bulkCylinderField(1, radiusM, gapM);
  res.spaceChargeDensityCPerM3 = rho;
  res.lineChargeDensityCPerM = rho * Math.PI * radiusM * radiusM;
  if (lengthM !== null) {
    requirePositive('lengthM', lengthM);
    res.chargeC = res.lineChargeDensityCPerM * lengthM;
  }
  res.warnings.push(...bulkWarnings(bulkCylinderField(rho, radiusM, 0)), ...fieldWarnings(fieldVPerM));
  return res;
}

/**
 * Space charge density from the field outside a sphere: rho = 3 eps0 E (R + g)^2 / R^3; Q = rho (4/3) pi R^3.
 * @example bulkSphereFromField({ fieldVPerM: 1.8823e5, radiusM: 0.5, gapM: 0 }).spaceChargeDensityCPerM3 // 1e-5 C/m^3
 */
export function bulkSphereFromField(args: { fieldVPerM: number; radiusM: number; gapM: number }): ModelResult {
  const { fieldVPerM, radiusM, gapM } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const rho = fieldVPerM / bulkSphereField(1, radiusM, gapM);
  res.spaceChargeDensityCPerM3 = rho;
  res.chargeC = (rho * 4 * Math.PI * radiusM ** 3) / 3;
  res.warnings.push(...bulkWarnings(bulkSphereField(rho, radiusM, 0)), ...fieldWarnings(fieldVPerM));
  return res;
}
