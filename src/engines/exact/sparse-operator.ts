/**
 * Operators of the form Σ_k w_k (ρ+^p ρ−^q z^r)_A (ρ+^p ρ−^q z^r)_B in a {@link PairBasis}, stored as one
 * compressed-sparse-row pattern with the nonzero values of each group of terms (e.g. one per multipole order: most
 * elements get contributions from one or two orders only), so the Hamiltonian at any R is a weighted sum of the
 * groups without rebuilding the pattern.
 *
 * Matrix elements in the mirror-even basis (derived here): with v = O|s> in the product basis, f_S = √2 for a
 * paired function (|s> + |σs>)/√2 and 1 otherwise, and g_T = 1/√2 or 1 likewise,
 *   <T|O|S> = f_S g_T Σ_{t ∈ T} v_t,
 * valid for any O that commutes with the mirror σ.
 */
import {
  addScaleExponents,
  ladderScale,
  monomialActionTable,
  rationalSquareRoot,
  SCALE_PRIME_COUNT,
  type CircularMonomial,
  type MonomialActionTable,
} from './circular-states.js';
import type { PairBasis } from './pair-basis.js';

/**
 * One product term, weight = coefficient × scale. `coefficient` is the exact part (a dyadic rational: with the
 * integer ladder coefficients every partial sum is an exact double); `scale` is the species part (charges and
 * length factors), shared bit for bit by the terms whose contributions can cancel (see {@link buildSparseOperator}).
 */
export interface OperatorTerm {
  coefficient: number;
  scale: number;
  a: CircularMonomial;
  b: CircularMonomial;
}

/** The nonzero values of one group: entries rowStart[i] … rowStart[i + 1] − 1 belong to row i, at col positions `entry`. */
export interface GroupValues {
  rowStart: Int32Array;
  entry: Int32Array;
  value: Float64Array;
}

/**
 * CSR pattern with the values of each term group. `storage` 'full': every row holds all its entries, columns
 * ascending. 'lower': a symmetric matrix stored as its lower triangle (columns ≤ row, ascending, so the diagonal
 * comes last): rows of a nested basis only ever gain columns below them, so a larger basis appends rows and keeps
 * the smaller one as its exact prefix. `store` (lower storage) holds the arrays the rows were written to, with room
 * to append: the arrays of this operator are views of its first rows.
 */
export interface SparseOperator {
  size: number;
  rowPtr: Int32Array;
  col: Int32Array;
  groups: GroupValues[];
  storage: 'full' | 'lower';
  store?: RowStore;
}

/** Append-only rows of one lower-triangle operator (capacities exceed what is written; unwritten memory is never touched). */
export interface RowStore {
  rows: number;
  nnz: number;
  rowPtr: Int32Array;
  col: Int32Array;
  groups: Array<GroupValues & { count: number }>;
}

/** A store with room for `rows` rows and `entries` entries (per group too), holding a copy of `from` (when given). */
function allocateStore(groupCount: number, rows: number, entries: number, from?: RowStore): RowStore {
  const store: RowStore = {
    rows: 0,
    nnz: 0,
    rowPtr: new Int32Array(rows + 1),
    col: new Int32Array(entries),
    groups: Array.from({ length: groupCount }, () => ({
      count: 0,
      rowStart: new Int32Array(rows + 1),
      entry: new Int32Array(entries),
      value: new Float64Array(entries),
    })),
  };
  if (from) {
    store.rows = from.rows;
    store.nnz = from.nnz;
    store.rowPtr.set(from.rowPtr.subarray(0, from.rows + 1));
    store.col.set(from.col.subarray(0, from.nnz));
    from.groups.forEach((g, k) => {
      const to = store.groups[k];
      to.count = g.count;
      to.rowStart.set(g.rowStart.subarray(0, from.rows + 1));
      to.entry.set(g.entry.subarray(0, g.count));
      to.value.set(g.value.subarray(0, g.count));
    });
  }
  return store;
}

