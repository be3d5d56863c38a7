/**
 * Uniformly charged disk of radius R, meter on its axis at distance z.
 *
 * Reference: Griffiths, Introduction to Electrodynamics, 4th ed., Problem 2.6 (field
 * above a uniformly charged disk); isolated conducting disk capacitance C = 8 eps0 R,
 * Jackson, Classical Electrodynamics, 3rd ed., section 3.13 (also Smythe, Static and
 * Dynamic Electricity, 3rd ed., 5.02). The uniform-density disk is not the conductor's
 * charge distribution; the capacitance is used for the potential and energy as if the
 * charge could move (indicative for insulators).
 */
import { EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { densityWarnings, fieldWarnings, requireFinite, requirePositive, withCapacitance } from './common';

/**
 * On-axis field: E = sigma / (2 eps0) x (1 - z / sqrt(z^2 + R^2)). Near: sigma / (2 eps0);
 * far: k Q / z^2 with Q = sigma pi R^2.
 * @param sigma surface charge density, C/m^2 (signed)
 * @param radiusM disk radius R, m
 * @param zM distance z from the disk to the meter on its axis, m
 * @returns field, V/m
 * @example diskAxisField(1e-6, 0.1, 0.05) // 3.12161e4 V/m
 */
export function diskAxisField(sigma: number, radiusM: number, zM: number): number {
  requirePositive('radiusM', radiusM);
  requirePositive('zM', zM);
  // 1 - z/sqrt(z^2+R^2) = R^2 / (sqrt(z^2+R^2) (sqrt(z^2+R^2) + z)): no cancellation far away.
  const s = Math.sqrt(zM * zM + radiusM * radiusM);
  return (sigma / (2 * EPSILON_0)) * ((radiusM * radiusM) / (s * (s + zM)));
}

/**
 * Isolated conducting disk capacitance: C = 8 eps0 R.
 * @example diskCapacitance(0.1) // 7.0834e-12 F
 */
export function diskCapacitance(radiusM: number): number {
  requirePositive('radiusM', radiusM);
  return 8 * EPSILON_0 * radiusM;
}

/**
 * Disk density from the on-axis field: sigma = 2 eps0 E / (1 - z / sqrt(z^2 + R^2));
 * Q = sigma pi R^2; C = 8 eps0 R; V = Q / C; W = Q^2 / (2 C).
 * @param fieldVPerM field, V/m (signed)
 * @param radiusM R, m
 * @param gapM z, m
 * @returns surfaceChargeDensityCPerM2, chargeC, capacitanceF, potentialV, energyJ
 * @example diskFromField({ fieldVPerM: 3.12161e4, radiusM: 0.1, gapM: 0.05 }).surfaceChargeDensityCPerM2 // 1e-6 C/m^2
 */
export function diskFromField(args: { fieldVPerM: number; radiusM: number; gapM: number }): ModelResult {
  const { fieldVPerM, radiusM, gapM } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const sigma = fieldVPerM / diskAxisField(1, radiusM, gapM);
  const q = sigma * Math.PI * radiusM * radiusM;
  res.surfaceChargeDensityCPerM2 = sigma;
  res.chargeC = q;
  withCapacitance(res, q, diskCapacitance(radiusM));
  res.warnings.push(...fieldWarnings(fieldVPerM), ...densityWarnings(sigma));
  return res;
}
