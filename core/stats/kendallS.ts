/**
 * Kendall's S for paired data: concordant minus discordant pairs, pairs tied in
 * x or in y counting 0. Without `xs` the values are taken in their given order
 * (x = 0, 1, 2, ...), which is the Mann–Kendall S. Runs in O(n log n).
 *
 * Formula in words: S = sum over i < j of sign(x_j - x_i) sign(y_j - y_i).
 * Computed by Knight's method: sort the points by x, then by y; count the
 * discordant pairs as the inversions of the y sequence with a merge sort (D);
 * then S = N0 - Nx - Ny + Nxy - 2 D, with N0 = n(n-1)/2 and Nx, Ny, Nxy the
 * pairs tied in x, in y, and in both.
 *
 * Units: a count of pairs. Values are compared exactly. The caller checks that
 * the inputs are finite and of equal length.
 *
 * Reference: W. R. Knight (1966), "A computer method for calculating Kendall's
 * tau with ungrouped data", JASA 61(314):436–439 (the same method as
 * scipy.stats.kendalltau); M. G. Kendall (1975), Rank Correlation Methods.
 *
 * Example: `kendallS([1, 2, 2, 3, 3, 3, 4])` is 17 (21 pairs, none falling, 4 tied).
 */
export function kendallS(ys: ArrayLike<number>, xs?: ArrayLike<number>): number {
  const n = ys.length;
  if (n < 2) return 0;
  const order = Array.from({ length: n }, (_, i) => i);
  if (xs !== undefined) {
    order.sort((a, b) => (xs[a] as number) - (xs[b] as number) || (ys[a] as number) - (ys[b] as number));
  }
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = ys[order[i] as number] as number;

  // Pairs tied in x, and tied in both x and y (runs in the (x, y) order).
  let tiedX = 0;
  let tiedXY = 0;
  if (xs !== undefined) {
    let runX = 1;
    let runXY = 1;
    for (let i = 1; i <= n; i++) {
      const sameX = i < n && xs[order[i] as number] === xs[order[i - 1] as number];
      const sameXY = sameX && y[i] === y[i - 1];
      if (sameX) runX++;
      else {
        tiedX += (runX * (runX - 1)) / 2;
        runX = 1;
      }
      if (sameXY) runXY++;
      else {
        tiedXY += (runXY * (runXY - 1)) / 2;
        runXY = 1;
      }
    }
  }

  const discordant = countInversions(y);

  // Pairs tied in y: y is now sorted by the merge sort.
  let tiedY = 0;
  let runY = 1;
  for (let i = 1; i <= n; i++) {
    if (i < n && y[i] === y[i - 1]) runY++;
    else {
      tiedY += (runY * (runY - 1)) / 2;
      runY = 1;
    }
  }
  return (n * (n - 1)) / 2 - tiedX - tiedY + tiedXY - 2 * discordant;
}

/** Sorts `a` ascending in place (bottom-up merge sort) and returns the number of strict inversions. */
function countInversions(a: Float64Array<ArrayBuffer>): number {
  const n = a.length;
  let src: Float64Array<ArrayBuffer> = a;
  let dst = new Float64Array(n);
  let inversions = 0;
  for (let width = 1; width < n; width *= 2) {
    for (let lo = 0; lo < n; lo += 2 * width) {
      const mid = Math.min(lo + width, n);
      const hi = Math.min(lo + 2 * width, n);
      let i = lo;
      let j = mid;
      let k = lo;
      while (i < mid && j < hi) {
        const left = src[i] as number;
        const right = src[j] as number;
        if (right < left) {
          dst[k++] = right;
          j++;
          inversions += mid - i;
        } else {
          dst[k++] = left;
          i++;
        }
      }
      while (i < mid) dst[k++] = src[i++] as number;
      while (j < hi) dst[k++] = src[j++] as number;
    }
    const t = src;
    src = dst;
    dst = t;
  }
  if (src !== a) a.set(src);
  return inversions;
}
