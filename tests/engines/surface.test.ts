/**
 * An atom in front of a surface: image Hamiltonian, the three routes, closed forms, dielectric limits, bad input.
 *
 * Hydrogen in front of a perfect conductor (derived here, from the image charges of J. D. Jackson, Classical
 * Electrodynamics, 3rd ed. 1999, §2.1; electron −1 at Z ẑ + r, nucleus at Z ẑ, their images mirrored with
 * opposite charges, the ½ of induced charges):
 *   W(r) = 1/|2Z ẑ + r| − 1/(4(Z + z)) − 1/(4Z) = Σ_n W_n/Z^(n+1),
 *   W_2 = −(r² + z²)/16,  W_3 = (3/32) z (z² + r²),  W_4 = r⁴ P_4(cos θ)/32 − z⁴/4.
 * With the 1s density e^(−2r)/π: <r²> = 3, <z²> = 1, <r⁴> = 45/2, <z⁴> = 9/2, <r⁴ P_4> = 0, so
 *   C3 = −<W_2> = 1/4,  C5 = −<W_4> = 9/8.
 * D4 = −2<0|μ_z R0 W_3|0> with μ_z = −z and the Dalgarno–Lewis function R0 (z ψ0) = (1 + r/2) z ψ0 (the static
 * polarisability's first-order function; A. Dalgarno, J. T. Lewis, Proc. R. Soc. Lond. A 233, 70 (1955)):
 *   D4 = 2 ∫ (1 + r/2) z W_3 ψ0² d³r = (3/16π) ∫ (1 + r/2) z² (z² + r²) e^(−2r) d³r
 *      = (3/16π) · 4π · <cos⁴θ + cos²θ>_angle · ∫_0^∞ (1 + r/2) r⁶ e^(−2r) dr
 *      = (3/4) · (1/5 + 1/3) · (6!/2⁷ + ½ · 7!/2⁸) = (3/4)(8/15)(45/8 + 315/32) = (2/5)(495/32) = 99/16.
 */
import { describe, expect, test } from 'vitest';
import { computeSurface } from '../../src/engines/surface/surface.js';
import { imageFactor } from '../../src/engines/surface/image-factor.js';
import { isotropicSurfaceCoefficients, tensorSurfaceCoefficients } from '../../src/engines/surface/response-surface.js';
import { drudeIsotropicResponse, drudeTensorResponse } from '../../src/engines/response/drude-response.js';
import { evaluatePolynomial3, imagePolynomial, imageTerms } from '../../src/engines/surface/image-hamiltonian.js';
import { deriveSurfaceQuantities } from '../../src/engines/symbolic/symbolic-surface.js';
import { evaluateClosedFormNumber } from '../../src/engines/symbolic/closed-form.js';
import { drude, drudeAnisotropic, drudeHyperpolarisabilityB } from '../../src/model/drude.js';
import { hydrogenic } from '../../src/model/hydrogenic.js';
import { oscillatorSpectrum, parseResponseData } from '../../src/model/response-data.js';
import { parseEpsTable, parseSurfaceSpec, type SurfaceSpec } from '../../src/model/surface-spec.js';
import type { DrudeSpecies } from '../../src/model/drude.js';
import { inputErrorOf } from '../helpers/input-error.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { expectClose, relDiff } from '../helpers/tolerance.js';

const conductor: SurfaceSpec = { kind: 'conductor' };
const H = hydrogenic({ Z: 1 }, 'H');

