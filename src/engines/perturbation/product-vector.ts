/**
 * Sparse vectors on the product space A ⊗ B, keyed by iA · 2^26 + iB (both local indices < 2^26),
 * and the operations Rayleigh–Schrödinger perturbation theory needs on them.
 */
import type { Monomial } from '../../hamiltonian/monomial.js';
import type { CouplingTerm } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';

export type ProductVector = Map<number, number>;

const STRIDE = 2 ** 26;

/**
 * Scratch accumulator for building one product vector: an open-addressing hash table on typed arrays (keys are
 * exact integers below 2^52, stored as doubles) that remembers the order in which keys first appeared. Each key's
 * sum is formed in the order its contributions arrive, and the Map handed out lists keys in first-appearance order,
 * so the result is the Map that adding term by term into a Map gives — the same numbers, bit for bit — with one Map
 * insertion per distinct key instead of a lookup and an insertion per contribution. Shared by the functions below
 * (each empties it before returning; JavaScript runs them one at a time).
 */
class Accumulator {
  private keys = new Float64Array(1 << 12);
  private sums = new Float64Array(1 << 12);
  private used = new Uint8Array(1 << 12);
  /** Slots in first-appearance order. */
  private order = new Int32Array(1 << 11);
  private count = 0;

  /** Adds x to the entry of |iA iB> (key iA·2^26 + iB). */
  add(iA: number, iB: number, x: number): void {
    if (2 * (this.count + 1) > this.keys.length) this.grow();
    const mask = this.keys.length - 1;
    const key = iA * STRIDE + iB;
    let slot = hashSlot(iA, iB, mask);
    while (this.used[slot] && this.keys[slot] !== key) slot = (slot + 1) & mask;
    if (this.used[slot]) {
      this.sums[slot] += x;
      return;
    }
    this.used[slot] = 1;
    this.keys[slot] = key;
    this.sums[slot] = 0 + x; // as (undefined ?? 0) + x: −0 becomes +0
    this.order[this.count++] = slot;
  }

  /** The accumulated vector as a Map in first-appearance order; the accumulator is left empty. */
  take(): ProductVector {
    const out: ProductVector = new Map();
    for (let i = 0; i < this.count; i++) {
      const slot = this.order[i];
      out.set(this.keys[slot], this.sums[slot]);
      this.used[slot] = 0;
    }
    this.count = 0;
    return out;
  }

  private grow(): void {
    const keys = this.keys, sums = this.sums, order = this.order.subarray(0, this.count);
    const size = 2 * keys.length;
    this.keys = new Float64Array(size);
    this.sums = new Float64Array(size);
    this.used = new Uint8Array(size);
    this.order = new Int32Array(size / 2);
    const mask = size - 1;
    order.forEach((old, i) => {
      const iB = keys[old] % STRIDE;
      let slot = hashSlot((keys[old] - iB) / STRIDE, iB, mask);
      while (this.used[slot]) slot = (slot + 1) & mask;
      this.used[slot] = 1;
      this.keys[slot] = keys[old];
      this.sums[slot] = sums[old];
      this.order[i] = slot;
    });
  }
}

/** Slot of the key iA·2^26 + iB: a multiplicative hash of both indices. */
function hashSlot(iA: number, iB: number, mask: number): number {
  return (Math.imul(iA, 0x9e3779b1) ^ Math.imul(iB, 0x85ebca6b)) & mask;
}

const scratch = new Accumulator();

/** The unperturbed ground state |0_A 0_B>. */
export const groundState = (): ProductVector => new Map([[0, 1]]);

/** Σ_k c_k M^A_{pA_k} M^B_{pB_k} applied to v (distance factor R^-(n+1) not included). */
export function applyCoupling(terms: readonly CouplingTerm[], v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out = scratch;
  for (const [key, amp] of v) {
    const iB = key % STRIDE;
    const iA = (key - iB) / STRIDE;
    for (const t of terms) {
      const a = A.applyMoment(t.pA, iA);
      const b = B.applyMoment(t.pB, iB);
      const c = t.c * amp;
      for (let j = 0; j < a.states.length; j++) {
        const target = a.states[j];
        const ca = c * a.amps[j];
        for (let k = 0; k < b.states.length; k++) out.add(target, b.states[k], ca * b.amps[k]);
      }
    }
  }
  return out.take();
}

/** A one-centre moment M_p acting on centre `on` of v. */
export function applyLocal(p: Monomial, on: 'a' | 'b', v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out = scratch;
  for (const [key, amp] of v) {
    const iB = key % STRIDE;
    const iA = (key - iB) / STRIDE;
    if (on === 'a') {
      const e = A.applyMoment(p, iA);
      for (let j = 0; j < e.states.length; j++) out.add(e.states[j], iB, amp * e.amps[j]);
    } else {
      const e = B.applyMoment(p, iB);
      for (let j = 0; j < e.states.length; j++) out.add(iA, e.states[j], amp * e.amps[j]);
    }
  }
  return out.take();
}

/** The reduced resolvent Q (H0 − E0)^-1 Q: drops the ground component, divides by the excitation energy. */
export function reducedResolvent(v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    if (key === 0) continue;
    const iB = key % STRIDE;
    const iA = (key - iB) / STRIDE;
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
