/**
 * The states of one axially symmetric 3D harmonic oscillator in circular quantum numbers |n+, n−, nz>,
 * and the action of position monomials on them by ladder operators.
 *
 * With a± = (a_x ∓ i a_y)/√2 the circular quanta carry L_z = m = n+ − n−, and the in-plane coordinates are
 *   ρ+ = x + i y = √2 s⊥ (a+† + a−),   ρ− = x − i y = √2 s⊥ (a−† + a+),   z = s_z (a_z + a_z†),
 * with s = 1/sqrt(2 m w) (atomic units). Every coefficient is real, ρ+ raises m by one, ρ− lowers it, and the
 * mirror y → −y swaps a+ ↔ a−, i.e. |n+, n−, nz> → |n−, n+, nz> with no phase (derived here from the
 * Cartesian ladder operators; e.g. C. Cohen-Tannoudji, B. Diu, F. Laloë, Quantum Mechanics, vol. 1, ch. VI, for
 * circular quanta of the 2D oscillator).
 */
import { binomial } from '../../math/combinatorics.js';

/** A monomial ρ+^p ρ−^q z^r of one centre's coordinates, as [p, q, r]. */
export type CircularMonomial = readonly [number, number, number];

/** All states of one centre with at most `maxQuanta` quanta, ordered by total quanta. */
export interface LocalStates {
  maxQuanta: number;
  count: number;
  nPlus: Int32Array;
  nMinus: Int32Array;
  nZ: Int32Array;
  /** n+ + n− + nz. */
  quanta: Int32Array;
  /** L_z = n+ − n−. */
  m: Int32Array;
  /** Index of the mirror image |n−, n+, nz>. */
  mirror: Int32Array;
  /** Index of |n+, n−, nz>, or −1 when it has more than `maxQuanta` quanta. */
  index(nPlus: number, nMinus: number, nZ: number): number;
}

const localCache = new Map<number, LocalStates>();

/** Enumerate the local states (cached per `maxQuanta`). */
export function localStates(maxQuanta: number): LocalStates {
  const hit = localCache.get(maxQuanta);
  if (hit) return hit;
  const K = maxQuanta + 1;
  const table = new Int32Array(K * K * K).fill(-1);
  const np: number[] = [], nm: number[] = [], nz: number[] = [];
  for (let n = 0; n <= maxQuanta; n++)
    for (let z = n; z >= 0; z--)
      for (let p = n - z; p >= 0; p--) {
        table[p + K * (n - z - p) + K * K * z] = np.length;
        np.push(p);
        nm.push(n - z - p);
        nz.push(z);
      }
  const count = np.length;
  const index = (p: number, q: number, z: number): number =>
    p < 0 || q < 0 || z < 0 || p + q + z > maxQuanta ? -1 : table[p + K * q + K * K * z];
  const states: LocalStates = {
    maxQuanta,
    count,
    nPlus: Int32Array.from(np),
    nMinus: Int32Array.from(nm),
    nZ: Int32Array.from(nz),
    quanta: Int32Array.from(np, (p, i) => p + nm[i] + nz[i]),
    m: Int32Array.from(np, (p, i) => p - nm[i]),
    mirror: Int32Array.from(np, (p, i) => index(nm[i], p, nz[i])),
    index,
  };
  localCache.set(maxQuanta, states);
  return states;
}

/** One linear ladder combination a_raise† + a_lower on the three modes (0 = +, 1 = −, 2 = z). */
type LadderPair = readonly [raise: number, lower: number];
const RHO_PLUS: LadderPair = [0, 1];
const RHO_MINUS: LadderPair = [1, 0];
const ZETA: LadderPair = [2, 2];

/** Untruncated intermediate states are keyed by n+ + B n− + B² nz. */
const B = 128;

function applyLadderPair(v: Map<number, number>, [raise, lower]: LadderPair): Map<number, number> {
  const out = new Map<number, number>();
  const stride = [1, B, B * B];
  for (const [key, amp] of v) {
    const n = [key % B, Math.floor(key / B) % B, Math.floor(key / (B * B))];
    const up = key + stride[raise];
    out.set(up, (out.get(up) ?? 0) + amp * Math.sqrt(n[raise] + 1));
    if (n[lower] > 0) {
      const down = key - stride[lower];
      out.set(down, (out.get(down) ?? 0) + amp * Math.sqrt(n[lower]));
    }
  }
  return out;
}

