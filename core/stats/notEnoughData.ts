/**
 * The answer of a statistical summary that cannot be computed from the data it was
 * given: too few points, no variation, or every point at one time. It carries a plain
 * reason that the review and trend screens show as-is, instead of a NaN.
 *
 * `n` is the number of usable points that were seen (after any exclusions).
 *
 * Example: `notEnoughData('needs at least 3 readings, got 2', 2)` gives
 * `{ status: 'not-enough-data', reason: 'needs at least 3 readings, got 2', n: 2 }`.
 */
export interface NotEnoughData {
  readonly status: 'not-enough-data';
  readonly reason: string;
  readonly n: number;
}

/** Builds a {@link NotEnoughData} result. */
export function notEnoughData(reason: string, n: number): NotEnoughData {
  return { status: 'not-enough-data', reason, n };
}
