import { quickselect } from './quickselect';

/** Above this many pairs, bracket the wanted ranks by sampling instead of storing every slope. */
const STORE_ALL_MAX_PAIRS = 20_000;
/** Sample size for the bracket: an eighth of the pairs, at least 2 500, at most 20 000. */
function sampleSizeFor(pairCount: number): number {
  return Math.min(20_000, Math.max(2_500, Math.floor(pairCount / 8)));
}

/**
 * Values at (possibly fractional) 1-based ranks among the slopes
 * (y_j - y_i) / (x_j - x_i) of all pairs i < j with x_i != x_j, interpolating
 * linearly between neighbouring order statistics. Exact, not approximate: the
 * same numbers a full sort of every slope would give. For the Theil–Sen median
 * and its rank-based confidence limits.
 *
 * Formula in words: with N pairs, rank r (clamped to [1, N]) gives
 * s(floor r) + (r - floor r)(s(floor r + 1) - s(floor r)), s(k) the k-th
 * smallest slope. Up to 20 000 pairs (n about 200 points) every slope is stored
 * and the wanted order statistics are found by quickselect. Above that, a
 * deterministic random sample of pair slopes (an eighth of them, 2 500 to
 * 20 000) brackets the wanted ranks
 * [lo, hi] with a wide margin; one pass over all pairs counts the slopes below lo
 * and keeps only those in [lo, hi], and the order statistics are selected among
 * those. If the bracket misses (very unlikely; ties can cause it) the function
 * falls back to storing every slope. Time O(n^2), memory O(n^2 / 15) typical.
 *
 * Units: slopes in y units per x unit. `ranks` must be numbers (not NaN);
 * `pairCount` must be the number of pairs with distinct x (> 0).
 *
 * Reference: the sampling bracket follows the randomized selection idea of
 * R. W. Floyd and R. L. Rivest (1975), CACM 18(3):165–172, and J. Matoušek
 * (1991), "Randomized optimal algorithm for slope selection", Inf. Process.
 * Lett. 39:183–187 (here without its O(n log n) counting).
 *
 * Example: for x = 0..5, y = 6, 4, 1, 8, 7, 8 (15 slopes), rank 8 is 2/3 and rank
 * 2.5 is -2.25 (halfway between -2.5 and -2).
 */
export function pairwiseSlopesAtRanks(
  xs: Float64Array,
  ys: Float64Array,
  pairCount: number,
  ranks: readonly number[],
): number[] {
  const wanted = wantedIndices(pairCount, ranks);
  let values: Map<number, number> | null = null;
  if (pairCount > STORE_ALL_MAX_PAIRS) values = selectByBracket(xs, ys, pairCount, wanted);
  if (values === null) values = selectAmongAll(allSlopes(xs, ys, pairCount), 0, wanted);
  const got = values;
  return ranks.map((rank) => {
    const r = Math.min(Math.max(rank, 1), pairCount);
    const lo = Math.floor(r);
    const a = got.get(lo - 1) as number;
    const fraction = r - lo;
    // `+ 0` turns a -0 slope (0 / negative dx) into 0: zero has no sign here.
    if (fraction === 0) return a + 0;
    const b = got.get(lo) as number;
    return (a === b ? a : a + fraction * (b - a)) + 0;
  });
}

/** Sorted distinct 0-based order-statistic indices the ranks need. */
function wantedIndices(pairCount: number, ranks: readonly number[]): number[] {
  const set = new Set<number>();
  for (const rank of ranks) {
    const r = Math.min(Math.max(rank, 1), pairCount);
    const lo = Math.floor(r);
    set.add(lo - 1);
    if (r > lo) set.add(lo);
  }
  return [...set].sort((a, b) => a - b);
}

function allSlopes(xs: Float64Array, ys: Float64Array, pairCount: number): Float64Array {
  const n = xs.length;
  const slopes = new Float64Array(pairCount);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const xi = xs[i] as number;
    const yi = ys[i] as number;
    for (let j = i + 1; j < n; j++) {
      const dx = (xs[j] as number) - xi;
      if (dx !== 0) slopes[k++] = ((ys[j] as number) - yi) / dx;
    }
  }
  return slopes;
}

