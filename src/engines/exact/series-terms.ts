/**
 * Which terms of the asymptotic series a multipole Hamiltonian of a given order gets right, and the order the
 * finite-R commands use by default.
 *
 * A series coefficient is complete once every coupling V_n of its perturbation chains is in the Hamiltonian
 * (V = Σ_{n ≤ order} V_n/R^(n+1)). The chains (derived here; see perturbation/rspt.ts for the parity argument):
 *   C6 ← V2·V2,  C8 ← V3·V3 + V2·V4,  D7 ← V2·V3,  D9 ← V3·V4 + V2·V5,
 *   first order (permanent moments): E5 ← V4, E7 ← V6, D4 ← V3, D6 ← V5, D8 ← V7.
 * For spherical centres (isotropic QDOs, atoms) V2·V4 and V2·V5 vanish: they need a linear response of one centre
 * between moments of different rank (dipole and octupole), or a response of the other to ranks (1, 1, 4) that
 * cannot couple to a scalar (derived here; tests/engines/d9-series.test.ts checks both numerically). So C8 is
 * complete from order 3 and D9 from order 4 there, and first-order terms vanish.
 * With only the dipole–dipole coupling (order 2) the Hamiltonian is even under the joint inversion
 * (r_A, r_B) → (−r_A, −r_B) and both induced dipoles vanish identically by symmetry.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { isIsotropicDrude } from '../../model/drude.js';

/** The coefficients of the printed series: mu_z ∋ D_p/R^p, E ∋ E_p/R^p − C_p/R^p. */
export type SeriesCoefficient = 'C6' | 'C8' | 'D7' | 'D9' | 'D10' | 'E5' | 'E7' | 'D4' | 'D6' | 'D8';

/** The lowest Hamiltonian order at which each coefficient is complete, for spherical or anisotropic pairs. */
export function completeFromOrder(spherical: boolean): Record<SeriesCoefficient, number> {
  return spherical
    ? { C6: 2, C8: 3, D7: 3, D9: 4, D10: 3, E5: 2, E7: 2, D4: 2, D6: 2, D8: 2 }
    : { C6: 2, C8: 4, D7: 3, D9: 5, D10: 9, E5: 4, E7: 6, D4: 3, D6: 5, D8: 7 };
}

/**
 * The terms of the printed series: the dipole through R^-9 (spherical pairs: R^-10, with the third-order D10 ←
 * V2·V2·V3, complete from order 3; for anisotropic pairs R^-10 also has a first-order part from V9, beyond the
 * engine) and the energy through R^-8 (first-order terms for anisotropic pairs).
 */
export function seriesTerms(spherical: boolean): { dipole: SeriesCoefficient[]; energy: SeriesCoefficient[] } {
  return spherical
    ? { dipole: ['D7', 'D9', 'D10'], energy: ['C6', 'C8'] }
    : { dipole: ['D4', 'D6', 'D7', 'D8', 'D9'], energy: ['E5', 'C6', 'E7', 'C8'] };
}

/** True when both centres are isotropic QDOs (the exact engine's spherical case). */
export const sphericalPair = (A: DrudeSpecies, B: DrudeSpecies): boolean => isIsotropicDrude(A) && isIsotropicDrude(B);

/**
 * The default Hamiltonian order of `curve`, `density` and the curve asymptotes: 6 for spherical pairs, 7 for
 * anisotropic ones (D8 needs V7). Order 6 is one above the order that completes the printed series of a
 * spherical pair (4): it also carries the R^-11 and R^-12 dipole terms (V4·V5, V2·V2·V5, …), so the exact columns
 * no longer move at the printed precision when the order is raised at R ≥ 10 bohr for the demo pairs
 * (tests/cli/curve.test.ts).
 */
export function defaultExactOrder(A: DrudeSpecies, B: DrudeSpecies): number {
  return sphericalPair(A, B) ? 6 : 7;
}

/** What a Hamiltonian of this order misses of the printed series. */
export interface OrderCompleteness {
  order: number;
  /** Dipole-series coefficients the exact dipole lacks (part of) at this order. */
  dipoleMissing: SeriesCoefficient[];
  /** Energy-series coefficients the exact energy lacks (part of) at this order. */
  energyMissing: SeriesCoefficient[];
  /** Order 2: the dipoles vanish identically by symmetry. */
  dipoleVanishes: boolean;
  /** Human statements of the above (empty when complete). */
  notes: string[];
}

/** Which printed series terms a Hamiltonian of `order` gets complete. */
export function orderCompleteness(order: number, spherical: boolean): OrderCompleteness {
  const from = completeFromOrder(spherical);
  const terms = seriesTerms(spherical);
  const dipoleMissing = terms.dipole.filter((t) => from[t] > order);
  const energyMissing = terms.energy.filter((t) => from[t] > order);
  const dipoleVanishes = order <= 2;
  const notes: string[] = [];
  if (dipoleVanishes)
    notes.push(
      'with only the dipole–dipole coupling (order 2) the Hamiltonian is even under the joint inversion (r_A, r_B) → (−r_A, −r_B), so both induced dipoles vanish identically by symmetry: they are zero by construction, not a result',
    );
  else if (dipoleMissing.length > 0)
    notes.push(
      `the Hamiltonian stops at multipole order ${order}: its dipole lacks (part of) ${dipoleMissing.join(', ')} (complete from order ${Math.max(...dipoleMissing.map((t) => from[t]))}), so the dipoles are not right to the order of the asymptotic series`,
    );
  if (energyMissing.length > 0)
    notes.push(
      `the Hamiltonian stops at multipole order ${order}: its energy lacks (part of) ${energyMissing.join(', ')} (complete from order ${Math.max(...energyMissing.map((t) => from[t]))}), so the energy is not right to the order of the asymptotic series`,
    );
  return { order, dipoleMissing, energyMissing, dipoleVanishes, notes };
}
