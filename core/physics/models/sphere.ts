/**
 * Charged sphere (conducting, or any spherically symmetric charge) of radius a.
 *
 * Reference: Gauss's law, Griffiths, Introduction to Electrodynamics, 4th ed.,
 * Example 2.3 (field outside a sphere) and Problem 2.46 / section 2.5.4 (capacitance
 * of an isolated sphere C = 4 pi eps0 a).
 */
import { COULOMB_K, EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { densityWarnings, fieldWarnings, geometryFactorWarnings, requireFinite, requireNonNegative, requirePositive, withCapacitance } from './common';

/**
 * Capacitance of an isolated sphere: C = 4 pi eps0 a.
 * @param radiusM sphere radius a, m
 * @returns capacitance, F
 * @example sphereCapacitance(1) // 1.11265e-10 F (111 pF per metre of radius)
 */
export function sphereCapacitance(radiusM: number): number {
  requirePositive('radiusM', radiusM);
  return 4 * Math.PI * EPSILON_0 * radiusM;
}

/**
 * Field outside a charged sphere at gap g from its surface: E = k Q / (a + g)^2
 * (exact outside a spherically symmetric charge).
 * @param chargeC total charge Q, C (signed)
 * @param radiusM radius a, m
 * @param gapM gap g from the surface to the meter, m (>= 0)
 * @returns field at the meter, V/m
 * @example sphereField(1e-8, 0.1, 0.1) // 2246.89 V/m
 */
export function sphereField(chargeC: number, radiusM: number, gapM: number): number {
  requirePositive('radiusM', radiusM);
  requireNonNegative('gapM', gapM);
  const r = radiusM + gapM;
  return (COULOMB_K * chargeC) / (r * r);
}

/**
 * Charge of a sphere from the field at gap g: Q = 4 pi eps0 (a + g)^2 E / f; then
 * sigma = Q / (4 pi a^2), C = 4 pi eps0 a, V = Q / C, W = Q^2 / (2 C).
 *
 * @param fieldVPerM field at the meter, V/m (signed)
 * @param radiusM sphere radius a, m
 * @param gapM gap g between the sphere's surface and the meter, m
 * @param geometryFactor meter geometry factor f, 1..2 (divides the charge)
 * @returns chargeC (C), surfaceChargeDensityCPerM2 (C/m^2), capacitanceF (F), potentialV (V), energyJ (J)
 * @example sphereFromField({ fieldVPerM: 2246.89, radiusM: 0.1, gapM: 0.1 })
 *   // chargeC 1e-8 C, capacitanceF 1.11265e-11 F, potentialV 898.8 V, energyJ 4.494e-6 J
 */
export function sphereFromField(args: { fieldVPerM: number; radiusM: number; gapM: number; geometryFactor?: number }): ModelResult {
  const { fieldVPerM, radiusM, gapM, geometryFactor = 1 } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  requirePositive('radiusM', radiusM);
  requireNonNegative('gapM', gapM);
  const res = emptyResult();
  const r = radiusM + gapM;
  const q = (4 * Math.PI * EPSILON_0 * r * r * fieldVPerM) / geometryFactor;
  res.chargeC = q;
  res.surfaceChargeDensityCPerM2 = q / (4 * Math.PI * radiusM * radiusM);
  withCapacitance(res, q, sphereCapacitance(radiusM));
  res.warnings.push(...geometryFactorWarnings(geometryFactor), ...fieldWarnings(fieldVPerM), ...densityWarnings(res.surfaceChargeDensityCPerM2));
  return res;
}
