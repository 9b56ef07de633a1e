/**
 * Restricted closed-shell Hartree–Fock ground state of an atom or ion in a radial Slater basis × spherical harmonics
 * (Roothaan's equations per angular-momentum channel; C. C. J. Roothaan, Rev. Mod. Phys. 32, 179 (1960);
 * C. Froese Fischer, The Hartree–Fock Method for Atoms, 1977). Atomic units.
 *
 * For a closed shell every channel l has its own Fock matrix
 *   F^l = h^l + Σ_b s(2l_b+1) J_b − Σ_b (2l_b+1) Σ_k (l k l_b; 0 0 0)² K^k_b,
 * with J_b the Coulomb operator of shell b (Y^0[P_b²]/r) and K^k_b its rank-k exchange (Y^k[P_b ·]/r · P_b);
 * s = 2 electrons per spatial orbital (closed shell) or s = 1 (a single spin-orbital: the one-electron check,
 * where the self-interaction cancels exactly). E = ½ Σ_b s(2l_b+1)(h_bb + ε_b). Convergence by Pulay's DIIS
 * (P. Pulay, J. Comput. Chem. 3, 556 (1982)) on the commutator F D − D F in the orthonormal basis.
 */
import { canonicalOrthogonaliser, congruence, eigh, expectationPair, matMul, solveLinear } from './dense.js';
import { basisOnGrid, oneElectronMatrices, pairScreening, type SlaterBasis } from './radial-basis.js';
import { connects, threeJ } from './angular-coupling.js';

/** One angular-momentum channel after the SCF: orbitals in the basis and on the grid. */
export interface ChannelOrbitals {
  l: number;
  /** Basis functions on the grid, chi[p·G + g]. */
  chi: Float64Array;
  /** Number of basis functions n. */
  n: number;
  /** Number of orbitals (after removing near-linear dependence) m. */
  m: number;
  /** MO coefficients C[p·m + i], orbitals ordered by energy. */
  C: Float64Array;
  /** Orbital energies (Eh), ascending. */
  eps: Float64Array;
  /** Radial orbitals P_i(r) on the grid, P[i·G + g]. */
  P: Float64Array;
  /** Occupied orbitals in this channel (the first nOcc). */
  nOcc: number;
}

/** A converged (or not) closed-shell Hartree–Fock atom. */
export interface HartreeFockAtom {
  Z: number;
  electrons: number;
  /** Electrons per occupied spatial orbital: 2 (closed shell) or 1 (one electron). */
  s: number;
  basis: SlaterBasis;
  /** Channels 0 … lMax (occupied channels first, then virtual-only channels for the response). */
  channels: ChannelOrbitals[];
  energy: number;
  iterations: number;
  /** Largest element of the final DIIS commutator. */
  residual: number;
  converged: boolean;
  /** Smallest kept overlap eigenvalue (the basis' conditioning). */
  smallestOverlap: number;
}

export interface ScfOptions {
  maxIterations?: number;
  /** Commutator tolerance (default 1e-8; 1000× that with an energy stable to 1e-13 on two iterations counts too). */
  tolerance?: number;
}

/** Screening functions cached per (l, l', k) for one basis. */
export class ScreeningCache {
  private readonly map = new Map<string, Float64Array>();
  constructor(readonly basis: SlaterBasis) {}
  get(l: number, lp: number, k: number): Float64Array {
    const key = `${l},${lp},${k}`;
    let y = this.map.get(key);
    if (!y) {
      y = pairScreening(this.basis, l, lp, k);
      this.map.set(key, y);
    }
    return y;
  }
}

interface ChannelSetup {
  l: number;
  n: number;
  chi: Float64Array;
  S: Float64Array;
  H: Float64Array;
  X: Float64Array;
  m: number;
  smallest: number;
}

function setupChannel(b: SlaterBasis, l: number, Z: number): ChannelSetup {
  const n = b.zeta[l].length;
  const { S, H } = oneElectronMatrices(b, l, Z);
  const { X, m, smallest } = canonicalOrthogonaliser(S, n, 1e-9);
  return { l, n, chi: basisOnGrid(b, l), S, H, X, m, smallest };
}

