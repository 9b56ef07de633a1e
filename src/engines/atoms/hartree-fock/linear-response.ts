/**
 * Time-dependent (coupled) Hartree–Fock linear response of a closed-shell atom to an axial 2^K-pole field,
 * in the angular-momentum-coupled particle–hole basis (i → a with l_i, l_a coupled to rank K, M = 0).
 *
 * With the singlet orbital Hessians (real orbitals; A. D. McLachlan, M. A. Ball, Rev. Mod. Phys. 36, 844 (1964);
 * P. Jørgensen, J. Simons, Second Quantization-Based Methods in Quantum Chemistry, 1981)
 *   A_ai,bj = δ (ε_a − ε_i) + s⟨aj|ib⟩ − ⟨aj|bi⟩,   B_ai,bj = s⟨ab|ij⟩ − ⟨ab|ji⟩
 * (s = 2 for a closed shell, 1 for a single spin-orbital) and the property gradient g_ai = ⟨a|Q_K0|i⟩,
 * Q_K0 = −r^K P_K(cos θ), the first-order density at frequency ω has x + y = p, x − y = q with
 *   [(A + B) − ω² (A − B)⁻¹] p = −2 g,   (A − B) q = ω p.
 * At imaginary frequency ω = iu everything stays real, and with the Cholesky factor A − B = L Lᵀ and
 * Lᵀ(A + B)L = Σ_n ω_n² z_n z_nᵀ (so (A + B) + u²(A − B)⁻¹ = L⁻ᵀ [Lᵀ(A + B)L + u²] L⁻¹),
 *   alpha_K(iu) = 2s gᵀ [(A + B) + u² (A − B)⁻¹]⁻¹ g = Σ_n f_n / (ω_n² + u²),   f_n = 2s (gᵀ L z_n)²,
 * a pseudo-spectrum: exact in u once the two symmetric eigenproblems are solved (derived here from the equations
 * above; the form is the standard RPA one, e.g. M. J. Jamieson, Int. J. Quantum Chem. Symp. 4, 103 (1971)).
 */
import { coupledFactor, connects, reducedLegendre } from './angular-coupling.js';
import { eigh } from './dense.js';
import type { OrbitalPotentials } from './orbital-potentials.js';
import type { HartreeFockAtom } from './scf.js';

/** A block of excitations: occupied orbital (li, i) to the virtual orbitals of channel la. */
export interface ExcitationBlock {
  li: number;
  i: number;
  la: number;
  /** Offset of the block in the excitation vector. */
  offset: number;
  /** Virtual orbitals a = nOcc(la) … m(la) − 1, count. */
  count: number;
}

/** The TDHF linear response of rank K in spectral form. */
export interface RankResponse {
  K: number;
  blocks: ExcitationBlock[];
  n: number;
  /** Excitation energies ω_n (Eh), ascending, and line strengths f_n: alpha_K(iu) = Σ f_n/(ω_n² + u²). */
  omega: Float64Array;
  f: Float64Array;
  /** Property gradient g (coupled, reduced). */
  g: Float64Array;
  /** Cholesky factor of A − B = L Lᵀ (lower triangle, row-major). */
  L: Float64Array;
  /** Columns w_n = L z_n, W[i·n + k]. */
  W: Float64Array;
  /** Smallest Cholesky pivot of A − B and smallest ω² (stability of the Hartree–Fock state: both must be > 0). */
  stability: { AminusB: number; omega2: number };
}

/** Excitation blocks of rank K: occupied channels to every channel lMax allows, natural parity. */
export function excitationBlocks(atom: HartreeFockAtom, K: number): ExcitationBlock[] {
  const blocks: ExcitationBlock[] = [];
  let offset = 0;
  for (const occ of atom.channels)
    for (let i = 0; i < occ.nOcc; i++)
      for (const vir of atom.channels) {
        if (!connects(vir.l, K, occ.l)) continue;
        const count = vir.m - vir.nOcc;
        if (count <= 0) continue;
        blocks.push({ li: occ.l, i, la: vir.l, offset, count });
        offset += count;
      }
  return blocks;
}

