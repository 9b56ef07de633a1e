/**
 * Force balance for a pair of QDOs (A at the origin, B at +R ẑ): the R → ∞ coefficients, analytically.
 *
 * In any eigenstate the mean force on each Drude particle vanishes (Ehrenfest; Hellmann–Feynman with respect to
 * a displacement): k_c <x_c> = −<∂V/∂x_c>, c over the six Drude coordinates, k_c = m w_c².
 * Reference: the dipole–dipole-coupled pair H0 + V2/R³ (exactly harmonic; its ground state is a Gaussian).
 * Because ∂V3/∂x is even under inversion of all six coordinates, its mean has no first-order V3 correction, so
 *   k_c <x_c> + Σ_d G_cd <x_d> / R³ = −<∂V3/∂x_c>_ref / R⁴                     (G: the V2 coupling matrix)
 * holds exactly to first order in V3 and to all orders in V2. Expanding the Gaussian mean to first order in V2
 * (covariance <x_A x_B> = −g/(2 mA mB wA wB (wA + wB)) for a coupling g xA xB, derived here from the
 * Dalgarno–Lewis function of V2) and solving order by order in 1/R:
 *   <x_c>^(4) = −<∂V3/∂x_c>_0 / k_c                                              (permanent-quadrupole induction, D4)
 *   <x_c>^(7) = [ −<∂V3/∂x_c>_1 − Σ_d G_cd <x_d>^(4) ] / k_c                     (D7: dispersion + back-induction)
 * and mu = −q <r>. For two isotropic QDOs this gives D7.a = −9 qA³ qB² / (mA² wA³ mB wB (wA + wB))
 * = −(qA/kA) · 6 C6: the whole R^-7 dispersion force on A acts on its Drude particle and is balanced by the spring.
 *
 * Energies of the same Hamiltonian:
 *   C6: the leading term of the exact normal-mode zero-point energy of each coupled axis pair,
 *       ΔE = −g²/(4 mA mB wA wB (wA + wB)) for a coupling g xA xB (normal modes of two coupled oscillators,
 *       F. London, Trans. Faraday Soc. 33, 8 (1937); W. L. Bade, J. Chem. Phys. 27, 1280 (1957)).
 *   C8, C10: second-order energies from Dalgarno–Lewis functions, C_2N = −Σ_{n+n'=2N−2} (<V_n P_n'>_0 − <V_n>_0<P_n'>_0)
 *       (exact polynomial Gaussian means). The n = 2 terms are the Hellmann–Feynman first-order energies
 *       <V_n'>_1 = 2<V_n' P2>_c of the higher multipoles in the dipole-coupled state.
 *   E5 = <V4>_0 (permanent quadrupole–quadrupole energy; anisotropic centres only).
 */
import type { Vec3 } from '../../model/types.js';
import type { DrudeSpecies } from '../../model/drude.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import {
  type HarmonicPair,
  type Poly6,
  dalgarnoLewis,
  derivative,
  exponentOf,
  firstOrderMean,
  groundMean,
  harmonicPair,
  pairKey,
} from './harmonic-polynomial.js';
import type { VectorCoefficients } from '../route.js';
import { SecondOrderEnergies } from './coupling-plan.js';

/** The force-balance coefficients of a QDO pair (atomic units; C8, C10 present when maxEnergyPower allows). */
export type ForceBalanceCoefficients = VectorCoefficients;

/** The order-n coupling of two QDOs as a polynomial in the six Drude coordinates, at R = 1 (hartree). */
export function couplingPolynomial(order: number, A: DrudeSpecies, B: DrudeSpecies): Poly6 {
  const p: Poly6 = new Map();
  // M^A_pA M^B_pB = (−qA)(−qB) rA^pA rB^pB (the cores sit at the centres)
  for (const t of couplingTerms(order)) p.set(pairKey(t.pA, t.pB), (p.get(pairKey(t.pA, t.pB)) ?? 0) + A.q * B.q * t.c);
  return p;
}

/**
 * Zero-point-energy change of one pair of coordinates coupled by g xA xB: the exact normal-mode result
 * (ω+ + ω− − wA − wB)/2 with ω±² the eigenvalues of [[wA², g/√(mA mB)], [g/√(mA mB), wB²]], written without
 * cancellation (derived here; the closed form is London's and Bade's). Hartree; throws on an unstable pair.
 */
