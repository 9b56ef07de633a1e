/**
 * Closed-shell atoms from first principles (src/engines/atoms/hartree-fock/): restricted Hartree–Fock ground
 * states, time-dependent (coupled) Hartree–Fock alpha_l(iu) and the quadratic-response B(0; iu, −iu), checked
 * against exact one-electron results, Hartree–Fock-limit literature values, an independent finite-field
 * Hartree–Fock calculation, and the shipped data regenerated from scratch.
 */
import { describe, expect, test } from 'vitest';
import { expectClose, relDiff } from '../helpers/tolerance.js';
import { computeTdhfAtom, tdhfBasis } from '../../src/engines/atoms/hartree-fock/atom-response.js';
import { finiteFieldStatics } from '../../src/engines/atoms/hartree-fock/finite-field.js';
import { finiteFieldHyperB } from '../../src/engines/atoms/hartree-fock/finite-field-response.js';
import { OrbitalPotentials } from '../../src/engines/atoms/hartree-fock/orbital-potentials.js';
import { polarisability } from '../../src/engines/atoms/hartree-fock/linear-response.js';
import { hyperpolarisabilityB, quadraticSetup } from '../../src/engines/atoms/hartree-fock/quadratic-response.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';
import type { IsotropicResponse } from '../../src/engines/response/response-model.js';
import { pseudoStateResponse } from '../../src/engines/atoms/pseudo-state-response.js';
import { hydrogenicSpectrum } from '../../src/engines/atoms/sturmian-spectrum.js';
import { ATOM_LIBRARY, HYDROGEN_EXACT } from '../../src/data/atom-library.js';
import { TDHF_ATOMS } from '../../src/data/tdhf-atoms.js';
import { tdhfAtomRecord } from '../../src/data/generate-tdhf-atoms.js';
import type { RankResponse } from '../../src/engines/atoms/hartree-fock/linear-response.js';

/** (3/π)∫α_A α_B du = (3/2) Σ_ij f_i f_j / (ω_i ω_j (ω_i + ω_j)) for pseudo-spectra (Casimir–Polder; common practice). */
function c6(a: RankResponse, b: RankResponse): number {
  let s = 0;
  for (let i = 0; i < a.n; i++) for (let j = 0; j < b.n; j++) s += (a.f[i] * b.f[j]) / (a.omega[i] * b.omega[j] * (a.omega[i] + b.omega[j]));
  return 1.5 * s;
}

const library = (symbol: string) => ATOM_LIBRARY.find((a) => a.symbol === symbol)!;

describe('one electron: the engine without two-electron terms reproduces exact hydrogen', () => {
  const H = computeTdhfAtom(1, 0, 16, { grid: [0, 0.5, 2] });
  const exact = pseudoStateResponse(hydrogenicSpectrum(1, 20, 3));
  test('ground state E = −1/2 (common practice) and alpha_1 = 9/2, alpha_2 = 15, alpha_3 = 131.25 (Epstein 1926; Yan et al., PRA 54, 2824 (1996))', () => {
    expect(H.converged).toBe(true);
    expectClose(H.atom.energy, -0.5, 1e-9, 0, 'E');
    expectClose(H.statics.alpha[0], HYDROGEN_EXACT.alpha1.value, 1e-6, 0, 'alpha1');
    expectClose(H.statics.alpha[1], HYDROGEN_EXACT.alpha2.value, 1e-5, 0, 'alpha2');
    expectClose(H.statics.alpha[2], HYDROGEN_EXACT.alpha3.value, 1e-3, 0, 'alpha3 (basis-limited)');
  });
  test('B = −213/2 by quadratic response (Buckingham, Adv. Chem. Phys. 12, 107 (1967), quoted from memory)', () => {
    expectClose(H.statics.B, HYDROGEN_EXACT.B.value, 1e-5, 0, 'B(0)');
  });
  test('B(0; iu, −iu) at u = 0.5 and 2 equals the exact sum over Sturmian pseudo-states (derived here; independent code)', () => {
    expectClose(H.response.B[1], exact.hyperB(0.5), 1e-5, 0, 'B(0.5)');
    expectClose(H.response.B[2], exact.hyperB(2), 1e-5, 0, 'B(2)');
  });
  test('H–H C6 = 6.4990267 (Yan et al., PRA 54, 2824 (1996))', () => {
    expectClose(c6(H.ranks[0], H.ranks[0]), HYDROGEN_EXACT.C6.value, 1e-6, 0, 'C6');
  });
});

