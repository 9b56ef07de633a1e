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
/** Resonances narrower than this × the lowest kT are handed to the line shape as discrete levels (not to the moments). */
const LINE_SHAPE_LEVEL = 1e-5;
/** Half-width, in Γ, of the window around a located resonance integrated in the Breit–Wigner variable. */
const WINDOW = 50;
import { barrierTop, boundStates, continuumState, innerWell, quasiBoundStates, startIndex, type BoundState, type RadialGrid } from './radial-solver.js';

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
  /** Bound and quasi-bound levels for the line shape (quasi-bound: Γ below 1e-5 of the lowest kT). */
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
    // bound levels, and quasi-bound levels (orbiting resonances) narrower than NARROW kT counted like bound ones
    // (no quadrature node lands within Γ of them); wider ones are integrated through in their Breit–Wigner variable.
    // Missing a resonance leaves an error that does not fall with the mass (a floor under quantum − Wigner–Kirkwood).
    const levels: BoundState[] = boundDone ? [] : boundStates(g, l);
    if (!boundDone && levels.length === 0) boundDone = true;
    const windows: Array<{ E: number; width: number; lo: number; hi: number }> = [];
    const marks: number[] = [];
    const start = startIndex(g, l, options.Ecut);
    if (!quasiDone) {
      const quasi = quasiBoundStates(g, l);
      if (quasi.length === 0 && boundDone && l > 0 && !innerWell(g, l)) quasiDone = true;
      const barrier = barrierTop(g, l);
      if (barrier) for (const x of [0, 1, 8]) marks.push(barrier.E - (x * barrier.omega) / (2 * Math.PI), barrier.E + (x * barrier.omega) / (2 * Math.PI));
      quasi.forEach((q, v) => {
        // the resonance energy and width from the Breit–Wigner form of the trapped weight
        const gap = Math.min(v > 0 ? q.E - quasi[v - 1].E : q.E, v + 1 < quasi.length ? quasi[v + 1].E - q.E : q.E) / 2;
        const peak = locateResonance(g, l, q.E, Math.min(gap, 100 * (q.width ?? gap)), start, work, q.u);
        const width = peak ? peak.width : (q.width ?? 0);
        if (width < NARROW * kTmin) {
          // far too narrow for any energy grid: a discrete level (error O(Γ/kT)); the quadrature nodes miss its peak
          levels.push(peak ? { ...q, E: peak.E, width } : q);
          return;
        }
        if (!peak) {
          // no isolated Breit–Wigner peak (broad, near the barrier top): breakpoints at the WKB estimate
          for (const x of [0.5, 2, 8]) marks.push(q.E - x * width, q.E + x * width);
          return;
        }
        // a window of ±WINDOW Γ integrated in the Lorentzian's own variable, geometric breakpoints beyond it
        const E = peak.E, half = Math.min(WINDOW * width, 0.5 * gap);
        windows.push({ E, width, lo: Math.max(E - half, 0), hi: E + half });
        // the line shape's fixed k grid cannot resolve it either: there it stays a discrete level
        if (width < LINE_SHAPE_LEVEL * kTmin) bound.push({ ...q, E, width });
        for (let x = 4 * half; x < gap; x *= 4) marks.push(E - x, E + x);
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
    // pieces of [0, kcut]: resonance windows apart (integrated in θ = atan(2(E − E_r)/Γ), where the
    // Breit–Wigner peak is flat), geometric breakpoints around them
    const toK = (E: number) => Math.sqrt(2 * m * Math.max(E, 0));
    const edges = [0, kcut, ...marks.filter((E) => E > 0).map(toK).filter((k) => k < kcut)];
    for (const w of windows) edges.push(toK(w.lo), Math.min(toK(w.hi), kcut));
    edges.sort((x, y) => x - y);
    const r = { value: new Float64Array(dim), converged: true };
    const scaleOf = (v: Float64Array) => {
      const sc = new Float64Array(dim);
      for (let k = 0; k < dim; k++) sc[k] = Math.max(Math.abs(totals[k] + contrib[k] + r.value[k] + v[k]), 1e-300);
      return sc;
    };
    const add = (piece: { value: Float64Array; converged: boolean }) => {
      for (let k = 0; k < dim; k++) r.value[k] += piece.value[k];
      r.converged &&= piece.converged;
    };
    for (let p = 0; p + 1 < edges.length; p++) {
      const a = edges[p], b = edges[p + 1];
      if (!(b > a) || windows.some((w) => toK(w.lo) <= a && b <= toK(w.hi))) continue;
      add(adaptiveKronrod(f, dim, a, b, { panels: Math.max(1, Math.round((PANELS * (b - a)) / kcut)), maxPanels: 400, relTol: options.relTol, scaleOf }));
    }
    const yTheta = new Float64Array(dim);
    for (const w of windows) {
      if (!(w.lo < options.Ecut)) continue;
      const hi = Math.min(w.hi, options.Ecut);
      // E = E_r + (Γ/2) tan θ, dk = (m/k) dE, dE = (Γ/2) sec²θ dθ
      const fTheta = (theta: number): Float64Array | null => {
        const E = w.E + 0.5 * w.width * Math.tan(theta);
        const k = toK(E);
        const y0 = f(k);
        if (!y0) return null;
        const jac = (m / k) * 0.5 * w.width / Math.cos(theta) ** 2;
        for (let c = 0; c < dim; c++) yTheta[c] = y0[c] * jac;
        return yTheta;
      };
      const t0 = Math.atan((2 * (w.lo - w.E)) / w.width), t1 = Math.atan((2 * (hi - w.E)) / w.width);
      add(adaptiveKronrod(fTheta, dim, t0, t1, { panels: 4, maxPanels: 400, relTol: options.relTol, scaleOf }));
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
 * The resonance of a quasi-bound level in the continuum. Near an isolated resonance the trapped weight
 * W(E) = ∫ u² dR inside the barrier (u the continuum wave of unit asymptotic amplitude) has the Breit–Wigner form
 * W ∝ 1/((E − E_r)² + Γ²/4) (G. Breit, E. Wigner, Phys. Rev. 49, 519 (1936); quoted from memory), so 1/W is a
 * parabola in E: three values give E_r and Γ = 2√(min/curvature). The fit is repeated on a bracket shrinking
 * towards ±2Γ (the box level `E0` with its wall at the barrier top is off by up to ~√(Γ ΔE)). Returns null when
 * the fit does not settle (Γ below the solver's energy resolution, or no isolated peak).
 */
export function locateResonance(g: RadialGrid, l: number, E0: number, gap: number, start: number, work: Float64Array, trapped: Float64Array): { E: number; width: number } | null {
  let ib = start;
  for (let i = start; i < trapped.length; i++) if (trapped[i] !== 0) ib = i;
  const inv = (E: number) => {
    const s = continuumState(g, l, E, start, work);
    if (!s) return Infinity;
    let t = 0;
    for (let i = start; i <= ib; i++) t += work[i] * work[i];
    return 1 / t;
  };
  let E = E0, d = Math.min(gap, E0) / 8;
  for (let it = 0; it < 60; it++) {
    if (!(d > 1e-13 * E)) return null;
    const ym = inv(E - d), y0 = inv(E), yp = inv(E + d);
    const a = (yp + ym - 2 * y0) / (2 * d * d), b = (yp - ym) / (2 * d);
    if (!(a > 0) || !Number.isFinite(a)) {
      d /= 4;
      continue;
    }
    const x = -b / (2 * a), min = y0 - (b * b) / (4 * a);
    if (Math.abs(x) > 4 * d) {
      // outside the bracket: move towards the vertex, keep the size
      E = Math.max(E + Math.sign(x) * 2 * d, 0.5 * E);
      continue;
    }
    E += x;
    const width = min > 0 ? 2 * Math.sqrt(min / a) : 0;
    if (width > 0 && d <= 4 * width && Math.abs(x) <= 1e-3 * width) return { E, width };
    d = Math.max(Math.min(d / 4, width > 0 ? 2 * width : d / 4), 2 * Math.abs(x), 1e-13 * E);
  }
  return null;
}
