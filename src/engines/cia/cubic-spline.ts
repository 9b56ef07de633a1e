/**
 * Natural cubic spline through tabulated points (common practice, e.g. C. de Boor, A Practical Guide to
 * Splines, Springer 1978): piecewise cubic, continuous second derivative, zero curvature at both ends.
 * Gives the value and the first two derivatives.
 */
export interface CubicSpline {
  x: Float64Array;
  y: Float64Array;
  /** Second derivatives at the knots. */
  m: Float64Array;
}

/** Build the spline; x strictly increasing (checked by the caller), at least 3 points. */
export function cubicSpline(x: readonly number[], y: readonly number[]): CubicSpline {
  const n = x.length;
  const m = new Float64Array(n);
  const c = new Float64Array(n);
  const d = new Float64Array(n);
  // tridiagonal system for the interior second derivatives (Thomas algorithm)
  for (let i = 1; i < n - 1; i++) {
    const h0 = x[i] - x[i - 1];
    const h1 = x[i + 1] - x[i];
    const diag = 2 * (h0 + h1);
    const rhs = 6 * ((y[i + 1] - y[i]) / h1 - (y[i] - y[i - 1]) / h0);
    const prevC = i > 1 ? c[i - 1] : 0;
    const prevD = i > 1 ? d[i - 1] : 0;
    const den = diag - h0 * prevC;
    c[i] = h1 / den;
    d[i] = (rhs - h0 * prevD) / den;
  }
  for (let i = n - 2; i >= 1; i--) m[i] = d[i] - c[i] * m[i + 1];
  return { x: Float64Array.from(x), y: Float64Array.from(y), m };
}

/** Value, first and second derivative at t (clamped to the table's range by the caller). */
export function evaluateSpline(s: CubicSpline, t: number): [number, number, number] {
  const { x, y, m } = s;
  const n = x.length;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (x[mid] > t) hi = mid;
    else lo = mid;
  }
  const h = x[hi] - x[lo];
  const a = (x[hi] - t) / h;
  const b = (t - x[lo]) / h;
  const v = a * y[lo] + b * y[hi] + ((a * a * a - a) * m[lo] + (b * b * b - b) * m[hi]) * (h * h) / 6;
  const d1 = (y[hi] - y[lo]) / h - ((3 * a * a - 1) * m[lo] - (3 * b * b - 1) * m[hi]) * h / 6;
  const d2 = a * m[lo] + b * m[hi];
  return [v, d1, d2];
}
