/**
 * A hydrogen-like atom: one electron bound to a point nucleus of charge Z (infinite nuclear mass,
 * non-relativistic), computed from first principles by the engines (a radial Sturmian pseudo-spectrum,
 * src/engines/atoms/sturmian-spectrum.ts). Plain data; atomic units.
 */
import { InputError } from './errors.js';
import { requireIntegerIn, requirePositive } from './validate.js';

export interface HydrogenicSpecies {
  kind: 'hydrogenic';
  /** Display name (a built-in name, a file entry's name, or the inline spec). */
  name: string;
  /** Nuclear charge, in e (1 for hydrogen; any value > 0 for a hydrogen-like ion). */
  Z: number;
  /** Sturmian functions per angular momentum (the pseudo-spectrum's size). */
  basis: number;
  /** Where the species comes from. */
  source?: string;
}

/** Default basis size: C6, C8, C10 of H–H within ~2e-11 of the exact values (see the tests) at ~0.3 s per pair. */
export const DEFAULT_HYDROGENIC_BASIS = 10;
/** Allowed basis sizes: the perturbation route's cost grows like basis⁴. */
export const HYDROGENIC_BASIS_RANGE = [4, 24] as const;

/** A hydrogen-like atom; fields validated (Z finite > 0 and at most 20, basis an integer in range). */
export function hydrogenic(params: { Z?: unknown; basis?: unknown }, name = 'hydrogenic', source?: string): HydrogenicSpecies {
  const Z = params.Z === undefined ? 1 : requirePositive(`${name}.Z`, params.Z);
  if (Z > 20) throw new InputError(`${name}.Z`, `must be a finite number > 0 and ≤ 20, got ${Z}`);
  const basis =
    params.basis === undefined
      ? DEFAULT_HYDROGENIC_BASIS
      : requireIntegerIn(`${name}.basis`, params.basis, HYDROGENIC_BASIS_RANGE[0], HYDROGENIC_BASIS_RANGE[1]);
  return { kind: 'hydrogenic', name, Z, basis, ...(source ? { source } : {}) };
}