describe('image Hamiltonian', () => {
  test('W_2 is the classic image-dipole energy −(μ² + μ_z²)/16 (Jackson §2.1, derived here)', () => {
    const w2 = [...imagePolynomial(2, 1).values()].map((t) => [t.p.join(''), t.c]);
    expect(Object.fromEntries(w2)).toEqual({ '200': -1 / 16, '020': -1 / 16, '002': -1 / 8 });
  });
  test('the multipole sum reproduces the exact image energy of hydrogen’s charges (Jackson §2.1)', () => {
    const exact = (r: number[], Z: number) => 1 / Math.hypot(r[0], r[1], 2 * Z + r[2]) - 1 / (4 * (Z + r[2])) - 1 / (4 * Z);
    for (const [r, Z] of [[[0.3, -0.2, 0.4], 6], [[-0.5, 0.1, -0.3], 9]] as const) {
      let sum = 0;
      for (let n = 2; n <= 10; n++) sum += evaluatePolynomial3(imagePolynomial(n, 1), r) / Z ** (n + 1);
      expectClose(sum, exact([...r], Z), 1e-9, 0, `Z = ${Z}`);
    }
  });
  test('a tilted normal gives the same operator as the rotated coordinates (n = x̂: x and z swap roles)', () => {
    const tilted = imagePolynomial(3, 1, [1, 0, 0]);
    const plain = imagePolynomial(3, 1);
    const r = [0.3, -0.7, 0.2];
    // surface axes for n = x̂: e1 = ŷ, e2 = ẑ, n = x̂, so the surface-frame coordinates are (y, z, x)
    expectClose(evaluatePolynomial3(tilted, r), evaluatePolynomial3(plain, [r[1], r[2], r[0]]), 1e-13, 1e-15);
    expect(imageTerms(3, [1, 0, 0]).length).toBe(imageTerms(3).length);
  });
});

describe('hydrogen in front of a perfect conductor (exact values derived in the header comment)', () => {
  const r = computeSurface(H, conductor);
  test('C3 = 1/4 = <r²>/12 (image-dipole result of J. E. Lennard-Jones, Trans. Faraday Soc. 28, 333 (1932): attribution and year checked, volume and page quoted from memory; <r²> = 3)', () => {
    for (const route of r.routes) expectClose(route.C3, 1 / 4, 1e-12, 0, route.name);
  });
  test('C5 = 9/8 (derived here: <z⁴>/4 with <z⁴> = 9/2)', () => {
    for (const route of r.routes) expectClose(route.C5!, 9 / 8, 1e-12, 0, route.name);
  });
  test('D4 = 99/16 to 1e-9 by the pseudo-state perturbation route and by the response route (B(0; iu, −iu) of hydrogen)', () => {
    expect(r.routes.map((x) => x.name)).toEqual(['perturbation', 'response']);
    for (const route of r.routes) expectClose(route.D4, 99 / 16, 1e-9, 0, route.name);
    expect(r.trusted).toBe(true);
  });
  test('a hydrogen-like ion scales as C3 ∝ Z⁻², C5 ∝ Z⁻⁴, D4 ∝ Z⁻⁶ (r → r/Z, energies × Z²; common practice)', () => {
    const ion = computeSurface(hydrogenic({ Z: 2 }, 'He+'), conductor);
    for (const route of ion.routes) {
      expectClose(route.C3, 1 / 4 / 4, 1e-11, 0, route.name);
      expectClose(route.C5!, 9 / 8 / 16, 1e-11, 0, route.name);
      expectClose(route.D4, 99 / 16 / 64, 1e-9, 0, route.name);
    }
  });
});

/** A closed form's value at numeric q, m, w (or wx, wy, wz). */
function closedFormValue(name: 'C3' | 'C5' | 'D4', s: DrudeSpecies, anisotropic: boolean): number {
  const [d] = deriveSurfaceQuantities([name], anisotropic);
  const t = d.form.table;
  const values = t.symbols.map(() => 1);
  values[t.q.a] = s.q;
  values[t.m.a] = s.m;
  t.w.a.forEach((i, axis) => (values[i] = s.w[axis]));
  return evaluateClosedFormNumber(d.form, values);
}

