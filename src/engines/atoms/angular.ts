/**
 * Angular factors for one-electron atoms in a basis of real spherical harmonics S_lm (m = −l … l):
 *   S_lm = N_lm P_l^|m|(cos θ) × {1 (m = 0), √2 cos mφ (m > 0), √2 sin |m|φ (m < 0)},
 *   N_lm = sqrt((2l+1)/(4π) (l−|m|)!/(l+|m|)!)   (common practice).
 * A Cartesian monomial of the unit vector, x̂^a ŷ^b ẑ^c, between two harmonics is integrated over the sphere by a
 * product rule — Gauss–Legendre in cos θ × uniform in φ — that is exact for the polynomial degree involved
 * (degree l + l' + a + b + c ≤ 31 here), so the factors are exact up to rounding.
 */
import { gaussLegendre } from '../../math/gauss-legendre.js';
import { type Monomial, monomialKey } from '../../hamiltonian/monomial.js';
import { factorial } from '../../math/combinatorics.js';

/** Highest l supported by the angular tables. */
export const ANGULAR_L_MAX = 8;
const N_THETA = 16;
const N_PHI = 32;

/** Associated Legendre functions P_l^m(x), 0 ≤ m ≤ l ≤ lMax, without the Condon–Shortley phase; index [l][m]. */
function associatedLegendre(x: number, lMax: number): number[][] {
  const P = Array.from({ length: lMax + 1 }, () => new Array<number>(lMax + 1).fill(0));
  const s = Math.sqrt(Math.max(0, 1 - x * x));
  let pmm = 1;
  for (let m = 0; m <= lMax; m++) {
    if (m > 0) pmm *= (2 * m - 1) * s;
    P[m][m] = pmm;
    if (m + 1 <= lMax) P[m + 1][m] = x * (2 * m + 1) * pmm;
    for (let l = m + 2; l <= lMax; l++) P[l][m] = ((2 * l - 1) * x * P[l - 1][m] - (l + m - 1) * P[l - 2][m]) / (l - m);
  }
  return P;
}


/** Index of (l, m) in a flat list: l² + l + m. */
export const harmonicIndex = (l: number, m: number): number => l * l + l + m;

/**
 * The product rule's two factors. On the grid (θ_i, φ_j) every integrand here is a product of a θ part and a φ
 * part — S_lm = N_lm P_l^|m|(cos θ) T_m(φ), x̂^a ŷ^b ẑ^c = sin^(a+b)θ cos^c θ · cos^a φ sin^b φ — so the double sum
 * is the product of two single sums (derived here: the weights are products too): 16 + 32 terms per factor
 * instead of 512.
 */
interface SphereRule {
  /** Gauss–Legendre weights and cos θ_i, sin θ_i. */
  weight: Float64Array;
  cos: Float64Array;
  sin: Float64Array;
  /** legendre[l][|m|][i] = N_l|m| P_l^|m|(cos θ_i) */
  legendre: Float64Array[][];
  /** azimuth[m + ANGULAR_L_MAX][j] = T_m(φ_j), and cos φ_j, sin φ_j */
  azimuth: Float64Array[];
  cosPhi: Float64Array;
  sinPhi: Float64Array;
}

let rule: SphereRule | undefined;

function sphereRule(): SphereRule {
  if (rule) return rule;
  const gl = gaussLegendre(N_THETA);
  const cos = Float64Array.from(gl.nodes), sin = cos.map((c) => Math.sqrt(1 - c * c));
  const legendre = Array.from({ length: ANGULAR_L_MAX + 1 }, () => Array.from({ length: ANGULAR_L_MAX + 1 }, () => new Float64Array(N_THETA)));
  const norm = (l: number, am: number) => Math.sqrt(((2 * l + 1) / (4 * Math.PI)) * (factorial(l - am) / factorial(l + am)));
  for (let i = 0; i < N_THETA; i++) {
    const P = associatedLegendre(cos[i], ANGULAR_L_MAX);
    for (let l = 0; l <= ANGULAR_L_MAX; l++) for (let am = 0; am <= l; am++) legendre[l][am][i] = norm(l, am) * P[l][am];
  }
  const cosPhi = new Float64Array(N_PHI), sinPhi = new Float64Array(N_PHI);
  const azimuth = Array.from({ length: 2 * ANGULAR_L_MAX + 1 }, () => new Float64Array(N_PHI));
  for (let j = 0; j < N_PHI; j++) {
    const phi = (2 * Math.PI * j) / N_PHI;
    cosPhi[j] = Math.cos(phi);
    sinPhi[j] = Math.sin(phi);
    for (let m = -ANGULAR_L_MAX; m <= ANGULAR_L_MAX; m++)
      azimuth[m + ANGULAR_L_MAX][j] = m === 0 ? 1 : m > 0 ? Math.SQRT2 * Math.cos(m * phi) : Math.SQRT2 * Math.sin(-m * phi);
  }
  rule = { weight: Float64Array.from(gl.weights), cos, sin, legendre, azimuth, cosPhi, sinPhi };
  return rule;
}

