/**
 * The "response" surface route: quadrature over imaginary frequency of the atom's response functions weighted by
 * the surface's image factor Δ(iu) = (eps(iu) − 1)/(eps(iu) + 1) (non-retarded; A. D. McLachlan, Mol. Phys. 6,
 * 423 (1963); Δ = 1 for a conductor).
 *
 * General (Cartesian) form, derived here. The image energy at first order in the image Hamiltonian
 * W_n = Σ c M_pA M_pB (image-hamiltonian.ts) is Σ c <0|M_pA M_pB|0>, and
 *   <0|M_pA M_pB|0> = Σ_{k≠0} <0|M_pA|k><k|M_pB|0> + <M_pA><M_pB> = (1/π) ∫_0^∞ χ_{pA,pB}(iu) du + <M_pA><M_pB>
 * (∫_0^∞ 2ω/(ω² + u²) du = π). The fluctuating part is imaged at each frequency with Δ(iu), the permanent part
 * with the static Δ(0):
 *   E_n(F) = Σ c [ (1/π) ∫ χ_{pA,pB}(iu; F) Δ(iu) du + Δ(0) <M_pA>_F <M_pB>_F ],   C3 = −E_2, C5 = −E_4,
 * and the dipole along axis k is −∂E_3/∂F_k for a static field F_k on the atom (H → H − F_k M_k):
 *   D4_k = −Σ c [ (1/π) ∫ ∂_k χ_{pA,pB}(iu) Δ(iu) du + Δ(0) (χ_{pA,M_k}(0) <M_pB> + <M_pA> χ_{pB,M_k}(0)) ].
 *
 * Spherical atoms (derived here from the general form): <M_pA M_pB> pairs only equal multipole orders l, and the
 * coupling tensors are traceless, so with the 2^l-pole alpha_l(iu) and Buckingham's B(0; iu, −iu) (whose
 * field derivative of the dipole–quadrupole response is ∂χ_{μa, r_c r_d}/∂F_z = (B/2)(δ_ac δ_zd + δ_ad δ_zc) + trace)
 *   C3 = (1/4π) ∫ alpha_1(iu) Δ(iu) du,     C5 = (1/4π) ∫ alpha_2(iu) Δ(iu) du,
 *   D4 = −(3/8π) ∫ B(0; iu, −iu) Δ(iu) du.
 * C3 is the classic result (E. Zaremba, W. Kohn, Phys. Rev. B 13, 2270 (1976), after E. M. Lifshitz; for a conductor
 * the image result C3 = <μ² + μ_z²>/16, = <μ²>/12 for a spherical atom and <r²>/12 for one electron, of
 * J. E. Lennard-Jones, Trans. Faraday Soc. 28, 333 (1932); both quoted from memory), and C5 is its quadrupole
 * analogue (X.-P. Jiang, F. Toigo, M. W. Cole, Surf. Sci. 145, 281 (1984), quoted from memory; the prefactor 1/4π
 * derived here). The D4 prefactor: with W_3 = Σ κ M_a M_cd
 * (one dipole, one second moment per term), D4 = −(1/π) ∫ (B/2) T Δ du, T = Σ κ (δ_ac δ_zd + δ_ad δ_zc) = 3/4 over
 * the nine W_3 terms (the trace parts cancel: the couplings are traceless), so −3/(8π). It also follows
 * from W_3 = (3/32) q² z (z² + r²) of a one-particle centre and B = −2q³/(m²w⁴), B(iu) = B w²/(w² + u²) of a QDO:
 * the closed form D4 = 3q³/(8m²w³) = −(3/16) B w = −(3/8π) ∫ B w²/(w² + u²) du; the tests confirm it for hydrogen
 * (exact D4 = 99/16) and against the Cartesian form. B < 0 for atoms, so D4 > 0: the dipole points away from the
 * surface (the electrons are drawn towards their images).
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { Species } from '../../model/species.js';
import type { SurfaceSpec } from '../../model/surface-spec.js';
import type { Vec3 } from '../../model/types.js';
import { AXIS_MONOMIALS, type Monomial } from '../../hamiltonian/monomial.js';
import { integrateSemiInfinite } from '../../math/semi-infinite-quadrature.js';
import { isotropicResponseOf, responsePowerLimit, speciesNotes, tensorResponseOf } from '../capabilities.js';
import { drudeTensorResponse } from '../response/drude-response.js';
import type { IsotropicResponse, TensorResponse } from '../response/response-model.js';
import { imageFactor, type ImageFactor } from './image-factor.js';
import { imageTerms } from './image-hamiltonian.js';
import { alongNormal, unitNormal, type SurfaceRoute, type SurfaceRouteOptions, type SurfaceRouteResult } from './surface-route.js';

/** Coefficients with quadrature error estimates (atomic units). */
export interface ResponseSurfaceCoefficients {
  C3: number;
  C5: number;
  D4vector: Vec3;
  error: { C3: number; C5: number; D4: number };
  converged: boolean;
  evaluations: number;
}

