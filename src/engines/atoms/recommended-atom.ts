/**
 * The recommended model of a real closed-shell atom: first-principles (time-dependent Hartree–Fock) response
 * functions rescaled to the atom's published static values. Atomic units throughout.
 *
 * The rule (derived here). With the TDHF functions alpha_l^T(iu) and B^T(iu) = B^T(0; iu, −iu):
 *
 *   alpha_1(iu) = s1 · alpha_1^T(iu/λ)      s1 = alpha(0) / alpha_1^T(0)
 *   alpha_2(iu) = s2 · alpha_2^T(iu/λ)      λ  = C6 / (s1² C6^T)          (C6 = (3/π)∫alpha_1² du ∝ s1² λ)
 *   alpha_3(iu) = s3 · alpha_3^T(iu/λ)      s2 = C8 / (s1 λ C8^T)         (C8 = (15/π)∫alpha_1 alpha_2 du ∝ s1 s2 λ)
 *   B(iu)       = sB · B^T(iu/λ)
 *
 * so the like-pair C6, C8 and alpha(0) of the recommended atom are the published ones exactly. One frequency
 * scale λ for every function keeps their shapes (the TDHF excitation spectrum is stretched by λ, every
 * oscillator strength multiplied by the amplitude factor). C10 = λ [s1 s3 X13 + s2² X22] with
 * X13 = (28/π)∫alpha_1^T alpha_3^T du and X22 = (35/π)∫(alpha_2^T)² du fixes
 *   s3 = (C10/λ − s2² X22) / (s1 X13)
 * when a C10 is published and this s3 lies in [1/2, 2] (the correlation corrections of alpha_1 and alpha_2 are a
 * few to 20 per cent, so a larger correction of alpha_3 would mean C10 is mostly absorbing the error of the
 * alpha_2² part: ill-posed); otherwise s3 = s2 (the octupole corrected like the quadrupole).
 * B: sB = B(0)/B^T(0) when a static B is published; otherwise sB = s1 · (s2/λ)^(1/2), the factor a
 * sum-over-states B ~ Σ μ μ Θ / ω² gets when every squared dipole matrix element is multiplied by s1 λ, every
 * squared quadrupole one by s2 λ, and every excitation energy by λ (derived here; an estimate, checked on He
 * where the published B is known).
 *
 * The rescaled atom is plain data, a response table on the stretched grid λ·u_k (the values at λ u_k are
 * s·f^T(u_k)); the engines evaluate it through {@link rescaledResponse}, the unscaled interpolant with its
 * argument divided by λ, so the like-pair C6, C8, C10 are s1²λ C6^T, … to rounding (the quadrature maps
 * u = scale·t/(1 − t) with scale ∝ λ) and the interpolation is done once per atom.
 */
import type { AtomRecord, SourcedValue } from '../../data/atom-library.js';
import type { FirstPrinciplesResponse } from '../../model/first-principles-response.js';
import type { ResponseTableSpecies } from '../../model/response-data.js';
import { sig } from '../../model/number-text.js';
import { isotropicResponseCoefficients } from '../response/isotropic-kernel.js';
import type { IsotropicResponse } from '../response/response-model.js';
import { responseTableResponse, type DataResponse } from './tabulated-response.js';

/** The amplitude and frequency factors of the rule, and which rule fixed s3 and sB. */
export interface RescalingFactors {
  /** Amplitude factor of alpha_1. */
  s1: number;
  /** Frequency scale λ (u → u/λ). */
  lambda: number;
  /** Amplitude factor of alpha_2. */
  s2: number;
  /** Amplitude factor of alpha_3. */
  s3: number;
  /** Amplitude factor of B(iu). */
  sB: number;
  /** How s3 was fixed: from the published C10, or s3 = s2. */
  s3From: 'C10' | 's2';
  /** How sB was fixed: from the published static B, or the estimate s1·(s2/λ)^(1/2). */
  sBFrom: 'published B' | 'estimate';
  /** The unscaled (TDHF) like-pair coefficients and static B the factors were computed from. */
  unscaled: { alpha: number; C6: number; C8: number; C10: number; B: number };
}

