/**
 * The "force-balance" surface route for a QDO: in any eigenstate the mean force on the Drude particle vanishes
 * (Ehrenfest; Hellmann–Feynman for a displacement), k_c <x_c> = −<∂W/∂x_c>, with W the image potential of the
 * Drude particle and the core (image-hamiltonian.ts; a one-particle polynomial for a QDO) times the image factor Δ
 * of an instantaneous surface. At order Z⁻⁴ the right side is the uncoupled Gaussian mean of the cubic W_3
 * (∂W_2/∂x is linear, so its mean is O(<x>) = O(Z⁻⁴) and enters only at Z⁻⁷):
 *   <x_c>^(4) = −Δ <∂W_3/∂x_c>_0 / k_c,   mu = −q <r>,
 * and the energies are Gaussian means, C3 = −Δ<W_2>_0, C5 = −Δ<W_4>_0 (derived here; Gaussian moments from
 * harmonic-polynomial.ts). For an isotropic QDO in front of a conductor this gives (derived here)
 *   C3 = q²/(8 m w),   C5 = 3 q²/(16 m² w²),   D4 = 3 q³/(8 m² w³).
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { Species } from '../../model/species.js';
import type { SurfaceSpec } from '../../model/surface-spec.js';
import type { Vec3 } from '../../model/types.js';
import { derivative, groundMean, pairKey, type HarmonicPair, type Poly6 } from '../force-balance/harmonic-polynomial.js';
import { imageFactor } from './image-factor.js';
import { imagePolynomial } from './image-hamiltonian.js';
import { instantaneousResult, unitNormal, type SurfaceRoute, type SurfaceRouteOptions, type SurfaceRouteResult } from './surface-route.js';

/** The image potential W_n of a QDO as a polynomial in its Drude coordinates (the first three of a Poly6). */
function imagePoly6(order: number, s: DrudeSpecies, normal: Vec3): Poly6 {
  const out: Poly6 = new Map();
  for (const t of imagePolynomial(order, s.q, normal).values()) {
    const k = pairKey(t.p, [0, 0, 0]);
    out.set(k, (out.get(k) ?? 0) + t.c);
  }
  return out;
}

/** C3, C5, D4 vector (species axes) of a QDO in front of a conductor (Δ = 1), by force balance; atomic units. */
export function forceBalanceSurfaceCoefficients(s: DrudeSpecies, normal: Vec3 = [0, 0, 1]): { C3: number; C5: number; D4vector: Vec3 } {
  // the second oscillator of the pair reference is a spectator (unit mass and frequency, never excited)
  const h: HarmonicPair = { mass: [s.m, s.m, s.m, 1, 1, 1], w: [...s.w, 1, 1, 1] };
  const W3 = imagePoly6(3, s, normal);
  const D4vector = [0, 1, 2].map((c) => {
    const x = -groundMean(derivative(W3, c), h) / (s.m * s.w[c] * s.w[c]);
    return -s.q * x;
  }) as Vec3;
  return { C3: -groundMean(imagePoly6(2, s, normal), h), C5: -groundMean(imagePoly6(4, s, normal), h), D4vector };
}

export const forceBalanceSurfaceRoute: SurfaceRoute = {
  name: 'force-balance',
  summary: 'mean force on the Drude particle from the image field vanishes (QDOs, instantaneous images)',
  unsupported(s: Species, surface: SurfaceSpec) {
    if (s.kind !== 'drude') return `${s.name} is not a quantum Drude oscillator: force balance needs a harmonic centre`;
    if (!imageFactor(surface).instantaneous) return 'force balance on the image field needs a frequency-independent image factor (conductor or constant eps)';
    return null;
  },
  run(s: Species, surface: SurfaceSpec, options: SurfaceRouteOptions): SurfaceRouteResult {
    if (s.kind !== 'drude') throw new Error(`${s.name} is not a QDO`);
    const n = unitNormal(options);
    const delta = imageFactor(surface).delta(0);
    return instantaneousResult('force-balance', forceBalanceSurfaceCoefficients(s, n), delta, n, {
      converged: true,
      notes: ['exact Gaussian means of the image potential: C3, C5 at first order, D4 from the mean image force on the Drude particle'],
    });
  },
};
