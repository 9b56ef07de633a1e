/**
 * Hydrogen from first principles: the Sturmian pseudo-spectrum against exact published values, the two routes
 * (sum over product pseudo-states vs imaginary-frequency quadrature) against each other, a finite-field check
 * of B, and convergence with basis size.
 */
import { describe, expect, test } from 'vitest';
import { expectClose, relDiff } from '../helpers/tolerance.js';
import { hydrogenicSpectrum } from '../../src/engines/atoms/sturmian-spectrum.js';
import { pseudoStateResponse } from '../../src/engines/atoms/pseudo-state-response.js';
import { pseudoStateSpace } from '../../src/engines/atoms/pseudo-state-space.js';
import { finiteFieldGroundState } from '../../src/engines/atoms/finite-field.js';
import { hydrogenicBasisCheck, hydrogenicLikePair } from '../../src/engines/atoms/hydrogenic-atom.js';
import { gaussLaguerre } from '../../src/engines/atoms/laguerre-rule.js';
import { perturbationCoefficients } from '../../src/engines/perturbation/rspt.js';
import { harmonicSpace } from '../../src/engines/perturbation/harmonic-space.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';
import { drudeIsotropicResponse, drudeTensorResponse } from '../../src/engines/response/drude-response.js';
import { computePair } from '../../src/engines/pair.js';
import { drude } from '../../src/model/drude.js';
import { hydrogenic } from '../../src/model/hydrogenic.js';
import { HYDROGEN_EXACT } from '../../src/data/atom-library.js';
import type { Monomial } from '../../src/hamiltonian/monomial.js';

const H = hydrogenic({ Z: 1 }, 'H');
const spectrum = hydrogenicSpectrum(1, 10, 3);
const response = pseudoStateResponse(spectrum);

describe('hydrogen static response (exact values)', () => {
  test('the ground state is exactly 1s: E0 = −1/2 (common practice)', () => {
    expectClose(spectrum.energies[0][0], -0.5, 1e-14);
  });
  test('alpha = 9/2 (Epstein 1926), quadrupole 15 and octupole 131.25 (Yan, Babb, Dalgarno & Drake, PRA 54, 2824 (1996))', () => {
    const [a1, a2, a3] = response.statics.alpha;
    expectClose(a1, HYDROGEN_EXACT.alpha1.value, 1e-13, 0, 'alpha1');
    expectClose(a2, HYDROGEN_EXACT.alpha2.value, 1e-13, 0, 'alpha2');
    expectClose(a3, HYDROGEN_EXACT.alpha3.value, 1e-13, 0, 'alpha3');
  });
  test('B = −213/2 (Buckingham convention; Buckingham, Adv. Chem. Phys. 12, 107 (1967), from memory) by the sum over states', () => {
    expectClose(response.statics.B, -213 / 2, 1e-13);
  });
  test('gamma = 10665/8 (fourth-order Stark coefficient −3555/64 of hydrogen; Buckingham 1967, from memory)', () => {
    expectClose(response.statics.gamma, 10665 / 8, 1e-12);
  });
  test('finite field: B = lim 2<Q20>(F)/F² = −106.5, negative because the cloud stretches along the field (derived here)', () => {
    const s = hydrogenicSpectrum(1, 14, 6);
    const Bof = (F: number) => (2 * finiteFieldGroundState(s, F).Q20) / (F * F);
    const state = finiteFieldGroundState(s, 0.002);
    expect(state.Q20).toBeLessThan(0); // <r² P2> > 0: elongated along z
    const richardson = (4 * Bof(0.001) - Bof(0.002)) / 3;
    expectClose(richardson, -213 / 2, 1e-6, 0, 'finite-field B');
    // the same calculation gives alpha and gamma: E(F) = E0 − alpha F²/2 − gamma F⁴/24
    const e0 = finiteFieldGroundState(s, 0).energy;
    const A = (F: number) => (-2 * (finiteFieldGroundState(s, F).energy - e0)) / (F * F);
    expectClose((4 * A(0.002) - A(0.004)) / 3, 9 / 2, 1e-6, 0, 'finite-field alpha');
    expectClose((12 * (A(0.004) - A(0.002))) / (0.004 ** 2 - 0.002 ** 2), 10665 / 8, 2e-3, 0, 'finite-field gamma');
  });
  test('hydrogen-like scaling: alpha ∝ Z^-4, B ∝ Z^-8, C6 ∝ Z^-6 (common practice: r → r/Z, E → Z² E)', () => {
    const r2 = pseudoStateResponse(hydrogenicSpectrum(2, 10, 3));
    expectClose(r2.statics.alpha[0], 4.5 / 16, 1e-13);
    expectClose(r2.statics.B, -106.5 / 256, 1e-12);
    expectClose(hydrogenicLikePair(2, 10).C6, hydrogenicLikePair(1, 10).C6 / 64, 1e-12);
  });
});

