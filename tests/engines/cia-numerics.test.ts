/** CIA engine numerics: damping functions, quadrature rule, Riccati–Bessel functions, the Numerov solver, HFD sets, validation. */
import { describe, expect, test } from 'vitest';
import { tangToenniesDamping } from '../../src/engines/cia/damping.js';
import { KRONROD15 } from '../../src/engines/cia/gauss-kronrod.js';
import { riccatiBessel } from '../../src/engines/cia/riccati-bessel.js';
import { boundStates, continuumState, radialGrid, startIndex } from '../../src/engines/cia/radial-solver.js';
import { buildPotential } from '../../src/engines/cia/potential.js';
import { HFD_SETS } from '../../src/engines/cia/hfd-parameters.js';
import { InputError } from '../../src/model/errors.js';
import { BOHR_IN_ANGSTROM, BOLTZMANN_IN_HARTREE_PER_KELVIN } from '../../src/model/units.js';
import { expectClose } from '../helpers/tolerance.js';

describe('Tang–Toennies damping f_n(x) = 1 − e^-x Σ_{k≤n} x^k/k! (K. T. Tang, J. P. Toennies, J. Chem. Phys. 80, 3726 (1984))', () => {
  test('both evaluation branches agree with the defining sum, and f_n → x^(n+1)/(n+1)! for small x (derived here)', () => {
    for (const n of [6, 7, 8, 9, 10]) {
      for (const x of [0.7, 3, n + 0.5, n + 1.5, 12, 25]) {
        let t = 1, sum = 1;
        for (let k = 1; k <= n; k++) (t *= x / k), (sum += t);
        expectClose(tangToenniesDamping(n, x)[0], 1 - Math.exp(-x) * sum, 1e-12, 1e-15, `f_${n}(${x})`);
      }
      let fact = 1;
      for (let k = 2; k <= n + 1; k++) fact *= k;
      expectClose(tangToenniesDamping(n, 1e-3)[0], 1e-3 ** (n + 1) / fact, 1e-3, 0, `small-x f_${n}`);
    }
  });
  test('the first and second derivatives match central differences', () => {
    for (const [n, x] of [[6, 2.5], [8, 9.1], [10, 14]] as const) {
      const h = 1e-4;
      const [, d1, d2] = tangToenniesDamping(n, x);
      const f = (y: number) => tangToenniesDamping(n, y)[0];
      expectClose(d1, (f(x + h) - f(x - h)) / (2 * h), 1e-7);
      const g = (y: number) => tangToenniesDamping(n, y)[1];
      expectClose(d2, (g(x + h) - g(x - h)) / (2 * h), 1e-6, 1e-12);
    }
  });
});

test('Gauss–Kronrod 7–15: weights sum to 2, Kronrod exact to degree 22, Gauss to degree 13 (QUADPACK, Piessens et al. 1983)', () => {
  const { nodes, kronrod, gauss } = KRONROD15;
  for (let p = 0; p <= 22; p++) {
    const exact = p % 2 ? 0 : 2 / (p + 1);
    const k = nodes.reduce((s, x, i) => s + kronrod[i] * x ** p, 0);
    expectClose(k, exact, 1e-14, 1e-15, `Kronrod x^${p}`);
    if (p <= 13) expectClose(nodes.reduce((s, x, i) => s + gauss[i] * x ** p, 0), exact, 1e-14, 1e-15, `Gauss x^${p}`);
  }
});

describe('Riccati–Bessel functions (M. Abramowitz, I. A. Stegun, Handbook (1964), 10.1.11, 10.1.12, 10.1.31)', () => {
  test('closed forms of l = 1, 2', () => {
    for (const x of [0.3, 2, 17.5]) {
      const [j1, n1] = riccatiBessel(1, x);
      expectClose(j1, Math.sin(x) / x - Math.cos(x), 1e-12, 1e-14);
      expectClose(n1, -Math.cos(x) / x - Math.sin(x), 1e-12, 1e-14);
      const [j2, n2] = riccatiBessel(2, x);
      expectClose(j2, (3 / (x * x) - 1) * Math.sin(x) - (3 * Math.cos(x)) / x, 1e-10, 1e-14);
      expectClose(n2, -(3 / (x * x) - 1) * Math.cos(x) - (3 * Math.sin(x)) / x, 1e-12, 1e-14);
    }
  });
  test('cross product ĵ_l n̂_(l−1) − ĵ_(l−1) n̂_l = 1 on both branches (upward and Miller)', () => {
    for (const [l, x] of [[5, 30], [40, 10], [120, 60], [300, 280]] as const) {
      const [jl, nl] = riccatiBessel(l, x);
      const [jm, nm] = riccatiBessel(l - 1, x);
      expectClose(jl * nm - jm * nl, 1, 1e-9, 0, `l = ${l}, x = ${x}`);
    }
  });
});