export function coupledPairZeroPointShift(mA: number, wA: number, mB: number, wB: number, g: number): number {
  // order so that a = wA² ≥ b = wB²
  if (wA < wB) [mA, wA, mB, wB] = [mB, wB, mA, wA];
  const a = wA * wA, b = wB * wB, c = (g * g) / (mA * mB);
  const h = (a - b) / 2;
  const d = Math.sqrt(h * h + c);
  const delta = c / (d + h); // ω+² − a = b − ω−² = δ
  const wPlus = Math.sqrt(a + delta);
  const wMinus2 = b - delta;
  if (!(wMinus2 > 0)) throw new RangeError('coupled oscillators are unstable (polarisation catastrophe)');
  const wMinus = Math.sqrt(wMinus2);
  // (ω+ − wA) + (ω− − wB) = δ [1/(ω+ + wA) − 1/(ω− + wB)] = δ [(ω− − ω+) + (wB − wA)] / ((ω+ + wA)(ω− + wB))
  const spread = (-2 * d) / (wPlus + wMinus) - (a - b) / (wA + wB);
  return (0.5 * delta * spread) / ((wPlus + wA) * (wMinus + wB));
}

/** Everything the route reports, from polynomial Gaussian means (see the module comment). */
export function forceBalanceCoefficients(A: DrudeSpecies, B: DrudeSpecies, maxEnergyPower: 6 | 8 | 10 = 10): ForceBalanceCoefficients {
  const h: HarmonicPair = harmonicPair(A, B);
  const V2 = couplingPolynomial(2, A, B);
  const V3 = couplingPolynomial(3, A, B);
  const V4 = couplingPolynomial(4, A, B);
  const k = h.w.map((w, c) => h.mass[c] * w * w);

  // C6: leading (g²) term of each axis pair's exact normal-mode shift; V2 couples x–x, y–y, z–z only (B on z)
  let C6 = 0;
  for (const t of couplingTerms(2)) {
    const a = t.pA.indexOf(1);
    if (t.pB.indexOf(1) !== a) throw new Error('dipole–dipole coupling is not axis-diagonal'); // cannot happen on the z axis
    const g = A.q * B.q * t.c;
    C6 += (g * g) / (4 * A.m * B.m * A.w[a] * B.w[a] * (A.w[a] + B.w[a]));
  }

  // C8, C10: second-order energies Σ_{n+n'=2N−2} <V_n P_n'>_c from Dalgarno–Lewis functions (covariances),
  // on typed arrays laid out once per order (coupling-plan.ts)
  const energies = new SecondOrderEnergies(A, B, h);
  const P2 = dalgarnoLewis(V2, h);

  // force balance, order by order
  const grad3 = [0, 1, 2, 3, 4, 5].map((c) => derivative(V3, c));
  const x4 = grad3.map((g, c) => -groundMean(g, h) / k[c]);
  const x7 = grad3.map((g, c) => {
    // −<∂V2/∂x_c> at the R^-4 means: ∂V2/∂x_c is linear, so evaluate it at <x>^(4)
    const backInduction = linearAt(derivative(V2, c), x4);
    return (-firstOrderMean(g, P2, h) - backInduction) / k[c];
  });
  const dip = (x: number[], q: number, off: number): Vec3 => [-q * x[off], -q * x[off + 1], -q * x[off + 2]];
  return {
    C6,
    ...(maxEnergyPower >= 8 ? { C8: energies.coefficient(8) } : {}),
    ...(maxEnergyPower >= 10 ? { C10: energies.coefficient(10) } : {}),
    D7a: dip(x7, A.q, 0),
    D7b: dip(x7, B.q, 3),
    permanent: { E5: groundMean(V4, h), D4a: dip(x4, A.q, 0), D4b: dip(x4, B.q, 3) },
  };
}

/** Value of a polynomial of degree ≤ 1 at the point x. */
function linearAt(p: Poly6, x: readonly number[]): number {
  let s = 0;
  for (const [key, c] of p) {
    let term = c;
    for (let coord = 0; coord < 6; coord++) if (exponentOf(key, coord) === 1) term *= x[coord];
    s += term;
  }
  return s;
}
