/**
 * The exact engine's building blocks: circular couplings, the symmetry-reduced basis, the sparse Hamiltonian,
 * and the eigensolvers against a dense diagonalisation (ml-matrix).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, test } from 'vitest';
import { circularCouplingTerms } from '../../src/engines/exact/circular-coupling.js';
import { localStates, ladderMonomialAction } from '../../src/engines/exact/circular-states.js';
import { davidsonLowest } from '../../src/engines/exact/davidson.js';
import { solveInBasis } from '../../src/engines/exact/ground-state.js';
import { fullProductDimension, pairBasis } from '../../src/engines/exact/pair-basis.js';
import { exactModel, hamiltonianAt, type ExactModel } from '../../src/engines/exact/pair-hamiltonian.js';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { drude } from '../../src/model/drude.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { expectClose } from '../helpers/tolerance.js';

// invented demo species (src/model/builtin-species.ts)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/** The Hamiltonian of a model at R as a dense matrix (from the CSR arrays). */
function denseHamiltonian(model: ExactModel, R: number, dim = model.basis.size): Matrix {
  const H = hamiltonianAt(model, R);
  const M = Matrix.zeros(dim, dim);
  const { rowPtr, col } = model.coupling;
  for (let i = 0; i < dim; i++) {
    M.set(i, i, H.diagonal[i]);
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) if (col[k] < dim && col[k] !== i) M.set(i, col[k], H.values[k]);
  }
  return M;
}

describe('circular coordinates', () => {
  test('every coupling term conserves L_z of the pair; the dipole–dipole term is the textbook one', () => {
    for (let order = 2; order <= 5; order++) {
      const terms = circularCouplingTerms(order);
      expect(terms.length).toBeGreaterThan(0);
      for (const t of terms) expect(t.a[0] - t.a[1] + t.b[0] - t.b[1]).toBe(0);
    }
    // dipole–dipole: x_A x_B + y_A y_B − 2 z_A z_B (common practice) = ½(ρ+A ρ−B + ρ−A ρ+B) − 2 z_A z_B
    const dd = circularCouplingTerms(2).map((t) => `${t.a}|${t.b}:${t.exact.toFraction()}`).sort();
    expect(dd).toEqual(['0,0,1|0,0,1:-2', '0,1,0|1,0,0:1/2', '1,0,0|0,1,0:1/2'].sort());
    expect(couplingTerms(2)).toHaveLength(3);
  });
  test('ρ+ = √2 s (a+† + a−) raises m by one; z is the usual ladder sum (common practice)', () => {
    const S = localStates(4);
    const i = S.index(1, 1, 0);
    const act = ladderMonomialAction(S, [1, 0, 0], i); // (a+† + a−)|1,1,0> = √2 |2,1,0> + |1,0,0>
    const got = new Map(Array.from(act.targets, (t, k) => [`${S.nPlus[t]},${S.nMinus[t]},${S.nZ[t]}`, act.amps[k]]));
    expect([...got.keys()].sort()).toEqual(['1,0,0', '2,1,0']);
    expectClose(got.get('2,1,0')!, Math.SQRT2, 1e-15);
    expectClose(got.get('1,0,0')!, 1, 1e-15);
    for (const t of act.targets) expect(S.m[t]).toBe(S.m[i] + 1);
  });
});

