/**
 * Curves mu_A,z(R), mu_B,z(R) and ΔE(R) of a pair from the finite-R exact solution, on a grid of separations.
 * One solver serves the whole grid, so the basis matrices are built once (and enlarged only if a point needs it).
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { exactSolver, type ExactOptions, type ExactPoint } from './exact-solver.js';

export type GridSpacing = 'log' | 'linear';

/** `count` separations from `from` to `to` (inclusive), equally spaced in R or in log R (validated by the caller). */
export function separationGrid(from: number, to: number, count: number, spacing: GridSpacing): number[] {
  if (!(from > 0) || !(to > from) || !Number.isInteger(count) || count < 2) throw new RangeError(`bad grid ${from}…${to} (${count} points)`);
  return Array.from({ length: count }, (_, k) => {
    const t = k / (count - 1);
    return spacing === 'log' ? from * (to / from) ** t : from + (to - from) * t;
  });
}

export interface ExactCurve {
  order: number;
  points: ExactPoint[];
}

/** Solve the pair at every R (bohr), in order. */
export function exactCurve(A: DrudeSpecies, B: DrudeSpecies, R: readonly number[], options: ExactOptions = {}): ExactCurve {
  const solver = exactSolver(A, B, options);
  return { order: solver.order, points: R.map((r) => solver.solve(r).point) };
}
