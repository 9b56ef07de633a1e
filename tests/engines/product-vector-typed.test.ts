/**
 * The typed-array paths of the perturbation route and of the hydrogen pseudo-spectrum give the numbers of the
 * formulas they replace, to 1e-13, on seeded random input:
 * - the route (product-grid.ts: compact state numbers, flat typed vectors, moments fetched before the arithmetic)
 *   against the previous evaluation with Map product vectors (product-vector.ts), written out below term by term
 *   from the formulas in the header of rspt.ts — every dipole component of both centres, no symmetry shortcut;
 * - the Sturmian channels (a symmetric tridiagonal problem, sturmian-spectrum.ts) against the dense generalised
 *   eigenproblem H c = E S c (Cholesky of S and the project's dense eigensolver), and the orthonormality of the
 *   pseudo-states through their radial integrals;
 * - the angular factors (a product of a θ and a φ sum, angular.ts) against the 16 × 32-point double sum;
 * - the closed-form D7.a of the basis check against the response route's quadrature.
 * Vector components that vanish by symmetry are compared against the scale of the vector (derived here: a
 * rounding residue has no relative precision). These are equivalence checks of faster evaluations; the numbers
 * themselves are checked against published values elsewhere (hydrogen.test.ts: H–H C6, C8, C10 of Z.-C. Yan,
 * J. F. Babb, A. Dalgarno, G. W. F. Drake, Phys. Rev. A 54, 2824 (1996), and hydrogen's exact static properties).
 */
import { describe, expect, test } from 'vitest';
import { AXIS_MONOMIALS, type Monomial, monomialsOfDegree } from '../../src/hamiltonian/monomial.js';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { hydrogenic } from '../../src/model/hydrogenic.js';
import type { Vec3 } from '../../src/model/types.js';
import { applyCoupling, applyLocal, dot, groundState, reducedResolvent, type ProductVector } from '../../src/engines/perturbation/product-vector.js';
import { couplingDot, localDot } from '../helpers/map-matrix-elements.js';
import type { LocalSpace } from '../../src/engines/perturbation/local-space.js';
import { DIPOLE_CHAINS, perturbationCoefficients } from '../../src/engines/perturbation/rspt.js';
import { localSpaceOf } from '../../src/engines/capabilities.js';
import { hydrogenicSpectrum } from '../../src/engines/atoms/sturmian-spectrum.js';
import { angularTerms } from '../../src/engines/atoms/angular.js';
import { likePairD7a, pseudoStateResponse } from '../../src/engines/atoms/pseudo-state-response.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';
import { gaussLegendre } from '../../src/math/gauss-legendre.js';
import { symmetricEigen } from '../../src/math/symmetric-eigen.js';
import { relDiff } from '../helpers/tolerance.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { randomDrude } from '../helpers/random-species.js';

const TOL = 1e-13;