/** The operator made of the first `n` rows of a store. */
function storeView(store: RowStore, n: number): SparseOperator {
  const nnz = store.rowPtr[n];
  return {
    size: n,
    rowPtr: store.rowPtr.subarray(0, n + 1),
    col: store.col.subarray(0, nnz),
    groups: store.groups.map((g) => {
      const count = g.rowStart[n];
      return { rowStart: g.rowStart.subarray(0, n + 1), entry: g.entry.subarray(0, count), value: g.value.subarray(0, count) };
    }),
    storage: 'lower',
    store,
  };
}

/** The values of group g aligned with `col` (zeros where the group has none). */
export function denseGroup(op: SparseOperator, g: number): Float64Array {
  const { entry, value } = op.groups[g];
  if (entry.length === op.col.length) return value; // every entry (entries ascend within rows, rows in order)
  const out = new Float64Array(op.col.length);
  for (let e = 0; e < entry.length; e++) out[entry[e]] = value[e];
  return out;
}

/**
 * The matrix of each group of terms on the basis, all groups on one pattern, as the lower triangle of the symmetric
 * operator. `previous` (the same terms on a smaller nested basis) is kept as the first rows: only rows its store
 * does not have yet are computed, appended to that store when it has room (the previous operator stays valid: its
 * views end before the new rows).
 *
 * Row T = |t> (representative t = (iA, iB)) holds <S|O|T> = f_T g_S Σ_{s ∈ S} (O|t>)_s for S ≤ T. Every amplitude
 * is an integer times the scale σ(i → j) of its two local states ({@link ladderScale}), so the contribution of the
 * terms of one class (same group and same species scale F) to a product state s = (jA, jB) is
 *   F σ(iA → jA) σ(iB → jB) Σ_{α,β} coefficient_αβ c_α(iA → jA) c_β(iB → jB),
 * and the sum is exact in doubles (dyadic numbers far below 2^53). The two product states of a mirror pair, whose
 * scales differ, are added exactly too when the ratio of their scales is rational ({@link rationalSquareRoot}).
 * Matrix elements that vanish exactly (the permanent moments of a spherical centre, where F is the same for the
 * whole class) therefore come out as exact zeros, whatever the order of the terms; they are not stored. The terms are taken by A-monomial α: the B side of every term with that α
 * is first summed into W_α|iB> = Σ_β coefficient_αβ c_β β|iB> (per class), then each target jA of α|iA> meets
 * the targets jB of W_α|iB> with quanta(jA) + quanta(jB) ≤ quanta(T) (everything beyond lies above the diagonal).
 */