/** Reduced matrix element −⟨l_a||r^K C^K||l_i⟩ radial × angular, for every excitation: the gradient of Q_K0. */
export function multipoleGradient(atom: HartreeFockAtom, blocks: readonly ExcitationBlock[], n: number, K: number): Float64Array {
  const { r, w } = atom.basis.grid;
  const G = r.length;
  const g = new Float64Array(n);
  const rk = Float64Array.from(r, (x, t) => x ** K * w[t]);
  for (const b of blocks) {
    const ci = atom.channels[b.li], ca = atom.channels[b.la];
    const ang = -reducedLegendre(b.la, K, b.li);
    for (let t = 0; t < b.count; t++) {
      const a = ca.nOcc + t;
      let s = 0;
      for (let q = 0; q < G; q++) s += ca.P[a * G + q] * ci.P[b.i * G + q] * rk[q];
      g[b.offset + t] = ang * s;
    }
  }
  return g;
}

/** Σ_g L[a·G + g] · R[b·G + g] · (v ? v[g] : 1) for a < na, b < nb: out[a·nb + b]. */
function contract(L: Float64Array, lo: number, na: number, R: Float64Array, ro: number, nb: number, G: number, v?: Float64Array): Float64Array {
  const out = new Float64Array(na * nb);
  const row = new Float64Array(G);
  for (let a = 0; a < na; a++) {
    for (let g = 0; g < G; g++) row[g] = v ? L[lo + a * G + g] * v[g] : L[lo + a * G + g];
    for (let b = 0; b < nb; b++) {
      let s = 0;
      const o = ro + b * G;
      for (let g = 0; g < G; g++) s += row[g] * R[o + g];
      out[a * nb + b] = s;
    }
  }
  return out;
}

/** The coupled A and B matrices of rank K (n×n, row-major). */
export function orbitalHessians(atom: HartreeFockAtom, pots: OrbitalPotentials, K: number, blocks: readonly ExcitationBlock[], n: number): { A: Float64Array; B: Float64Array } {
  const G = pots.G, s = atom.s;
  const A = new Float64Array(n * n), B = new Float64Array(n * n);
  const ch = atom.channels;
  for (const X of blocks) {
    const ca = ch[X.la], ci = ch[X.li];
    // P_a P_i for the block's virtuals
    const PaPi = new Float64Array(X.count * G);
    for (let t = 0; t < X.count; t++) for (let g = 0; g < G; g++) PaPi[t * G + g] = ca.P[(ca.nOcc + t) * G + g] * ci.P[X.i * G + g];
    for (const Y of blocks) {
      if (Y.offset < X.offset) continue; // symmetric: fill both triangles from X ≤ Y
      const cb = ch[Y.la], cj = ch[Y.li];
      const add = (M: Float64Array, block: Float64Array, f: number) => {
        if (f === 0) return;
        for (let t = 0; t < X.count; t++)
          for (let u = 0; u < Y.count; u++) {
            const v = f * block[t * Y.count + u];
            M[(X.offset + t) * n + Y.offset + u] += v;
            if (Y.offset !== X.offset) M[(Y.offset + u) * n + X.offset + t] += v;
          }
      };
      // direct: R^K(ai; jb) = ∫ P_a P_i V^K[P_j P_b]
      const dA = coupledFactor(X.la, X.li, Y.la, Y.li, K, K, [1, 2, 3, 4]);
      const dB = coupledFactor(X.la, X.li, Y.la, Y.li, K, K, [1, 2, 4, 3]);
      if (dA !== 0 || dB !== 0) {
        const V = pots.potentials(Y.li, Y.i, Y.la, K);
        const R = contract(PaPi, 0, X.count, V, cb.nOcc * G, Y.count, G);
        add(A, R, s * dA);
        add(B, R, s * dB);
      }
      for (let k = 0; k <= Math.max(X.la, X.li) + Math.max(Y.la, Y.li); k++) {
        // exchange in A: ⟨aj|bi⟩ = Σ_k c^k(a,b) c^k(i,j) R^k(ab; ji)
        if (connects(X.la, k, Y.la) && connects(X.li, k, Y.li)) {
          const f = coupledFactor(X.la, X.li, Y.la, Y.li, K, k, [1, 3, 2, 4]);
          if (f !== 0) {
            const v = pots.potentials(Y.li, Y.i, X.li, k).subarray(X.i * G, X.i * G + G);
            add(A, contract(ca.P, ca.nOcc * G, X.count, cb.P, cb.nOcc * G, Y.count, G, v), -f);
          }
        }
        // exchange in B: ⟨ab|ji⟩ = Σ_k c^k(a,j) c^k(i,b) R^k(aj; bi)
        if (connects(X.la, k, Y.li) && connects(X.li, k, Y.la)) {
          const f = coupledFactor(X.la, X.li, Y.la, Y.li, K, k, [1, 4, 2, 3]);
          if (f !== 0) {
            const V = pots.potentials(X.li, X.i, Y.la, k);
            const PaPj = new Float64Array(X.count * G);
            for (let t = 0; t < X.count; t++) for (let g = 0; g < G; g++) PaPj[t * G + g] = ca.P[(ca.nOcc + t) * G + g] * cj.P[Y.i * G + g];
            add(B, contract(PaPj, 0, X.count, V, cb.nOcc * G, Y.count, G), -f);
          }
        }
      }
    }
    for (let t = 0; t < X.count; t++) A[(X.offset + t) * (n + 1)] += ca.eps[ca.nOcc + t] - ci.eps[X.i];
  }
  return { A, B };
}

