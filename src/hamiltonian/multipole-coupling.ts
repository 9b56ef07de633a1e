/**
 * The multipole (Taylor) expansion of the Coulomb interaction between two neutral charge distributions,
 * A about the origin and B about R ẑ, as products of Cartesian moments:
 *
 *   V = Σ_n R^-(n+1) Σ_{|pA|+|pB| = n} c(pA, pB) M^A_{pA} M^B_{pB},   M^X_p = Σ_{i∈X} e_i x_i^p0 y_i^p1 z_i^p2,
 *
 * with exact rational c(pA, pB) = a_{pA+pB} · Π_axis binom(pA+pB, pB) · (−1)^|pA|, where a_p are the Taylor
 * coefficients of 1/|ẑ + d| (d = r_B − r_A). Neutrality removes every term with pA = 0 or pB = 0.
 * "Order" n is the total degree: 2 = dipole–dipole (R^-3), 3 = dipole–quadrupole both ways (R^-4),
 * 4 = quadrupole–quadrupole and dipole–octupole (R^-5), and so on. Derivation: the Taylor expansion of
 * Σ e_i e_j /|R ẑ + r_j − r_i| (common practice; e.g. A. J. Stone, The Theory of Intermolecular Forces, 2013).
 */
import Fraction from 'fraction.js';
import { taylorCoefficient } from './inverse-distance-taylor.js';
import { type Monomial, degree, monomialsOfDegree } from './monomial.js';
import { binomial } from '../math/combinatorics.js';

/** One term c · M^A_{pA} M^B_{pB} / R^(order+1). */
export interface CouplingTerm {
  /** Exact coefficient. */
  exact: Fraction;
  /** The same as a double. */
  c: number;
  pA: Monomial;
  pB: Monomial;
  /** Total degree |pA| + |pB|; the term falls off as R^-(order+1). */
  order: number;
}


const cache = new Map<number, CouplingTerm[]>();

/** All coupling terms of exactly one order (≥ 2), sorted deterministically. */
export function couplingTerms(order: number): CouplingTerm[] {
  if (!Number.isInteger(order) || order < 2) throw new RangeError(`coupling order must be an integer ≥ 2, got ${order}`);
  const hit = cache.get(order);
  if (hit) return hit;
  const out: CouplingTerm[] = [];
  for (const p of monomialsOfDegree(order)) {
    const a = taylorCoefficient(p);
    if (a.equals(0)) continue;
    for (let kx = 0; kx <= p[0]; kx++)
      for (let ky = 0; ky <= p[1]; ky++)
        for (let kz = 0; kz <= p[2]; kz++) {
          const pB: Monomial = [kx, ky, kz];
          const pA: Monomial = [p[0] - kx, p[1] - ky, p[2] - kz];
          if (degree(pA) === 0 || degree(pB) === 0) continue;
          const mult = binomial(p[0], kx) * binomial(p[1], ky) * binomial(p[2], kz);
          const sign = degree(pA) % 2 === 0 ? 1 : -1;
          const exact = a.mul(new Fraction(mult * sign));
          out.push({ exact, c: exact.valueOf(), pA, pB, order });
        }
  }
  out.sort((s, t) => cmp(s.pA, t.pA) || cmp(s.pB, t.pB));
  cache.set(order, out);
  return out;
}

function cmp(a: Monomial, b: Monomial): number {
  return degree(a) - degree(b) || a[2] - b[2] || a[1] - b[1] || a[0] - b[0];
}

/** Numerical value of the order-n coupling for point moments given as functions of the monomial, at distance R. */
export function evaluateCoupling(
  order: number,
  R: number,
  momentA: (p: Monomial) => number,
  momentB: (p: Monomial) => number,
): number {
  let s = 0;
  for (const t of couplingTerms(order)) s += t.c * momentA(t.pA) * momentB(t.pB);
  return s / R ** (order + 1);
}
