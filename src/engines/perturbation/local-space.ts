/**
 * What the perturbation engine needs from one centre: a discrete set of states (index 0 = ground state),
 * their excitation energies, and the action of charge-weighted Cartesian moments
 * M_p = Σ_i e_i x_i^p0 y_i^p1 z_i^p2 on them. A QDO is the harmonic-oscillator case; a pseudo-spectrum of a
 * real atom is another implementation of the same interface.
 */
import type { Monomial } from '../../hamiltonian/monomial.js';

/** Sparse result of M_p |i>: parallel arrays of target state indices and amplitudes. */
export interface LocalEntries {
  readonly states: readonly number[];
  readonly amps: readonly number[];
}

export interface LocalSpace {
  /** Excitation energy E_i − E_0 of local state i, hartree (≥ 0; > 0 for i ≠ 0). */
  excitation(i: number): number;
  /** M_p |i> restricted to the space. Indices must be integers in [0, 2^26). */
  applyMoment(p: Monomial, i: number): LocalEntries;
}

/** Largest local state index a product vector can hold (see product-vector.ts). */
export const LOCAL_INDEX_LIMIT = 2 ** 26;
