/**
 * The N-oscillator engine: against the pair (closed-form normal modes, force-balance D7), the triple-dipole
 * energy of three oscillators, symmetry, invariance, and input errors.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { drude, drudeAnisotropic, type DrudeSpecies } from '../../src/model/drude.js';
import type { Vec3 } from '../../src/model/types.js';
import { computeCluster, freeAlpha, freeC6, type ClusterCentre } from '../../src/engines/cluster/cluster.js';
import { coupledPairZeroPointShift, forceBalanceCoefficients } from '../../src/engines/force-balance/pair-force-balance.js';
import { dipoleCouplingBlock, thirdDerivativeTensor } from '../../src/engines/cluster/dipole-tensors.js';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { expectClose } from '../helpers/tolerance.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { inputErrorOf } from '../helpers/input-error.js';

const Quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const Virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
const Spindlet = drudeAnisotropic({ q: 1.2, m: 0.45, wx: 0.8, wy: 0.8, wz: 0.55 }, 'Spindlet');

const centre = (label: string, species: DrudeSpecies, position: Vec3): ClusterCentre => ({ label, species, position });
const scale = (v: readonly number[], s: number): Vec3 => [v[0] * s, v[1] * s, v[2] * s];
const norm = (v: readonly number[]) => Math.hypot(v[0], v[1], v[2]);

/** Least-squares fit y = a + b x; returns a. */
function intercept(xs: number[], ys: number[]): number {
  const n = xs.length, mx = xs.reduce((s, x) => s + x, 0) / n, my = ys.reduce((s, y) => s + y, 0) / n;
  let sxy = 0, sxx = 0;
  for (let i = 0; i < n; i++) {
    sxy += (xs[i] - mx) * (ys[i] - my);
    sxx += (xs[i] - mx) ** 2;
  }
  return my - (sxy / sxx) * mx;
}

describe('interaction tensors', () => {
  test('for R along z they reproduce the exact dipole–dipole and dipole–quadrupole couplings (multipole-coupling.ts)', () => {
    const R = 2.7;
    const K = dipoleCouplingBlock([0, 0, R]);
    for (const t of couplingTerms(2)) expectClose(K[3 * t.pA.indexOf(1) + t.pB.indexOf(1)] * R ** 3, t.c, 1e-15);
    // V_dq = (q q/2) T3_abc (r_i,a r_i,b r_j,c − r_j,a r_j,b r_i,c): compare the polynomial coefficients
    const T3 = thirdDerivativeTensor([0, 0, R]);
    const coeff = new Map<string, number>();
    const add = (k: string, c: number) => coeff.set(k, (coeff.get(k) ?? 0) + c);
    for (let a = 0; a < 3; a++)
      for (let b = 0; b < 3; b++)
        for (let c = 0; c < 3; c++) {
          const pA = [0, 0, 0], pB = [0, 0, 0], qA = [0, 0, 0], qB = [0, 0, 0];
          pA[a]++; pA[b]++; pB[c]++; // r_i,a r_i,b r_j,c
          qB[a]++; qB[b]++; qA[c]++; // r_j,a r_j,b r_i,c
          add(`${pA}|${pB}`, 0.5 * T3[9 * a + 3 * b + c] * R ** 4);
          add(`${qA}|${qB}`, -0.5 * T3[9 * a + 3 * b + c] * R ** 4);
        }
    for (const t of couplingTerms(3)) expectClose(coeff.get(`${t.pA}|${t.pB}`) ?? 0, t.c, 1e-14, 1e-14, `${t.pA}|${t.pB}`);
    for (const [k, c] of coeff) if (!couplingTerms(3).some((t) => `${t.pA}|${t.pB}` === k)) expectClose(c, 0, 0, 1e-14, k);
  });
});

