/** The "perturbation" route: Rayleigh–Schrödinger perturbation theory in each species' local state space. */
import type { Route } from '../route.js';
import { vectorRouteResult } from '../route.js';
import { hasLocalSpace, isSpherical, localSpaceOf, speciesNotes } from '../capabilities.js';
import { perturbationCoefficients, requiredQuanta } from './rspt.js';

export const perturbationRoute: Route = {
  name: 'perturbation',
  summary: 'Rayleigh–Schrödinger perturbation theory in a product basis (exact for QDOs)',
  unsupported(A, B) {
    for (const s of [A, B]) if (!hasLocalSpace(s)) return `${s.name} has response functions only, no state space for perturbation theory`;
    return null;
  },
  run(A, B, options) {
    const power = options.maxEnergyPower ?? 10;
    const need = requiredQuanta(power, 9);
    const quanta = options.maxQuanta ?? need;
    const centres = [isSpherical(A), isSpherical(B)] as const;
    const spherical = centres[0] && centres[1];
    // spherical centres have no permanent moments: their first-order terms vanish by symmetry (not computed)
    const r = perturbationCoefficients(localSpaceOf(A, quanta), localSpaceOf(B, quanta), { maxEnergyPower: power, maxDipolePower: 9, spherical: centres });
    return vectorRouteResult('perturbation', r, {
      spherical,
      // a truncation below the exact minimum changes the numbers: flag them
      converged: quanta >= need,
      notes: [
        ...(A.kind === 'drude' || B.kind === 'drude'
          ? [
              quanta >= need
                ? `harmonic truncation for QDOs: ${quanta} quanta per centre (exact from ${need} up, D9 included)`
                : `harmonic truncation ${quanta} is below the exact minimum ${need}: numbers untrusted`,
            ]
          : []),
        `D9 from the second-order chain${spherical ? ' V3×V4 (V2×V5 vanishes for spherical centres)' : 's V2×V5 and V3×V4'}: complete at R^-9 (first and third order give no R^-9 dipole for centres even under inversion)`,
        ...(spherical ? [] : ['first-order terms E5, E7, D4, D6, D8 from the permanent moments (complete through E R^-8 and mu R^-9)']),
        ...new Set([...speciesNotes(A), ...speciesNotes(B)]),
      ],
    });
  },
};
