/**
 * The "perturbation" surface route: Rayleigh–Schrödinger perturbation theory in the atom's own state space
 * (harmonic states of a QDO, the Sturmian pseudo-states of a one-electron atom) with the image Hamiltonian
 * W = Σ_n W_n / Z^(n+1) of image-hamiltonian.ts, multiplied by the image factor Δ of an instantaneous surface
 * (a conductor, Δ = 1, or a constant eps, Δ = (eps − 1)/(eps + 1); each image charge scales by Δ, J. D. Jackson,
 * Classical Electrodynamics, 3rd ed. 1999, §4.4). W is a two-body operator of the atom (the products M_pA M_pB act
 * on the same electrons), applied as two moment actions in the local space.
 *   first order:  E ∋ Δ <0|W_2|0>/Z³ + Δ <0|W_4|0>/Z⁵,  so C3 = −Δ<0|W_2|0>, C5 = −Δ<0|W_4|0>
 *   first-order dipole (Z⁻⁴): <M_k> = −2Δ <0|M_k R0 W_3|0>,  R0 = Q(H0 − E0)⁻¹Q
 * (standard RSPT, e.g. J. O. Hirschfelder, W. B. Brown, S. T. Epstein, Adv. Quantum Chem. 1, 255 (1964)).
 * <0|W_3|0> vanishes for centrosymmetric atoms (all kinds here). For a QDO a truncation at 4 quanta is exact
 * (W_4|0> reaches 4 quanta); for the pseudo-state basis the moments act through the basis's resolution of the
 * identity, exact when the basis holds r^k|0> (Sturmian functions do).
 */
import type { Species } from '../../model/species.js';
import type { SurfaceSpec } from '../../model/surface-spec.js';
import type { Vec3 } from '../../model/types.js';
import { AXIS_MONOMIALS } from '../../hamiltonian/monomial.js';
import { hasLocalSpace, localSpaceOf, speciesNotes } from '../capabilities.js';
import type { LocalSpace } from '../perturbation/local-space.js';
import { imageFactor } from './image-factor.js';
import { imageTerms, type ImageTerm } from './image-hamiltonian.js';
import { instantaneousResult, unitNormal, type SurfaceRoute, type SurfaceRouteOptions, type SurfaceRouteResult } from './surface-route.js';

type Vector = Map<number, number>;

/** Σ c M_pA M_pB |v> in the local space. */
export function applyImageOperator(terms: readonly ImageTerm[], v: Vector, space: LocalSpace): Vector {
  const out: Vector = new Map();
  for (const t of terms) {
    const inner: Vector = new Map();
    for (const [i, a] of v) {
      const e = space.applyMoment(t.pB, i);
      for (let j = 0; j < e.states.length; j++) inner.set(e.states[j], (inner.get(e.states[j]) ?? 0) + a * e.amps[j]);
    }
    for (const [i, a] of inner) {
      const e = space.applyMoment(t.pA, i);
      const ca = t.c * a;
      for (let j = 0; j < e.states.length; j++) out.set(e.states[j], (out.get(e.states[j]) ?? 0) + ca * e.amps[j]);
    }
  }
  return out;
}

/** C3, C5 and the D4 vector (species axes) of a local space in front of a conductor (Δ = 1), atomic units. */
export function perturbationSurfaceCoefficients(space: LocalSpace, normal: Vec3 = [0, 0, 1]): { C3: number; C5: number; D4vector: Vec3 } {
  const ground: Vector = new Map([[0, 1]]);
  const mean = (order: number) => applyImageOperator(imageTerms(order, normal), ground, space).get(0) ?? 0;
  const w3 = applyImageOperator(imageTerms(3, normal), ground, space);
  const phi: Vector = new Map(); // R0 W3 |0>
  for (const [i, a] of w3) if (i !== 0) phi.set(i, a / space.excitation(i));
  const D4vector = AXIS_MONOMIALS.map((p) => {
    const e = space.applyMoment(p, 0);
    let s = 0;
    for (let j = 0; j < e.states.length; j++) s += e.amps[j] * (phi.get(e.states[j]) ?? 0);
    return -2 * s;
  }) as Vec3;
  return { C3: -mean(2), C5: -mean(4), D4vector };
}

export const perturbationSurfaceRoute: SurfaceRoute = {
  name: 'perturbation',
  summary: 'first-order Rayleigh–Schrödinger perturbation theory with the image Hamiltonian in the atom’s state space',
  unsupported(s: Species, surface: SurfaceSpec) {
    if (!hasLocalSpace(s)) return `${s.name} has response functions only, no state space for perturbation theory`;
    if (!imageFactor(surface).instantaneous) return 'the image Hamiltonian needs a frequency-independent image factor (conductor or constant eps)';
    return null;
  },
  run(s: Species, surface: SurfaceSpec, options: SurfaceRouteOptions): SurfaceRouteResult {
    const n = unitNormal(options);
    const quanta = options.maxQuanta ?? 4;
    const delta = imageFactor(surface).delta(0);
    const r = perturbationSurfaceCoefficients(localSpaceOf(s, quanta), n);
    return instantaneousResult('perturbation', r, delta, n, {
      converged: s.kind !== 'drude' || quanta >= 4,
      notes: [
        ...(s.kind === 'drude'
          ? [quanta >= 4 ? `harmonic truncation ${quanta} quanta (exact from 4 up)` : `harmonic truncation ${quanta} is below the exact minimum 4: numbers untrusted`]
          : []),
        ...speciesNotes(s),
      ],
    });
  },
};