describe('QDO in front of a conductor: closed forms of the symbolic engine matched by every route', () => {
  const rand = seededRandom(1414);
  const species = [
    ...Array.from({ length: 3 }, () => drude({ q: uniform(rand, 0.5, 2), m: uniform(rand, 0.2, 1.5), w: uniform(rand, 0.3, 1.2) })),
    ...Array.from({ length: 3 }, () =>
      drudeAnisotropic({ q: uniform(rand, 0.5, 2), m: uniform(rand, 0.2, 1.5), wx: uniform(rand, 0.3, 1.2), wy: uniform(rand, 0.3, 1.2), wz: uniform(rand, 0.3, 1.2) }),
    ),
  ];
  test('isotropic closed forms: C3 = q²/(8mw), C5 = 3q²/(16m²w²), D4 = 3q³/(8m²w³)', () => {
    const text = deriveSurfaceQuantities(['C3', 'C5', 'D4']).map((d) => `${d.name} = ${d.display.text}`);
    expect(text).toEqual(['C3 = q^2/(8*m*w)', 'C5 = 3*q^2/(16*m^2*w^2)', 'D4 = 3*q^3/(8*m^2*w^3)']);
  });
  test('C3 = alpha w/8, the Lifshitz–McLachlan integral (1/4π)∫alpha(iu) du of alpha(iu) = alpha w²/(w² + u²) (A. D. McLachlan, Mol. Phys. 6, 423 (1963))', () => {
    const s = species[0];
    const alpha = (s.q * s.q) / (s.m * s.w[0] ** 2);
    expectClose(closedFormValue('C3', s, false), (alpha * s.w[0]) / 8, 1e-14);
  });
  test('D4 = −(3/16) B w with Buckingham’s B = −2q³/(m²w⁴) of a QDO (the response-route prefactor −3/(8π))', () => {
    const s = species[1];
    expectClose(closedFormValue('D4', s, false), (-3 / 16) * drudeHyperpolarisabilityB({ q: s.q, m: s.m, w: s.w[0] }) * s.w[0], 1e-14);
  });
  test('perturbation, response and force balance agree with the closed forms to 1e-12 (isotropic and anisotropic)', () => {
    for (const [k, s] of species.entries()) {
      const aniso = k >= 3;
      const r = computeSurface(s, conductor);
      expect(r.routes.map((x) => x.name)).toEqual(['perturbation', 'response', 'force-balance']);
      for (const route of r.routes) {
        expectClose(route.C3, closedFormValue('C3', s, aniso), 1e-12, 0, `${route.name} C3 #${k}`);
        expectClose(route.C5!, closedFormValue('C5', s, aniso), 1e-12, 0, `${route.name} C5 #${k}`);
        expectClose(route.D4, closedFormValue('D4', s, aniso), 1e-12, 0, `${route.name} D4 #${k}`);
      }
      expect(r.trusted).toBe(true);
    }
  });
});

describe('orientation', () => {
  const s = drudeAnisotropic({ q: 1.2, m: 0.45, wx: 0.8, wy: 0.7, wz: 0.55 });
  test('normal along the atom’s x axis = the untilted atom with its axes relabelled (symmetry; derived here)', () => {
    const tilted = computeSurface(s, conductor, { normal: [1, 0, 0] });
    const relabelled = computeSurface(drudeAnisotropic({ q: 1.2, m: 0.45, wx: 0.7, wy: 0.55, wz: 0.8 }), conductor);
    for (const k of ['C3', 'C5', 'D4'] as const) expectClose(tilted.coefficients[k]!, relabelled.coefficients[k]!, 1e-12, 0, k);
    expect(tilted.coefficients.D4vector).toBeUndefined(); // along a principal axis: no tilt
  });
  test('a tilted anisotropic centre gets a tilted dipole; every route gives the same vector', () => {
    const r = computeSurface(s, conductor, { normal: [1, 1, 2] });
    expect(r.coefficients.D4vector).toBeDefined();
    const v = r.coefficients.D4vector!;
    const n = r.normal;
    expectClose(v[0] * n[0] + v[1] * n[1] + v[2] * n[2], r.coefficients.D4, 1e-13);
    expect(Math.hypot(v[0] - r.coefficients.D4 * n[0], v[1] - r.coefficients.D4 * n[1])).toBeGreaterThan(1e-3 * Math.abs(r.coefficients.D4));
    expect(r.spread.D4vector).toBeLessThan(1e-12);
    expect(r.routes).toHaveLength(3);
  });
  test('an isotropic centre’s dipole stays along the normal whatever its direction', () => {
    const q = drude({ q: 1.1, m: 0.38, w: 0.72 });
    const r = computeSurface(q, conductor, { normal: [0.3, -0.4, 0.5] });
    const plain = computeSurface(q, conductor);
    expectClose(r.coefficients.D4, plain.coefficients.D4, 1e-12);
    for (const route of r.routes) route.D4vector.forEach((x, k) => expectClose(x, plain.coefficients.D4 * r.normal[k], 1e-12, 1e-14, `${route.name} ${k}`));
  });
});

