/**
 * Product vectors of the perturbation route on typed arrays. Each centre's states get dense integer numbers in the
 * order they are first met (`CompactSpace`; the ground state is 0), so a vector on A ⊗ B is a flat Float64Array
 * over (compact A, compact B) plus the list of its non-zero entries: a lookup is an array read, a loop runs over the
 * non-zero entries only, and nothing is boxed (a Map of numbers keyed beyond 2^31 allocates a heap number per key
 * and per value: most of the route's garbage collection).
 *
 * The route runs once per pair, so most of its loops run before the JIT has compiled them: each operation first
 * fetches every moment action it needs (`prepare`, the only path into the local spaces' caches) and then runs small
 * arithmetic kernels over typed arrays (`gather`, `gatherStrided`, `axpy`), which stay cheap to compile.
 *
 * The operations are those of product-vector.ts (the Map-based reference, still used by multi-order.ts), with the
 * same products; sums run in another order, so results agree to rounding
 * (tests/engines/product-vector-typed.test.ts compares the route with the Map formulas to 1e-13).
 */
import { type Monomial, monomialKey } from '../../hamiltonian/monomial.js';
import type { CouplingTerm } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';

/**
 * M_p |c> in compact numbers: target states and amplitudes (plain arrays: small typed arrays live outside the heap
 * and cost more to make than to use here; the amplitudes are the local space's own array).
 */
export interface CompactEntries {
  readonly states: readonly number[];
  readonly amps: readonly number[];
}

/** Moment actions of one monomial, by compact state (filled by {@link CompactSpace.prepare}). */
export type MomentTable = Array<CompactEntries | undefined>;

/**
 * A local space with its states numbered densely in order of first use (local index 0, the ground state, is 0) and
 * its moment actions in those numbers, cached per (monomial, state). One per LocalSpace object (spaces are cached
 * per species, so a table reuses the numbering and the converted moments).
 */
export class CompactSpace {
  private readonly numbers = new Map<number, number>();
  private readonly locals: number[] = [];
  private excitations = new Float64Array(64);
  private readonly moments = new Map<number, MomentTable>();

  constructor(readonly space: LocalSpace) {
    this.numberOf(0);
  }

  /** States numbered so far. */
  get size(): number {
    return this.locals.length;
  }

  /** Excitation energy of compact state c, hartree. */
  excitation(c: number): number {
    return this.excitations[c];
  }

  /** The compact number of local state i (assigned on first use). */
  numberOf(i: number): number {
    let c = this.numbers.get(i);
    if (c === undefined) {
      c = this.locals.length;
      this.numbers.set(i, c);
      this.locals.push(i);
      if (c >= this.excitations.length) {
        const grown = new Float64Array(2 * this.excitations.length);
        grown.set(this.excitations);
        this.excitations = grown;
      }
      this.excitations[c] = this.space.excitation(i);
    }
    return c;
  }

  /**
   * The moment table of M_p with entries for the compact states `from` … `to − 1` (or the single state `from`)
   * filled in: afterwards table[c] is defined for each of them.
   */
  prepare(p: Monomial, from: number, to = from + 1): MomentTable {
    const key = monomialKey(p);
    let table = this.moments.get(key);
    if (!table) this.moments.set(key, (table = []));
    for (let c = from; c < to; c++) if (!table[c]) table[c] = this.convert(p, c);
    return table;
  }

  /** M_p |c> in compact numbers (numbering any new target). */
  private convert(p: Monomial, c: number): CompactEntries {
    const local = this.space.applyMoment(p, this.locals[c]);
    const states: number[] = [];
    for (let j = 0; j < local.states.length; j++) states.push(this.numberOf(local.states[j]));
    return { states, amps: local.amps };
  }
}

const compactSpaces = new WeakMap<LocalSpace, CompactSpace>();

/** The compact numbering of a local space (one per space object). */
export function compactSpace(space: LocalSpace): CompactSpace {
  let c = compactSpaces.get(space);
  if (!c) compactSpaces.set(space, (c = new CompactSpace(space)));
  return c;
}

/**
 * A vector on A ⊗ B: x[a·nB + b] is the amplitude of |a b> (compact numbers; nA × nB covers the states the vector
 * can hold, the others have amplitude 0), `nonzero` the flat indices of its non-zero entries, ascending.
 */
export interface ProductGrid {
  readonly nA: number;
  readonly nB: number;
  readonly x: Float64Array;
  readonly nonzero: Int32Array;
}

/** Scratch for the non-zero indices of a new grid (grown as needed; fresh large arrays are slow to make). */
let indexScratch = new Int32Array(1 << 12);

/** The grid of x (nA × nB), its non-zero entries listed by one scan. */
function grid(nA: number, nB: number, x: Float64Array): ProductGrid {
  if (indexScratch.length < x.length) indexScratch = new Int32Array(Math.max(x.length, 2 * indexScratch.length));
  const all = indexScratch;
  let count = 0;
  for (let k = 0; k < x.length; k++) if (x[k] !== 0) all[count++] = k;
  return { nA, nB, x, nonzero: all.slice(0, count) };
}