export function buildSparseOperator(
  basis: PairBasis,
  groups: readonly (readonly OperatorTerm[])[],
  previous?: SparseOperator,
): SparseOperator {
  const { plans, classes } = planByMonomialA(groups, basis.maxQuanta);
  const G = groups.length;
  const H = classes.length;
  const n = basis.size;
  const local = basis.local;
  const { repA, repB, paired, compact } = basis;
  let store = previous?.store && previous.groups.length === G && previous.size <= n ? previous.store : undefined;
  if (store && store.rows < previous!.size) store = undefined; // not this operator's store
  // room for a few more quanta shells: the solver grows its basis one shell at a time (virtual memory only)
  if (!store) store = allocateStore(G, 4 * n, 1024 * n);
  else if (store.rowPtr.length < n + 1) {
    // a fresh store with room for the new rows (estimated from the density of the last rows, generously)
    const perRow = (store.nnz - store.rowPtr[Math.floor(store.rows / 2)]) / Math.max(1, store.rows - Math.floor(store.rows / 2));
    store = allocateStore(G, 2 * n, store.nnz + Math.ceil(3 * perRow * (2 * n - store.rows)), store);
  }
  // per-row accumulators: exact sums per (function S, which of its product states, class), reset after each row
  const exact = new Float64Array(n * 2 * H);
  const marked = new Uint8Array(n * 2 * H);
  const keys = new Int32Array(n * 2 * H);
  const slot = new Int32Array(n).fill(-1);
  const touched = new Int32Array(n);
  const sum = new Float64Array(n * G);
  // W_α|iB>: dense accumulator over local states (the targets have at most the row's quanta, so < local.count)
  const maxClasses = Math.max(1, ...plans.map((p) => p.classes.length));
  const wSlot = new Int32Array(local.count).fill(-1);
  const wList = new Int32Array(local.count);
  const wQuanta = new Int32Array(local.count);
  const wValue = new Float64Array(local.count * maxClasses);
  const wOrder = new Int32Array(local.count);
  const ratioWork = new Int32Array(SCALE_PRIME_COUNT);
  for (let T = store.rows; T < n; T++) {
    const iA = repA[T], iB = repB[T], qT = basis.quanta[T];
    let count = 0;
    let keyCount = 0;
    for (const plan of plans) {
      const ta = plan.a;
      const aFrom = ta.start[iA], aTo = ta.start[iA + 1];
      if (aFrom === aTo || ta.quanta[aFrom] > qT) continue;
      const room = qT - ta.quanta[aFrom]; // largest B quanta any target pair can use
      const C = plan.classes.length;
      // W_α|iB>, per class of the plan
      let wCount = 0;
      for (let e = 0; e < plan.b.length; e++) {
        const tb = plan.b[e];
        const coefficient = plan.coefficient[e], h = plan.localClass[e];
        for (let k = tb.start[iB], end = tb.start[iB + 1]; k < end; k++) {
          if (tb.quanta[k] > room) break;
          const jB = tb.targets[k];
          let at = wSlot[jB];
          if (at < 0) {
            at = wSlot[jB] = wCount;
            wList[wCount] = jB;
            wQuanta[wCount] = tb.quanta[k];
            for (let x = at * C; x < at * C + C; x++) wValue[x] = 0;
            wCount++;
          }
          wValue[at * C + h] += coefficient * tb.coefficients[k];
        }
      }
      if (wCount === 0) continue;
      // the slots of W in ascending order of their targets (ascending quanta): insertion sort, the lists are short
      for (let k = 0; k < wCount; k++) {
        const jB = wList[k];
        let x = k;
        while (x > 0 && wList[wOrder[x - 1]] > jB) {
          wOrder[x] = wOrder[x - 1];
          x--;
        }
        wOrder[x] = k;
        wSlot[jB] = -1;
      }
      for (let j = aFrom; j < aTo; j++) {
        const rest = qT - ta.quanta[j];
        if (rest < 0) break;
        const jA = ta.targets[j], cA = ta.coefficients[j];
        for (let k = 0; k < wCount; k++) {
          const at = wOrder[k];
          if (wQuanta[at] > rest) break;
          const jB = wList[at];
          // (every term conserves L_z, so m(jA) + m(jB) = 0 and the compact table applies)
          const S = compact ? compact.table[compact.block[jA] + compact.rank[jB]] : basis.lookup(jA, jB);
          if (S > T || S < 0) continue;
          if (slot[S] < 0) {
            slot[S] = count;
            touched[count++] = S;
          }
          const part = repA[S] === jA && repB[S] === jB ? 0 : 1;
          const base = (S * 2 + part) * H;
          for (let h = 0; h < C; h++) {
            const w = wValue[at * C + h];
            if (w === 0) continue;
            const key = base + plan.classes[h];
            if (!marked[key]) {
              marked[key] = 1;
              keys[keyCount++] = key;
            }
            exact[key] += cA * w;
          }
        }
      }
    }
    // scales: F σ(iA → jA) σ(iB → jB) per product state and class. The two product states of a mirror pair can
    // cancel (their sum is the reduced element); when their scales have a rational ratio a/b they are added
    // exactly first, F (σ0/b)(b E0 + a E1), so an exact cancellation gives an exact zero.
    for (let pass = 0; pass < 2; pass++)
      for (let k = 0; k < keyCount; k++) {
        const key = keys[k];
        const h = key % H, sp = (key - h) / H, S = sp >> 1, part = sp & 1;
        if (part !== pass || !marked[key]) continue;
        marked[key] = 0;
        let E = exact[key];
        exact[key] = 0;
        const jA = part ? local.mirror[repA[S]] : repA[S], jB = part ? local.mirror[repB[S]] : repB[S];
        let sigma = ladderScale(local, iA, jA) * ladderScale(local, iB, jB);
        const partner = key + H;
        if (part === 0 && marked[partner]) {
          const E1 = exact[partner];
          if (E !== 0 && E1 !== 0 && E < 0 !== E1 < 0) {
            ratioWork.fill(0);
            addScaleExponents(local, iA, local.mirror[jA], 1, ratioWork);
            addScaleExponents(local, iB, local.mirror[jB], 1, ratioWork);
            addScaleExponents(local, iA, jA, -1, ratioWork);
            addScaleExponents(local, iB, jB, -1, ratioWork);
            const ratio = rationalSquareRoot(ratioWork);
            if (ratio) {
              E = ratio[1] * E + ratio[0] * E1;
              sigma /= ratio[1];
              marked[partner] = 0;
              exact[partner] = 0;
            }
          }
        }
        if (E !== 0) sum[S * G + classes[h].group] += classes[h].scale * sigma * E;
      }
    const cols = touched.subarray(0, count).sort();
    if (store.nnz + count > store.col.length || store.groups.some((g) => g.count + count > g.entry.length))
      store = allocateStore(G, store.rowPtr.length - 1, Math.max(2 * store.col.length, store.nnz + count), store);
    const fT = paired[T] ? Math.SQRT2 : 1;
    let at = store.nnz;
    for (let k = 0; k < count; k++) {
      const S = cols[k];
      slot[S] = -1;
      // f_T g_S: √2 · √½ = 1 exactly
      const factor = paired[S] ? (fT === 1 ? Math.SQRT1_2 : 1) : fT;
      let kept = false;
      for (let g = 0; g < G; g++) {
        const v = sum[S * G + g];
        if (v === 0) continue;
        sum[S * G + g] = 0;
        const group = store.groups[g];
        group.entry[group.count] = at;
        group.value[group.count++] = factor * v;
        kept = true;
      }
      if (kept) store.col[at++] = S; // elements that vanish exactly are not stored
    }
    store.nnz = at;
    store.rowPtr[T + 1] = at;
    for (const group of store.groups) group.rowStart[T + 1] = group.count;
    store.rows = T + 1;
  }
  return storeView(store, n);
}