/** Orbitals of a channel from its Fock matrix: C = X V (V eigenvectors of Xᵀ F X). */
function diagonalise(ch: ChannelSetup, F: Float64Array, G: number, nOcc: number): ChannelOrbitals {
  const Fo = congruence(F, ch.X, ch.n, ch.m);
  const { values, vectors } = eigh(Fo, ch.m);
  const C = matMul(ch.X, vectors, ch.n, ch.m, ch.m);
  const P = matMul(transposeCols(C, ch.n, ch.m), ch.chi, ch.m, ch.n, G);
  return { l: ch.l, chi: ch.chi, n: ch.n, m: ch.m, C, eps: values, P, nOcc };
}

function transposeCols(C: Float64Array, n: number, m: number): Float64Array {
  const T = new Float64Array(m * n);
  for (let p = 0; p < n; p++) for (let i = 0; i < m; i++) T[i * n + p] = C[p * m + i];
  return T;
}

/**
 * The Fock matrix of channel l for the occupied orbitals in `occ` (channels with nOcc > 0), in the basis of l.
 */
export function fockMatrix(
  ch: { l: number; n: number; chi: Float64Array; H: Float64Array },
  occ: readonly ChannelOrbitals[],
  s: number,
  cache: ScreeningCache,
  G: number,
): Float64Array {
  const { l, n, chi } = ch;
  const F = Float64Array.from(ch.H);
  // Hartree potential (weighted): Σ_b s(2l_b+1) Y^0[P_b²] w/r
  const vH = new Float64Array(G);
  for (const o of occ) {
    if (o.nOcc === 0) continue;
    const Y = cache.get(o.l, o.l, 0);
    const D = new Float64Array(o.n * o.n);
    for (let i = 0; i < o.nOcc; i++)
      for (let p = 0; p < o.n; p++) for (let q = 0; q < o.n; q++) D[p * o.n + q] += s * (2 * o.l + 1) * o.C[p * o.m + i] * o.C[q * o.m + i];
    for (let pq = 0; pq < o.n * o.n; pq++) {
      const d = D[pq];
      if (d === 0) continue;
      const base = pq * G;
      for (let g = 0; g < G; g++) vH[g] += d * Y[base + g];
    }
  }
  const row = new Float64Array(G);
  for (let p = 0; p < n; p++) {
    for (let g = 0; g < G; g++) row[g] = chi[p * G + g] * vH[g];
    for (let q = 0; q <= p; q++) {
      let v = 0;
      for (let g = 0; g < G; g++) v += row[g] * chi[q * G + g];
      F[p * n + q] += v;
      if (q !== p) F[q * n + p] += v;
    }
  }
  // exchange
  const Zq = new Float64Array(n * G), left = new Float64Array(n * G);
  for (const o of occ) {
    for (let k = Math.abs(l - o.l); k <= l + o.l; k++) {
      if (!connects(l, k, o.l)) continue;
      const e = (2 * o.l + 1) * threeJ(l, k, o.l, 0, 0, 0) ** 2;
      const Y = cache.get(l, o.l, k);
      for (let b = 0; b < o.nOcc; b++) {
        Zq.fill(0);
        for (let q = 0; q < n; q++)
          for (let t = 0; t < o.n; t++) {
            const c = o.C[t * o.m + b];
            const base = (q * o.n + t) * G, zo = q * G;
            for (let g = 0; g < G; g++) Zq[zo + g] += c * Y[base + g];
          }
        for (let p = 0; p < n; p++) for (let g = 0; g < G; g++) left[p * G + g] = chi[p * G + g] * o.P[b * G + g];
        for (let p = 0; p < n; p++)
          for (let q = 0; q < n; q++) {
            let v = 0;
            for (let g = 0; g < G; g++) v += left[p * G + g] * Zq[q * G + g];
            // symmetrise: K_pq = ½(∫χ_p P_b Y[χ_q P_b] + ∫χ_q P_b Y[χ_p P_b])
            F[p * n + q] -= 0.5 * e * v;
            F[q * n + p] -= 0.5 * e * v;
          }
      }
    }
  }
  return F;
}

/**
 * Self-consistent field for `shells[l]` doubly (s = 2) or singly (s = 1) occupied shells per channel; channels
 * lOcc+1 … lMax get virtual orbitals from the converged Fock operator.
 */
