/**
 * Radial Schrödinger equation of the relative motion (hbar = 1, m the reduced mass, atomic units)
 *   u''(R) = [2m (V(R) − E) + l(l + 1)/R²] u(R)
 * on a uniform grid by the Numerov method (B. Numerov, Mon. Not. R. Astron. Soc. 84, 592 (1924); error O(h⁴)),
 * started with u = 0 deep in the classically forbidden region (the regular solution).
 * - Continuum states are normalised to unit asymptotic amplitude, u → sin(kR − lπ/2 + δ_l), by matching to
 *   Riccati–Bessel functions at two outer points where V is negligible; with the factor 2/π they are
 *   normalised to δ(k − k').
 * - Bound states are found by node counting (the number of nodes of the regular solution at E equals the number
 *   of levels below E: Sturm oscillation theorem) and bisection, then built by outward and inward integration
 *   matched at the outer turning point and normalised to ∫u² dR = 1.
 */
import { riccatiBessel } from './riccati-bessel.js';

export interface RadialGrid {
  mass: number;
  h: number;
  /** R_i = R[0] + i h, i = 0 … R.length − 1 (the far end is used by bound states only). */
  R: Float64Array;
  /** 2m V(R_i). */
  twoMV: Float64Array;
  /** 1/R_i² (0 at R = 0, where u = 0). */
  invR2: Float64Array;
  /** Index of the continuum matching point (outer end for continuum states). */
  match: number;
  /** Index of the last point where the dipole matters (matrix elements run to here). */
  dipoleEnd: number;
}

/** Build the grid from R0 to Rfar with step h. */
export function radialGrid(V: (R: number) => number, mass: number, R0: number, h: number, Rdipole: number, Rmatch: number, Rfar: number): RadialGrid {
  const n = Math.ceil((Rfar - R0) / h) + 1;
  const R = new Float64Array(n), twoMV = new Float64Array(n), invR2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    R[i] = R0 + i * h;
    twoMV[i] = 2 * mass * V(R[i]);
    invR2[i] = R[i] > 0 ? 1 / (R[i] * R[i]) : 0; // at R = 0 the regular solution starts with u = 0, so the term drops out
  }
  const idx = (x: number) => Math.min(n - 1, Math.round((x - R0) / h));
  return { mass, h, R, twoMV, invR2, match: idx(Rmatch), dipoleEnd: idx(Rdipole) };
}

/**
 * First index for the regular solution of angular momentum l at energies up to E: the point where the WKB
 * decay integral ∫κ dR measured inward from the inner turning point exceeds 40 (the wave there is < e^-40).
 */
export function startIndex(g: RadialGrid, l: number, E: number): number {
  const L = l * (l + 1), twoME = 2 * g.mass * E;
  const n = g.R.length;
  let i = g.R[0] > 0 ? 0 : 1;
  while (i < n - 1 && !(g.twoMV[i] + L * g.invR2[i] - twoME <= 0)) i++; // first allowed point
  // Numerov needs h² f/12 well below 1: near R = 0 the centrifugal term sets a smallest start (u ∝ R^(l+1) is tiny there)
  // (h² l(l+1)/(12 R²) ≤ 1/4 for R ≥ h √(l(l+1)/3))
  const floor = Math.min(n - 1, Math.max(0, Math.ceil(Math.sqrt(L / 3) - g.R[0] / g.h)));
  let s = 0;
  while (i > floor && s < 40) {
    i--;
    const f = g.twoMV[i] + L * g.invR2[i] - twoME;
    s += Math.sqrt(Math.max(f, 0)) * g.h;
  }
  return i;
}

/**
 * Numerov propagation of the regular solution from `start` to `end` (inclusive) into u (zeros before start).
 * Returns the number of sign changes (nodes). Rescales on the way to avoid overflow.
 */