describe('hydrogen pairs: perturbation and response routes', () => {
  const pert = perturbationCoefficients(pseudoStateSpace(spectrum), pseudoStateSpace(spectrum), { maxEnergyPower: 10 });
  const resp = isotropicResponseCoefficients(response, response);
  test('H–H C6, C8, C10 (Yan, Babb, Dalgarno & Drake, PRA 54, 2824 (1996))', () => {
    for (const r of [{ C6: pert.C6, C8: pert.C8!, C10: pert.C10! }, resp]) {
      expectClose(r.C6, HYDROGEN_EXACT.C6.value, 1e-10, 0, 'C6');
      expectClose(r.C8, HYDROGEN_EXACT.C8.value, 1e-10, 0, 'C8');
      expectClose(r.C10, HYDROGEN_EXACT.C10.value, 1e-9, 0, 'C10'); // the reference has 10 digits
    }
  });
  test('H–H D7: the two routes agree, D7.a = −D7.b < 0 (derived here: like atoms polarise toward each other)', () => {
    expect(relDiff(pert.D7a[2], resp.D7a)).toBeLessThan(1e-12);
    expect(relDiff(pert.D7b[2], resp.D7b)).toBeLessThan(1e-12);
    expect(pert.D7a[2]).toBeLessThan(0);
    expectClose(pert.D7a[2] + pert.D7b[2], 0, 0, 1e-11);
    expect(Math.abs(pert.D7a[0]) + Math.abs(pert.D7a[1])).toBeLessThan(1e-12);
  });
  test('H–QDO: C6, C8, C10 and D7 agree between the routes', () => {
    const q = drude({ q: 1.2, m: 0.4, w: 0.9 }, 'q');
    const p = perturbationCoefficients(pseudoStateSpace(spectrum), harmonicSpace(q, 5), { maxEnergyPower: 10 });
    const r = isotropicResponseCoefficients(response, drudeIsotropicResponse(q));
    expect(relDiff(p.C6, r.C6)).toBeLessThan(1e-12);
    expect(relDiff(p.C8!, r.C8)).toBeLessThan(1e-12);
    expect(relDiff(p.C10!, r.C10)).toBeLessThan(1e-12);
    expect(relDiff(p.D7a[2], r.D7a)).toBeLessThan(1e-12);
    expect(relDiff(p.D7b[2], r.D7b)).toBeLessThan(1e-12);
  });
  test('computePair on H–H and H–QDO: trusted, perturbation is the reference, spread below 1e-9', () => {
    for (const other of [H, drude({ q: 0.8, m: 0.7, w: 0.5 }, 'q')]) {
      const pair = computePair(H, other);
      expect(pair.routes.map((r) => r.name)).toEqual(['perturbation', 'response']);
      expect(pair.trusted).toBe(true);
      expect(pair.spread.max).toBeLessThan(1e-9);
      expect(pair.warnings).toEqual([]);
    }
  });
});

describe('B(0; iu, −iu): definition and frequency dependence', () => {
  test('for a QDO, ∂χ_{M_z,Q20}(iu)/∂F equals the closed form B w²/(w² + u²) of drude-response.ts (derived here)', () => {
    const q = drude({ q: 1.3, m: 0.6, w: 0.8 }, 'q');
    const t = drudeTensorResponse(q), iso = drudeIsotropicResponse(q);
    const z: Monomial = [0, 0, 1];
    for (const u of [0, 0.3, 1.7]) {
      // Q20 = (3z² − r²)/2 per unit charge: combine the Cartesian second moments
      const dQ = t.dChiDFz(z, [0, 0, 2], u) - 0.5 * (t.dChiDFz(z, [2, 0, 0], u) + t.dChiDFz(z, [0, 2, 0], u));
      expectClose(dQ, iso.hyperB(u), 1e-13, 0, `u=${u}`);
    }
  });
  test('hydrogen: B(0; iu, −iu) falls off faster than B·alpha(iu)/alpha(0): the static-B approximation overestimates |D7.a(H–H)| by 17.0% (reported in README)', () => {
    const approx = { ...response, hyperB: (u: number) => (response.statics.B * response.alpha(1, u)) / response.alpha(1, 0) };
    const exact = isotropicResponseCoefficients(response, response).D7a;
    const rough = isotropicResponseCoefficients(approx, response).D7a;
    expectClose(rough / exact - 1, 0.1696, 0, 5e-4, 'relative error of the approximation');
    expect(response.hyperB(2) / approx.hyperB(2)).toBeLessThan(0.5);
  });
});

describe('basis convergence', () => {
  test('C6 and C8 of H–H approach Yan et al. exponentially: basis 7 within 1e-8, basis 10 within 1e-10; the check reports both sizes', () => {
    const c7 = hydrogenicLikePair(1, 7), c10 = hydrogenicLikePair(1, 10);
    const e7 = relDiff(c7.C6, HYDROGEN_EXACT.C6.value), e10 = relDiff(c10.C6, HYDROGEN_EXACT.C6.value);
    expect(e7).toBeLessThan(1e-8);
    expect(e7).toBeGreaterThan(1e-10); // visibly unconverged at 7 functions
    expect(e10).toBeLessThan(1e-10);
    expect(relDiff(c10.C8, HYDROGEN_EXACT.C8.value)).toBeLessThan(1e-10);
    const check = hydrogenicBasisCheck(H);
    expect(check.coarse.basis).toBe(7);
    expect(check.fine.basis).toBe(10);
    expectClose(check.change.C6, relDiff(c7.C6, c10.C6), 1e-12);
    expect(check.change.D7a).toBeLessThan(1e-8);
  });
  test('the perturbation route at basis 7 and 10: D7.a changes by less than 1e-8 (the routes agree at each size)', () => {
    const d = (n: number) => {
      const s = pseudoStateSpace(hydrogenicSpectrum(1, n, 3));
      return perturbationCoefficients(s, s, { maxEnergyPower: 8 }).D7a[2];
    };
    expect(relDiff(d(7), d(10))).toBeLessThan(1e-8);
  });
  test('Gauss–Laguerre rule: ∫ x^k e^{-x} dx = k! exactly for k ≤ 2M − 1 (common practice)', () => {
    const rule = gaussLaguerre(20);
    for (const k of [0, 1, 5, 17, 39]) {
      let s = 0;
      for (let i = 0; i < 20; i++) s += rule.scaledWeights[i] * Math.exp(-rule.nodes[i]) * rule.nodes[i] ** k;
      let f = 1;
      for (let j = 2; j <= k; j++) f *= j;
      expectClose(s, f, 1e-12, 0, `k=${k}`);
    }
  });
});
