/**
 * Classical spectral moments of the translational CIA band of an unlike pair, per n1 n2 (atomic units,
 * hbar = 1; m the reduced mass in electron masses; beta = 1/kT in 1/Eh):
 *   M0 = 4π ∫ mu² g R² dR                                    (e²·a0^5)
 *   M1 = (1/2m) 4π ∫ (mu'² + 2 mu²/R²) g R² dR               (e²·a0^5·Eh/ħ)   first-moment sum rule
 *   M2 = (kT/m) 4π ∫ (mu'² + 2 mu²/R²) g R² dR               (e²·a0^5·(Eh/ħ)²) classical
 * with g = exp(−V/kT) (J. Van Kranendonk, Physica 23, 825 (1957); J. D. Poll, J. Van Kranendonk,
 * Can. J. Phys. 39, 189 (1961); L. Frommhold, Collision-induced Absorption in Gases, Cambridge University
 * Press (1993), ch. 6). The factor mu'² + 2mu²/R² is |∇ ⊗ (mu(R) R̂)|², the squared gradient of the dipole
 * vector (derived here). M1 is the double-commutator sum rule ∫ω S(ω) dω = (1/2)⟨[[mu, H], mu]⟩ evaluated with
 * the classical g (its leading order in ħ).
 *
 * The Wigner–Kirkwood block replaces g by its ħ² expansion
 *   g_WK = e^(−βV) [1 − (β²ħ²/12m) ∇²V + (β³ħ²/24m) (∇V)²],   ∇²V = V'' + 2V'/R
 * (E. Wigner, Phys. Rev. 40, 749 (1932); J. G. Kirkwood, Phys. Rev. 44, 31 (1933); L. D. Landau,
 * E. M. Lifshitz, Statistical Physics, §33).
 */
import type { DipoleFunction } from './dipole.js';
import type { PairPotential } from './potential.js';
import { integrateVector } from './radial-quadrature.js';

export interface ClassicalMoments {
  M0: number;
  M1: number;
  M2: number;
}

export interface ClassicalResult {
  classical: ClassicalMoments;
  wignerKirkwood: { M0: number; M1: number };
  converged: boolean;
}

/**
 * Classical and Wigner–Kirkwood moments at each temperature, integrating R over [from, to] (bohr).
 * @param mass reduced mass (electron masses)
 * @param kT thermal energies (Eh)
 */
export function classicalMoments(potential: PairPotential, dipole: DipoleFunction, mass: number, kT: readonly number[], from: number, to: number): ClassicalResult[] {
  const nT = kT.length;
  // components per T: [cl M0, cl grad, wk M0, wk grad]
  const f = (R: number, out: Float64Array) => {
    const [V, V1, V2] = potential.derivatives(R);
    const [mu, mu1] = dipole.evaluate(R);
    const R2 = R * R;
    const m0 = 4 * Math.PI * mu * mu * R2;
    const grad = R > 0 ? 4 * Math.PI * (mu1 * mu1 * R2 + 2 * mu * mu) : 0;
    const lap = R > 0 ? V2 + (2 * V1) / R : V2;
    for (let t = 0; t < nT; t++) {
      const beta = 1 / kT[t];
      const g = Math.exp(-beta * V);
      const corr = 1 - ((beta * beta) / (12 * mass)) * lap + ((beta * beta * beta) / (24 * mass)) * V1 * V1;
      out[4 * t] = m0 * g;
      out[4 * t + 1] = grad * g;
      out[4 * t + 2] = m0 * g * corr;
      out[4 * t + 3] = grad * g * corr;
    }
  };
  const r = integrateVector(f, 4 * nT, from, to);
  return kT.map((kt, t) => ({
    classical: { M0: r.value[4 * t], M1: r.value[4 * t + 1] / (2 * mass), M2: (kt / mass) * r.value[4 * t + 1] },
    wignerKirkwood: { M0: r.value[4 * t + 2], M1: r.value[4 * t + 3] / (2 * mass) },
    converged: r.converged,
  }));
}
