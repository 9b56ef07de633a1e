/**
 * Finite-R exact solution of a pair of Drude oscillators, converged in basis size.
 *
 * At each R the ground state is solved in nested bases of N = startQuanta, startQuanta + 1, … total quanta;
 * the basis is accepted when two successive enlargements change the interaction energy and both induced dipoles
 * by no more than `tolerance` (relative). The record of every step is returned. A result is trusted only when
 * it converged, the lowest eigenvalue fell monotonically with N (nested bases; Cauchy interlacing), the
 * eigenvector residual is small, and the basis stayed inside the escape barrier of the multipole potential
 * ({@link localisationCheck}); otherwise `reasons` says why not.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { solveInBasis, type BasisSolution } from './ground-state.js';
import { basisReach, localisationCheck, type LocalisationCheck } from './localisation.js';
import { fullProductDimension } from './pair-basis.js';
import { exactModel, extendHamiltonian, growExactModel, hamiltonianAt, type ExactModel, type PairHamiltonianValues } from './pair-hamiltonian.js';

export interface ExactOptions {
  /** Highest multipole order of the coupling (2 dipole–dipole, 3 adds dipole–quadrupole …). Default 3. */
  order?: number;
  /** Relative change allowed between successive bases. Default 1e-10. */
  tolerance?: number;
  /** Smallest basis tried (total quanta). Default 4. */
  startQuanta?: number;
  /** Largest basis allowed (total quanta). Default 24. */
  maxQuanta?: number;
  /** Use the L_z = 0, mirror-even reduction. Default true. */
  reduced?: boolean;
  /** Largest eigenvector residual ||Hv − Ev|| accepted, hartree. Default 1e-10. */
  residualTolerance?: number;
}

/** One step of the basis-convergence record: the solution in one nested basis, without its vector. */
export type BasisStep = Omit<BasisSolution, 'vector' | 'iterations'>;

export interface ExactPoint {
  /** Separation, bohr. */
  R: number;
  /** Interaction energy E − E0_A − E0_B, hartree. */
  energy: number;
  /** Induced dipoles along z, e·a0 (A at the origin, B at +R ẑ). */
  muA: number;
  muB: number;
  muTotal: number;
  /** The accepted basis: total quanta, its dimension, and the dimension without the symmetry reduction. */
  quanta: number;
  dimension: number;
  fullDimension: number;
  residual: number;
  /** The basis-size loop reached its tolerance. */
  converged: boolean;
  /** Converged and every check passed; when false, `reasons` says why. */
  trusted: boolean;
  reasons: string[];
  record: BasisStep[];
  localisation: LocalisationCheck;
}

/** A point together with its eigenvector (on the first `dimension` functions of `model`). */
export interface ExactState {
  point: ExactPoint;
  model: ExactModel;
  vector: Float64Array;
}

export interface ExactSolver {
  order: number;
  solve(R: number): ExactState;
}

