/**
 * Typed errors with one message style. The CLI maps them to exit codes:
 * {@link InputError} → 2 (bad input, nothing written), {@link ConvergenceError} → 3.
 */

/** Bad input at the public edge: names the field and what would have been allowed. */
export class InputError extends Error {
  override readonly name = 'InputError';
  constructor(
    /** Dotted path of the offending field, e.g. `species.A.w` or `file.csv:12:3`. */
    readonly field: string,
    /** What is wrong and what is allowed, e.g. `must be a finite number > 0, got -1`. */
    readonly problem: string,
  ) {
    super(`${field}: ${problem}`);
  }
}

/** A numerical procedure did not reach its tolerance; carries what it did reach. */
export class ConvergenceError extends Error {
  override readonly name = 'ConvergenceError';
  constructor(
    readonly what: string,
    readonly reached: number,
    readonly wanted: number,
  ) {
    super(`${what} did not converge: error estimate ${reached.toExponential(2)} > tolerance ${wanted.toExponential(2)}`);
  }
}

/** Describe a received value for an error message (keeps NaN, strings and objects readable). */
export function describeValue(v: unknown): string {
  if (typeof v === 'string') return JSON.stringify(v);
  if (typeof v === 'number') return String(v);
  if (v === undefined) return 'nothing';
  try {
    return JSON.stringify(v);
  } catch {
    return String(v);
  }
}
