/**
 * Radial pseudo-spectrum of a one-electron (hydrogen-like) atom of nuclear charge Z, from a finite Sturmian
 * (Laguerre) basis per angular momentum l. Atomic units.
 *
 * Basis (x = 2λr, λ = Z, normalised so that ∫ φ_j φ_k dr / r = δ_jk):
 *   φ_j(r) = sqrt(j!/(j+2l+1)!) x^{l+1} e^{-x/2} L_j^{(2l+1)}(x),   j = 0 … size−1.
 * Each φ_j is a hydrogenic function of charge (j+l+1)λ at energy −λ²/2, so
 *   <φ_i|−½ d²/dr² + l(l+1)/(2r²)|φ_j> = −(λ²/2) S_ij + λ (j+l+1) δ_ij,   <φ_i|1/r|φ_j> = δ_ij,
 *   S_ij = <φ_i|φ_j> = (1/2λ) [2(j+l+1) δ_ij − sqrt((j+1)(j+2l+2)) δ_{i,j+1} − sqrt(j(j+2l+1)) δ_{i,j−1}]
 * (Laguerre recurrences, derived here; e.g. M. Rotenberg, Adv. At. Mol. Phys. 6, 233 (1970) for Sturmians).
 * H = T − Z/r is diagonalised in this basis (a symmetric tridiagonal problem, see channelStates). Because λ = Z, the l = 0 basis
 * contains e^{-Zr} and the ground state 1s is exact; all static perturbation functions of hydrogen are
 * polynomials × e^{-Zr}, so static response properties are exact for a modest size, and dynamic ones converge
 * exponentially with size (shown in the tests).
 *
 * Radial integrals <n l|r^k|n' l'> are evaluated with a Gauss–Laguerre rule that is exact for the polynomial
 * degree involved, so they carry no quadrature error (only rounding).
 */
import { tridiagonalEigenvalues } from '../../math/symmetric-eigen.js';
import { gaussLaguerre } from './laguerre-rule.js';

/** A one-electron atom's radial pseudo-spectrum: energies and radial moment integrals per l. */
export interface RadialPseudoSpectrum {
  /** Nuclear charge. */
  Z: number;
  /** Radial pseudo-states per l. */
  size: number;
  /** Highest angular momentum kept. */
  lMax: number;
  /** E_{l,n}, hartree, ascending in n for each l; energies[0][0] is the ground state 1s. */
  energies: readonly Float64Array[];
  /** <n l1| r^k |n' l2>, row-major size × size (row n, column n'), a0^k. Cached. */
  radial(l1: number, l2: number, k: number): Float64Array;
  /** Column n' of {@link radial}: <n l1| r^k |n' l2> for n = 0 … size − 1 (the same doubles). Cached. */
  radialColumn(l1: number, l2: number, k: number, column: number): Float64Array;
}

/** Values of the normalised basis functions φ_0 … φ_{size−1} (for angular momentum l) at x = 2λr. */
function basisValues(l: number, size: number, x: number): Float64Array {
  const a = 2 * l + 1;
  const out = new Float64Array(size);
  let lnFact = 0;
  for (let i = 2; i <= a; i++) lnFact += Math.log(i);
  let p0 = Math.exp((l + 1) * Math.log(x) - x / 2 - lnFact / 2);
  out[0] = p0;
  if (size === 1) return out;
  let p1 = ((a + 1 - x) * p0) / Math.sqrt(a + 1);
  out[1] = p1;
  for (let n = 1; n < size - 1; n++) {
    const p2 = ((2 * n + a + 1 - x) * p1 - Math.sqrt(n * (n + a)) * p0) / Math.sqrt((n + 1) * (n + a + 1));
    p0 = p1;
    p1 = p2;
    out[n + 1] = p2;
  }
  return out;
}

/**
 * x ← (T − μ)^-1 x for the symmetric tridiagonal T (diagonal d, off-diagonal e[i] = T[i+1][i]) by Gaussian
 * elimination with partial pivoting (common practice; e.g. Golub & Van Loan, Matrix Computations §4.3); exact zero
 * pivots become `tiny` (μ is an eigenvalue: inverse iteration wants the large solution, not a failure). `work` holds
 * five arrays of length n (reused between calls: fresh typed arrays per solve cost more than the solve).
 */