/** A solver for one pair; the basis matrices are built once and enlarged only when a point needs more quanta. */
export function exactSolver(A: DrudeSpecies, B: DrudeSpecies, options: ExactOptions = {}): ExactSolver {
  const order = options.order ?? 3;
  const tol = options.tolerance ?? 1e-10;
  const start = options.startQuanta ?? 4;
  const maxQuanta = Math.max(start + 2, options.maxQuanta ?? 24);
  const reduced = options.reduced ?? true;
  const residualTol = options.residualTolerance ?? 1e-10;
  let model: ExactModel | undefined;
  let lastVector: Float64Array | undefined;
  let spare: PairHamiltonianValues | undefined; // the Hamiltonian arrays of the previous R, reused
  let lastQuanta = 0; // the accepted basis of the previous point

  const modelFor = (N: number): ExactModel => {
    if (!model || model.basis.maxQuanta < N) {
      // a larger model keeps the rows it has and computes only the new ones, so it grows just to the N asked for
      const grown = model ? N : Math.max(start + 8, 12);
      const cap = Math.min(maxQuanta, Math.max(N, grown));
      model = model ? growExactModel(model, cap) : exactModel(A, B, { order, maxQuanta: cap, reduced });
    }
    return model;
  };

  const small = (change: number, scale: number) => change <= Math.max(tol, 4 * Number.EPSILON) * scale;

  function solve(R: number): ExactState {
    const localisation = localisationCheck(A, B, order, R);
    const limit = Math.min(maxQuanta, Math.max(start + 2, localisation.maxQuanta));
    const record: BasisStep[] = [];
    const reasons: string[] = [];
    let previous: BasisSolution | undefined = undefined;
    let current: BasisSolution | undefined = undefined;
    let converged = false;
    let calmSteps = 0;
    let H: PairHamiltonianValues | undefined;
    let Hfor: ExactModel | undefined;
    // a curve visits R in order and neighbouring points need similar bases: start 4 quanta below the previous point's
    // (the loop still needs two calm steps, so a point may end up to 2 quanta below its neighbour, or above it)
    const begin = Math.min(limit, Math.max(start, lastQuanta - 4));
    for (let N = begin; N <= limit; N++) {
      const m = modelFor(N);
      // only the rows of the nested basis in use are filled (the model may be much larger than this point needs)
      const rows = m.basis.prefixSize[Math.min(N, m.basis.maxQuanta)];
      if (Hfor !== m) {
        H = spare = hamiltonianAt(m, R, rows, spare, 'lower');
        Hfor = m;
      } else extendHamiltonian(m, R, H!, rows);
      const guess = previous?.vector ?? (lastVector && lastVector.length <= m.basis.size ? lastVector : undefined);
      current = solveInBasis(m, H!, N, residualTol, guess);
      const { vector: _v, iterations: _i, ...step } = current;
      record.push(step);
      if (previous) {
        if (current.energy > previous.energy + 1e-12 * Math.abs(previous.energy) + 1e-18)
          reasons.push(`the lowest eigenvalue rose from ${N - 1} to ${N} quanta (nested bases must give non-increasing values): eigensolver failure`);
        const muScale = Math.max(Math.abs(current.muA), Math.abs(current.muB));
        const calm =
          small(Math.abs(current.energy - previous.energy), Math.abs(current.energy)) &&
          small(Math.abs(current.muA - previous.muA), muScale) &&
          small(Math.abs(current.muB - previous.muB), muScale);
        calmSteps = calm ? calmSteps + 1 : 0;
        if (calmSteps >= 2) {
          converged = true;
          break;
        }
      }
      previous = current;
    }
    const sol = current!;
    lastVector = sol.vector;
    const N = sol.quanta;
    lastQuanta = N;
    if (!converged) {
      if (N >= maxQuanta) reasons.push(`basis not converged to ${tol} within ${maxQuanta} quanta`);
      else
        reasons.push(
          `basis not converged to ${tol} at ${N} quanta, and a larger basis would reach the escape barrier of the multipole potential`,
        );
    }
    if (localisation.barrier === 0)
      reasons.push(
        `R = ${R} bohr is inside the polarisation-catastrophe distance ${localisation.catastropheR.toPrecision(4)} bohr: the dipole–dipole coupling outweighs the restoring force and there is no bound ground state`,
      );
    else if (N > localisation.maxQuanta)
      reasons.push(
        `the basis of ${N} quanta reaches the escape barrier of the order-${order} multipole potential (scaled reach ${basisReach(N).toPrecision(3)} ≥ barrier ${localisation.barrier.toPrecision(3)}): the polynomial Hamiltonian is unbounded below beyond it, so the ground state is not well localised in this basis`,
      );
    if (!(sol.residual <= residualTol)) reasons.push(`eigenvector residual ${sol.residual.toExponential(2)} Eh above ${residualTol}`);
    const point: ExactPoint = {
      R,
      energy: sol.energy,
      muA: sol.muA,
      muB: sol.muB,
      muTotal: sol.muA + sol.muB,
      quanta: N,
      dimension: sol.dimension,
      fullDimension: fullProductDimension(N),
      residual: sol.residual,
      converged,
      trusted: converged && reasons.length === 0,
      reasons,
      record,
      localisation,
    };
    return { point, model: model!, vector: sol.vector };
  }

  return { order, solve };
}
