/**
 * The full polynomial Hamiltonian of two Drude oscillators in a truncated harmonic product basis:
 *   H − E0 = Σ_X Σ_axes w_i n_i  +  qA qB Σ_{n=2}^{order} R^-(n+1) V_n(r_A, r_B),
 * the unperturbed excitation energies on the diagonal (so the lowest eigenvalue is the interaction energy
 * itself, with no cancellation against the zero-point energy) and the multipole couplings V_n of
 * {@link circularCouplingTerms} (for a QDO M_p = −q r^p, so M^A M^B = qA qB r_A^pA r_B^pB). Centres must be
 * axially symmetric about the bond axis (wx = wy); isotropic QDOs are the common case.
 * The matrices are built once per basis and reused at every R.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { Species } from '../../model/species.js';
import { circularCouplingTerms, type CircularCouplingTerm } from './circular-coupling.js';
import type { CircularMonomial } from './circular-states.js';
import { pairBasis, type PairBasis } from './pair-basis.js';
import { buildSparseOperator, combineGroups, type OperatorTerm, type SparseOperator } from './sparse-operator.js';

/** Highest multipole order the exact engine accepts (R^-8 couplings: order 7 completes the first-order D8 of anisotropic centres). */
export const MAX_EXACT_ORDER = 7;

export interface ExactModelOptions {
  /** Highest multipole order n in V = Σ V_n/R^(n+1): 2 dipole–dipole, 3 adds dipole–quadrupole (default), 4 … */
  order?: number;
  /** Largest total number of quanta (both centres) in the basis. */
  maxQuanta: number;
  /** Use the L_z = 0, mirror-even symmetry reduction (default true). */
  reduced?: boolean;
}

export interface ExactModel {
  A: DrudeSpecies;
  B: DrudeSpecies;
  order: number;
  basis: PairBasis;
  /** Coupling matrices, group k holding qA qB V_(k+2) (multiply by R^-(k+3)). */
  coupling: SparseOperator;
  /** Unperturbed excitation energies of the basis functions, hartree. */
  excitation: Float64Array;
  /** mu_A,z = −qA zA and mu_B,z = −qB zB, e·a0. */
  dipoleA: SparseOperator;
  dipoleB: SparseOperator;
}

/** Why the exact engine cannot take a species (null when it can): it needs Drude oscillators with wx = wy. */
export function axialProblem(s: Species): string | null {
  if (s.kind !== 'drude') return `${s.name} is not a Drude oscillator (the exact engine needs harmonic centres)`;
  return s.w[0] === s.w[1] ? null : `${s.name} is not axially symmetric about the bond axis (wx ≠ wy), so L_z is not conserved`;
}

/**
 * Length factor s⊥^(p+q) s_z^r of a monomial ρ+^p ρ−^q z^r on one centre (s = 1/sqrt(2 m w)); the (√2)^(p+q)
 * of ρ± = √2 s⊥ (…) goes into the exact coefficient instead (see {@link couplingWeight}). For an isotropic centre
 * every monomial of one degree gets the identical double s^degree, so couplings that cancel exactly for a
 * spherical centre (its vanishing permanent quadrupole, for instance) cancel to the last bit here too — otherwise
 * a rounding-level quadrupole would add a spurious R^-4 dipole that spoils the R^-7 fit at large R.
 */
function lengthFactor(s: DrudeSpecies, mono: CircularMonomial): number {
  const sPerp = 1 / Math.sqrt(2 * s.m * s.w[0]);
  const sZ = 1 / Math.sqrt(2 * s.m * s.w[2]);
  return sPerp === sZ ? sPerp ** (mono[0] + mono[1] + mono[2]) : sPerp ** (mono[0] + mono[1]) * sZ ** mono[2];
}

/**
 * Weight of one coupling term: qA qB · [c · 2^((pA+qA+pB+qB)/2)] · lengths. L_z conservation makes pA+qA and
 * pB+qB of equal parity, so the power of √2 is whole and the bracket is an exact rational.
 */
