/**
 * Angular factors for closed-shell atoms with complex spherical harmonics Y_lm (Condon–Shortley phase).
 *
 *   Wigner 3j symbols by Racah's formula (e.g. A. R. Edmonds, Angular Momentum in Quantum Mechanics, 1957, eq. 3.7.3);
 *   c^k(l m, l' m') = √(4π/(2k+1)) ∫ Y*_lm Y_{k,m−m'} Y_l'm' dΩ
 *                   = (−1)^m √((2l+1)(2l'+1)) (l k l'; 0 0 0)(l k l'; −m m−m' m')     (Condon–Shortley),
 * so that ⟨ab|cd⟩ = δ(m_a+m_b, m_c+m_d) Σ_k c^k(a, c) c^k(d, b) R^k(ac; bd) (Slater–Condon, common practice).
 *
 * Every perturbation here is axial (M = 0) and of natural parity, so a rank-k operator between (l m) and (l' m)
 * is O_red · γ^k_{l l'}(m) with γ^k_{l l'}(m) = c^k(l m, l' m) normalised to Σ_m γ² = 1 (Wigner–Eckart; the
 * normalisation is our convention, derived here). γ is symmetric in l ↔ l', so reduced matrices of symmetric
 * operators are symmetric.
 */
import { factorial } from '../../../math/combinatorics.js';

/** Wigner 3j symbol (j1 j2 j3; m1 m2 m3) for integer arguments. */
export function threeJ(j1: number, j2: number, j3: number, m1: number, m2: number, m3: number): number {
  if (m1 + m2 + m3 !== 0) return 0;
  if (j3 < Math.abs(j1 - j2) || j3 > j1 + j2) return 0;
  if (Math.abs(m1) > j1 || Math.abs(m2) > j2 || Math.abs(m3) > j3) return 0;
  const tri = (factorial(j1 + j2 - j3) * factorial(j1 - j2 + j3) * factorial(-j1 + j2 + j3)) / factorial(j1 + j2 + j3 + 1);
  const pre = Math.sqrt(
    tri *
      factorial(j1 + m1) * factorial(j1 - m1) * factorial(j2 + m2) * factorial(j2 - m2) * factorial(j3 + m3) * factorial(j3 - m3),
  );
  const tMin = Math.max(0, j2 - j3 - m1, j1 - j3 + m2);
  const tMax = Math.min(j1 + j2 - j3, j1 - m1, j2 + m2);
  let sum = 0;
  for (let t = tMin; t <= tMax; t++) {
    const den =
      factorial(t) * factorial(j3 - j2 + t + m1) * factorial(j3 - j1 + t - m2) * factorial(j1 + j2 - j3 - t) * factorial(j1 - t - m1) * factorial(j2 - t + m2);
    sum += (t % 2 === 0 ? 1 : -1) / den;
  }
  const phase = (j1 - j2 - m3) % 2 === 0 ? 1 : -1;
  return phase * pre * sum;
}

/** c^k(l m, l' m') (Condon–Shortley). */
export function gauntC(k: number, l: number, m: number, lp: number, mp: number): number {
  const a = threeJ(l, k, lp, 0, 0, 0);
  if (a === 0) return 0;
  const ph = Math.abs(m) % 2 === 0 ? 1 : -1;
  return ph * Math.sqrt((2 * l + 1) * (2 * lp + 1)) * a * threeJ(l, k, lp, -m, m - mp, mp);
}

/** True when a rank-k, natural-parity, M = 0 operator connects channels l and l'. */
export const connects = (l: number, k: number, lp: number): boolean => (l + k + lp) % 2 === 0 && k >= Math.abs(l - lp) && k <= l + lp;

const gammaCache = new Map<string, Float64Array>();

/**
 * γ^k_{l l'}(m) for m = −min(l, l') … min(l, l'), stored at index m + min(l, l'); empty when k does not connect
 * l and l'.
 */
export function pairFactors(l: number, k: number, lp: number): Float64Array {
  const key = `${l},${k},${lp}`;
  let g = gammaCache.get(key);
  if (g) return g;
  const mm = Math.min(l, lp);
  g = new Float64Array(connects(l, k, lp) ? 2 * mm + 1 : 0);
  let norm = 0;
  for (let i = 0; i < g.length; i++) {
    g[i] = gauntC(k, l, i - mm, lp, i - mm);
    norm += g[i] * g[i];
  }
  for (let i = 0; i < g.length; i++) g[i] /= Math.sqrt(norm);
  gammaCache.set(key, g);
  return g;
}

/** γ^k_{l l'}(m), 0 when |m| exceeds min(l, l') or k does not connect the channels. */
export function pairFactor(l: number, k: number, lp: number, m: number): number {
  const g = pairFactors(l, k, lp);
  const mm = Math.min(l, lp);
  return g.length === 0 || Math.abs(m) > mm ? 0 : g[m + mm];
}

/**
 * ⟨l m| C^k_0 |l' m⟩ in reduced form for the normalised γ: ⟨l m|C^k_0|l' m⟩ = reducedLegendre(l, k, l') γ^k_{l l'}(m).
 */
export function reducedLegendre(l: number, k: number, lp: number): number {
  const g = pairFactors(l, k, lp);
  const mm = Math.min(l, lp);
  let s = 0;
  for (let i = 0; i < g.length; i++) s += g[i] * gauntC(k, l, i - mm, lp, i - mm);
  return s;
}

const coupledCache = new Map<string, number>();

/**
 * Coupled two-electron angular factor for excitations (orbital pair p,q of rank K) and (r,s) of rank K:
 *   Σ_{m,m'} γ^K_{l1 l2}(m) γ^K_{l3 l4}(m') c^k(lA mA, lB mB) c^k(lC mC, lD mD)
 * where the four c^k arguments pick their (l, m) from the pairs: `pattern` lists for A, B, C, D which of
 * (1: l1 with m, 2: l2 with m, 3: l3 with m', 4: l4 with m') they are. Derived here (Wigner–Eckart + Slater–Condon).
 */
export function coupledFactor(l1: number, l2: number, l3: number, l4: number, K: number, k: number, pattern: readonly [number, number, number, number]): number {
  const key = `${l1},${l2},${l3},${l4},${K},${k},${pattern.join('')}`;
  const hit = coupledCache.get(key);
  if (hit !== undefined) return hit;
  const ls = [0, l1, l2, l3, l4];
  const g12 = pairFactors(l1, K, l2), g34 = pairFactors(l3, K, l4);
  const m12 = Math.min(l1, l2), m34 = Math.min(l3, l4);
  let s = 0;
  for (let i = 0; i < g12.length; i++)
    for (let j = 0; j < g34.length; j++) {
      const m = i - m12, mp = j - m34;
      const ms = [0, m, m, mp, mp];
      const [a, b, c, d] = pattern;
      s += g12[i] * g34[j] * gauntC(k, ls[a], ms[a], ls[b], ms[b]) * gauntC(k, ls[c], ms[c], ls[d], ms[d]);
    }
  coupledCache.set(key, s);
  return s;
}