export function numerovOutward(g: RadialGrid, l: number, E: number, start: number, end: number, u: Float64Array, countNodes = true): number {
  const L = l * (l + 1), twoME = 2 * g.mass * E, c = (g.h * g.h) / 12;
  const V = g.twoMV, inv = g.invR2;
  u.fill(0, 0, start);
  u[start] = 0;
  u[start + 1] = 1e-300;
  // a_i = 1 − c f_i; u_{i+1} a_{i+1} = 2 u_i (1 + 5 c f_i) − u_{i−1} a_{i−1} = u_i (12 − 10 a_i) − u_{i−1} a_{i−1}
  let aPrev = 1 - c * (V[start] + L * inv[start] - twoME);
  let aCur = 1 - c * (V[start + 1] + L * inv[start + 1] - twoME);
  let uPrev = 0, uCur = 1e-300, nodes = 0;
  for (let i = start + 1; i < end; i++) {
    const aNext = 1 - c * (V[i + 1] + L * inv[i + 1] - twoME);
    let next = (uCur * (12 - 10 * aCur) - uPrev * aPrev) / aNext;
    if (countNodes && next !== 0 && uCur !== 0 && next > 0 !== uCur > 0) nodes++;
    if (!(Math.abs(next) < 1e200)) {
      for (let k = start; k <= i; k++) u[k] *= 1e-200;
      next *= 1e-200;
      uCur *= 1e-200;
    }
    u[i + 1] = next;
    uPrev = uCur;
    uCur = next;
    aPrev = aCur;
    aCur = aNext;
  }
  return nodes;
}

/** Result of a continuum solution: u normalised to unit asymptotic amplitude, or null when negligible. */
export interface ContinuumState {
  u: Float64Array;
  start: number;
  /** Phase shift δ_l (mod π). */
  phase: number;
}

/**
 * The continuum solution at energy E > 0 normalised to u → sin(kR − lπ/2 + δ). Returns null when the
 * centrifugal barrier keeps the wave out of the matching region (inner amplitude < e^-35: negligible).
 * `u` is a work array of the grid's length (overwritten and returned inside the result).
 */
export function continuumState(g: RadialGrid, l: number, E: number, start: number, u: Float64Array): ContinuumState | null {
  const k = Math.sqrt(2 * g.mass * E);
  const end = g.match;
  const Rend = g.R[end];
  const L = l * (l + 1);
  if (L > 0 && k * Rend < Math.sqrt(L)) {
    // free centrifugal decay from the turning point sqrt(L)/k back to Rend
    const Rt = Math.sqrt(L) / k;
    const steps = 64;
    let s = 0;
    for (let j = 0; j < steps; j++) {
      const r = Rend + ((j + 0.5) / steps) * (Rt - Rend);
      s += Math.sqrt(Math.max(L / (r * r) - k * k, 0)) * ((Rt - Rend) / steps);
    }
    if (s > 35) return null;
  }
  numerovOutward(g, l, E, start, end, u, false);
  // match at two points about a quarter wavelength apart
  const span = Math.max(2, Math.min(Math.round(Math.PI / (2 * k * g.h)), Math.floor((end - start) / 4)));
  const i1 = end - span, i2 = end;
  const [j1, n1] = riccatiBessel(l, k * g.R[i1]);
  const [j2, n2] = riccatiBessel(l, k * g.R[i2]);
  // u_i = P ĵ_i − Q n̂_i with P = A cos δ, Q = A sin δ
  const det = n1 * j2 - j1 * n2;
  const P = (n1 * u[i2] - n2 * u[i1]) / det;
  const Q = (j1 * u[i2] - j2 * u[i1]) / det;
  const A = Math.hypot(P, Q);
  if (!(A > 0) || !Number.isFinite(A)) return null;
  const inv = 1 / A;
  for (let i = start; i <= end; i++) u[i] *= inv;
  return { u, start, phase: Math.atan2(Q, P) };
}

/** A bound level: energy (Eh), normalised u on the grid, angular momentum. */
export interface BoundState {
  l: number;
  E: number;
  u: Float64Array;
  start: number;
  /** Quasi-bound (orbiting resonance behind the centrifugal barrier, E > 0): its WKB width Γ (Eh). */
  width?: number;
}

/**
 * Quasi-bound levels of angular momentum l: energies between 0 and the top of the centrifugal barrier where the
 * wave is trapped inside the well. Found like bound levels with the box wall at the barrier top (the Dirichlet
 * levels approach the resonance energies up to terms of order Γ); width by the WKB tunnelling formula
 * Γ ≈ (ΔE/2π) e^(−2∫κ dR) through the barrier, ΔE the level spacing (common practice; e.g. R. J. Le Roy,
 * R. B. Bernstein, J. Chem. Phys. 54, 5114 (1971)). Each level is refined with the box wall moved to the outer turning point (shift ~Γ instead of ~√(Γ ΔE)); u is normalised inside the barrier top and zero beyond.
 */
