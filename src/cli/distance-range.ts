/**
 * The --from/--to distance range of the finite-distance commands (`curve`, `surface --exact`) and the single distance of `density`, checked option by
 * option in the user's length unit. Upper limit: 1e6 bohr (≈ 5.3e5 Å; messages state it in the unit asked for), far beyond where
 * any asymptotic coefficient is distinguishable from the exact curve in double precision (R^-6 terms at 1e6 bohr are
 * 1e-36 of their value at 1 bohr), and small enough that the grid and its powers (up to R^10) stay finite (derived here).
 */
import { InputError } from '../model/errors.js';
import { angstromToBohr, bohrToAngstrom } from '../model/units.js';
import type { LengthUnit } from '../report/curve-report.js';
import { sig } from '../report/format.js';

/** Largest distance accepted for --from and --to, bohr. */
export const MAX_DISTANCE_BOHR = 1e6;

/**
 * One distance option (`--from`, `--to`, `--R`) in the user's `length` unit, checked against (0, {@link MAX_DISTANCE_BOHR}];
 * the error names the option and states the limit in that unit. Returns the value unchanged (user units).
 */
export function requireDistance(option: string, x: number, length: LengthUnit): number {
  const unit = length === 'bohr' ? 'bohr' : 'Å';
  const max = length === 'bohr' ? MAX_DISTANCE_BOHR : bohrToAngstrom(MAX_DISTANCE_BOHR);
  if (!(x > 0 && x <= max)) throw new InputError(option, `must be a distance > 0 and at most ${sig(max, 6)} ${unit}, got ${x} ${unit}`);
  return x;
}

/**
 * The range in bohr from the user's --from/--to (in `length` units; undefined → defaults: `defaultFromBohr`, and
 * 5 × from). Each bound must be at most {@link MAX_DISTANCE_BOHR}, and --to larger than --from; errors name the
 * option and quote every length in the user's unit.
 */
export function distanceRange(flags: { from?: number; to?: number; length: LengthUnit }, defaultFromBohr: number): { from: number; to: number } {
  const unit = flags.length === 'bohr' ? 'bohr' : 'Å';
  const toUser = (bohr: number) => (flags.length === 'bohr' ? bohr : bohrToAngstrom(bohr));
  const toBohr = (x: number) => (flags.length === 'bohr' ? x : angstromToBohr(x));
  const show = (bohr: number) => `${sig(toUser(bohr), 6)} ${unit}`;
  for (const name of ['from', 'to'] as const) {
    const x = flags[name];
    if (x !== undefined) requireDistance(`--${name}`, x, flags.length);
  }
  const from = flags.from !== undefined ? toBohr(flags.from) : defaultFromBohr;
  const to = flags.to !== undefined ? toBohr(flags.to) : Math.min(5 * from, MAX_DISTANCE_BOHR);
  if (!(to > from)) {
    if (flags.to === undefined) throw new InputError('--from', `must be below the upper limit of --to (${show(to)}; default --to: 5 × --from, capped there), got ${show(from)}`);
    throw new InputError('--to', `must be larger than --from (${sig(toUser(from), 6)}), got ${flags.to} (both ${unit})`);
  }
  return { from, to };
}
