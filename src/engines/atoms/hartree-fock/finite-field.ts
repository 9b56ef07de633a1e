/**
 * Independent check of the response code: the closed-shell Hartree–Fock atom in a static field F along z,
 * H = H0 + F z (electron charge −1, so H = H0 − F M_z), solved self-consistently with axial symmetry — orbitals of
 * definite m, each a sum over channels l = |m| … lMax of radial functions in the same Slater basis — without any
 * response or coupled-angular-momentum code. Atomic units.
 *
 *   alpha = −∂²E/∂F²:  with f(F) = E(F) + E(−F) − 2E(0) = −alpha F² − gamma F⁴/12,
 *          alpha = −(16 f(F) − f(2F)) / (12 F²)    (Richardson; E is even in F);
 *   B:      Buckingham's energy term −(1/4) B F² g for an axial gradient g coupled as −½ g Q_20 gives, by the
 *          Hellmann–Feynman theorem (exact for the variational Hartree–Fock energy),
 *          ⟨Q_20⟩(F) = −∂E/∂(½g)·… = ½ B F² + O(F⁴), so q(F) = 2⟨Q_20⟩/F² and B = (4 q(F) − q(2F))/3
 * (derived here; the same convention as src/engines/atoms/finite-field.ts for hydrogen).
 *
 * Two-electron terms by the Slater–Condon rules with c^k coefficients (angular-coupling.ts):
 *   J_pq = Σ_j s Σ_{l1 l2} Σ_k c^k(l_p m, l_q m) c^k(l2 m_j, l1 m_j) R^k(χ_p χ_q; P_j^l1 P_j^l2),
 *   K_pq = Σ_j Σ_{l1 l2} Σ_k c^k(l_p m, l2 m_j) c^k(l_q m, l1 m_j) R^k(χ_p P_j^l2; P_j^l1 χ_q),
 * F = h + J − K, E = Σ_j (s/2)(h_jj + F_jj) over occupied orbitals j (both signs of m).
 */
import { CLOSED_SHELLS } from '../../../model/closed-shell.js';
import { gauntC } from './angular-coupling.js';
import { canonicalOrthogonaliser, congruence, eigh, expectationPair, matMul } from './dense.js';
import { basisOnGrid, oneElectronMatrices, radialMomentMatrix, type SlaterBasis } from './radial-basis.js';
import { ScreeningCache } from './scf.js';

/** One axial block (fixed m ≥ 0): its channels, basis offsets and occupied orbitals. */
interface AxialBlock {
  m: number;
  ls: number[];
  offsets: number[];
  dim: number;
  nOcc: number;
  H: Float64Array;
  X: Float64Array;
  xm: number;
  /** Occupied coefficients C[row·nOcc + j]. */
  C: Float64Array;
  /** Radial components of the occupied orbitals on the grid: comp[j][li] (li index into ls). */
  comp: Float64Array[][];
}

/** The m = 0 orbitals of the converged state (all of them, occupied first), for the finite-field response. */
export interface AxialOrbitals {
  ls: number[];
  offsets: number[];
  dim: number;
  /** Orbital count (after removing near-linear dependence) and occupied count. */
  count: number;
  nOcc: number;
  /** Coefficients C[row·count + p] and orbital energies. */
  C: Float64Array;
  eps: Float64Array;
}

export interface FiniteFieldResult {
  /** The m = 0 block's orbitals. */
  m0: AxialOrbitals;
  energy: number;
  /** ⟨Q_20⟩ = −⟨r² P_2(cos θ)⟩ summed over electrons. */
  Q20: number;
  iterations: number;
  converged: boolean;
}

