/**
 * Rayleigh–Schrödinger perturbation theory for a pair in a product basis, with several perturbation
 * parameters: one per multipole order, V = Σ_n λ_n V_n with λ_n = R^-(n+1) (V_2 dipole–dipole, V_3 dipole–quadrupole, …).
 *
 * With φ_n = R0 V_n |0> (R0 = Q (H0 − E0)^-1 Q, the reduced resolvent) and E1_n = <0|V_n|0>:
 *   second-order energy:  −C_{2N} = −Σ_{n+n'=2N−2} <0|V_n R0 V_n'|0>      (C6 ← V2V2, C8 ← V3V3 + V2V4 + V4V2, …)
 *   first-order terms:    E ∋ E1_n λ_n,   <mu> ∋ −2<0|mu|φ_n> λ_n
 *   mixed second-order dipole, the coefficient of λ_n λ_n' (n ≠ n'), intermediate normalisation:
 *     <mu>_{nn'} = 2<0|mu|ψ_{nn'}> + 2<φ_n|mu|φ_n'> − 2<φ_n|φ_n'><0|mu|0>,
 *     ψ_{nn'} = R0[(V_n − E1_n) φ_n' + (V_n' − E1_n') φ_n]
 * (standard RSPT, e.g. J. O. Hirschfelder, W. B. Brown, S. T. Epstein, Adv. Quantum Chem. 1, 255 (1964)).
 *
 * Which terms make which power (derived here, for centres even under inversion — QDOs and atoms): H0 is even under
 * r_A → −r_A and under r_B → −r_B separately; a term of V_n with moment degrees (|pA|, |pB|) carries the parities
 * ((−1)^|pA|, (−1)^|pB|). Then
 *   - the energy at second order has only even powers (C6, C8, …), at first order E_{n+1} = E1_n only for n even
 *     (E5, E7: permanent moments of both centres, anisotropic centres only);
 *   - mu_A,z at second order has only odd powers: R^-7 from (n, n') = (2, 3), R^-9 from (2, 5) and (3, 4);
 *     at first order only even powers R^-(n+1), n odd: D4 (n = 3), D6 (n = 5), D8 (n = 7) (anisotropic only);
 *     third order starts at R^-10 (the only R^-9 candidate, V2³, is odd under r_B → −r_B).
 * So through R^-9 the dipole is D4/R^4 + D6/R^6 + D7/R^7 + D8/R^8 + D9/R^9, and through R^-8 the energy
 * E5/R^5 − C6/R^6 + E7/R^7 − C8/R^8, each coefficient complete at the order of perturbation theory computed here.
 * Everything is evaluated at R = 1, so the results are the coefficients C_n (Eh·a0^n) and D_n (e·a0^(n+1)).
 */
import type { Vec3 } from '../../model/types.js';
import type { VectorCoefficients } from '../route.js';
import { AXIS_MONOMIALS, type Monomial } from '../../hamiltonian/monomial.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';
import {
  compactSpace,
  couplingDotGrid as couplingDot,
  couplingOnGround,
  gridDot as dot,
  groundAmplitude,
  groundGrid,
  localDotGrid as localDot,
  momentOnGround,
  resolventGrid,
  type ProductGrid,
} from './product-grid.js';

export interface PerturbationOptions {
  /** Highest dispersion power 2N computed (6, 8 or 10). Default 10. */
  maxEnergyPower?: 6 | 8 | 10;
  /** Highest power of the dispersion dipole: 7 (D7 only) or 9 (D7 and D9). Default 9. */
  maxDipolePower?: 7 | 9;
  /**
   * Which centres are spherical (true: both). A spherical centre has no permanent moments, so the first-order dipole
   * of its partner and the first-order energies vanish by symmetry and are set to exactly 0 (a Cartesian sum would
   * leave rounding residue); with both spherical the V2·V5 chain of D9 vanishes too (exact/series-terms.ts) and is
   * skipped, and the pair is symmetric under rotations about the axis, so the x and y components of the dipoles
   * vanish and are set to exactly 0 (only z is computed). Default: neither.
   */
  spherical?: boolean | readonly [a: boolean, b: boolean];
}

/** C6, C8, C10, the D7 (and D9) vectors (A at the origin, B at +R ẑ) and the first-order terms. */
export type PerturbationCoefficients = VectorCoefficients;

/** The pairs (n, n') of coupling orders whose mixed second-order term gives the R^-p dipole (n + n' + 2 = p, n < n'). */
export const DIPOLE_CHAINS: Readonly<Record<7 | 9, ReadonlyArray<readonly [number, number]>>> = {
  7: [[2, 3]],
  9: [
    [2, 5],
    [3, 4],
  ],
};

