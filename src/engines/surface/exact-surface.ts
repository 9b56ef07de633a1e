/**
 * Finite-Z exact solution of a QDO in front of an instantaneous surface (conductor, or constant eps with image
 * factor Δ): the ground state of
 *   H = H0 + Δ Σ_{n=2}^{order} W_n(r) / Z^(n+1)
 * (W_n the one-particle image polynomials of image-hamiltonian.ts) in the harmonic basis of states with at most N
 * total quanta, N grown until two successive enlargements change the energy and the normal dipole by no more than
 * `tolerance` (relative), as for pairs (src/engines/exact/exact-solver.ts). Lowest eigenpair by Davidson's method
 * (src/engines/exact/davidson.ts). Parities the image polynomial keeps (x → −x, y → −y for an untilted centre)
 * restrict the basis to even quanta along those axes.
 *
 * Escape check (the one-centre form of src/engines/exact/localisation.ts, derived here): the multipole-expanded
 * potential U(ξ) = Σ w_a ξ_a² + Δ Σ W_n(2 s ξ)/Z^(n+1) (ξ_a = x_a/(2 s_a), s_a² = 1/(2 m w_a)) rises from the
 * minimum, passes a barrier and falls without bound beyond it; the basis of N quanta stays inside when
 * N + 3/2 < κ², κ the smallest barrier distance over sampled directions. Points whose accepted basis reaches the
 * barrier, or that did not converge, are untrusted with the reason.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { Vec3 } from '../../model/types.js';
import { AXIS_MONOMIALS, type Monomial } from '../../hamiltonian/monomial.js';
import { davidsonLowest, type SymmetricOperator } from '../exact/davidson.js';
import { harmonicIndex, harmonicSpace } from '../perturbation/harmonic-space.js';
import { imagePolynomial, type Polynomial3 } from './image-hamiltonian.js';
import { requirePositive, requireIntegerIn, requireInRange } from '../../model/validate.js';

export const MAX_SURFACE_ORDER = 8;

export interface SurfaceExactOptions {
  /** Image factor Δ (1 for a conductor). */
  delta?: number;
  /** Highest multipole order n of W_n (2…8). Default 4. */
  order?: number;
  /** Relative change allowed between successive bases. Default 1e-10. */
  tolerance?: number;
  /** Smallest and largest basis (total quanta). Defaults 4 and 30. */
  startQuanta?: number;
  maxQuanta?: number;
  /** Surface normal in the species' axes. Default +z. */
  normal?: Vec3;
}

export interface SurfaceExactPoint {
  /** Distance of the centre from the surface, bohr. */
  Z: number;
  /** Energy shift E − E0, hartree. */
  energy: number;
  /** Induced dipole vector (species axes), e·a0. */
  mu: Vec3;
  /** Its component along the normal (away from the surface), e·a0. */
  muNormal: number;
  quanta: number;
  dimension: number;
  residual: number;
  converged: boolean;
  trusted: boolean;
  reasons: string[];
}

export interface SurfaceExactCurve {
  order: number;
  delta: number;
  points: SurfaceExactPoint[];
}

interface Entry {
  i: number;
  j: number;
  v: number;
}

/** Basis states (indices of harmonic-space.ts) with at most `maxQuanta` quanta, sorted by total quanta. */
function basisStates(maxQuanta: number, even: readonly boolean[]): { states: number[]; count: number[] } {
  const states: number[] = [];
  const count: number[] = [];
  for (let N = 0; N <= maxQuanta; N++) {
    for (let nz = 0; nz <= N; nz++)
      for (let ny = 0; ny <= N - nz; ny++) {
        const nx = N - nz - ny;
        if ((even[0] && nx % 2) || (even[1] && ny % 2) || (even[2] && nz % 2)) continue;
        states.push(harmonicIndex(nx, ny, nz));
      }
    count.push(states.length);
  }
  return { states, count };
}

