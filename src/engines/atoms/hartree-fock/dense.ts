/** Small dense row-major helpers for the Hartree–Fock engine (Float64Array, n×m row-major). */
import { symmetricEigen } from '../../../math/symmetric-eigen.js';

/** C = A (n×k) · B (k×m). */
export function matMul(A: Float64Array, B: Float64Array, n: number, k: number, m: number): Float64Array {
  const C = new Float64Array(n * m);
  for (let i = 0; i < n; i++)
    for (let p = 0; p < k; p++) {
      const a = A[i * k + p];
      if (a === 0) continue;
      const bo = p * m, co = i * m;
      for (let j = 0; j < m; j++) C[co + j] += a * B[bo + j];
    }
  return C;
}

/** Aᵀ (A is k×n, result n×k). */
export function transpose(A: Float64Array, k: number, n: number): Float64Array {
  const T = new Float64Array(n * k);
  for (let i = 0; i < k; i++) for (let j = 0; j < n; j++) T[j * k + i] = A[i * n + j];
  return T;
}

/** Xᵀ M X for X n×m, M n×n. */
export function congruence(M: Float64Array, X: Float64Array, n: number, m: number): Float64Array {
  return matMul(transpose(X, n, m), matMul(M, X, n, n, m), m, n, m);
}

/** Eigen-decomposition of a symmetric matrix (symmetrised first): values ascending, vectors[i·n + k]. */
export function eigh(M: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const S = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) S[i * n + j] = 0.5 * (M[i * n + j] + M[j * n + i]);
  const e = symmetricEigen(S, n);
  return { values: e.values, vectors: e.vectors! };
}

/**
 * Canonical orthogonalisation X = U s^(−1/2) over the eigenvalues s of the overlap above `threshold`·max(s)
 * (P.-O. Löwdin, Adv. Quantum Chem. 5, 185 (1970)); returns X (n×m) and the smallest kept eigenvalue.
 */
export function canonicalOrthogonaliser(S: Float64Array, n: number, threshold: number): { X: Float64Array; m: number; smallest: number } {
  const { values, vectors } = eigh(S, n);
  const max = values[n - 1];
  const keep: number[] = [];
  for (let k = 0; k < n; k++) if (values[k] > threshold * max) keep.push(k);
  const m = keep.length;
  const X = new Float64Array(n * m);
  keep.forEach((k, j) => {
    const f = 1 / Math.sqrt(values[k]);
    for (let i = 0; i < n; i++) X[i * m + j] = vectors[i * n + k] * f;
  });
  return { X, m, smallest: values[keep[0]] };
}

/** Solve the dense linear system A x = b (Gaussian elimination with partial pivoting); A n×n is not modified. */
export function solveLinear(A: Float64Array, b: Float64Array, n: number): Float64Array {
  const M = Float64Array.from(A), x = Float64Array.from(b);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r * n + c]) > Math.abs(M[piv * n + c])) piv = r;
    if (piv !== c) {
      for (let j = 0; j < n; j++) [M[c * n + j], M[piv * n + j]] = [M[piv * n + j], M[c * n + j]];
      [x[c], x[piv]] = [x[piv], x[c]];
    }
    const d = M[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = M[r * n + c] / d;
      if (f === 0) continue;
      for (let j = c; j < n; j++) M[r * n + j] -= f * M[c * n + j];
      x[r] -= f * x[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = x[r];
    for (let j = r + 1; j < n; j++) s -= M[r * n + j] * x[j];
    x[r] = s / M[r * n + r];
  }
  return x;
}

/** cᵀ H c and cᵀ F c for column `col` of the coefficient matrix C (rows n, row stride `stride`). */
export function expectationPair(C: Float64Array, stride: number, col: number, H: Float64Array, F: Float64Array, n: number): [number, number] {
  let hv = 0, fv = 0;
  for (let p = 0; p < n; p++)
    for (let q = 0; q < n; q++) {
      const cc = C[p * stride + col] * C[q * stride + col];
      hv += cc * H[p * n + q];
      fv += cc * F[p * n + q];
    }
  return [hv, fv];
}
