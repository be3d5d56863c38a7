/**
 * Sizes of the groups of tied (exactly equal) values in a sample, for the tie
 * corrections of Kendall's S. Only groups of two or more are returned, in
 * ascending order of value.
 *
 * Formula in words: sort a copy, walk it, and record the length of every run of
 * equal values that is longer than one.
 *
 * Units: counts. Values are compared exactly: 1.2 and 1.2000001 are not tied, so
 * round readings to the meter's resolution before testing if that is meant.
 *
 * Reference: M. G. Kendall (1975), Rank Correlation Methods, 4th ed., ch. 3;
 * R. O. Gilbert (1987), Statistical Methods for Environmental Pollution
 * Monitoring, 16.4 (t_p, the number of data in the p-th tied group).
 *
 * Example: `tieGroupSizes([5, 3, 5, 7, 3, 5])` is [2, 3] (two 3s, three 5s).
 */
export function tieGroupSizes(values: ArrayLike<number>): number[] {
  const sorted = Float64Array.from(values).sort();
  const sizes: number[] = [];
  let run = 1;
  for (let i = 1; i <= sorted.length; i++) {
    if (i < sorted.length && sorted[i] === sorted[i - 1]) {
      run++;
    } else {
      if (run > 1) sizes.push(run);
      run = 1;
    }
  }
  return sizes;
}
