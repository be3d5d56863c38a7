/**
 * Units a field meter reading can be entered in, and their conversion to the
 * normalized SI field in volts per metre.
 *
 * Field units: V/m, kV/m, V/cm, kV/cm, V/inch, kV/inch (1 inch = 0.0254 m exactly).
 * Surface-voltage mode ('V', 'kV'): a field meter in this mode displays
 * V = E * dCal, where dCal is its calibrated distance, whatever distance it was
 * held at. So E = V / dCal. The display equals the object's potential only for a
 * large flat target with the meter as the nearest ground; we never treat it as one.
 */
export const FIELD_UNITS = ['V/m', 'kV/m', 'V/cm', 'kV/cm', 'V/inch', 'kV/inch'] as const;
export type FieldUnit = (typeof FIELD_UNITS)[number];

/** The meter's surface-voltage mode, in volts or kilovolts at its calibrated distance. */
export const SURFACE_VOLTAGE_UNITS = ['V', 'kV'] as const;
export type SurfaceVoltageUnit = (typeof SURFACE_VOLTAGE_UNITS)[number];

export const READING_UNITS = [...FIELD_UNITS, ...SURFACE_VOLTAGE_UNITS] as const;
export type ReadingUnit = (typeof READING_UNITS)[number];

/** Volts per metre for one unit of each field unit. Exact. */
export const VOLTS_PER_METRE_PER_FIELD_UNIT: Readonly<Record<FieldUnit, number>> = {
  'V/m': 1,
  'kV/m': 1e3,
  'V/cm': 1e2,
  'kV/cm': 1e5,
  'V/inch': 1 / 0.0254,
  'kV/inch': 1e3 / 0.0254,
};

/** Volts per one unit of each surface-voltage unit. */
export const VOLTS_PER_SURFACE_VOLTAGE_UNIT: Readonly<Record<SurfaceVoltageUnit, number>> = {
  V: 1,
  kV: 1e3,
};

export function isFieldUnit(u: unknown): u is FieldUnit {
  return typeof u === 'string' && (FIELD_UNITS as readonly string[]).includes(u);
}

export function isSurfaceVoltageUnit(u: unknown): u is SurfaceVoltageUnit {
  return typeof u === 'string' && (SURFACE_VOLTAGE_UNITS as readonly string[]).includes(u);
}

export function isReadingUnit(u: unknown): u is ReadingUnit {
  return isFieldUnit(u) || isSurfaceVoltageUnit(u);
}

/**
 * Converts a field value in a field unit to V/m.
 * @example fieldToVoltsPerMetre(125, 'V/inch') // 4921.259842519685
 */
export function fieldToVoltsPerMetre(value: number, unit: FieldUnit): number {
  return value * VOLTS_PER_METRE_PER_FIELD_UNIT[unit];
}

/**
 * Converts V/m to a field unit for display.
 * @example voltsPerMetreToField(4921.259842519685, 'V/inch') // 125
 */
export function voltsPerMetreToField(vPerM: number, unit: FieldUnit): number {
  return vPerM / VOLTS_PER_METRE_PER_FIELD_UNIT[unit];
}

/**
 * Field at the meter from a surface-voltage-mode display: E = V / dCal.
 * @param value display value in `unit` (V or kV)
 * @param calibratedDistanceM the meter's calibrated distance in metres (> 0)
 * @example surfaceVoltageToVoltsPerMetre(1, 'kV', 0.0254) // 39370.07874015748 V/m
 */
export function surfaceVoltageToVoltsPerMetre(
  value: number,
  unit: SurfaceVoltageUnit,
  calibratedDistanceM: number,
): number {
  if (!(calibratedDistanceM > 0) || !Number.isFinite(calibratedDistanceM)) {
    throw new RangeError('surface-voltage mode requires the meter calibrated distance (m) > 0');
  }
  return (value * VOLTS_PER_SURFACE_VOLTAGE_UNIT[unit]) / calibratedDistanceM;
}

export type Polarity = '+' | '-';

/**
 * Normalizes a reading as entered (magnitude, unit, polarity) to the signed field in V/m.
 * Surface-voltage units need the meter's calibrated distance.
 * @example normalizeReading({ value: 2, unit: 'kV/inch', polarity: '-' }) // -78740.15748031496
 */
export function normalizeReading(input: {
  value: number;
  unit: ReadingUnit;
  polarity: Polarity;
  calibratedDistanceM?: number | null;
}): number {
  const sign = input.polarity === '-' ? -1 : 1;
  if (isSurfaceVoltageUnit(input.unit)) {
    return sign * surfaceVoltageToVoltsPerMetre(input.value, input.unit, input.calibratedDistanceM ?? NaN);
  }
  return sign * fieldToVoltsPerMetre(input.value, input.unit);
}

/**
 * What a meter in surface-voltage mode with calibrated distance dCal would display
 * for a field E: V = E * dCal.
 */
export function fieldToSurfaceVoltageV(fieldVPerM: number, calibratedDistanceM: number): number {
  return fieldVPerM * calibratedDistanceM;
}