/** C6, C8, C10 and the D7 (D9) vectors of a pair of local spaces by RSPT. */
export function perturbationCoefficients(localA: LocalSpace, localB: LocalSpace, options: PerturbationOptions = {}): PerturbationCoefficients {
  const maxPower = options.maxEnergyPower ?? 10;
  const dipolePower = options.maxDipolePower ?? 9;
  const [sphericalA, sphericalB] = options.spherical === true ? [true, true] : options.spherical === false || options.spherical === undefined ? [false, false] : options.spherical;
  const spherical = sphericalA && sphericalB;
  const firstOrder = !spherical;
  // product vectors on typed arrays over densely numbered local states (product-grid.ts)
  const A = compactSpace(localA), B = compactSpace(localB);
  const V0cache = new Map<number, ProductGrid>(); // V_n |0>
  const phiCache = new Map<number, ProductGrid>(); // R0 V_n |0>
  const V0 = (n: number): ProductGrid => {
    let v = V0cache.get(n);
    if (!v) V0cache.set(n, (v = couplingOnGround(couplingTerms(n), A, B)));
    return v;
  };
  const phi = (n: number): ProductGrid => {
    let v = phiCache.get(n);
    if (!v) phiCache.set(n, (v = resolventGrid(V0(n), A, B)));
    return v;
  };
  const ground = groundGrid();
  /** <0|V_n|0>: from V_n|0> when it is built anyway, else as a matrix element (V_n|0> is not needed). */
  const E1 = (n: number): number => {
    const v = V0cache.get(n);
    return v ? groundAmplitude(v) : couplingDot(couplingTerms(n), ground, ground, A, B);
  };
  /**
   * C_P = Σ_{n+m=P−2} <0|V_n R0 V_m|0>, each unordered pair once: <0|V_n R0 V_m|0> = <φ_n|V_m|0> = <0|V_m R0 V_n|0>
   * (R0 and V symmetric), with the smaller order on φ, so V_m|0> is never built for the high orders of C10.
   */
  const C = (power: number): number => {
    let s = 0;
    for (let n = 2; 2 * n <= power - 2; n++) {
      const m = power - 2 - n;
      s += (n === m ? 1 : 2) * couplingDot(couplingTerms(m), ground, phi(n), A, B);
    }
    return s;
  };

  /**
   * The coefficient of λ_n λ_n' in <mu>, for every dipole component of both centres (z only for two spherical
   * centres: x and y vanish by the rotational symmetry about the axis). The term 2<0|mu|ψ_{nn'}> is
   * evaluated from the other side, 2<χ|(V_n − E1_n)|φ_n'> + 2<χ|(V_n' − E1_n')|φ_n> with χ = R0 mu|0> (V and R0 are
   * symmetric): V then acts on the few states of χ instead of on φ, the same sum over the same truncated space.
   */
  const mixed = (n: number, np: number) => {
    const overlap = dot(phi(n), phi(np));
    const component = (p: Monomial, on: 'a' | 'b'): number => {
      if (spherical && p !== AXIS_MONOMIALS[2]) return 0;
      const mu0 = momentOnGround(p, on, A, B);
      const chi = resolventGrid(mu0, A, B);
      const viaPsi =
        couplingDot(couplingTerms(n), chi, phi(np), A, B) -
        E1(n) * dot(chi, phi(np)) +
        couplingDot(couplingTerms(np), chi, phi(n), A, B) -
        E1(np) * dot(chi, phi(n));
      return 2 * viaPsi + 2 * localDot(p, on, phi(n), phi(np), A, B) - 2 * overlap * groundAmplitude(mu0);
    };
    return (on: 'a' | 'b'): Vec3 => AXIS_MONOMIALS.map((p) => component(p, on)) as Vec3;
  };
  const dipoleSeries = (power: 7 | 9) => {
    const chains = DIPOLE_CHAINS[power].filter(([n, np]) => !(spherical && n === 2 && np === 5));
    const parts = chains.map(([n, np]) => mixed(n, np));
    const of = (on: 'a' | 'b'): Vec3 => parts.map((f) => f(on)).reduce((s, v) => s.map((x, i) => x + v[i]) as Vec3);
    return { a: of('a'), b: of('b') };
  };
  const none: Vec3 = [0, 0, 0];
  /** First-order dipole from V_n: −2<0|mu|φ_n> (zero when the partner is spherical: no permanent moments). */
  const firstOrderDipole = (n: number, on: 'a' | 'b'): Vec3 =>
    (on === 'a' ? sphericalB : sphericalA) ? none : (AXIS_MONOMIALS.map((p) => -2 * dot(momentOnGround(p, on, A, B), phi(n))) as Vec3);
  const firstOrderEnergy = (n: number): number => (sphericalA || sphericalB ? 0 : E1(n));

  const D7 = dipoleSeries(7);
  const D9 = dipolePower >= 9 ? dipoleSeries(9) : undefined;
  return {
    C6: C(6),
    ...(maxPower >= 8 ? { C8: C(8) } : {}),
    ...(maxPower >= 10 ? { C10: C(10) } : {}),
    D7a: D7.a,
    D7b: D7.b,
    ...(D9 ? { D9a: D9.a, D9b: D9.b } : {}),
    permanent: firstOrder
      ? {
          E5: firstOrderEnergy(4),
          E7: firstOrderEnergy(6),
          D4a: firstOrderDipole(3, 'a'),
          D4b: firstOrderDipole(3, 'b'),
          D6a: firstOrderDipole(5, 'a'),
          D6b: firstOrderDipole(5, 'b'),
          D8a: firstOrderDipole(7, 'a'),
          D8b: firstOrderDipole(7, 'b'),
        }
      : { E5: 0, E7: 0, D4a: none, D4b: none, D6a: none, D6b: none, D8a: none, D8b: none },
  };
}

/**
 * The fewest quanta per centre that make the harmonic truncation exact: a matrix element <0|V_n R0 V_n'|0> only
 * sees states both sides reach, at most min(n, n') − 1 ≤ P/2 − 2 quanta on a centre for C_P (n + n' = P − 2);
 * the D7 chain <0|mu R0 V2 R0 V3|0> (and its partners) needs 2, the D9 chains 3 (<φ3|mu|φ4> meets the three
 * quanta V4 puts on one centre by its octupole part). Truncation acts on final states only, so first-order terms
 * are exact in any space. Lower truncations change the results (tests/engines/routes-agree.test.ts, d9 tests).
 */
export function requiredQuanta(maxEnergyPower: number, maxDipolePower: 7 | 9 = 7): number {
  return Math.max(maxDipolePower >= 9 ? 3 : 2, maxEnergyPower / 2 - 2);
}