function couplingWeight(A: DrudeSpecies, B: DrudeSpecies, t: CircularCouplingTerm): number {
  const planar = t.a[0] + t.a[1] + t.b[0] + t.b[1];
  const exact = t.exact.mul(2 ** (planar / 2)).valueOf();
  return exact * (A.q * B.q * lengthFactor(A, t.a) * lengthFactor(B, t.b));
}

/** Build the model (species must pass {@link axialProblem}). */
export function exactModel(A: DrudeSpecies, B: DrudeSpecies, options: ExactModelOptions): ExactModel {
  for (const s of [A, B]) {
    const why = axialProblem(s);
    if (why) throw new Error(why);
  }
  const order = options.order ?? 3;
  if (!Number.isInteger(order) || order < 2 || order > MAX_EXACT_ORDER) throw new RangeError(`order must be 2…${MAX_EXACT_ORDER}`);
  const basis = pairBasis(options.maxQuanta, options.reduced ?? true);
  const groups: OperatorTerm[][] = [];
  for (let n = 2; n <= order; n++)
    groups.push(circularCouplingTerms(n).map((t) => ({ weight: couplingWeight(A, B, t), a: t.a, b: t.b })));
  const coupling = buildSparseOperator(basis, groups);
  const none: CircularMonomial = [0, 0, 0], z: CircularMonomial = [0, 0, 1];
  const dipoleA = buildSparseOperator(basis, [[{ weight: -A.q * lengthFactor(A, z), a: z, b: none }]]);
  const dipoleB = buildSparseOperator(basis, [[{ weight: -B.q * lengthFactor(B, z), a: none, b: z }]]);
  const { local } = basis;
  const level = (s: DrudeSpecies, i: number) => s.w[0] * (local.nPlus[i] + local.nMinus[i]) + s.w[2] * local.nZ[i];
  const excitation = Float64Array.from(basis.repA, (iA, k) => level(A, iA) + level(B, basis.repB[k]));
  return { A, B, order, basis, coupling, excitation, dipoleA, dipoleB };
}

/**
 * The Hamiltonian H − E0 at separation R (bohr): off-diagonal values on the coupling pattern and the diagonal,
 * filled for the leading `rows` basis functions (default all). A nested basis of N quanta needs only its prefix, so
 * a solver that stays well below the model's size fills the rest only when it gets there ({@link extendHamiltonian}).
 */
export interface PairHamiltonianValues {
  values: Float64Array;
  diagonal: Float64Array;
  /** Rows filled so far. */
  rows: number;
}

export function hamiltonianAt(model: ExactModel, R: number, rows = model.basis.size, reuse?: PairHamiltonianValues): PairHamiltonianValues {
  // `reuse`: the arrays of an earlier R on the same model (a curve visits many R; fresh arrays are slow to touch)
  const H: PairHamiltonianValues =
    reuse && reuse.values.length === model.coupling.col.length
      ? { values: reuse.values, diagonal: reuse.diagonal, rows: 0 }
      : { values: new Float64Array(model.coupling.col.length), diagonal: new Float64Array(model.basis.size), rows: 0 };
  H.diagonal.set(model.excitation);
  extendHamiltonian(model, R, H, rows);
  return H;
}

/** Fill rows [H.rows, rows) of the Hamiltonian at R (the same R it was started with). */
export function extendHamiltonian(model: ExactModel, R: number, H: PairHamiltonianValues, rows: number): void {
  const end = Math.min(rows, model.basis.size);
  if (end <= H.rows) return;
  const { rowPtr, col } = model.coupling;
  combineGroups(
    model.coupling,
    model.coupling.values.map((_, k) => R ** -(k + 3)),
    H.values,
    rowPtr[H.rows],
    rowPtr[end],
  );
  for (let i = H.rows; i < end; i++)
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++)
      if (col[k] === i) {
        H.diagonal[i] += H.values[k];
        H.values[k] = 0; // kept once, in the diagonal
      }
  H.rows = end;
}
