/**
 * The large-matrix path of the eigensolver (src/math/symmetric-eigen.ts, taken from order 2000): the blocked
 * tridiagonalisation (symmetricProduct kernel, panel updates, rank-2k trailing update by the register-tiled gemmTile
 * kernel) and the back-transformation on gemmTile. Checked against the previous path (fused reduction, gemm
 * back-transformation, still used below order 2000), against a plain cyclic Jacobi eigen-decomposition written here,
 * and against a closed-form spectrum, on seeded random symmetric matrices. The kernels themselves are checked in
 * symmetric-eigen-kernels.test.ts.
 *
 * What is compared: eigenvalues to 1e-13 relative to the spectral norm ‖A‖₂ = max |λ|; eigenvectors up to sign,
 * each to C n ε ‖A‖₂ / gap_k (gap_k: distance of λ_k to the rest of the spectrum; the sin θ bound of
 * C. Davis and W. M. Kahan, SIAM J. Numer. Anal. 7, 1 (1970), as in G. H. Golub and C. F. Van Loan, Matrix
 * Computations, 4th ed. 2013, Thm 8.1.12, for two backward-stable decompositions of the same matrix).
 */
import { afterAll, describe, expect, test } from 'vitest';
import { symmetricEigen, type SymmetricEigenResult } from '../../src/math/symmetric-eigen.js';
import { ThreadTeam } from '../../src/math/thread-team.js';
import { expectClose } from '../helpers/tolerance.js';
import { randomSymmetric } from '../helpers/random.js';

const EPS = 2 ** -52;
/** Tolerance factor on n ε (common practice: a small constant in front of the backward-error bound). */
const C = 10;
/** Eigenvalues of two paths agree to this fraction of ‖A‖₂ (the 1e-13). */
const VALUE_TOL = 1e-13;

const team1 = new ThreadTeam(1);
const team2 = new ThreadTeam(2);
afterAll(() => {
  team1.close();
  team2.close();
});

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

/**
 * Cyclic Jacobi eigen-decomposition (Golub & Van Loan 2013, Algorithm 8.5.3, rotations by their §8.5.2 formulas),
 * swept until the off-diagonal part is below ε²‖A‖_F; an independent reference for small n.
 */
function jacobi(a0: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const a = Float64Array.from(a0), V = new Float64Array(n * n);
  for (let i = 0; i < n; i++) V[i * n + i] = 1;
  let frob = 0;
  for (const x of a) frob += x * x;
  for (let sweep = 0; sweep < 50; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = 0; q < n; q++) if (p !== q) off += a[p * n + q] ** 2;
    if (off <= EPS * EPS * frob) break;
    for (let p = 0; p < n - 1; p++)
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q];
        if (apq === 0) continue;
        const tau = (a[q * n + q] - a[p * n + p]) / (2 * apq);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t), s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k * n + p], akq = a[k * n + q];
          a[k * n + p] = c * akp - s * akq;
          a[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p * n + k], aqk = a[q * n + k];
          a[p * n + k] = c * apk - s * aqk;
          a[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = V[k * n + p], vkq = V[k * n + q];
          V[k * n + p] = c * vkp - s * vkq;
          V[k * n + q] = s * vkp + c * vkq;
        }
      }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((i, j) => a[i * n + i] - a[j * n + j]);
  const values = Float64Array.from(order, (i) => a[i * n + i]);
  const vectors = new Float64Array(n * n);
  order.forEach((from, to) => {
    for (let i = 0; i < n; i++) vectors[i * n + to] = V[i * n + from];
  });
  return { values, vectors };
}

