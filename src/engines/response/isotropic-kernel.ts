/**
 * Response route for two spherically symmetric centres: Casimir–Polder-type integrals over imaginary frequency.
 *
 *   C6  = (3/π)  ∫ α1A α1B du                                   (H. B. G. Casimir, D. Polder, Phys. Rev. 73, 360 (1948))
 *   C8  = (15/2π) ∫ (α1A α2B + α2A α1B) du
 *   C10 = (14/π) ∫ (α1A α3B + α3A α1B) du + (35/π) ∫ α2A α2B du
 *       (general term (1/2π) binom(2lA+2lB, 2lA) ∫ α_lA α_lB; e.g. A. D. Buckingham, Adv. Chem. Phys. 12, 107 (1967))
 *   D7.a = (9/π) ∫ B_A(0; iu, −iu) α1B(iu) du,     D7.b = −(9/π) ∫ B_B(0; iu, −iu) α1A(iu) du
 *
 * The D7 prefactor is derived here: the dipole is −∂E/∂F of the dispersion energy of A in a static field F;
 * only the V_dd × V_dq cross term depends on F at this order, and its F-derivative brings in A's
 * dipole–dipole–quadrupole response. Contracting the R^-3 and R^-4 interaction tensors with the isotropic form
 * B_ab,cd = (3/4) B (δac δbd + δad δbc − (2/3) δab δcd) gives 9/π; the force-balance closed form for two QDOs
 * (D7.a = −9 qA³ qB² / (mA² wA³ mB wB (wA + wB))) and the perturbation route confirm it in the tests.
 * B's sign flips because B sees its partner on the −z side.
 */
import { integrateSemiInfinite } from '../../math/semi-infinite-quadrature.js';
import type { IsotropicResponse } from './response-model.js';
import type { ResponseCoefficients, ResponseOptions } from './tensor-kernel.js';

/** C6, C8, C10, D7 of two isotropic centres by quadrature, with error estimates. */
export function isotropicResponseCoefficients(A: IsotropicResponse, B: IsotropicResponse, options: ResponseOptions = {}): ResponseCoefficients {
  const scale = Math.sqrt(A.scale * B.scale);
  const out = new Float64Array(5);
  const f = (u: number) => {
    const a1 = A.alpha(1, u), a2 = A.alpha(2, u), a3 = A.alpha(3, u);
    const b1 = B.alpha(1, u), b2 = B.alpha(2, u), b3 = B.alpha(3, u);
    out[0] = (3 / Math.PI) * a1 * b1;
    out[1] = (15 / (2 * Math.PI)) * (a1 * b2 + a2 * b1);
    out[2] = (14 / Math.PI) * (a1 * b3 + a3 * b1) + (35 / Math.PI) * a2 * b2;
    out[3] = (9 / Math.PI) * A.hyperB(u) * b1;
    out[4] = (-9 / Math.PI) * B.hyperB(u) * a1;
    return out;
  };
  const r = integrateSemiInfinite(f, 5, { scale, relTol: options.relTol ?? 1e-13 });
  const [C6, C8, C10, D7a, D7b] = r.value;
  const [eC6, eC8, eC10, eA, eB] = r.error;
  return {
    C6, C8, C10, D7a, D7b,
    error: { C6: eC6, C8: eC8, C10: eC10, D7a: eA, D7b: eB },
    permanent: { E5: 0, D4a: 0, D4b: 0 },
    converged: r.converged,
    evaluations: r.evaluations,
    kernel: 'isotropic',
  };
}
