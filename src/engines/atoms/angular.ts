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

interface SphereGrid {
  weight: Float64Array;
  x: Float64Array;
  y: Float64Array;
  z: Float64Array;
  /** harmonics[harmonicIndex(l, m)][point] */
  harmonics: Float64Array[];
}

let grid: SphereGrid | undefined;

function sphereGrid(): SphereGrid {
  if (grid) return grid;
  const gl = gaussLegendre(N_THETA);
  const count = N_THETA * N_PHI;
  const weight = new Float64Array(count), x = new Float64Array(count), y = new Float64Array(count), z = new Float64Array(count);
  const nh = (ANGULAR_L_MAX + 1) ** 2;
  const harmonics = Array.from({ length: nh }, () => new Float64Array(count));
  // the normalisations N_lm and the azimuthal factors, once per (l, |m|) and per (φ_j, m) instead of per point
  const norms = Array.from({ length: ANGULAR_L_MAX + 1 }, (_, l) =>
    Array.from({ length: l + 1 }, (_, am) => Math.sqrt(((2 * l + 1) / (4 * Math.PI)) * (factorial(l - am) / factorial(l + am)))),
  );
  const trigs = Array.from({ length: N_PHI }, (_, j) => {
    const phi = (2 * Math.PI * j) / N_PHI;
    return Array.from({ length: 2 * ANGULAR_L_MAX + 1 }, (_, mi) => {
      const m = mi - ANGULAR_L_MAX, am = Math.abs(m);
      return m === 0 ? 1 : m > 0 ? Math.SQRT2 * Math.cos(m * phi) : Math.SQRT2 * Math.sin(am * phi);
    });
  });
  const legendre = Array.from({ length: N_THETA }, (_, i) => associatedLegendre(gl.nodes[i], ANGULAR_L_MAX));
  for (let i = 0, k = 0; i < N_THETA; i++) {
    const ct = gl.nodes[i];
    const st = Math.sqrt(1 - ct * ct);
    for (let j = 0; j < N_PHI; j++, k++) {
      const phi = (2 * Math.PI * j) / N_PHI;
      weight[k] = (gl.weights[i] * 2 * Math.PI) / N_PHI;
      x[k] = st * Math.cos(phi);
      y[k] = st * Math.sin(phi);
      z[k] = ct;
    }
  }
  // one harmonic at a time over all points (point k = i·N_PHI + j): a short, tight loop per table row
  for (let l = 0; l <= ANGULAR_L_MAX; l++)
    for (let m = -l; m <= l; m++) {
      const am = Math.abs(m), norm = norms[l][am], mi = m + ANGULAR_L_MAX;
      const h = harmonics[harmonicIndex(l, m)];
      for (let i = 0, k = 0; i < N_THETA; i++) {
        const p = legendre[i][l][am];
        for (let j = 0; j < N_PHI; j++, k++) h[k] = norm * p * trigs[j][mi];
      }
    }
  grid = { weight, x, y, z, harmonics };
  return grid;
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
  const g = sphereGrid();
  const f = new Float64Array(g.weight.length);
  const src = g.harmonics[harmonicIndex(l, m)];
  for (let i = 0; i < f.length; i++) f[i] = g.weight[i] * src[i] * g.x[i] ** p[0] * g.y[i] ** p[1] * g.z[i] ** p[2];
  const out: AngularTerm[] = [];
  for (let lp = (l + k) % 2; lp <= Math.min(lMax, l + k); lp += 2) {
    for (let mp = -lp; mp <= lp; mp++) {
      const h = g.harmonics[harmonicIndex(lp, mp)];
      let s = 0;
      for (let i = 0; i < f.length; i++) s += f[i] * h[i];
      if (Math.abs(s) > 1e-13) out.push({ l: lp, m: mp, value: s });
    }
  }
  termCache.set(key, out);
  return out;
}

/** <l' 0| P_L(cos θ) |l 0> = 2π ∫ N_l'0 N_l0 P_l' P_L P_l d(cos θ), exact by Gauss–Legendre. */
export function legendreCoupling(lp: number, L: number, l: number): number {
  const gl = gaussLegendre(N_THETA);
  let s = 0;
  for (let i = 0; i < N_THETA; i++) {
    const P = associatedLegendre(gl.nodes[i], Math.max(lp, L, l));
    s += gl.weights[i] * P[lp][0] * P[L][0] * P[l][0];
  }
  return 2 * Math.PI * Math.sqrt(((2 * lp + 1) * (2 * l + 1)) / (16 * Math.PI * Math.PI)) * s;
}