export function quasiBoundStates(g: RadialGrid, l: number): BoundState[] {
  const n = g.R.length, L = l * (l + 1), m2 = 2 * g.mass;
  if (l === 0) return [];
  const veff = (i: number) => (g.twoMV[i] + L * g.invR2[i]) / m2;
  const well = innerWell(g, l);
  if (!well) return [];
  const { iw, ib } = well;
  const top = veff(ib);
  if (!(top > 0)) return [];
  const start = startIndex(g, l, top);
  const work = new Float64Array(n);
  const nodesAt = (E: number) => numerovOutward(g, l, E, start, ib, work);
  const below = nodesAt(1e-300);
  const count = nodesAt(top) - below;
  const out: BoundState[] = [];
  for (let v = 0; v < count; v++) {
    let lo = 0, hi = top;
    for (let it = 0; it < 200 && hi - lo > 1e-13 * hi; it++) {
      const mid = 0.5 * (lo + hi);
      if (nodesAt(mid) - below > v) hi = mid;
      else lo = mid;
    }
    let E = 0.5 * (lo + hi);
    let iout = ib;
    // the wall at the barrier top shifts the level by up to ~√(Γ ΔE); at the outer turning point only by ~Γ
    while (iout < n - 1 && veff(iout) > E) iout++;
    if (iout < n - 1) {
      const nodesOut = (x: number) => numerovOutward(g, l, x, start, iout, work);
      const belowOut = nodesOut(1e-300);
      let a = 0, b = E;
      for (let it = 0; it < 200 && b - a > 1e-14 * b; it++) {
        const mid = 0.5 * (a + b);
        if (nodesOut(mid) - belowOut > v) b = mid;
        else a = mid;
      }
      E = 0.5 * (a + b);
    }
    // the trapped wave, normalised inside the barrier top (outward integration beyond it, under the barrier, is
    // unstable; the tail left out is of relative order e^(−2∫κ) over the outer half of the barrier)
    const wall = ib;
    const u = new Float64Array(n);
    numerovOutward(g, l, E, start, wall, u);
    let peak = 0;
    for (let i = start; i <= wall; i++) peak = Math.max(peak, Math.abs(u[i]));
    let norm = 0;
    for (let i = start; i <= wall; i++) (u[i] /= peak), (norm += u[i] * u[i]);
    norm = Math.sqrt(norm * g.h);
    for (let i = start; i <= wall; i++) u[i] /= norm;
    // tunnelling integral through the barrier
    let theta = 0;
    for (let i = iw; i < n; i++) {
      const d = veff(i) - E;
      if (d > 0 && i > iw) theta += Math.sqrt(m2 * d) * g.h;
      else if (i > ib) break;
    }
    out.push({ l, E, u, start, width: theta }); // the tunnelling integral for now; the width below
  }
  // widths from the level spacing (the last level uses the spacing below it)
  for (let v = 0; v < out.length; v++) {
    const spacing = v + 1 < out.length ? out[v + 1].E - out[v].E : v > 0 ? out[v].E - out[v - 1].E : top - out[v].E;
    out[v].width = (spacing / (2 * Math.PI)) * Math.exp(-2 * (out[v].width as number));
  }
  return out;
}

/**
 * The inner well of V_eff = V + l(l+1)/(2mR²) seen from the repulsive wall: the first local minimum iw and the
 * barrier top ib (the first local maximum after it), or null when V_eff has no such well on the grid. The well
 * bottom may lie above zero energy (then every level in it is quasi-bound); a global minimum would miss those
 * wells, since V_eff → 0⁺ at large R.
 */
export function innerWell(g: RadialGrid, l: number): { iw: number; ib: number } | null {
  const n = g.R.length, L = l * (l + 1);
  const f = (i: number) => g.twoMV[i] + L * g.invR2[i];
  let iw = g.R[0] > 0 ? 0 : 1;
  while (iw < n - 1 && !(f(iw + 1) >= f(iw))) iw++;
  let ib = iw;
  while (ib < n - 1 && !(f(ib + 1) <= f(ib))) ib++;
  if (iw >= n - 2 || ib >= n - 2 || ib === iw) return null;
  return { iw, ib };
}

