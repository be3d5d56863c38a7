/**
 * Physical constants and unit brands used by the estimation engine. All SI.
 *
 * Reference: CODATA 2022 recommended values (NIST, May 2024) for the vacuum
 * electric permittivity; the breakdown field of air is the usual round figure of
 * standard physics (about 3 MV/m at sea level, e.g. Wikipedia "Brush discharge");
 * the one-sided surface charge limit eps0 x 3 MV/m = 26.6 uC/m^2 matches the AIChE
 * CCPS Process Safety Glossary, "Surface Charge Density" (26.5 uC/m^2).
 */

/** A number in volts per metre. Brands are compile-time only; values stay plain numbers. */
export type VoltsPerMetre = number & { readonly __unit: 'V/m' };
/** A number in metres. */
export type Metres = number & { readonly __unit: 'm' };
/** A number in coulombs. */
export type Coulombs = number & { readonly __unit: 'C' };
/** A number in coulombs per square metre. */
export type CoulombsPerSquareMetre = number & { readonly __unit: 'C/m^2' };
/** A number in farads. */
export type Farads = number & { readonly __unit: 'F' };
/** A number in joules. */
export type Joules = number & { readonly __unit: 'J' };

/**
 * Vacuum electric permittivity eps0, in F/m (CODATA 2022: 8.8541878188e-12 F/m).
 * Note mathjs 15 still carries the CODATA 2018 value 8.8541878128e-12 (7.7e-11 relative).
 */
export const EPSILON_0 = 8.8541878188e-12;

/** Coulomb constant k = 1 / (4 pi eps0), in N m^2 / C^2 (about 8.98755e9). */
export const COULOMB_K = 1 / (4 * Math.PI * EPSILON_0);

/** Breakdown field of air at sea level, in V/m (about 3 MV/m; standard physics). */
export const AIR_BREAKDOWN_V_PER_M = 3e6;

/**
 * Largest surface charge density a single charged surface in air can hold before the
 * air breaks down, in C/m^2: eps0 x 3 MV/m = 2.656e-5 C/m^2 (26.6 uC/m^2; AIChE CCPS
 * glossary quotes 26.5 uC/m^2).
 */
export const MAX_SURFACE_CHARGE_DENSITY = EPSILON_0 * AIR_BREAKDOWN_V_PER_M;

/** One inch in metres, exact (international yard and pound agreement, 1959). */
export const INCH_M = 0.0254;