/** Static alpha and B of a closed-shell atom from finite-field Hartree–Fock energies and quadrupole moments. */
export function finiteFieldStatics(Z: number, electrons: number, basis: SlaterBasis, field = 0.01): { alpha: number; B: number; runs: FiniteFieldResult[] } {
  const r0 = axialHartreeFock(Z, electrons, basis, 0);
  const r1 = axialHartreeFock(Z, electrons, basis, field);
  const r2 = axialHartreeFock(Z, electrons, basis, 2 * field);
  const f1 = 2 * (r1.energy - r0.energy), f2 = 2 * (r2.energy - r0.energy);
  const alpha = -(16 * f1 - f2) / (12 * field * field);
  const q1 = (2 * (r1.Q20 - r0.Q20)) / field ** 2, q2 = (2 * (r2.Q20 - r0.Q20)) / (2 * field) ** 2;
  return { alpha, B: (4 * q1 - q2) / 3, runs: [r0, r1, r2] };
}

/** Self-consistent closed-shell Hartree–Fock in a field F along z (channels 0 … basis.zeta.length − 1). */
export function axialHartreeFock(Z: number, electrons: number, basis: SlaterBasis, F: number, tolerance = 1e-10, maxIterations = 200): FiniteFieldResult {
  const shells = CLOSED_SHELLS[electrons].shells;
  const s = electrons === 1 ? 1 : 2;
  const lMax = basis.zeta.length - 1;
  const G = basis.grid.r.length;
  const mOcc = shells.length - 1;
  const cache = new ScreeningCache(basis);
  const chi = Array.from({ length: lMax + 1 }, (_, l) => basisOnGrid(basis, l));
  const n = basis.zeta.map((z) => z.length);
  const blocks: AxialBlock[] = [];
  for (let m = 0; m <= mOcc; m++) {
    const ls: number[] = [], offsets: number[] = [];
    let dim = 0;
    for (let l = m; l <= lMax; l++) {
      ls.push(l);
      offsets.push(dim);
      dim += n[l];
    }
    const H = new Float64Array(dim * dim), S = new Float64Array(dim * dim);
    ls.forEach((l, a) => {
      const one = oneElectronMatrices(basis, l, Z);
      for (let p = 0; p < n[l]; p++)
        for (let q = 0; q < n[l]; q++) {
          H[(offsets[a] + p) * dim + offsets[a] + q] = one.H[p * n[l] + q];
          S[(offsets[a] + p) * dim + offsets[a] + q] = one.S[p * n[l] + q];
        }
      ls.forEach((lp, b) => {
        const c = gauntC(1, l, m, lp, m);
        if (c === 0 || F === 0) return;
        const R = radialMomentMatrix(basis, l, lp, 1);
        for (let p = 0; p < n[l]; p++) for (let q = 0; q < n[lp]; q++) H[(offsets[a] + p) * dim + offsets[b] + q] += F * c * R[p * n[lp] + q];
      });
    });
    const { X, m: xm } = canonicalOrthogonaliser(S, dim, 1e-9);
    let nOcc = 0;
    for (let l = m; l < shells.length; l++) nOcc += shells[l];
    blocks.push({ m, ls, offsets, dim, nOcc, H, X, xm, C: new Float64Array(0), comp: [] });
  }
  const solve = (b: AxialBlock, Fm: Float64Array): Float64Array => {
    const e = eigh(congruence(Fm, b.X, b.dim, b.xm), b.xm);
    const C = matMul(b.X, e.vectors, b.dim, b.xm, b.xm);
    const occ = new Float64Array(b.dim * b.nOcc);
    for (let r = 0; r < b.dim; r++) for (let j = 0; j < b.nOcc; j++) occ[r * b.nOcc + j] = C[r * b.xm + j];
    return occ;
  };
  const components = (b: AxialBlock) => {
    b.comp = Array.from({ length: b.nOcc }, (_, j) =>
      b.ls.map((l, a) => {
        const P = new Float64Array(G);
        for (let p = 0; p < n[l]; p++) {
          const c = b.C[(b.offsets[a] + p) * b.nOcc + j];
          if (c !== 0) for (let g = 0; g < G; g++) P[g] += c * chi[l][p * G + g];
        }
        return P;
      }),
    );
  };
  for (const b of blocks) {
    b.C = solve(b, b.H);
    components(b);
  }
  let energy = 0, prev = NaN, it = 0, converged = false, mixOld: Float64Array[] | undefined;
  for (it = 1; it <= maxIterations; it++) {
    const Fock = blocks.map((b) => fockBlock(b, blocks, s, cache, chi, n, G));
    energy = 0;
    blocks.forEach((b, bi) => {
      const weight = b.m === 0 ? 1 : 2;
      for (let j = 0; j < b.nOcc; j++) {
        const [hv, fv] = expectationPair(b.C, b.nOcc, j, b.H, Fock[bi], b.dim);
        energy += (weight * s * (hv + fv)) / 2;
      }
    });
    if (Math.abs(energy - prev) < tolerance) {
      converged = true;
      break;
    }
    prev = energy;
    // simple damping keeps the plain Roothaan iteration stable
    const mixed = mixOld ? Fock.map((f, i) => f.map((v, t) => 0.7 * v + 0.3 * mixOld![i][t])) : Fock;
    mixOld = mixed;
    blocks.forEach((b, i) => {
      b.C = solve(b, mixed[i]);
      components(b);
    });
  }
  // ⟨Q_20⟩ = −s Σ_j Σ_{l l'} c²(l m_j, l' m_j) ∫ P^l r² P^l'
  const { r, w } = basis.grid;
  let Q = 0;
  for (const b of blocks) {
    const weight = b.m === 0 ? 1 : 2;
    for (let j = 0; j < b.nOcc; j++)
      b.ls.forEach((l, a) =>
        b.ls.forEach((lp, c) => {
          const ang = gauntC(2, l, b.m, lp, b.m);
          if (ang === 0) return;
          let t = 0;
          for (let g = 0; g < G; g++) t += b.comp[j][a][g] * b.comp[j][c][g] * r[g] * r[g] * w[g];
          Q -= weight * s * ang * t;
        }),
      );
  }
  const b0 = blocks[0];
  const e0 = eigh(congruence(fockBlock(b0, blocks, s, cache, chi, n, G), b0.X, b0.dim, b0.xm), b0.xm);
  const m0: AxialOrbitals = { ls: b0.ls, offsets: b0.offsets, dim: b0.dim, count: b0.xm, nOcc: b0.nOcc, C: matMul(b0.X, e0.vectors, b0.dim, b0.xm, b0.xm), eps: e0.values };
  return { m0, energy, Q20: Q, iterations: it, converged };
}