/** The route's coefficients by the previous Map-based evaluation (rspt.ts header formulas, all components). */
function mapReference(A: LocalSpace, B: LocalSpace, spherical: readonly [boolean, boolean]) {
  const zero = groundState();
  const V0 = new Map<number, ProductVector>(), phi = new Map<number, ProductVector>();
  const v0 = (n: number) => V0.get(n) ?? V0.set(n, applyCoupling(couplingTerms(n), zero, A, B)).get(n)!;
  const ph = (n: number) => phi.get(n) ?? phi.set(n, reducedResolvent(v0(n), A, B)).get(n)!;
  const E1 = (n: number) => v0(n).get(0) ?? 0;
  const C = (power: number) => {
    let s = 0;
    for (let n = 2; n <= power - 4; n++) s += dot(v0(n), ph(power - 2 - n));
    return s;
  };
  const both = spherical[0] && spherical[1];
  const mixed = (n: number, np: number, on: 'a' | 'b'): Vec3 =>
    AXIS_MONOMIALS.map((p) => {
      const mu0 = applyLocal(p, on, zero, A, B);
      const chi = reducedResolvent(mu0, A, B);
      const viaPsi = couplingDot(couplingTerms(n), chi, ph(np), A, B) - E1(n) * dot(chi, ph(np)) + couplingDot(couplingTerms(np), chi, ph(n), A, B) - E1(np) * dot(chi, ph(n));
      return 2 * viaPsi + 2 * localDot(p, on, ph(n), ph(np), A, B) - 2 * dot(ph(n), ph(np)) * (mu0.get(0) ?? 0);
    }) as Vec3;
  const series = (power: 7 | 9, on: 'a' | 'b'): Vec3 =>
    DIPOLE_CHAINS[power]
      .filter(([n, np]) => !(both && n === 2 && np === 5))
      .map(([n, np]) => mixed(n, np, on))
      .reduce((s, v) => s.map((x, i) => x + v[i]) as Vec3);
  const firstOrder = (n: number, on: 'a' | 'b'): Vec3 =>
    (on === 'a' ? spherical[1] : spherical[0]) ? [0, 0, 0] : (AXIS_MONOMIALS.map((p) => -2 * dot(applyLocal(p, on, zero, A, B), ph(n))) as Vec3);
  return {
    C6: C(6), C8: C(8), C10: C(10),
    vectors: { D7a: series(7, 'a'), D7b: series(7, 'b'), D9a: series(9, 'a'), D9b: series(9, 'b') },
    permanent: both ? undefined : { E5: spherical[0] || spherical[1] ? 0 : E1(4), D4a: firstOrder(3, 'a'), D4b: firstOrder(3, 'b'), D6a: firstOrder(5, 'a'), D8b: firstOrder(7, 'b') },
  };
}

/** |a − b| ≤ TOL × the vector's largest component (its own scale when non-zero). */
function expectVectorClose(actual: Vec3, expected: Vec3, label: string): void {
  const scale = Math.max(...expected.map(Math.abs), ...actual.map(Math.abs));
  actual.forEach((x, i) => expect(Math.abs(x - expected[i]), `${label}[${i}]: ${x} vs ${expected[i]}`).toBeLessThanOrEqual(TOL * scale));
}

/** The route's numbers against the Map reference; returns how many numbers were compared. */
function comparePair(A: LocalSpace, B: LocalSpace, spherical: readonly [boolean, boolean]): number {
  const fast = perturbationCoefficients(A, B, { maxEnergyPower: 10, maxDipolePower: 9, spherical });
  const ref = mapReference(A, B, spherical);
  for (const k of ['C6', 'C8', 'C10'] as const) expect(relDiff(fast[k]!, ref[k]), k).toBeLessThan(TOL);
  for (const k of ['D7a', 'D7b', 'D9a', 'D9b'] as const) expectVectorClose(fast[k]!, ref.vectors[k], k);
  let count = 3 + 12;
  if (ref.permanent) {
    expect(relDiff(fast.permanent.E5, ref.permanent.E5)).toBeLessThan(TOL);
    for (const k of ['D4a', 'D4b', 'D6a', 'D8b'] as const) expectVectorClose(fast.permanent[k]!, ref.permanent[k], k);
    count += 13;
  }
  return count;
}

describe('perturbation route on typed product vectors equals the Map-based formulas', () => {
  test('seeded random QDO pairs (isotropic and anisotropic, 3 quanta per centre)', () => {
    const rand = seededRandom(2016);
    let compared = 0;
    for (let k = 0; k < 4; k++) {
      const isoA = k % 2 === 0, isoB = k < 2;
      const A = randomDrude(rand, 'A', isoA), B = randomDrude(rand, 'B', isoB);
      compared += comparePair(localSpaceOf(A, 3), localSpaceOf(B, 3), [isoA, isoB]);
    }
    expect(compared).toBe(4 * 15 + 3 * 13);
  });

  test('seeded random hydrogen-like pairs (pseudo-state spaces, unlike charges and basis sizes)', () => {
    const rand = seededRandom(1616);
    for (let k = 0; k < 2; k++) {
      const a = hydrogenic({ Z: uniform(rand, 0.6, 2.5), basis: 5 + k }, 'X'), b = hydrogenic({ Z: uniform(rand, 0.6, 2.5), basis: 6 - k }, 'Y');
      expect(comparePair(localSpaceOf(a, 3), localSpaceOf(b, 3), [true, true])).toBe(15);
    }
  });

  test('hydrogen with a QDO partner (a pseudo-state space against a harmonic one)', () => {
    const rand = seededRandom(77);
    const H = hydrogenic({ Z: 1, basis: 6 }, 'H');
    expect(comparePair(localSpaceOf(H, 3), localSpaceOf(randomDrude(rand, 'Q', true), 3), [true, true])).toBe(15);
  });
});