/** An atom's recommended model: the rescaled species, the unscaled one it comes from, and the factors. */
export interface RecommendedAtom {
  record: AtomRecord;
  data: FirstPrinciplesResponse;
  factors: RescalingFactors;
  /** The recommended (rescaled) atom, named by its symbol (e.g. "He"). */
  species: ResponseTableSpecies;
  /** The unscaled first-principles atom (same table), named e.g. "He-tdhf": one end of the uncertainty spread. */
  unscaled: ResponseTableSpecies;
  /** The response functions of `species` (the rescaled unscaled interpolant). */
  response: DataResponse;
}

/** s3 outside [S3_MIN, S3_MAX] means the published C10 cannot fix alpha_3 sensibly (see the module comment). */
const S3_MIN = 0.5;
const S3_MAX = 2;

/**
 * The first-principles data as a response-table species. The electron number closes alpha_1 beyond the grid
 * (alpha → N/u², the Thomas–Reiche–Kuhn sum rule, which time-dependent Hartree–Fock satisfies in a complete basis;
 * common practice), so the tail is not extrapolated from the last grid points.
 */
export function firstPrinciplesTable(data: FirstPrinciplesResponse, name: string, source: string): ResponseTableSpecies {
  return {
    kind: 'response-table',
    name,
    electrons: data.electrons,
    u: [...data.u],
    alpha: [...data.alpha1],
    alpha2: [...data.alpha2],
    alpha3: [...data.alpha3],
    hyperB: [...data.B],
    source,
  };
}

/** Only the quadrupole part of a response (for the alpha_2² part of C10). */
const quadrupoleOnly = (r: IsotropicResponse): IsotropicResponse => ({ alpha: (l, u) => (l === 2 ? r.alpha(2, u) : 0), hyperB: () => 0, scale: r.scale });

/** The factors that rescale `unscaled` to the published values of `record` (see the module comment). */
export function rescalingFactors(record: AtomRecord, unscaled: ResponseTableSpecies): RescalingFactors {
  const r = responseTableResponse(unscaled);
  const like = isotropicResponseCoefficients(r, r);
  const X22 = isotropicResponseCoefficients(quadrupoleOnly(r), quadrupoleOnly(r)).C10;
  const X13 = like.C10 - X22;
  const alphaT = unscaled.alpha[0];
  const BT = unscaled.hyperB![0];
  const s1 = record.alpha.value / alphaT;
  const lambda = record.C6.value / (s1 * s1 * like.C6);
  const s2 = record.C8.value / (s1 * lambda * like.C8);
  let s3 = s2;
  let s3From: RescalingFactors['s3From'] = 's2';
  if (record.C10) {
    const fromC10 = (record.C10.value / lambda - s2 * s2 * X22) / (s1 * X13);
    if (fromC10 >= S3_MIN && fromC10 <= S3_MAX) {
      s3 = fromC10;
      s3From = 'C10';
    }
  }
  const sB = record.B ? record.B.value / BT : s1 * Math.sqrt(s2 / lambda);
  return {
    s1, lambda, s2, s3, sB, s3From,
    sBFrom: record.B ? 'published B' : 'estimate',
    unscaled: { alpha: alphaT, C6: like.C6, C8: like.C8, C10: like.C10, B: BT },
  };
}

