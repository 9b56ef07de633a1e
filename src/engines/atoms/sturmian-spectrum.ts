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
 * H = T − Z/r is diagonalised in this basis (Cholesky of S + symmetric EVD). Because λ = Z, the l = 0 basis
 * contains e^{-Zr} and the ground state 1s is exact; all static perturbation functions of hydrogen are
 * polynomials × e^{-Zr}, so static response properties are exact for a modest size, and dynamic ones converge
 * exponentially with size (shown in the tests).
 *
 * Radial integrals <n l|r^k|n' l'> are evaluated with a Gauss–Laguerre rule that is exact for the polynomial
 * degree involved, so they carry no quadrature error (only rounding).
 */
import type { Matrix } from 'ml-matrix';
import { mlMatrixModule } from '../../lazy-modules.js';
import { symmetricEigen } from '../../math/symmetric-eigen.js';
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

/** Inverse of a lower-triangular matrix (forward substitution). */
function lowerInverse(L: Matrix): Matrix {
  const { Matrix } = mlMatrixModule();
  const n = L.rows;
  const inv = Matrix.zeros(n, n);
  for (let c = 0; c < n; c++)
    for (let r = c; r < n; r++) {
      let s = r === c ? 1 : 0;
      for (let k = c; k < r; k++) s -= L.get(r, k) * inv.get(k, c);
      inv.set(r, c, s / L.get(r, r));
    }
  return inv;
}

/** Energies and eigenvector values at the quadrature nodes for one l. */
function solveChannel(Z: number, l: number, size: number, nodes: Float64Array): { energies: Float64Array; values: Float64Array[] } {
  const { CholeskyDecomposition, Matrix } = mlMatrixModule();
  const lam = Z;
  const S = Matrix.zeros(size, size);
  for (let j = 0; j < size; j++) {
    S.set(j, j, (2 * (j + l + 1)) / (2 * lam));
    if (j + 1 < size) {
      const off = -Math.sqrt((j + 1) * (j + 2 * l + 2)) / (2 * lam);
      S.set(j, j + 1, off);
      S.set(j + 1, j, off);
    }
  }
  const H = S.clone().mul((-lam * lam) / 2);
  for (let j = 0; j < size; j++) H.set(j, j, H.get(j, j) + lam * (j + l + 1) - Z);
  const Linv = lowerInverse(new CholeskyDecomposition(S).lowerTriangularMatrix);
  const A = Linv.mmul(H).mmul(Linv.transpose());
  const eig = symmetricEigen(Float64Array.from(A.to1DArray()), size); // ascending; reads the lower triangle
  const Y = new Matrix(size, size);
  for (let i = 0; i < size; i++) for (let k = 0; k < size; k++) Y.set(i, k, eig.vectors![i * size + k]);
  const C = Linv.transpose().mmul(Y); // columns: coefficients in the φ basis, S-normalised
  const energies = Float64Array.from(eig.values);
  const values = Array.from(nodes, (x) => {
    const phi = basisValues(l, size, x);
    const row = new Float64Array(size);
    for (let n = 0; n < size; n++) {
      let s = 0;
      for (let j = 0; j < size; j++) s += C.get(j, n) * phi[j];
      row[n] = s;
    }
    return row;
  });
  // sign convention: each pseudo-state's leading coefficient (small r behaviour) positive
  for (let n = 0; n < size; n++) if (C.get(0, n) < 0) for (const row of values) row[n] = -row[n];
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
  const radialCache = new Map<number, Float64Array>();
  const spectrum: RadialPseudoSpectrum = {
    Z,
    size,
    lMax,
    energies: channels.map((c) => c.energies),
    radial(l1, l2, k) {
      const rkey = (l1 * 16 + l2) * 64 + k;
      const got = radialCache.get(rkey);
      if (got) return got;
      const a = channels[l1].values, b = channels[l2].values;
      const out = new Float64Array(size * size);
      const scale = (2 * Z) ** -(k + 1);
      for (let i = 0; i < rule.nodes.length; i++) {
        const w = rule.scaledWeights[i] * rule.nodes[i] ** k * scale;
        const ai = a[i], bi = b[i];
        for (let n = 0; n < size; n++) {
          const wa = w * ai[n];
          for (let m = 0; m < size; m++) out[n * size + m] += wa * bi[m];
        }
      }
      radialCache.set(rkey, out);
      return out;
    },
  };
  cache.set(key, spectrum);
  return spectrum;
}