function shiftedTridiagonalSolve(d: Float64Array, e: Float64Array, mu: number, x: Float64Array, tiny: number, work: Float64Array[]): void {
  const n = d.length;
  const [diag, sup1, sup2, mult, swapped] = work;
  for (let i = 0; i < n; i++) {
    diag[i] = d[i] - mu;
    sup1[i] = i + 1 < n ? e[i] : 0;
    sup2[i] = 0;
    swapped[i] = 0;
  }
  for (let i = 0; i + 1 < n; i++) {
    const sub = e[i]; // T[i+1][i]
    if (Math.abs(diag[i]) >= Math.abs(sub)) {
      if (diag[i] === 0) diag[i] = tiny;
      mult[i] = sub / diag[i];
      diag[i + 1] -= mult[i] * sup1[i];
    } else {
      // rows i and i+1 swap: the new row i is [sub, diag[i+1], sup1[i+1]]
      swapped[i] = 1;
      mult[i] = diag[i] / sub;
      const nextDiag = diag[i + 1], nextSup = sup1[i + 1], oldSup = sup1[i];
      diag[i] = sub;
      sup1[i] = nextDiag;
      sup2[i] = nextSup;
      diag[i + 1] = oldSup - mult[i] * nextDiag;
      sup1[i + 1] = -mult[i] * nextSup;
    }
  }
  if (diag[n - 1] === 0) diag[n - 1] = tiny;
  for (let i = 0; i + 1 < n; i++) {
    if (swapped[i]) {
      const t = x[i];
      x[i] = x[i + 1];
      x[i + 1] = t;
    }
    x[i + 1] -= mult[i] * x[i];
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    if (i + 1 < n) s -= sup1[i] * x[i + 1];
    if (i + 2 < n) s -= sup2[i] * x[i + 2];
    x[i] = s / diag[i];
  }
}

/**
 * Eigenvalues (descending) and orthonormal eigenvectors (vectors[k] for values[k]) of a symmetric tridiagonal
 * matrix: the eigenvalues by implicit QL (src/math/symmetric-eigen.ts), each vector by inverse iteration with
 * modified Gram–Schmidt against the vectors before it (common practice; Golub & Van Loan §8.2.2). The matrices here
 * are small (≤ 120) with well separated eigenvalues.
 */
function tridiagonalEigenpairs(d: Float64Array, e: Float64Array): { values: Float64Array; vectors: Float64Array[] } {
  const n = d.length;
  const values = tridiagonalEigenvalues(d, e).reverse();
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(d[i]) + Math.abs(e[i]) + (i > 0 ? Math.abs(e[i - 1]) : 0));
  const tiny = Number.EPSILON * norm;
  const work = Array.from({ length: 5 }, () => new Float64Array(n));
  const vectors: Float64Array[] = [];
  for (let k = 0; k < n; k++) {
    const x = new Float64Array(n).fill(1 / Math.sqrt(n));
    for (let iter = 0; iter < 3; iter++) {
      shiftedTridiagonalSolve(d, e, values[k], x, tiny, work);
      for (let j = 0; j < k; j++) {
        const v = vectors[j];
        let overlap = 0;
        for (let i = 0; i < n; i++) overlap += v[i] * x[i];
        for (let i = 0; i < n; i++) x[i] -= overlap * v[i];
      }
      let length = 0;
      for (let i = 0; i < n; i++) length += x[i] * x[i];
      length = Math.sqrt(length);
      for (let i = 0; i < n; i++) x[i] /= length;
    }
    vectors.push(x);
  }
  return { values, vectors };
}

/**
 * Energies and Sturmian coefficients (coefficients[n][j]: pseudo-state n, basis function j; S-normalised) of one l.
 * With λ = Z the Hamiltonian matrix is H = −(Z²/2) S + Z K, K = diag(j + l), so H c = E S c is Z K c = ε S c with
 * ε = E + Z²/2 (derived here). For l ≥ 1 K is positive: y = K^{1/2} c solves the symmetric tridiagonal problem
 * K^{-1/2} S K^{-1/2} y = (Z/ε) y, and the largest Z/ε is the lowest state. For l = 0, K_00 = 0: ε = 0 is the exact
 * 1s (c = e_0), and for ε ≠ 0 the first row gives c_0 = −S_01 c_1 / S_00, leaving the same problem on j ≥ 1 with S_11
 * replaced by the Schur complement S_11 − S_01²/S_00 (still tridiagonal). Since cᵀ S c = yᵀ T y = Z/ε for a unit y,
 * c = K^{-1/2} y / sqrt(Z/ε).
 */
function channelStates(Z: number, l: number, size: number): { energies: Float64Array; coefficients: Float64Array[] } {
  const lam = Z;
  const Sdiag = Float64Array.from({ length: size }, (_, j) => (2 * (j + l + 1)) / (2 * lam));
  const Soff = Float64Array.from({ length: size - 1 }, (_, j) => -Math.sqrt((j + 1) * (j + 2 * l + 2)) / (2 * lam));
  const first = l === 0 ? 1 : 0; // basis functions of the tridiagonal problem: j = first … size − 1
  const m = size - first;
  const d = new Float64Array(m), e = new Float64Array(m);
  const k = (j: number) => j + l;
  for (let i = 0; i < m; i++) {
    const j = i + first;
    const sjj = l === 0 && j === 1 ? Sdiag[1] - (Soff[0] * Soff[0]) / Sdiag[0] : Sdiag[j];
    d[i] = sjj / k(j);
    if (i + 1 < m) e[i] = Soff[j] / Math.sqrt(k(j) * k(j + 1));
  }
  const { values, vectors } = tridiagonalEigenpairs(d, e);
  const energies = new Float64Array(size);
  const coefficients: Float64Array[] = [];
  if (l === 0) {
    energies[0] = (-Z * Z) / 2;
    const ground = new Float64Array(size);
    ground[0] = 1 / Math.sqrt(Sdiag[0]);
    coefficients.push(ground);
  }
  values.forEach((tau, i) => {
    energies[i + first] = Z / tau - (Z * Z) / 2;
    const c = new Float64Array(size);
    const scale = 1 / Math.sqrt(tau);
    for (let r = 0; r < m; r++) c[r + first] = (vectors[i][r] * scale) / Math.sqrt(k(r + first));
    if (l === 0) c[0] = (-Soff[0] * c[1]) / Sdiag[0];
    coefficients.push(c);
  });
  return { energies, coefficients };
}

