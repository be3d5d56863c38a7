/**
 * Distance units a surveyor may enter, and their exact factors to metres.
 *
 * 1 inch = 0.0254 m exactly (international yard and pound agreement, 1959).
 */
export const DISTANCE_UNITS = ['mm', 'cm', 'm', 'inch'] as const;
export type DistanceUnit = (typeof DISTANCE_UNITS)[number];

/** Metres per one unit. */
export const METRES_PER_DISTANCE_UNIT: Readonly<Record<DistanceUnit, number>> = {
  mm: 0.001,
  cm: 0.01,
  m: 1,
  inch: 0.0254,
};

/**
 * Converts a distance as entered to metres.
 * @example distanceToMetres(1, 'inch') // 0.0254
 */
export function distanceToMetres(value: number, unit: DistanceUnit): number {
  return value * METRES_PER_DISTANCE_UNIT[unit];
}

/**
 * Converts metres to a display unit.
 * @example metresToDistance(0.0254, 'inch') // 1
 */
export function metresToDistance(metres: number, unit: DistanceUnit): number {
  return metres / METRES_PER_DISTANCE_UNIT[unit];
}

export function isDistanceUnit(u: unknown): u is DistanceUnit {
  return typeof u === 'string' && (DISTANCE_UNITS as readonly string[]).includes(u);
}
