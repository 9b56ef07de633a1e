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

const SAMPLED_DIRECTIONS = 1500;
/** The sampled directions and the axis directions, each ray with both signs; the same for every call. */
let directionCache: number[][] | undefined;
function candidateDirections(): number[][] {
  if (!directionCache) {
    directionCache = [];
    for (const nu of sphereDirections(SAMPLED_DIRECTIONS)) directionCache.push(nu, nu.map((x) => -x));
    // the axis directions (pure z displacements are often the worst)
    for (let i = 0; i < 6; i++)
      for (const sign of [1, -1]) {
        const nu = new Array<number>(6).fill(0);
        nu[i] = sign;
        directionCache.push(nu);
      }
  }
  return directionCache;
}

/**
 * Per order n, the monomials ν^e of the coupling's terms at every candidate direction (direction-major): the
 * species only scale them, a_n(ν) = qA qB/R^(n+1) Σ_t c_t (Π_i s_i^e_t,i) ν^e_t, so each call is one dot product
 * per direction.
 */
const directionMonomials = new Map<number, Float64Array>();
function candidateMonomials(n: number): Float64Array {
  let table = directionMonomials.get(n);
  if (!table) {
    const { e, factor6 } = couplingTermsFlat(n);
    const terms = e.length / 6;
    const directions = candidateDirections();
    table = new Float64Array(directions.length * terms);
    // ν_i^e at 6 e + i, by Math.pow as before (the same doubles); powers[0] = 1 pads short terms (exact)
    const powers = new Float64Array(6 * (n + 1));
    powers[0] = 1;
    directions.forEach((nu, d) => {
      for (let x = 1; x <= n; x++) for (let i = 0; i < 6; i++) powers[6 * x + i] = nu[i] ** x;
      for (let t = 0, f = 0; t < terms; t++, f += 6)
        table![d * terms + t] =
          1 * powers[factor6[f]] * powers[factor6[f + 1]] * powers[factor6[f + 2]] * powers[factor6[f + 3]] * powers[factor6[f + 4]] * powers[factor6[f + 5]];
    });
    directionMonomials.set(n, table);
  }
  return table;
}

/** The order-n coupling flattened: coefficient and the six exponents of each term. */
interface FlatTerms {
  c: Float64Array;
  e: Uint8Array;
  /** The factors x_i^e of term t as indices 6 e + i into a power table, i ascending: factorStart[t] … factorStart[t+1]−1. */
  factorStart: Int32Array;
  /** The same six per term (a term has at most one factor per coordinate), padded with index 0 where the power table holds 1. */
  factor6: Int32Array;
  factor: Int32Array;
}
const flatTerms = new Map<number, FlatTerms>();
/** {@link FlatTerms} of the order-n coupling, built once per order. */
function couplingTermsFlat(n: number): FlatTerms {
  let flat = flatTerms.get(n);
  if (!flat) {
    const terms = drudeCouplingPolynomial(n);
    const factorStart = new Int32Array(terms.length + 1);
    const factor: number[] = [];
    terms.forEach((t, k) => {
      factorStart[k] = factor.length;
      t.e.forEach((e, i) => e && factor.push(6 * e + i));
    });
    factorStart[terms.length] = factor.length;
    const factor6 = new Int32Array(6 * terms.length);
    for (let k = 0; k < terms.length; k++)
      for (let f = factorStart[k]; f < factorStart[k + 1]; f++) factor6[6 * k + f - factorStart[k]] = factor[f];
    flat = {
      c: Float64Array.from(terms, (t) => t.c),
      e: Uint8Array.from(terms.flatMap((t) => [...t.e])),
      factorStart,
      factor: Int32Array.from(factor),
      factor6,
    };
    flatTerms.set(n, flat);
  }
  return flat;
}

/**
 * The radial search grid: τ_k = 10⁻³ · 1.15^k below 10⁷, by repeated multiplication. The first grid point where
 * U'(τ)/τ ≤ 0 brackets the barrier (with the grid point before it, or 0); rays whose slope stays positive on the
 * whole grid have no barrier.
 */
const RADIAL_GRID: Float64Array = (() => {
  const grid: number[] = [];
  for (let tau = 1e-3; tau < 1e7; tau *= 1.15) grid.push(tau);
  return Float64Array.from(grid);
})();

/** U'(τ)/τ = Σ_{n≥2} n a_n τ^(n−2) by Horner's rule. */
function slopeAt(a: Float64Array, order: number, tau: number): number {
  let s = 0;
  for (let n = order; n >= 2; n--) s = s * tau + n * a[n];
  return s;
}

