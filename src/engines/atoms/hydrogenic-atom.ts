/**
 * A hydrogenic species' capabilities: its pseudo-state space (perturbation route), its isotropic response
 * (response route), and a basis-convergence check at two basis sizes. The pseudo-spectrum is cached per
 * (Z, basis), so repeated pairs reuse it.
 */
import type { HydrogenicSpecies } from '../../model/hydrogenic.js';
import type { LocalSpace } from '../perturbation/local-space.js';
import type { IsotropicResponse } from '../response/response-model.js';
import { likePairD7a, linesProductIntegral, pseudoStateResponse, type StaticAtomProperties } from './pseudo-state-response.js';
import { pseudoStateSpace } from './pseudo-state-space.js';
import { hydrogenicSpectrum } from './sturmian-spectrum.js';

/** Angular momenta kept: l ≤ 3 is exact for C6…C10 and D7 of spherical atoms (see pseudo-state-space.ts). */
export const HYDROGENIC_L_MAX = 3;

const spaces = new Map<string, LocalSpace>();

/** The perturbation-route state space (cached per Z and basis; its moment actions are cached inside). */
export function hydrogenicSpace(s: HydrogenicSpecies): LocalSpace {
  const key = `${s.Z}|${s.basis}`;
  let space = spaces.get(key);
  if (!space) {
    space = pseudoStateSpace(hydrogenicSpectrum(s.Z, s.basis, HYDROGENIC_L_MAX));
    spaces.set(key, space);
  }
  return space;
}

/** The response-route functions alpha_l(iu), B(0; iu, −iu) from the same pseudo-spectrum. */
export function hydrogenicResponse(s: HydrogenicSpecies): IsotropicResponse & { statics: StaticAtomProperties } {
  return pseudoStateResponse(hydrogenicSpectrum(s.Z, s.basis, HYDROGENIC_L_MAX));
}

/** Like-pair coefficients of a hydrogenic atom from a basis of `basis` functions per l. */
export interface LikePairValues {
  basis: number;
  C6: number;
  C8: number;
  /** D7.a of the like pair (A at the origin), e·a0^8. */
  D7a: number;
}

/** The like pair's C6, C8 and D7.a (closed-form sums over the pseudo-states, no quadrature) for one basis size. */
export function hydrogenicLikePair(Z: number, basis: number): LikePairValues {
  const r = pseudoStateResponse(hydrogenicSpectrum(Z, basis, HYDROGENIC_L_MAX));
  const [l1, l2] = r.lines;
  const C6 = (3 / Math.PI) * linesProductIntegral(l1, l1);
  const C8 = (15 / Math.PI) * linesProductIntegral(l1, l2);
  return { basis, C6, C8, D7a: likePairD7a(r) };
}

/** The basis check: like-pair values at the species' basis and at a smaller one, with relative changes. */
export function hydrogenicBasisCheck(s: HydrogenicSpecies): { coarse: LikePairValues; fine: LikePairValues; change: { C6: number; C8: number; D7a: number } } {
  const fine = hydrogenicLikePair(s.Z, s.basis);
  const coarse = hydrogenicLikePair(s.Z, Math.max(3, s.basis - 3));
  const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
  return { coarse, fine, change: { C6: rel(coarse.C6, fine.C6), C8: rel(coarse.C8, fine.C8), D7a: rel(coarse.D7a, fine.D7a) } };
}

const noteCache = new Map<string, string[]>();

/** Human notes: what the species' pseudo-spectrum is and how converged it is (cached per Z, basis, name). */
export function hydrogenicNotes(s: HydrogenicSpecies): string[] {
  const key = `${s.Z}|${s.basis}|${s.name}`;
  const hit = noteCache.get(key);
  if (hit) return hit;
  const { coarse, fine, change } = hydrogenicBasisCheck(s);
  const e = (x: number) => x.toExponential(1);
  const notes = [
    `${s.name}: Sturmian pseudo-spectrum, ${s.basis} functions per l (l ≤ ${HYDROGENIC_L_MAX}), exponent Z = ${s.Z}`,
    `${s.name}: basis check, like pair with ${coarse.basis} vs ${fine.basis} functions: relative change C6 ${e(change.C6)}, C8 ${e(change.C8)}, D7.a ${e(change.D7a)}`,
  ];
  noteCache.set(key, notes);
  return notes;
}
