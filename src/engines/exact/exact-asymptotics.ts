/**
 * D7, C6 and C8 from the finite-R exact solution: solve the pair at a geometric grid of large R, then fit
 *   R^7 mu_A,z(R), R^7 mu_B,z(R)  and  R^6 ΔE(R)
 * to their series in 1/R ({@link seriesPowers}, a stated number of terms) and read off the leading coefficients:
 * D7.a, D7.b and −C6, −C8. The error estimate of each coefficient is the larger of (i) the change when the last
 * series term is dropped and (ii) the change when the two smallest R are dropped.
 *
 * The grid (20 points, geometric) starts at R_min = max(8 (s_A + s_B), 3 R_c) — several ground-state widths
 * (s = 1/sqrt(2 m w) is the rms displacement per axis) and well outside the polarisation-catastrophe distance
 * R_c — and ends at 50 R_min/3; with 11 terms per series this recovers C6, C8 and D7 of random isotropic pairs
 * to ~1e-11 or better (tests/engines/exact-route.test.ts checks them against the perturbation route).
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { fitInverseSeries, seriesPowers, type SeriesObservable } from './asymptotic-fit.js';
import { exactSolver, type ExactPoint } from './exact-solver.js';
import { catastropheDistance } from './localisation.js';

export interface ExactAsymptoticsOptions {
  /** Multipole order of the Hamiltonian. Default 4: C8 contains the V2·V4 cross term, so order 3 would miss part of it. */
  order?: number;
  /** Number of grid points. Default 20. */
  points?: number;
  /** Number of series terms fitted (each series). Default 11. */
  terms?: number;
  /** Relative basis-convergence tolerance per point. Default 1e-12. */
  tolerance?: number;
  /** Largest relative error estimate accepted for a coefficient. Default 1e-8. */
  fitTolerance?: number;
}

export interface ExactAsymptotics {
  C6: number;
  /** Absent when the order (2) gives no R^-8 energy term. */
  C8?: number;
  D7a: number;
  D7b: number;
  error: { C6: number; C8?: number; D7a: number; D7b: number };
  order: number;
  /** Separations used, bohr. */
  grid: number[];
  /** Powers of 1/R fitted: energy (R^-p in ΔE) and dipoles (R^-p in mu). */
  powers: { energy: number[]; muA: number[]; muB: number[] };
  points: ExactPoint[];
  converged: boolean;
  reasons: string[];
}

/** The default R grid of the exact route (bohr). */
export function asymptoticGrid(A: DrudeSpecies, B: DrudeSpecies, count = 20): number[] {
  const width = (s: DrudeSpecies) => Math.max(...s.w.map((w) => 1 / Math.sqrt(2 * s.m * w)));
  const Rmin = Math.max(8 * (width(A) + width(B)), 3 * catastropheDistance(A, B));
  const Rmax = (50 / 3) * Rmin;
  return Array.from({ length: count }, (_, k) => Rmin * (Rmax / Rmin) ** (k / (count - 1)));
}

/** Fit one observable; returns the coefficient of each requested power with its error estimate. */
function fitObservable(
  R: readonly number[],
  y: readonly number[],
  order: number,
  observable: SeriesObservable,
  terms: number,
): { powers: number[]; coef: (p: number) => { value: number; error: number } | undefined } {
  const lead = observable === 'energy' ? 6 : 7;
  const powers = seriesPowers(order, observable, lead + 40).slice(0, terms);
  const exps = powers.map((p) => p - lead);
  const scaled = y.map((v, i) => v * R[i] ** lead);
  const main = fitInverseSeries(R, scaled, exps);
  const fewer = fitInverseSeries(R, scaled, exps.slice(0, -1));
  const far = fitInverseSeries(R.slice(2), scaled.slice(2), exps);
  return {
    powers,
    coef: (p) => {
      const k = powers.indexOf(p);
      if (k < 0) return undefined;
      const value = main.coefficients[k];
      const error = Math.max(Math.abs((fewer.coefficients[k] ?? value) - value), Math.abs(far.coefficients[k] - value));
      return { value, error };
    },
  };
}

/** Solve on the grid and fit (isotropic or axial centres; first-order terms are not fitted). */
export function exactAsymptotics(A: DrudeSpecies, B: DrudeSpecies, options: ExactAsymptoticsOptions = {}): ExactAsymptotics {
  const order = options.order ?? 4;
  const terms = options.terms ?? 11;
  const count = Math.max(options.points ?? 20, terms + 3);
  const fitTol = options.fitTolerance ?? 1e-8;
  const grid = asymptoticGrid(A, B, count);
  const solver = exactSolver(A, B, { order, tolerance: options.tolerance ?? 1e-12, maxQuanta: 24 });
  const points = grid.map((R) => solver.solve(R).point);
  const reasons: string[] = [];
  for (const p of points) for (const r of p.reasons) reasons.push(`R = ${p.R.toPrecision(5)} bohr: ${r}`);

  const energy = fitObservable(grid, points.map((p) => p.energy), order, 'energy', terms);
  const muA = fitObservable(grid, points.map((p) => p.muA), order, 'muA', terms);
  const muB = fitObservable(grid, points.map((p) => p.muB), order, 'muB', terms);
  const c6 = energy.coef(6)!, c8 = energy.coef(8), dA = muA.coef(7)!, dB = muB.coef(7)!;
  const checks: Array<[string, { value: number; error: number } | undefined]> = [['C6', c6], ['C8', c8], ['D7.a', dA], ['D7.b', dB]];
  for (const [name, c] of checks)
    if (c && !(c.error <= fitTol * Math.abs(c.value)))
      reasons.push(`fit of ${name}: error estimate ${(c.error / Math.abs(c.value)).toExponential(1)} (relative) above ${fitTol}`);
  return {
    C6: -c6.value,
    ...(c8 ? { C8: -c8.value } : {}),
    D7a: dA.value,
    D7b: dB.value,
    error: { C6: c6.error, ...(c8 ? { C8: c8.error } : {}), D7a: dA.error, D7b: dB.error },
    order,
    grid,
    powers: { energy: energy.powers, muA: muA.powers, muB: muB.powers },
    points,
    converged: reasons.length === 0,
    reasons,
  };
}
