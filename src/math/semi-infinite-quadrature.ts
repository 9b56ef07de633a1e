/**
 * Adaptive quadrature of a vector-valued integrand over [0, ∞) with an error estimate.
 *
 * Map u = s·t/(1 − t), du = s/(1 − t)² dt onto t ∈ [0, 1); on each panel compare the n-point Gauss–Legendre
 * value with the sum over its two halves (the difference is the panel's error estimate) and bisect the
 * panel with the largest error until every component meets max(relTol·|I_k|, absTol_k). Integrands decaying
 * like u^-2 or faster become smooth and bounded in t (common practice for Casimir–Polder integrals).
 */
import { ConvergenceError } from '../model/errors.js';
import { gaussLegendre } from './gauss-legendre.js';

export interface QuadratureOptions {
  /** Frequency scale s of the map (near the integrand's characteristic frequency). */
  scale: number;
  /** Relative tolerance per component. Default 1e-13. */
  relTol?: number;
  /** Absolute tolerance per component (same units as the integral). Default 0. */
  absTol?: number | Float64Array;
  /** Gauss–Legendre points per panel. Default 20. */
  points?: number;
  /** Largest number of panels before giving up. Default 2000. */
  maxPanels?: number;
}

export interface QuadratureResult {
  value: Float64Array;
  error: Float64Array;
  evaluations: number;
  converged: boolean;
}

interface Panel {
  a: number;
  b: number;
  value: Float64Array;
  error: Float64Array;
  score: number;
}

/** ∫_0^∞ f(u) du component-wise, with an error estimate per component. */
export function integrateSemiInfinite(f: (u: number) => Float64Array, dim: number, options: QuadratureOptions): QuadratureResult {
  const { scale } = options;
  const relTol = options.relTol ?? 1e-13;
  const rule = gaussLegendre(options.points ?? 20);
  const maxPanels = options.maxPanels ?? 2000;
  const absTol = (k: number) => {
    const a = options.absTol ?? 0;
    return typeof a === 'number' ? a : a[k];
  };
  let evaluations = 0;

  const raw = (a: number, b: number): Float64Array => {
    const half = 0.5 * (b - a);
    const mid = 0.5 * (a + b);
    const sum = new Float64Array(dim);
    for (let i = 0; i < rule.nodes.length; i++) {
      const t = mid + half * rule.nodes[i];
      const u = (scale * t) / (1 - t);
      const jac = scale / ((1 - t) * (1 - t));
      const y = f(u);
      evaluations++;
      const wj = rule.weights[i] * half * jac;
      for (let k = 0; k < dim; k++) sum[k] += wj * y[k];
    }
    return sum;
  };
  const panel = (a: number, b: number, whole?: Float64Array): Panel => {
    const coarse = whole ?? raw(a, b);
    const m = 0.5 * (a + b);
    const left = raw(a, m);
    const right = raw(m, b);
    const value = new Float64Array(dim);
    const error = new Float64Array(dim);
    for (let k = 0; k < dim; k++) {
      value[k] = left[k] + right[k];
      error[k] = Math.abs(value[k] - coarse[k]);
    }
    return { a, b, value, error, score: 0 };
  };

  const panels: Panel[] = [panel(0, 0.5), panel(0.5, 1)];
  const total = () => {
    const value = new Float64Array(dim);
    const error = new Float64Array(dim);
    for (const p of panels)
      for (let k = 0; k < dim; k++) {
        value[k] += p.value[k];
        error[k] += p.error[k];
      }
    return { value, error };
  };
  for (;;) {
    const { value, error } = total();
    const tol = Array.from(value, (v, k) => Math.max(relTol * Math.abs(v), absTol(k)));
    const ok = error.every((e, k) => e <= tol[k]);
    if (ok || !error.every(Number.isFinite) || panels.length >= maxPanels) {
      if (!value.every(Number.isFinite)) throw new ConvergenceError('quadrature (integrand not finite)', NaN, relTol);
      return { value, error, evaluations, converged: ok };
    }
    let worst = 0;
    for (let i = 0; i < panels.length; i++) {
      let s = 0;
      for (let k = 0; k < dim; k++) s = Math.max(s, panels[i].error[k] / (tol[k] || Number.MIN_VALUE));
      panels[i].score = s;
      if (s > panels[worst].score) worst = i;
    }
    const p = panels[worst];
    const m = 0.5 * (p.a + p.b);
    panels.splice(worst, 1, panel(p.a, m), panel(m, p.b));
  }
}
