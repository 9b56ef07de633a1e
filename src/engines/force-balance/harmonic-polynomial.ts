/**
 * Polynomials in the six Drude coordinates of a QDO pair (xA, yA, zA, xB, yB, zB; bohr) and the two operations
 * force balance needs on them, both exact for uncoupled harmonic oscillators:
 *
 * - the ground-state (Gaussian) mean <x^e>_0 = Π_c (e_c − 1)!! s_c^e_c for even e_c (0 for odd),
 *   s_c² = 1/(2 m w_c) (common practice; moments of a Gaussian);
 * - the Dalgarno–Lewis first-order function: for a polynomial perturbation W the first-order state is P ψ0 with
 *   L P = −(W − <W>_0), where (H0 − E0)(P ψ0) = ψ0 · L P and
 *   L = Σ_c [ −(1/2m) ∂_c² + w_c x_c ∂_c ]
 *   (A. Dalgarno, J. T. Lewis, Proc. R. Soc. Lond. A 233, 70 (1955); L derived here from ψ0 ∝ exp(−Σ m w_c x_c²/2)).
 *   L maps x^e to (Σ_c w_c e_c) x^e plus terms two degrees lower, so P follows by back-substitution, degree by degree.
 *
 * With P, the first-order change of any expectation is <O>_1 = 2(<O P>_0 − <O>_0 <P>_0), and the second-order
 * energy is E2 = <W P>_0 − <W>_0 <P>_0 (ψ0 real, normalisation kept to first order).
 */
import type { DrudeSpecies } from '../../model/drude.js';

/** Exponents of the six coordinates, base 16 (each exponent < 16). */
export type Poly6 = Map<number, number>;

const BASE = 16;
const POW = [1, 16, 256, 4096, 65536, 1048576];

/** Exponent of coordinate c in a key. */
export const exponentOf = (key: number, c: number): number => Math.floor(key / POW[c]) % BASE;

/** The key of a monomial from exponents on A (pA) and B (pB). */
export const pairKey = (pA: readonly number[], pB: readonly number[]): number =>
  pA[0] * POW[0] + pA[1] * POW[1] + pA[2] * POW[2] + pB[0] * POW[3] + pB[1] * POW[4] + pB[2] * POW[5];

/** The constant monomial. */
export const ONE = 0;

function addTerm(p: Poly6, key: number, c: number): void {
  const v = (p.get(key) ?? 0) + c;
  if (v === 0) p.delete(key);
  else p.set(key, v);
}

/** p·q (exponents add; every product here stays far below 16 per coordinate). */
export function multiply(p: Poly6, q: Poly6): Poly6 {
  const out: Poly6 = new Map();
  for (const [k1, c1] of p) for (const [k2, c2] of q) addTerm(out, k1 + k2, c1 * c2);
  return out;
}

/** ∂p/∂x_c. */
export function derivative(p: Poly6, c: number): Poly6 {
  const out: Poly6 = new Map();
  for (const [k, v] of p) {
    const e = exponentOf(k, c);
    if (e > 0) addTerm(out, k - POW[c], v * e);
  }
  return out;
}

/** Total degree of a key. */
function degreeOf(key: number): number {
  let d = 0;
  for (let c = 0; c < 6; c++) d += exponentOf(key, c);
  return d;
}

/** The uncoupled ground state of a QDO pair: per-coordinate mass and frequency. */
export interface HarmonicPair {
  /** Mass of the Drude particle owning coordinate c (m_e). */
  mass: readonly number[];
  /** Frequency of coordinate c (Eh/hbar). */
  w: readonly number[];
}

/** The harmonic reference of two QDOs (A's three coordinates, then B's). */
export function harmonicPair(A: DrudeSpecies, B: DrudeSpecies): HarmonicPair {
  return { mass: [A.m, A.m, A.m, B.m, B.m, B.m], w: [...A.w, ...B.w] };
}

/** <x^e>_0 for one coordinate: (e − 1)!! s^e for even e, s² = 1/(2 m w). */
function coordinateMean(e: number, m: number, w: number): number {
  if (e % 2 === 1) return 0;
  let df = 1;
  for (let k = e - 1; k > 1; k -= 2) df *= k;
  return df * (1 / (2 * m * w)) ** (e / 2);
}

/** Ground-state mean <p>_0 of the uncoupled pair. */
export function groundMean(p: Poly6, h: HarmonicPair): number {
  let s = 0;
  for (const [k, v] of p) {
    let term = v;
    for (let c = 0; c < 6 && term !== 0; c++) term *= coordinateMean(exponentOf(k, c), h.mass[c], h.w[c]);
    s += term;
  }
  return s;
}

/**
 * The Dalgarno–Lewis function P of a perturbation W: L P = −(W − <W>_0), with <P>_0 left as it falls
 * (callers use covariance forms, which do not depend on it).
 */
export function dalgarnoLewis(W: Poly6, h: HarmonicPair): Poly6 {
  const residual: Poly6 = new Map();
  for (const [k, v] of W) addTerm(residual, k, -v);
  const P: Poly6 = new Map();
  for (;;) {
    let top = -1;
    let topDegree = 0;
    for (const k of residual.keys()) {
      const d = degreeOf(k);
      if (d > topDegree) [top, topDegree] = [k, d];
    }
    if (top < 0) return P; // only the constant <W>_0 is left
    const a = residual.get(top)!;
    let lambda = 0;
    for (let c = 0; c < 6; c++) lambda += h.w[c] * exponentOf(top, c);
    const coeff = a / lambda;
    addTerm(P, top, coeff);
    residual.delete(top);
    // the lower-degree part of L(coeff · x^e): −e_c (e_c − 1)/(2 m_c) x^(e − 2ê_c)
    for (let c = 0; c < 6; c++) {
      const e = exponentOf(top, c);
      if (e >= 2) addTerm(residual, top - 2 * POW[c], (coeff * e * (e - 1)) / (2 * h.mass[c]));
    }
  }
}

/** First-order change of <O> under the perturbation whose Dalgarno–Lewis function is P: 2(<OP>_0 − <O>_0<P>_0). */
export function firstOrderMean(O: Poly6, P: Poly6, h: HarmonicPair): number {
  return 2 * (groundMean(multiply(O, P), h) - groundMean(O, h) * groundMean(P, h));
}
