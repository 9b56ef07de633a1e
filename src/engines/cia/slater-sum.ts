/**
 * Quantum spectral moments M0 and M1 from the two-body Slater sum (pair distribution of distinguishable
 * particles, Boltzmann statistics), exact for the given V:
 *   g(R) = Λ³ Σ_l (2l+1)/(4π R²) [ Σ_b e^(−βE_b) u_b(R)² + (2/π) ∫_0^∞ dk e^(−βk²/2m) u_kl(R)² ],
 *   Λ³ = (2πβħ²/m)^(3/2)
 * (u_b bound, ∫u_b² = 1; u_kl continuum → sin(kR − lπ/2 + δ_l); g = 1 for V = 0 by the addition theorem
 * Σ(2l+1) j_l² = 1). See L. Frommhold, Collision-induced Absorption in Gases (1993) and J. de Boer,
 * Rep. Prog. Phys. 12, 305 (1949) for the Slater sum. Then
 *   M0 = 4π ∫ mu² g R² dR = Λ³ Σ_l (2l+1) [Σ_b e^(−βE_b) ⟨b|mu²|b⟩ + (2/π) ∫ dk e^(−βE) ⟨kl|mu²|kl⟩]
 *   M1 = (ħ/2m) 4π ∫ (mu'² + 2mu²/R²) g R² dR       (first-moment sum rule, same bookkeeping).
 * The R range beyond the grid's dipole end adds the classical e^(−βV) tail (negligible by construction).
 * The partial-wave sum stops when 3 successive l each add less than `pwTol` of every total; reaching
 * `maxL` first leaves the result unconverged.
 */
import { adaptiveKronrod } from './gauss-kronrod.js';

/** Quasi-bound levels narrower than this × the lowest kT (WKB estimate) are counted as discrete levels. */
const NARROW = 1e-8;
const PANELS = 4;
/** Located resonances narrower than this × the lowest kT are discrete levels with a window of ±1000 Γ cut out. */
const RESOLVE = 1e-5;
import { boundStates, continuumState, quasiBoundStates, startIndex, type BoundState, type RadialGrid } from './radial-solver.js';

export interface QuantumMoments {
  M0: number;
  M1: number;
  /** The bound-state part of M0. */
  M0bound: number;
}

export interface SlaterSumOptions {
  /** Highest collision energy (Eh) of the continuum integral. */
  Ecut: number;
  /** Largest partial wave; reaching it leaves the sum unconverged. */
  maxL: number;
  /** Relative contribution per partial wave below which the sum stops (3 in a row). */
  pwTol: number;
  /** Relative error target of each partial wave's energy integral. */
  relTol: number;
}

export interface SlaterSumResult {
  moments: QuantumMoments[];
  /** Last partial wave included. */
  lMax: number;
  converged: boolean;
  /** Why not converged (or ''). */
  reason: string;
  bound: BoundState[];
  /** Number of continuum solutions computed. */
  solves: number;
}

/** Dipole arrays on the grid: mu², mu'² + 2mu²/R². */
export function dipoleOnGrid(g: RadialGrid, evaluate: (R: number) => [number, number]): { mu: Float64Array; mu2: Float64Array; grad: Float64Array } {
  const n = g.dipoleEnd + 1;
  const mu = new Float64Array(n), mu2 = new Float64Array(n), grad = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const [m, d] = evaluate(g.R[i]);
    mu[i] = m;
    mu2[i] = m * m;
    grad[i] = g.R[i] > 0 ? d * d + (2 * m * m) * g.invR2[i] : 0;
  }
  return { mu, mu2, grad };
}

