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

/**
 * Read-only view of a product vector by rows: for each A state present, the B amplitudes as a dense typed array
 * (B indices of the spaces used here are small: a few hundred at most), so the inner sums over B states of the
 * matrix elements below read an array instead of hashing a key. Built once per vector and cached (vectors are not
 * mutated after they are made).
 */
class RowView {
  readonly rows = new Map<number, Float64Array>();
  readonly width: number;

  constructor(v: ProductVector) {
    let width = 0;
    for (const key of v.keys()) width = Math.max(width, (key % STRIDE) + 1);
    this.width = width;
    for (const [key, x] of v) {
      const iB = key % STRIDE;
      const iA = (key - iB) / STRIDE;
      let row = this.rows.get(iA);
      if (!row) this.rows.set(iA, (row = new Float64Array(width)));
      row[iB] = x;
    }
  }
}

const views = new WeakMap<ProductVector, RowView>();
function rowsOf(v: ProductVector): RowView {
  let r = views.get(v);
  if (!r) views.set(v, (r = new RowView(v)));
  return r;
}

/** Σ_k amps[k] · row[states[k]] (entries beyond the row's width are absent: 0). */
function rowSum(row: Float64Array, states: readonly number[], amps: readonly number[]): number {
  let s = 0;
  const width = row.length;
  for (let k = 0; k < states.length; k++) {
    const i = states[k];
    if (i < width) s += amps[k] * row[i];
  }
  return s;
}

/**
 * <w|V|v> with V = Σ_k c_k M^A_{pA_k} M^B_{pB_k}: dot(applyCoupling(terms, v, A, B), w) without building V|v>
 * (each contribution is multiplied by w's entry as it is made; the same products, summed in another order).
 */
export function couplingDot(terms: readonly CouplingTerm[], v: ProductVector, w: ProductVector, A: LocalSpace, B: LocalSpace): number {
  const W = rowsOf(w);
  let s = 0;
  for (const [key, amp] of v) {
    const iB = key % STRIDE;
    const iA = (key - iB) / STRIDE;
    for (const t of terms) {
      const a = A.applyMoment(t.pA, iA);
      const b = B.applyMoment(t.pB, iB);
      const c = t.c * amp;
      for (let j = 0; j < a.states.length; j++) {
        const row = W.rows.get(a.states[j]);
        if (row) s += c * a.amps[j] * rowSum(row, b.states, b.amps);
      }
    }
  }
  return s;
}

/** <w|M_p|v> with M_p acting on centre `on`: dot(w, applyLocal(p, on, v, A, B)) without building M_p|v>. */
export function localDot(p: Monomial, on: 'a' | 'b', w: ProductVector, v: ProductVector, A: LocalSpace, B: LocalSpace): number {
  const W = rowsOf(w);
  let s = 0;
  for (const [key, amp] of v) {
    const iB = key % STRIDE;
    const iA = (key - iB) / STRIDE;
    let inner = 0;
    if (on === 'a') {
      if (iB >= W.width) continue;
      const e = A.applyMoment(p, iA);
      for (let j = 0; j < e.states.length; j++) {
        const row = W.rows.get(e.states[j]);
        if (row) inner += e.amps[j] * row[iB];
      }
    } else {
      const row = W.rows.get(iA);
      if (!row) continue;
      const e = B.applyMoment(p, iB);
      inner = rowSum(row, e.states, e.amps);
    }
    s += amp * inner;
  }
  return s;
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
