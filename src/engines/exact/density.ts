/**
 * Where the charge moves: the change of each centre's Drude-particle density, interacting minus isolated
 * ground state, in the plane y = 0 that contains the bond axis, from the exact pair wave function.
 *
 * The one-particle density of centre A is ρ_A(r) = Σ_ij D_ij ψ_i(r) ψ_j(r)*, with the reduced density matrix
 * D_ij = Σ_k Ψ(i, k) Ψ(j, k) (trace over B's states k); the isolated ground state has D = |0><0|, so
 * Δρ = Σ_ij (D − |0><0|)_ij ψ_i ψ_j*. Total L_z = 0 makes D block-diagonal in m, so Δρ is cylindrically
 * symmetric and the plane shows all of it.
 *
 * The circular states on the plane y = 0 are real (derived here): expanding
 * a+† = (a_x† + i a_y†)/√2, a−† = (a_x† − i a_y†)/√2 in |n+, n−> = (a+†)^n+ (a−†)^n− |0>/sqrt(n+! n−!) gives
 *   ψ(x, 0) = Σ_jk C(n+, j) C(n−, k) 2^-(n+ + n−)/2 (−1)^((a−b)/2) sqrt((j+k)! (a+b)! / (n+! n−!)) φ_(j+k)(x) φ_(a+b)(0),
 * a = n+ − j, b = n− − k, over even a + b (φ_q(0) = 0 for odd q), with the normalised Hermite functions
 *   φ_0(x) = (m w/π)^¼ e^(−ξ²/2),  φ_(p+1) = sqrt(2/(p+1)) ξ φ_p − sqrt(p/(p+1)) φ_(p−1),  ξ = sqrt(m w) x
 * (common practice; any QM text). Checks in the tests: ∫ Δρ = 0 and −q ∫ z Δρ d³r = mu_z.
 */
import type { DrudeSpecies } from '../../model/drude.js';
import type { ExactState } from './exact-solver.js';
import { factorial, binomial } from '../../math/combinatorics.js';

export interface DensityMap {
  centre: 'a' | 'b';
  /** Grid across the axis (x, bohr, relative to the centre). */
  x: Float64Array;
  /** Grid along the axis (z, bohr, relative to the centre; the partner is towards +z for A, −z for B). */
  z: Float64Array;
  /** Δρ(x_i, z_j) at index i * z.length + j, in a0^-3 (probability density of the Drude particle). */
  change: Float64Array;
  /** Isolated ground-state density at the centre, a0^-3 (for scale). */
  peak: number;
}

/** Normalised Hermite functions φ_0 … φ_P of an oscillator (mass m, frequency w) at the points x. */
export function hermiteFunctions(m: number, w: number, P: number, x: ArrayLike<number>): Float64Array[] {
  const root = Math.sqrt(m * w);
  const norm = Math.sqrt(root / Math.sqrt(Math.PI));
  const out = Array.from({ length: P + 1 }, () => new Float64Array(x.length));
  for (let i = 0; i < x.length; i++) {
    const xi = root * x[i];
    let prev = 0;
    let cur = norm * Math.exp(-0.5 * xi * xi);
    out[0][i] = cur;
    for (let p = 0; p < P; p++) {
      const next = Math.sqrt(2 / (p + 1)) * xi * cur - Math.sqrt(p / (p + 1)) * prev;
      prev = cur;
      cur = next;
      out[p + 1][i] = cur;
    }
  }
  return out;
}


/** ψ_{n+,n−}(x, y = 0) on the grid, from the Hermite functions φ_p(x) and their values φ_q(0). */
function circularOnPlane(nPlus: number, nMinus: number, phiX: Float64Array[], phi0: Float64Array): Float64Array {
  const out = new Float64Array(phiX[0].length);
  const pre = 2 ** (-(nPlus + nMinus) / 2) / Math.sqrt(factorial(nPlus) * factorial(nMinus));
  for (let j = 0; j <= nPlus; j++)
    for (let k = 0; k <= nMinus; k++) {
      const a = nPlus - j, b = nMinus - k;
      if ((a + b) % 2 !== 0) continue;
      const p = j + k, q = a + b;
      const c = pre * binomial(nPlus, j) * binomial(nMinus, k) * ((a - b) / 2 % 2 === 0 ? 1 : -1) * Math.sqrt(factorial(p) * factorial(q)) * phi0[q];
      if (c === 0) continue;
      const f = phiX[p];
      for (let i = 0; i < out.length; i++) out[i] += c * f[i];
    }
  return out;
}

