/**
 * What the response route needs from one centre: response functions at imaginary frequency iu.
 * Two forms; a species offers one or both.
 */
import type { Monomial } from '../../hamiltonian/monomial.js';

/** Spherically symmetric centre: scalar 2^l-pole polarisabilities and the hyperpolarisability B. */
export interface IsotropicResponse {
  /** alpha_l(iu), a0^(2l+1); alpha_l = 2 Σ_n ω_n |<n|Q_l0|0>|² / (ω_n² + u²), Q_l0 = Σ e r^l P_l(cos θ). */
  alpha(l: 1 | 2 | 3, u: number): number;
  /** B(0; iu, −iu): static dipole output, field at iu, field gradient at −iu (Buckingham normalisation, B = B_zz,zz). */
  hyperB(u: number): number;
  /** A typical excitation frequency (hartree), used to map the quadrature. */
  scale: number;
}

/** General centre: linear and field-derivative responses of Cartesian moments M_p = Σ e x^p0 y^p1 z^p2. */
export interface TensorResponse {
  /** χ_{p,p'}(iu) = 2 Σ_{n≠0} ω_n <0|M_p|n><n|M_p'|0> / (ω_n² + u²). */
  chi(p: Monomial, pp: Monomial, u: number): number;
  /** ∂χ_{p,p'}(iu)/∂F at F = 0 for a static field F along z on this centre (H → H − F M_z). */
  dChiDFz(p: Monomial, pp: Monomial, u: number): number;
  /** Ground-state expectation <0|M_p|0> (a permanent moment; zero for every odd p of a centrosymmetric centre). */
  mean(p: Monomial): number;
  /** A typical excitation frequency (hartree), used to map the quadrature. */
  scale: number;
}
