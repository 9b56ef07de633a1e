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
/** The lowest bit of each exponent: two keys multiply to an all-even monomial iff these bits agree. */
const PARITY_BITS = 0x111111;

/** Exponent of coordinate c in a key. */
export const exponentOf = (key: number, c: number): number => (key >> (4 * c)) & (BASE - 1);

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

/** <x_c^e>_0 for every coordinate c and exponent e < 16, at index 16 c + e; one table per HarmonicPair. */
const meanTables = new WeakMap<HarmonicPair, Float64Array>();
export function coordinateMeans(h: HarmonicPair): Float64Array {
  let table = meanTables.get(h);
  if (!table) {
    table = new Float64Array(6 * BASE);
    for (let c = 0; c < 6; c++) for (let e = 0; e < BASE; e++) table[c * BASE + e] = coordinateMean(e, h.mass[c], h.w[c]);
    meanTables.set(h, table);
  }
  return table;
}

/** <x^key>_0 from the coordinate table (0 unless every exponent is even). */
export function monomialMean(key: number, table: Float64Array): number {
  return (
    table[key & 15] *
    table[16 + ((key >> 4) & 15)] *
    table[32 + ((key >> 8) & 15)] *
    table[48 + ((key >> 12) & 15)] *
    table[64 + ((key >> 16) & 15)] *
    table[80 + ((key >> 20) & 15)]
  );
}

/** Ground-state mean <p>_0 of the uncoupled pair. */
export function groundMean(p: Poly6, h: HarmonicPair): number {
  const table = coordinateMeans(h);
  let s = 0;
  for (const [k, v] of p) s += v * monomialMean(k, table);
  return s;
}

/**
 * <p q>_0 without forming the product: Σ_ij p_i q_j <x^(k_i + k_j)>_0 over the pairs of terms whose exponents
 * have the same parities (all other products have an odd exponent and mean zero).
 */
export function productMean(p: Poly6, q: Poly6, h: HarmonicPair): number {
  const table = coordinateMeans(h);
  const qKeys = [...q.keys()];
  const qCoeffs = [...q.values()];
  let s = 0;
  for (const [k1, c1] of p) {
    const parity = k1 & PARITY_BITS;
    let t = 0;
    for (let j = 0; j < qKeys.length; j++) {
      const k2 = qKeys[j];
      if ((k2 & PARITY_BITS) === parity) t += qCoeffs[j] * monomialMean(k1 + k2, table);
    }
    s += c1 * t;
  }
  return s;
}

/**
 * The Dalgarno–Lewis function P of a perturbation W: L P = −(W − <W>_0), with <P>_0 left as it falls
 * (callers use covariance forms, which do not depend on it). Solved degree by degree from the top: the terms of
 * one degree are independent (L keeps the degree up to terms two lower), so each degree's residual is one map.
 */
export function dalgarnoLewis(W: Poly6, h: HarmonicPair): Poly6 {
  const byDegree: Poly6[] = [];
  for (const [k, v] of W) addTerm((byDegree[degreeOf(k)] ??= new Map()), k, -v);
  const P: Poly6 = new Map();
  for (let d = byDegree.length - 1; d > 0; d--) {
    const residual = byDegree[d];
    if (!residual) continue;
    for (const [top, a] of residual) {
      let lambda = 0;
      for (let c = 0; c < 6; c++) lambda += h.w[c] * exponentOf(top, c);
      const coeff = a / lambda;
      addTerm(P, top, coeff);
      // the lower-degree part of L(coeff · x^e): −e_c (e_c − 1)/(2 m_c) x^(e − 2ê_c)
      for (let c = 0; c < 6; c++) {
        const e = exponentOf(top, c);
        if (e >= 2) addTerm((byDegree[d - 2] ??= new Map()), top - 2 * POW[c], (coeff * e * (e - 1)) / (2 * h.mass[c]));
      }
    }
  }
  return P; // the constant <W>_0 is left in the degree-0 residual
}

/** <X Y>_0 − <X>_0 <Y>_0 in the uncoupled ground state. */
export function covariance(X: Poly6, Y: Poly6, h: HarmonicPair): number {
  return productMean(X, Y, h) - groundMean(X, h) * groundMean(Y, h);
}

/** First-order change of <O> under the perturbation whose Dalgarno–Lewis function is P: 2(<OP>_0 − <O>_0<P>_0). */
export function firstOrderMean(O: Poly6, P: Poly6, h: HarmonicPair): number {
  return 2 * covariance(O, P, h);
}
