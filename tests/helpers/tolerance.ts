/** One tolerance helper for every test: relative (and optional absolute) tolerance, with a readable failure. */
import { expect } from 'vitest';

/**
 * Assert |actual − expected| ≤ max(relTol·|expected|, absTol). On failure the message shows
 * value, expected, delta and tolerance.
 */
export function expectClose(actual: number, expected: number, relTol: number, absTol = 0, label = ''): void {
  const delta = Math.abs(actual - expected);
  const tol = Math.max(relTol * Math.abs(expected), absTol);
  const ok = Number.isFinite(actual) && delta <= tol;
  expect(
    ok,
    `${label ? label + ': ' : ''}value ${actual}, expected ${expected}, delta ${delta.toExponential(3)}, tolerance ${tol.toExponential(3)}`,
  ).toBe(true);
}

/** Relative difference |a − b| / |b| (absolute when b = 0). */
export const relDiff = (a: number, b: number): number => (b === 0 ? Math.abs(a) : Math.abs(a - b) / Math.abs(b));
