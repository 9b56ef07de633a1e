/**
 * What a pair's numbers rest on (src/engines/accuracy.ts) and the rescaling rule of the recommended atoms
 * (src/engines/atoms/recommended-atom.ts).
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { ATOM_LIBRARY, HYDROGEN_EXACT, type AtomRecord } from '../../src/data/atom-library.js';
import type { FirstPrinciplesResponse } from '../../src/model/first-principles-response.js';
import { resolveSpecies } from '../../src/model/builtin-species.js';
import { parseInlineSpecies } from '../../src/model/species-kinds.js';
import { computePair } from '../../src/engines/pair.js';
import { pairAccuracy, speciesAccuracy, worstLevel } from '../../src/engines/accuracy.js';
import { recommendedAtom } from '../../src/engines/atoms/recommended-atom.js';
import { recommendedAtomBySymbol } from '../../src/engines/atoms/recommended-atoms.js';
import { hydrogenicSpectrum } from '../../src/engines/atoms/sturmian-spectrum.js';
import { pseudoStateResponse } from '../../src/engines/atoms/pseudo-state-response.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';

/** Hydrogen's exact response functions (Sturmian pseudo-spectrum) sampled like shipped first-principles data. */
function hydrogenAsData(): FirstPrinciplesResponse {
  const r = pseudoStateResponse(hydrogenicSpectrum(1, 10, 3));
  const u = [0, ...Array.from({ length: 47 }, (_, k) => 0.5 * Math.tan(((k + 1) * Math.PI) / 2 / 49))];
  return {
    symbol: 'H', Z: 1, charge: 0, electrons: 1, level: 'exact (one electron)', basis: 'Sturmian, 10 functions per l', energy: -0.5,
    u,
    alpha1: u.map((x) => r.alpha(1, x)),
    alpha2: u.map((x) => r.alpha(2, x)),
    alpha3: u.map((x) => r.alpha(3, x)),
    B: u.map((x) => r.hyperB(x)),
    convergence: 'test data',
  };
}
const H_DATA = hydrogenAsData();
const HE = ATOM_LIBRARY.find((a) => a.symbol === 'He')!;
const HYDROGEN_RECORD: AtomRecord = {
  symbol: 'H', name: 'hydrogen', electrons: 1,
  alpha: HYDROGEN_EXACT.alpha1, C6: HYDROGEN_EXACT.C6, C8: HYDROGEN_EXACT.C8, C10: HYDROGEN_EXACT.C10, B: HYDROGEN_EXACT.B,
};

describe('the rescaling rule (derived here)', () => {
  test('exact data rescaled to their own exact values need no rescaling: s1 = λ = s2 = s3 = sB = 1 (hydrogen: Yan, Babb, Dalgarno & Drake, PRA 54, 2824 (1996); B = −213/2, Buckingham 1967)', () => {
    const f = recommendedAtom(HYDROGEN_RECORD, H_DATA).factors;
    for (const [name, x] of [['s1', f.s1], ['λ', f.lambda], ['s2', f.s2], ['s3', f.s3], ['sB', f.sB]] as const) expectClose(x, 1, 1e-8, 0, name);
    expect(f.s3From).toBe('C10');
    expect(f.sBFrom).toBe('published B');
  });

  test('one-electron functions rescaled to helium reproduce helium\'s alpha, C6, C8 (Yan et al. 1996) and B = −7.327 (Bishop & Pipin 1989) through the response kernel', () => {
    const rec = recommendedAtom(HE, H_DATA);
    const he = rec.species;
    expect(he.alpha[0]).toBeCloseTo(HE.alpha.value, 14);
    expect(he.hyperB![0]).toBeCloseTo(HE.B!.value, 13);
    const c = isotropicResponseCoefficients(rec.response, rec.response); // the response route's kernel on the rescaled functions
    expectClose(c.C6, HE.C6.value, 1e-13, 0, 'C6');
    expectClose(c.C8, HE.C8.value, 1e-13, 0, 'C8');
    // hydrogen's shapes are far from helium's (λ ≈ 2): helium's C10 would need s3 outside [1/2, 2], so the rule
    // falls back to s3 = s2 and C10 is not fitted (with helium's own functions it is: 'helium is shipped' below)
    expect(rec.factors.lambda).toBeGreaterThan(1.5);
    expect(rec.factors.s3From).toBe('s2');
    expect(rec.factors.s3).toBe(rec.factors.s2);
  });

  test('the rescaled table is the unscaled one stretched: alpha(iλu) = s1·alpha^T(iu) on the grid (derived here)', () => {
    const rec = recommendedAtom(HE, H_DATA);
    const { s1, lambda } = rec.factors;
    rec.species.u.forEach((u, k) => {
      expectClose(u, lambda * H_DATA.u[k], 1e-15);
      expectClose(rec.species.alpha[k], s1 * H_DATA.alpha1[k], 1e-15);
    });
  });

  test('without a published B, sB = s1·(s2/λ)^(1/2) (sum-over-states amplitude estimate, derived here)', () => {
    const { B: _drop, ...noB } = HE;
    const f = recommendedAtom(noB, H_DATA).factors;
    expect(f.sBFrom).toBe('estimate');
    expectClose(f.sB, f.s1 * Math.sqrt(f.s2 / f.lambda), 1e-15);
  });
});

