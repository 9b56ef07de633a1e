/**
 * The dense symmetric eigensolver (src/math/symmetric-eigen.ts) on its SIMD kernels and thread team: backward
 * stability (‖A V − V Λ‖ and ‖Vᵀ V − I‖ of order n ε ‖A‖, G. H. Golub, C. F. Van Loan, Matrix Computations,
 * 4th ed. 2013, §8.3–8.4), known spectra, degenerate eigenvalues, and results independent of the thread count.
 */
import { afterAll, describe, expect, test } from 'vitest';
import { symmetricEigen } from '../../src/math/symmetric-eigen.js';
import { ThreadTeam } from '../../src/math/thread-team.js';
import { expectClose } from '../helpers/tolerance.js';
import { randomSymmetric, seededRandom } from '../helpers/random.js';

const EPS = 2 ** -52;
/** Tolerance factor on n ε ‖A‖ (common practice: a small constant in front of the backward-error bound). */
const C = 10;

/** A random orthogonal Q (product of n seeded Householder reflectors) as a row-major array. */
function randomOrthogonal(n: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const Q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) Q[i * n + i] = 1;
  const u = new Float64Array(n), row = new Float64Array(n);
  for (let r = 0; r < 4; r++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += (u[i] = rand() - 0.5) ** 2;
    const f = 2 / s;
    // Q ← Q (I − f u uᵀ)
    for (let i = 0; i < n; i++) {
      let dot = 0;
      for (let j = 0; j < n; j++) dot += Q[i * n + j] * u[j];
      row[i] = f * dot;
    }
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Q[i * n + j] -= row[i] * u[j];
  }
  return Q;
}

/** Q diag(values) Qᵀ, exactly symmetric. */
function withSpectrum(values: readonly number[], seed: number): Float64Array {
  const n = values.length;
  const Q = randomOrthogonal(n, seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += Q[i * n + k] * values[k] * Q[j * n + k];
      a[i * n + j] = s;
      a[j * n + i] = s;
    }
  return a;
}

/** max |A V − V Λ|, max |Vᵀ V − I| and ‖A‖_∞ (row-sum norm). */
function residuals(a: Float64Array, n: number, values: Float64Array, V: Float64Array) {
  let residual = 0, orth = 0, norm = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) s += Math.abs(a[i * n + j]);
    norm = Math.max(norm, s);
  }
  const AV = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      const x = a[i * n + j];
      if (x === 0) continue;
      for (let k = 0; k < n; k++) AV[i * n + k] += x * V[j * n + k];
    }
  for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) residual = Math.max(residual, Math.abs(AV[i * n + k] - values[k] * V[i * n + k]));
  const G = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let k = 0; k < n; k++) {
      const x = V[i * n + k];
      for (let l = 0; l < n; l++) G[k * n + l] += x * V[i * n + l];
    }
  for (let k = 0; k < n; k++) for (let l = 0; l < n; l++) orth = Math.max(orth, Math.abs(G[k * n + l] - (k === l ? 1 : 0)));
  return { residual, orth, norm };
}

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

const team2 = new ThreadTeam(2);
afterAll(() => team2.close());

