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

/** A cache of {@link ladderMonomialAction} for one set of local states. */
export function ladderActionCache(states: LocalStates): (mono: CircularMonomial, i: number) => LocalAction {
  const cache = new Map<number, LocalAction>();
  return (mono, i) => {
    const key = ((mono[0] * 16 + mono[1]) * 16 + mono[2]) * states.count + i;
    let hit = cache.get(key);
    if (!hit) {
      hit = ladderMonomialAction(states, mono, i);
      cache.set(key, hit);
    }
    return hit;
  };
}