describe('hydrogen pseudo-spectrum: tridiagonal channels equal the dense generalised eigenproblem', () => {
  /** Energies of H c = E S c in the Sturmian basis by Cholesky of S and the dense symmetric eigensolver. */
  function denseEnergies(Z: number, l: number, size: number): Float64Array {
    const S = new Float64Array(size * size), H = new Float64Array(size * size);
    for (let j = 0; j < size; j++) {
      S[j * size + j] = (j + l + 1) / Z;
      if (j + 1 < size) S[j * size + j + 1] = S[(j + 1) * size + j] = -Math.sqrt((j + 1) * (j + 2 * l + 2)) / (2 * Z);
    }
    for (let i = 0; i < size * size; i++) H[i] = (-Z * Z * S[i]) / 2;
    for (let j = 0; j < size; j++) H[j * size + j] += Z * (j + l + 1) - Z;
    // S = L Lᵀ, then L⁻¹ H L⁻ᵀ
    const L = new Float64Array(size * size);
    for (let i = 0; i < size; i++)
      for (let j = 0; j <= i; j++) {
        let s = S[i * size + j];
        for (let k = 0; k < j; k++) s -= L[i * size + k] * L[j * size + k];
        L[i * size + j] = i === j ? Math.sqrt(s) : s / L[j * size + j];
      }
    const solveL = (b: Float64Array) => {
      const x = Float64Array.from(b);
      for (let i = 0; i < size; i++) {
        for (let k = 0; k < i; k++) x[i] -= L[i * size + k] * x[k];
        x[i] /= L[i * size + i];
      }
      return x;
    };
    const X = new Float64Array(size * size); // L⁻¹ H, column by column
    for (let c = 0; c < size; c++) {
      const col = solveL(Float64Array.from({ length: size }, (_, r) => H[r * size + c]));
      for (let r = 0; r < size; r++) X[r * size + c] = col[r];
    }
    const A = new Float64Array(size * size); // (L⁻¹ (L⁻¹ H)ᵀ)ᵀ = L⁻¹ H L⁻ᵀ
    for (let r = 0; r < size; r++) {
      const row = solveL(Float64Array.from({ length: size }, (_, c) => X[r * size + c]));
      for (let c = 0; c < size; c++) A[c * size + r] = row[c];
    }
    return symmetricEigen(A, size, { vectors: false }).values;
  }

  test('energies on seeded random Z and sizes, and orthonormal pseudo-states (<n l|n\' l> = δ by the radial integrals)', () => {
    const rand = seededRandom(5);
    for (let k = 0; k < 6; k++) {
      const Z = uniform(rand, 0.5, 6), size = 4 + Math.floor(rand() * 21);
      const s = hydrogenicSpectrum(Z, size, 3);
      for (let l = 0; l <= 3; l++) {
        const dense = denseEnergies(Z, l, size);
        // absolute against the scale of the channel's energies (states near E = 0 have no relative precision)
        const scale = Math.max(...dense.map(Math.abs));
        s.energies[l].forEach((E, i) => expect(Math.abs(E - dense[i]), `Z=${Z} size=${size} l=${l} state ${i}`).toBeLessThan(TOL * scale));
        const overlap = s.radial(l, l, 0);
        for (let n = 0; n < size; n++) for (let m = 0; m < size; m++) expect(Math.abs(overlap[n * size + m] - (n === m ? 1 : 0))).toBeLessThan(1e-12);
      }
      expect(s.energies[0][0]).toBe((-Z * Z) / 2); // the exact 1s
    }
  });
});

