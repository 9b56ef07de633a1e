/** Seeded pseudo-random numbers for reproducible property tests (mulberry32; common practice). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A uniform number in [lo, hi) from a generator. */
export const uniform = (rand: () => number, lo: number, hi: number): number => lo + (hi - lo) * rand();

/** (B + Bᵀ)/2 for an n×n B with seeded entries uniform in [−1, 1): a random symmetric matrix, row-major. */
export function randomSymmetric(n: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const b = Float64Array.from({ length: n * n }, () => uniform(rand, -1, 1));
  return Float64Array.from({ length: n * n }, (_, k) => 0.5 * (b[k] + b[(k % n) * n + Math.floor(k / n)]));
}
