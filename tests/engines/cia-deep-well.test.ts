/**
 * Quantum Slater sum for a deep well at low temperature: orbiting resonances, quasi-bound levels in wells whose
 * bottom lies above zero energy, and barrier-top resonances must all be in the energy integral.
 *
 * Check (derived here from the Wigner–Kirkwood expansion): at fixed T and V the pair distribution is
 *   g = e^(−βV) [1 + ħ² g₂(R)/m + ħ⁴ g₄(R)/m² + …]
 * (E. Wigner, Phys. Rev. 40, 749 (1932); J. G. Kirkwood, Phys. Rev. 44, 31 (1933); quoted from memory), with
 * g₂, g₄ independent of m. The Wigner–Kirkwood block keeps the ħ² term exactly, so
 *   (quantum − WK)/WK = c₄/m² + O(1/m³):
 * scaling the reduced mass by 4 divides it by ≈ 16, by 16 divides it by ≈ 256. A mass-independent defect of the
 * quantum route (a missed resonance, a lost level) leaves a floor instead, and the ratios collapse towards 1.
 * The parameter set is INVENTED: a Tang–Toennies well of ~148 K at 6 bohr, 95 K, masses 1 u + 10 u scaled ×1, ×4, ×16.
 */
import { describe, expect, test } from 'vitest';
import { computeCia, type CiaInput } from '../../src/engines/cia/cia.js';

const C6 = 27;
const DEEP: CiaInput = {
  names: ['X', 'Y'],
  masses: [1, 10],
  massSource: 'invented',
  potential: { kind: 'tang-toennies', A: 40, b: 1.9, C6, C8: 20 * C6, C10: 420 * C6, dispersionSource: 'invented' },
  dipole: { kind: 'overlap', mu0: 5e-3, R0: 6, rho: 0.6 },
  dipoleContext: { D7: -20, dispersionSource: 'invented' },
  temperatures: [95],
  numerics: { stepFactor: 0.14, relTol: 1e-5, pwTol: 1e-6, matchPotentialKT: 1e-6 },
};

describe('deep well (~148 K) at 95 K: quantum − Wigner–Kirkwood falls like ħ⁴ ∝ 1/m²', () => {
  const runs = [1, 4, 16].map((s) => computeCia({ ...DEEP, masses: [DEEP.masses[0] * s, DEEP.masses[1] * s] }));
  const residual = runs.map((r) => Math.abs(r.temperatures[0].wignerKirkwood.M0 / r.temperatures[0].quantum.M0 - 1));

  test('the well is deep and bound pairs carry a large share of M0 (the regime of the check)', () => {
    expect(runs[0].potential.well!.depthK).toBeGreaterThan(140);
    for (const r of runs) {
      expect(r.temperatures[0].quantum.converged).toBe(true);
      expect(r.trusted).toBe(true);
      expect(r.temperatures[0].quantum.M0bound / r.temperatures[0].quantum.M0).toBeGreaterThan(0.25);
    }
  });

  test('each ×4 in mass divides (quantum − WK)/WK by more than 4^1.5 = 8 (1/m² expected: 16; ħ⁶ terms at the light end)', () => {
    expect(residual[0] / residual[1]).toBeGreaterThan(8);
    expect(residual[1] / residual[2]).toBeGreaterThan(8);
  });

  test('over ×16 in mass the residual falls as m^−p with p within 2 ± 0.25 (16^1.75 = 128 … 16^2.25 = 512)', () => {
    const ratio = residual[0] / residual[2];
    expect(ratio).toBeGreaterThan(128);
    expect(ratio).toBeLessThan(512);
  });
});
