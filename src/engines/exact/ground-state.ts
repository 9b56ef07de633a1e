/**
 * The pair's ground state in one nested basis (the functions with at most N quanta): Davidson, then
 * component-wise polishing, then the induced dipoles <mu_A,z>, <mu_B,z> as expectation values.
 * Energies are interaction energies E − E0_A − E0_B (hartree); dipoles in e·a0; A at the origin, B at +R ẑ.
 */
import { davidsonLowest, polishEigenvector, type SymmetricOperator } from './davidson.js';
import type { ExactModel } from './pair-hamiltonian.js';
import { denseGroup, expectationPrefix, multiplyPrefix, type SparseOperator } from './sparse-operator.js';

/** Hamiltonian values at one R (from `hamiltonianAt`); `pattern` is the operator they follow (default `model.coupling`). */
export interface HamiltonianValues {
  values: Float64Array;
  diagonal: Float64Array;
  pattern?: SparseOperator;
}

export interface BasisSolution {
  /** Total quanta N of the nested basis. */
  quanta: number;
  dimension: number;
  /** Interaction energy, hartree. */
  energy: number;
  muA: number;
  muB: number;
  /** ||H v − E v|| of the normalised eigenvector, hartree. */
  residual: number;
  iterations: number;
  /** Eigenvector on the first `dimension` basis functions. */
  vector: Float64Array;
}

/** The Hamiltonian at one R as a matrix-free operator on the leading `dim` functions. */
export function prefixOperator(model: ExactModel, H: HamiltonianValues, dim: number): SymmetricOperator {
  const pattern = H.pattern ?? model.coupling;
  return {
    size: dim,
    diagonal: H.diagonal.subarray(0, dim),
    apply: (x, y) => multiplyPrefix(pattern, H.values, H.diagonal, x, y, dim),
  };
}

/**
 * Lowest eigenpair in the basis of at most `quanta` quanta. `initial` (e.g. the vector of the next smaller
 * basis, padded with zeros) speeds it up. `tolerance` bounds the residual norm.
 */
export function solveInBasis(
  model: ExactModel,
  H: HamiltonianValues,
  quanta: number,
  tolerance: number,
  initial?: Float64Array,
): BasisSolution {
  const dim = model.basis.prefixSize[quanta];
  const op = prefixOperator(model, H, dim);
  let start: Float64Array | undefined;
  if (initial) {
    start = new Float64Array(dim);
    start.set(initial.subarray(0, Math.min(dim, initial.length)));
  }
  const coarse = davidsonLowest(op, { tolerance: Math.max(tolerance, 1e-12), initial: start });
  // the polish stops once the dipoles (what the solution is for) have settled to rounding
  const muA = denseGroup(model.dipoleA, 0), muB = denseGroup(model.dipoleB, 0);
  const dipoles = (x: Float64Array, norm2: number) => [
    expectationPrefix(model.dipoleA, muA, x, dim) / norm2,
    expectationPrefix(model.dipoleB, muB, x, dim) / norm2,
  ];
  const fine = polishEigenvector(op, coarse, tolerance, { watch: dipoles });
  const v = fine.vector;
  return {
    quanta,
    dimension: dim,
    energy: fine.value,
    muA: expectationPrefix(model.dipoleA, muA, v, dim),
    muB: expectationPrefix(model.dipoleB, muB, v, dim),
    residual: fine.residualNorm,
    iterations: fine.iterations,
    vector: v,
  };
}
