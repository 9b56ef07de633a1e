/**
 * The local state space of a QDO: products |nx ny nz> of harmonic-oscillator eigenstates with
 * excitation energy Σ n_i w_i. Moments act as M_p = −q x^p0 y^p1 z^p2, with x = s (a + a†),
 * s = 1/sqrt(2 m w) (atomic units), applied by ladder operators:
 *   a|n> = sqrt(n)|n−1>,  a†|n> = sqrt(n+1)|n+1>   (common practice; any QM text).
 * Polynomial couplings keep every vector finite, so the space is exact when `maxQuanta` is at least the
 * number of quanta the perturbation chain can create on one centre; states above it are dropped.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { type Monomial, monomialKey } from '../../hamiltonian/monomial.js';
import type { LocalEntries, LocalSpace } from './local-space.js';

const BASE = 64;

/** Index of |nx ny nz>. */
export const harmonicIndex = (nx: number, ny: number, nz: number): number => nx + BASE * ny + BASE * BASE * nz;

/** Quantum numbers of an index. */
export function harmonicQuanta(i: number): [number, number, number] {
  return [i % BASE, Math.floor(i / BASE) % BASE, Math.floor(i / (BASE * BASE))];
}

/** (a + a†)^k |n> as a sparse list over n' (ladder recursion). */
function ladderPower(k: number, n: number): Map<number, number> {
  let v = new Map<number, number>([[n, 1]]);
  for (let step = 0; step < k; step++) {
    const next = new Map<number, number>();
    for (const [m, c] of v) {
      if (m > 0) next.set(m - 1, (next.get(m - 1) ?? 0) + c * Math.sqrt(m));
      next.set(m + 1, (next.get(m + 1) ?? 0) + c * Math.sqrt(m + 1));
    }
    v = next;
  }
  return v;
}

/**
 * Π_axis (a + a†)^p_axis |n_x n_y n_z>, truncated at `maxQuanta` total quanta: dimensionless and the same for every
 * species, so it is computed once per (p, state, truncation) and shared; a species only scales it.
 */
const ladderProducts = new Map<number, LocalEntries>();
function ladderProduct(p: Monomial, i: number, maxQuanta: number): LocalEntries {
  const key = (monomialKey(p) * 2 ** 20 + i) * BASE + maxQuanta;
  const hit = ladderProducts.get(key);
  if (hit) return hit;
  const n = harmonicQuanta(i);
  const per = [0, 1, 2].map((axis) => ladderPower(p[axis], n[axis]));
  const states: number[] = [];
  const amps: number[] = [];
  for (const [nx, cx] of per[0])
    for (const [ny, cy] of per[1])
      for (const [nz, cz] of per[2]) {
        if (nx + ny + nz > maxQuanta) continue;
        const amp = cx * cy * cz;
        if (amp === 0) continue;
        states.push(harmonicIndex(nx, ny, nz));
        amps.push(amp);
      }
  const entries = { states, amps };
  ladderProducts.set(key, entries);
  return entries;
}

// Species are immutable plain data, so a space (and its matrix-element cache) is reused for the same object:
// a table of N species then builds N spaces, not N² .
const spaces = new WeakMap<DrudeSpecies, Map<number, LocalSpace>>();

/** The harmonic local space of a QDO, keeping states with at most `maxQuanta` total quanta (cached per species). */
export function harmonicSpace(species: DrudeSpecies, maxQuanta: number): LocalSpace {
  let bySize = spaces.get(species);
  if (!bySize) spaces.set(species, (bySize = new Map()));
  let space = bySize.get(maxQuanta);
  if (!space) bySize.set(maxQuanta, (space = buildHarmonicSpace(species, maxQuanta)));
  return space;
}

function buildHarmonicSpace(species: DrudeSpecies, maxQuanta: number): LocalSpace {
  if (!(maxQuanta >= 1 && maxQuanta < BASE)) throw new RangeError(`maxQuanta must be 1…${BASE - 1}`);
  const { q, m, w } = species;
  const s = w.map((wi) => 1 / Math.sqrt(2 * m * wi));
  const cache = new Map<number, LocalEntries>();

  function apply(p: Monomial, i: number): LocalEntries {
    const key = monomialKey(p) * 2 ** 20 + i;
    const hit = cache.get(key);
    if (hit) return hit;
    const dimensionless = ladderProduct(p, i, maxQuanta);
    const scale = -q * s[0] ** p[0] * s[1] ** p[1] * s[2] ** p[2];
    const entries = { states: dimensionless.states, amps: dimensionless.amps.map((a) => scale * a) };
    cache.set(key, entries);
    return entries;
  }

  return {
    excitation(i) {
      // the quanta of harmonicQuanta(i), without the tuple (called once per product-vector entry)
      const nx = i % BASE, ny = Math.floor(i / BASE) % BASE, nz = Math.floor(i / (BASE * BASE));
      return nx * w[0] + ny * w[1] + nz * w[2];
    },
    applyMoment: apply,
  };
}