export function solveHartreeFock(
  Z: number,
  electrons: number,
  shells: readonly number[],
  basis: SlaterBasis,
  options: ScfOptions = {},
  cache: ScreeningCache = new ScreeningCache(basis),
): HartreeFockAtom {
  const s = electrons === 1 ? 1 : 2;
  const G = basis.grid.r.length;
  const lMax = basis.zeta.length - 1;
  const setups = Array.from({ length: lMax + 1 }, (_, l) => setupChannel(basis, l, Z));
  const lOcc = shells.length - 1;
  const occSetups = setups.slice(0, lOcc + 1);
  let orbitals = occSetups.map((ch, l) => diagonalise(ch, ch.H, G, shells[l]));
  const tol = options.tolerance ?? 1e-8;
  const maxIt = options.maxIterations ?? 200;
  const history: { F: Float64Array[]; e: Float64Array }[] = [];
  let energy = 0, residual = Infinity, it = 0, converged = false, lastEnergy = NaN, settled = 0;
  for (it = 1; it <= maxIt; it++) {
    const F = occSetups.map((ch) => fockMatrix(ch, orbitals, s, cache, G));
    // energy from the current density and the Fock matrices built from it
    energy = 0;
    for (const [l, o] of orbitals.entries()) {
      const ch = occSetups[l];
      for (let i = 0; i < o.nOcc; i++) {
        const [hv, fv] = expectationPair(o.C, o.m, i, ch.H, F[l], ch.n);
        energy += 0.5 * s * (2 * l + 1) * (hv + fv);
      }
    }
    // DIIS error: commutator in the orthonormal basis
    const errs: number[] = [];
    for (const [l, o] of orbitals.entries()) {
      const ch = occSetups[l], n = ch.n;
      const D = new Float64Array(n * n);
      for (let i = 0; i < o.nOcc; i++) for (let p = 0; p < n; p++) for (let q = 0; q < n; q++) D[p * n + q] += o.C[p * o.m + i] * o.C[q * o.m + i];
      const FDS = matMul(matMul(F[l], D, n, n, n), ch.S, n, n, n);
      const comm = new Float64Array(n * n);
      for (let p = 0; p < n; p++) for (let q = 0; q < n; q++) comm[p * n + q] = FDS[p * n + q] - FDS[q * n + p];
      const Eo = matMul(transposeCols(ch.X, n, ch.m), matMul(comm, ch.X, n, n, ch.m), ch.m, n, ch.m);
      for (const v of Eo) errs.push(v);
    }
    const e = Float64Array.from(errs);
    residual = e.reduce((mx, v) => Math.max(mx, Math.abs(v)), 0);
    // converged at the tolerance, or at the rounding floor: a small commutator and an energy stable to 1e-13
    const stable = Math.abs(energy - lastEnergy) <= 1e-13 * Math.abs(energy);
    settled = stable ? settled + 1 : 0;
    lastEnergy = energy;
    if (residual < tol || (residual < 1e3 * tol && settled >= 2)) {
      converged = true;
      break;
    }
    history.push({ F, e });
    if (history.length > 8) history.shift();
    const Fmix = diisExtrapolate(history);
    orbitals = occSetups.map((ch, l) => diagonalise(ch, Fmix[l], G, shells[l]));
  }
  // final orbitals of every channel (virtual-only channels too) from the converged density
  const channels = setups.map((ch, l) => diagonalise(ch, fockMatrix(ch, orbitals, s, cache, G), G, l <= lOcc ? shells[l] : 0));
  return {
    Z, electrons, s, basis, channels, energy, iterations: it, residual, converged,
    smallestOverlap: Math.min(...setups.map((c) => c.smallest)),
  };
}

/** Pulay's DIIS: the combination Σ c_i F_i with Σ c_i = 1 minimising |Σ c_i e_i|. */
function diisExtrapolate(history: { F: Float64Array[]; e: Float64Array }[]): Float64Array[] {
  const k = history.length;
  if (k === 1) return history[0].F;
  const n = k + 1;
  const B = new Float64Array(n * n), rhs = new Float64Array(n);
  for (let i = 0; i < k; i++)
    for (let j = 0; j < k; j++) {
      let d = 0;
      const a = history[i].e, b = history[j].e;
      for (let t = 0; t < a.length; t++) d += a[t] * b[t];
      B[i * n + j] = d;
    }
  for (let i = 0; i < k; i++) {
    B[i * n + k] = -1;
    B[k * n + i] = -1;
  }
  rhs[k] = -1;
  const c = solveLinear(B, rhs, n);
  if (!c.every(Number.isFinite)) return history[k - 1].F;
  return history[0].F.map((_, l) => {
    const out = new Float64Array(history[0].F[l].length);
    for (let i = 0; i < k; i++) {
      const f = history[i].F[l];
      for (let t = 0; t < out.length; t++) out[t] += c[i] * f[t];
    }
    return out;
  });
}
