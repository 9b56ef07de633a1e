/**
 * Radial basis of normalised Slater functions χ(r) = N r^(l+1) e^(−ζ r) (the radial function P = r R) per angular
 * momentum l, on a logarithmic quadrature grid. Atomic units.
 *
 * One-electron integrals are analytic (∫ r^n e^(−a r) dr = n!/a^(n+1)). Two-electron integrals use the Hartree
 * screening function of a basis-pair product ρ = r^n e^(−a r),
 *   Y^k(r) = r^(−k−1) ∫_0^r t^k ρ dt + r^k ∫_r^∞ t^(−k−1) ρ dt
 *          = r^(−k−1) γ(n+k+1, a r)/a^(n+k+1) + r^k Γ(n−k, a r)/a^(n−k)
 * (D. R. Hartree, The Calculation of Atomic Structures, 1957; C. Froese Fischer, The Hartree–Fock Method for Atoms,
 * 1977), evaluated exactly point by point; the remaining single integral R^k = ∫ ρ' V^k dr has an analytic integrand in
 * x = ln r and decays at both ends, so the trapezoidal rule in x converges geometrically (common practice;
 * L. N. Trefethen, J. A. C. Weideman, SIAM Rev. 56, 385 (2014)). The grid step is checked in the tests.
 */
import { factorial } from '../../../math/combinatorics.js';

/** Logarithmic grid r_g = e^(x0 + g h) with trapezoidal weights w_g = h r_g. */
export interface RadialGrid {
  r: Float64Array;
  w: Float64Array;
  h: number;
}

/** A grid covering [rMin, rMax] with step h in ln r. */
export function logGrid(rMin: number, rMax: number, h: number): RadialGrid {
  const n = Math.ceil(Math.log(rMax / rMin) / h) + 1;
  const r = new Float64Array(n), w = new Float64Array(n);
  for (let g = 0; g < n; g++) {
    r[g] = rMin * Math.exp(g * h);
    w[g] = h * r[g];
  }
  return { r, w, h };
}

/** The Slater exponents of each channel l = 0 … lMax. */
export interface SlaterBasis {
  /** zeta[l] = exponents of channel l. */
  zeta: Float64Array[];
  grid: RadialGrid;
}

/** ∫_0^∞ r^n e^(−a r) dr. */
const moment = (n: number, a: number): number => factorial(n) / a ** (n + 1);

/** Normalisation of r^(l+1) e^(−ζ r). */
export const slaterNorm = (l: number, z: number): number => Math.sqrt((2 * z) ** (2 * l + 3) / factorial(2 * l + 2));

/** Values of the channel's functions on the grid: out[p·G + g]. */
export function basisOnGrid(b: SlaterBasis, l: number): Float64Array {
  const { r } = b.grid;
  const z = b.zeta[l], G = r.length;
  const out = new Float64Array(z.length * G);
  for (let p = 0; p < z.length; p++) {
    const N = slaterNorm(l, z[p]);
    for (let g = 0; g < G; g++) out[p * G + g] = N * r[g] ** (l + 1) * Math.exp(-z[p] * r[g]);
  }
  return out;
}

/** Overlap, kinetic + nuclear attraction (charge Z) and r^k matrices of channel l (row-major n×n). */
export function oneElectronMatrices(b: SlaterBasis, l: number, Z: number): { S: Float64Array; H: Float64Array } {
  const z = b.zeta[l], n = z.length;
  const S = new Float64Array(n * n), H = new Float64Array(n * n);
  for (let p = 0; p < n; p++)
    for (let q = 0; q < n; q++) {
      const a = z[p] + z[q], NN = slaterNorm(l, z[p]) * slaterNorm(l, z[q]);
      S[p * n + q] = NN * moment(2 * l + 2, a);
      // ½∫χ'χ' + ½ l(l+1)∫χχ/r², χ' = N((l+1) r^l − ζ r^(l+1)) e^(−ζr)
      const kin =
        0.5 * NN * ((l + 1) ** 2 * moment(2 * l, a) - (l + 1) * a * moment(2 * l + 1, a) + z[p] * z[q] * moment(2 * l + 2, a)) +
        0.5 * l * (l + 1) * NN * moment(2 * l, a);
      H[p * n + q] = kin - Z * NN * moment(2 * l + 1, a);
    }
  return { S, H };
}

