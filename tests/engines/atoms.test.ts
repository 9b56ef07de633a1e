/**
 * The atom library (QDOs fitted to published alpha, C6, C8), angular factors, and species from user response
 * data: interpolation accuracy on hydrogen's exact alpha(iu), tails, and how such species enter a pair.
 */
import { describe, expect, test } from 'vitest';
import { expectClose, relDiff } from '../helpers/tolerance.js';
import { seededRandom } from '../helpers/random.js';
import { ATOM_LIBRARY, HYDROGEN_EXACT } from '../../src/data/atom-library.js';
import { atomLibrarySpecies, resolveSpecies } from '../../src/model/builtin-species.js';
import { drude, drudeHyperpolarisabilityB, isotropicParameters } from '../../src/model/drude.js';
import { parseResponseData, type ResponseTableSpecies } from '../../src/model/response-data.js';
import { computePair } from '../../src/engines/pair.js';
import { angularTerms, legendreCoupling } from '../../src/engines/atoms/angular.js';
import { hydrogenicSpectrum } from '../../src/engines/atoms/sturmian-spectrum.js';
import { pseudoStateResponse } from '../../src/engines/atoms/pseudo-state-response.js';
import { responseTableResponse } from '../../src/engines/atoms/tabulated-response.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';
import { drudeIsotropicResponse } from '../../src/engines/response/drude-response.js';

const hydrogen = pseudoStateResponse(hydrogenicSpectrum(1, 10, 3));
const exactHH = isotropicResponseCoefficients(hydrogen, hydrogen);

describe('atom library', () => {
  test('every library QDO reproduces its published alpha, C6 and C8 by both routes (Yan et al. 1996; Tang & Toennies 2003; see atom-library.ts)', () => {
    for (const a of ATOM_LIBRARY) {
      const s = resolveSpecies(`${a.symbol}-qdo`);
      expect(s.kind).toBe('drude');
      const pair = computePair(s, s);
      expect(pair.trusted).toBe(true);
      expectClose(pair.coefficients.C6, a.C6.value, 1e-12, 0, `${a.symbol} C6`);
      expectClose(pair.coefficients.C8!, a.C8.value, 1e-12, 0, `${a.symbol} C8`);
      if (s.kind === 'drude') expectClose((s.q * s.q) / (s.m * s.w[0] * s.w[0]), a.alpha.value, 1e-13, 0, `${a.symbol} alpha`);
    }
  });
  test('He–He from the library: C6 = 1.460977837725 (Yan, Babb, Dalgarno & Drake, PRA 54, 2824 (1996))', () => {
    const he = resolveSpecies('He');
    expectClose(computePair(he, he).coefficients.C6, 1.460977837725, 1e-12);
  });
  test('mixed pairs of the fitted QDOs He-qdo–Ar-qdo and Ne-qdo–Xe-qdo run with all default routes agreeing', () => {
    for (const [a, b] of [['He-qdo', 'Ar-qdo'], ['Ne-qdo', 'Xe-qdo'], ['H', 'Kr-qdo']]) {
      const pair = computePair(resolveSpecies(a), resolveSpecies(b));
      expect(pair.trusted).toBe(true);
      expect(pair.spread.max).toBeLessThan(1e-9);
      expect(pair.coefficients.D7.a).toBeLessThan(pair.coefficients.D7.b);
    }
  });
  test('the QDO fitted to hydrogen implies B = −57.1, about half the exact −106.5 (Buckingham 1967, from memory): what the model misses', () => {
    const hq = atomLibrarySpecies.find((s) => s.name === 'H-qdo')!;
    if (hq.kind !== 'drude') throw new Error('H-qdo is a QDO');
    const B = drudeHyperpolarisabilityB(isotropicParameters(hq));
    expectClose(B, -57.104085, 1e-6);
    expect(B / HYDROGEN_EXACT.B.value).toBeLessThan(0.6);
  });
});

describe('angular factors', () => {
  test('<1 0|ẑ|0 0> = 1/√3 and <1 0|P2|1 0> = 2/5 (common practice: Gaunt coefficients)', () => {
    const t = angularTerms([0, 0, 1], 0, 0, 3);
    expect(t).toHaveLength(1);
    expect(t[0]).toMatchObject({ l: 1, m: 0 });
    expectClose(t[0].value, 1 / Math.sqrt(3), 1e-14);
    expectClose(legendreCoupling(1, 2, 1), 2 / 5, 1e-14);
    expectClose(legendreCoupling(2, 2, 0), 1 / Math.sqrt(5), 1e-14);
  });
  test('x̂² + ŷ² + ẑ² acts as the identity on every (l, m) (the product rule is exact)', () => {
    for (let l = 0; l <= 3; l++)
      for (let m = -l; m <= l; m++) {
        const sum = new Map<string, number>();
        for (const p of [[2, 0, 0], [0, 2, 0], [0, 0, 2]] as const)
          for (const t of angularTerms(p, l, m, 5)) sum.set(`${t.l},${t.m}`, (sum.get(`${t.l},${t.m}`) ?? 0) + t.value);
        for (const [key, v] of sum) expectClose(v, key === `${l},${m}` ? 1 : 0, 0, 1e-13, `l=${l} m=${m} → ${key}`);
      }
  });
});