describe('two centres', () => {
  test('energy equals the closed-form normal modes of two dipole-coupled oscillators at finite R (Bade 1957), any axis', () => {
    const rand = seededRandom(41);
    for (const R of [4, 6, 10, 25]) {
      const dir = [uniform(rand, -1, 1), uniform(rand, -1, 1), uniform(rand, -1, 1)];
      const at = scale(dir, R / norm(dir));
      const r = computeCluster([centre('A', Quelon, [0.3, -1, 2]), centre('B', Virid, [0.3 + at[0], -1 + at[1], 2 + at[2]])]);
      const g = (1.1 * 1.45) / R ** 3;
      const exact = coupledPairZeroPointShift(0.38, 0.72, 0.52, 0.6, -2 * g) + 2 * coupledPairZeroPointShift(0.38, 0.72, 0.52, 0.6, g);
      expectClose(r.energy.manyBody, exact, 1e-11, 0, `R=${R}`);
      expectClose(r.energy.pairwise, exact, 1e-13, 0, `R=${R}`);
      expectClose(r.energy.nonAdditive, 0, 0, 1e-11 * Math.abs(exact));
    }
  });
  test('large-R fits reproduce the pair C6 and the force-balance D7 of both centres (isotropic and anisotropic)', () => {
    for (const [A, B] of [[Quelon, Virid], [Spindlet, Virid]] as const) {
      const ref = forceBalanceCoefficients(A, B);
      const Rs = [30, 40, 50, 60];
      const runs = Rs.map((R) => computeCluster([centre('A', A, [0, 0, 0]), centre('B', B, [0, 0, R])]));
      // R^6 E = −C6 + O(R^-6);  R^7 mu = D7 + O(R^-3) (the permanent-quadrupole D4 part, R^-4, is removed first)
      expectClose(intercept(Rs.map((R) => R ** -6), runs.map((r, k) => r.energy.manyBody * Rs[k] ** 6)), -ref.C6, 1e-8, 0, `${A.name} C6`);
      for (const [i, D7, D4] of [[0, ref.D7a[2], ref.permanent.D4a[2]], [1, ref.D7b[2], ref.permanent.D4b[2]]] as const) {
        const ys = runs.map((r, k) => (r.centres[i].dipole[2] - D4 / Rs[k] ** 4) * Rs[k] ** 7);
        expectClose(intercept(Rs.map((R) => R ** -3), ys), D7, 1e-5, 0, `${A.name}–${B.name} centre ${i}`);
        for (const r of runs) for (const a of [0, 1]) expectClose(r.centres[i].dipole[a], 0, 0, 1e-12 * Math.abs(r.centres[i].dipole[2]));
      }
    }
  });
  test('a lone centre keeps its free polarisability and C6 ((3/4) α² w for an isotropic QDO), and has no dipole', () => {
    for (const s of [Quelon, Spindlet]) {
      const r = computeCluster([centre('X', s, [1, 2, 3])]);
      expectClose(r.centres[0].alpha, freeAlpha(s), 1e-14);
      expectClose(r.centres[0].C6, freeC6(s), 1e-10);
      expect(r.centres[0].dipole.map(Math.abs)).toEqual([0, 0, 0]);
      expectClose(r.energy.manyBody, 0, 0, 1e-15);
    }
    expectClose(freeC6(Quelon), 0.75 * freeAlpha(Quelon) ** 2 * 0.72, 1e-14);
  });
  test('screening: in an approaching pair each centre\'s polarisability and C6 grow above the free values', () => {
    const r = computeCluster([centre('A', Quelon, [0, 0, 0]), centre('B', Quelon, [0, 0, 6])]);
    for (const c of r.centres) {
      expect(c.alpha).toBeGreaterThan(c.alphaFree);
      expect(c.C6).toBeGreaterThan(c.C6Free);
    }
  });
});

describe('three oscillators', () => {
  /*
   * Triple-dipole energy (B. M. Axilrod, E. Teller, J. Chem. Phys. 11, 299 (1943); Y. Muto, Proc. Phys.-Math. Soc.
   * Japan 17, 629 (1943); quoted from memory): E3 = C9 (1 + 3 cos γ1 cos γ2 cos γ3) / (R12 R23 R31)³, with
   * C9 = (3/π) ∫ αA αB αC du. For three identical QDOs, α(iu) = α w²/(w² + u²) and
   * ∫_0^∞ w^6/(w² + u²)³ du = 3π w/16, so C9 = (9/16) α³ w (= (3/4) α C6, Axilrod–Teller's London-type form).
   * On an equilateral triangle cos γ = 1/2, so E3 = (11/8) C9 / R^9 + O(R^-12) (next: four couplings, R^-12).
   */
  test('equilateral triangle: the non-additive energy tends to (11/8)·(9/16)α³w/R^9', () => {
    const alpha = freeAlpha(Quelon);
    const C9 = (9 / 16) * alpha ** 3 * 0.72;
    const Rs = [12, 16, 20, 24];
    const ys = Rs.map((R) => {
      const h = (R * Math.sqrt(3)) / 2;
      const r = computeCluster([centre('a', Quelon, [0, 0, 0]), centre('b', Quelon, [R, 0, 0]), centre('c', Quelon, [R / 2, h, 0])]);
      return (r.energy.nonAdditive * R ** 9) / (11 / 8);
    });
    expectClose(intercept(Rs.map((R) => R ** -3), ys), C9, 2e-4);
    expect(ys.every((y) => y > 0)).toBe(true); // repulsive for the equilateral triangle
  });
});

