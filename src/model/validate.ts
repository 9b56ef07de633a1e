/** Validation helpers for the public edge. NaN-safe: comparisons are written so that NaN fails them. */
import { InputError, describeValue } from './errors.js';

/** A finite number strictly greater than zero, else an {@link InputError} naming `field`. */
export function requirePositive(field: string, value: unknown): number {
  const x = asNumber(value);
  if (!(x > 0) || !Number.isFinite(x)) throw new InputError(field, `must be a finite number > 0, got ${describeValue(value)}`);
  return x;
}

/** A number, or a non-blank numeric string converted; anything else becomes NaN (and fails the checks). */
function asNumber(value: unknown): number {
  if (typeof value === 'number') return value;
  if (typeof value === 'string' && value.trim() !== '') return Number(value);
  return NaN;
}

/** A finite number (any sign). */
export function requireFinite(field: string, value: unknown): number {
  const x = asNumber(value);
  if (!Number.isFinite(x)) throw new InputError(field, `must be a finite number, got ${describeValue(value)}`);
  return x;
}

/** An integer in [min, max]. */
export function requireIntegerIn(field: string, value: unknown, min: number, max: number): number {
  const x = asNumber(value);
  if (!Number.isInteger(x) || !(x >= min) || !(x <= max)) {
    throw new InputError(field, `must be an integer from ${min} to ${max}, got ${describeValue(value)}`);
  }
  return x;
}

/** A number in the closed range [min, max]. */
export function requireInRange(field: string, value: unknown, min: number, max: number): number {
  const x = asNumber(value);
  if (!(x >= min) || !(x <= max)) throw new InputError(field, `must be a number from ${min} to ${max}, got ${describeValue(value)}`);
  return x;
}

/** One of a fixed list of strings. */
export function requireOneOf<T extends string>(field: string, value: unknown, allowed: readonly T[]): T {
  if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
    throw new InputError(field, `must be one of ${allowed.join(', ')}, got ${describeValue(value)}`);
  }
  return value as T;
}
