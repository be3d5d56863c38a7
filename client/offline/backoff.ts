/**
 * Retry delay after `failures` consecutive failed sync passes: exponential
 * (1 s, 2 s, 4 s ... capped at 60 s) with jitter over the upper half of the
 * step, so many tablets coming back online at once do not all retry together,
 * and no retry comes sooner than half its step.
 *
 * @example backoffDelay(1, () => 0) // 500 (ms)
 * @example backoffDelay(3, () => 1) // 4000
 * @example backoffDelay(20, () => 1) // 60000
 */
export const BASE_DELAY_MS = 1000;
export const MAX_DELAY_MS = 60_000;

export function backoffDelay(failures: number, random: () => number = Math.random): number {
  const cap = Math.min(MAX_DELAY_MS, BASE_DELAY_MS * 2 ** Math.max(0, failures - 1));
  return Math.round(cap / 2 + random() * (cap / 2));
}