/** Sparse result of a monomial on a local state: target indices and amplitudes. */
export interface LocalAction {
  targets: Int32Array;
  amps: Float64Array;
}

/**
 * (a+† + a−)^p (a−† + a+)^q (a_z + a_z†)^r |state> restricted to the local states — the monomial ρ+^p ρ−^q z^r
 * without its length factors (√2 s⊥)^(p+q) s_z^r. The three factors commute (they are functions of position).
 */
export function ladderMonomialAction(states: LocalStates, mono: CircularMonomial, i: number): LocalAction {
  let v = new Map<number, number>([[states.nPlus[i] + B * states.nMinus[i] + B * B * states.nZ[i], 1]]);
  for (let k = 0; k < mono[0]; k++) v = applyLadderPair(v, RHO_PLUS);
  for (let k = 0; k < mono[1]; k++) v = applyLadderPair(v, RHO_MINUS);
  for (let k = 0; k < mono[2]; k++) v = applyLadderPair(v, ZETA);
  const targets: number[] = [];
  const amps: number[] = [];
  for (const [key, amp] of v) {
    const j = states.index(key % B, Math.floor(key / B) % B, Math.floor(key / (B * B)));
    if (j >= 0 && amp !== 0) {
      targets.push(j);
      amps.push(amp);
    }
  }
  return { targets: Int32Array.from(targets), amps: Float64Array.from(amps) };
}

/**
 * sqrt(max(n, n')! / min(n, n')!) for one mode: every amplitude <n'|(a + a†)^r ...|n> of a ladder monomial is an
 * integer multiple of it (normal ordering gives integer coefficients, and (a†)^p a^q|n> = sqrt(n!/(n−q)!)
 * sqrt(n'!/(n−q)!)|n'>; derived here). Always the same double for the same pair of levels.
 */
const MODE_LEVELS = 64;
let modeScales: Float64Array | undefined;
function modeScale(n: number, nPrime: number): number {
  if (!modeScales) {
    modeScales = new Float64Array(MODE_LEVELS * MODE_LEVELS);
    for (let lo = 0; lo < MODE_LEVELS; lo++) {
      let v = 1;
      for (let hi = lo; hi < MODE_LEVELS; hi++) {
        if (hi > lo) v *= Math.sqrt(hi);
        modeScales[lo * MODE_LEVELS + hi] = modeScales[hi * MODE_LEVELS + lo] = v;
      }
    }
  }
  if (n >= MODE_LEVELS || nPrime >= MODE_LEVELS) throw new RangeError(`more than ${MODE_LEVELS - 1} quanta in one mode`);
  return modeScales[n * MODE_LEVELS + nPrime];
}

/** The common scale σ(i → j) = Π_modes sqrt(max!/min!) of every monomial amplitude from local state i to j. */
export function ladderScale(states: LocalStates, i: number, j: number): number {
  return (
    modeScale(states.nPlus[i], states.nPlus[j]) * modeScale(states.nMinus[i], states.nMinus[j]) * modeScale(states.nZ[i], states.nZ[j])
  );
}

/** Primes below {@link MODE_LEVELS}: σ(i → j)² is a product of them. */
const SCALE_PRIMES = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43, 47, 53, 59, 61];
let factorialExponents: Int32Array | undefined;

/**
 * Add `sign` × the prime exponents of σ(i → j)² = Π_modes max!/min! to `out` (one entry per prime below 64). Two
 * scales have a rational ratio exactly when the exponents of their squares differ by even numbers.
 */
export function addScaleExponents(states: LocalStates, i: number, j: number, sign: number, out: Int32Array): void {
  const P = SCALE_PRIMES.length;
  if (!factorialExponents) {
    factorialExponents = new Int32Array(MODE_LEVELS * P);
    for (let n = 1; n < MODE_LEVELS; n++)
      for (let p = 0; p < P; p++) {
        let e = 0;
        for (let m = n; m % SCALE_PRIMES[p] === 0; m /= SCALE_PRIMES[p]) e++;
        factorialExponents[n * P + p] = factorialExponents[(n - 1) * P + p] + e;
      }
  }
  const fe = factorialExponents;
  const levels = [states.nPlus, states.nMinus, states.nZ];
  for (const level of levels) {
    const lo = Math.min(level[i], level[j]) * P, hi = Math.max(level[i], level[j]) * P;
    for (let p = 0; p < P; p++) out[p] += sign * (fe[hi + p] - fe[lo + p]);
  }
}

