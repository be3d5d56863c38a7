/**
 * Uniformly charged rectangle 2a x 2b, meter on its central axis at distance z.
 *
 * Reference: the normal field of a uniformly charged plane region is
 * E = sigma Omega / (4 pi eps0), with Omega the solid angle it subtends (Coulomb's law
 * integrated over the area, Griffiths, Introduction to Electrodynamics, 4th ed., eq. 2.8);
 * a rectangle seen from its central axis subtends Omega = 4 atan(a b / (z sqrt(a^2 + b^2 + z^2))).
 * Capacitance: not defined here (null).
 */
import { EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { densityWarnings, fieldWarnings, requireFinite, requirePositive } from './common';

/**
 * On-axis field: E = sigma / (pi eps0) x atan(a b / (z sqrt(a^2 + b^2 + z^2))), a = width/2, b = height/2.
 * Near: sigma / (2 eps0); far: k Q / z^2 with Q = sigma x width x height.
 * @param sigma surface charge density, C/m^2
 * @param widthM full width 2a, m
 * @param heightM full height 2b, m
 * @param zM distance on the axis, m
 * @returns field, V/m
 * @example rectangleAxisField(1e-6, 0.2, 0.2, 0.05) // 3.33365e4 V/m
 */
export function rectangleAxisField(sigma: number, widthM: number, heightM: number, zM: number): number {
  requirePositive('widthM', widthM);
  requirePositive('heightM', heightM);
  requirePositive('zM', zM);
  const a = widthM / 2;
  const b = heightM / 2;
  return (sigma / (Math.PI * EPSILON_0)) * Math.atan((a * b) / (zM * Math.sqrt(a * a + b * b + zM * zM)));
}

/**
 * Density from the field: sigma = pi eps0 E / atan(a b / (z sqrt(a^2 + b^2 + z^2))); Q = sigma x width x height.
 * @returns surfaceChargeDensityCPerM2 (C/m^2), chargeC (C); no capacitance
 * @example rectangleFromField({ fieldVPerM: 3.33365e4, widthM: 0.2, heightM: 0.2, gapM: 0.05 }).chargeC // 4e-8 C
 */
export function rectangleFromField(args: { fieldVPerM: number; widthM: number; heightM: number; gapM: number }): ModelResult {
  const { fieldVPerM, widthM, heightM, gapM } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const sigma = fieldVPerM / rectangleAxisField(1, widthM, heightM, gapM);
  res.surfaceChargeDensityCPerM2 = sigma;
  res.chargeC = sigma * widthM * heightM;
  res.warnings.push(...fieldWarnings(fieldVPerM), ...densityWarnings(sigma));
  return res;
}