/** The rank-K response in spectral form (two symmetric eigenproblems of the excitation dimension). */
export function rankResponse(atom: HartreeFockAtom, pots: OrbitalPotentials, K: number): RankResponse {
  const blocks = excitationBlocks(atom, K);
  const n = blocks.reduce((t, b) => t + b.count, 0);
  const { A, B } = orbitalHessians(atom, pots, K, blocks, n);
  const { L, W, w2, smallest } = spectralForm(A, B, n);
  const g = multipoleGradient(atom, blocks, n, K);
  const omega = Float64Array.from(w2, (x) => Math.sqrt(Math.max(x, 0)));
  const f = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let t = 0;
    for (let i = 0; i < n; i++) t += g[i] * W[i * n + k];
    f[k] = 2 * atom.s * t * t;
  }
  return { K, blocks, n, omega, f, g, L, W, stability: { AminusB: smallest, omega2: w2[0] } };
}

/**
 * The spectral form of TDHF response at imaginary frequency for orbital Hessians A, B (n×n):
 * A − B = L Lᵀ, Lᵀ(A + B)L = Σ ω_n² z_n z_nᵀ, W = L Z, so [(A + B) + u²(A − B)⁻¹]⁻¹ = Σ_n w_n w_nᵀ/(ω_n² + u²).
 */
export function spectralForm(A: Float64Array, B: Float64Array, n: number): { L: Float64Array; W: Float64Array; w2: Float64Array; smallest: number } {
  const AmB = new Float64Array(n * n), ApB = new Float64Array(n * n);
  for (let t = 0; t < n * n; t++) {
    AmB[t] = A[t] - B[t];
    ApB[t] = A[t] + B[t];
  }
  const { L, smallest } = cholesky(AmB, n);
  const T = lowerTransposeTimes(L, multiplyLower(ApB, L, n), n);
  const { values: w2, vectors: Zv } = eigh(T, n);
  return { L, W: lowerTimes(L, Zv, n), w2, smallest };
}

