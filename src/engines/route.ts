/** The common result shape of every route, so routes can be compared and reported side by side. */
import type { Species } from '../model/species.js';
import type { Vec3 } from '../model/types.js';

export interface D7Triple {
  /** lim R^7 mu_A,z, e·a0^8 (A at the origin, B at +R ẑ). */
  a: number;
  /** lim R^7 mu_B,z, e·a0^8. */
  b: number;
  /** a + b. */
  total: number;
}

/** One route's coefficients (atomic units). Optional fields are absent when the route does not give them. */
export interface RouteResult {
  /** Route name as used in JSON: "perturbation", "response", "force-balance", "exact". */
  name: string;
  C6: number;
  C8?: number;
  C10?: number;
  D7: D7Triple;
  /** Full D7 vectors when the route gives all three components. */
  D7vectors?: { a: Vec3; b: Vec3 };
  /** The next dispersion dipole, lim R^9 (mu_z − D7/R^7 − first-order terms), e·a0^10; absent when the route does not give it. */
  D9?: D7Triple;
  /** Error estimates where the route has them (same keys as the values). */
  error?: Partial<Record<'C6' | 'C8' | 'C10' | 'D7a' | 'D7b' | 'D9a' | 'D9b', number>>;
  /** First-order (permanent-moment) terms, present when nonzero (anisotropic species); see {@link PermanentTerms}. */
  permanent?: PermanentTerms;
  /** False when the route did not reach its tolerance: its numbers are untrusted. */
  converged: boolean;
  /** Human notes (e.g. which kernel, basis size, what was assumed). */
  notes: string[];
}

/**
 * First-order (permanent-moment) terms of a pair of anisotropic centres, atomic units: E ∋ E5/R^5 + E7/R^7,
 * mu_z ∋ D4/R^4 + D6/R^6 + D8/R^8 (first order in the couplings, from the permanent quadrupole, hexadecapole,
 * rank-6 moments of one centre and the static polarisabilities of the other). E7, D6, D8 are absent when the route
 * does not give them.
 */
export interface PermanentTerms {
  E5: number;
  D4: D7Triple;
  E7?: number;
  D6?: D7Triple;
  D8?: D7Triple;
}

/**
 * Coefficients with full dipole vectors, as the state-based engines (perturbation, force balance) produce them,
 * atomic units: C_n in Eh·a0^n; D7 vectors lim R^7 <mu> in e·a0^8; first-order (permanent-quadrupole) terms
 * E ∋ E5/R^5 and mu ∋ D4/R^4 (zero for spherical centres).
 */
export interface VectorCoefficients {
  C6: number;
  C8?: number;
  C10?: number;
  D7a: Vec3;
  D7b: Vec3;
  /** lim R^9 of the second-order dipole, e·a0^10 (when the engine gives it). */
  D9a?: Vec3;
  D9b?: Vec3;
  permanent: { E5: number; D4a: Vec3; D4b: Vec3; E7?: number; D6a?: Vec3; D6b?: Vec3; D8a?: Vec3; D8b?: Vec3 };
}

/**
 * The {@link RouteResult} of engine output with dipole vectors. `spherical`: both centres are spherical, so
 * the first-order terms vanish by symmetry and any rounding residue there is dropped.
 */
export function vectorRouteResult(
  name: string,
  r: VectorCoefficients,
  extra: { spherical: boolean; converged: boolean; notes: string[] },
): RouteResult {
  const { E5, D4a, D4b, E7, D6a, D6b, D8a, D8b } = r.permanent;
  const nonzero = (v?: Vec3) => v !== undefined && v.some((x) => x !== 0);
  const hasPermanent = !extra.spherical && (E5 !== 0 || (E7 ?? 0) !== 0 || [D4a, D4b, D6a, D6b, D8a, D8b].some(nonzero));
  const permanent: PermanentTerms = {
    E5,
    D4: d7(D4a[2], D4b[2]),
    ...(E7 !== undefined ? { E7 } : {}),
    ...(D6a && D6b ? { D6: d7(D6a[2], D6b[2]) } : {}),
    ...(D8a && D8b ? { D8: d7(D8a[2], D8b[2]) } : {}),
  };
  return {
    name,
    C6: r.C6,
    ...(r.C8 !== undefined ? { C8: r.C8 } : {}),
    ...(r.C10 !== undefined ? { C10: r.C10 } : {}),
    D7: d7(r.D7a[2], r.D7b[2]),
    D7vectors: { a: r.D7a, b: r.D7b },
    ...(r.D9a && r.D9b ? { D9: d7(r.D9a[2], r.D9b[2]) } : {}),
    ...(hasPermanent ? { permanent } : {}),
    converged: extra.converged,
    notes: extra.notes,
  };
}

/** Options every route accepts; routes ignore what they do not use. */
export interface RouteOptions {
  /** Relative tolerance for quadratures and convergence loops. Default 1e-13. */
  relTol?: number;
  /** Harmonic truncation for the perturbation route (total quanta per centre); default: the exact minimum. */
  maxQuanta?: number;
  /** Highest dispersion power computed (6, 8 or 10). Default 10. */
  maxEnergyPower?: 6 | 8 | 10;
}

/** A route: a named, independent way to compute the pair's coefficients. */
export interface Route {
  name: string;
  /** One line for help and reports. */
  summary: string;
  /** null when the route can handle the pair, else the reason it cannot. */
  unsupported(A: Species, B: Species): string | null;
  run(A: Species, B: Species, options: RouteOptions): RouteResult;
}

/**
 * Build a {@link D7Triple} (the same shape serves D9, D4, D6, D8) from the two z components. A total below the rounding resolution of the sum
 * (4 ulp of |a| + |b|) is reported as 0 rather than as rounding noise.
 */
export function d7(a: number, b: number): D7Triple {
  const total = a + b;
  return { a, b, total: Math.abs(total) <= 4 * Number.EPSILON * (Math.abs(a) + Math.abs(b)) ? 0 : total };
}