/** values[j] ** e for each exponent e, built on first use (the same doubles as raising each time). */
function powerTable(values: Float64Array): (e: number) => Float64Array {
  const byExponent: Float64Array[] = [];
  return (e) => (byExponent[e] ??= values.map((x) => x ** e));
}
type Powers = (e: number) => Float64Array;
let powers: { cosPhi: Powers; sinPhi: Powers; cos: Powers; sin: Powers } | undefined;
/** Powers of cos φ_j, sin φ_j, cos θ_i, sin θ_i. */
function powersOf(g: SphereRule) {
  return (powers ??= { cosPhi: powerTable(g.cosPhi), sinPhi: powerTable(g.sinPhi), cos: powerTable(g.cos), sin: powerTable(g.sin) });
}

/** (2π/N_φ) Σ_j T_m(φ_j) T_m'(φ_j) cos^a φ_j sin^b φ_j, cached per (m, m', a, b). */
const azimuthCache = new Map<number, number>();
function azimuthFactor(g: SphereRule, m: number, mp: number, a: number, b: number): number {
  const key = (((m + 16) * 32 + (mp + 16)) * 32 + a) * 32 + b;
  const hit = azimuthCache.get(key);
  if (hit !== undefined) return hit;
  const t = g.azimuth[m + ANGULAR_L_MAX], tp = g.azimuth[mp + ANGULAR_L_MAX];
  const ca = powersOf(g).cosPhi(a), sb = powersOf(g).sinPhi(b);
  let s = 0;
  for (let j = 0; j < N_PHI; j++) s += t[j] * tp[j] * ca[j] * sb[j];
  const value = (2 * Math.PI * s) / N_PHI;
  azimuthCache.set(key, value);
  return value;
}

/** One nonzero angular factor <l' m'| x̂^a ŷ^b ẑ^c |l m>. */
export interface AngularTerm {
  l: number;
  m: number;
  value: number;
}

const termCache = new Map<number, AngularTerm[]>();

/**
 * All nonzero <l' m'| x̂^a ŷ^b ẑ^c |l m> with l' ≤ lMax (|value| below 1e-13 counts as zero: the exact value is
 * then zero by symmetry). Cached.
 */
export function angularTerms(p: Monomial, l: number, m: number, lMax: number): readonly AngularTerm[] {
  const key = ((monomialKey(p) * 16 + l) * 32 + (m + 16)) * 16 + lMax;
  const hit = termCache.get(key);
  if (hit) return hit;
  const k = p[0] + p[1] + p[2];
  if (l + lMax + k > 31 || lMax > ANGULAR_L_MAX || l > ANGULAR_L_MAX) throw new RangeError('angular degree beyond the exact product rule');
  const g = sphereRule();
  // θ part of the integrand without the partner: w_i N P_l^|m| sin^(a+b) cos^c
  const f = new Float64Array(N_THETA);
  const src = g.legendre[l][Math.abs(m)];
  const sq = powersOf(g).sin(p[0] + p[1]), cr = powersOf(g).cos(p[2]);
  for (let i = 0; i < N_THETA; i++) f[i] = g.weight[i] * src[i] * sq[i] * cr[i];
  const out: AngularTerm[] = [];
  for (let lp = (l + k) % 2; lp <= Math.min(lMax, l + k); lp += 2) {
    for (let mp = -lp; mp <= lp; mp++) {
      // |θ factor| ≤ 1/(2π) (Cauchy–Schwarz with the normalisation of both harmonics), so a φ factor ≤ 1e-13 makes
      // the product fall below the zero threshold whatever the θ factor: skip the θ sum
      const phi = azimuthFactor(g, m, mp, p[0], p[1]);
      if (Math.abs(phi) <= 1e-13) continue;
      const h = g.legendre[lp][Math.abs(mp)];
      let theta = 0;
      for (let i = 0; i < N_THETA; i++) theta += f[i] * h[i];
      const s = theta * phi;
      if (Math.abs(s) > 1e-13) out.push({ l: lp, m: mp, value: s });
    }
  }
  termCache.set(key, out);
  return out;
}

const couplingCache = new Map<number, number>();

/** <l' 0| P_L(cos θ) |l 0> = 2π ∫ N_l'0 N_l0 P_l' P_L P_l d(cos θ), exact by Gauss–Legendre. Cached. */
export function legendreCoupling(lp: number, L: number, l: number): number {
  const key = (lp * 64 + L) * 64 + l;
  let value = couplingCache.get(key);
  if (value === undefined) couplingCache.set(key, (value = legendreCouplingSum(lp, L, l)));
  return value;
}

function legendreCouplingSum(lp: number, L: number, l: number): number {
  const gl = gaussLegendre(N_THETA);
  let s = 0;
  for (let i = 0; i < N_THETA; i++) {
    const P = associatedLegendre(gl.nodes[i], Math.max(lp, L, l));
    s += gl.weights[i] * P[lp][0] * P[L][0] * P[l][0];
  }
  return 2 * Math.PI * Math.sqrt(((2 * lp + 1) * (2 * l + 1)) / (16 * Math.PI * Math.PI)) * s;
}