/**
 * Order statistics at `indices` (ascending) of `values`, where values[k] holds
 * order statistic k + offset. The largest is selected first over the whole
 * array, then the smallest below it, then the rest between the two: each
 * selection leaves its left side <= and right side >= it, so later searches
 * cover only the narrow band between the confidence limits.
 */
function selectAmongAll(values: Float64Array, offset: number, indices: readonly number[]): Map<number, number> {
  const out = new Map<number, number>();
  const first = (indices[0] as number) - offset;
  const last = (indices[indices.length - 1] as number) - offset;
  quickselect(values, last, 0, values.length - 1);
  out.set(last + offset, values[last] as number);
  if (first === last) return out;
  quickselect(values, first, 0, last - 1);
  out.set(first + offset, values[first] as number);
  let left = first + 1;
  for (let i = 1; i < indices.length - 1; i++) {
    const k = (indices[i] as number) - offset;
    quickselect(values, k, left, last - 1);
    out.set(k + offset, values[k] as number);
    left = k + 1;
  }
  return out;
}

function selectByBracket(xs: Float64Array, ys: Float64Array, pairCount: number, indices: readonly number[]): Map<number, number> | null {
  const n = xs.length;
  // Deterministic sample of pair slopes (mulberry32), so results never vary between runs.
  let state = 0x9e3779b9;
  const random = () => {
    state = (state + 0x6d2b79f5) | 0;
    let t = Math.imul(state ^ (state >>> 15), 1 | state);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const sampleSize = sampleSizeFor(pairCount);
  const sample = new Float64Array(sampleSize);
  let m = 0;
  for (let tries = 0; m < sampleSize && tries < 4 * sampleSize; tries++) {
    const i = Math.floor(random() * n);
    const j = Math.floor(random() * n);
    if (i === j) continue;
    const a = i < j ? i : j;
    const b = i < j ? j : i;
    const dx = (xs[b] as number) - (xs[a] as number);
    if (dx === 0) continue;
    sample[m++] = ((ys[b] as number) - (ys[a] as number)) / dx;
  }
  if (m < sampleSize / 2) return null;
  const drawn = sample.subarray(0, m);
  const first = indices[0] as number;
  const last = indices[indices.length - 1] as number;
  // Margin: 6 binomial standard deviations of a sample quantile, plus a little.
  const margin = 6 * Math.sqrt(0.25 / m) + 2 / m;
  const qLo = first / pairCount - margin;
  const qHi = (last + 1) / pairCount + margin;
  const kHi = Math.min(m - 1, Math.ceil(qHi * m));
  const kLo = Math.min(kHi, Math.floor(qLo * m));
  // Select rather than sort the sample: two selections cost far less.
  let hi = Infinity;
  if (qHi < 1) {
    quickselect(drawn, kHi);
    hi = drawn[kHi] as number;
  }
  let lo = -Infinity;
  if (qLo > 0) {
    quickselect(drawn, kLo, 0, kHi);
    lo = drawn[kLo] as number;
  }

  const capacity = Math.min(pairCount, Math.ceil((qHi - Math.max(qLo, 0)) * pairCount * 1.2) + 1024);
  const { below, kept } = slopesInBracket(xs, ys, lo, hi, capacity);
  const k = kept.length;
  if (below > first || below + k - 1 < last) return null;
  return selectAmongAll(kept, below, indices);
}

/** One pass over all pairs: how many slopes fall below `lo`, and those in [lo, hi]. */
function slopesInBracket(
  xs: Float64Array,
  ys: Float64Array,
  lo: number,
  hi: number,
  capacity: number,
): { below: number; kept: Float64Array } {
  const n = xs.length;
  let below = 0;
  let kept: Float64Array = new Float64Array(capacity);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const xi = xs[i] as number;
    const yi = ys[i] as number;
    for (let j = i + 1; j < n; j++) {
      const dx = (xs[j] as number) - xi;
      if (dx === 0) continue;
      const s = ((ys[j] as number) - yi) / dx;
      if (s < lo) below++;
      else if (s <= hi) {
        if (k === kept.length) kept = grow(kept);
        kept[k++] = s;
      }
    }
  }
  return { below, kept: kept.subarray(0, k) };
}

function grow(a: Float64Array): Float64Array {
  const grown = new Float64Array(Math.max(16, a.length * 2));
  grown.set(a);
  return grown;
}