/** Cholesky factor L (lower, row-major) of a symmetric matrix; the smallest pivot L_ii² (≤ 0: not positive definite). */
function cholesky(M: Float64Array, n: number): { L: Float64Array; smallest: number } {
  const L = new Float64Array(n * n);
  let smallest = Infinity;
  for (let j = 0; j < n; j++) {
    let d = 0.5 * (M[j * n + j] + M[j * n + j]);
    for (let k = 0; k < j; k++) d -= L[j * n + k] * L[j * n + k];
    smallest = Math.min(smallest, d);
    if (!(d > 0)) return { L, smallest: d };
    const ljj = Math.sqrt(d);
    L[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let v = 0.5 * (M[i * n + j] + M[j * n + i]);
      const ri = i * n, rj = j * n;
      for (let k = 0; k < j; k++) v -= L[ri + k] * L[rj + k];
      L[ri + j] = v / ljj;
    }
  }
  return { L, smallest };
}

/** X · L for a lower-triangular L (n×n). */
function multiplyLower(X: Float64Array, L: Float64Array, n: number): Float64Array {
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      const a = X[i * n + k];
      if (a === 0) continue;
      const lo = k * n, zo = i * n;
      for (let j = 0; j <= k; j++) Z[zo + j] += a * L[lo + j];
    }
  return Z;
}

/** Lᵀ · Y for a lower-triangular L. */
function lowerTransposeTimes(L: Float64Array, Y: Float64Array, n: number): Float64Array {
  const Z = new Float64Array(n * n);
  for (let k = 0; k < n; k++)
    for (let i = 0; i <= k; i++) {
      const a = L[k * n + i];
      if (a === 0) continue;
      const yo = k * n, zo = i * n;
      for (let j = 0; j < n; j++) Z[zo + j] += a * Y[yo + j];
    }
  return Z;
}

/** L · Y for a lower-triangular L. */
function lowerTimes(L: Float64Array, Y: Float64Array, n: number): Float64Array {
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let k = 0; k <= i; k++) {
      const a = L[i * n + k];
      if (a === 0) continue;
      const yo = k * n, zo = i * n;
      for (let j = 0; j < n; j++) Z[zo + j] += a * Y[yo + j];
    }
  return Z;
}

/** alpha_K(iu) = Σ f_n/(ω_n² + u²). */
export function polarisability(r: RankResponse, u: number): number {
  let s = 0;
  for (let k = 0; k < r.n; k++) if (r.f[k] !== 0) s += r.f[k] / (r.omega[k] * r.omega[k] + u * u);
  return s;
}

/**
 * First-order density of the perturbation `field` (coupled vector, e.g. g) at ω = ±iu:
 *   p = x + y = −2 Σ_n w_n (w_nᵀ field)/(ω_n² + u²),   x − y = ω (A − B)⁻¹ p = ±i u (A − B)⁻¹ p
 * (w_n = L z_n: [(A + B) + u²(A − B)⁻¹]⁻¹ = L [Lᵀ(A + B)L + u²]⁻¹ Lᵀ = Σ_n w_n w_nᵀ/(ω_n² + u²)).
 * Returned as p and qi = u (A − B)⁻¹ p (so x = (p ± i qi)/2, y = (p ∓ i qi)/2 for ω = ±iu).
 */
export function firstOrderDensity(r: RankResponse, field: Float64Array, u: number): { p: Float64Array; qi: Float64Array } {
  const { n, W } = r;
  const p = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let t = 0;
    for (let i = 0; i < n; i++) t += W[i * n + k] * field[i];
    const c = (-2 * t) / (r.omega[k] * r.omega[k] + u * u);
    if (c === 0) continue;
    for (let i = 0; i < n; i++) p[i] += c * W[i * n + k];
  }
  // qi = u (A − B)⁻¹ p = u L⁻ᵀ L⁻¹ p (two triangular solves)
  const qi = new Float64Array(n);
  if (u !== 0) {
    const { L } = r;
    const t = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let v = p[i];
      for (let k = 0; k < i; k++) v -= L[i * n + k] * t[k];
      t[i] = v / L[i * n + i];
    }
    for (let i = n - 1; i >= 0; i--) {
      let v = t[i];
      for (let k = i + 1; k < n; k++) v -= L[k * n + i] * qi[k];
      qi[i] = v / L[i * n + i];
    }
    for (let i = 0; i < n; i++) qi[i] *= u;
  }
  return { p, qi };
}