/** Matrix entries (i ≤ j in basis positions) of a polynomial in r, from the moment actions M_p = −q r^p. */
function polynomialMatrix(s: DrudeSpecies, poly: Polynomial3, states: readonly number[], maxQuanta: number): Entry[] {
  const space = harmonicSpace(s, maxQuanta);
  const position = new Map(states.map((st, k) => [st, k]));
  const acc = new Map<number, number>();
  for (let j = 0; j < states.length; j++)
    for (const t of poly.values()) {
      const e = space.applyMoment(t.p as Monomial, states[j]);
      for (let k = 0; k < e.states.length; k++) {
        const i = position.get(e.states[k]);
        if (i === undefined || i > j) continue;
        const key = i * states.length + j;
        acc.set(key, (acc.get(key) ?? 0) + (t.c * e.amps[k]) / -s.q);
      }
    }
  const out: Entry[] = [];
  for (const [key, v] of acc) if (v !== 0) out.push({ i: Math.floor(key / states.length), j: key % states.length, v });
  return out;
}

/** Scaled distance κ to the nearest escape barrier of the expanded potential at distance Z (module comment). */
export function surfaceBarrier(s: DrudeSpecies, polys: readonly Polynomial3[], orders: readonly number[], delta: number, Z: number): number {
  const len = s.w.map((w) => 1 / Math.sqrt(2 * s.m * w));
  const directions: Vec3[] = [];
  const count = 600;
  for (let k = 0; k < count; k++) {
    const zc = 1 - (2 * (k + 0.5)) / count;
    const r = Math.sqrt(1 - zc * zc);
    const phi = k * Math.PI * (3 - Math.sqrt(5));
    directions.push([r * Math.cos(phi), r * Math.sin(phi), zc]);
  }
  for (const a of [0, 1, 2]) for (const sign of [1, -1]) directions.push(AXIS_MONOMIALS[a].map((x) => sign * x) as Vec3);
  let kappa = Infinity;
  for (const nu of directions) {
    // U(τ) = Σ_k a_k τ^k
    const a = new Float64Array(MAX_SURFACE_ORDER + 1);
    a[2] = s.w[0] * nu[0] ** 2 + s.w[1] * nu[1] ** 2 + s.w[2] * nu[2] ** 2;
    polys.forEach((poly, idx) => {
      const n = orders[idx];
      for (const t of poly.values()) {
        let c = (delta * t.c) / Z ** (n + 1);
        for (let ax = 0; ax < 3; ax++) c *= (2 * len[ax] * nu[ax]) ** t.p[ax];
        a[n] += c;
      }
    });
    // first maximum: dU/dτ changes sign from + to −
    const slope = (tau: number) => {
      let d = 0;
      for (let k = a.length - 1; k >= 1; k--) d = d * tau + k * a[k];
      return d;
    };
    // geometric steps: the barrier distance to 1%
    for (let tau = 0.05; tau < Math.min(kappa, 200); tau *= 1.01) {
      if (slope(tau) <= 0) {
        kappa = Math.min(kappa, tau);
        break;
      }
    }
  }
  return kappa;
}