describe('accuracy levels', () => {
  test('hydrogen is exact, a QDO given by its parameters is exact for itself, stand-in QDOs are models', () => {
    expect(speciesAccuracy(resolveSpecies('H')).level).toBe('exact');
    expect(speciesAccuracy(resolveSpecies('Quelon')).level).toBe('exact');
    expect(speciesAccuracy(parseInlineSpecies('drude:q=1.2,m=0.4,w=0.9')).level).toBe('exact');
    const fit = speciesAccuracy(parseInlineSpecies('fit:alpha=1.38,C6=1.46,C8=14.1'));
    expect(fit.level).toBe('exact'); // exact for the QDO it defines; the statement names its B
    expect(fit.basis).toContain("D7 rests on the model's B = ");
    for (const name of ['H-qdo', 'He-qdo', 'Ne-qdo', 'Ar-qdo', 'Kr-qdo', 'Xe-qdo']) {
      const acc = speciesAccuracy(resolveSpecies(name));
      expect(acc.level, name).toBe('model');
      expect(acc.warning, name).toMatch(/^MODEL: /);
    }
  });

  test('levels order exact < first-principles < rescaled < model', () => {
    expect(worstLevel('exact', 'rescaled')).toBe('rescaled');
    expect(worstLevel('first-principles', 'exact')).toBe('first-principles');
    expect(worstLevel('model', 'rescaled', 'exact')).toBe('model');
  });

  test("He-qdo's warning gives the model's B = −4.483 beside the published −7.327 (Bishop & Pipin, J. Chem. Phys. 91, 3549 (1989))", () => {
    const w = speciesAccuracy(resolveSpecies('He-qdo')).warning!;
    expect(w).toContain("the model's B = -4.483");
    expect(w).toContain('published static B of helium = -7.327');
  });

  test('H-qdo against the exact atom: the warning gives B = −57.1 beside −106.5 (= −213/2, Buckingham 1967)', () => {
    const w = speciesAccuracy(resolveSpecies('H-qdo')).warning!;
    expect(w).toContain("the model's B = -57.1");
    expect(w).toContain('-106.5');
  });

  test('He-qdo–Ar-qdo gives the numbers the fitted QDOs always gave, now with the MODEL warning and level', () => {
    const p = computePair(resolveSpecies('He-qdo'), resolveSpecies('Ar-qdo'));
    // project history: `dispole pair He Ar` with the fitted QDOs (perturbation route, 10 digits)
    expectClose(p.coefficients.C6, 9.523183444, 1e-9);
    expectClose(p.coefficients.D7.a, -92.58562911, 1e-9);
    expectClose(p.coefficients.D7.b, 511.1158891, 1e-9);
    expect(p.accuracy.level).toEqual({ a: 'model', b: 'model' });
    expect(p.accuracy.uncertainty).toBeUndefined();
    expect(p.warnings.filter((w) => w.startsWith('MODEL:'))).toHaveLength(2);
    expect(p.trusted).toBe(true); // the routes agree: that is arithmetic, not accuracy
  });

  test('the accuracy of a pair is the same in computePair and pairAccuracy', () => {
    const a = resolveSpecies('H'), b = resolveSpecies('Quelon');
    const p = computePair(a, b);
    expect(p.accuracy).toEqual(pairAccuracy(a, b, p.coefficients.D7, {}, p.coefficients.D9 !== undefined));
    expect(p.accuracy.quantities.D9).toBe(p.accuracy.quantities.D7); // D9 rests on the same response and B as D7 (derived here)
    expect(p.accuracy.level).toEqual({ a: 'exact', b: 'exact' });
    expect(p.warnings.some((w) => w.startsWith('MODEL'))).toBe(false);
  });
});