/** 1 + the largest state of some moment actions (the extent a vector of their targets needs). */
function extent(entries: readonly CompactEntries[]): number {
  let top = 0;
  for (const e of entries) for (let j = 0; j < e.states.length; j++) top = Math.max(top, e.states[j] + 1);
  return top;
}

// ---- arithmetic kernels (small on purpose: they are what the JIT compiles) ----

/** Σ_k e.amps[k] · x[base + e.states[k]] over the entries with states[k] < limit. */
function gather(x: Float64Array, base: number, limit: number, e: CompactEntries): number {
  const { states, amps } = e;
  let s = 0;
  for (let k = 0; k < states.length; k++) if (states[k] < limit) s += amps[k] * x[base + states[k]];
  return s;
}

/** Σ_j e.amps[j] · x[e.states[j] · stride + offset] over the entries with states[j] < limit. */
function gatherStrided(x: Float64Array, stride: number, offset: number, limit: number, e: CompactEntries): number {
  const { states, amps } = e;
  let s = 0;
  for (let j = 0; j < states.length; j++) if (states[j] < limit) s += amps[j] * x[states[j] * stride + offset];
  return s;
}

/** y[i] += c · x[base + i] for i < y.length. */
function axpy(y: Float64Array, c: number, x: Float64Array, base: number): void {
  for (let i = 0; i < y.length; i++) y[i] += c * x[base + i];
}

/** out[row + states[k]] += c · amps[k] for every entry of e. */
function scatter(out: Float64Array, row: number, c: number, e: CompactEntries): void {
  const { states, amps } = e;
  for (let k = 0; k < states.length; k++) out[row + states[k]] += c * amps[k];
}

// ---- vectors and matrix elements ----

/** The unperturbed ground state |0_A 0_B>. */
export const groundGrid = (): ProductGrid => grid(1, 1, Float64Array.of(1));

/** <0|v>, the ground-state amplitude. */
export const groundAmplitude = (v: ProductGrid): number => v.x[0];

/** V|0> with V = Σ_k c_k M^A_{pA_k} M^B_{pB_k} (distance factor R^-(n+1) not included). */
export function couplingOnGround(terms: readonly CouplingTerm[], A: CompactSpace, B: CompactSpace): ProductGrid {
  const parts = terms.map((t) => [A.prepare(t.pA, 0)[0]!, B.prepare(t.pB, 0)[0]!] as const); // numbers every target first
  const nA = Math.max(1, extent(parts.map((q) => q[0]))), nB = Math.max(1, extent(parts.map((q) => q[1])));
  const x = new Float64Array(nA * nB);
  for (let i = 0; i < terms.length; i++) {
    const [a, b] = parts[i];
    const c = terms[i].c;
    for (let j = 0; j < a.states.length; j++) scatter(x, a.states[j] * nB, c * a.amps[j], b);
  }
  return grid(nA, nB, x);
}

/** M_p|0> with the moment acting on centre `on`. */
export function momentOnGround(p: Monomial, on: 'a' | 'b', A: CompactSpace, B: CompactSpace): ProductGrid {
  const e = (on === 'a' ? A : B).prepare(p, 0)[0]!;
  const n = Math.max(1, extent([e]));
  const nA = on === 'a' ? n : 1, nB = on === 'a' ? 1 : n;
  const x = new Float64Array(nA * nB);
  scatter(x, 0, 1, e);
  return grid(nA, nB, x);
}

/** The reduced resolvent Q (H0 − E0)^-1 Q: drops the ground component, divides by the excitation energy. */
export function resolventGrid(v: ProductGrid, A: CompactSpace, B: CompactSpace): ProductGrid {
  const x = new Float64Array(v.x.length);
  const nonzero = v.nonzero[0] === 0 ? v.nonzero.slice(1) : v.nonzero;
  for (let i = 0; i < nonzero.length; i++) {
    const k = nonzero[i], b = k % v.nB, a = (k - b) / v.nB;
    x[k] = v.x[k] / (A.excitation(a) + B.excitation(b));
  }
  return { nA: v.nA, nB: v.nB, x, nonzero };
}

/** <u|v> for real vectors. */
export function gridDot(u: ProductGrid, v: ProductGrid): number {
  const small = u.nonzero.length <= v.nonzero.length ? u : v, large = small === u ? v : u;
  let s = 0;
  for (let i = 0; i < small.nonzero.length; i++) {
    const k = small.nonzero[i], b = k % small.nB, a = (k - b) / small.nB;
    if (a < large.nA && b < large.nB) s += small.x[k] * large.x[a * large.nB + b];
  }
  return s;
}

