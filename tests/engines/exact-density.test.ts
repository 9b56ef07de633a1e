/**
 * The density change of each centre from the exact wave function: Hermite functions, normalisation
 * (∫Δρ = 0), and the dipole it carries (−q ∫ z Δρ d³r equals the induced dipole <mu_z>).
 */
import { describe, expect, test } from 'vitest';
import { densityChange, hermiteFunctions } from '../../src/engines/exact/density.js';
import { exactSolver } from '../../src/engines/exact/exact-solver.js';
import { gaussLegendre } from '../../src/math/gauss-legendre.js';
import { drude } from '../../src/model/drude.js';
import { expectClose } from '../helpers/tolerance.js';

// invented demo species (src/model/builtin-species.ts)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/** Gauss–Legendre nodes and weights on [a, b]. */
function rule(n: number, a: number, b: number) {
  const g = gaussLegendre(n);
  return { x: Float64Array.from(g.nodes, (t) => a + ((b - a) * (t + 1)) / 2), w: Float64Array.from(g.weights, (v) => (v * (b - a)) / 2) };
}

describe('density of the Drude particle', () => {
  test('Hermite functions are orthonormal and φ0(0)² = sqrt(m w/π) (common practice)', () => {
    const { x, w } = rule(120, -16, 16);
    const phi = hermiteFunctions(0.38, 0.72, 8, x);
    for (let p = 0; p <= 8; p++)
      for (let q = 0; q <= p; q++) {
        const s = phi[p].reduce((acc, v, i) => acc + w[i] * v * phi[q][i], 0);
        expectClose(s, p === q ? 1 : 0, 0, 1e-13, `<${p}|${q}>`);
      }
    expectClose(hermiteFunctions(0.38, 0.72, 0, [0])[0][0] ** 2, Math.sqrt((0.38 * 0.72) / Math.PI), 1e-15);
  });
  test('∫ Δρ d³r = 0 and −q ∫ z Δρ d³r = <mu_z> for both centres (cylindrical symmetry: d³r = 2π x dx dz)', () => {
    const state = exactSolver(quelon, virid, { order: 3 }).solve(6);
    expect(state.point.trusted).toBe(true);
    const W = 14;
    const xs = rule(60, 0, W), zs = rule(60, -W, W);
    for (const [centre, s, mu] of [['a', quelon, state.point.muA], ['b', virid, state.point.muB]] as const) {
      const d = densityChange(state, centre, xs.x, zs.x);
      let norm = 0, dip = 0, peak = 0;
      for (let i = 0; i < xs.x.length; i++)
        for (let j = 0; j < zs.x.length; j++) {
          const v = d.change[i * zs.x.length + j];
          const wgt = 2 * Math.PI * xs.x[i] * xs.w[i] * zs.w[j];
          norm += wgt * v;
          dip += wgt * v * zs.x[j];
          peak = Math.max(peak, Math.abs(v));
        }
      expect(peak).toBeGreaterThan(1e-5);
      expectClose(norm, 0, 0, 1e-13, `${centre}: ∫Δρ`);
      expectClose(-s.q * dip, mu, 1e-11, 0, `${centre}: dipole of Δρ`);
      expectClose(d.peak, (s.m * s.w[0] / Math.PI) ** 1.5, 1e-14);
    }
  });
});
