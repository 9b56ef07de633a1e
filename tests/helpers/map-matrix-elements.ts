/**
 * The Map-based matrix elements the perturbation route used before its typed-array product grids
 * (src/engines/perturbation/product-grid.ts): <w|V|v> and <w|M_p|v> summed against a row view of w without
 * building V|v> or M_p|v>. Kept here as the reference the grid versions are compared with
 * (tests/engines/product-vector-typed.test.ts); tests/engines/product-vector-dots.test.ts checks them in turn against
 * the two-step formulas dot(V|v>, w) and dot(w, M_p|v>).
 */
import type { Monomial } from '../../src/hamiltonian/monomial.js';
import type { CouplingTerm } from '../../src/hamiltonian/multipole-coupling.js';
import type { LocalSpace } from '../../src/engines/perturbation/local-space.js';
import type { ProductVector } from '../../src/engines/perturbation/product-vector.js';

/** Product-vector keys are iA · 2^26 + iB (src/engines/perturbation/product-vector.ts). */
const STRIDE = 2 ** 26;

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
