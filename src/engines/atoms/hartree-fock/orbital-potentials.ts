/**
 * Rank-k potentials of orbital-pair densities with one occupied orbital, V^k[P_j P_q](r) (weighted by the grid),
 * for every occupied j and every orbital q of the channels in use: every two-electron integral of the linear and
 * quadratic response has at least one occupied orbital in one of its pair densities, so
 *   R^k(pq; jr) = ∫ P_p P_q V^k[P_j P_r] dr
 * covers them all. Built from the basis-pair potentials of radial-basis.ts by two contractions. Atomic units.
 */
import { connects } from './angular-coupling.js';
import type { HartreeFockAtom } from './scf.js';
import { ScreeningCache } from './scf.js';

/** Identifies a radial orbital: channel l and index i within the channel (occupied first). */
export interface OrbitalRef {
  l: number;
  i: number;
}

export class OrbitalPotentials {
  private readonly map = new Map<string, Float64Array>();
  readonly G: number;
  constructor(
    readonly atom: HartreeFockAtom,
    readonly cache: ScreeningCache = new ScreeningCache(atom.basis),
  ) {
    this.G = atom.basis.grid.r.length;
  }

  /** V^k[P_j P_q]·w for occupied j (channel lj, index j) and all orbitals q of channel lq: out[q·G + g]. */
  potentials(lj: number, j: number, lq: number, k: number): Float64Array {
    const key = `${lj},${j},${lq},${k}`;
    let v = this.map.get(key);
    if (v) return v;
    const { G } = this;
    const cj = this.atom.channels[lj], cq = this.atom.channels[lq];
    v = new Float64Array(cq.m * G);
    if (connects(lj, k, lq)) {
      const Y = this.cache.get(lj, lq, k); // index (p·n_q + t)·G
      const Zt = new Float64Array(cq.n * G);
      for (let p = 0; p < cj.n; p++) {
        const c = cj.C[p * cj.m + j];
        if (c === 0) continue;
        for (let t = 0; t < cq.n; t++) {
          const base = (p * cq.n + t) * G, zo = t * G;
          for (let g = 0; g < G; g++) Zt[zo + g] += c * Y[base + g];
        }
      }
      for (let t = 0; t < cq.n; t++)
        for (let q = 0; q < cq.m; q++) {
          const c = cq.C[t * cq.m + q];
          const zo = t * G, vo = q * G;
          for (let g = 0; g < G; g++) v[vo + g] += c * Zt[zo + g];
        }
    }
    this.map.set(key, v);
    return v;
  }
}

/** ∫ f(r) g(r) r^k dr on the grid for the radial orbitals (or any functions) given on it. */
export function radialMoment(atom: HartreeFockAtom, f: Float64Array, fo: number, g: Float64Array, go: number, k: number): number {
  const { r, w } = atom.basis.grid;
  let s = 0;
  for (let t = 0; t < r.length; t++) s += f[fo + t] * g[go + t] * w[t] * r[t] ** k;
  return s;
}