describe('symmetricEigen on the SIMD kernels', () => {
  test.each([1, 2, 3, 4, 5, 33, 64, 257])('random symmetric n = %i (seeded): A V = V Λ and Vᵀ V = I to n ε ‖A‖, values ascending', (n) => {
    const a = randomSymmetric(n, 7000 + n);
    const { values, vectors } = symmetricEigen(a, n);
    const { residual, orth, norm } = residuals(a, n, values, vectors!);
    expect(residual).toBeLessThanOrEqual(C * n * EPS * norm);
    expect(orth).toBeLessThanOrEqual(C * n * EPS);
    for (let k = 1; k < n; k++) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
  });

  test('order 600 (split tridiagonalisation steps, blocked back-transformation over column chunks): backward stable, and the same bits on 1 and 2 threads', () => {
    const n = 600;
    const a = randomSymmetric(n, 4242);
    const one = symmetricEigen(a, n, { team: new ThreadTeam(1) });
    const two = symmetricEigen(a, n, { team: team2 });
    const { residual, orth, norm } = residuals(a, n, two.values, two.vectors!);
    expect(residual).toBeLessThanOrEqual(C * n * EPS * norm);
    expect(orth).toBeLessThanOrEqual(C * n * EPS);
    // the work split is fixed by n alone, so the threads only change who computes what
    expect(bytes(two.values).equals(bytes(one.values))).toBe(true);
    expect(bytes(two.vectors!).equals(bytes(one.vectors!))).toBe(true);
  });

  test('a prescribed spectrum with multiplicities 1–4 (Q Λ Qᵀ, Q a seeded product of reflectors): values to n ε ‖A‖, orthonormal vectors in every degenerate subspace', () => {
    const values: number[] = [];
    for (let level = 0; values.length < 530; level++) for (let m = 0; m <= level % 4 && values.length < 530; m++) values.push(-3 + 0.05 * level);
    const n = values.length;
    const a = withSpectrum(values, 99);
    const r = symmetricEigen(a, n, { team: team2 });
    const { residual, orth, norm } = residuals(a, n, r.values, r.vectors!);
    expect(residual).toBeLessThanOrEqual(C * n * EPS * norm);
    expect(orth).toBeLessThanOrEqual(C * n * EPS);
    const sorted = [...values].sort((x, y) => x - y);
    sorted.forEach((x, k) => expectClose(r.values[k], x, 0, C * n * EPS * norm, `λ${k}`));
  });

  test('five-point Laplacian on a 24×24 grid: eigenvalues 4 − 2cos(iπ/25) − 2cos(jπ/25), doubly degenerate for i ≠ j (R. J. LeVeque, Finite Difference Methods for ODEs and PDEs, SIAM 2007, §3.4)', () => {
    const m = 24, n = m * m;
    const a = new Float64Array(n * n);
    for (let x = 0; x < m; x++)
      for (let y = 0; y < m; y++) {
        const i = x * m + y;
        a[i * n + i] = 4;
        if (x > 0) a[i * n + i - m] = a[(i - m) * n + i] = -1;
        if (y > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1;
      }
    const exact: number[] = [];
    for (let i = 1; i <= m; i++) for (let j = 1; j <= m; j++) exact.push(4 - 2 * Math.cos((i * Math.PI) / (m + 1)) - 2 * Math.cos((j * Math.PI) / (m + 1)));
    exact.sort((x, y) => x - y);
    const r = symmetricEigen(a, n, { team: team2 });
    exact.forEach((x, k) => expectClose(r.values[k], x, 0, C * n * EPS * 8, `λ${k}`));
    const { residual, orth } = residuals(a, n, r.values, r.vectors!);
    expect(residual).toBeLessThanOrEqual(C * n * EPS * 8);
    expect(orth).toBeLessThanOrEqual(C * n * EPS);
  });

  test('eigenvalues only agree with the full decomposition', () => {
    const n = 90;
    const a = randomSymmetric(n, 5);
    const full = symmetricEigen(a, n);
    const only = symmetricEigen(a, n, { vectors: false });
    expect(only.vectors).toBeUndefined();
    full.values.forEach((x, k) => expectClose(only.values[k], x, 0, 0));
  });

  test('the input is not modified, and repeated small calls (a kept workspace) give identical results', () => {
    const n = 6;
    const a = randomSymmetric(n, 11);
    const copy = Float64Array.from(a);
    const first = symmetricEigen(a, n);
    symmetricEigen(randomSymmetric(40, 12), 40); // another size in between reuses the kept memory
    const again = symmetricEigen(a, n);
    expect(Array.from(a)).toEqual(Array.from(copy));
    expect(Array.from(again.vectors!)).toEqual(Array.from(first.vectors!));
    expect(Array.from(again.values)).toEqual(Array.from(first.values));
  });

  test('a matrix of the wrong size is refused', () => {
    expect(() => symmetricEigen(new Float64Array(5), 2)).toThrow('matrix has 5 entries, expected 2×2');
  });
});