describe('radial Numerov solver', () => {
  test('Morse bound levels E_v = −D + ω(v+½) − ω²(v+½)²/(4D) (P. M. Morse, Phys. Rev. 34, 57 (1929)), l = 0', () => {
    // an invented Morse well: D = 0.01 Eh, a = 1.1/bohr, Re = 6 bohr, reduced mass 6000 m_e (9 levels)
    const D = 0.01, a = 1.1, Re = 6, m = 6000;
    const V = (R: number) => D * ((1 - Math.exp(-a * (R - Re))) ** 2 - 1);
    const g = radialGrid(V, m, 2.5, 0.004, 14, 16, 20);
    const levels = boundStates(g, 0);
    const w = a * Math.sqrt((2 * D) / m);
    const expected = Array.from({ length: 20 }, (_, v) => -D + w * (v + 0.5) - (w * (v + 0.5)) ** 2 / (4 * D)).filter((E, v) => E < 0 && v < Math.floor(Math.sqrt(2 * m * D) / a - 0.5) - 1);
    expect(expected.length).toBeGreaterThanOrEqual(7);
    expect(levels.length).toBeGreaterThanOrEqual(expected.length);
    expected.forEach((E, v) => expectClose(levels[v].E, E, 0, 2e-8 * D, `level ${v}`));
    // normalised
    const norm = levels[0].u.reduce((s, u) => s + u * u, 0) * g.h;
    expectClose(norm, 1, 1e-12);
  });
  test('free waves (V = 0) come out as ĵ_l(kR) with zero phase shift (unit asymptotic amplitude)', () => {
    const m = 6000;
    const g = radialGrid(() => 0, m, 0, 0.004, 20, 25, 30);
    const u = new Float64Array(g.R.length);
    for (const [l, E] of [[0, 1e-3], [3, 5e-4], [30, 2e-3]] as const) {
      const k = Math.sqrt(2 * m * E);
      const s = continuumState(g, l, E, startIndex(g, l, E), u)!;
      expect(Math.abs(Math.sin(s.phase))).toBeLessThan(1e-6);
      for (const i of [1500, 3000, 4500]) expectClose(u[i] * Math.cos(s.phase), riccatiBessel(l, k * g.R[i])[0], 0, 2e-6, `l ${l} R ${g.R[i]}`);
    }
  });
});

describe('HFD parameter sets', () => {
  test.each(Object.keys(HFD_SETS))('%s: the well lies at rm with depth ε (reduced form V*(1) = −1, the defining property of the published sets)', (name) => {
    const p = HFD_SETS[name];
    const pot = buildPotential({ kind: 'hfd', set: name });
    // published: He-He ε/k = 10.948 K, rm = 2.963 Å (Aziz, McCourt, Wong, Mol. Phys. 61, 1487 (1987));
    // Ar-Ar ε/k = 143.25 K, rm = 3.761 Å (R. A. Aziz, J. Chem. Phys. 92, 1030 (1990))
    expectClose(pot.well!.R * BOHR_IN_ANGSTROM, p.rmAngstrom, 2e-3);
    expectClose(pot.well!.depth / BOLTZMANN_IN_HARTREE_PER_KELVIN, p.epsilonK, 2e-3);
  });
});

describe('potential validation', () => {
  test('a Tang–Toennies potential with a non-positive repulsion is refused, naming the field', () => {
    expect(() => buildPotential({ kind: 'tang-toennies', A: -3, b: 1.5, C6: 10, C8: 100, C10: 1000, dispersionSource: 'x' })).toThrow(/--potential\.A: the Born–Mayer repulsion must be a finite number > 0/);
  });
  test('a table without a well, or with a non-increasing grid, is refused', () => {
    const R = [3, 4, 5, 6, 7];
    expect(() => buildPotential({ kind: 'table', file: 'v.txt', R, V: [1, 0.5, 0.2, 0.1, 0.05] })).toThrow(InputError);
    expect(() => buildPotential({ kind: 'table', file: 'v.txt', R, V: [1, 0.5, 0.2, 0.1, 0.05] })).toThrow(/no well|attractive tail/);
    expect(() => buildPotential({ kind: 'table', file: 'v.txt', R: [3, 4, 4, 6, 7], V: [1, -0.1, -0.2, -0.1, -0.05] })).toThrow(/v\.txt:3: the R grid must increase strictly/);
  });
});