describe('dielectric surfaces', () => {
  const qdo = drude({ q: 1.1, m: 0.38, w: 0.72 });
  const ref = computeSurface(qdo, conductor).coefficients;
  test('constant eps: every coefficient is the conductor’s times (eps − 1)/(eps + 1) (image charge, Jackson §4.4)', () => {
    const r = computeSurface(qdo, { kind: 'constant', eps: 3 });
    for (const route of r.routes) {
      expectClose(route.C3, 0.5 * ref.C3, 1e-12, 0, route.name);
      expectClose(route.D4, 0.5 * ref.D4, 1e-12, 0, route.name);
    }
  });
  test('eps → ∞ gives the conductor, eps → 1 gives zero', () => {
    const big = computeSurface(H, { kind: 'constant', eps: 1e12 });
    const hRef = computeSurface(H, conductor).coefficients;
    expectClose(big.coefficients.C3, hRef.C3, 3e-12);
    expectClose(big.coefficients.D4, hRef.D4, 3e-12);
    const none = computeSurface(H, { kind: 'constant', eps: 1 });
    expect([none.coefficients.C3, none.coefficients.C5, none.coefficients.D4]).toEqual([0, 0, 0]);
  });
  test('a Drude metal tends to the conductor as the plasma frequency grows (response route)', () => {
    const deviation = [1, 10, 100, 1000].map((wp) => {
      const r = computeSurface(qdo, { kind: 'drude-lorentz', form: 'drude', terms: [{ wp, w0: 0, gamma: 0.01 }] });
      expect(r.routes.map((x) => x.name)).toEqual(['response']);
      return Math.max(relDiff(r.coefficients.C3, ref.C3), relDiff(r.coefficients.D4, ref.D4));
    });
    for (let k = 1; k < deviation.length; k++) expect(deviation[k]).toBeLessThan(deviation[k - 1] / 5);
    expect(deviation[3]).toBeLessThan(2e-3);
  });
  test('a tabulated eps(iu) reproduces the analytic Drude–Lorentz surface it samples', () => {
    const terms = [{ wp: 0.6, w0: 0, gamma: 0.02 }, { wp: 0.9, w0: 0.5, gamma: 0.05 }];
    const u = Array.from({ length: 40 }, (_, k) => 0.005 * 1.2 ** k);
    const eps = u.map((x) => 1 + terms.reduce((s, t) => s + (t.wp * t.wp) / (t.w0 * t.w0 + x * x + t.gamma * x), 0));
    const table = parseEpsTable(['u [Eh], eps', ...u.map((x, k) => `${x}, ${eps[k]}`)].join('\n'), 'eps.csv');
    const a = computeSurface(H, { kind: 'drude-lorentz', form: 'drude-lorentz', terms });
    const b = computeSurface(H, table);
    expectClose(b.coefficients.C3, a.coefficients.C3, 1e-4);
    expectClose(b.coefficients.D4, a.coefficients.D4, 1e-4);
    expect(b.routes[0].notes.some((n) => n.includes('interpolated'))).toBe(true);
  });
  test('frequency-dependent image: the Cartesian kernel equals the isotropic integrals (prefactors 1/4π, −3/8π derived here)', () => {
    const f = imageFactor(parseSurfaceSpec('drude-lorentz:wp=0.4,w0=0,gamma=0.02;wp=0.7,w0=0.9,gamma=0.1'));
    const t = drudeTensorResponse(qdo);
    const cart = tensorSurfaceCoefficients(t, [undefined, undefined, t.dChiDFz], f, [0, 0, 1]);
    const iso = isotropicSurfaceCoefficients(drudeIsotropicResponse(qdo), f, [0, 0, 1]);
    expectClose(cart.C3, iso.C3, 1e-12);
    expectClose(cart.C5, iso.C5, 1e-12);
    expectClose(cart.D4vector[2], iso.D4vector[2], 1e-12);
    expect(cart.C3).toBeLessThan(ref.C3);
  });
  test('image factors stay in [0, 1]', () => {
    const f = imageFactor(parseSurfaceSpec('drude-lorentz:wp=0.3,w0=0,gamma=0.01;wp=0.5,w0=0.4,gamma=0.02'));
    for (const u of [0, 1e-6, 0.1, 1, 100]) expect(f.delta(u) >= 0 && f.delta(u) <= 1).toBe(true);
    expect(f.delta(0)).toBe(1);
  });
});

