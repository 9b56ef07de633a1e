/**
 * Response functions of a QDO in closed form.
 *
 * Isotropic (see src/model/drude.ts for the formulas and sources):
 *   alpha_l(iu) = alpha_l (l w)²/((l w)² + u²),  B(0; iu, −iu) = B w²/(w² + u²).
 * Cartesian (any QDO, anisotropic included): with M_p = −q r^p and the exact harmonic matrix elements
 *   <n|(a + a†)^k|0> = k! / (2^j j! sqrt(n!)),  k − n = 2j ≥ 0   (Hermite expansion of x^k; common practice),
 *   χ_{p,p'}(iu) = q² Σ_{n≠0} 2 ω_n c_p(n) c_p'(n) / (ω_n² + u²).
 * A static field F along z only shifts the oscillator, z → z + z0 with z0 = −qF/k_z (k_z = m w_z²), so
 *   ∂χ_{p,p'}/∂F = −(q/k_z) [p_z χ_{p−ẑ,p'} + p'_z χ_{p,p'−ẑ}]   (exact; derived here),
 * with χ of a constant (degree 0) equal to zero. Permanent moments: <M_p> = −q Π_i <0|x_i^p_i|0>.
 */
import {
  type DrudeSpecies,
  drudeHyperpolarisabilityB,
  drudeMultipolePolarisability,
  isotropicParameters,
} from '../../model/drude.js';
import { type Monomial, degree, monomialKey } from '../../hamiltonian/monomial.js';
import type { IsotropicResponse, TensorResponse } from './response-model.js';
import { factorial } from '../../math/combinatorics.js';

/** Closed-form isotropic response of an isotropic QDO. */
export function drudeIsotropicResponse(s: DrudeSpecies): IsotropicResponse {
  const p = isotropicParameters(s);
  const alphaStatic = [0, 1, 2, 3].map((l) => (l === 0 ? 0 : drudeMultipolePolarisability(p, l)));
  const B = drudeHyperpolarisabilityB(p);
  const w2 = p.w * p.w;
  return {
    alpha: (l, u) => (alphaStatic[l] * l * l * w2) / (l * l * w2 + u * u),
    hyperB: (u) => (B * w2) / (w2 + u * u),
    scale: p.w,
  };
}


/** <n|(a + a†)^k|0> for all n (nonzero only for n = k, k−2, …). */
function hermiteCoefficients(k: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let j = 0; 2 * j <= k; j++) {
    const n = k - 2 * j;
    out.push([n, factorial(k) / (2 ** j * factorial(j) * Math.sqrt(factorial(n)))]);
  }
  return out;
}

const tensorCache = new WeakMap<DrudeSpecies, TensorResponse>();

/** Closed-form Cartesian response of any QDO (cached per species object: species are immutable data). */
export function drudeTensorResponse(s: DrudeSpecies): TensorResponse {
  let hit = tensorCache.get(s);
  if (!hit) tensorCache.set(s, (hit = buildTensorResponse(s)));
  return hit;
}

function buildTensorResponse(s: DrudeSpecies): TensorResponse {
  const { q, m, w } = s;
  const len = w.map((wi) => 1 / Math.sqrt(2 * m * wi));
  const kz = m * w[2] * w[2];
  const stateKey = (nx: number, ny: number, nz: number) => nx + 64 * ny + 4096 * nz;
  // spectral lines of r^p|0>: excited state → [ω_n, <n|r^p|0>]
  const lineCache = new Map<number, Map<number, [number, number]>>();
  const lines = (p: Monomial) => {
    const key = monomialKey(p);
    let hit = lineCache.get(key);
    if (hit) return hit;
    hit = new Map();
    for (const [nx, cx] of hermiteCoefficients(p[0]))
      for (const [ny, cy] of hermiteCoefficients(p[1]))
        for (const [nz, cz] of hermiteCoefficients(p[2])) {
          if (nx + ny + nz === 0) continue;
          const amp = cx * cy * cz * len[0] ** p[0] * len[1] ** p[1] * len[2] ** p[2];
          hit.set(stateKey(nx, ny, nz), [nx * w[0] + ny * w[1] + nz * w[2], amp]);
        }
    lineCache.set(key, hit);
    return hit;
  };
  // χ_{r^p, r^p'}(iu) = Σ 2ω a a'/(ω² + u²): the common lines as flat [ω², 2ω a a', …], cached per pair
  const pairCache = new Map<number, Float64Array>();
  const pairLines = (p: Monomial, pp: Monomial): Float64Array => {
    const key = monomialKey(p) * 32768 + monomialKey(pp);
    let hit = pairCache.get(key);
    if (hit) return hit;
    const out: number[] = [];
    if (degree(p) > 0 && degree(pp) > 0) {
      const b = lines(pp);
      for (const [state, [omega, amp]] of lines(p)) {
        const other = b.get(state);
        if (other) out.push(omega * omega, 2 * omega * amp * other[1]);
      }
    }
    hit = Float64Array.from(out);
    pairCache.set(key, hit);
    return hit;
  };
  const chiCoord = (p: Monomial, pp: Monomial, u: number): number => {
    const l = pairLines(p, pp);
    const u2 = u * u;
    let sum = 0;
    for (let i = 0; i < l.length; i += 2) sum += l[i + 1] / (l[i] + u2);
    return sum;
  };
  const lower = (p: Monomial): Monomial => [p[0], p[1], p[2] - 1];
  const groundAmp = (k: number) => hermiteCoefficients(k).find(([n]) => n === 0)?.[1] ?? 0;
  return {
    chi: (p, pp, u) => q * q * chiCoord(p, pp, u),
    dChiDFz(p, pp, u) {
      let s2 = 0;
      if (p[2] > 0) s2 += p[2] * chiCoord(lower(p), pp, u);
      if (pp[2] > 0) s2 += pp[2] * chiCoord(p, lower(pp), u);
      return (-q / kz) * q * q * s2;
    },
    mean: (p) => (degree(p) === 0 ? 0 : -q * p.reduce((acc, k, i) => acc * groundAmp(k) * len[i] ** k, 1)),
    scale: (w[0] + w[1] + w[2]) / 3,
  };
}