/** The distinct A and B states of v's non-zero entries, ascending. */
function statesOf(v: ProductGrid): { a: number[]; b: number[] } {
  const usedA = new Uint8Array(v.nA), usedB = new Uint8Array(v.nB);
  for (let i = 0; i < v.nonzero.length; i++) {
    const k = v.nonzero[i], b = k % v.nB;
    usedB[b] = 1;
    usedA[(k - b) / v.nB] = 1;
  }
  const list = (used: Uint8Array) => {
    const out: number[] = [];
    for (let c = 0; c < used.length; c++) if (used[c]) out.push(c);
    return out;
  };
  return { a: list(usedA), b: list(usedB) };
}

/**
 * The partial sums over one centre that {@link couplingDotGrid} forms against w, by (centre, monomial, state): kept
 * with w, since the route forms the same ones against the same φ for several matrix elements.
 */
const partialsByVector = new WeakMap<ProductGrid, Map<number, Float64Array>>();
function partialSums(w: ProductGrid): Map<number, Float64Array> {
  let m = partialsByVector.get(w);
  if (!m) partialsByVector.set(w, (m = new Map()));
  return m;
}

/**
 * <w|V|v> with V = Σ_t c_t M^A_{pA_t} M^B_{pB_t}, contracting one centre first: with v on few B states (χ of a
 * dipole on A), y_{pB,b}[a'] = Σ_k (M_pB|b>)_k w[a'][k] is formed once per (pB, b) and
 * <w|V|v> = Σ_{ab} v_ab Σ_t c_t Σ_j (M_pA|a>)_j y_{pB,b}[j]; on few A states, the mirror image. The same products as
 * <w|(V|v>)>, grouped per centre.
 */
export function couplingDotGrid(terms: readonly CouplingTerm[], v: ProductGrid, w: ProductGrid, A: CompactSpace, B: CompactSpace): number {
  const states = statesOf(v);
  const contractB = states.b.length <= states.a.length;
  const [inner, outer] = contractB ? [B, A] : [A, B];
  const [innerStates, outerStates] = contractB ? [states.b, states.a] : [states.a, states.b];
  // every moment action first (numbers new states), then the partial sums over the contracted centre
  const innerTables = terms.map((t) => {
    const p = contractB ? t.pB : t.pA;
    let table: MomentTable = [];
    for (const c of innerStates) table = inner.prepare(p, c);
    return table;
  });
  const outerTables = terms.map((t) => {
    const p = contractB ? t.pA : t.pB;
    let table: MomentTable = [];
    for (const c of outerStates) table = outer.prepare(p, c);
    return table;
  });
  const partials = partialSums(w);
  const keyOf = (t: number, c: number) => ((contractB ? 0 : 2 ** 15) + monomialKey(contractB ? terms[t].pB : terms[t].pA)) * 2 ** 26 + c;
  terms.forEach((_, t) => {
    for (const c of innerStates) {
      const key = keyOf(t, c);
      if (partials.has(key)) continue;
      const e = innerTables[t][c]!;
      const y = new Float64Array(contractB ? w.nA : w.nB);
      if (contractB) for (let a = 0; a < w.nA; a++) y[a] = gather(w.x, a * w.nB, w.nB, e);
      else for (let j = 0; j < e.states.length; j++) if (e.states[j] < w.nA) axpy(y, e.amps[j], w.x, e.states[j] * w.nB);
      partials.set(key, y);
    }
  });
  let s = 0;
  for (let i = 0; i < v.nonzero.length; i++) {
    const k = v.nonzero[i], b = k % v.nB, a = (k - b) / v.nB;
    const [ci, co] = contractB ? [b, a] : [a, b];
    let sum = 0;
    for (let t = 0; t < terms.length; t++) {
      const y = partials.get(keyOf(t, ci))!;
      sum += terms[t].c * gather(y, 0, y.length, outerTables[t][co]!);
    }
    s += v.x[k] * sum;
  }
  return s;
}

/** <w|M_p|v> with M_p acting on centre `on`: Σ_{ab} v_ab Σ_j (M_p|a>)_j w[j][b] (or on b), over the sparser vector. */
export function localDotGrid(p: Monomial, on: 'a' | 'b', w: ProductGrid, v: ProductGrid, A: CompactSpace, B: CompactSpace): number {
  // <w|M_p|v> = <v|M_p|w> (M_p real symmetric): the moment acts on the vector with fewer entries
  if (w.nonzero.length < v.nonzero.length) [w, v] = [v, w];
  const space = on === 'a' ? A : B;
  let table: MomentTable = [];
  for (const c of statesOf(v)[on]) table = space.prepare(p, c);
  let s = 0;
  for (let i = 0; i < v.nonzero.length; i++) {
    const k = v.nonzero[i], b = k % v.nB, a = (k - b) / v.nB;
    if (on === 'a') {
      if (b < w.nB) s += v.x[k] * gatherStrided(w.x, w.nB, b, w.nA, table[a]!);
    } else if (a < w.nA) s += v.x[k] * gather(w.x, a * w.nB, w.nB, table[b]!);
  }
  return s;
}
