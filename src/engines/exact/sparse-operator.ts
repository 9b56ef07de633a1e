/**
 * Operators of the form Σ_k w_k (ρ+^p ρ−^q z^r)_A (ρ+^p ρ−^q z^r)_B in a {@link PairBasis}, stored as one
 * compressed-sparse-row pattern with one value array per group of terms (e.g. one per multipole order), so the
 * Hamiltonian at any R is a weighted sum of the groups without rebuilding the pattern.
 *
 * Matrix elements in the mirror-even basis (derived here): with v = O|s> in the product basis, f_S = √2 for a
 * paired function (|s> + |σs>)/√2 and 1 otherwise, and g_T = 1/√2 or 1 likewise,
 *   <T|O|S> = f_S g_T Σ_{t ∈ T} v_t,
 * valid for any O that commutes with the mirror σ.
 */
import { ladderActionCache, type CircularMonomial } from './circular-states.js';
import type { PairBasis } from './pair-basis.js';

/** One product term; `weight` includes the length factors of both centres. */
export interface OperatorTerm {
  weight: number;
  a: CircularMonomial;
  b: CircularMonomial;
}

/** CSR matrix with one value array per term group; columns ascending within each row. */
export interface SparseOperator {
  size: number;
  rowPtr: Int32Array;
  col: Int32Array;
  values: Float64Array[];
}

/**
 * Build the matrix of each group of terms on the basis (all groups share one pattern). The operators are symmetric
 * (Hermitian with real elements), so only the upper triangle T ≥ S is computed — targets with fewer quanta than the
 * row come before it and are skipped before the lookup — and the lower one is its transpose.
 */
export function buildSparseOperator(basis: PairBasis, groups: readonly (readonly OperatorTerm[])[]): SparseOperator {
  const upper = buildUpperTriangle(basis, groups);
  return symmetricFromUpper(upper);
}

/** Rows of the upper triangle (columns ≥ row, ascending). */
function buildUpperTriangle(basis: PairBasis, groups: readonly (readonly OperatorTerm[])[]): SparseOperator {
  const act = ladderActionCache(basis.local);
  const localQuanta = basis.local.quanta;
  const G = groups.length;
  const n = basis.size;
  // row accumulator: dense scratch indexed by column, reset after each row
  const slot = new Int32Array(n).fill(-1);
  const touched: number[] = [];
  const scratch = new Float64Array(n * G);
  let col = new Int32Array(Math.max(16, 8 * n * G));
  let values = Array.from({ length: G }, () => new Float64Array(col.length));
  const rowPtr = new Int32Array(n + 1);
  let nnz = 0;
  for (let S = 0; S < n; S++) {
    const iA = basis.repA[S], iB = basis.repB[S];
    const fS = basis.paired[S] ? Math.SQRT2 : 1;
    const qS = basis.quanta[S];
    for (let g = 0; g < G; g++)
      for (const t of groups[g]) {
        const ea = act(t.a, iA);
        const eb = act(t.b, iB);
        for (let j = 0; j < ea.targets.length; j++) {
          const wa = t.weight * fS * ea.amps[j];
          const jA = ea.targets[j];
          const below = qS - localQuanta[jA]; // targets on B with fewer quanta than this lie before row S
          for (let k = 0; k < eb.targets.length; k++) {
            if (localQuanta[eb.targets[k]] < below) continue;
            const T = basis.lookup(jA, eb.targets[k]);
            if (T < S) continue; // T < 0 (outside the basis) or in the lower triangle
            if (slot[T] < 0) {
              slot[T] = touched.length;
              touched.push(T);
            }
            scratch[T * G + g] += wa * eb.amps[k] * (basis.paired[T] ? Math.SQRT1_2 : 1);
          }
        }
      }
    touched.sort((x, y) => x - y);
    if (nnz + touched.length > col.length) {
      const size = Math.max(2 * col.length, nnz + touched.length);
      const grownCol = new Int32Array(size);
      grownCol.set(col);
      col = grownCol;
      values = values.map((v) => {
        const w = new Float64Array(size);
        w.set(v);
        return w;
      });
    }
    for (const T of touched) {
      col[nnz] = T;
      for (let g = 0; g < G; g++) {
        values[g][nnz] = scratch[T * G + g];
        scratch[T * G + g] = 0;
      }
      slot[T] = -1;
      nnz++;
    }
    touched.length = 0;
    rowPtr[S + 1] = nnz;
  }
  return { size: n, rowPtr, col: col.slice(0, nnz), values: values.map((v) => v.slice(0, nnz)) };
}