describe('symmetry and invariance', () => {
  test('a centrosymmetric cluster has zero total dipole, and inversion partners have opposite dipoles', () => {
    const rand = seededRandom(42);
    const half: ClusterCentre[] = [];
    const species = [Quelon, Virid, Quelon, Virid];
    for (let i = 0; i < 4; i++) half.push(centre(`c${i}`, species[i], [uniform(rand, 3, 9) * (i % 2 ? -1 : 1), uniform(rand, -8, 8), uniform(rand, -8, 8)]));
    const all = [...half, ...half.map((c) => centre(`${c.label}'`, c.species as DrudeSpecies, scale(c.position, -1)))];
    const r = computeCluster(all);
    const typical = Math.max(...r.centres.map((c) => norm(c.dipole)));
    expect(typical).toBeGreaterThan(0);
    for (let a = 0; a < 3; a++) expectClose(r.dipole[a], 0, 0, 1e-10 * typical);
    for (let i = 0; i < 4; i++) for (let a = 0; a < 3; a++) expectClose(r.centres[i].dipole[a], -r.centres[i + 4].dipole[a], 1e-8, 1e-12 * typical);
  });
  test('results do not depend on the order of the centres (40 centres: blocks cross the solver\'s tile edges)', () => {
    const rand = seededRandom(2026);
    const sp = [Quelon, Virid, Spindlet];
    const cs: ClusterCentre[] = [];
    // a jittered 4 × 5 × 2 lattice with 7 bohr spacing: well apart, no symmetry
    for (let i = 0; i < 40; i++) {
      const grid = [i % 4, Math.floor(i / 4) % 5, Math.floor(i / 20)];
      cs.push(centre(`c${i}`, sp[i % 3], grid.map((g) => 7 * g + uniform(rand, -0.8, 0.8)) as Vec3));
    }
    const order = cs.map((_, i) => i);
    for (let i = order.length - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1));
      [order[i], order[j]] = [order[j], order[i]];
    }
    const r1 = computeCluster(cs);
    const r2 = computeCluster(order.map((i) => cs[i]));
    expectClose(r2.energy.manyBody, r1.energy.manyBody, 1e-11);
    expectClose(r2.energy.pairwise, r1.energy.pairwise, 1e-12);
    const big = Math.max(...r1.centres.map((c) => norm(c.dipole)));
    order.forEach((i, k) => {
      const a = r1.centres[i], b = r2.centres[k];
      expect(b.label).toBe(a.label);
      expectClose(b.alpha, a.alpha, 1e-11);
      expectClose(b.C6, a.C6, 1e-10);
      for (let x = 0; x < 3; x++) expectClose(b.dipole[x], a.dipole[x], 1e-9, 1e-11 * big);
    });
  });
  test('results are invariant under rotation and translation (property test, isotropic centres)', () => {
    const vec = fc.tuple(fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }));
    const rotation = fc.tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: 0.1, max: 1, noNaN: true }));
    fc.assert(
      fc.property(fc.array(vec, { minLength: 2, maxLength: 5 }), rotation, vec, (points, [a, b, c, d], shift) => {
        // keep centres apart (≥ 3.5 bohr) so the coupled system is stable
        const pts = points.map((p, i) => [p[0] + 7 * i, p[1], p[2]] as Vec3);
        // rotation matrix from a quaternion
        const s = Math.hypot(a, b, c, d);
        const [x, y, z, w0] = [a / s, b / s, c / s, d / s];
        const Rm = [
          [1 - 2 * (y * y + z * z), 2 * (x * y - z * w0), 2 * (x * z + y * w0)],
          [2 * (x * y + z * w0), 1 - 2 * (x * x + z * z), 2 * (y * z - x * w0)],
          [2 * (x * z - y * w0), 2 * (y * z + x * w0), 1 - 2 * (x * x + y * y)],
        ];
        const rot = (v: readonly number[]): Vec3 => Rm.map((row) => row[0] * v[0] + row[1] * v[1] + row[2] * v[2]) as Vec3;
        const sp = [Quelon, Virid, Quelon, Virid, Quelon];
        const r1 = computeCluster(pts.map((p, i) => centre(`c${i}`, sp[i], p)));
        const r2 = computeCluster(pts.map((p, i) => centre(`c${i}`, sp[i], rot(p).map((t, k) => t + shift[k]) as Vec3)));
        expectClose(r2.energy.manyBody, r1.energy.manyBody, 1e-9);
        expectClose(r2.energy.pairwise, r1.energy.pairwise, 1e-12);
        const big = Math.max(...r1.centres.map((cc) => norm(cc.dipole)));
        r1.centres.forEach((c1, i) => {
          const c2 = r2.centres[i];
          expectClose(c2.alpha, c1.alpha, 1e-10);
          expectClose(c2.C6, c1.C6, 1e-8);
          const turned = rot(c1.dipole);
          for (let k = 0; k < 3; k++) expectClose(c2.dipole[k], turned[k], 1e-7, 1e-9 * big);
        });
      }),
      { seed: 43, numRuns: 15 },
    );
  });
});

describe('input errors', () => {
  const errorOf = inputErrorOf;
  test('overlapping centres (inside the pair polarisation catastrophe) name both lines', () => {
    const e = errorOf(() =>
      computeCluster([
        { label: 'Q1', species: Quelon, position: [0, 0, 0], line: 3 },
        { label: 'Q2', species: Quelon, position: [0, 0, 10], line: 4 },
        { label: 'Q3', species: Quelon, position: [0, 0.5, 10], line: 5 },
      ]),
    );
    expect(e.field).toBe('line 5 (Q3)');
    expect(e.problem).toMatch(/overlaps centre Q2 on line 4: 0\.5000 bohr apart.*polarisation catastrophe.*2\.\d+ bohr/);
  });
  test('an empty cluster is refused', () => {
    expect(() => computeCluster([])).toThrow(/no centres/);
  });
});
