/**
 * Independent numerical tools for the physics tests: adaptive Gauss-Legendre
 * quadrature (nodes computed here by Newton iteration) and the
 * Coulomb field of a point charge written out from scratch, so no closed form of the
 * code under test is reused. Also a seeded PRNG (mulberry32, public domain, Tommy
 * Ettinger) and Box-Muller normals for synthetic noisy data.
 */

/** 1 / (4 pi eps0) from CODATA 2022 eps0, written out here independently of core. */
export const K_REF = 1 / (4 * Math.PI * 8.8541878188e-12);
export const EPS0_REF = 8.8541878188e-12;

/** Gauss-Legendre nodes and weights on [-1, 1] by Newton iteration on P_n (Numerical Recipes, 3rd ed., 4.6 gauleg). */
function gaussLegendre(n: number): { x: number[]; w: number[] } {
  const x: number[] = new Array<number>(n).fill(0);
  const w: number[] = new Array<number>(n).fill(0);
  const m = Math.floor((n + 1) / 2);
  for (let i = 0; i < m; i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    let pp = 0;
    for (let it = 0; it < 100; it++) {
      let p1 = 1, p2 = 0;
      for (let j = 0; j < n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = ((2 * j + 1) * z * p2 - j * p3) / (j + 1);
      }
      pp = (n * (z * p1 - p2)) / (z * z - 1);
      const z1 = z;
      z = z1 - p1 / pp;
      if (Math.abs(z - z1) < 1e-15) break;
    }
    x[i] = -z;
    x[n - 1 - i] = z;
    w[i] = 2 / ((1 - z * z) * pp * pp);
    w[n - 1 - i] = w[i] as number;
  }
  return { x, w };
}
const GL = gaussLegendre(16);

function gl16(f: (x: number) => number, a: number, b: number): number {
  const h = (b - a) / 2, c = (a + b) / 2;
  let s = 0;
  for (let i = 0; i < 16; i++) s += (GL.w[i] as number) * f(c + h * (GL.x[i] as number));
  return s * h;
}

/**
 * Adaptive 16-point Gauss-Legendre integral of f on [a, b]: a panel is accepted when
 * it agrees with the sum of its two halves to tol relative to the running total
 * (global budget of 100 000 panels, so a pathological integrand cannot hang a test).
 */
export function integrate(f: (x: number) => number, a: number, b: number, tol = 1e-11): number {
  const total0 = gl16(f, a, b);
  const stack: [number, number, number][] = [[a, b, total0]];
  let sum = 0;
  let budget = 100_000;
  while (stack.length > 0) {
    const [lo, hi, whole] = stack.pop() as [number, number, number];
    const mid = (lo + hi) / 2;
    const left = gl16(f, lo, mid);
    const right = gl16(f, mid, hi);
    const scale = Math.max(Math.abs(total0), Math.abs(sum), 1e-300);
    if (Math.abs(left + right - whole) <= tol * scale || budget-- <= 0) {
      sum += left + right;
    } else {
      stack.push([lo, mid, left], [mid, hi, right]);
    }
  }
  return sum;
}

export type Vec3 = [number, number, number];

/** Field vector at p of a point charge q at s: k q (p - s) / |p - s|^3 (Coulomb's law, Griffiths eq. 2.4). */
export function coulombVector(q: number, s: Vec3, p: Vec3): Vec3 {
  const dx = p[0] - s[0], dy = p[1] - s[1], dz = p[2] - s[2];
  const r2 = dx * dx + dy * dy + dz * dz;
  const f = (K_REF * q) / (r2 * Math.sqrt(r2));
  return [f * dx, f * dy, f * dz];
}

export function add(a: Vec3, b: Vec3): Vec3 {
  return [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
}

export function norm(a: Vec3): number {
  return Math.hypot(a[0], a[1], a[2]);
}

/** Relative difference |a - b| / |b|. */
export function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

/** mulberry32 seeded PRNG: uniform [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal deviate by Box-Muller from a uniform source. */
export function normal(rand: () => number): number {
  const u = 1 - rand();
  const v = rand();
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
}