/** A class of terms: one group and one species scale (bit for bit). */
interface TermClass {
  group: number;
  scale: number;
}

/** The terms of one A-monomial α: its B-monomials with their exact coefficients and classes. */
interface MonomialPlan {
  a: MonomialActionTable;
  b: MonomialActionTable[];
  coefficient: number[];
  /** Class of each term, as an index into `classes` of this plan. */
  localClass: number[];
  /** The global class index of each local class. */
  classes: number[];
}

function planByMonomialA(
  groups: readonly (readonly OperatorTerm[])[],
  maxQuanta: number,
): { plans: MonomialPlan[]; classes: TermClass[] } {
  const byA = new Map<string, MonomialPlan>();
  const classes: TermClass[] = [];
  const classIndex = new Map<string, number>();
  groups.forEach((terms, group) => {
    for (const t of terms) {
      const key = t.a.join(',');
      let plan = byA.get(key);
      if (!plan) byA.set(key, (plan = { a: monomialActionTable(t.a, maxQuanta), b: [], coefficient: [], localClass: [], classes: [] }));
      const classKey = `${group}:${t.scale}`;
      let h = classIndex.get(classKey);
      if (h === undefined) {
        classIndex.set(classKey, (h = classes.length));
        classes.push({ group, scale: t.scale });
      }
      let local = plan.classes.indexOf(h);
      if (local < 0) local = plan.classes.push(h) - 1;
      plan.b.push(monomialActionTable(t.b, maxQuanta));
      plan.coefficient.push(t.coefficient);
      plan.localClass.push(local);
    }
  });
  return { plans: [...byA.values()], classes };
}

/**
 * The same operator with every row complete (columns ascending): the lower triangle and its transpose. For
 * callers that read rows of the whole matrix; the solver itself works on the lower triangle.
 */