/** The full symmetric CSR from its upper triangle: row T gets the transposed entries of rows S < T first, then its own. */
function symmetricFromUpper(u: SparseOperator): SparseOperator {
  const n = u.size;
  const count = new Int32Array(n + 1);
  for (let S = 0; S < n; S++)
    for (let k = u.rowPtr[S]; k < u.rowPtr[S + 1]; k++) {
      count[S]++;
      if (u.col[k] !== S) count[u.col[k]]++;
    }
  const rowPtr = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) rowPtr[i + 1] = rowPtr[i] + count[i];
  const nnz = rowPtr[n];
  const col = new Int32Array(nnz);
  // where each stored upper entry k lands: once in its own row, and (off the diagonal) transposed in row col[k]
  const own = new Int32Array(u.col.length);
  const mirrored = new Int32Array(u.col.length).fill(-1);
  const next = rowPtr.slice(0, n);
  // transposed (lower) entries: rows S ascending, so each row T receives its columns S < T in ascending order
  for (let S = 0; S < n; S++)
    for (let k = u.rowPtr[S]; k < u.rowPtr[S + 1]; k++) {
      const T = u.col[k];
      if (T === S) continue;
      const at = next[T]++;
      col[at] = S;
      mirrored[k] = at;
    }
  // then each row's own upper entries (columns ≥ row, ascending)
  for (let S = 0; S < n; S++)
    for (let k = u.rowPtr[S]; k < u.rowPtr[S + 1]; k++) {
      const at = next[S]++;
      col[at] = u.col[k];
      own[k] = at;
    }
  const values = u.values.map((v) => {
    const out = new Float64Array(nnz);
    for (let k = 0; k < v.length; k++) {
      out[own[k]] = v[k];
      if (mirrored[k] >= 0) out[mirrored[k]] = v[k];
    }
    return out;
  });
  return { size: n, rowPtr, col, values };
}

/**
 * Σ_g weights[g] · values[g]: the values of one combined matrix on the shared pattern, written into `out` for the
 * stored entries [from, to) (default all; a range of whole rows is rowPtr[i] … rowPtr[j]).
 */
export function combineGroups(
  op: SparseOperator,
  weights: readonly number[],
  out: Float64Array = new Float64Array(op.col.length),
  from = 0,
  to = op.col.length,
): Float64Array {
  out.fill(0, from, to);
  weights.forEach((w, g) => {
    if (w === 0) return;
    const v = op.values[g];
    for (let k = from; k < to; k++) out[k] += w * v[k];
  });
  return out;
}

/** y = (M + diag) x on the leading `dim` basis functions (the nested basis of fewer quanta). */
export function multiplyPrefix(
  op: SparseOperator,
  values: Float64Array,
  diagonal: Float64Array | null,
  x: Float64Array,
  y: Float64Array,
  dim: number,
): void {
  const { rowPtr, col } = op;
  for (let i = 0; i < dim; i++) {
    let s = diagonal ? diagonal[i] * x[i] : 0;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const c = col[k];
      if (c >= dim) break;
      s += values[k] * x[c];
    }
    y[i] = s;
  }
}

/** <x|M|x> on the leading `dim` functions. */
export function expectationPrefix(op: SparseOperator, values: Float64Array, x: Float64Array, dim: number): number {
  const { rowPtr, col } = op;
  let s = 0;
  for (let i = 0; i < dim; i++) {
    if (x[i] === 0) continue;
    let row = 0;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const c = col[k];
      if (c >= dim) break;
      row += values[k] * x[c];
    }
    s += x[i] * row;
  }
  return s;
}