/** Hydrogen's exact alpha(iu) and B(0; iu, −iu) written as a response table on a grid (test data). */
function hydrogenTable(grid: number[], options: { electrons?: boolean; withB?: boolean; noise?: number } = {}): ResponseTableSpecies {
  const rand = seededRandom(7);
  const jitter = () => 1 + (options.noise ?? 0) * (2 * rand() - 1);
  const lines = [
    ...(options.electrons === false ? [] : ['electrons = 1']),
    ...(options.withB === false ? ['B = -106.5'] : []),
    options.withB === false ? 'u [Eh], alpha [a0^3]' : 'u [Eh], alpha [a0^3], B [au]',
    ...grid.map((u) => [u, hydrogen.alpha(1, u) * jitter(), ...(options.withB === false ? [] : [hydrogen.hyperB(u) * jitter()])].join(', ')),
  ];
  const s = parseResponseData(lines.join('\n'), 'h.csv');
  if (s.kind !== 'response-table') throw new Error('expected a table');
  return s;
}

const grids: Record<string, number[]> = {
  'tangent, 30 points to u = 13': Array.from({ length: 30 }, (_, k) => 0.7 * Math.tan((Math.PI * k) / 60)),
  'geometric, 30 points to u = 31': [0, ...Array.from({ length: 29 }, (_, k) => 0.02 * 1.3 ** k)],
  'mapped uniform, 30 points to u = 44': [0, ...Array.from({ length: 29 }, (_, k) => (1.5 * (k + 1)) / (30 - (k + 1)))],
};

describe('tabulated response: interpolation and tails', () => {
  for (const [name, grid] of Object.entries(grids)) {
    test(`H–H C6 within 1e-6 of Yan et al. (PRA 54, 2824 (1996)) from a table of hydrogen's alpha(iu) on a ${name} grid`, () => {
      const t = responseTableResponse(hydrogenTable(grid));
      const r = isotropicResponseCoefficients(t, t);
      expect(r.converged).toBe(true);
      expect(relDiff(r.C6, HYDROGEN_EXACT.C6.value)).toBeLessThan(1e-6);
      expect(relDiff(r.D7a, exactHH.D7a)).toBeLessThan(1e-5);
      expect(t.notes.join(' ')).toContain('N/u² with N = 1 (given)');
    });
  }
  test('without the electron number the tail N is estimated from the last point, and the output says so', () => {
    const t = responseTableResponse(hydrogenTable(grids['geometric, 30 points to u = 31'], { electrons: false }));
    expect(t.notes.join(" ")).toMatch(/N ≈ [\d.]+ extrapolated from the table \(no electron number given\)/);
    expect(relDiff(isotropicResponseCoefficients(t, t).C6, HYDROGEN_EXACT.C6.value)).toBeLessThan(1e-5);
  });
  test('tails follow N/u²: u² alpha(iu) → N far beyond the grid', () => {
    const t = responseTableResponse(hydrogenTable(grids['tangent, 30 points to u = 13']));
    expectClose(1e6 * t.alpha(1, 1e3), 1, 1e-3);
  });
  test('noisy data (1e-6 relative) still give C6 within 1e-5', () => {
    const t = responseTableResponse(hydrogenTable(grids['mapped uniform, 30 points to u = 44'], { noise: 1e-6 }));
    expect(relDiff(isotropicResponseCoefficients(t, t).C6, HYDROGEN_EXACT.C6.value)).toBeLessThan(1e-5);
  });
  test('a static B only: D7 uses B·alpha(iu)/alpha(0) and is flagged approximate (17% off for H–H, see hydrogen.test.ts)', () => {
    const s = hydrogenTable(grids['geometric, 30 points to u = 31'], { withB: false });
    const pair = computePair(s, s);
    expect(pair.routes.map((r) => r.name)).toEqual(['response']);
    expect(pair.skipped.find((k) => k.name === 'perturbation')?.reason).toBe('h has response functions only, no state space for perturbation theory');
    expect(pair.coefficients.C8).toBeUndefined();
    expect(pair.warnings.some((w) => w.startsWith('D7 is APPROXIMATE: h has only a static B'))).toBe(true);
    expect(pair.routes[0].notes.join('\n')).toContain('APPROXIMATE D7');
    expectClose(pair.coefficients.D7.a / exactHH.D7a - 1, 0.1696, 0, 1e-3);
  });
});

describe('pseudo-spectrum species', () => {
  test('a one-line spectrum f = q²/m at ω = w with B = −2q³/(m²w⁴) is a QDO: C6 and D7 with a QDO partner match the QDO (derived here: B(iu) ∝ alpha(iu) is exact for a QDO)', () => {
    const q = drude({ q: 1.1, m: 0.5, w: 0.7 }, 'q');
    const partner = drude({ q: 0.9, m: 0.8, w: 1.3 }, 'p');
    const spectrum = parseResponseData(`B = ${(-2 * 1.1 ** 3) / (0.5 ** 2 * 0.7 ** 4)}\nenergy [Eh], strength\n0.7, ${1.1 ** 2 / 0.5}`, 'one.csv');
    const fromSpectrum = computePair(spectrum, partner);
    const r = isotropicResponseCoefficients(drudeIsotropicResponse(q), drudeIsotropicResponse(partner));
    expectClose(fromSpectrum.coefficients.C6, r.C6, 1e-12);
    expectClose(fromSpectrum.coefficients.D7.a, r.D7a, 1e-12);
    expectClose(fromSpectrum.coefficients.D7.b, r.D7b, 1e-12);
    expect(fromSpectrum.coefficients.C8).toBeUndefined();
  });
});
