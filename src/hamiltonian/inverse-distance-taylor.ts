/**
 * Exact Taylor coefficients of 1/|ẑ + d| about d = 0, i.e. the derivative tensors of 1/R at R ẑ
 * divided by p!, at R = 1. For general R the degree-n coefficients scale as R^-(n+1).
 *
 * Method: 1/|ẑ + d| = (1 + t)^(-1/2) with t = 2 d_z + d_x² + d_y² + d_z², expanded by the binomial series
 * Σ_k binom(−1/2, k) t^k (common practice; equivalent to the Legendre expansion Σ_l (−|d|)^l P_l(d_z/|d|)).
 * The multinomial theorem gives each coefficient in closed form (derived here): t^k contains
 * k!/(i! a! b! m!) 2^i d_x^2a d_y^2b d_z^(i+2m) for i + a + b + m = k, and binom(−1/2, k) = (−1)^k (2k−1)!!/(2^k k!), so
 *
 *   a_(2a, 2b, n) = Σ_{m=0}^{⌊n/2⌋} (−1)^k (2k−1)!! 2^(i−k) / (i! a! b! m!),   i = n − 2m, k = i + a + b + m,
 *
 * and a_p = 0 when p_x or p_y is odd. Summed in exact integer arithmetic (BigInt), so every coefficient is the exact
 * rational the series gives (tests/hamiltonian/multipole-coupling.test.ts compares it with the series itself).
 */
import Fraction from 'fraction.js';
import { type Monomial, monomialKey } from './monomial.js';

/** A polynomial in (dx, dy, dz) with exact coefficients, keyed by {@link monomialKey}. */
export type ExactPolynomial3 = Map<number, { p: Monomial; c: Fraction }>;

const factorials: bigint[] = [1n];
const factorial = (n: number): bigint => {
  for (let k = factorials.length; k <= n; k++) factorials.push(factorials[k - 1] * BigInt(k));
  return factorials[n];
};
const doubleFactorials: bigint[] = [1n]; // (2k − 1)!! at index k
const oddDoubleFactorial = (k: number): bigint => {
  for (let j = doubleFactorials.length; j <= k; j++) doubleFactorials.push(doubleFactorials[j - 1] * BigInt(2 * j - 1));
  return doubleFactorials[k];
};

/** The coefficient a_p of d_x^p0 d_y^p1 d_z^p2 in 1/|ẑ + d| (exact; zero when p0 or p1 is odd). */
export function taylorCoefficient(p: Monomial): Fraction {
  if (p[0] % 2 !== 0 || p[1] % 2 !== 0) return new Fraction(0);
  const a = p[0] / 2, b = p[1] / 2, n = p[2];
  // common denominator 2^K · a! b! · (the i! m! of each term folded into the numerator over n!·2^K)
  let num = 0n;
  let den = 1n;
  for (let m = 0; 2 * m <= n; m++) {
    const i = n - 2 * m;
    const k = i + a + b + m;
    const sign = k % 2 === 0 ? 1n : -1n;
    // term = sign (2k−1)!! 2^(i−k) / (i! a! b! m!) as tn / td
    let tn = sign * oddDoubleFactorial(k);
    let td = factorial(i) * factorial(a) * factorial(b) * factorial(m);
    if (i >= k) tn *= 1n << BigInt(i - k);
    else td *= 1n << BigInt(k - i);
    num = num * td + tn * den;
    den *= td;
  }
  return new Fraction(num, den);
}

const cache = new Map<number, ExactPolynomial3>();

/** Taylor polynomial of 1/|ẑ + d| through total degree `maxDegree` (zero coefficients removed), by degree. */
export function inverseDistanceTaylor(maxDegree: number): ExactPolynomial3 {
  const hit = cache.get(maxDegree);
  if (hit) return hit;
  const result: ExactPolynomial3 = new Map();
  for (let d = 0; d <= maxDegree; d++)
    for (let px = 0; px <= d; px += 2)
      for (let py = 0; px + py <= d; py += 2) {
        const p: Monomial = [px, py, d - px - py];
        const c = taylorCoefficient(p);
        if (!c.equals(0)) result.set(monomialKey(p), { p, c });
      }
  cache.set(maxDegree, result);
  return result;
}
