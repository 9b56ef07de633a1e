/**
 * Exact Taylor coefficients of 1/|ẑ + d| about d = 0, i.e. the derivative tensors of 1/R at R ẑ
 * divided by p!, at R = 1. For general R the degree-n coefficients scale as R^-(n+1).
 *
 * Method: 1/|ẑ + d| = (1 + t)^(-1/2) with t = 2 d_z + d·d, expanded by the binomial series
 * Σ_k binom(-1/2, k) t^k and truncated at total degree N, in exact rational arithmetic
 * (common practice; equivalent to the Legendre expansion Σ_l (−|d|)^l P_l(d_z/|d|)).
 */
import Fraction from 'fraction.js';
import { type Monomial, monomialKey } from './monomial.js';

/** A polynomial in (dx, dy, dz) with exact coefficients, keyed by {@link monomialKey}. */
export type ExactPolynomial3 = Map<number, { p: Monomial; c: Fraction }>;

function multiply(a: ExactPolynomial3, b: ExactPolynomial3, maxDegree: number): ExactPolynomial3 {
  const out: ExactPolynomial3 = new Map();
  for (const x of a.values()) {
    for (const y of b.values()) {
      const p: Monomial = [x.p[0] + y.p[0], x.p[1] + y.p[1], x.p[2] + y.p[2]];
      if (p[0] + p[1] + p[2] > maxDegree) continue;
      const k = monomialKey(p);
      const prev = out.get(k);
      const c = x.c.mul(y.c);
      out.set(k, { p, c: prev ? prev.c.add(c) : c });
    }
  }
  return out;
}

const cache = new Map<number, ExactPolynomial3>();

/** Taylor polynomial of 1/|ẑ + d| through total degree `maxDegree` (zero coefficients removed). */
export function inverseDistanceTaylor(maxDegree: number): ExactPolynomial3 {
  const hit = cache.get(maxDegree);
  if (hit) return hit;
  const t: ExactPolynomial3 = new Map();
  const add = (p: Monomial, c: Fraction) => t.set(monomialKey(p), { p, c });
  add([0, 0, 1], new Fraction(2));
  add([2, 0, 0], new Fraction(1));
  add([0, 2, 0], new Fraction(1));
  add([0, 0, 2], new Fraction(1));

  const result: ExactPolynomial3 = new Map([[monomialKey([0, 0, 0]), { p: [0, 0, 0] as Monomial, c: new Fraction(1) }]]);
  let power: ExactPolynomial3 = new Map(result);
  let binom = new Fraction(1);
  for (let k = 1; k <= maxDegree; k++) {
    power = multiply(power, t, maxDegree);
    binom = binom.mul(new Fraction(-1, 2).sub(k - 1)).div(k); // binom(-1/2, k)
    for (const [key, term] of power) {
      const prev = result.get(key);
      const c = term.c.mul(binom);
      result.set(key, { p: term.p, c: prev ? prev.c.add(c) : c });
    }
  }
  for (const [key, term] of result) if (term.c.equals(0)) result.delete(key);
  cache.set(maxDegree, result);
  return result;
}
