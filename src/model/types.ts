/** Small shared value types. */

/** A Cartesian 3-vector (x, y, z). */
export type Vec3 = [number, number, number];

/** A value with an error estimate; `converged` is false when the estimate exceeds the requested tolerance. */
export interface Estimate {
  value: number;
  error: number;
  converged: boolean;
}