/**
 * sqrt(Π p^e_p) for the exponents accumulated in `work` (e.g. σ1²/σ0² by {@link addScaleExponents}), as a reduced
 * fraction [a, b] of integers when it is rational, else null.
 */
export function rationalSquareRoot(work: Int32Array): [number, number] | null {
  let a = 1, b = 1;
  for (let p = 0; p < SCALE_PRIMES.length; p++) {
    const d = work[p];
    if (d % 2 !== 0) return null;
    if (d > 0) a *= SCALE_PRIMES[p] ** (d / 2);
    else if (d < 0) b *= SCALE_PRIMES[p] ** (-d / 2);
  }
  return [a, b];
}

/** Number of primes {@link addScaleExponents} tracks (the length of its `out`). */
export const SCALE_PRIME_COUNT = SCALE_PRIMES.length;

/**
 * The action of one monomial on every local state up to some number of quanta, as flat arrays: the targets of
 * state i are targets[start[i] … start[i + 1]), in ascending index order (so ascending total quanta), with their
 * quanta and integer coefficients c: the amplitude is c · {@link ladderScale}(i, target). Targets are not truncated
 * (a target may have more quanta than the table's states).
 */
export interface MonomialActionTable {
  /** Number of local states covered (a prefix of the enumeration by total quanta). */
  states: number;
  start: Int32Array;
  targets: Int32Array;
  /** Integer coefficients (exact doubles). */
  coefficients: Float64Array;
  quanta: Int32Array;
}

/**
 * Process-wide store of monomial actions (species-independent, so shared by every model and basis size). Each
 * table grows by whole quanta shells as larger bases ask for it; targets are indexed in the local states of
 * quanta + degree quanta, which hold every one (the enumeration is by total quanta, so a state's index is the same
 * in every larger set). Their amplitudes are those of {@link ladderMonomialAction} (σ · c; a test compares them).
 */
const actionTables = new Map<number, GrowingTable>();

/** Falling product hi (hi − 1) … (lo + 1) = hi!/lo! (1 when hi ≤ lo). */
function factorialRatio(hi: number, lo: number): number {
  let v = 1;
  for (let k = lo + 1; k <= hi; k++) v *= k;
  return v;
}

/**
 * Integer coefficients of (a + a†)^r |n> = Σ_n' c_n' σ(n → n') |n'> (one mode), by applying a + a† r times to the
 * coefficients: with σ(n → m ± 1) = σ(n → m) sqrt(m + 1) or sqrt(m), a step away from n keeps c and a step back
 * towards n multiplies it by the level left behind (derived here). Cached per (r, n); index n' − n + r.
 */
const zCache = new Map<number, Float64Array>();
function zCoefficients(r: number, n: number): Float64Array {
  const key = r * 4096 + n;
  let c = zCache.get(key);
  if (c) return c;
  c = new Float64Array(2 * r + 1);
  c[r] = 1;
  for (let step = 0; step < r; step++) {
    const next = new Float64Array(2 * r + 1);
    for (let x = 0; x <= 2 * r; x++) {
      if (c[x] === 0) continue;
      const m = n + x - r;
      // raise to m + 1 (amplitude sqrt(m + 1)), lower to m − 1 (amplitude sqrt(m))
      next[x + 1] += m >= n ? c[x] : c[x] * (m + 1);
      if (m > 0) next[x - 1] += m <= n ? c[x] : c[x] * m;
    }
    c = next;
  }
  zCache.set(key, c);
  return c;
}

/**
 * The action of ρ+^p ρ−^q z^r (ladder form, see {@link ladderMonomialAction}) on |n+, n−, nz> as integer
 * coefficients of the scales σ, targets ascending. With ρ+ = a+† + a−, ρ− = a−† + a+ (commuting):
 *   ρ+^p ρ−^q = Σ_{k,l} C(p, k) C(q, l) [(a+†)^k a+^(q−l)] [a−^(p−k) (a−†)^l],
 * and (a†)^k a^j |n> = [min(n, n')!/(n − j)!] σ(n → n') |n'>, a^j (a†)^l |n> = [(n + l)!/max(n, n')!] σ(n → n') |n'>
 * (derived here); both targets depend on k + l only, so terms of equal k + l add.
 */