const mapScale = (atom: number, f: ImageFactor) => (f.scale === undefined ? atom : Math.sqrt(atom * f.scale));

/** Spherical atom: C3, C5, D4 by the three isotropic integrals (module comment). D4vector along `normal`. */
export function isotropicSurfaceCoefficients(r: IsotropicResponse, f: ImageFactor, normal: Vec3, relTol = 1e-13): ResponseSurfaceCoefficients {
  const out = new Float64Array(3);
  const q = integrateSemiInfinite(
    (u) => {
      const d = f.delta(u);
      out[0] = (r.alpha(1, u) * d) / (4 * Math.PI);
      out[1] = (r.alpha(2, u) * d) / (4 * Math.PI);
      out[2] = (-3 / (8 * Math.PI)) * r.hyperB(u) * d;
      return out;
    },
    3,
    { scale: mapScale(r.scale, f), relTol },
  );
  const [C3, C5, D4] = q.value;
  return {
    C3,
    C5,
    D4vector: normal.map((x) => x * D4) as Vec3,
    error: { C3: q.error[0], C5: q.error[1], D4: q.error[2] },
    converged: q.converged,
    evaluations: q.evaluations,
  };
}

/**
 * ∂χ/∂F_k for a QDO along any axis: the species with its axes permuted so that k becomes z (a field along k is
 * then the field along z of drude-response.ts).
 */
function drudeFieldDerivative(s: DrudeSpecies, k: number): (p: Monomial, pp: Monomial, u: number) => number {
  if (k === 2) return drudeTensorResponse(s).dChiDFz;
  const order = k === 0 ? [1, 2, 0] : [2, 0, 1];
  const permuted = drudeTensorResponse({ ...s, w: order.map((i) => s.w[i]) as Vec3 });
  const map = (p: Monomial): Monomial => [p[order[0]], p[order[1]], p[order[2]]];
  return (p, pp, u) => permuted.dChiDFz(map(p), map(pp), u);
}