describe('species with response data only', () => {
  test('a one-line pseudo-spectrum behaves as the QDO it mimics (response route; D4 flagged approximate)', () => {
    const q = 1.3, m = 0.6, w = 0.8;
    const s = oscillatorSpectrum({ energies: [w], strengths: [(q * q) / m], B: drudeHyperpolarisabilityB({ q, m, w }) }, 'mimic');
    const r = computeSurface(s, conductor);
    expect(r.routes.map((x) => x.name)).toEqual(['response']);
    expectClose(r.coefficients.C3, (q * q) / (8 * m * w), 1e-12);
    expectClose(r.coefficients.D4, (3 * q ** 3) / (8 * m * m * w ** 3), 1e-12);
    expect(r.coefficients.C5).toBeUndefined();
    expect(r.warnings.some((x) => x.startsWith('D4 is APPROXIMATE'))).toBe(true);
  });
});

describe('tabulated response data', () => {
  test('a response table sampled from a QDO gives the QDO closed forms (response route, rational interpolation)', () => {
    const q = 1.1, m = 0.38, w = 0.72;
    const alpha = (q * q) / (m * w * w), alpha2 = (0.75 * q * q) / (m * m * w ** 3), B = drudeHyperpolarisabilityB({ q, m, w });
    const u = [0, ...Array.from({ length: 29 }, (_, k) => 0.02 * 1.3 ** k)];
    const rows = u.map((x) => [x, (alpha * w * w) / (w * w + x * x), (alpha2 * 4 * w * w) / (4 * w * w + x * x), (B * w * w) / (w * w + x * x)].join(', '));
    const s = parseResponseData(['u [Eh], alpha [a0^3], alpha2 [a0^5], B [au]', ...rows].join('\n'), 'qdo-table.csv');
    const r = computeSurface(s, conductor);
    expect(r.routes.map((x) => x.name)).toEqual(['response']);
    expectClose(r.coefficients.C3, (q * q) / (8 * m * w), 1e-8);
    expectClose(r.coefficients.C5!, (3 * q * q) / (16 * m * m * w * w), 1e-8);
    expectClose(r.coefficients.D4, (3 * q ** 3) / (8 * m * m * w ** 3), 1e-8);
  });
});