/** Index of the first grid point ≥ x (RADIAL_GRID.length when none). */
function gridIndexAbove(x: number): number {
  let lo = 0, hi = RADIAL_GRID.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (RADIAL_GRID[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** d/dτ of {@link slopeAt}: Σ_{n≥3} n (n − 2) a_n τ^(n−3). */
function slopeDerivativeAt(a: Float64Array, order: number, tau: number): number {
  let s = 0;
  for (let n = order; n >= 3; n--) s = s * tau + n * (n - 2) * a[n];
  return s;
}

/**
 * The barrier along a ray from the bracketing grid point k (slope ≤ 0 there, > 0 at every grid point before):
 * the crossing in (τ_(k−1), τ_k], by Newton steps kept inside the shrinking bracket (a bisection step whenever
 * Newton would leave it; common practice) to rounding level, or `root` (the closed-form crossing) clamped to that
 * interval.
 */
function crossingIn(a: Float64Array, order: number, k: number, root?: number): number {
  let lo = k > 0 ? RADIAL_GRID[k - 1] : 0;
  let hi = RADIAL_GRID[k];
  if (root !== undefined) return Math.min(hi, Math.max(lo, root));
  let x = 0.5 * (lo + hi);
  for (let step = 0; step < 100; step++) {
    const s = slopeAt(a, order, x);
    if (s > 0) lo = x;
    else hi = x;
    let next = x - s / slopeDerivativeAt(a, order, x);
    if (Math.abs(next - x) <= 2 * Number.EPSILON * x) return Math.min(hi, Math.max(lo, next)); // converged
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (hi - lo <= 2 * Number.EPSILON * hi) return next;
    x = next;
  }
  return x;
}

/**
 * For orders above 4: the grid point k bracketing the first barrier of U(τ) = Σ a_n τ^n (a_2 > 0), i.e. the first
 * grid point where the slope is ≤ 0, or −1 when there is none. The scan skips runs of grid points [τ_j, τ_l] on
 * which the slope is provably positive: there it is at least 2 a_2 + Σ_{n≥3} n a_n τ^(n−2) with each positive term
 * taken at τ_j and each negative one at τ_l (derived here); when that bound also exceeds 10⁻¹⁰ of the terms'
 * magnitude, no computed slope in the run can be ≤ 0 either. Runs double while they can be skipped and shrink to
 * single grid points near a sign change, so the same first grid point is found as by evaluating every one.
 */
function barrierBracket(a: Float64Array, order: number): number {
  let negative = false;
  for (let n = 3; n <= order; n++) negative ||= a[n] < 0;
  if (!negative) return -1; // every term positive: the slope never turns
  const positiveOn = (low: number, high: number): boolean => {
    let bound = 2 * a[2], size = 2 * a[2];
    let pLow = 1, pHigh = 1;
    for (let n = 3; n <= order; n++) {
      pLow *= low;
      pHigh *= high;
      bound += n * a[n] * (a[n] > 0 ? pLow : pHigh);
      size += n * Math.abs(a[n]) * pHigh;
    }
    return bound > 1e-10 * size;
  };
  const last = RADIAL_GRID.length - 1;
  let step = 16;
  for (let k = 0; k <= last; ) {
    const j = Math.min(last, k + step - 1);
    if (positiveOn(RADIAL_GRID[k], RADIAL_GRID[j])) {
      k = j + 1;
      step *= 2;
    } else if (step > 1) step = Math.max(1, step >> 2);
    else if (slopeAt(a, order, RADIAL_GRID[k]) <= 0) return k;
    else k++;
  }
  return -1;
}

/**
 * First maximum τ_b of U(τ) = Σ a_n τ^n (a_2 > 0): the first grid point where the slope polynomial is ≤ 0, then the
 * crossing before it. The slope is linear for order 3 and quadratic for order 4: there its roots are taken in closed
 * form (numerically stable quadratic formula; common practice) and only the grid points next to them are evaluated;
 * higher orders scan the grid ({@link barrierBracket}) and refine the crossing ({@link crossingIn}).
 */
function firstBarrier(a: Float64Array, order: number): number {
  const b0 = 2 * a[2], b1 = order >= 3 ? 3 * a[3] : 0, b2 = order >= 4 ? 4 * a[4] : 0;
  if (order > 4) {
    const k = barrierBracket(a, order);
    return k < 0 ? Infinity : crossingIn(a, order, k);
  }
  // the first positive root r1 of b0 + b1 τ + b2 τ² (b0 > 0); the slope is ≤ 0 from r1 to the next root, if any
  let r1: number;
  if (b2 === 0) {
    if (!(b1 < 0)) return Infinity;
    r1 = -b0 / b1;
  } else {
    const disc = b1 * b1 - 4 * b2 * b0;
    if (b2 > 0 && (!(b1 < 0) || disc < 0)) return Infinity;
    const q = -0.5 * (b1 + (b1 < 0 ? -1 : 1) * Math.sqrt(disc));
    // b2 < 0: one positive root (the roots' product b0/b2 < 0); b2 > 0: two, the slope ≤ 0 between them
    const ra = q / b2, rb = b0 / q;
    r1 = ra > 0 ? (rb > 0 ? Math.min(ra, rb) : ra) : rb > 0 ? rb : Infinity;
  }
  // the first grid point with slope ≤ 0 lies next to r1 (rounding may move the sign change by an ulp)
  let k = gridIndexAbove(r1);
  if (k > 0 && slopeAt(a, order, RADIAL_GRID[k - 1]) <= 0) k--;
  if (k >= RADIAL_GRID.length || slopeAt(a, order, RADIAL_GRID[k]) > 0) return Infinity; // beyond the grid, or a dip between two grid points
  return crossingIn(a, order, k, r1);
}

/** Pattern searches started from the best sampled directions. */
const PATTERN_STARTS = 4;

/** Indices of the `count` smallest values, ascending, ties in index order (a stable sort's first `count`). */
function smallestFirst(values: Float64Array, count: number): number[] {
  const out: number[] = [];
  for (let d = 0; d < values.length; d++) {
    const v = values[d];
    if (out.length === count && !(v < values[out[count - 1]])) continue;
    let at = out.length;
    while (at > 0 && v < values[out[at - 1]]) at--;
    out.splice(at, 0, d);
    if (out.length > count) out.pop();
  }
  return out;
}

/**
 * Per candidate direction ν: at [d (order + 1)] the harmonic part Σ_i w_i ν_i², at [d (order + 1) + n] the sum
 * Σ_t c_t (Π_i s_i^e_t,i) ν^e_t of the order-n coupling — everything of a_n(ν) but the factor qA qB/R^(n+1), so
 * the table serves every R of a pair (the last few pairs are kept).
 */
const sumCache = new Map<string, Float64Array>();
function directionSums(
  A: DrudeSpecies,
  B: DrudeSpecies,
  order: number,
  scale: readonly number[],
  polys: ReadonlyArray<{ n: number; terms: FlatTerms }>,
): Float64Array {
  const key = `${order}|${A.q},${A.m},${A.w}|${B.q},${B.m},${B.w}`;
  const hit = sumCache.get(key);
  if (hit) return hit;
  const harmonic = [...A.w, ...B.w];
  const directions = candidateDirections();
  const width = order + 1;
  const sums = new Float64Array(directions.length * width);
  const scaledTerms = polys.map(({ terms }) =>
    Float64Array.from(terms.c, (c, t) => {
      let m = c;
      for (let i = 0; i < 6; i++) if (terms.e[6 * t + i]) m *= scale[i] ** terms.e[6 * t + i];
      return m;
    }),
  );
  const monomials = polys.map(({ n }) => candidateMonomials(n));
  for (let d = 0; d < directions.length; d++) {
    const nu = directions[d];
    let h = 0;
    for (let i = 0; i < 6; i++) h += harmonic[i] * nu[i] * nu[i];
    sums[d * width] = h;
    for (let p = 0; p < polys.length; p++) {
      const coeffs = scaledTerms[p], table = monomials[p], terms = coeffs.length;
      let s = 0;
      for (let t = 0, at = d * terms; t < terms; t++, at++) s += coeffs[t] * table[at];
      sums[d * width + polys[p].n] = s;
    }
  }
  if (sumCache.size >= 4) sumCache.delete(sumCache.keys().next().value!);
  sumCache.set(key, sums);
  return sums;
}

/** One scratch array kept between calls (fresh arrays are slow to touch on a busy machine). */
let scratchArray = new Float64Array(0);
const scratch = (length: number): Float64Array => {
  if (scratchArray.length < length) scratchArray = new Float64Array(length);
  return scratchArray.subarray(0, length);
};

/** Barrier check of the order-`order` multipole potential of the pair at separation R (bohr). */
export function localisationCheck(A: DrudeSpecies, B: DrudeSpecies, order: number, R: number): LocalisationCheck {
  const catastropheR = catastropheDistance(A, B);
  if (R <= catastropheR) return { barrier: 0, maxQuanta: -1, catastropheR };
  const scale = [...A.w.map((w) => 2 / Math.sqrt(2 * A.m * w)), ...B.w.map((w) => 2 / Math.sqrt(2 * B.m * w))];
  const harmonic = [...A.w, ...B.w];
  const polys: Array<{ n: number; terms: FlatTerms; factor: number }> = [];
  let maxExponent = 2;
  for (let n = 2; n <= order; n++) {
    polys.push({ n, terms: couplingTermsFlat(n), factor: (A.q * B.q) / R ** (n + 1) });
    maxExponent = n;
  }
  const a = new Float64Array(order + 1);
  const powers = new Float64Array(6 * (maxExponent + 1)); // x_i^e at 6 e + i; powers[0] = 1 pads short terms
  powers[0] = 1;

  /** First maximum τ_b of U along the unit direction ν (both signs of ν are separate rays). */
  const barrierAlong = (nu: readonly number[]): number => {
    for (let i = 0; i < 6; i++) {
      const x = nu[i] * scale[i];
      powers[6 + i] = x;
      for (let e = 2; e <= maxExponent; e++) powers[6 * e + i] = powers[6 * (e - 1) + i] * x;
    }
    a.fill(0);
    for (let i = 0; i < 6; i++) a[2] += harmonic[i] * nu[i] * nu[i];
    for (const { n, terms, factor } of polys) {
      const { c, factor6 } = terms;
      let s = 0;
      // the factors of each term in order, then × 1 (powers[0]) for the missing ones: exact, so the same doubles
      for (let t = 0, f = 0; t < c.length; t++, f += 6)
        s += c[t] * powers[factor6[f]] * powers[factor6[f + 1]] * powers[factor6[f + 2]] * powers[factor6[f + 3]] * powers[factor6[f + 4]] * powers[factor6[f + 5]];
      a[n] += factor * s;
    }
    if (a[2] <= 0) return 0;
    return firstBarrier(a, order);
  };

  // the candidate directions from their cached monomials: the term coefficients scaled once for this pair
  const sums = directionSums(A, B, order, scale, polys);
  const directions = candidateDirections();
  const taus = new Float64Array(directions.length);
  // orders above 4: first only the bracketing grid point of each ray; the crossing itself is refined only for rays
  // whose bracket reaches below the PATTERN_STARTS-th smallest bracket top (the others cannot be among the smallest
  // barriers: they lie above their bracket's bottom), and those keep their bracket top (never among the smallest)
  const bracketFirst = order > 4;
  const coefficients = bracketFirst ? scratch(directions.length * (order + 1)) : undefined;
  const brackets = bracketFirst ? new Int32Array(directions.length) : undefined;
  const width = order + 1;
  for (let d = 0; d < directions.length; d++) {
    a.fill(0);
    a[2] = sums[d * width];
    for (const { n, factor } of polys) a[n] += factor * sums[d * width + n];
    if (a[2] <= 0) taus[d] = 0;
    else if (!bracketFirst) taus[d] = firstBarrier(a, order);
    else {
      const k = barrierBracket(a, order);
      brackets![d] = k;
      taus[d] = k < 0 ? Infinity : RADIAL_GRID[k];
      coefficients!.set(a, d * (order + 1));
    }
  }
  if (bracketFirst) {
    const tops = smallestFirst(taus, PATTERN_STARTS);
    const threshold = taus[tops[tops.length - 1]];
    for (let d = 0; d < directions.length; d++) {
      const k = brackets![d];
      if (taus[d] === 0 || k < 0 || (k > 0 && RADIAL_GRID[k - 1] >= threshold)) continue;
      taus[d] = crossingIn(coefficients!.subarray(d * (order + 1), (d + 1) * (order + 1)), order, k);
    }
  }
  const starts = smallestFirst(taus, PATTERN_STARTS).map((d) => ({ nu: directions[d], tau: taus[d] }));
  let best = starts[0].tau;
  const trial = new Array<number>(6);
  for (const start of starts) {
    if (!Number.isFinite(start.tau) || start.tau === 0) continue;
    let { nu, tau } = start;
    for (let step = 0.2; step > 1e-4; step /= 2) {
      let improved = true;
      while (improved) {
        improved = false;
        for (let i = 0; i < 6; i++)
          for (let sign = 1; sign >= -1; sign -= 2) {
            // ν + sign·step·ê_i, normalised
            for (let j = 0; j < 6; j++) trial[j] = j === i ? nu[j] + sign * step : nu[j];
            const norm = Math.hypot(trial[0], trial[1], trial[2], trial[3], trial[4], trial[5]);
            for (let j = 0; j < 6; j++) trial[j] /= norm;
            const t = barrierAlong(trial);
            if (t < tau) {
              nu = trial.slice();
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
