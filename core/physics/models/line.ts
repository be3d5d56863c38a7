/**
 * Uniformly charged straight line of length L (a roll, hose, pipe or cylinder of
 * radius a), meter on the perpendicular bisector at distance rho = a + g from the axis.
 *
 * Reference: field of a finite line charge on its bisector, Griffiths, Introduction
 * to Electrodynamics, 4th ed., Example 2.2 (E = lambda L / (4 pi eps0 z sqrt(z^2 + L^2/4)))
 * and its infinite limit lambda / (2 pi eps0 z). Capacitance of an isolated thin
 * cylinder: average-potential (Howe) approximation C = 2 pi eps0 L / (ln(L/a) - (1 - ln 2)),
 * which agrees with the leading terms of the expansion in J. D. Jackson, "Charge density
 * on thin straight wire, revisited", Am. J. Phys. 68 (2000) 789.
 */
import { EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { densityWarnings, fieldWarnings, requireFinite, requireNonNegative, requirePositive, withCapacitance } from './common';

/** The thin-cylinder capacitance approximation is only used when L >= this multiple of a. */
export const LINE_CAPACITANCE_MIN_ASPECT = 10;

/**
 * Field of a finite line on its perpendicular bisector:
 * E = lambda / (2 pi eps0 rho) x (L/2) / sqrt(rho^2 + (L/2)^2).
 * @param lineChargeDensityCPerM lambda, C/m (signed)
 * @param lengthM line length L, m
 * @param rhoM distance rho from the axis to the meter, m
 * @returns field, V/m
 * @example finiteLineField(1e-7, 1, 0.05) // 3.57718e4 V/m
 */
export function finiteLineField(lineChargeDensityCPerM: number, lengthM: number, rhoM: number): number {
  requirePositive('lengthM', lengthM);
  requirePositive('rhoM', rhoM);
  const h = lengthM / 2;
  return (lineChargeDensityCPerM / (2 * Math.PI * EPSILON_0 * rhoM)) * (h / Math.sqrt(rhoM * rhoM + h * h));
}

/**
 * Field of an infinitely long line: E = lambda / (2 pi eps0 rho).
 * @example infiniteLineField(1e-7, 0.05) // 3.5950e4 V/m
 */
export function infiniteLineField(lineChargeDensityCPerM: number, rhoM: number): number {
  requirePositive('rhoM', rhoM);
  return lineChargeDensityCPerM / (2 * Math.PI * EPSILON_0 * rhoM);
}

/**
 * Approximate capacitance of an isolated thin cylinder of length L and radius a:
 * C = 2 pi eps0 L / (ln(L/a) - (1 - ln 2)); used when L >= 10 a, else null.
 * @param lengthM L, m
 * @param radiusM a, m
 * @returns capacitance, F, or null when the approximation does not hold
 * @example cylinderCapacitance(1, 0.05) // 2.0690e-11 F (about 21 pF for a 1 m roll of 10 cm diameter)
 */
export function cylinderCapacitance(lengthM: number, radiusM: number): number | null {
  requirePositive('lengthM', lengthM);
  requireNonNegative('radiusM', radiusM);
  if (radiusM === 0 || lengthM < LINE_CAPACITANCE_MIN_ASPECT * radiusM) return null;
  return (2 * Math.PI * EPSILON_0 * lengthM) / (Math.log(lengthM / radiusM) - (1 - Math.LN2));
}

/**
 * Line charge from the field on the bisector: lambda = 2 pi eps0 rho E sqrt(rho^2 + (L/2)^2) / (L/2),
 * rho = a + g; Q = lambda L; sigma = lambda / (2 pi a) on the outer surface (a > 0);
 * with the thin-cylinder capacitance (L >= 10 a) also V = Q / C and W = Q^2 / (2 C).
 *
 * @param fieldVPerM field, V/m (signed)
 * @param lengthM length L, m
 * @param radiusM cylinder radius a, m (0 for a thin line)
 * @param gapM gap g from the surface to the meter, m
 * @returns chargeC (C), lineChargeDensityCPerM (C/m), surfaceChargeDensityCPerM2 (C/m^2), capacitanceF, potentialV, energyJ
 * @example lineFromField({ fieldVPerM: 3.57718e4, lengthM: 1, radiusM: 0, gapM: 0.05 }).lineChargeDensityCPerM // 1e-7 C/m
 */
export function lineFromField(args: { fieldVPerM: number; lengthM: number; radiusM: number; gapM: number }): ModelResult {
  const { fieldVPerM, lengthM, radiusM, gapM } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  requireNonNegative('radiusM', radiusM);
  requireNonNegative('gapM', gapM);
  const rho = radiusM + gapM;
  requirePositive('radiusM + gapM', rho);
  const res = emptyResult();
  const lambda = fieldVPerM / finiteLineField(1, lengthM, rho);
  const q = lambda * lengthM;
  res.lineChargeDensityCPerM = lambda;
  res.chargeC = q;
  if (radiusM > 0) res.surfaceChargeDensityCPerM2 = lambda / (2 * Math.PI * radiusM);
  const c = cylinderCapacitance(lengthM, radiusM);
  if (c !== null) {
    withCapacitance(res, q, c);
  } else {
    res.warnings.push({
      code: 'no-capacitance',
      message: `No capacitance reported: the thin-cylinder approximation needs a radius above zero and a length at least ${LINE_CAPACITANCE_MIN_ASPECT}x the radius.`,
    });
  }
  if (rho > lengthM / 3) {
    res.warnings.push({
      code: 'line-short',
      message: `The meter is more than a third of the line's length from its axis: the line looks more like a point charge from here.`,
    });
  }
  res.warnings.push(...fieldWarnings(fieldVPerM), ...densityWarnings(res.surfaceChargeDensityCPerM2));
  return res;
}