/**
 * The top of the inner well's barrier: energy V_eff(R_b) (Eh) and the barrier frequency ω_b = √(|V_eff''(R_b)|/m)
 * (ħ = 1). Transmission through a parabolic barrier changes over energies ~ω_b/2π around its top
 * (E. C. Kemble, Phys. Rev. 48, 549 (1935); quoted from memory), where barrier-top resonances sit.
 */
export function barrierTop(g: RadialGrid, l: number): { E: number; omega: number } | null {
  const well = innerWell(g, l);
  if (!well) return null;
  const L = l * (l + 1), i = well.ib, f = (j: number) => g.twoMV[j] + L * g.invR2[j];
  const curvature = Math.abs(f(i + 1) - 2 * f(i) + f(i - 1)) / (g.h * g.h); // |d²(2mV_eff)/dR²|
  const E = f(i) / (2 * g.mass);
  return E > 0 ? { E, omega: Math.sqrt(curvature / 2) / g.mass } : null;
}

/** All bound levels of angular momentum l on the grid (box boundary at the far end), lowest first. */
export function boundStates(g: RadialGrid, l: number): BoundState[] {
  const n = g.R.length, L = l * (l + 1);
  let vmin = Infinity;
  for (let i = 0; i < n; i++) vmin = Math.min(vmin, (g.twoMV[i] + L * g.invR2[i]) / (2 * g.mass));
  if (!(vmin < 0)) return [];
  const work = new Float64Array(n);
  const start = startIndex(g, l, 0);
  const nodesAt = (E: number) => numerovOutward(g, l, E, start, n - 1, work);
  const count = nodesAt(-1e-300);
  const levels: BoundState[] = [];
  for (let v = 0; v < count; v++) {
    let lo = vmin, hi = -1e-300;
    for (let it = 0; it < 200 && hi - lo > 1e-13 * Math.abs(lo); it++) {
      const mid = 0.5 * (lo + hi);
      if (nodesAt(mid) > v) hi = mid;
      else lo = mid;
    }
    const E = 0.5 * (lo + hi);
    levels.push({ l, E, u: boundWave(g, l, E, start), start });
  }
  return levels;
}

/** The bound wave at an eigenvalue E: outward and inward solutions joined at the outer turning point. */
function boundWave(g: RadialGrid, l: number, E: number, start: number): Float64Array {
  const n = g.R.length, L = l * (l + 1), twoME = 2 * g.mass * E, c = (g.h * g.h) / 12;
  const f = (i: number) => g.twoMV[i] + L * g.invR2[i] - twoME;
  let turn = n - 2;
  while (turn > start + 2 && f(turn) > 0) turn--;
  const u = new Float64Array(n);
  numerovOutward(g, l, E, start, turn + 1, u);
  const out = u[turn];
  // inward from the far end
  const w = new Float64Array(n);
  w[n - 1] = 0;
  w[n - 2] = 1e-300;
  for (let i = n - 2; i > turn; i--) {
    w[i - 1] = (2 * w[i] * (1 + 5 * c * f(i)) - w[i + 1] * (1 - c * f(i + 1))) / (1 - c * f(i - 1));
    if (Math.abs(w[i - 1]) > 1e200) for (let k = i - 1; k < n; k++) w[k] *= 1e-200;
  }
  // join in O(1) numbers: out and w[turn] may be ~1e-280 and ~1e+200, whose plain ratio underflows to 0
  let peak = 0;
  for (let i = start; i <= turn; i++) peak = Math.max(peak, Math.abs(u[i]));
  for (let i = start; i <= turn; i++) u[i] /= peak; // the raw values may be ~1e-280: square only after scaling
  const joint = out / peak, wt = w[turn];
  for (let i = turn + 1; i < n; i++) u[i] = (w[i] / wt) * joint;
  peak = 0;
  for (let i = start; i < n; i++) peak = Math.max(peak, Math.abs(u[i]));
  for (let i = start; i < n; i++) u[i] /= peak;
  let norm = 0;
  for (let i = start; i < n; i++) norm += u[i] * u[i];
  norm = Math.sqrt(norm * g.h);
  for (let i = 0; i < n; i++) u[i] /= norm;
  return u;
}
