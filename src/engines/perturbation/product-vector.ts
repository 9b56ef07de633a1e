/**
 * Sparse vectors on the product space A ⊗ B, keyed by iA · 2^26 + iB (both local indices < 2^26),
 * and the operations Rayleigh–Schrödinger perturbation theory needs on them.
 */
import type { Monomial } from '../../hamiltonian/monomial.js';
import type { CouplingTerm } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';

export type ProductVector = Map<number, number>;

const STRIDE = 2 ** 26;
const split = (key: number): [number, number] => [Math.floor(key / STRIDE), key % STRIDE];

/** The unperturbed ground state |0_A 0_B>. */
export const groundState = (): ProductVector => new Map([[0, 1]]);

/** Σ_k c_k M^A_{pA_k} M^B_{pB_k} applied to v (distance factor R^-(n+1) not included). */
export function applyCoupling(terms: readonly CouplingTerm[], v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    const [iA, iB] = split(key);
    for (const t of terms) {
      const a = A.applyMoment(t.pA, iA);
      const b = B.applyMoment(t.pB, iB);
      const c = t.c * amp;
      for (let j = 0; j < a.states.length; j++) {
        const base = a.states[j] * STRIDE;
        const ca = c * a.amps[j];
        for (let k = 0; k < b.states.length; k++) {
          const tk = base + b.states[k];
          out.set(tk, (out.get(tk) ?? 0) + ca * b.amps[k]);
        }
      }
    }
  }
  return out;
}

/** A one-centre moment M_p acting on centre `on` of v. */
export function applyLocal(p: Monomial, on: 'a' | 'b', v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    const [iA, iB] = split(key);
    if (on === 'a') {
      const e = A.applyMoment(p, iA);
      for (let j = 0; j < e.states.length; j++) {
        const tk = e.states[j] * STRIDE + iB;
        out.set(tk, (out.get(tk) ?? 0) + amp * e.amps[j]);
      }
    } else {
      const e = B.applyMoment(p, iB);
      for (let j = 0; j < e.states.length; j++) {
        const tk = iA * STRIDE + e.states[j];
        out.set(tk, (out.get(tk) ?? 0) + amp * e.amps[j]);
      }
    }
  }
  return out;
}

/** The reduced resolvent Q (H0 − E0)^-1 Q: drops the ground component, divides by the excitation energy. */
export function reducedResolvent(v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    if (key === 0) continue;
    const [iA, iB] = split(key);
    out.set(key, amp / (A.excitation(iA) + B.excitation(iB)));
  }
  return out;
}

/** <u|v> for real vectors. */
export function dot(u: ProductVector, v: ProductVector): number {
  const [small, large] = u.size <= v.size ? [u, v] : [v, u];
  let s = 0;
  for (const [k, a] of small) {
    const b = large.get(k);
    if (b !== undefined) s += a * b;
  }
  return s;
}

/** a·u + b·v. */
export function combine(a: number, u: ProductVector, b: number, v: ProductVector): ProductVector {
  const out: ProductVector = new Map();
  for (const [k, x] of u) out.set(k, a * x);
  for (const [k, x] of v) out.set(k, (out.get(k) ?? 0) + b * x);
  return out;
}