describe('shipped Hartree–Fock atoms against the Hartree–Fock limit', () => {
  // Numerical Hartree–Fock energies: C. F. Bunge, J. A. Barrientos, A. V. Bunge, J. A. Cogordan, "Hartree-Fock and
  // Roothaan-Hartree-Fock energies for the ground states of He through Xe", Phys. Rev. A 46, 3691 (1992), which
  // reports 10-digit numerical HF energies (title, authors, volume and page checked; the table entries are quoted
  // from memory). The digits agree with the HF-limit references -2.861679995612, -128.547098109 and -526.817512803
  // carried by independent numerical-HF programs.
  test.each([
    ['He', -2.861679996, 1e-8],
    ['Ne', -128.547098109, 1e-6],
    ['Ar', -526.817513, 2e-6],
  ])('%s: total energy %f Eh (Bunge et al. 1992)', (symbol, energy, tol) => {
    expectClose(TDHF_ATOMS[symbol].energy, energy, 0, tol, `${symbol} energy`);
  });
  // Coupled (time-dependent at u = 0) Hartree–Fock-limit static polarisabilities, to the digits quoted:
  // He 1.3222, Ne 2.3767, Ar 10.76 (quoted from memory, as widely tabulated for the coupled Hartree–Fock method;
  // no published table with these digits was found when the sources were checked, so they remain unconfirmed).
  test.each([
    ['He', 1.3222, 5e-5],
    ['Ne', 2.3767, 5e-5],
    ['Ar', 10.76, 5e-3],
  ])('%s: static alpha %f at the Hartree–Fock limit', (symbol, alpha, tol) => {
    expectClose(TDHF_ATOMS[symbol].alpha1[0], alpha, 0, tol, `${symbol} alpha`);
  });
  test('the correlation error is reported, not hidden: TDHF alpha and C6 of He are 4.4 % and 5.8 % below the exact values (Yan et al. 1996)', () => {
    const he = TDHF_ATOMS.He;
    const alphaError = he.alpha1[0] / library('He').alpha.value - 1;
    expect(alphaError).toBeGreaterThan(-0.046);
    expect(alphaError).toBeLessThan(-0.043);
  });
  test('dipole Thomas–Reiche–Kuhn sum rule Σf = N holds in the TDHF pseudo-spectrum (common practice: RPA conserves it)', () => {
    for (const symbol of ['He', 'Ne']) expect(TDHF_ATOMS[symbol].convergence).toMatch(new RegExp(`Σf = ${TDHF_ATOMS[symbol].electrons}\\.0000`));
  });
});

describe('helium at the time-dependent Hartree–Fock level', () => {
  const he = computeTdhfAtom(2, 0, 12, { grid: [0] });
  test('He–He C6 = 1.376 at the TDHF level (TDHF column of J. Toulouse, E. Rebolini, T. Gould, J. F. Dobson, P. Seal, J. G. Ángyán, J. Chem. Phys. 138, 194106 (2013), arXiv:1305.0107; authors and TDHF comparison checked, the He entry and the journal page quoted from memory) vs exact 1.460978 (Yan et al. 1996): 5.8 % correlation error', () => {
    const C6 = c6(he.ranks[0], he.ranks[0]);
    expectClose(C6, 1.376, 1e-3, 0, 'C6 TDHF');
    expectClose(C6 / library('He').C6.value - 1, -0.058, 0, 0.002, 'correlation error of C6');
  });
  test('static B: −6.58 against the correlated −7.327 (D. M. Bishop, J. Pipin, J. Chem. Phys. 91, 3549 (1989), helium hyperpolarizabilities; the B entry quoted from memory); expected |B_HF| about (alpha_HF/alpha_exact)² ≈ 0.914 of the correlated value (derived here from B ∝ alpha² at fixed excitation energy), observed 0.898', () => {
    const ratio = he.statics.B / library('He').B!.value;
    expect(ratio).toBeGreaterThan(0.88);
    expect(ratio).toBeLessThan(0.93);
  });
  test('finite-field Hartree–Fock (axial SCF in a field, no response code) gives the same static alpha and B', () => {
    const ff = finiteFieldStatics(2, 2, tdhfBasis(2, 12, 2), 0.01);
    expectClose(ff.alpha, he.statics.alpha[0], 2e-6, 0, 'alpha finite field vs response');
    expectClose(ff.B, he.statics.B, 5e-4, 0, 'B finite field vs response');
  });
});

describe('D7 by a route that does not share the quadratic-response code', () => {
  test('He–He D7.a: B(0; iu, −iu) from the TDHF cross response of the field-polarised atom (finite difference in F) agrees with the 2n+1 quadratic response to 1e-5', () => {
    const he = computeTdhfAtom(2, 0, 12, { withB: false });
    const pots = new OrbitalPotentials(he.atom);
    const q = quadraticSetup(he.atom, pots, he.ranks[0], he.ranks[1], 2);
    const alpha = (l: 1 | 2 | 3, u: number) => polarisability(he.ranks[l - 1], u);
    const scale = he.ranks[0].omega[0];
    const Bff = finiteFieldHyperB(2, 2, tdhfBasis(2, 12, 2));
    const viaField: IsotropicResponse = { alpha, hyperB: Bff, scale };
    const viaQuadratic: IsotropicResponse = { alpha, hyperB: (u) => hyperpolarisabilityB(q, u).B, scale };
    const d7Field = isotropicResponseCoefficients(viaField, viaQuadratic, { relTol: 1e-9 }).D7a;
    const d7Response = isotropicResponseCoefficients(viaQuadratic, viaQuadratic, { relTol: 1e-9 }).D7a;
    expectClose(d7Field, d7Response, 1e-5, 0, 'D7.a finite field vs quadratic response');
    expectClose(Bff(0.5), hyperpolarisabilityB(q, 0.5).B, 1e-5, 0, 'B(0; 0.5i, −0.5i)');
  });
});

describe('the shipped data regenerate from scratch (src/data/generate-tdhf-atoms.ts)', () => {
  test.each(['He', 'Ne'])('%s', (symbol) => {
    const fresh = tdhfAtomRecord(symbol);
    const shipped = TDHF_ATOMS[symbol];
    expect(fresh.u.length).toBe(shipped.u.length);
    for (const key of ['u', 'alpha1', 'alpha2', 'alpha3', 'B'] as const)
      fresh[key].forEach((v, k) => expect(relDiff(v, shipped[key][k]), `${symbol} ${key}[${k}]`).toBeLessThan(1e-9));
    expectClose(fresh.energy, shipped.energy, 1e-11, 0, 'energy');
  });
});