describe('bad input names the field', () => {
  test('eps below 1', () => {
    expect(inputErrorOf(() => parseSurfaceSpec('eps=0.5')).field).toBe('surface.eps');
  });
  test('a table with eps(iu) < 1, an unsorted table, a too short table', () => {
    const e1 = inputErrorOf(() => parseEpsTable('u [Eh], eps\n0, 3\n0.1, 2\n0.2, 0.9\n0.3, 1.2\n', 'bad.csv'));
    expect(e1.field).toBe('bad.csv:4:2');
    expect(e1.problem).toMatch(/≥ 1/);
    const e2 = inputErrorOf(() => parseEpsTable('u [Eh], eps\n0, 3\n0.2, 2\n0.1, 1.5\n0.3, 1.2\n', 'unsorted.csv'));
    expect(e2.field).toBe('unsorted.csv:4:1');
    expect(e2.problem).toMatch(/increase strictly/);
    expect(inputErrorOf(() => parseEpsTable('u [Eh], eps\n0, 3\n', 'short.csv')).problem).toMatch(/at least 4 rows/);
  });
  test('Drude fields and unknown surfaces', () => {
    expect(inputErrorOf(() => parseSurfaceSpec('drude:wp=-1,gamma=0')).field).toBe('surface.drude.wp');
    expect(inputErrorOf(() => parseSurfaceSpec('drude:wp=1,gama=0')).field).toBe('surface.drude.gama');
    expect(inputErrorOf(() => parseSurfaceSpec('mirror')).field).toBe('surface');
  });
});

describe('library edge validation', () => {
  test('plain-data surfaces and distances are checked', async () => {
    const { surfaceExactCurve } = await import('../../src/engines/surface/exact-surface.js');
    expect(inputErrorOf(() => computeSurface(H, { kind: 'constant', eps: 0.9 })).field).toBe('surface.eps');
    expect(inputErrorOf(() => computeSurface(H, { kind: 'table', name: 't', u: [0, 0.2, 0.1, 0.3], eps: [3, 2, 1.5, 1.2] })).field).toBe('surface.u[2]');
    expect(inputErrorOf(() => computeSurface(H, conductor, { normal: [0, 0, 0] })).field).toBe('normal');
    expect(inputErrorOf(() => surfaceExactCurve(drude({ q: 1, m: 1, w: 1 }), [5, 0])).field).toBe('Z[1]');
  });
});

describe('Drude–Lorentz parameter ranges (derived here: wp in [1e-6, 1e6] Eh, w0 and gamma in [0, 1e6] Eh keep eps(iu) finite)', () => {
  test('out-of-range parameters are InputErrors naming the field, in the spec and as plain data', () => {
    expect(inputErrorOf(() => parseSurfaceSpec('drude:wp=1e308,gamma=0', '--surface')).field).toBe('--surface.drude.wp');
    expect(inputErrorOf(() => parseSurfaceSpec('drude:wp=1e-9,gamma=0', '--surface')).field).toBe('--surface.drude.wp');
    expect(inputErrorOf(() => parseSurfaceSpec('drude:wp=0.5,gamma=1e300', '--surface')).field).toBe('--surface.drude.gamma');
    expect(inputErrorOf(() => parseSurfaceSpec('drude-lorentz:wp=0.5,w0=2e6,gamma=0', '--surface')).field).toBe('--surface.drude-lorentz[0].w0');
    expect(inputErrorOf(() => parseSurfaceSpec('drude:gamma=0.1', '--surface')).field).toBe('--surface.drude.wp');
    expect(inputErrorOf(() => computeSurface(H, { kind: 'drude-lorentz', form: 'drude', terms: [{ wp: 1e308, w0: 0, gamma: 0 }] })).field).toBe('surface.terms[0].wp');
    expect(parseSurfaceSpec('drude:wp=1e6,gamma=1e6')).toEqual({ kind: 'drude-lorentz', form: 'drude', terms: [{ wp: 1e6, w0: 0, gamma: 1e6 }] });
  });
  test('a Drude metal images like a conductor as u → 0 (eps(0) = ∞, McLachlan 1963): Δ = 1, never NaN, even where eps − 1 overflows', () => {
    const f = imageFactor(parseSurfaceSpec('drude:wp=1e6,gamma=0'));
    expect(f.delta(1e-200)).toBe(1); // eps − 1 = 1e12/1e-400 overflows to ∞
    expect(f.delta(0)).toBe(1);
    expectClose(imageFactor(parseSurfaceSpec('drude:wp=1,gamma=0')).delta(1), 1 / 3, 1e-15); // S = 1: Δ = 1/3 (derived here)
  });
});
