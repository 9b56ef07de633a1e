/**
 * Does a truncated harmonic basis stay inside the region where the pair's ground state is localised?
 *
 * The multipole Hamiltonian is a polynomial in the six Drude coordinates. Its dipole–quadrupole part is cubic
 * (and higher orders bring further odd or negative terms), so the potential
 *   U(r_A, r_B) = ½ Σ k_i x_i² + qA qB Σ_n V_n(r_A, r_B)/R^(n+1)
 * rises from the minimum, passes an escape barrier at displacements that grow with R, and falls without bound
 * beyond it. The ground state is a well-localised (metastable) state inside the barrier; a basis that reaches
 * past the barrier can describe the run-away region and its lowest eigenvalue eventually drops without limit.
 *
 * In the scaled coordinates ξ_i = x_i/(2 s_i) (s_i = 1/sqrt(2 m w_i)) the harmonic part is Σ w_i ξ_i² and the
 * classically allowed region of every basis state with at most N quanta is the ball |ξ|² ≤ N + 3 (N quanta
 * plus six zero-point halves). Along each direction ν the potential is U(τν) = Σ_n a_n τ^n, and its first
 * maximum τ_b(ν) is the barrier along that ray. The basis of N quanta is flagged as reaching the barrier
 * when N + 3 ≥ κ², κ = min_ν τ_b(ν) (derived here). κ is found by deterministic sampling of directions and a
 * pattern search from the best ones: an estimate of the nearest barrier, not a proof.
 * When the quadratic part alone is not positive (R below the polarisation-catastrophe distance of the
 * dipole–dipole coupling) there is no localised ground state at all and κ = 0.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import { drudeCouplingPolynomial } from '../../hamiltonian/drude-polynomial.js';

export interface LocalisationCheck {
  /** κ: distance to the nearest escape barrier in the scaled coordinates (0: unstable, ∞: none found). */
  barrier: number;
  /** Largest total quanta N whose basis stays inside the barrier (N + 3 < κ²); −1 when none does. */
  maxQuanta: number;
  /** Separation below which the dipole–dipole coupling alone makes the pair unstable, bohr. */
  catastropheR: number;
}

/** Scaled reach of a basis with at most N quanta: sqrt(N + 3). */
export const basisReach = (quanta: number): number => Math.sqrt(quanta + 3);

/**
 * Polarisation-catastrophe distance of two dipole-coupled oscillators (axial centres): the z modes couple with
 * −2 qA qB/R³ and become unstable when 2 qA qB/R³ ≥ sqrt(kA,z kB,z); the x, y modes when qA qB/R³ ≥ sqrt(kA,x kB,x)
 * (normal modes of two coupled oscillators; derived here).
 */
export function catastropheDistance(A: DrudeSpecies, B: DrudeSpecies): number {
  const k = (s: DrudeSpecies, axis: number) => s.m * s.w[axis] ** 2;
  const qq = A.q * B.q;
  return Math.max(Math.cbrt((2 * qq) / Math.sqrt(k(A, 2) * k(B, 2))), Math.cbrt(qq / Math.sqrt(k(A, 0) * k(B, 0))));
}

/**
 * Directions spread evenly over the unit sphere in 6D: a Kronecker (additive-recurrence) sequence in the unit cube,
 * u_n,i = frac(½ + n g^-i) with g the real root of g^7 = g + 1 (common practice for low-discrepancy points),
 * mapped to Gaussian pairs by Box–Muller and normalised. Deterministic, so the check gives the same answer every run.
 */
function sphereDirections(count: number): number[][] {
  let g = 1.1;
  for (let k = 0; k < 50; k++) g -= (g ** 7 - g - 1) / (7 * g ** 6 - 1);
  const alpha = Array.from({ length: 6 }, (_, i) => g ** -(i + 1));
  const out: number[][] = [];
  for (let n = 1; n <= count; n++) {
    const u = alpha.map((a) => (0.5 + n * a) % 1);
    const v: number[] = [];
    for (let i = 0; i < 6; i += 2) {
      const r = Math.sqrt(-2 * Math.log(1 - u[i]));
      v.push(r * Math.cos(2 * Math.PI * u[i + 1]), r * Math.sin(2 * Math.PI * u[i + 1]));
    }
    const norm = Math.hypot(...v);
    out.push(v.map((x) => x / norm));
  }
  return out;
}

