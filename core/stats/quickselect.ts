/**
 * Rearranges `array` in place so that array[k] is the k-th smallest value
 * (0-based), everything left of k is <= it and everything right of k is >= it.
 * NOTE mutates `array`. Expected time O(n).
 *
 * Formula in words: the Floyd–Rivest SELECT algorithm: on large ranges, first
 * recurse on a small sample around the expected position of k to find tight
 * bounds, then partition around array[k] and keep the side holding k.
 *
 * Units: whatever the values are. Values must not be NaN. Throws for k out of range.
 *
 * Reference: R. W. Floyd and R. L. Rivest (1975), "Algorithm 489: The algorithm
 * SELECT — for finding the ith smallest of n elements", CACM 18(3):173; the same
 * algorithm as d3-array's `quickselect`.
 *
 * Example: after `quickselect(a = Float64Array.of(5, 1, 4, 2, 3), 2)`, a[2] is 3.
 */
export function quickselect(array: Float64Array, k: number, left = 0, right = array.length - 1): Float64Array {
  if (!Number.isInteger(k) || k < left || k > right) {
    throw new RangeError(`quickselect requires an integer k in [${left}, ${right}], got ${String(k)}`);
  }
  while (right > left) {
    if (right - left > 600) {
      const n = right - left + 1;
      const m = k - left + 1;
      const z = Math.log(n);
      const s = 0.5 * Math.exp((2 * z) / 3);
      const sd = 0.5 * Math.sqrt((z * s * (n - s)) / n) * (m - n / 2 < 0 ? -1 : 1);
      const newLeft = Math.max(left, Math.floor(k - (m * s) / n + sd));
      const newRight = Math.min(right, Math.floor(k + ((n - m) * s) / n + sd));
      quickselect(array, k, newLeft, newRight);
    }
    const t = array[k] as number;
    let i = left;
    let j = right;
    swap(array, left, k);
    if ((array[right] as number) > t) swap(array, left, right);
    while (i < j) {
      swap(array, i, j);
      i++;
      j--;
      while ((array[i] as number) < t) i++;
      while ((array[j] as number) > t) j--;
    }
    if (array[left] === t) {
      swap(array, left, j);
    } else {
      j++;
      swap(array, j, right);
    }
    if (j <= k) left = j + 1;
    if (k <= j) right = j - 1;
  }
  return array;
}

function swap(array: Float64Array, i: number, j: number): void {
  const t = array[i] as number;
  array[i] = array[j] as number;
  array[j] = t;
}
