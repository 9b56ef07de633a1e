/** The "perturbation" route: Rayleigh–Schrödinger perturbation theory in each species' local state space. */
import type { Route } from '../route.js';
import { d7 } from '../route.js';
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
    const { E5, D4a, D4b } = r.permanent;
    // spherical centres have no permanent quadrupole: their E5, D4 vanish by symmetry (pseudo-spectra leave rounding)
    const hasPermanent = !(isSpherical(A) && isSpherical(B)) && (E5 !== 0 || D4a.some((x) => x !== 0) || D4b.some((x) => x !== 0));
    return {
      name: 'perturbation',
      C6: r.C6,
      ...(r.C8 !== undefined ? { C8: r.C8 } : {}),
      ...(r.C10 !== undefined ? { C10: r.C10 } : {}),
      D7: d7(r.D7a[2], r.D7b[2]),
      D7vectors: { a: r.D7a, b: r.D7b },
      ...(hasPermanent ? { permanent: { E5, D4: d7(D4a[2], D4b[2]) } } : {}),
      // a truncation below the exact minimum changes the numbers: flag them
      converged: quanta >= requiredQuanta(power),
      notes: [
        quanta >= requiredQuanta(power)
          ? `harmonic truncation for QDOs: ${quanta} quanta per centre (exact from ${requiredQuanta(power)} up)`
          : `harmonic truncation ${quanta} is below the exact minimum ${requiredQuanta(power)}: numbers untrusted`,
        ...new Set([...speciesNotes(A), ...speciesNotes(B)]),
      ],
    };
  },
};