/** The rescaled table: grid λ·u_k, values s·f^T(u_k); the alpha_1 tail N/u² becomes s1 λ² N/u² (the `electrons` field). */
export function rescaledTable(unscaled: ResponseTableSpecies, f: RescalingFactors, name: string, source: string): ResponseTableSpecies {
  const times = (k: number, xs: readonly number[] | undefined) => (xs ?? []).map((x) => k * x);
  return {
    kind: 'response-table',
    name,
    u: times(f.lambda, unscaled.u),
    alpha: times(f.s1, unscaled.alpha),
    alpha2: times(f.s2, unscaled.alpha2),
    alpha3: times(f.s3, unscaled.alpha3),
    hyperB: times(f.sB, unscaled.hyperB),
    ...(unscaled.electrons !== undefined ? { electrons: f.s1 * f.lambda * f.lambda * unscaled.electrons } : {}),
    source,
  };
}

/** "value (source)" for a species' source line. */
const cited = (label: string, v: SourcedValue) => `${label} (${v.source})`;

/** What the rescaling rests on, in words (the species' source). */
export function rescaledSource(record: AtomRecord, data: FirstPrinciplesResponse, f: RescalingFactors): string {
  const targets = [cited('alpha', record.alpha), cited('C6', record.C6), cited('C8', record.C8)];
  if (f.s3From === 'C10' && record.C10) targets.push(cited('C10', record.C10));
  if (record.B) targets.push(cited('B', record.B));
  const tail = `alpha_1 → N/u² with N = s1 λ² × ${data.electrons} electrons`;
  return `recommended ${record.name}: ${data.level} response functions (${data.basis}) rescaled to ${targets.join(', ')}; ${factorsText(f)}; ${tail}`;
}

/** The factors in one line, e.g. "s1 = 1.046, λ = 0.97, s2 = …; s3 from C10; sB from the published B". */
export function factorsText(f: RescalingFactors): string {
  const g = (x: number) => sig(x, 5);
  return (
    `s1 = ${g(f.s1)}, λ = ${g(f.lambda)}, s2 = ${g(f.s2)}, s3 = ${g(f.s3)} (${f.s3From === 'C10' ? 'from C10' : 'no usable C10: s3 = s2'}), ` +
    `sB = ${g(f.sB)} (${f.sBFrom === 'published B' ? 'from the published static B' : 'estimate s1·(s2/λ)^(1/2): no published B'})`
  );
}

/** alpha_l(iu) = s_l alpha_l^T(iu/λ), B(iu) = sB B^T(iu/λ) from the unscaled response `r`. */
export function rescaledResponse(r: DataResponse, f: RescalingFactors, name: string): DataResponse {
  const s = [0, f.s1, f.s2, f.s3];
  return {
    alpha: (l, u) => s[l] * r.alpha(l, u / f.lambda),
    hyperB: (u) => f.sB * r.hyperB(u / f.lambda),
    scale: f.lambda * r.scale,
    maxEnergyPower: r.maxEnergyPower,
    approximateB: r.approximateB,
    notes: [...r.notes, `${name}: the first-principles functions above rescaled, alpha_l(iu) = s_l alpha_l^T(iu/λ), B(iu) = sB B^T(iu/λ); ${factorsText(f)}`],
  };
}

/** The recommended model of one atom from its published values and its first-principles response functions. */
export function recommendedAtom(record: AtomRecord, data: FirstPrinciplesResponse): RecommendedAtom {
  const unscaled = firstPrinciplesTable(data, `${record.symbol}-tdhf`, `${record.name}: ${data.level} (${data.basis}), no empirical input`);
  const factors = rescalingFactors(record, unscaled);
  const fitted = ['alpha', 'C6', 'C8', ...(factors.s3From === 'C10' && record.C10 ? ['C10'] : []), ...(record.B ? ['B'] : [])];
  const species: ResponseTableSpecies = {
    ...rescaledTable(unscaled, factors, record.symbol, rescaledSource(record, data, factors)),
    sourceBrief: `recommended ${record.name}: ${data.level} response rescaled to published ${fitted.join(', ')} (full sources: dispole species)`,
  };
  return { record, data, factors, species, unscaled, response: rescaledResponse(responseTableResponse(unscaled), factors, record.symbol) };
}
