/**
 * The "exact" route: finite-R exact diagonalisation of the pair's multipole Hamiltonian (through order 4, which
 * completes C8 and D9 for spherical centres) at a grid of large R, fitted in powers of 1/R to recover C6, C8, D7
 * and D9 ({@link exactAsymptotics}). Optional (a second or two per pair); isotropic QDO pairs only.
 */
import { isIsotropicDrude } from '../../model/drude.js';
import type { Species } from '../../model/species.js';
import type { Route, RouteResult } from '../route.js';
import { d7 } from '../route.js';
import { exactAsymptotics } from './exact-asymptotics.js';
import { axialProblem } from './pair-hamiltonian.js';
import { sig } from '../../model/number-text.js';

function problem(s: Species): string | null {
  if (s.kind !== 'drude') return axialProblem(s);
  if (!isIsotropicDrude(s)) return `${s.name} is anisotropic (the exact route fits isotropic pairs only: permanent quadrupoles add R^-4 and R^-5 terms)`;
  return null;
}

const fmt = (x: number): string => sig(x, 4);

export const exactRoute: Route = {
  name: 'exact',
  summary: 'finite-R exact diagonalisation of the order-4 multipole Hamiltonian, fitted in 1/R (C6, C8, D7, D9)',
  unsupported: (A, B) => problem(A) ?? problem(B),
  run(A, B): RouteResult {
    if (A.kind !== 'drude' || B.kind !== 'drude') throw new Error(`exact route: ${problem(A) ?? problem(B)}`);
    const r = exactAsymptotics(A, B);
    const largest = r.points.reduce((p, q) => (q.quanta > p.quanta ? q : p));
    const notes = [
      `Hamiltonian through multipole order ${r.order}: complete for C8 (V3·V3) and D9 (V3·V4) of spherical centres, whose V2·V4 and V2·V5 chains vanish`,
      `${r.grid.length} separations ${fmt(r.grid[0])}…${fmt(r.grid[r.grid.length - 1])} bohr; fitted R^6 ΔE to R^-(${r.powers.energy.join(', ')}) and R^7 mu to R^-(${r.powers.muA.join(', ')})`,
      `largest basis ${largest.quanta} quanta: dimension ${largest.dimension} with the L_z = 0 and mirror reduction (${largest.fullDimension} without)`,
      ...r.reasons,
    ];
    return {
      name: 'exact',
      C6: r.C6,
      ...(r.C8 !== undefined ? { C8: r.C8 } : {}),
      D7: d7(r.D7a, r.D7b),
      ...(r.D9a !== undefined && r.D9b !== undefined ? { D9: d7(r.D9a, r.D9b) } : {}),
      error: r.error,
      converged: r.converged,
      notes,
    };
  },
};
