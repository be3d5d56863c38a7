/**
 * Large charged sheet, web or panel (distance small against its size).
 *
 * Reference: isolated sheet E = sigma / (2 eps0), Griffiths, Introduction to
 * Electrodynamics, 4th ed., Example 2.5. Three-plane model (grounded meter face at gap a
 * in front, ground at distance b behind, charge sigma between): the charge splits in
 * inverse proportion to the gaps, sigma_front = sigma b / (a + b), so the field in the
 * front gap is E = sigma b / (eps0 (a + b)) (parallel-plate superposition, Griffiths
 * section 2.5.4; NFPA 77 (2000) 5.4.2-5.4.3 on grounds near the measured web).
 */
import { EPSILON_0 } from '../constants';
import { emptyResult, type ModelResult } from '../types';
import { densityWarnings, fieldWarnings, requireFinite, requirePositive } from './common';

/**
 * Field in front of a large sheet: isolated E = sigma / (2 eps0); with a ground at b
 * behind and the grounded meter at gap a, E = sigma b / (eps0 (a + b)).
 * @param sigma surface charge density, C/m^2
 * @param gapM gap a from the sheet to the meter, m
 * @param groundBehindM distance b from the sheet to the ground behind it, m, or null (isolated)
 * @returns field, V/m
 * @example sheetField(1e-6, 0.025, null) // 5.6470e4 V/m; sheetField(1e-6, 0.025, 0.025) // same (b = a)
 */
export function sheetField(sigma: number, gapM: number, groundBehindM: number | null = null): number {
  requirePositive('gapM', gapM);
  if (groundBehindM === null) return sigma / (2 * EPSILON_0);
  requirePositive('groundBehindM', groundBehindM);
  return (sigma * groundBehindM) / (EPSILON_0 * (gapM + groundBehindM));
}

/**
 * Surface charge density of a sheet: isolated sigma = 2 eps0 E; three-plane
 * sigma = eps0 E (a + b) / b. chargeC is null (no area given).
 * @param fieldVPerM field, V/m
 * @param gapM gap a, m
 * @param groundBehindM distance b to the ground behind, m, or null
 * @param widthM optional smallest lateral size of the sheet, m ('sheet-too-small' when the gap exceeds a tenth of it)
 * @returns surfaceChargeDensityCPerM2, C/m^2
 * @example sheetFromField({ fieldVPerM: 1e5, gapM: 0.025 }).surfaceChargeDensityCPerM2 // 1.77084e-6 C/m^2
 */
export function sheetFromField(args: { fieldVPerM: number; gapM: number; groundBehindM?: number | null; widthM?: number | null }): ModelResult {
  const { fieldVPerM, gapM, groundBehindM = null, widthM = null } = args;
  requireFinite('fieldVPerM', fieldVPerM);
  const res = emptyResult();
  const sigma = fieldVPerM / sheetField(1, gapM, groundBehindM);
  res.surfaceChargeDensityCPerM2 = sigma;
  if (groundBehindM === null) {
    res.warnings.push({
      code: 'no-ground-behind-given',
      message: 'No distance to a ground behind the sheet was given: the isolated-sheet value 2 eps0 E is reported; the true value may be as low as half of it (eps0 E) if the meter is the nearest ground, or much higher if a ground lies close behind.',
    });
  } else if (groundBehindM < gapM) {
    res.warnings.push({
      code: 'ground-behind-reads-low',
      message: `A ground lies closer behind the sheet (${groundBehindM} m) than the meter in front (${gapM} m): the reading is low although the charge is there; do not read it as 'no charge'. Measure free spans, not over rollers.`,
    });
  }
  if (widthM !== null && gapM > widthM / 10) {
    res.warnings.push({
      code: 'sheet-too-small',
      message: `The gap (${gapM} m) is more than a tenth of the sheet's size (${widthM} m): the sheet formula reads low; use the rectangle or disk model.`,
    });
  }
  res.warnings.push(...fieldWarnings(fieldVPerM), ...densityWarnings(sigma));
  return res;
}

/**
 * Charge current carried off a process by a moving charged web: I = sigma w v
 * (the charge a moving web carries off, as a current). It sizes a neutraliser (which must deliver the same
 * current of the opposite sign) and makes lines at different speeds comparable.
 * A web charged + on one face and - on the other (a double layer) reads near zero
 * on a field meter yet can discharge: its sigma, and so this current, is then not
 * what the meter sees.
 * Reference: conservation of charge (charge per unit area times area swept per
 * second); worked example (arithmetic): 5 uC/m^2 on a 1.5 m web at 4 m/s = 30 uA.
 * @param sigmaCPerM2 surface charge density, C/m^2 (signed)
 * @param widthM web width, m
 * @param speedMPerS line speed, m/s (0 gives 0: a stopped web carries no current)
 * @returns current, A (signed as sigma)
 * @example webChargeCurrentA(5e-6, 1.5, 4) // 3e-5 A (30 uA)
 */
export function webChargeCurrentA(sigmaCPerM2: number, widthM: number, speedMPerS: number): number {
  requireFinite('sigmaCPerM2', sigmaCPerM2);
  requirePositive('widthM', widthM);
  requireFinite('speedMPerS', speedMPerS);
  if (speedMPerS < 0) throw new RangeError('speedMPerS must be zero or positive');
  return sigmaCPerM2 * widthM * speedMPerS;
}
