/**
 * Gauss–Laguerre quadrature ∫_0^∞ e^{-x} p(x) dx = Σ_i w_i p(x_i), exact for polynomials p of degree ≤ 2M − 1,
 * returned in scaled form W_i = w_i e^{x_i} so that ∫_0^∞ f(x) dx = Σ_i W_i f(x_i) for f = e^{-x} × polynomial
 * without overflow (common practice; e.g. Numerical Recipes §4.6).
 *
 * Nodes: eigenvalues of the (tridiagonal) Jacobi matrix of the Laguerre polynomials (Golub & Welsch, Math. Comp. 23,
 * 221 (1969)), polished by Newton steps on L_M. Weights from the Christoffel function, W_i = 1 / Σ_{n<M} ℓ_n(x_i)², with the
 * orthonormal Laguerre functions ℓ_n(x) = e^{-x/2} L_n(x), which stay bounded (no factorials, no overflow).
 */
import { tridiagonalEigenvalues } from '../../math/symmetric-eigen.js';

export interface LaguerreRule {
  nodes: Float64Array;
  /** Scaled weights W_i = w_i e^{x_i}. */
  scaledWeights: Float64Array;
}

/** ℓ_0 … ℓ_{count−1} at x (orthonormal Laguerre functions e^{-x/2} L_n(x)). */
function laguerreFunctions(x: number, count: number): Float64Array {
  const out = new Float64Array(count);
  let a = Math.exp(-x / 2);
  out[0] = a;
  if (count === 1) return out;
  let b = (1 - x) * a;
  out[1] = b;
  for (let n = 1; n < count - 1; n++) {
    const c = ((2 * n + 1 - x) * b - n * a) / (n + 1);
    a = b;
    b = c;
    out[n + 1] = c;
  }
  return out;
}

const cache = new Map<number, LaguerreRule>();

/** The M-point Gauss–Laguerre rule (weight e^{-x} on [0, ∞)), cached. */
export function gaussLaguerre(M: number): LaguerreRule {
  const hit = cache.get(M);
  if (hit) return hit;
  if (!Number.isInteger(M) || M < 1 || M > 400) throw new RangeError(`Gauss–Laguerre order must be 1…400, got ${M}`);
  // the Jacobi matrix: diagonal 2i + 1, off-diagonal i + 1 (row i + 1, column i)
  const diagonal = Float64Array.from({ length: M }, (_, i) => 2 * i + 1);
  const offDiagonal = Float64Array.from({ length: M }, (_, i) => (i + 1 < M ? i + 1 : 0));
  const guesses = tridiagonalEigenvalues(diagonal, offDiagonal);
  const nodes = new Float64Array(M);
  const scaledWeights = new Float64Array(M);
  guesses.forEach((guess, i) => {
    let x = guess;
    for (let iter = 0; iter < 6; iter++) {
      const l = laguerreFunctions(x, M + 1);
      // Newton on L_M: L_M'(x) = M (L_M − L_{M−1}) / x; the common factor e^{-x/2} cancels.
      const step = (x * l[M]) / (M * (l[M] - l[M - 1]));
      x -= step;
      if (Math.abs(step) <= 1e-15 * x) break;
    }
    const l = laguerreFunctions(x, M);
    let s = 0;
    for (let n = 0; n < M; n++) s += l[n] * l[n];
    nodes[i] = x;
    scaledWeights[i] = 1 / s;
  });
  const rule = { nodes, scaledWeights };
  cache.set(M, rule);
  return rule;
}
