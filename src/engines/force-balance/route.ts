/**
 * The "force-balance" route: induced dipoles from the vanishing mean force on each Drude particle, in the exactly
 * harmonic dipole-coupled reference (see pair-force-balance.ts). Harmonic centres (QDOs) only.
 */
import type { Species } from '../../model/species.js';
import type { DrudeSpecies } from '../../model/drude.js';
import type { Route, RouteResult } from '../route.js';
import { vectorRouteResult } from '../route.js';
import { isSpherical } from '../capabilities.js';
import { forceBalanceCoefficients } from './pair-force-balance.js';

/** The species as a harmonic centre, or the reason it is not one. */
function harmonicCentre(s: Species): DrudeSpecies | string {
  switch (s.kind) {
    case 'drude':
      return s;
    default:
      return `${(s as Species).name} is not a quantum Drude oscillator: force balance needs a harmonic centre`;
  }
}

export const forceBalanceRoute: Route = {
  name: 'force-balance',
  summary: 'mean force on each Drude particle vanishes, in the exactly harmonic dipole-coupled reference (QDOs only)',
  unsupported(A, B) {
    for (const s of [A, B]) {
      const c = harmonicCentre(s);
      if (typeof c === 'string') return c;
    }
    return null;
  },
  run(A, B, options): RouteResult {
    const a = harmonicCentre(A), b = harmonicCentre(B);
    if (typeof a === 'string' || typeof b === 'string') throw new Error(this.unsupported(A, B) ?? 'force-balance route unavailable');
    const power = options.maxEnergyPower ?? 10;
    const r = forceBalanceCoefficients(a, b, power);
    return vectorRouteResult('force-balance', r, {
      spherical: isSpherical(A) && isSpherical(B),
      converged: true,
      notes: [
        'exact Gaussian means: C6 from the coupled normal modes, C8 and C10 from Dalgarno–Lewis functions, D7 and D4 by force balance',
      ],
    });
  },
};