describe('recommended atoms', () => {
  test('each built-in atom name is its rescaled model where first-principles data are shipped, else its fitted QDO with the model level', () => {
    for (const a of ATOM_LIBRARY) {
      const s = resolveSpecies(a.symbol);
      const rec = recommendedAtomBySymbol(a.symbol);
      if (rec) {
        expect(s).toBe(rec.species);
        expect(speciesAccuracy(s).level).toBe('rescaled');
      } else {
        expect(s.kind).toBe('drude');
        expect(speciesAccuracy(s).level).toBe('model');
      }
    }
  });

  test('helium is shipped: the recommended He reproduces alpha, C6, C8, C10 (Yan et al. 1996) and B = −7.327 (Bishop & Pipin 1989) exactly', () => {
    const rec = recommendedAtomBySymbol('He')!;
    expect(rec).toBeDefined();
    expect(rec.factors.s3From).toBe('C10');
    expect(rec.factors.sBFrom).toBe('published B');
    const he = resolveSpecies('He');
    const p = computePair(he, he);
    expectClose(he.kind === 'response-table' ? he.alpha[0] : NaN, HE.alpha.value, 1e-15, 0, 'alpha');
    expectClose(p.coefficients.C6, HE.C6.value, 1e-13, 0, 'C6');
    expectClose(p.coefficients.C8!, HE.C8.value, 1e-13, 0, 'C8');
    expectClose(p.coefficients.C10!, HE.C10!.value, 1e-13, 0, 'C10');
    expectClose(rec.response.hyperB(0), HE.B!.value, 1e-14, 0, 'B');
    // correlation moves every helium function by a few per cent (TDHF alpha 1.3222 vs exact 1.3832: s1 = 1.046)
    for (const x of [rec.factors.s1, rec.factors.lambda, rec.factors.s2, rec.factors.s3, rec.factors.sB]) expect(Math.abs(x - 1)).toBeLessThan(0.15);
  });

  test('the B estimate sB = s1·(s2/λ)^(1/2) used without a published B misses helium\'s published B (Bishop & Pipin 1989) by ~2 % (checked here: < 4 %)', () => {
    const f = recommendedAtomBySymbol('He')!.factors;
    const estimate = f.s1 * Math.sqrt(f.s2 / f.lambda);
    const miss = Math.abs(estimate / f.sB - 1);
    expect(miss).toBeLessThan(0.04);
    expect(miss).toBeGreaterThan(0.005); // an estimate, not an identity
  });

  test('a pair with a recommended atom has a D7 uncertainty spanning the unscaled and the QDO model; like pairs have D7.total = 0 in every model', () => {
    const he = resolveSpecies('He');
    const p = computePair(he, he);
    const u = p.accuracy.uncertainty!;
    expect(u.models.map((m) => m.model)).toEqual(['first-principles (unscaled)', 'fitted QDO']);
    for (const m of u.models) expectClose(u.D7.a, Math.max(...u.models.map((x) => Math.abs(x.D7.a - p.coefficients.D7.a))), 1e-15, 0, m.model);
    expect(u.D7.a).toBeGreaterThan(0);
    expect(u.D7.total).toBe(0);
    expect(p.accuracy.level).toEqual({ a: 'rescaled', b: 'rescaled' });
    expect(p.warnings.some((w) => w.startsWith('MODEL'))).toBe(false);
  });
});