/** The Fock matrix of block b (h + J − K) from the occupied orbitals of all blocks (m and −m). */
function fockBlock(b: AxialBlock, blocks: readonly AxialBlock[], s: number, cache: ScreeningCache, chi: Float64Array[], n: number[], G: number): Float64Array {
  const Fm = Float64Array.from(b.H);
  const kMax = 2 * (b.ls[b.ls.length - 1] ?? 0);
  // Coulomb: V_k = s Σ_j Σ_{l1 l2} c^k(l2 mj, l1 mj) V^k[P^l1 P^l2], both signs of m_j (equal contributions)
  const Vk: Float64Array[] = Array.from({ length: kMax + 1 }, () => new Float64Array(G));
  for (const o of blocks) {
    const weight = o.m === 0 ? 1 : 2;
    for (let j = 0; j < o.nOcc; j++)
      o.ls.forEach((l1, a1) =>
        o.ls.forEach((l2, a2) => {
          for (let k = 0; k <= kMax; k++) {
            const c = gauntC(k, l2, o.m, l1, o.m);
            if (c === 0) continue;
            const pot = potentialOf(cache, l1, o, j, a1, l2, o, j, a2, k, n, G);
            const f = weight * s * c;
            for (let g = 0; g < G; g++) Vk[k][g] += f * pot[g];
          }
        }),
      );
  }
  b.ls.forEach((l, a) =>
    b.ls.forEach((lp, c) => {
      for (let k = 0; k <= kMax; k++) {
        const ang = gauntC(k, l, b.m, lp, b.m);
        if (ang === 0) continue;
        for (let p = 0; p < n[l]; p++)
          for (let q = 0; q < n[lp]; q++) {
            let t = 0;
            for (let g = 0; g < G; g++) t += chi[l][p * G + g] * chi[lp][q * G + g] * Vk[k][g];
            Fm[(b.offsets[a] + p) * b.dim + b.offsets[c] + q] += ang * t;
          }
      }
    }),
  );
  // exchange: K_pq = Σ_j Σ_{l1 l2} Σ_k c^k(l m, l2 mj) c^k(l' m, l1 mj) ∫ χ_p P^l2 V^k[P^l1 χ_q], mj = ±|m_j|
  for (const o of blocks)
    for (const sign of o.m === 0 ? [1] : [1, -1]) {
      const mj = sign * o.m;
      for (let j = 0; j < o.nOcc; j++)
        b.ls.forEach((lp, c) =>
          o.ls.forEach((l1, a1) => {
            for (let k = 0; k <= lp + l1; k++) {
              if (gauntC(k, lp, b.m, l1, mj) === 0) continue;
              // V^k[P^l1 χ_q] for all q of channel l'
              const Y = cache.get(l1, lp, k); // (t·n_lp + q)
              const V = new Float64Array(n[lp] * G);
              for (let t = 0; t < n[l1]; t++) {
                const coef = o.C[(o.offsets[a1] + t) * o.nOcc + j];
                if (coef === 0) continue;
                for (let q = 0; q < n[lp]; q++) {
                  const base = (t * n[lp] + q) * G;
                  for (let g = 0; g < G; g++) V[q * G + g] += coef * Y[base + g];
                }
              }
              b.ls.forEach((l, a) =>
                o.ls.forEach((l2, a2) => {
                  const ang = gauntC(k, l, b.m, l2, mj) * gauntC(k, lp, b.m, l1, mj);
                  if (ang === 0) return;
                  const Pj2 = o.comp[j][a2];
                  const row = new Float64Array(G);
                  for (let p = 0; p < n[l]; p++) {
                    for (let g = 0; g < G; g++) row[g] = chi[l][p * G + g] * Pj2[g];
                    for (let q = 0; q < n[lp]; q++) {
                      let t = 0;
                      for (let g = 0; g < G; g++) t += row[g] * V[q * G + g];
                      Fm[(b.offsets[a] + p) * b.dim + b.offsets[c] + q] -= ang * t;
                    }
                  }
                }),
              );
            }
          }),
        );
    }
  // symmetrise (the exchange quadrature is symmetric only up to rounding)
  for (let i = 0; i < b.dim; i++)
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (Fm[i * b.dim + j] + Fm[j * b.dim + i]);
      Fm[i * b.dim + j] = v;
      Fm[j * b.dim + i] = v;
    }
  return Fm;
}

/** V^k[P_j^l1 P_j'^l2] on the grid (weighted) for two occupied radial components. */
function potentialOf(cache: ScreeningCache, l1: number, o1: AxialBlock, j1: number, a1: number, l2: number, o2: AxialBlock, j2: number, a2: number, k: number, n: number[], G: number): Float64Array {
  const Y = cache.get(l1, l2, k);
  const out = new Float64Array(G);
  for (let t = 0; t < n[l1]; t++) {
    const c1 = o1.C[(o1.offsets[a1] + t) * o1.nOcc + j1];
    if (c1 === 0) continue;
    for (let u = 0; u < n[l2]; u++) {
      const c = c1 * o2.C[(o2.offsets[a2] + u) * o2.nOcc + j2];
      if (c === 0) continue;
      const base = (t * n[l2] + u) * G;
      for (let g = 0; g < G; g++) out[g] += c * Y[base + g];
    }
  }
  return out;
}
