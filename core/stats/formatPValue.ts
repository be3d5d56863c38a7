/**
 * A p-value as people write it in a report: "p < 0.001", "p = 0.003",
 * "p = 0.049", "p = 0.41".
 *
 * Formula in words: below 0.001 say "< 0.001"; below 0.1 give three decimals;
 * otherwise two decimals (APA style, 7th ed., 6.36).
 *
 * Units: p is a probability in [0, 1]. Throws outside [0, 1] or NaN.
 *
 * Reference: American Psychological Association (2020), Publication Manual, 7th
 * ed., 6.36 (statistics in text).
 *
 * Example: `formatPValue(0.0031)` is "p = 0.003".
 */
export function formatPValue(p: number): string {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`formatPValue requires p in [0, 1], got ${String(p)}`);
  if (p < 0.001) return 'p < 0.001';
  // 0.0995 and up would print as "0.100" with three decimals.
  if (p < 0.0995) return `p = ${p.toFixed(3)}`;
  return `p = ${p.toFixed(2)}`;
}
