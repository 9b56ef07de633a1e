/**
 * The quantum line shape of the translational CIA band of an unlike pair (per n1 n2; atomic units, ħ = 1):
 *   S(ω) = Λ³ Σ_{i,f} e^(−βE_i) |⟨f|mu R̂|i⟩|² δ(ω − E_f + E_i),   ∫ S dω = M0,  ∫ ω S dω = M1,
 * the golden-rule spectral density of the dipole autocorrelation for Boltzmann-weighted pair states (L. Frommhold,
 * Collision-induced Absorption in Gases (1993), ch. 5–6; derived here in this normalisation). The dipole vector
 * mu(R) R̂ is a rank-1 operator: it couples l to l' = l ± 1 with the angular factor Σ_{m,m'} |⟨l'm'|R̂|lm⟩|² =
 * max(l, l') (derived here; their sum over l' is 2l + 1, the closure check).
 * - free–free: Λ³ (2/π)² Σ max(l,l') ∫ dE_i (m/k_i)(m/k_f) e^(−βE_i) |M_fi|², E_f = E_i + ω,
 *   with E_i = max(0, −ω) + s² so the threshold behaviour is smooth in s;
 * - bound–free (ω > 0) and free–bound (ω < 0): Λ³ (2/π) max(l,l') e^(−βE_i) (m/k) |M|²;
 * - bound–bound lines at ω = E_f − E_i, weight Λ³ max(l,l') e^(−βE_i)|M|², shared between the two nearest
 *   frequencies of the grid (area kept).
 * Detailed balance S(−ω) = e^(−βω) S(ω) holds for the exact S; the code computes both signs independently.
 */
import { gaussLegendre } from '../../math/gauss-legendre.js';
import { cubicSpline, evaluateSpline } from './cubic-spline.js';
import { continuumState, startIndex, type BoundState, type RadialGrid } from './radial-solver.js';

export interface LineShapeOptions {
  /** Panels × Gauss–Legendre nodes of the collision-energy integral (in s = sqrt(E_i − E0)). */
  panels: number;
  nodes: number;
  /** Highest collision energy above threshold (Eh). */
  Ecut: number;
  /** Partial waves 0 … lMax (from the moments' convergence). */
  lMax: number;
  /**
   * 'interpolated' (default): for each l the matrix elements with the threshold-side states are computed on a
   * uniform grid in the other state's wavenumber k and interpolated by a natural cubic spline (they oscillate in
   * k with period ~2π/ΔR, ΔR the dipole's range: `samplesPerPeriod` points per period); 'direct': every
   * (ω, node) solves its own state (slow; the check of the interpolation).
   */
  method?: 'interpolated' | 'direct';
  samplesPerPeriod?: number;
  onProgress?: (done: number, total: number) => void;
}

export interface LineShape {
  /** Angular frequencies (Eh/ħ) and S(ω) (e²·a0^5 per Eh/ħ). */
  omega: Float64Array;
  S: Float64Array;
  /** Parts of S: free–free, bound–free + free–bound, bound–bound (binned). */
  freeFree: Float64Array;
  boundFree: Float64Array;
  boundBound: Float64Array;
}