/** The quantum moments at each kT (Eh) on a prepared grid. `tail` gives the classical tail [M0, grad] per T. */
export function slaterSumMoments(g: RadialGrid, dip: { mu2: Float64Array; grad: Float64Array }, kT: readonly number[], tail: ReadonlyArray<[number, number]>, options: SlaterSumOptions): SlaterSumResult {
  const nT = kT.length, dim = 2 * nT, m = g.mass, h = g.h, end = g.dipoleEnd;
  const totals = new Float64Array(dim);
  const work = new Float64Array(g.R.length);
  const y = new Float64Array(dim);
  const beta = kT.map((t) => 1 / t);
  const bound: BoundState[] = [];
  const M0bound = new Float64Array(nT);
  let solves = 0, small = 0, l = 0, converged = false, reason = '', boundDone = false, quasiDone = false;
  const kTmin = Math.min(...kT);
  const kcut = Math.sqrt(2 * m * options.Ecut);
  // a grid starting at R = 0 (no repulsive wall, e.g. V = 0): 2mu²/R² · u² → 2mu(0)² u'(0)² there; the trapezoid's
  // half weight of that limit (u'(0) ≈ u_1/R_1, only l = 0 has u'(0) ≠ 0)
  const originTerm = (u: Float64Array) => (g.R[0] === 0 ? h * dip.mu2[0] * (u[1] / g.R[1]) ** 2 : 0);
  for (; l <= options.maxL; l++) {
    const contrib = new Float64Array(dim);
    // bound levels, and narrow quasi-bound levels (orbiting resonances) counted like bound ones: the energy
    // integral cannot resolve a peak of width Γ ≪ kT, so its window [E_r − 1000Γ, E_r + 1000Γ] is cut out of it
    const levels: BoundState[] = boundDone ? [] : boundStates(g, l);
    if (!boundDone && levels.length === 0) boundDone = true;
    const cuts: Array<[number, number]> = [];
    const marks: number[] = [];
    const start = startIndex(g, l, options.Ecut);
    if (!quasiDone) {
      const quasi = quasiBoundStates(g, l);
      if (quasi.length === 0 && boundDone && l > 0) quasiDone = true;
      quasi.forEach((q, v) => {
        if ((q.width ?? 0) < NARROW * kTmin) {
          levels.push(q); // far too narrow for any energy grid: a discrete level (error O(Γ/kT))
          return;
        }
        // locate the peak of the trapped-wave weight and its half-width, then give the integral breakpoints there
        const gap = Math.min(v > 0 ? q.E - quasi[v - 1].E : q.E, v + 1 < quasi.length ? quasi[v + 1].E - q.E : q.E) / 3;
        const peak = resonancePeak(g, l, q, Math.max(q.E - gap, 1e-300), q.E + gap, start, work);
        if (peak.width < RESOLVE * kTmin) {
          // narrow: the trapped state as a discrete level, its peak cut out of the energy integral
          levels.push({ ...q, E: peak.E, width: peak.width });
          cuts.push([Math.max(0, peak.E - 1000 * peak.width), peak.E + 1000 * peak.width]);
          return;
        }
        for (const x of [0.5, 2, 8, 32, 128]) marks.push(peak.E - x * peak.width, peak.E + x * peak.width);
        marks.push(peak.E);
      });
    }
    for (const b of levels) {
      bound.push(b);
      let i0 = 0, i1 = originTerm(b.u);
      for (let i = b.start; i <= end; i++) (i0 += dip.mu2[i] * b.u[i] * b.u[i]), (i1 += dip.grad[i] * b.u[i] * b.u[i]);
      for (let t = 0; t < nT; t++) {
        const w = (2 * l + 1) * Math.exp(-beta[t] * b.E) * h;
        contrib[2 * t] += w * i0;
        contrib[2 * t + 1] += w * i1;
        M0bound[t] += w * i0 * (2 * Math.PI * beta[t] / m) ** 1.5;
      }
    }
    const f = (k: number): Float64Array | null => {
      if (!(k > 0)) return null;
      const E = (k * k) / (2 * m);
      solves++;
      const s = continuumState(g, l, E, start, work);
      if (!s) return null;
      let i0 = 0, i1 = originTerm(work);
      for (let i = start; i <= end; i++) {
        const u2 = work[i] * work[i];
        i0 += dip.mu2[i] * u2;
        i1 += dip.grad[i] * u2;
      }
      for (let t = 0; t < nT; t++) {
        const w = Math.exp(-beta[t] * E) * h * (2 / Math.PI) * (2 * l + 1);
        y[2 * t] = w * i0;
        y[2 * t + 1] = w * i1;
      }
      return y;
    };
    // pieces of [0, kcut]: cut windows removed, broad resonances as breakpoints
    const toK = (E: number) => Math.sqrt(2 * m * Math.max(E, 0));
    const edges = [0, kcut, ...marks.filter((E) => E > 0).map(toK).filter((k) => k < kcut)];
    for (const [a, b] of cuts) edges.push(toK(a), Math.min(toK(b), kcut));
    edges.sort((x, y) => x - y);
    const r = { value: new Float64Array(dim), converged: true };
    for (let p = 0; p + 1 < edges.length; p++) {
      const a = edges[p], b = edges[p + 1];
      if (!(b > a) || cuts.some(([lo, hi]) => toK(lo) <= a && b <= toK(hi))) continue;
      const piece = adaptiveKronrod(f, dim, a, b, {
        panels: Math.max(1, Math.round((PANELS * (b - a)) / kcut)),
        maxPanels: 400,
        relTol: options.relTol,
        scaleOf: (v) => {
          const sc = new Float64Array(dim);
          for (let k = 0; k < dim; k++) sc[k] = Math.max(Math.abs(totals[k] + contrib[k] + r.value[k] + v[k]), 1e-300);
          return sc;
        },
      });
      for (let k = 0; k < dim; k++) r.value[k] += piece.value[k];
      r.converged &&= piece.converged;
    }
    if (!r.converged) {
      reason = `the energy integral of partial wave l = ${l} did not reach its tolerance`;
    }
    let rel = 0;
    for (let k = 0; k < dim; k++) {
      contrib[k] += r.value[k];
      totals[k] += contrib[k];
    }
    for (let k = 0; k < dim; k++) rel = Math.max(rel, Math.abs(contrib[k]) / Math.max(Math.abs(totals[k]), 1e-300));
    small = rel < options.pwTol ? small + 1 : 0;
    if (small >= 3 && boundDone && quasiDone) {
      converged = reason === '';
      break;
    }
  }
  if (l > options.maxL) {
    l = options.maxL;
    reason = `the partial-wave sum did not converge by l = ${options.maxL}`;
  }
  const moments = kT.map((_, t) => {
    const L3 = (2 * Math.PI * beta[t] / m) ** 1.5;
    return { M0: L3 * totals[2 * t] + tail[t][0], M1: (L3 * totals[2 * t + 1] + tail[t][1]) / (2 * m), M0bound: M0bound[t] };
  });
  return { moments, lMax: l, converged, reason, bound, solves };
}

