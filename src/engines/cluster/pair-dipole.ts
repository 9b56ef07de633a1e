/**
 * Force-balance dipoles of one isotropic QDO pair, to all orders in the dipole–dipole coupling and first order in
 * the dipole–quadrupole term (the two-centre case of cluster.ts), in closed form and without cancellation, so
 * that they keep full precision at any separation (derived here).
 *
 * Along the pair axis n̂ (from A to B) each Cartesian pair of Drude coordinates is an independent 2×2 problem with
 * mass-weighted coupling c = g/√(mA mB): g_z = −2 qA qB/R³ along the axis, g⊥ = qA qB/R³ across it (twice).
 * With d = w², the covariance is Σ = ½ M^-½ S M^-½, S = D^-½, D = [[dA, c], [c, dB]]. For a 2×2 block
 * (√D = (D + δ I)/τ, δ = √det D, τ = √(tr D + 2δ); common practice) S_AB = −c/(δ τ). The shift of a diagonal
 * entry from its free value, S_BB − 1/wB = O(c²), comes from the divided differences of f(t) = t^-½
 * (the Daleckii–Krein form f(D) − f(D0) = V E, E_kb = f[λ_k, d_b] (VᵀC)_kb):
 *   S_BB − 1/wB = Σ_k V_Bk² ρ(λ_k, dB) (λ_k − dB)²,  ρ(λ, d) = (a + 2b) / (2 a b³ (a + b)²), a = √λ, b = √d,
 * and for 2×2, V_Bk² (λ_k − dB)² = c² (λ_k − dB)/(λ_k − λ_other), every factor computed without cancellation.
 * The mean force −<∂V_dq/∂r> then has the axis component (T3 contracted with diag(p, p, s): 6 (p − s)/R⁴)
 *   F_A = −qA qB [6 (Σ⊥_AB − Σz_AB) − 3 (ΔΣ⊥_BB − ΔΣz_BB)] / R⁴,  F_B = qA qB [6 (Σ⊥_AB − Σz_AB) − 3 (ΔΣ⊥_AA − ΔΣz_AA)] / R⁴,
 * balanced by the coupled springs [[kA, g_z], [g_z, kB]] <z> = F; mu = −q <z> n̂. For R → ∞ this is D7/R^7 with
 * D7.a = −9 qA³ qB² / (mA² wA³ mB wB (wA + wB)) (force-balance/pair-force-balance.ts).
 */
import type { DrudeSpecies } from '../../model/drude.js';

/** ρ(λ, d) = (f[λ, d] − f'(d))/(λ − d) for f(t) = t^-½ (derived here; positive, no cancellation). */
export function inverseRootCurvature(lambda: number, d: number): number {
  const a = Math.sqrt(lambda), b = Math.sqrt(d);
  return (a + 2 * b) / (2 * a * b * b * b * (a + b) ** 2);
}

/** The 2×2 block: S_AB and the shifts S_AA − 1/wA, S_BB − 1/wB (see the module comment). */
function block(dA: number, dB: number, c: number): { sAB: number; dSA: number; dSB: number } {
  const c2 = c * c;
  const h = (dA - dB) / 2;
  const rho = Math.sqrt(h * h + c2);
  const P = rho + Math.abs(h), Q = c2 / P; // ρ + |h| and ρ − |h|
  // λ+ − dA, λ+ − dB, λ− − dA, λ− − dB
  const [pA, pB, mA, mB] = h >= 0 ? [Q, P, -P, -Q] : [P, Q, -Q, -P];
  const lp = Math.max(dA, dB) + Q, lm = Math.min(dA, dB) - Q;
  if (!(lm > 0)) throw new RangeError('unstable pair');
  const delta = Math.sqrt(lp * lm); // √det D
  const tau = Math.sqrt(dA + dB + 2 * delta);
  const shift = (ep: number, em: number, d: number) => (c2 * (ep * inverseRootCurvature(lp, d) - em * inverseRootCurvature(lm, d))) / (2 * rho);
  return { sAB: -c / (delta * tau), dSA: rho === 0 ? 0 : shift(pA, mA, dA), dSB: rho === 0 ? 0 : shift(pB, mB, dB) };
}

/**
 * Dipoles (e·a0) of A and B along the axis from A to B, at separation r (bohr): mu_A = a n̂, mu_B = b n̂.
 * Throws RangeError when the pair is unstable (polarisation catastrophe).
 */
export function isotropicPairDipoles(A: DrudeSpecies, B: DrudeSpecies, r: number): { a: number; b: number } {
  const qq = A.q * B.q, wA = A.w[0], wB = B.w[0];
  const dA = wA * wA, dB = wB * wB;
  const root = Math.sqrt(A.m * B.m);
  const gPerp = qq / r ** 3, gAxis = -2 * gPerp;
  const perp = block(dA, dB, gPerp / root), axis = block(dA, dB, gAxis / root);
  const r4 = r ** 4;
  const sAB = (perp.sAB - axis.sAB) / (2 * root); // Σ⊥_AB − Σz_AB
  const FA = (-qq * (6 * sAB - (3 * (perp.dSB - axis.dSB)) / (2 * B.m))) / r4;
  const FB = (qq * (6 * sAB - (3 * (perp.dSA - axis.dSA)) / (2 * A.m))) / r4;
  const kA = A.m * dA, kB = B.m * dB;
  const det = kA * kB - gAxis * gAxis;
  const zA = (kB * FA - gAxis * FB) / det, zB = (kA * FB - gAxis * FA) / det;
  return { a: -A.q * zA, b: -B.q * zB };
}
