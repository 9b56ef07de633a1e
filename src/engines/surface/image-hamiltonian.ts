/**
 * The image Hamiltonian of a neutral atom in front of a perfect conductor, multipole-expanded, as products of
 * the atom's own Cartesian moments M_p = Σ_i e_i x_i^p0 y_i^p1 z_i^p2 (about the atom's centre).
 *
 * Geometry: the surface is the plane z' = 0, the atom's centre sits at Z n (n the unit normal, pointing from the
 * surface to the atom). Each charge e_i at Z n + r_i has an image −e_i at −Z n + σ r_i (σ: reflection in the
 * plane), and the energy of charges in the field of the charges they induce carries a factor ½
 * (J. D. Jackson, Classical Electrodynamics, 3rd ed. 1999, §2.1 and §4.4):
 *   W = −½ Σ_ij e_i e_j / |2Z n + r_i − σ r_j|.
 * This is the pair interaction of multipole-coupling.ts (A = the image at the origin, B = the atom at R = 2Z along
 * n) with M^A_p = −(−1)^{p_z} M_p and M^B_p = M_p, times ½ (derived here), so in the surface frame (x', y', z' = n)
 *   W = Σ_n W_n / Z^(n+1),  W_n = −2^-(n+2) Σ_{|pA|+|pB|=n} c(pA, pB) (−1)^{pA_z} M_pA M_pB.
 * Neutrality removes every term without a moment on both sides. Checks (derived here, tests): W_2 =
 * −(μ² + μ_z²)/16 (the classic image dipole energy), and for hydrogen (e = −1 at r, nucleus at the centre)
 * W = 1/|2Z ẑ + r| − 1/(4(Z + z)) − 1/(4Z) term by term.
 * For a centre whose axes are tilted against the surface, the moments of the surface frame are rewritten in the
 * species' own axes: r' = E r with E's rows the surface axes (e1, e2, n) in species coordinates.
 */
import { type Monomial, monomialKey } from '../../hamiltonian/monomial.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { Vec3 } from '../../model/types.js';

/** c · M_pA M_pB (species axes); the operator W_n is the sum of its terms. Atomic units at Z = 1. */
export interface ImageTerm {
  c: number;
  pA: Monomial;
  pB: Monomial;
}

/** A polynomial in (x, y, z) keyed by {@link monomialKey}. */
export type Polynomial3 = Map<number, { p: Monomial; c: number }>;

/** Orthonormal surface axes (e1, e2, n) in species coordinates for a surface normal n (any length > 0). */
export function surfaceAxes(normal: Vec3): [Vec3, Vec3, Vec3] {
  const len = Math.hypot(...normal);
  const n = normal.map((x) => x / len) as Vec3;
  if (n[0] === 0 && n[1] === 0) return n[2] > 0 ? [[1, 0, 0], [0, 1, 0], [0, 0, 1]] : [[1, 0, 0], [0, -1, 0], [0, 0, -1]];
  const a: Vec3 = Math.abs(n[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const dot = a[0] * n[0] + a[1] * n[1] + a[2] * n[2];
  const e1raw = a.map((x, k) => x - dot * n[k]);
  const l1 = Math.hypot(...e1raw);
  const e1 = e1raw.map((x) => x / l1) as Vec3;
  const e2: Vec3 = [n[1] * e1[2] - n[2] * e1[1], n[2] * e1[0] - n[0] * e1[2], n[0] * e1[1] - n[1] * e1[0]];
  return [e1, e2, n];
}

function addInto(poly: Polynomial3, p: Monomial, c: number): void {
  const k = monomialKey(p);
  const prev = poly.get(k);
  poly.set(k, { p, c: (prev?.c ?? 0) + c });
}

/** (E r)^p as a polynomial in the species coordinates r (E's rows: the surface axes). */
export function rotatedMonomial(p: Monomial, axes: readonly Vec3[]): Polynomial3 {
  let poly: Polynomial3 = new Map([[0, { p: [0, 0, 0] as Monomial, c: 1 }]]);
  for (let a = 0; a < 3; a++)
    for (let k = 0; k < p[a]; k++) {
      const next: Polynomial3 = new Map();
      for (const t of poly.values())
        for (let j = 0; j < 3; j++) {
          const e = axes[a][j];
          if (e === 0) continue;
          const q: Monomial = [t.p[0] + (j === 0 ? 1 : 0), t.p[1] + (j === 1 ? 1 : 0), t.p[2] + (j === 2 ? 1 : 0)];
          addInto(next, q, t.c * e);
        }
      poly = next;
    }
  return poly;
}

const cache = new Map<string, ImageTerm[]>();

/** The terms of W_n (n ≥ 2) in the species axes, for a surface with unit normal `normal` (default +z). */
export function imageTerms(order: number, normal: Vec3 = [0, 0, 1]): ImageTerm[] {
  const key = `${order}|${normal.join(',')}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const axes = surfaceAxes(normal);
  const identity = axes[2][2] === 1;
  const scale = -(2 ** -(order + 2));
  const merged = new Map<number, ImageTerm>();
  const add = (c: number, pA: Monomial, pB: Monomial) => {
    const k = monomialKey(pA) * 32768 + monomialKey(pB);
    const prev = merged.get(k);
    if (prev) prev.c += c;
    else merged.set(k, { c, pA, pB });
  };
  for (const t of couplingTerms(order)) {
    const c = scale * t.c * (t.pA[2] % 2 === 0 ? 1 : -1);
    if (identity) {
      add(c, t.pA, t.pB);
      continue;
    }
    const a = rotatedMonomial(t.pA, axes), b = rotatedMonomial(t.pB, axes);
    for (const x of a.values()) for (const y of b.values()) add(c * x.c * y.c, x.p, y.p);
  }
  const terms = [...merged.values()].filter((t) => t.c !== 0);
  cache.set(key, terms);
  return terms;
}

/**
 * W_n of a one-particle centre (a QDO's Drude particle or hydrogen's electron, charge ∓q, the other charge at
 * the centre) as a polynomial in the particle's coordinates: M_pA M_pB = q² r^(pA+pB). Divide by Z^(n+1).
 */
export function imagePolynomial(order: number, q: number, normal: Vec3 = [0, 0, 1]): Polynomial3 {
  const poly: Polynomial3 = new Map();
  for (const t of imageTerms(order, normal)) {
    addInto(poly, [t.pA[0] + t.pB[0], t.pA[1] + t.pB[1], t.pA[2] + t.pB[2]], q * q * t.c);
  }
  for (const [k, t] of poly) if (t.c === 0) poly.delete(k);
  return poly;
}

/** The value of a {@link Polynomial3} at r. */
export function evaluatePolynomial3(poly: Polynomial3, r: readonly number[]): number {
  let s = 0;
  for (const t of poly.values()) s += t.c * r[0] ** t.p[0] * r[1] ** t.p[1] * r[2] ** t.p[2];
  return s;
}
