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

/**
 * Derived quantities of a QDO as powers q^a m^b w^c (with their constant factor): the polarisabilities, B, the
 * like-pair C6, C8, C10 and D7 scales and the oscillator length 1/sqrt(m w) (closed forms above; C10 and D7 up
 * to a constant, derived here). Every route computes with these magnitudes.
 */
const DERIVED: ReadonlyArray<{ what: string; c: number; q: number; m: number; w: number }> = [
  { what: 'alpha1 = q²/(m w²)', c: 1, q: 2, m: -1, w: -2 },
  { what: 'alpha2 = (3/4) q²/(m² w³)', c: 0.75, q: 2, m: -2, w: -3 },
  { what: 'alpha3 = (5/4) q²/(m³ w⁴)', c: 1.25, q: 2, m: -3, w: -4 },
  { what: 'B = −2 q³/(m² w⁴)', c: 2, q: 3, m: -2, w: -4 },
  { what: 'the like-pair C6 = (3/4) q⁴/(m² w³)', c: 0.75, q: 4, m: -2, w: -3 },
  { what: 'the like-pair C8 = (15/4) q⁴/(m³ w⁴)', c: 3.75, q: 4, m: -3, w: -4 },
  { what: 'the C10 scale q⁴/(m⁴ w⁵)', c: 1, q: 4, m: -4, w: -5 },
  { what: 'the D7 scale q⁵/(m³ w⁵)', c: 1, q: 5, m: -3, w: -5 },
  { what: 'the oscillator length 1/sqrt(m w)', c: 1, q: 0, m: -0.5, w: -0.5 },
];

/**
 * Largest |log10| of a derived quantity accepted: 10^±100 leaves room for the products of two species and the
 * squares inside the routes within double precision (about 10^±308), far beyond any physical oscillator.
 */
export const DRUDE_DERIVED_LOG10_LIMIT = 100;

/**
 * Refuse parameters whose derived quantities ({@link DERIVED}) overflow or underflow, naming the field that
 * drives the magnitude (e.g. `drude:q=1,m=1,w=1e-200.w`). Computed in logarithms, so the check itself cannot
 * overflow. `fields` names the parameters (`w` or the axis `wx`, `wy`, `wz`).
 */
function requireRepresentable(name: string, q: number, m: number, w: readonly number[], wFields: readonly string[]): void {
  const lq = Math.log10(q), lm = Math.log10(m);
  w.forEach((wi, axis) => {
    const lw = Math.log10(wi);
    for (const d of DERIVED) {
      const parts = [
        { field: 'q', value: q, e: d.q, part: d.q * lq },
        { field: 'm', value: m, e: d.m, part: d.m * lm },
        { field: wFields[axis], value: wi, e: d.w, part: d.w * lw },
      ];
      const total = Math.log10(d.c) + parts.reduce((s, p) => s + p.part, 0);
      if (Math.abs(total) <= DRUDE_DERIVED_LOG10_LIMIT) continue;
      const culprit = parts.reduce((best, p) => (p.part * Math.sign(total) > best.part * Math.sign(total) ? p : best));
      const given = parts.map((p) => `${p.field}=${p.value}`).join(', ');
      throw new InputError(
        `${name}.${culprit.field}`,
        `gives ${d.what} ≈ 1e${Math.round(total)} (with ${given}), beyond the range 1e±${DRUDE_DERIVED_LOG10_LIMIT} this program computes in; ` +
          `choose ${culprit.field} ${Math.sign(total) * Math.sign(culprit.e) > 0 ? 'smaller' : 'larger'}`,
      );
    }
  });
}

/** An isotropic QDO; every field validated (finite, > 0, derived quantities representable). */
export function drude(params: DrudeParameters, name = 'drude', source?: string): DrudeSpecies {
  const q = requirePositive(`${name}.q`, params.q);
  const m = requirePositive(`${name}.m`, params.m);
  const w = requirePositive(`${name}.w`, params.w);
  requireRepresentable(name, q, m, [w], ['w']);
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
  requireRepresentable(name, q, m, w, ['wx', 'wy', 'wz']);
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
  if (!(q > 0) || !Number.isFinite(q) || !(m > 0) || !Number.isFinite(m) || !(w > 0) || !Number.isFinite(w)) {
    throw new InputError(name, `targets alpha, C6, C8 give no valid oscillator (q=${q}, m=${m}, w=${w})`);
  }
  try {
    requireRepresentable(name, q, m, [w], ['w']);
  } catch (e) {
    if (e instanceof InputError) throw new InputError(name, `targets alpha, C6, C8 give an oscillator that ${e.problem.replace(/; choose .*$/, '')}`);
    throw e;
  }
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