/**
 * The resonance of a quasi-bound level in the continuum: the energy where the trapped weight ∫ u² dR inside the
 * barrier (u the continuum wave of unit asymptotic amplitude) peaks, by golden-section search in [lo, hi], and the
 * full width at half maximum by bisection on either side.
 */
function resonancePeak(g: RadialGrid, l: number, q: BoundState, lo: number, hi: number, start: number, work: Float64Array): { E: number; width: number } {
  let ib = q.start;
  for (let i = q.start; i < q.u.length; i++) if (q.u[i] !== 0) ib = i;
  const inside = (E: number) => {
    const s = continuumState(g, l, E, start, work);
    if (!s) return 0;
    let t = 0;
    for (let i = start; i <= ib; i++) t += work[i] * work[i];
    return t;
  };
  const gr = (Math.sqrt(5) - 1) / 2;
  let a = lo, b = hi;
  let x1 = b - gr * (b - a), x2 = a + gr * (b - a), f1 = inside(x1), f2 = inside(x2);
  for (let it = 0; it < 80 && b - a > 1e-14 * b; it++) {
    if (f1 > f2) (b = x2), (x2 = x1), (f2 = f1), (x1 = b - gr * (b - a)), (f1 = inside(x1));
    else (a = x1), (x1 = x2), (f1 = f2), (x2 = a + gr * (b - a)), (f2 = inside(x2));
  }
  const E = 0.5 * (a + b), top = inside(E);
  const half = (from: number, to: number) => {
    let p = from, r = to;
    for (let it = 0; it < 60 && Math.abs(r - p) > 1e-14 * Math.abs(E); it++) {
      const mid = 0.5 * (p + r);
      if (inside(mid) > top / 2) p = mid;
      else r = mid;
    }
    return 0.5 * (p + r);
  };
  const width = Math.max(half(E, hi) - half(E, lo), 1e-14 * E);
  return { E, width };
}