/** Barrier check of the order-`order` multipole potential of the pair at separation R (bohr). */
export function localisationCheck(A: DrudeSpecies, B: DrudeSpecies, order: number, R: number): LocalisationCheck {
  const catastropheR = catastropheDistance(A, B);
  if (R <= catastropheR) return { barrier: 0, maxQuanta: -1, catastropheR };
  const scale = [...A.w.map((w) => 2 / Math.sqrt(2 * A.m * w)), ...B.w.map((w) => 2 / Math.sqrt(2 * B.m * w))];
  const harmonic = [...A.w, ...B.w];
  const polys: Array<{ n: number; terms: ReturnType<typeof drudeCouplingPolynomial>; factor: number }> = [];
  for (let n = 2; n <= order; n++) polys.push({ n, terms: drudeCouplingPolynomial(n), factor: (A.q * B.q) / R ** (n + 1) });

  /** First maximum τ_b of U along the unit direction ν (both signs of ν are separate rays). */
  const barrierAlong = (nu: readonly number[]): number => {
    const x = nu.map((v, i) => v * scale[i]);
    const a: number[] = new Array(order + 1).fill(0);
    for (let i = 0; i < 6; i++) a[2] += harmonic[i] * nu[i] * nu[i];
    for (const { n, terms, factor } of polys) {
      let s = 0;
      for (const t of terms) {
        let m = t.c;
        for (let i = 0; i < 6; i++) if (t.e[i]) m *= x[i] ** t.e[i];
        s += m;
      }
      a[n] += factor * s;
    }
    if (a[2] <= 0) return 0;
    // U'(τ)/τ = Σ n a_n τ^(n−2): first positive root, scanned on a geometric grid then bisected
    const slope = (tau: number) => {
      let s = 0;
      for (let n = order; n >= 2; n--) s = s * tau + n * a[n];
      return s;
    };
    let lo = 0;
    for (let tau = 1e-3; tau < 1e7; tau *= 1.15) {
      if (slope(tau) <= 0) {
        let hi = tau;
        for (let k = 0; k < 60; k++) {
          const mid = 0.5 * (lo + hi);
          if (slope(mid) > 0) lo = mid;
          else hi = mid;
        }
        return 0.5 * (lo + hi);
      }
      lo = tau;
    }
    return Infinity;
  };

  const unit = (v: number[]) => {
    const n = Math.hypot(...v);
    return v.map((x) => x / n);
  };
  const candidates: Array<{ nu: number[]; tau: number }> = [];
  for (const nu of sphereDirections(1500)) {
    const back = nu.map((x) => -x);
    candidates.push({ nu, tau: barrierAlong(nu) }, { nu: back, tau: barrierAlong(back) });
  }
  // the axis directions (pure z displacements are often the worst)
  for (let i = 0; i < 6; i++)
    for (const sign of [1, -1]) {
      const nu = new Array(6).fill(0);
      nu[i] = sign;
      candidates.push({ nu, tau: barrierAlong(nu) });
    }
  candidates.sort((p, q) => p.tau - q.tau);
  let best = candidates[0].tau;
  for (const start of candidates.slice(0, 4)) {
    if (!Number.isFinite(start.tau) || start.tau === 0) continue;
    let { nu, tau } = start;
    for (let step = 0.2; step > 1e-4; step /= 2) {
      let improved = true;
      while (improved) {
        improved = false;
        for (let i = 0; i < 6; i++)
          for (const sign of [1, -1]) {
            const trial = unit(nu.map((v, j) => (j === i ? v + sign * step : v)));
            const t = barrierAlong(trial);
            if (t < tau) {
              nu = trial;
              tau = t;
              improved = true;
            }
          }
      }
    }
    best = Math.min(best, tau);
  }
  const maxQuanta = Number.isFinite(best) ? Math.max(-1, Math.ceil(best * best - 3) - 1) : Number.MAX_SAFE_INTEGER;
  return { barrier: best, maxQuanta, catastropheR };
}