describe('pair basis', () => {
  test('without reduction the dimension is C(N + 6, 6) (states of six oscillators with ≤ N quanta; common practice)', () => {
    for (const N of [0, 1, 4, 8]) expect(pairBasis(N, false).size).toBe(fullProductDimension(N));
    expect(fullProductDimension(8)).toBe(3003);
  });
  test('the reduced basis is nested: the basis for N quanta is a prefix of the basis for N + 1', () => {
    const small = pairBasis(6, true), large = pairBasis(9, true);
    for (let k = 0; k < small.size; k++) {
      expect(large.repA[k]).toBe(small.repA[k]);
      expect(large.repB[k]).toBe(small.repB[k]);
    }
    expect(large.prefixSize[6]).toBe(small.size);
    expect(small.size).toBeLessThan(fullProductDimension(6) / 5);
  });
  test('the Hamiltonian matrix is symmetric', () => {
    const model = exactModel(quelon, virid, { order: 4, maxQuanta: 7 });
    const H = denseHamiltonian(model, 7);
    let worst = 0, size = 0;
    for (let i = 0; i < H.rows; i++)
      for (let j = 0; j < i; j++) {
        worst = Math.max(worst, Math.abs(H.get(i, j) - H.get(j, i)));
        size = Math.max(size, Math.abs(H.get(i, j)));
      }
    expect(size).toBeGreaterThan(1e-4);
    expect(worst).toBeLessThan(1e-14 * size);
  });
  test('the symmetry reduction leaves the ground state unchanged (same lowest eigenvalue and dipoles)', () => {
    const R = 6.5, N = 7;
    const full = exactModel(quelon, virid, { order: 3, maxQuanta: N, reduced: false });
    const reduced = exactModel(quelon, virid, { order: 3, maxQuanta: N });
    const a = solveInBasis(full, hamiltonianAt(full, R), N, 1e-12);
    const b = solveInBasis(reduced, hamiltonianAt(reduced, R), N, 1e-12);
    expect(b.dimension).toBeLessThan(a.dimension / 5);
    expectClose(b.energy, a.energy, 1e-12);
    expectClose(b.muA, a.muA, 1e-10);
    expectClose(b.muB, a.muB, 1e-10);
  });
});

describe('eigensolvers against a dense diagonalisation (ml-matrix EVD)', () => {
  test('Davidson + polishing on the pair Hamiltonian: lowest eigenvalue, eigenvector and residual', () => {
    for (const [reduced, R, N] of [[true, 5, 7], [false, 4, 5]] as const) {
      const model = exactModel(quelon, virid, { order: 3, maxQuanta: N, reduced });
      const dense = denseHamiltonian(model, R);
      const evd = new EigenvalueDecomposition(dense);
      const values = evd.realEigenvalues;
      const k = values.indexOf(Math.min(...values));
      const sol = solveInBasis(model, hamiltonianAt(model, R), N, 1e-12);
      expectClose(sol.energy, values[k], 1e-11, 1e-16, 'lowest eigenvalue');
      const ref = evd.eigenvectorMatrix.getColumn(k);
      const overlap = Math.abs(ref.reduce((s, v, i) => s + v * sol.vector[i], 0)) / Math.hypot(...ref);
      expectClose(overlap, 1, 1e-12, 0, 'overlap with the dense eigenvector');
      // the reported residual ||Hv − Ev||, recomputed here with the dense matrix
      const Hv = dense.mmul(Matrix.columnVector(Array.from(sol.vector))).to1DArray();
      const residual = Math.hypot(...Hv.map((x, i) => x - sol.energy * sol.vector[i]));
      expect(residual).toBeLessThan(1e-12);
      expectClose(sol.residual, residual, 0, 1e-13, 'reported residual');
    }
  });
  test('Davidson on random symmetric matrices (seeded)', () => {
    const rand = seededRandom(20251);
    for (let trial = 0; trial < 4; trial++) {
      const n = 40;
      const a = Array.from({ length: n }, () => new Array(n).fill(0));
      for (let i = 0; i < n; i++)
        for (let j = 0; j <= i; j++) {
          const v = i === j ? uniform(rand, 0, 5) : uniform(rand, -0.3, 0.3);
          a[i][j] = v;
          a[j][i] = v;
        }
      const evd = new EigenvalueDecomposition(new Matrix(a));
      const ref = [...evd.realEigenvalues].sort((x, y) => x - y);
      const M = new Matrix(a);
      const dav = davidsonLowest(
        { size: n, diagonal: Float64Array.from(a, (row, i) => row[i]), apply: (x, y) => y.set(M.mmul(Matrix.columnVector(Array.from(x))).to1DArray()) },
        { tolerance: 1e-12 },
      );
      expect(dav.converged).toBe(true);
      expectClose(dav.value, ref[0], 0, 1e-12, 'Davidson lowest');
    }
  });
});