/** ∫ χ_p^(l) r^k χ_q^(l') dr for all p, q (row-major n_l × n_l'). */
export function radialMomentMatrix(b: SlaterBasis, l: number, lp: number, k: number): Float64Array {
  const z = b.zeta[l], zp = b.zeta[lp];
  const out = new Float64Array(z.length * zp.length);
  for (let p = 0; p < z.length; p++)
    for (let q = 0; q < zp.length; q++) out[p * zp.length + q] = slaterNorm(l, z[p]) * slaterNorm(lp, zp[q]) * moment(l + lp + 2 + k, z[p] + zp[q]);
  return out;
}

/** Γ(m, x)/(m−1)! = e^(−x) Σ_{j<m} x^j/j! for integer m ≥ 1 (ex = e^(−x) given). */
function upperRegularised(m: number, x: number, ex: number): number {
  let term = 1, s = 1;
  for (let j = 1; j < m; j++) {
    term *= x / j;
    s += term;
  }
  return ex * s;
}

/**
 * V^k(r)·w on the grid for every basis-pair product χ_p^(l) χ_q^(l'), out[(p·n' + q)·G + g]: the weighted
 * rank-k potentials, so that ∫ f V^k dr = Σ_g f_g out_g.
 */
export function pairScreening(b: SlaterBasis, l: number, lp: number, k: number): Float64Array {
  const { r, w } = b.grid;
  const G = r.length, z = b.zeta[l], zp = b.zeta[lp];
  const n = l + lp + 2;
  const m1 = n + k + 1, m2 = n - k;
  const f1 = factorial(m1 - 1), f2 = factorial(m2 - 1);
  // per-point powers and per-exponent exponentials, shared by all pairs
  const rn = Float64Array.from(r, (x) => x ** n), rk = Float64Array.from(r, (x) => x ** k), rk1 = Float64Array.from(r, (x) => x ** -(k + 1));
  const ez = Array.from(z, (zz) => Float64Array.from(r, (x) => Math.exp(-zz * x)));
  const ezp = Array.from(zp, (zz) => Float64Array.from(r, (x) => Math.exp(-zz * x)));
  const out = new Float64Array(z.length * zp.length * G);
  for (let p = 0; p < z.length; p++)
    for (let q = 0; q < zp.length; q++) {
      const a = z[p] + zp[q], NN = slaterNorm(l, z[p]) * slaterNorm(lp, zp[q]);
      const c1 = f1 / a ** m1, c2 = f2 / a ** m2;
      const base = (p * zp.length + q) * G;
      const e1 = ez[p], e2 = ezp[q];
      for (let g = 0; g < G; g++) {
        const x = a * r[g], ex = e1[g] * e2[g];
        let inner: number;
        if (x < m1) {
          // γ(m1, x) r^(−k−1)/a^m1 = r^n e^(−x) Σ_j x^j / (m1 (m1+1) … (m1+j))
          let term = 1 / m1, sum = term;
          for (let j = 1; j < 400 && term > 1e-17 * sum; j++) {
            term *= x / (m1 + j);
            sum += term;
          }
          inner = rn[g] * ex * sum;
        } else {
          inner = c1 * (1 - upperRegularised(m1, x, ex)) * rk1[g];
        }
        const outer = c2 * rk[g] * upperRegularised(m2, x, ex);
        out[base + g] = NN * (inner + outer) * w[g];
      }
    }
  return out;
}

/** Even-tempered exponents ζ_i = ζ_lo (ζ_hi/ζ_lo)^(i/(n−1)), i = 0 … n−1. */
export function evenTempered(n: number, zLo: number, zHi: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = zLo * (zHi / zLo) ** (n === 1 ? 0 : i / (n - 1));
  return out;
}