const planarScratch = new Float64Array(64);
const foundTarget = new Int32Array(256);
const foundCoefficient = new Float64Array(256);

function monomialCoefficients(
  reach: LocalStates,
  mono: CircularMonomial,
  i: number,
  out: { targets: Int32Array; coefficients: Float64Array; quanta: Int32Array },
  at: number,
): number {
  const p = mono[0], q = mono[1], r = mono[2];
  const nP = reach.nPlus[i], nM = reach.nMinus[i], nZ = reach.nZ[i];
  const planar = planarScratch; // by k + l
  planar.fill(0, 0, p + q + 1);
  for (let k = 0; k <= p; k++)
    for (let l = 0; l <= q; l++) {
      const j = q - l; // a+ applied j times, then a+† k times
      if (j > nP) continue;
      const nP2 = nP - j + k;
      const cPlus = factorialRatio(Math.min(nP, nP2), nP - j);
      const m = nM + l; // a−† applied l times, then a− p − k times
      const nM2 = m - (p - k);
      if (nM2 < 0) continue;
      const cMinus = factorialRatio(m, Math.max(nM, nM2));
      planar[k + l] += binomial(p, k) * binomial(q, l) * cPlus * cMinus;
    }
  const z = zCoefficients(r, nZ);
  // the targets in ascending index order (insertion into a short list)
  let count = 0;
  for (let sKL = 0; sKL <= p + q; sKL++) {
    if (planar[sKL] === 0) continue;
    const nP2 = nP + sKL - q, nM2 = nM + sKL - p;
    for (let x = 0; x <= 2 * r; x++) {
      if (z[x] === 0) continue;
      const t = reach.index(nP2, nM2, nZ + x - r);
      let at = count++;
      while (at > 0 && foundTarget[at - 1] > t) {
        foundTarget[at] = foundTarget[at - 1];
        foundCoefficient[at] = foundCoefficient[at - 1];
        at--;
      }
      foundTarget[at] = t;
      foundCoefficient[at] = planar[sKL] * z[x];
    }
  }
  for (let k = 0; k < count; k++) {
    out.targets[at + k] = foundTarget[k];
    out.coefficients[at + k] = foundCoefficient[k];
    out.quanta[at + k] = reach.quanta[foundTarget[k]];
  }
  return at + count;
}

/** A table with the arrays it is written to (room for more states; never-written memory costs nothing). */
interface GrowingTable extends MonomialActionTable {
  buffers: { targets: Int32Array; coefficients: Float64Array; quanta: Int32Array };
}

/** The table of `mono` covering at least the local states of `maxQuanta` quanta (cached and extended per process). */
export function monomialActionTable(mono: CircularMonomial, maxQuanta: number): MonomialActionTable {
  const key = (mono[0] * 16 + mono[1]) * 16 + mono[2];
  const old = actionTables.get(key);
  const states = localStates(maxQuanta);
  if (old && old.states >= states.count) return old;
  const from = old ? old.states : 0;
  const reach = localStates(maxQuanta + mono[0] + mono[1] + mono[2]);
  // at most (p + q + 1)(r + 1) targets per state: one per k + l and per z level of the right parity
  const perState = (mono[0] + mono[1] + 1) * (mono[2] + 1);
  const base = old ? old.targets.length : 0;
  let buffers = old?.buffers;
  if (!buffers || buffers.targets.length < base + (states.count - from) * perState) {
    // room for six more shells, so that bases growing one shell at a time extend the table in place
    const room = base + (localStates(maxQuanta + 6).count - from) * perState;
    const grown = { targets: new Int32Array(room), coefficients: new Float64Array(room), quanta: new Int32Array(room) };
    if (old) {
      grown.targets.set(old.targets);
      grown.coefficients.set(old.coefficients);
      grown.quanta.set(old.quanta);
    }
    buffers = grown;
  }
  const start = new Int32Array(states.count + 1);
  if (old) start.set(old.start);
  let at = base;
  for (let i = from; i < states.count; i++) start[i + 1] = at = monomialCoefficients(reach, mono, i, buffers, at);
  const table: GrowingTable = {
    states: states.count,
    start,
    targets: buffers.targets.subarray(0, at),
    coefficients: buffers.coefficients.subarray(0, at),
    quanta: buffers.quanta.subarray(0, at),
    buffers,
  };
  actionTables.set(key, table);
  return table;
}
