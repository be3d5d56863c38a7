/**
 * Charged insulating layer (thickness t, relative permittivity eps_r) on a grounded
 * backing, with the charge on its outer face and a grounded meter at air gap d.
 *
 * Reference: two capacitors in parallel from the charged surface to ground (the layer,
 * eps0 eps_r / t, and the air gap, eps0 / d): sigma = eps0 E (1 + eps_r d / t);
 * Griffiths, Introduction to Electrodynamics, 4th ed., section 4.4 (dielectrics, D
 * boundary condition). The thin-layer case is NFPA 77 (2000) 4.3.7's propagating brush.
 */
import { EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { fieldWarnings, requireFinite, requirePositive } from './common';

/**
 * Field in the air gap: E = sigma / (eps0 (1 + eps_r d / t)).
 * @param sigma surface charge density, C/m^2
 * @param thicknessM layer thickness t, m
 * @param relativePermittivity eps_r (>= 1)
 * @param gapM air gap d to the grounded meter, m
 * @returns field, V/m
 * @example layerOnGroundField(1e-4, 100e-6, 3, 0.025) // 1.50387e4 V/m: 100 uC/m^2 on a 100 um film reads only 15 kV/m
 */
export function layerOnGroundField(sigma: number, thicknessM: number, relativePermittivity: number, gapM: number): number {
  requirePositive('thicknessM', thicknessM);
  requirePositive('relativePermittivity', relativePermittivity);
  requirePositive('gapM', gapM);
  return sigma / (EPSILON_0 * (1 + (relativePermittivity * gapM) / thicknessM));
}

/**
 * Density from the field: sigma = eps0 E (1 + eps_r d / t). No single charge or capacitance (null).
 * The air-breakdown density check does not apply: the backing binds the charge.
 * @returns surfaceChargeDensityCPerM2, C/m^2
 * @example layerOnGroundFromField({ fieldVPerM: 1.50387e4, thicknessM: 100e-6, relativePermittivity: 3, gapM: 0.025 }).surfaceChargeDensityCPerM2 // 1e-4 C/m^2
 */
export function layerOnGroundFromField(args: { fieldVPerM: number; thicknessM: number; relativePermittivity: number; gapM: number }): ModelResult {
  const { fieldVPerM, thicknessM, relativePermittivity, gapM } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  res.surfaceChargeDensityCPerM2 = fieldVPerM / layerOnGroundField(1, thicknessM, relativePermittivity, gapM);
  const gain = 1 + (relativePermittivity * gapM) / thicknessM;
  if (gain > 10) {
    res.warnings.push({
      code: 'thin-layer-reads-low',
      message: `A thin layer on a grounded backing reads low: the charge is ${gain.toPrecision(3)}x what the same field would mean on an isolated surface (the propagating-brush case).`,
    });
  }
  res.warnings.push(...fieldWarnings(fieldVPerM));
  return res;
}
