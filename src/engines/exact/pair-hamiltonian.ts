/**
 * The full polynomial Hamiltonian of two Drude oscillators in a truncated harmonic product basis:
 *   H − E0 = Σ_X Σ_axes w_i n_i  +  qA qB Σ_{n=2}^{order} R^-(n+1) V_n(r_A, r_B),
 * the unperturbed excitation energies on the diagonal (so the lowest eigenvalue is the interaction energy
 * itself, with no cancellation against the zero-point energy) and the multipole couplings V_n of
 * {@link circularCouplingTerms} (for a QDO M_p = −q r^p, so M^A M^B = qA qB r_A^pA r_B^pB). Centres must be
 * axially symmetric about the bond axis (wx = wy); isotropic QDOs are the common case.
 * The matrices are built once per basis and reused at every R; a larger nested basis keeps them as its first rows
 * ({@link growExactModel}).
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { Species } from '../../model/species.js';
import { circularCouplingTerms, type CircularCouplingTerm } from './circular-coupling.js';
import type { CircularMonomial } from './circular-states.js';
import { pairBasis, type PairBasis } from './pair-basis.js';
import { buildSparseOperator, combineGroups, fullFromLower, type OperatorTerm, type SparseOperator } from './sparse-operator.js';

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
  /** Coupling matrices, group k holding qA qB V_(k+2) (multiply by R^-(k+3)), as their lower triangle (what the solver uses). */
  lower: SparseOperator;
  /** The same with complete rows (formed from `lower` on first use; for callers that read whole rows). */
  readonly coupling: SparseOperator;
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
 * One coupling term as an operator term: qA qB · [c · 2^((pA+qA+pB+qB)/2)] · lengths. L_z conservation makes
 * pA+qA and pB+qB of equal parity, so the power of √2 is whole and the bracket is an exact dyadic rational (the
 * coefficient); the species part qA qB · lengths is the scale, the same double for every term of one degree on each
 * side of an isotropic pair.
 */
const exactCoefficients = new WeakMap<CircularCouplingTerm, number>();
function couplingOperatorTerm(A: DrudeSpecies, B: DrudeSpecies, t: CircularCouplingTerm): OperatorTerm {
  let coefficient = exactCoefficients.get(t);
  if (coefficient === undefined) {
    const planar = t.a[0] + t.a[1] + t.b[0] + t.b[1];
    exactCoefficients.set(t, (coefficient = t.exact.mul(2 ** (planar / 2)).valueOf()));
  }
  return {
    coefficient,
    scale: A.q * B.q * lengthFactor(A, t.a) * lengthFactor(B, t.b),
    a: t.a,
    b: t.b,
  };
}

/** Build the model (species must pass {@link axialProblem}). */
export function exactModel(A: DrudeSpecies, B: DrudeSpecies, options: ExactModelOptions): ExactModel {
  for (const s of [A, B]) {
    const why = axialProblem(s);
    if (why) throw new Error(why);
  }
  const order = options.order ?? 3;
  if (!Number.isInteger(order) || order < 2 || order > MAX_EXACT_ORDER) throw new RangeError(`order must be 2…${MAX_EXACT_ORDER}`);
  return assembleModel(A, B, order, pairBasis(options.maxQuanta, options.reduced ?? true));
}

/**
 * The same model on the nested basis of `maxQuanta` quanta: the rows it already has are kept (the basis for fewer
 * quanta is a prefix of the larger one), only the new ones are computed. The old model stays valid.
 */
export function growExactModel(model: ExactModel, maxQuanta: number): ExactModel {
  if (maxQuanta <= model.basis.maxQuanta) return model;
  return assembleModel(model.A, model.B, model.order, pairBasis(maxQuanta, model.basis.reduced), model);
}

