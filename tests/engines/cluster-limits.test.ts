/**
 * The cluster engine at the edges of its range: a dimer's dispersion dipoles from 5 to 10^5 bohr against the
 * pair's D7/R^7 (the leading term of the dispersion-induced dipole: A. D. Buckingham's R^-7 law, as reviewed by
 * K. L. C. Hunt, J. Chem. Phys. 1980s; quoted from memory), with D7 of the perturbation route (exact for QDOs,
 * derived here and cross-checked by every route in routes-agree.test.ts); its energy against the exact two-body
 * normal modes (London 1937, Bade 1957, as in the engine); and the memory limit, stated before any work.
 */
import { describe, expect, test } from 'vitest';
import { clusterMemoryBytes, computeCluster, FAR_COUPLING, largestClusterFitting, type ClusterCentre } from '../../src/engines/cluster/cluster.js';
import { computePair } from '../../src/engines/pair.js';
import { resolveSpecies } from '../../src/model/builtin-species.js';
import type { DrudeSpecies } from '../../src/model/drude.js';
import type { Vec3 } from '../../src/model/types.js';
import { inputErrorOf } from '../helpers/input-error.js';

const QUELON = resolveSpecies('Quelon') as DrudeSpecies;
const VIRID = resolveSpecies('Virid') as DrudeSpecies;
const SEPARATIONS = [5, 7, 10, 20, 50, 100, 300, 1e3, 1e4, 1e5];
/** An oblique axis, so that every Cartesian component is exercised. */
const AXIS: Vec3 = [1 / 3, 2 / 3, 2 / 3];
const dot = (a: readonly number[], b: readonly number[]) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];

/** Dimensionless coupling x = q_a q_b / (√(m_a m_b) R³ w_a w_b): the dipole–dipole screening is O(x) (derived here). */
const coupling = (a: DrudeSpecies, b: DrudeSpecies, R: number) => (a.q * b.q) / (Math.sqrt(a.m * b.m) * R ** 3 * a.w[0] * b.w[0]);

function dimer(a: DrudeSpecies, b: DrudeSpecies, R: number) {
  const centres: ClusterCentre[] = [
    { label: 'A', species: a, position: [0, 0, 0] },
    { label: 'B', species: b, position: AXIS.map((x) => x * R) as Vec3 },
  ];
  return computeCluster(centres);
}

describe.each([
  ['like dimer Quelon–Quelon', QUELON, QUELON],
  ['unlike dimer Quelon–Virid', QUELON, VIRID],
])('%s', (_, a, b) => {
  const D7 = computePair(a, b, { routes: ['perturbation'] }).coefficients.D7;
  const C6 = computePair(a, b, { routes: ['perturbation'] }).coefficients.C6;

  test.each(SEPARATIONS)('R = %s bohr: mu_A and mu_B along the axis are D7.a/R^7 and D7.b/R^7 up to the O(x) screening; sign right, no sideways part', (R) => {
    const r = dimer(a, b, R);
    const x = coupling(a, b, R);
    const [muA, muB] = r.centres.map((c) => c.dipole);
    // relative deviation bounded by the screening 3x (the largest seen: 2x at R = 5) plus the far-pair switch, 1e-5
    const bound = 3 * x + 1e-5;
    expect(Math.abs((dot(muA, AXIS) * R ** 7) / D7.a - 1)).toBeLessThanOrEqual(bound);
    expect(Math.abs((dot(muB, AXIS) * R ** 7) / D7.b - 1)).toBeLessThanOrEqual(bound);
    expect(Math.sign(dot(muA, AXIS))).toBe(Math.sign(D7.a));
    for (const mu of [muA, muB]) {
      const along = dot(mu, AXIS);
      const sideways = Math.hypot(mu[0] - along * AXIS[0], mu[1] - along * AXIS[1], mu[2] - along * AXIS[2]);
      expect(sideways).toBeLessThanOrEqual(1e-6 * Math.abs(along));
    }
    // the total: zero for the centrosymmetric like dimer (to rounding in the matrix range, exactly for far pairs)
    const total = dot(r.dipole, AXIS);
    if (a === b) expect(Math.abs(total)).toBeLessThanOrEqual(x < FAR_COUPLING ? 0 : 1e-6 * Math.abs(dot(muA, AXIS)));
    else expect(Math.abs((total * R ** 7) / D7.total - 1)).toBeLessThanOrEqual(bound * Math.max(Math.abs(D7.a), Math.abs(D7.b)) / Math.abs(D7.total));
    expect(r.converged).toBe(true);
    // a dimer has no non-additive energy, and its energy is −C6/R^6 up to the screening (London 1937)
    expect(Math.abs(r.energy.nonAdditive)).toBeLessThanOrEqual(1e-6 * Math.abs(r.energy.pairwise));
    expect(Math.abs((-r.energy.manyBody * R ** 6) / C6 - 1)).toBeLessThanOrEqual(3 * x + 1e-5);
  });
});

describe('memory limit of the cluster engine', () => {
  test('the need grows as two (3N)² double arrays; the largest size that fits the 4 GiB workspace is stated', () => {
    const nMax = largestClusterFitting();
    // 2 (3N)² · 8 bytes ≤ 4 GiB gives N ≤ 5461 (derived here); the eigensolver's smaller arrays take a little more
    expect(nMax).toBeGreaterThan(5300);
    expect(nMax).toBeLessThanOrEqual(5461);
    expect(clusterMemoryBytes(nMax).workspace).toBeLessThanOrEqual(4 * 1024 ** 3);
    expect(clusterMemoryBytes(nMax + 1).workspace).toBeGreaterThan(4 * 1024 ** 3);
  });

  test('20 000 centres are refused before any work, with the largest size that fits', () => {
    const centres: ClusterCentre[] = Array.from({ length: 20_000 }, (_, k) => ({ label: 'Q', species: QUELON, position: [10 * (k % 100), 10 * Math.floor(k / 100), 0] }));
    const e = inputErrorOf(() => computeCluster(centres));
    expect(e.field).toBe('geometry');
    expect(e.problem).toMatch(new RegExp(`has 20000 centres; solving them needs about \\d+\\.\\d GiB .* the largest cluster that fits has ${largestClusterFitting()} centres`));
  });

  test('a machine memory below the workspace limit lowers the stated largest size', () => {
    const centres: ClusterCentre[] = Array.from({ length: 3000 }, (_, k) => ({ label: 'Q', species: QUELON, position: [10 * (k % 100), 10 * Math.floor(k / 100), 0] }));
    const e = inputErrorOf(() => computeCluster(centres, { memoryBytes: 1024 ** 3 }));
    expect(e.problem).toMatch(new RegExp(`this machine has 1\\.0 GiB: the largest cluster that fits has ${largestClusterFitting(1024 ** 3)} centres`));
    expect(largestClusterFitting(1024 ** 3)).toBeLessThan(3000);
  });
});
