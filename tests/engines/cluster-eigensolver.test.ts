/** The typed-array symmetric eigensolver behind the cluster engine (src/math/symmetric-eigen.ts). */
import { describe, expect, test } from 'vitest';
import { EVD, Matrix } from 'ml-matrix';
import { symmetricEigen, tridiagonalEigenvalues } from '../../src/math/symmetric-eigen.js';
import { expectClose } from '../helpers/tolerance.js';
import { seededRandom } from '../helpers/random.js';

const EPS = 2 ** -52;

function randomSymmetric(n: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const x = rand() - 0.5;
      a[i * n + j] = x;
      a[j * n + i] = x;
    }
  return a;
}

/** max |A V − V Λ| and max |Vᵀ V − I|, with ‖A‖ (largest |entry|·n) for the tolerance. */
function check(a: Float64Array, n: number) {
  const { values, vectors } = symmetricEigen(a, n);
  const V = vectors!;
  let residual = 0, orth = 0, norm = 0;
  for (const x of a) norm = Math.max(norm, Math.abs(x) * n);
  for (let k = 0; k < n; k++) {
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += a[i * n + j] * V[j * n + k];
      residual = Math.max(residual, Math.abs(s - values[k] * V[i * n + k]));
    }
    for (let l = 0; l <= k; l++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += V[i * n + k] * V[i * n + l];
      orth = Math.max(orth, Math.abs(s - (k === l ? 1 : 0)));
    }
  }
  return { values, residual, orth, norm };
}

describe('symmetricEigen', () => {
  test.each([1, 2, 3, 7, 40, 121])('random symmetric n = %i (seeded): A V = V Λ, Vᵀ V = I, values ascending and as ml-matrix EVD', (n) => {
    const a = randomSymmetric(n, 100 + n);
    const { values, residual, orth, norm } = check(a, n);
    expect(residual).toBeLessThan(10 * n * EPS * norm + 1e-300);
    expect(orth).toBeLessThan(10 * n * EPS);
    for (let k = 1; k < n; k++) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
    const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
    const ref = [...new EVD(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues].sort((x, y) => x - y);
    ref.forEach((r, k) => expectClose(values[k], r, 0, 10 * n * EPS * norm));
  });
  test('degenerate spectra (identical 3×3 blocks, the identity) still give orthonormal vectors', () => {
    const n = 60;
    const blocks = new Float64Array(n * n);
    for (let b = 0; b < n / 3; b++) for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) blocks[(3 * b + i) * n + 3 * b + j] = i === j ? 2 : 0.3;
    const identity = new Float64Array(n * n);
    for (let i = 0; i < n; i++) identity[i * n + i] = 1;
    for (const a of [blocks, identity]) {
      const { residual, orth } = check(a, n);
      expect(residual).toBeLessThan(100 * n * EPS);
      expect(orth).toBeLessThan(100 * n * EPS);
    }
  });
  test('eigenvalues only, and the tridiagonal QL on a known spectrum (2 − 2cos(kπ/(n+1)))', () => {
    const n = 30;
    const d = new Float64Array(n).fill(2), e = new Float64Array(n).fill(-1);
    const vals = tridiagonalEigenvalues(d, e);
    for (let k = 1; k <= n; k++) expectClose(vals[k - 1], 2 - 2 * Math.cos((k * Math.PI) / (n + 1)), 0, 1e-14);
    expect(symmetricEigen(randomSymmetric(5, 1), 5, { vectors: false }).vectors).toBeUndefined();
  });
  test('a matrix of the wrong size is refused', () => {
    expect(() => symmetricEigen(new Float64Array(5), 2)).toThrow(/expected 2×2/);
  });
});
