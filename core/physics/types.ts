/**
 * Shared result shapes of the physics models. Every quantity is SI and signed
 * (polarity kept); null means the model's geometry does not define it.
 */

/** A validity or plausibility note on an estimate: a kebab-case code and a plain sentence. */
export interface PhysicsWarning {
  code: string;
  message: string;
}

/** The names of the derived quantities, in the order the API lists them. */
export const QUANTITY_NAMES = [
  'chargeC',
  'surfaceChargeDensityCPerM2',
  'lineChargeDensityCPerM',
  'dipoleMomentCM',
  'spaceChargeDensityCPerM3',
  'potentialV',
  'capacitanceF',
  'energyJ',
] as const;
export type QuantityName = (typeof QUANTITY_NAMES)[number];

/** Every quantity an estimate can report; null where the model does not define it. */
export type Quantities = Record<QuantityName, number | null>;

/** What every inverse model function returns. */
export interface ModelResult extends Quantities {
  warnings: PhysicsWarning[];
}

/** A result with every quantity null and no warnings, to fill in. */
export function emptyResult(): ModelResult {
  return {
    chargeC: null,
    surfaceChargeDensityCPerM2: null,
    lineChargeDensityCPerM: null,
    dipoleMomentCM: null,
    spaceChargeDensityCPerM3: null,
    potentialV: null,
    capacitanceF: null,
    energyJ: null,
    warnings: [],
  };
}
