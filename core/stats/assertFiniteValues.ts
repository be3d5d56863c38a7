/**
 * Throws a short clear error when `values` holds a NaN or an infinity, naming the
 * function and the first offending index. Statistics in core/ never turn bad input
 * into NaN output; data from the outside is validated at the edge, so reaching this
 * is a programming error.
 *
 * Example: `assertFiniteValues([1, NaN], 'mean')` throws
 * "mean requires finite values (index 1 is NaN)".
 */
export function assertFiniteValues(values: ArrayLike<number>, functionName: string): void {
  for (let i = 0; i < values.length; i++) {
    const v = values[i] as number;
    if (!Number.isFinite(v)) {
      throw new RangeError(`${functionName} requires finite values (index ${i} is ${String(v)})`);
    }
  }
}
