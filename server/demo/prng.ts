/**
 * A small seeded pseudo-random generator (mulberry32) so the demo site is the
 * same on every machine: only its dates follow the calendar.
 */
export interface Prng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [lo, hi). */
  between(lo: number, hi: number): number;
  /** Standard normal (Box-Muller). */
  normal(): number;
  /** True with probability p. */
  chance(p: number): boolean;
  /** Sixteen pseudo-random bytes (for UUIDv7 random bits). */
  bytes16(): Uint8Array;
}

export function mulberry32(seed: number): Prng {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    between: (lo, hi) => lo + (hi - lo) * next(),
    normal: () => {
      const u = Math.max(next(), 1e-12);
      const v = next();
      return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    },
    chance: (p) => next() < p,
    bytes16: () => Uint8Array.from({ length: 16 }, () => Math.floor(next() * 256)),
  };
}