export function fullFromLower(u: SparseOperator): SparseOperator {
  if (u.storage === 'full') return u;
  const n = u.size;
  const count = new Int32Array(n + 1);
  for (let S = 0; S < n; S++)
    for (let k = u.rowPtr[S]; k < u.rowPtr[S + 1]; k++) {
      count[S]++;
      if (u.col[k] !== S) count[u.col[k]]++;
    }
  const rowPtr = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) rowPtr[i + 1] = rowPtr[i] + count[i];
  const col = new Int32Array(rowPtr[n]);
  // where each stored entry k lands: once in its own row, and (off the diagonal) transposed in row col[k]
  const own = new Int32Array(u.col.length);
  const mirrored = new Int32Array(u.col.length).fill(-1);
  const next = rowPtr.slice(0, n);
  // own (lower) entries first: columns ≤ row, ascending
  for (let T = 0; T < n; T++)
    for (let k = u.rowPtr[T]; k < u.rowPtr[T + 1]; k++) {
      const at = next[T]++;
      col[at] = u.col[k];
      own[k] = at;
    }
  // then the transposed ones: rows T ascending, so row S receives its columns T > S in ascending order
  for (let T = 0; T < n; T++)
    for (let k = u.rowPtr[T]; k < u.rowPtr[T + 1]; k++) {
      const S = u.col[k];
      if (S === T) continue;
      const at = next[S]++;
      col[at] = T;
      mirrored[k] = at;
    }
  const groups = u.groups.map((_, g) => {
    const v = denseGroup(u, g);
    const full = new Float64Array(rowPtr[n]);
    for (let k = 0; k < v.length; k++) {
      full[own[k]] = v[k];
      if (mirrored[k] >= 0) full[mirrored[k]] = v[k];
    }
    // back to nonzero lists
    const rowStart = new Int32Array(n + 1);
    const entry: number[] = [], value: number[] = [];
    for (let i = 0; i < n; i++) {
      for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++)
        if (full[k] !== 0) {
          entry.push(k);
          value.push(full[k]);
        }
      rowStart[i + 1] = entry.length;
    }
    return { rowStart, entry: Int32Array.from(entry), value: Float64Array.from(value) };
  });
  return { size: n, rowPtr, col, groups, storage: 'full' };
}

/**
 * Σ_g weights[g] · group g: the values of one combined matrix on the shared pattern, written into `out` for the
 * rows [fromRow, toRow) (default all). Each element is 0 + Σ_g w_g v_g over its groups in group order.
 */
export function combineGroups(
  op: SparseOperator,
  weights: readonly number[],
  out: Float64Array = new Float64Array(op.col.length),
  fromRow = 0,
  toRow = op.size,
): Float64Array {
  out.fill(0, op.rowPtr[fromRow], op.rowPtr[toRow]);
  op.groups.forEach(({ rowStart, entry, value }, g) => {
    const w = weights[g];
    if (w === 0) return;
    for (let e = rowStart[fromRow]; e < rowStart[toRow]; e++) out[entry[e]] += w * value[e];
  });
  return out;
}

/**
 * y = (M + diag) x on the leading `dim` basis functions (the nested basis of fewer quanta). For 'lower' storage each
 * stored off-diagonal entry M_ij (j < i) adds M_ij x_j to y_i and M_ij x_i to y_j.
 */
export function multiplyPrefix(
  op: SparseOperator,
  values: Float64Array,
  diagonal: Float64Array | null,
  x: Float64Array,
  y: Float64Array,
  dim: number,
): void {
  const { rowPtr, col } = op;
  if (op.storage === 'lower') {
    y.fill(0, 0, dim);
    for (let i = 0; i < dim; i++) {
      const xi = x[i];
      let s = diagonal ? diagonal[i] * xi : 0;
      const end = rowPtr[i + 1];
      if (end === rowPtr[i]) {
        y[i] += s;
        continue;
      }
      // columns ascending: every entry but the last lies strictly below the diagonal
      for (let k = rowPtr[i]; k < end - 1; k++) {
        const c = col[k], v = values[k];
        s += v * x[c];
        y[c] += v * xi;
      }
      const c = col[end - 1], v = values[end - 1];
      s += v * x[c];
      if (c !== i) y[c] += v * xi;
      y[i] += s;
    }
    return;
  }
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
  const lower = op.storage === 'lower';
  let s = 0;
  for (let i = 0; i < dim; i++) {
    if (x[i] === 0) continue;
    let row = 0;
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
      const c = col[k];
      if (c >= dim) break;
      // lower storage: each off-diagonal entry stands for itself and its transpose
      row += (lower && c !== i ? 2 : 1) * values[k] * x[c];
    }
    s += x[i] * row;
  }
  return s;
}
