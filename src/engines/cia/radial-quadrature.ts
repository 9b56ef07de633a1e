/**
 * Composite Gauss–Legendre quadrature of a vector integrand on [a, b], the number of panels doubled until the
 * largest component changes by less than relTol of the largest result (common practice). Returns the values,
 * the last change as the error estimate, and whether the tolerance was met.
 */
import { gaussLegendre } from '../../math/gauss-legendre.js';

export interface VectorIntegral {
  value: Float64Array;
  error: number;
  converged: boolean;
}

/** f(x, out) adds nothing: it writes the integrand components at x into out. */
export function integrateVector(f: (x: number, out: Float64Array) => void, dim: number, a: number, b: number, relTol = 1e-11, startPanels = 16, maxPanels = 1 << 14): VectorIntegral {
  const rule = gaussLegendre(12);
  const tmp = new Float64Array(dim);
  const sum = (panels: number): Float64Array => {
    const out = new Float64Array(dim);
    const h = (b - a) / panels;
    for (let p = 0; p < panels; p++) {
      const mid = a + (p + 0.5) * h;
      for (let i = 0; i < rule.nodes.length; i++) {
        f(mid + 0.5 * h * rule.nodes[i], tmp);
        const w = 0.5 * h * rule.weights[i];
        for (let k = 0; k < dim; k++) out[k] += w * tmp[k];
      }
    }
    return out;
  };
  let panels = startPanels;
  let prev = sum(panels);
  for (;;) {
    panels *= 2;
    const next = sum(panels);
    let scale = 0, change = 0;
    for (let k = 0; k < dim; k++) {
      scale = Math.max(scale, Math.abs(next[k]));
      change = Math.max(change, Math.abs(next[k] - prev[k]));
    }
    if (change <= relTol * scale || panels >= maxPanels) return { value: next, error: change, converged: change <= relTol * scale };
    prev = next;
  }
}