/** Reduced density matrix of one centre minus |0><0|, as sparse entries over local state indices. */
function reducedChange(state: ExactState, centre: 'a' | 'b'): Map<number, number> {
  const { basis } = state.model;
  const L = basis.local.count;
  const { mirror } = basis.local;
  // product amplitudes grouped by the other centre's state
  const groups = new Map<number, Array<[number, number]>>();
  const add = (mine: number, other: number, amp: number) => {
    let g = groups.get(other);
    if (!g) groups.set(other, (g = []));
    g.push([mine, amp]);
  };
  for (let S = 0; S < state.vector.length; S++) {
    const c = state.vector[S];
    if (c === 0) continue;
    const iA = basis.repA[S], iB = basis.repB[S];
    const amp = basis.paired[S] ? c * Math.SQRT1_2 : c;
    const put = (a: number, b: number) => (centre === 'a' ? add(a, b, amp) : add(b, a, amp));
    put(iA, iB);
    if (basis.paired[S]) put(mirror[iA], mirror[iB]);
  }
  const D = new Map<number, number>();
  for (const g of groups.values())
    for (const [i, ai] of g)
      for (const [j, aj] of g) {
        const key = i * L + j;
        D.set(key, (D.get(key) ?? 0) + ai * aj);
      }
  D.set(0, (D.get(0) ?? 0) - 1);
  return D;
}

/** Δρ of one centre on a grid of the plane y = 0 (x across, z along the axis; bohr, relative to the centre). */
export function densityChange(state: ExactState, centre: 'a' | 'b', x: Float64Array, z: Float64Array): DensityMap {
  const species: DrudeSpecies = centre === 'a' ? state.model.A : state.model.B;
  const { local } = state.model.basis;
  const L = local.count;
  const P = local.maxQuanta;
  const wPerp = species.w[0], wZ = species.w[2];
  const phiX = hermiteFunctions(species.m, wPerp, P, x);
  const phi0 = hermiteFunctions(species.m, wPerp, P, [0]).map((f) => f[0]);
  const phiZ = hermiteFunctions(species.m, wZ, P, z);
  const D = reducedChange(state, centre);
  const planar = new Map<number, Float64Array>();
  const planarOf = (i: number) => {
    let f = planar.get(i);
    if (!f) planar.set(i, (f = circularOnPlane(local.nPlus[i], local.nMinus[i], phiX, Float64Array.from(phi0))));
    return f;
  };
  // M_ab(x) = Σ_{ij: nz_i = a, nz_j = b} D_ij ψ_i(x) ψ_j(x); then Δρ(x, z) = Σ_ab M_ab(x) φ_a(z) φ_b(z)
  const K = P + 1;
  const M = new Float64Array(x.length * K * K);
  for (const [key, d] of D) {
    if (d === 0) continue;
    const i = Math.floor(key / L), j = key % L;
    const fi = planarOf(i), fj = planarOf(j);
    const off = local.nZ[i] * K + local.nZ[j];
    for (let ix = 0; ix < x.length; ix++) M[ix * K * K + off] += d * fi[ix] * fj[ix];
  }
  const change = new Float64Array(x.length * z.length);
  for (let ix = 0; ix < x.length; ix++)
    for (let a = 0; a < K; a++)
      for (let b = 0; b < K; b++) {
        const m = M[ix * K * K + a * K + b];
        if (m === 0) continue;
        const fa = phiZ[a], fb = phiZ[b];
        for (let iz = 0; iz < z.length; iz++) change[ix * z.length + iz] += m * fa[iz] * fb[iz];
      }
  // |ψ0(0)|² = φ0⊥(0)⁴ φ0z(0)² (x and y across the axis, z along it)
  const peak = phi0[0] ** 4 * hermiteFunctions(species.m, wZ, 0, [0])[0][0] ** 2;
  return { centre, x, z, change, peak };
}
