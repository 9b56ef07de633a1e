/**
 * C6, C8, D7, D9 (and the first-order terms of axially anisotropic centres) from the finite-R exact solution: solve
 * the pair at a geometric grid of large R, then fit
 *   R^L mu_A,z(R), R^L mu_B,z(R)  and  R^L' ΔE(R)
 * to their series in 1/R ({@link seriesPowers}, a stated number of terms; L = 7, L' = 6 for spherical centres,
 * L = 4, L' = 5 for anisotropic ones) and read off the coefficients: D7.a, D7.b, D9.a, D9.b and −C6, −C8, and for
 * anisotropic centres E5, E7, D4, D6, D8. The error estimate of each coefficient is the larger of (i) the change when
 * the last series term is dropped and (ii) the change when the two smallest R are dropped.
 *
 * A coefficient is reported only when the Hamiltonian order makes it complete ({@link completeFromOrder}: for
 * spherical pairs C8 from order 3 and D9 from 4; for anisotropic ones C8 from 4, D9 from 5, E7 from 6, D8 from 7).
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
import { completeFromOrder, sphericalPair, type SeriesCoefficient } from './series-terms.js';

export interface ExactAsymptoticsOptions {
  /** Multipole order of the Hamiltonian. Default: the lowest that completes every fitted coefficient (4 for spherical pairs, 7 otherwise). */
  order?: number;
  /** Number of grid points. Default 20. */
  points?: number;
  /** Number of series terms fitted (each series). Default 11. */
  terms?: number;
  /** Relative basis-convergence tolerance per point. Default 1e-12. */
  tolerance?: number;
  /** Largest relative error estimate accepted for a coefficient. Default 1e-8. */
  fitTolerance?: number;
  /** Fit the first-order terms of anisotropic centres too. Default: when either centre is anisotropic. */
  firstOrder?: boolean;
}

/** One fitted coefficient with its error estimate (atomic units). */
export interface Fitted {
  value: number;
  error: number;
}

export interface ExactAsymptotics {
  C6: number;
  /** Absent when the order (below 4) leaves the R^-8 energy term incomplete. */
  C8?: number;
  D7a: number;
  D7b: number;
  /** Absent when the order is below 5. */
  D9a?: number;
  D9b?: number;
  /** First-order terms of anisotropic centres (when fitted), each only at an order that makes it complete. */
  permanent?: { E5?: number; E7?: number; D4a?: number; D4b?: number; D6a?: number; D6b?: number; D8a?: number; D8b?: number };
  error: Partial<Record<'C6' | 'C8' | 'D7a' | 'D7b' | 'D9a' | 'D9b' | 'E5' | 'E7' | 'D4a' | 'D4b' | 'D6a' | 'D6b' | 'D8a' | 'D8b', number>>;
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
export function fitObservable(
  R: readonly number[],
  y: readonly number[],
  order: number,
  observable: SeriesObservable,
  terms: number,
  firstOrder = false,
): { powers: number[]; coef: (p: number) => Fitted | undefined } {
  const powers = seriesPowers(order, observable, 60, firstOrder).slice(0, terms);
  const lead = powers[0];
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

/** Solve on the grid and fit (isotropic or axial centres). */
export function exactAsymptotics(A: DrudeSpecies, B: DrudeSpecies, options: ExactAsymptoticsOptions = {}): ExactAsymptotics {
  const spherical = sphericalPair(A, B);
  const from = completeFromOrder(spherical);
  const order = options.order ?? (spherical ? from.D9 : from.D8);
  const terms = options.terms ?? 11;
  const count = Math.max(options.points ?? 20, terms + 3);
  const fitTol = options.fitTolerance ?? 1e-8;
  const firstOrder = options.firstOrder ?? !spherical;
  const grid = asymptoticGrid(A, B, count);
  const solver = exactSolver(A, B, { order, tolerance: options.tolerance ?? 1e-12, maxQuanta: 24 });
  const points = grid.map((R) => solver.solve(R).point);
  const reasons: string[] = [];
  for (const p of points) for (const r of p.reasons) reasons.push(`R = ${p.R.toPrecision(5)} bohr: ${r}`);

  const energy = fitObservable(grid, points.map((p) => p.energy), order, 'energy', terms, firstOrder);
  const muA = fitObservable(grid, points.map((p) => p.muA), order, 'muA', terms, firstOrder);
  const muB = fitObservable(grid, points.map((p) => p.muB), order, 'muB', terms, firstOrder);
  const complete = (name: SeriesCoefficient) => order >= from[name];
  const picked: Array<[keyof ExactAsymptotics['error'], string, Fitted | undefined, number]> = [
    ['C6', 'C6', energy.coef(6), -1],
    ['C8', 'C8', complete('C8') ? energy.coef(8) : undefined, -1],
    ['D7a', 'D7.a', muA.coef(7), 1],
    ['D7b', 'D7.b', muB.coef(7), 1],
    ['D9a', 'D9.a', complete('D9') ? muA.coef(9) : undefined, 1],
    ['D9b', 'D9.b', complete('D9') ? muB.coef(9) : undefined, 1],
  ];
  if (firstOrder)
    picked.push(
      ['E5', 'E5', complete('E5') ? energy.coef(5) : undefined, 1],
      ['E7', 'E7', complete('E7') ? energy.coef(7) : undefined, 1],
      ['D4a', 'D4.a', complete('D4') ? muA.coef(4) : undefined, 1],
      ['D4b', 'D4.b', complete('D4') ? muB.coef(4) : undefined, 1],
      ['D6a', 'D6.a', complete('D6') ? muA.coef(6) : undefined, 1],
      ['D6b', 'D6.b', complete('D6') ? muB.coef(6) : undefined, 1],
      ['D8a', 'D8.a', complete('D8') ? muA.coef(8) : undefined, 1],
      ['D8b', 'D8.b', complete('D8') ? muB.coef(8) : undefined, 1],
    );
  const value: Partial<Record<keyof ExactAsymptotics['error'], number>> = {};
  const error: ExactAsymptotics['error'] = {};
  for (const [key, name, c, sign] of picked) {
    if (!c) continue;
    value[key] = sign * c.value;
    error[key] = c.error;
    if (!(c.error <= fitTol * Math.abs(c.value)))
      reasons.push(`fit of ${name}: error estimate ${(c.error / Math.abs(c.value)).toExponential(1)} (relative) above ${fitTol}`);
  }
  const { E5, E7, D4a, D4b, D6a, D6b, D8a, D8b } = value;
  const permanent = Object.fromEntries(Object.entries({ E5, E7, D4a, D4b, D6a, D6b, D8a, D8b }).filter(([, v]) => v !== undefined));
  return {
    C6: value.C6!,
    ...(value.C8 !== undefined ? { C8: value.C8 } : {}),
    D7a: value.D7a!,
    D7b: value.D7b!,
    ...(value.D9a !== undefined ? { D9a: value.D9a, D9b: value.D9b } : {}),
    ...(firstOrder ? { permanent } : {}),
    error,
    order,
    grid,
    powers: { energy: energy.powers, muA: muA.powers, muB: muB.powers },
    points,
    converged: reasons.length === 0,
    reasons,
  };
}
