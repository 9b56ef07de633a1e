/**
 * The quantum Drude oscillator (QDO): a core of charge +q and a Drude particle of charge −q and mass m,
 * bound harmonically with frequencies w = (wx, wy, wz) along the lab axes (force constants k_i = m w_i²).
 * Atomic units throughout. Its dipole operator is mu = −q r.
 *
 * Closed forms for the isotropic QDO (hbar = 1), used by the response route and checked against the
 * perturbation route in the tests:
 *   alpha1 = q²/(m w²)                 (static dipole polarisability)
 *   alpha2 = (3/4) q²/(m² w³)          (quadrupole, 2^l-pole convention alpha_l = 2 Σ |<n|q r^l P_l|0>|²/ΔE)
 *   alpha3 = (5/4) q²/(m³ w⁴)          (octupole)
 *   alpha_l(iu) = alpha_l (l w)²/((l w)² + u²)   (an l-pole excites exactly l quanta)
 *   B      = −2 q³/(m² w⁴)             (Buckingham dipole–dipole–quadrupole hyperpolarisability, B = B_zz,zz)
 *   B(0; iu, −iu) = B w²/(w² + u²)
 * Sources: A. P. Jones, J. Crain, V. P. Sokhan, T. W. Whitfield, G. J. Martyna, Phys. Rev. B 87, 144103 (2013)
 * for alpha_l of a QDO (quoted from memory); B and its frequency dependence derived here (the field gradient
 * changes the force constant, so B is the F²F' term of −(q²/2) F·(k + qF')^{-1}·F).
 */
import type { Vec3 } from './types.js';
import { requirePositive } from './validate.js';
import { InputError } from './errors.js';

/** A QDO species; isotropic when wx = wy = wz. Plain data. */
export interface DrudeSpecies {
  kind: 'drude';
  /** Display name (a built-in name, a file entry's name, or the inline spec). */
  name: string;
  /** Charge q of the core (+q) and Drude particle (−q), in e. */
  q: number;
  /** Drude particle mass, in m_e. */
  m: number;
  /** Frequencies along x, y, z, in Eh/hbar. */
  w: Vec3;
  /** Where the parameters come from (a citation, "invented for demos", or "fitted to …"). */
  source?: string;
  /** When the QDO was fitted: the targets it reproduces. */
  fittedFrom?: { alpha: number; C6: number; C8: number };
}

/** Parameters of an isotropic QDO, atomic units. */
export interface DrudeParameters {
  q: number;
  m: number;
  w: number;
}

/** An isotropic QDO; every field validated (finite, > 0). */
export function drude(params: DrudeParameters, name = 'drude', source?: string): DrudeSpecies {
  const q = requirePositive(`${name}.q`, params.q);
  const m = requirePositive(`${name}.m`, params.m);
  const w = requirePositive(`${name}.w`, params.w);
  return { kind: 'drude', name, q, m, w: [w, w, w], ...(source ? { source } : {}) };
}

/** An anisotropic QDO with frequencies along the lab axes; every field validated (finite, > 0). */
export function drudeAnisotropic(
  params: { q: number; m: number; wx: number; wy: number; wz: number },
  name = 'drude',
  source?: string,
): DrudeSpecies {
  const q = requirePositive(`${name}.q`, params.q);
  const m = requirePositive(`${name}.m`, params.m);
  const w: Vec3 = [
    requirePositive(`${name}.wx`, params.wx),
    requirePositive(`${name}.wy`, params.wy),
    requirePositive(`${name}.wz`, params.wz),
  ];
  return { kind: 'drude', name, q, m, w, ...(source ? { source } : {}) };
}

/**
 * The isotropic QDO that reproduces a static polarisability alpha and the like-pair C6 and C8
 * (three-parameter mapping of Jones et al., Phys. Rev. B 87, 144103 (2013); quoted from memory):
 *   w = 4 C6 / (3 alpha²),   m = 5 C6 / (w C8),   q = sqrt(m w² alpha).
 * It inverts C6 = (3/4) alpha² w and C8 = (15/4) alpha²/m, which the tests check against both routes.
 */
export function drudeFromTargets(
  targets: { alpha: number; C6: number; C8: number },
  name = 'fitted',
  source?: string,
): DrudeSpecies {
  const alpha = requirePositive(`${name}.alpha`, targets.alpha);
  const C6 = requirePositive(`${name}.C6`, targets.C6);
  const C8 = requirePositive(`${name}.C8`, targets.C8);
  const w = (4 * C6) / (3 * alpha * alpha);
  const m = (5 * C6) / (w * C8);
  const q = Math.sqrt(m * w * w * alpha);
  if (!(q > 0) || !Number.isFinite(q)) throw new InputError(name, 'targets alpha, C6, C8 give no valid oscillator');
  return {
    kind: 'drude',
    name,
    q,
    m,
    w: [w, w, w],
    source: source ?? `fitted to alpha=${alpha}, C6=${C6}, C8=${C8}`,
    fittedFrom: { alpha, C6, C8 },
  };
}

/** True when all three frequencies are equal (to the last bit). */
export function isIsotropicDrude(s: DrudeSpecies): boolean {
  return s.w[0] === s.w[1] && s.w[1] === s.w[2];
}

/** Static dipole polarisability tensor diagonal alpha_ii = q²/(m w_i²), a0³. */
export function drudePolarisability(s: DrudeSpecies): Vec3 {
  return s.w.map((wi) => (s.q * s.q) / (s.m * wi * wi)) as Vec3;
}

/** Isotropic-QDO static 2^l-pole polarisability alpha_l = ((2l−1)!!/l) q² / (2^(l−1) m^l w^(l+1)), l = 1, 2, 3 … */
export function drudeMultipolePolarisability(p: DrudeParameters, l: number): number {
  let dfact = 1;
  for (let k = 2 * l - 1; k > 1; k -= 2) dfact *= k;
  return (dfact / l) * (p.q * p.q) / (2 ** (l - 1) * p.m ** l * p.w ** (l + 1));
}

/** Isotropic-QDO static hyperpolarisability B = B_zz,zz = −2 q³/(m² w⁴) (Buckingham convention; derived here). */
export function drudeHyperpolarisabilityB(p: DrudeParameters): number {
  return (-2 * p.q ** 3) / (p.m ** 2 * p.w ** 4);
}

/** The isotropic parameters of a QDO that is isotropic (throws otherwise: a programming error). */
export function isotropicParameters(s: DrudeSpecies): DrudeParameters {
  if (!isIsotropicDrude(s)) throw new Error(`${s.name} is anisotropic`);
  return { q: s.q, m: s.m, w: s.w[0] };
}