/** S(ω) at each ω of `omega` (any sign) at temperature kT (Eh). */
export function lineShape(g: RadialGrid, mu: Float64Array, bound: readonly BoundState[], kT: number, omega: Float64Array, options: LineShapeOptions): LineShape {
  const m = g.mass, h = g.h, end = g.dipoleEnd, beta = 1 / kT;
  const L3 = (2 * Math.PI * beta / m) ** 1.5;
  const nW = omega.length;
  const freeFree = new Float64Array(nW), boundFree = new Float64Array(nW), boundBound = new Float64Array(nW);
  const rule = gaussLegendre(options.nodes);
  const sMax = Math.sqrt(options.Ecut);
  const sNodes: number[] = [], sWeights: number[] = [];
  for (let p = 0; p < options.panels; p++) {
    const a = (sMax * p) / options.panels, b = (sMax * (p + 1)) / options.panels;
    for (let j = 0; j < options.nodes; j++) {
      sNodes.push(0.5 * (a + b) + 0.5 * (b - a) * rule.nodes[j]);
      sWeights.push(0.5 * (b - a) * rule.weights[j]);
    }
  }
  const nS = sNodes.length, len = g.R.length;
  const overlap = (a: Float64Array, b: Float64Array, from: number) => {
    let s = 0;
    for (let i = from; i <= end; i++) s += a[i] * mu[i] * b[i];
    return s * h;
  };
  // One side of every free–free transition sits at the threshold nodes E = s² (the initial state for ω ≥ 0, the
  // final state for ω < 0): those states are cached per l. The other side (E = s² + |ω|) is solved once per
  // (ω, node, l) and serves both partners l ± 1.
  const eMax = options.Ecut + Math.max(0, ...omega.map(Math.abs));
  const starts = new Map<number, number>();
  const startFor = (l: number) => {
    let st = starts.get(l);
    if (st === undefined) starts.set(l, (st = startIndex(g, l, eMax)));
    return st;
  };
  const solve = (l: number, E: number, into: Float64Array): Float64Array | null => {
    const st = continuumState(g, l, E, startFor(l), into);
    return st ? st.u : null;
  };
  const cache = new Map<number, Array<Float64Array | null>>();
  const threshold = (l: number) => {
    let c = cache.get(l);
    if (!c) cache.set(l, (c = sNodes.map((x) => solve(l, x * x, new Float64Array(len)))));
    return c;
  };
  const work = new Float64Array(len);
  const lTop = options.lMax + 1;
  const aMax = Math.max(0, ...omega.map(Math.abs));
  const kMax = Math.sqrt(2 * m * (options.Ecut + aMax));
  // the dipole's effective range (mu² above 1e-6 of its peak) sets the oscillation period of the matrix elements in k
  let peak = 0;
  for (let i = 0; i <= end; i++) peak = Math.max(peak, mu[i] * mu[i]);
  let first = 0, last = end;
  while (first < end && mu[first] * mu[first] < 1e-6 * peak) first++;
  while (last > first && mu[last] * mu[last] < 1e-6 * peak) last--;
  const span = Math.max(g.R[last] - g.R[first], 1);
  const nK = Math.max(16, Math.ceil((kMax * span * (options.samplesPerPeriod ?? 8)) / (2 * Math.PI)));
  const kGrid = Array.from({ length: nK + 1 }, (_, n) => (kMax * n) / nK);
  let solveCached: (n: number) => Float64Array | null = () => null;
  for (let ls = 0; ls <= lTop; ls++) {
    const partners = [ls - 1, ls + 1].filter((lc) => lc >= 0 && lc <= lTop);
    // matrix elements ⟨ls, k| mu |lc, s_j²⟩ on the k grid (interpolated method)
    let splines: Map<number, Array<ReturnType<typeof cubicSpline> | null>> | undefined;
    if (options.method !== 'direct') {
      splines = new Map();
      const table = new Map(partners.map((lc) => [lc, sNodes.map(() => new Float64Array(nK + 1))]));
      const needBound = bound.some((b) => Math.abs(b.l - ls) === 1);
      const kept: Array<Float64Array | null> = [];
      solveCached = (n: number) => kept[n] ?? null;
      for (let n = 1; n <= nK; n++) {
        const u = solve(ls, (kGrid[n] * kGrid[n]) / (2 * m), needBound ? new Float64Array(len) : work);
        if (needBound) kept[n] = u;
        if (!u) continue;
        for (const lc of partners) {
          const th = threshold(lc), row = table.get(lc)!;
          const from = Math.max(startFor(ls), startFor(lc));
          for (let j = 0; j < nS; j++) if (th[j]) row[j][n] = overlap(u, th[j]!, from);
        }
      }
      for (const lc of partners) splines.set(lc, table.get(lc)!.map((row, j) => (threshold(lc)[j] ? cubicSpline(kGrid, Array.from(row)) : null)));
      // bound–free (ω > 0) and free–bound (ω < 0) with the free wave in ls: the same k grid, a spline per level
      for (const b of bound) {
        if (Math.abs(b.l - ls) !== 1) continue;
        const row = new Float64Array(nK + 1);
        for (let n = 1; n <= nK; n++) {
          const u = solveCached(n);
          if (u) row[n] = overlap(u, b.u, Math.max(startFor(ls), b.start));
        }
        const sp = cubicSpline(kGrid, Array.from(row));
        for (let w = 0; w < nW; w++) {
          const om = omega[w], Efree = b.E + Math.abs(om);
          if (om === 0 || !(Efree > 0)) continue;
          const k = Math.sqrt(2 * m * Efree);
          const M = evaluateSpline(sp, k)[0];
          const Ei = om > 0 ? b.E : Efree;
          boundFree[w] += L3 * (2 / Math.PI) * Math.max(b.l, ls) * Math.exp(-beta * Ei) * (m / k) * M * M;
        }
      }
    }
    for (let w = 0; w < nW; w++) {
      const om = omega[w], a = Math.abs(om);
      // free–free pairs (initial l ≤ lMax): ω ≥ 0: initial = partner (threshold side), final = ls; ω < 0: initial = ls
      const active = partners.filter((lc) => (om >= 0 ? lc : ls) <= options.lMax);
      if (active.length === 0) continue;
      let sum = 0;
      for (let j = 0; j < nS; j++) {
        const s0 = sNodes[j];
        const Elow = s0 * s0, Ehigh = Elow + a;
        if (!(Elow > 0) || !(Ehigh > 0)) continue;
        if (active.every((lc) => !threshold(lc)[j])) continue; // the threshold side is shut out by the barrier
        const kLow = Math.sqrt(2 * m * Elow), kHigh = Math.sqrt(2 * m * Ehigh);
        const Ei = om >= 0 ? Elow : Ehigh;
        const weight = sWeights[j] * 2 * s0 * (m / kLow) * (m / kHigh) * Math.exp(-beta * Ei);
        const us = splines ? undefined : solve(ls, Ehigh, work);
        if (!splines && !us) continue;
        for (const lc of active) {
          const uc = threshold(lc)[j];
          if (!uc) continue;
          const M = splines ? evaluateSpline(splines.get(lc)![j]!, kHigh)[0] : overlap(us!, uc, Math.max(startFor(ls), startFor(lc)));
          sum += Math.max(ls, lc) * weight * M * M;
        }
      }
      freeFree[w] += L3 * (4 / (Math.PI * Math.PI)) * sum;
    }
    cache.delete(ls - 2);
    options.onProgress?.(ls + 1, lTop + 1);
  }
  // bound–free, free–bound and bound–bound
  for (const b of bound) {
    for (const lf of [b.l - 1, b.l + 1]) {
      if (lf < 0 || options.method !== 'direct') continue; // the interpolated method did these in the l loop
      const ang = Math.max(b.l, lf);
      for (let w = 0; w < nW; w++) {
        const om = omega[w];
        if (om > 0 && b.E + om > 0) {
          const Ef = b.E + om, kf = Math.sqrt(2 * m * Ef);
          const uf = solve(lf, Ef, work);
          if (uf) {
            const M = overlap(uf, b.u, 0);
            boundFree[w] += L3 * (2 / Math.PI) * ang * Math.exp(-beta * b.E) * (m / kf) * M * M;
          }
        }
        if (om < 0 && b.E - om > 0) {
          // free (l_f) → bound b: initial energy E_b + |ω|
          const Ei = b.E - om, ki = Math.sqrt(2 * m * Ei);
          const ui = solve(lf, Ei, work);
          if (ui) {
            const M = overlap(ui, b.u, 0);
            boundFree[w] += L3 * (2 / Math.PI) * ang * Math.exp(-beta * Ei) * (m / ki) * M * M;
          }
        }
      }
    }
    for (const f of bound) {
      if (Math.abs(f.l - b.l) !== 1) continue;
      const M = overlap(f.u, b.u, 0);
      const weight = L3 * Math.max(b.l, f.l) * Math.exp(-beta * b.E) * M * M;
      binLine(omega, boundBound, f.E - b.E, weight);
    }
  }
  const S = new Float64Array(nW);
  for (let w = 0; w < nW; w++) S[w] = freeFree[w] + boundFree[w] + boundBound[w];
  return { omega, S, freeFree, boundFree, boundBound };
}

/** Add a line of area `weight` at frequency x to a uniform grid, shared linearly between its neighbours. */
function binLine(omega: Float64Array, out: Float64Array, x: number, weight: number): void {
  const n = omega.length;
  if (n < 2) return;
  const step = omega[1] - omega[0];
  const t = (x - omega[0]) / step;
  const i = Math.floor(t);
  if (i < 0 || i >= n - 1) return;
  const f = t - i;
  out[i] += (weight * (1 - f)) / step;
  out[i + 1] += (weight * f) / step;
}