function assembleModel(A: DrudeSpecies, B: DrudeSpecies, order: number, basis: PairBasis, previous?: ExactModel): ExactModel {
  const groups: OperatorTerm[][] = [];
  for (let n = 2; n <= order; n++)
    groups.push(circularCouplingTerms(n).map((t) => couplingOperatorTerm(A, B, t)));
  const lower = buildSparseOperator(basis, groups, previous?.lower);
  const none: CircularMonomial = [0, 0, 0], z: CircularMonomial = [0, 0, 1];
  const dipoleA = buildSparseOperator(basis, [[{ coefficient: 1, scale: -A.q * lengthFactor(A, z), a: z, b: none }]], previous?.dipoleA);
  const dipoleB = buildSparseOperator(basis, [[{ coefficient: 1, scale: -B.q * lengthFactor(B, z), a: none, b: z }]], previous?.dipoleB);
  const { local } = basis;
  const level = (s: DrudeSpecies, i: number) => s.w[0] * (local.nPlus[i] + local.nMinus[i]) + s.w[2] * local.nZ[i];
  const excitation = Float64Array.from(basis.repA, (iA, k) => level(A, iA) + level(B, basis.repB[k]));
  let full: SparseOperator | undefined;
  return {
    A,
    B,
    order,
    basis,
    lower,
    get coupling() {
      return (full ??= fullFromLower(lower));
    },
    excitation,
    dipoleA,
    dipoleB,
  };
}

/**
 * The Hamiltonian H − E0 at separation R (bohr): off-diagonal values on one coupling pattern and the diagonal,
 * filled for the leading `rows` basis functions (default all). A nested basis of N quanta needs only its prefix, so
 * a solver that stays well below the model's size fills the rest only when it gets there ({@link extendHamiltonian}).
 * `pattern` is the operator whose entries `values` follows: `model.coupling` (complete rows, the default) or
 * `model.lower` (the lower triangle, what the solver uses: half the entries).
 */
export interface PairHamiltonianValues {
  values: Float64Array;
  diagonal: Float64Array;
  /** Rows filled so far. */
  rows: number;
  pattern: SparseOperator;
  /** The separation the rows were filled for, bohr. */
  R: number;
}

/** A view of `length` doubles on the buffer of `old` when it has room, else a fresh array with room for `capacity`. */
function roomFor(old: Float64Array | undefined, length: number, capacity: number): Float64Array {
  if (old && old.buffer.byteLength >= 8 * length) return new Float64Array(old.buffer, 0, length);
  return new Float64Array(new ArrayBuffer(8 * Math.max(length, capacity)), 0, length);
}

export function hamiltonianAt(
  model: ExactModel,
  R: number,
  rows = model.basis.size,
  reuse?: PairHamiltonianValues,
  storage: 'full' | 'lower' = 'full',
): PairHamiltonianValues {
  const pattern = storage === 'lower' ? model.lower : model.coupling;
  // `reuse`: the arrays of an earlier R or a smaller model (a curve visits many R and grows its basis; fresh arrays
  // are slow to touch). Lower-triangle rows are the same in a grown model, so at the same R they are kept.
  const n = model.basis.size;
  const values = roomFor(reuse?.values, pattern.col.length, pattern.store ? pattern.store.col.length : 0);
  const diagonal = roomFor(reuse?.diagonal, n, pattern.store ? pattern.store.rowPtr.length - 1 : 0);
  const keep =
    reuse && reuse.R === R && reuse.pattern.store !== undefined && reuse.pattern.store === pattern.store && values.buffer === reuse.values.buffer
      ? Math.min(reuse.rows, n)
      : 0;
  const H: PairHamiltonianValues = { values, diagonal, rows: keep, pattern, R };
  extendHamiltonian(model, R, H, rows);
  return H;
}

/** Fill rows [H.rows, rows) of the Hamiltonian at R (the same R it was started with). */
export function extendHamiltonian(model: ExactModel, R: number, H: PairHamiltonianValues, rows: number): void {
  const end = Math.min(rows, model.basis.size);
  if (end <= H.rows) return;
  const { rowPtr, col } = H.pattern;
  H.diagonal.set(model.excitation.subarray(H.rows, end), H.rows);
  combineGroups(
    H.pattern,
    H.pattern.groups.map((_, k) => R ** -(k + 3)),
    H.values,
    H.rows,
    end,
  );
  for (let i = H.rows; i < end; i++)
    for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++)
      if (col[k] === i) {
        H.diagonal[i] += H.values[k];
        H.values[k] = 0; // kept once, in the diagonal
      }
  H.rows = end;
}