/** Solve the QDO at each distance Z (bohr). */
export function surfaceExactCurve(s: DrudeSpecies, Z: readonly number[], options: SurfaceExactOptions = {}): SurfaceExactCurve {
  Z.forEach((z, i) => requirePositive(`Z[${i}]`, z));
  const delta = requireInRange('delta', options.delta ?? 1, 0, 1);
  const order = requireIntegerIn('order', options.order ?? 4, 2, MAX_SURFACE_ORDER);
  const tolerance = options.tolerance ?? 1e-10;
  const start = options.startQuanta ?? 4;
  const maxQuanta = options.maxQuanta ?? 30;
  const normal = options.normal ?? [0, 0, 1];
  const orders = Array.from({ length: order - 1 }, (_, k) => k + 2);
  const polys = orders.map((n) => imagePolynomial(n, s.q, normal));
  const even = [0, 1, 2].map((ax) => polys.every((p) => [...p.values()].every((t) => t.p[ax] % 2 === 0)));
  const { states, count } = basisStates(maxQuanta, even);
  const H0 = states.map((st) => harmonicSpace(s, maxQuanta).excitation(st));
  const parts = polys.map((p) => polynomialMatrix(s, p, states, maxQuanta));
  const dipoles = AXIS_MONOMIALS.map((p) => polynomialMatrix(s, new Map([[0, { p, c: -s.q }]]), states, maxQuanta)); // M_a = −q x_a
  const expectation = (entries: readonly Entry[], x: Float64Array, dim: number) => {
    let sum = 0;
    for (const e of entries) if (e.i < dim && e.j < dim) sum += (e.i === e.j ? 1 : 2) * e.v * x[e.i] * x[e.j];
    return sum;
  };
  const points = Z.map((z): SurfaceExactPoint => {
    const weights = orders.map((n) => delta / z ** (n + 1));
    const kappa = surfaceBarrier(s, polys, orders, delta, z);
    let previous: { energy: number; mu: number } | undefined;
    let stable = 0;
    let last: SurfaceExactPoint | undefined;
    let initial: Float64Array | undefined;
    for (let N = start; N <= maxQuanta; N++) {
      const dim = count[N];
      const diagonal = Float64Array.from(H0.slice(0, dim));
      parts.forEach((entries, k) => {
        for (const e of entries) if (e.i === e.j && e.i < dim) diagonal[e.i] += weights[k] * e.v;
      });
      const op: SymmetricOperator = {
        size: dim,
        diagonal,
        apply(x, y) {
          for (let i = 0; i < dim; i++) y[i] = H0[i] * x[i];
          parts.forEach((entries, k) => {
            const w = weights[k];
            for (const e of entries) {
              if (e.i >= dim || e.j >= dim) continue;
              y[e.i] += w * e.v * x[e.j];
              if (e.i !== e.j) y[e.j] += w * e.v * x[e.i];
            }
          });
        },
      };
      const init = new Float64Array(dim);
      if (initial) init.set(initial.subarray(0, Math.min(initial.length, dim)));
      else init[0] = 1;
      const r = davidsonLowest(op, { tolerance: 1e-13, maxIterations: 600, initial: init });
      const x = r.vector[0] < 0 ? r.vector.map((v) => -v) : r.vector;
      initial = x;
      const mu = dipoles.map((d) => expectation(d, x, dim)) as Vec3;
      const muNormal = mu[0] * normal[0] + mu[1] * normal[1] + mu[2] * normal[2];
      const reach = Math.sqrt(N + 1.5);
      const reasons: string[] = [];
      if (!r.converged) reasons.push(`eigensolver residual ${r.residualNorm.toExponential(1)}`);
      if (reach >= kappa) reasons.push(`basis of ${N} quanta reaches the escape barrier of the expanded image potential (κ = ${kappa.toFixed(2)})`);
      last = { Z: z, energy: r.value, mu, muNormal, quanta: N, dimension: dim, residual: r.residualNorm, converged: false, trusted: false, reasons };
      if (previous) {
        const changeE = Math.abs(r.value - previous.energy) / Math.abs(r.value);
        const changeMu = Math.abs(muNormal - previous.mu) / Math.max(Math.abs(muNormal), Number.MIN_VALUE);
        stable = changeE <= tolerance && changeMu <= tolerance ? stable + 1 : 0;
      }
      previous = { energy: r.value, mu: muNormal };
      if (stable >= 2 || reach >= kappa) break;
    }
    const p = last!;
    p.converged = stable >= 2;
    if (!p.converged && p.reasons.length === 0) p.reasons.push(`basis not converged to ${tolerance} by ${maxQuanta} quanta`);
    p.trusted = p.converged && p.reasons.length === 0;
    return p;
  });
  return { order, delta, points };
}
