/**
 * The pair's ground state in one nested basis (the functions with at most N quanta): Davidson, then
 * component-wise polishing, then the induced dipoles <mu_A,z>, <mu_B,z> as expectation values.
 * Energies are interaction energies E − E0_A − E0_B (hartree); dipoles in e·a0; A at the origin, B at +R ẑ.
 */
import { davidsonLowest, polishEigenvector, type SymmetricOperator } from './davidson.js';
import type { ExactModel } from './pair-hamiltonian.js';
import { expectationPrefix, multiplyPrefix } from './sparse-operator.js';

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
export function prefixOperator(model: ExactModel, H: { values: Float64Array; diagonal: Float64Array }, dim: number): SymmetricOperator {
  return {
    size: dim,
    diagonal: H.diagonal.subarray(0, dim),
    apply: (x, y) => multiplyPrefix(model.coupling, H.values, H.diagonal, x, y, dim),
  };
}

/**
 * Lowest eigenpair in the basis of at most `quanta` quanta. `initial` (e.g. the vector of the next smaller
 * basis, padded with zeros) speeds it up. `tolerance` bounds the residual norm.
 */
export function solveInBasis(
  model: ExactModel,
  H: { values: Float64Array; diagonal: Float64Array },
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
  const fine = polishEigenvector(op, coarse, tolerance);
  const v = fine.vector;
  return {
    quanta,
    dimension: dim,
    energy: fine.value,
    muA: expectationPrefix(model.dipoleA, model.dipoleA.values[0], v, dim),
    muB: expectationPrefix(model.dipoleB, model.dipoleB.values[0], v, dim),
    residual: fine.residualNorm,
    iterations: fine.iterations,
    vector: v,
  };
}