/** Values to VALUE_TOL ‖A‖₂; vector k up to sign to C n ε ‖A‖₂ / gap_k (Davis–Kahan). */
function expectSameDecomposition(got: SymmetricEigenResult, ref: { values: Float64Array; vectors?: Float64Array }, n: number, label: string): void {
  const norm = Math.max(Math.abs(ref.values[0]), Math.abs(ref.values[n - 1]));
  for (let k = 0; k < n; k++) expectClose(got.values[k], ref.values[k], 0, VALUE_TOL * norm, `${label} λ${k}`);
  if (!ref.vectors) return;
  const V = got.vectors!, R = ref.vectors;
  for (let k = 0; k < n; k++) {
    let gap = Infinity;
    if (k > 0) gap = Math.min(gap, ref.values[k] - ref.values[k - 1]);
    if (k < n - 1) gap = Math.min(gap, ref.values[k + 1] - ref.values[k]);
    let dot = 0;
    for (let i = 0; i < n; i++) dot += V[i * n + k] * R[i * n + k];
    const sign = dot < 0 ? -1 : 1;
    let worst = 0;
    for (let i = 0; i < n; i++) worst = Math.max(worst, Math.abs(V[i * n + k] - sign * R[i * n + k]));
    expect(worst, `${label} vector ${k}`).toBeLessThanOrEqual((C * n * EPS * norm) / gap);
  }
}

describe('blocked tridiagonalisation against the previous paths', () => {
  test.each([3, 33, 64, 65, 97, 130])('n = %i: blocked and fused reductions give the same decomposition, and both agree with cyclic Jacobi', (n) => {
    const a = randomSymmetric(n, 100 + n);
    const blocked = symmetricEigen(a, n, { tridiagonalisation: 'blocked', team: team1 });
    const fused = symmetricEigen(a, n, { tridiagonalisation: 'fused', team: team1 });
    const ref = jacobi(a, n);
    expectSameDecomposition(blocked, fused, n, 'blocked vs fused');
    expectSameDecomposition(blocked, ref, n, 'blocked vs Jacobi');
    expectSameDecomposition(fused, ref, n, 'fused vs Jacobi');
  });

  test('n = 1100 on two threads: blocked equals fused (values 1e-13 ‖A‖₂, vectors by Davis–Kahan), and one thread gives the same bits', () => {
    const n = 1100;
    const a = randomSymmetric(n, 7);
    const blocked = symmetricEigen(a, n, { tridiagonalisation: 'blocked', team: team2 });
    const fused = symmetricEigen(a, n, { tridiagonalisation: 'fused', team: team2 });
    expectSameDecomposition(blocked, fused, n, 'n = 1100');
    const single = symmetricEigen(a, n, { tridiagonalisation: 'blocked', team: team1 });
    expect(bytes(single.values).equals(bytes(blocked.values))).toBe(true);
    expect(bytes(single.vectors!).equals(bytes(blocked.vectors!))).toBe(true);
  });

  test('only the lower triangle is read: NaN above the diagonal gives the same bits on both paths', () => {
    const n = 130;
    const a = randomSymmetric(n, 11);
    const poisoned = Float64Array.from(a);
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) poisoned[i * n + j] = NaN;
    for (const method of ['blocked', 'fused'] as const) {
      const clean = symmetricEigen(a, n, { tridiagonalisation: method, team: team1 });
      const got = symmetricEigen(poisoned, n, { tridiagonalisation: method, team: team1 });
      expect(bytes(got.values).equals(bytes(clean.values)), method).toBe(true);
      expect(bytes(got.vectors!).equals(bytes(clean.vectors!)), method).toBe(true);
    }
  });

  test('closed-form spectrum: A_ij = min(i, j) has λ_k = 1 / (4 sin²((2k − 1)π / (4n + 2))) (derived here: A⁻¹ is the second-difference matrix with one free end)', () => {
    const n = 300;
    const a = Float64Array.from({ length: n * n }, (_, e) => Math.min(Math.floor(e / n), e % n) + 1);
    const { values } = symmetricEigen(a, n, { tridiagonalisation: 'blocked', team: team1, vectors: false });
    const exact = Array.from({ length: n }, (_, k) => 1 / (4 * Math.sin(((2 * (n - k) - 1) * Math.PI) / (4 * n + 2)) ** 2));
    for (let k = 0; k < n; k++) expectClose(values[k], exact[k], 0, VALUE_TOL * exact[n - 1], `λ${k}`);
  });
});