/** Cartesian form (module comment); `fieldDerivative[k]` is ∂χ/∂F_k (missing axes give 0 and are not reported). */
export function tensorSurfaceCoefficients(
  t: TensorResponse,
  fieldDerivative: ReadonlyArray<((p: Monomial, pp: Monomial, u: number) => number) | undefined>,
  f: ImageFactor,
  normal: Vec3,
  relTol = 1e-13,
): ResponseSurfaceCoefficients {
  const W2 = imageTerms(2, normal), W3 = imageTerms(3, normal), W4 = imageTerms(4, normal);
  const d0 = f.delta(0);
  const out = new Float64Array(5);
  const q = integrateSemiInfinite(
    (u) => {
      const d = f.delta(u) / Math.PI;
      let e2 = 0, e4 = 0;
      for (const w of W2) e2 += w.c * t.chi(w.pA, w.pB, u);
      for (const w of W4) e4 += w.c * t.chi(w.pA, w.pB, u);
      out[0] = -e2 * d;
      out[1] = -e4 * d;
      for (let k = 0; k < 3; k++) {
        const dk = fieldDerivative[k];
        let s = 0;
        if (dk) for (const w of W3) s += w.c * dk(w.pA, w.pB, u);
        out[2 + k] = -s * d;
      }
      return out;
    },
    5,
    { scale: mapScale(t.scale, f), relTol },
  );
  // permanent moments, imaged statically
  let s2 = 0, s4 = 0;
  for (const w of W2) s2 += w.c * t.mean(w.pA) * t.mean(w.pB);
  for (const w of W4) s4 += w.c * t.mean(w.pA) * t.mean(w.pB);
  const D4vector = [0, 1, 2].map((k) => {
    const mk = AXIS_MONOMIALS[k];
    let s = 0;
    for (const w of W3) s += w.c * (t.chi(w.pA, mk, 0) * t.mean(w.pB) + t.mean(w.pA) * t.chi(w.pB, mk, 0));
    return q.value[2 + k] - d0 * s;
  }) as Vec3;
  return {
    C3: q.value[0] - d0 * s2,
    C5: q.value[1] - d0 * s4,
    D4vector,
    error: { C3: q.error[0], C5: q.error[1], D4: Math.max(q.error[2], q.error[3], q.error[4]) },
    converged: q.converged,
    evaluations: q.evaluations,
  };
}

/** The field derivatives a species' Cartesian response offers: all three axes for QDOs, else z only. */
function fieldDerivatives(s: Species, t: TensorResponse) {
  return s.kind === 'drude' ? [0, 1, 2].map((k) => drudeFieldDerivative(s, k)) : [undefined, undefined, t.dChiDFz];
}

const tilted = (n: Vec3) => n[0] !== 0 || n[1] !== 0;

export const responseSurfaceRoute: SurfaceRoute = {
  name: 'response',
  summary: 'quadrature over imaginary frequency of the atom’s response functions weighted by (eps(iu) − 1)/(eps(iu) + 1)',
  unsupported(s: Species, _surface: SurfaceSpec, options: SurfaceRouteOptions) {
    if (isotropicResponseOf(s)) return null;
    const t = tensorResponseOf(s);
    if (!t) return `${s.name} has no response functions`;
    if (s.kind !== 'drude' && tilted(unitNormal(options))) return `${s.name}: field derivatives along tilted axes are available for QDOs only`;
    return null;
  },
  run(s: Species, surface: SurfaceSpec, options: SurfaceRouteOptions): SurfaceRouteResult {
    const n = unitNormal(options);
    const f = imageFactor(surface);
    const iso = isotropicResponseOf(s);
    // a tabulated eps(iu) is a piecewise cubic (accurate to ~1e-5): a tighter quadrature than 1e-9 only chases its joints
    const relTol = surface.kind === 'table' ? Math.max(options.relTol ?? 1e-13, 1e-9) : options.relTol;
    let r: ResponseSurfaceCoefficients;
    if (iso) r = isotropicSurfaceCoefficients(iso, f, n, relTol);
    else {
      const t = tensorResponseOf(s);
      if (!t) throw new Error(`${s.name} has no response functions`);
      r = tensorSurfaceCoefficients(t, fieldDerivatives(s, t), f, n, relTol);
    }
    const withC5 = responsePowerLimit(s) >= 8;
    return {
      name: 'response',
      C3: r.C3,
      ...(withC5 ? { C5: r.C5 } : {}),
      D4: alongNormal(r.D4vector, n),
      D4vector: r.D4vector,
      error: { C3: r.error.C3, ...(withC5 ? { C5: r.error.C5 } : {}), D4: r.error.D4 },
      converged: r.converged,
      notes: [`${iso ? 'isotropic' : 'Cartesian'} kernel, ${r.evaluations} frequency points`, ...f.notes, ...speciesNotes(s)],
    };
  },
};
