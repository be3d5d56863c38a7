/**
 * Isolated conductor of known capacitance C with a potential reading V (contact
 * voltmeter, or inferred).
 *
 * Reference: Q = C V and W = C V^2 / 2 = Q^2 / (2 C), Griffiths, Introduction to
 * Electrodynamics, 4th ed., section 2.5.4; capacitances of objects: NFPA 77 (2000)
 * Table A.3.1.5.
 */
import { emptyResult, type ModelResult } from '../types';
import { requireFinite, requirePositive } from './common';

/**
 * Charge and stored energy of a conductor: Q = C V, W = C V^2 / 2.
 * @param potentialV potential against earth, V (signed)
 * @param capacitanceF capacitance to earth, F
 * @returns chargeC (C), potentialV (V), capacitanceF (F), energyJ (J)
 * @example conductorFromPotential({ potentialV: 10e3, capacitanceF: 200e-12 }) // chargeC 2e-6 C, energyJ 0.01 J (a person at 10 kV)
 */
export function conductorFromPotential(args: { potentialV: number; capacitanceF: number }): ModelResult {
  const { potentialV, capacitanceF } = args;
  requireFinite('potentialV', potentialV);
  requirePositive('capacitanceF', capacitanceF);
  const res = emptyResult();
  res.chargeC = capacitanceF * potentialV;
  res.potentialV = potentialV;
  res.capacitanceF = capacitanceF;
  res.energyJ = (capacitanceF * potentialV * potentialV) / 2;
  return res;
}

/**
 * Potential at which a conductor's spark reaches an energy: V = sqrt(2 W / C).
 * @param energyJ W, J
 * @param capacitanceF C, F
 * @returns V
 * @example potentialForEnergy(0.25e-3, 200e-12) // 1581.1 V (propane's MIE on a person)
 */
export function potentialForEnergy(energyJ: number, capacitanceF: number): number {
  requirePositive('capacitanceF', capacitanceF);
  if (!(energyJ >= 0)) throw new RangeError('energyJ must be zero or more');
  return Math.sqrt((2 * energyJ) / capacitanceF);
}