/** Energies and eigenvector values at the quadrature nodes for one l. */
function solveChannel(Z: number, l: number, size: number, nodes: Float64Array): { energies: Float64Array; values: Float64Array[] } {
  const { energies, coefficients } = channelStates(Z, l, size);
  // sign convention: each pseudo-state's leading coefficient (small r behaviour) positive
  const sign = coefficients.map((c) => (c[0] < 0 ? -1 : 1));
  const values = Array.from(nodes, (x) => {
    const phi = basisValues(l, size, x);
    const row = new Float64Array(size);
    for (let n = 0; n < size; n++) {
      const c = coefficients[n];
      let s = 0;
      for (let j = 0; j < size; j++) s += c[j] * phi[j];
      row[n] = sign[n] * s;
    }
    return row;
  });
  return { energies, values };
}

const cache = new Map<string, RadialPseudoSpectrum>();

/**
 * The radial pseudo-spectrum of a hydrogen-like atom (charge Z) with `size` Sturmian functions per l = 0 … lMax.
 * Cached per (Z, size, lMax): repeated pair computations reuse it.
 */
export function hydrogenicSpectrum(Z: number, size: number, lMax = 3): RadialPseudoSpectrum {
  const key = `${Z}|${size}|${lMax}`;
  const hit = cache.get(key);
  if (hit) return hit;
  if (!(Z > 0) || !Number.isInteger(size) || size < 2 || size > 120 || !Number.isInteger(lMax) || lMax < 0 || lMax > 8) {
    throw new RangeError(`hydrogenic spectrum needs Z > 0, size 2…120, lMax 0…8; got Z=${Z}, size=${size}, lMax=${lMax}`);
  }
  // exact for integrands x^{l1+l2+2+k} × (degree ≤ 2(size−1)) with k ≤ 2 lMax + 3
  const rule = gaussLaguerre(size + 2 * lMax + 4);
  const channels = Array.from({ length: lMax + 1 }, (_, l) => solveChannel(Z, l, size, rule.nodes));
  const radialCache = new Map<number, Float64Array>(), columnCache = new Map<number, Float64Array>();
  /** Quadrature weights × r^k in units of (2Z)^-(k+1): W_i x_i^k (2Z)^-(k+1), per k. */
  const weightsByPower: Float64Array[] = [];
  const weights = (k: number) => (weightsByPower[k] ??= rule.nodes.map((x, i) => rule.scaledWeights[i] * x ** k * (2 * Z) ** -(k + 1)));
  const spectrum: RadialPseudoSpectrum = {
    Z,
    size,
    lMax,
    energies: channels.map((c) => c.energies),
    radial(l1, l2, k) {
      const rkey = (l1 * 16 + l2) * 64 + k;
      const got = radialCache.get(rkey);
      if (got) return got;
      const a = channels[l1].values, b = channels[l2].values, wk = weights(k);
      const out = new Float64Array(size * size);
      for (let i = 0; i < rule.nodes.length; i++) {
        const w = wk[i];
        const ai = a[i], bi = b[i];
        for (let n = 0; n < size; n++) {
          const wa = w * ai[n];
          for (let m = 0; m < size; m++) out[n * size + m] += wa * bi[m];
        }
      }
      radialCache.set(rkey, out);
      return out;
    },
    radialColumn(l1, l2, k, column) {
      const ckey = ((l1 * 16 + l2) * 64 + k) * 128 + column;
      const got = columnCache.get(ckey);
      if (got) return got;
      const whole = radialCache.get((l1 * 16 + l2) * 64 + k);
      const out = new Float64Array(size);
      if (whole) for (let n = 0; n < size; n++) out[n] = whole[n * size + column];
      else {
        // the sums of radial() for one column, node by node in the same order
        const a = channels[l1].values, b = channels[l2].values, wk = weights(k);
        for (let i = 0; i < rule.nodes.length; i++) {
          const w = wk[i], ai = a[i], bm = b[i][column];
          for (let n = 0; n < size; n++) out[n] += w * ai[n] * bm;
        }
      }
      columnCache.set(ckey, out);
      return out;
    },
  };
  cache.set(key, spectrum);
  return spectrum;
}
