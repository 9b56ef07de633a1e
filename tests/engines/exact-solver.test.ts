/**
 * The finite-R exact solution: the dipole–dipole limit against the closed-form normal-mode energy, nested
 * bases, the basis-convergence record, and the flagging of bases that reach the escape barrier.
 */
import { describe, expect, test } from 'vitest';
import { exactSolver } from '../../src/engines/exact/exact-solver.js';
import { solveInBasis } from '../../src/engines/exact/ground-state.js';
import { catastropheDistance, localisationCheck } from '../../src/engines/exact/localisation.js';
import { exactModel, hamiltonianAt } from '../../src/engines/exact/pair-hamiltonian.js';
import { drude, type DrudeSpecies } from '../../src/model/drude.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { expectClose } from '../helpers/tolerance.js';

// invented demo species (src/model/builtin-species.ts)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/**
 * Interaction energy of two dipole-coupled isotropic oscillators from their normal modes: per axis the
 * mass-weighted force matrix [[wA², c], [c, wB²]], c = g/sqrt(mA mB), with g = qA qB/R³ for x and y and
 * g = −2 qA qB/R³ for z, has Ω±² with Ω+² + Ω−² = wA² + wB² and Ω+Ω− = P = sqrt(wA² wB² − c²); the zero-point
 * energy change is ½ Σ_axes (Ω+ + Ω− − wA − wB), written without cancellation as
 *   Ω+ + Ω− − wA − wB = −2c² / ((wA wB + P)(Ω+ + Ω− + wA + wB)),  Ω+ + Ω− = sqrt(wA² + wB² + 2P).
 * Normal modes of coupled oscillators: H. Goldstein, Classical Mechanics (1980), ch. 6; the Drude-model
 * dispersion energy this way: F. London, Trans. Faraday Soc. 33, 8 (1937) (quoted from memory).
 */
function normalModeEnergy(A: DrudeSpecies, B: DrudeSpecies, R: number): number {
  const wA = A.w[0], wB = B.w[0];
  const axis = (g: number) => {
    const c = g / Math.sqrt(A.m * B.m);
    const P = Math.sqrt(wA * wA * wB * wB - c * c);
    const sum = Math.sqrt(wA * wA + wB * wB + 2 * P);
    return (-2 * c * c) / ((wA * wB + P) * (sum + wA + wB));
  };
  const g = (A.q * B.q) / R ** 3;
  return 0.5 * (2 * axis(g) + axis(-2 * g));
}

describe('dipole–dipole coupling only (order 2)', () => {
  test('the exact energy equals the closed-form normal-mode energy and the induced dipoles vanish', () => {
    const rand = seededRandom(7);
    const pairs: Array<[DrudeSpecies, DrudeSpecies, number]> = [[quelon, virid, 5]];
    for (let k = 0; k < 3; k++) {
      const A = drude({ q: uniform(rand, 0.6, 1.8), m: uniform(rand, 0.3, 1.2), w: uniform(rand, 0.4, 1.4) }, 'a');
      const B = drude({ q: uniform(rand, 0.6, 1.8), m: uniform(rand, 0.3, 1.2), w: uniform(rand, 0.4, 1.4) }, 'b');
      pairs.push([A, B, 1.6 * catastropheDistance(A, B)]);
    }
    for (const [A, B, R] of pairs) {
      const p = exactSolver(A, B, { order: 2, tolerance: 1e-13 }).solve(R).point;
      expect(p.trusted).toBe(true);
      expectClose(p.energy, normalModeEnergy(A, B, R), 1e-12, 0, `R = ${R}`);
      // V_dd is invariant under the joint inversion (r_A, r_B) → (−r_A, −r_B), as is H0, so the non-degenerate
      // ground state has definite parity and the odd operators mu_A = −qA r_A, mu_B = −qB r_B average to zero.
      expect(p.muA).toBe(0);
      expect(p.muB).toBe(0);
    }
  });
  test('polarisation catastrophe: the dd quadratic form loses positivity at R_c = (2 qA qB / sqrt(kA kB))^(1/3) (derived here)', () => {
    const Rc = catastropheDistance(quelon, virid);
    const k = (s: DrudeSpecies) => s.m * s.w[0] ** 2;
    expectClose(Rc, Math.cbrt((2 * quelon.q * virid.q) / Math.sqrt(k(quelon) * k(virid))), 1e-15);
    expect(localisationCheck(quelon, virid, 2, 1.001 * Rc).barrier).toBe(Infinity);
    expect(localisationCheck(quelon, virid, 2, 0.999 * Rc).barrier).toBe(0);
    expect(Number.isNaN(normalModeEnergy(quelon, virid, 0.999 * Rc))).toBe(true); // the z mode frequency is imaginary
  });
});

describe('nested bases and the convergence record', () => {
  test('the lowest eigenvalue decreases monotonically as quanta are added (Cauchy interlacing; common practice)', () => {
    const model = exactModel(quelon, virid, { order: 3, maxQuanta: 14 });
    const H = hamiltonianAt(model, 5);
    let previous = Infinity;
    let v: Float64Array | undefined;
    for (let N = 1; N <= 14; N++) {
      const s = solveInBasis(model, H, N, 1e-12, v);
      expect(s.residual).toBeLessThan(1e-12);
      expect(s.energy).toBeLessThanOrEqual(previous + 1e-18);
      previous = s.energy;
      v = s.vector;
    }
  });
  test('the solver reports the record of sizes and values and stops once two enlargements change nothing', () => {
    const tol = 1e-9;
    const p = exactSolver(quelon, virid, { order: 3, tolerance: tol }).solve(7).point;
    expect(p.converged).toBe(true);
    expect(p.trusted).toBe(true);
    const rec = p.record;
    expect(rec.length).toBeGreaterThanOrEqual(3);
    for (let i = 1; i < rec.length; i++) {
      expect(rec[i].quanta).toBe(rec[i - 1].quanta + 1);
      expect(rec[i].dimension).toBeGreaterThan(rec[i - 1].dimension);
    }
    const last = rec[rec.length - 1], before = rec[rec.length - 2];
    expect(Math.abs(last.energy - before.energy)).toBeLessThanOrEqual(tol * Math.abs(last.energy));
    expect(Math.abs(last.muA - before.muA)).toBeLessThanOrEqual(tol * Math.abs(last.muB));
    expect(p.quanta).toBe(last.quanta);
    expect(p.fullDimension).toBeGreaterThan(10 * p.dimension);
    expect(p.residual).toBeLessThan(1e-10);
  });
});

describe('bases that reach the escape barrier of the cubic potential are flagged', () => {
  test('the barrier moves out with R, and a point close to the catastrophe is UNTRUSTED with the reason', () => {
    const near = localisationCheck(quelon, virid, 3, 3.6), far = localisationCheck(quelon, virid, 3, 8);
    expect(near.barrier).toBeGreaterThan(0);
    expect(far.barrier).toBeGreaterThan(2 * near.barrier);
    expect(far.maxQuanta).toBeGreaterThan(near.maxQuanta);
    const p = exactSolver(quelon, virid, { order: 3 }).solve(3.6).point;
    expect(p.trusted).toBe(false);
    expect(p.reasons.join(' ')).toMatch(/escape barrier of the multipole potential/);
    const inside = exactSolver(quelon, virid, { order: 3 }).solve(0.9 * catastropheDistance(quelon, virid)).point;
    expect(inside.trusted).toBe(false);
    expect(inside.reasons.join(' ')).toMatch(/inside the polarisation-catastrophe distance .* no bound ground state/);
  });
});
