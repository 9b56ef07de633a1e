/**
 * Rayleigh–Schrödinger perturbation theory for a pair in a product basis, with several perturbation
 * parameters: one per multipole order, V = Σ_n V_n R^-(n+1) (V_2 dipole–dipole, V_3 dipole–quadrupole, …).
 *
 * With φ_n = R0 V_n |0> (R0 = Q (H0 − E0)^-1 Q, the reduced resolvent):
 *   second-order energy:  −C_{2N} = −Σ_{n+n'=2N−2} <0|V_n R0 V_n'|0>      (C6 ← V2V2, C8 ← V3V3 + V2V4 + V4V2, …)
 *   mixed second-order dipole (order λ2 λ3, the R^-7 term), intermediate normalisation:
 *     <mu>_{23} = 2<0|mu|ψ23> + 2<φ2|mu|φ3> − 2<φ2|φ3><0|mu|0>,
 *     ψ23 = R0[(V2 − <V2>) φ3 + (V3 − <V3>) φ2]
 * (standard RSPT, e.g. J. O. Hirschfelder, W. B. Brown, S. T. Epstein, Adv. Quantum Chem. 1, 255 (1964)).
 * Everything is evaluated at R = 1, so the results are the coefficients C_n (Eh·a0^n) and D7 (e·a0^8).
 */
import type { Vec3 } from '../../model/types.js';
import type { VectorCoefficients } from '../route.js';
import { AXIS_MONOMIALS } from '../../hamiltonian/monomial.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';
import { applyCoupling, applyLocal, combine, dot, groundState, reducedResolvent, type ProductVector } from './product-vector.js';

export interface PerturbationOptions {
  /** Highest dispersion power 2N computed (6, 8 or 10). Default 10. */
  maxEnergyPower?: 6 | 8 | 10;
}

/** C6, C8, C10, the D7 vectors (A at the origin, B at +R ẑ) and the first-order terms E5 = <0|V4|0>, D4 = −2<0|mu R0 V3|0>. */
export type PerturbationCoefficients = VectorCoefficients;

/** C6, C8, C10 and the D7 vectors of a pair of local spaces by RSPT. */
export function perturbationCoefficients(A: LocalSpace, B: LocalSpace, options: PerturbationOptions = {}): PerturbationCoefficients {
  const maxPower = options.maxEnergyPower ?? 10;
  const maxOrder = maxPower - 4; // n + n' = 2N − 2 with n' ≥ 2
  const zero = groundState();
  const V0 = new Map<number, ProductVector>(); // V_n |0>
  const phi = new Map<number, ProductVector>(); // R0 V_n |0>
  for (let n = 2; n <= maxOrder; n++) {
    const v = applyCoupling(couplingTerms(n), zero, A, B);
    V0.set(n, v);
    phi.set(n, reducedResolvent(v, A, B));
  }
  const C = (power: number): number => {
    let s = 0;
    for (let n = 2; n <= power - 4; n++) s += dot(V0.get(n)!, phi.get(power - 2 - n)!);
    return s;
  };

  const phi2 = phi.get(2)!;
  const phi3 = phi.get(3) ?? reducedResolvent(applyCoupling(couplingTerms(3), zero, A, B), A, B);
  const e2 = V0.get(2)!.get(0) ?? 0;
  const e3 = (V0.get(3) ?? applyCoupling(couplingTerms(3), zero, A, B)).get(0) ?? 0;
  const source = combine(1, applyCoupling(couplingTerms(2), phi3, A, B), -e2, phi3);
  const psi23 = reducedResolvent(combine(1, source, 1, combine(1, applyCoupling(couplingTerms(3), phi2, A, B), -e3, phi2)), A, B);
  const overlap = dot(phi2, phi3);
  const firstOrderDipole = (on: 'a' | 'b'): Vec3 =>
    AXIS_MONOMIALS.map((p) => -2 * dot(applyLocal(p, on, zero, A, B), phi3)) as Vec3;
  const E5 = (V0.get(4) ?? applyCoupling(couplingTerms(4), zero, A, B)).get(0) ?? 0;
  const dipole = (on: 'a' | 'b'): Vec3 =>
    AXIS_MONOMIALS.map((p) => {
      const mu0 = applyLocal(p, on, zero, A, B);
      const muPhi3 = applyLocal(p, on, phi3, A, B);
      return 2 * dot(mu0, psi23) + 2 * dot(phi2, muPhi3) - 2 * overlap * (mu0.get(0) ?? 0);
    }) as Vec3;

  return {
    C6: C(6),
    ...(maxPower >= 8 ? { C8: C(8) } : {}),
    ...(maxPower >= 10 ? { C10: C(10) } : {}),
    D7a: dipole('a'),
    D7b: dipole('b'),
    permanent: { E5, D4a: firstOrderDipole('a'), D4b: firstOrderDipole('b') },
  };
}

/**
 * The fewest quanta per centre that make the harmonic truncation exact: a matrix element <0|V_n R0 V_n'|0> only
 * sees states both sides reach, at most min(n, n') − 1 ≤ P/2 − 2 quanta on a centre for C_P (n + n' = P − 2);
 * the D7 chain <0|mu R0 V2 R0 V3|0> (and its partners) needs 2. Lower truncations change the results
 * (tests/engines/routes-agree.test.ts shows both).
 */
export function requiredQuanta(maxEnergyPower: number): number {
  return Math.max(2, maxEnergyPower / 2 - 2);
}