describe('angular factors: θ sum × φ sum equals the 16 × 32-point double sum', () => {
  /** <l' m'| x̂^a ŷ^b ẑ^c |l m> on the full product grid (the previous formula). */
  function doubleSum(p: Monomial, l: number, m: number, lp: number, mp: number): number {
    const gl = gaussLegendre(16);
    const Y = (L: number, M: number, ct: number, phi: number) => {
      // real spherical harmonic by the associated Legendre recurrence (no Condon–Shortley phase)
      const am = Math.abs(M), st = Math.sqrt(1 - ct * ct);
      let pmm = 1;
      for (let i = 1; i <= am; i++) pmm *= (2 * i - 1) * st;
      let plm = pmm;
      if (L > am) {
        let p0 = pmm, p1 = ct * (2 * am + 1) * pmm;
        for (let ll = am + 2; ll <= L; ll++) [p0, p1] = [p1, ((2 * ll - 1) * ct * p1 - (ll + am - 1) * p0) / (ll - am)];
        plm = p1;
      }
      let ratio = 1;
      for (let i = L - am + 1; i <= L + am; i++) ratio /= i;
      const norm = Math.sqrt(((2 * L + 1) / (4 * Math.PI)) * ratio);
      return norm * plm * (M === 0 ? 1 : M > 0 ? Math.SQRT2 * Math.cos(M * phi) : Math.SQRT2 * Math.sin(am * phi));
    };
    let s = 0;
    for (let i = 0; i < 16; i++)
      for (let j = 0; j < 32; j++) {
        const ct = gl.nodes[i], st = Math.sqrt(1 - ct * ct), phi = (2 * Math.PI * j) / 32;
        const w = (gl.weights[i] * 2 * Math.PI) / 32;
        s += w * Y(l, m, ct, phi) * (st * Math.cos(phi)) ** p[0] * (st * Math.sin(phi)) ** p[1] * ct ** p[2] * Y(lp, mp, ct, phi);
      }
    return s;
  }

  test('seeded random monomials (degree ≤ 5) between harmonics with l ≤ 3', () => {
    const rand = seededRandom(31);
    let nonzero = 0;
    for (let k = 0; k < 40; k++) {
      const monomials = monomialsOfDegree(1 + Math.floor(rand() * 5));
      const p = monomials[Math.floor(rand() * monomials.length)];
      const l = Math.floor(rand() * 4), m = Math.floor(rand() * (2 * l + 1)) - l;
      const terms = angularTerms(p, l, m, 3);
      for (let lp = 0; lp <= 3; lp++)
        for (let mp = -lp; mp <= lp; mp++) {
          const ref = doubleSum(p, l, m, lp, mp);
          const got = terms.find((t) => t.l === lp && t.m === mp)?.value ?? 0;
          expect(Math.abs(got - ref), `${p} l=${l} m=${m} → ${lp},${mp}`).toBeLessThan(TOL);
          if (got !== 0) nonzero++;
        }
    }
    expect(nonzero).toBeGreaterThan(40);
  });
});

describe('basis check: the closed-form D7.a equals the response quadrature', () => {
  test('like pairs of seeded random hydrogen-like atoms: (9/π) ∫ B alpha_1 du as a sum and by quadrature (relTol 1e-13)', () => {
    const rand = seededRandom(9);
    for (let k = 0; k < 3; k++) {
      const r = pseudoStateResponse(hydrogenicSpectrum(uniform(rand, 0.5, 4), 5 + Math.floor(rand() * 8), 3));
      expect(relDiff(likePairD7a(r), isotropicResponseCoefficients(r, r).D7a)).toBeLessThan(5 * TOL);
    }
  });
});
