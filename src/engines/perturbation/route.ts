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
    const quanta = options.maxQuanta ?? requiredQuanta(power);
    const r = perturbationCoefficients(localSpaceOf(A, quanta), localSpaceOf(B, quanta), { maxEnergyPower: power });
    // spherical centres have no permanent quadrupole: their E5, D4 vanish by symmetry (pseudo-spectra leave rounding)
    return vectorRouteResult('perturbation', r, {
      spherical: isSpherical(A) && isSpherical(B),
      // a truncation below the exact minimum changes the numbers: flag them
      converged: quanta >= requiredQuanta(power),
      notes: [
        ...(A.kind === 'drude' || B.kind === 'drude'
          ? [
              quanta >= requiredQuanta(power)
                ? `harmonic truncation for QDOs: ${quanta} quanta per centre (exact from ${requiredQuanta(power)} up)`
                : `harmonic truncation ${quanta} is below the exact minimum ${requiredQuanta(power)}: numbers untrusted`,
            ]
          : []),
        ...new Set([...speciesNotes(A), ...speciesNotes(B)]),
      ],
    });
  },
};
