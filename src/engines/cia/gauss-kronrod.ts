/**
 * The 7-point Gauss / 15-point Kronrod pair on [−1, 1] (nodes and weights as tabulated in QUADPACK:
 * R. Piessens, E. de Doncker-Kapenga, C. W. Überhuber, D. K. Kahaner, QUADPACK, Springer (1983)).
 * The difference of the two estimates is the panel's error estimate. The sums of the weights and exactness
 * for polynomials are checked in tests/engines/cia-numerics.test.ts.
 */
const XK = [0.991455371120812639, 0.949107912342758525, 0.864864423359769073, 0.741531185599394440, 0.586087235467691130, 0.405845151377397167, 0.207784955007898468, 0];
const WK = [0.022935322010529225, 0.063092092629978553, 0.104790010322250184, 0.140653259715525919, 0.169004726639267903, 0.190350578064785410, 0.204432940075298892, 0.209482141084727828];
const WG = [0, 0.129484966168869693, 0, 0.279705391489276668, 0, 0.381830050505118945, 0, 0.417959183673469388];

/** The 15 nodes (ascending), Kronrod weights and Gauss weights (0 where the node is not a Gauss node). */
export const KRONROD15 = (() => {
  const nodes: number[] = [], wk: number[] = [], wg: number[] = [];
  for (let i = 0; i < 7; i++) nodes.push(-XK[i]), wk.push(WK[i]), wg.push(WG[i]);
  nodes.push(0), wk.push(WK[7]), wg.push(WG[7]);
  for (let i = 6; i >= 0; i--) nodes.push(XK[i]), wk.push(WK[i]), wg.push(WG[i]);
  return { nodes: Float64Array.from(nodes), kronrod: Float64Array.from(wk), gauss: Float64Array.from(wg) };
})();

export interface Panel {
  a: number;
  b: number;
  value: Float64Array;
  error: Float64Array;
}

/** Integrate a vector function over one panel: Kronrod value and |Kronrod − Gauss| per component. */
export function kronrodPanel(f: (x: number) => Float64Array | null, dim: number, a: number, b: number): Panel {
  const value = new Float64Array(dim), gauss = new Float64Array(dim);
  const half = 0.5 * (b - a), mid = 0.5 * (a + b);
  for (let i = 0; i < 15; i++) {
    const y = f(mid + half * KRONROD15.nodes[i]);
    if (!y) continue;
    const wk = half * KRONROD15.kronrod[i], wg = half * KRONROD15.gauss[i];
    for (let k = 0; k < dim; k++) {
      value[k] += wk * y[k];
      gauss[k] += wg * y[k];
    }
  }
  const error = new Float64Array(dim);
  for (let k = 0; k < dim; k++) error[k] = Math.abs(value[k] - gauss[k]);
  return { a, b, value, error };
}

/**
 * Adaptive vector integration on [a, b]: start with `panels` equal panels, bisect the panel with the largest
 * scaled error until Σ error_k / scale_k ≤ relTol for every component (scale from `scaleOf`), or `maxPanels`.
 */
export function adaptiveKronrod(
  f: (x: number) => Float64Array | null,
  dim: number,
  a: number,
  b: number,
  options: { panels: number; maxPanels: number; relTol: number; scaleOf: (value: Float64Array) => Float64Array },
): { value: Float64Array; error: Float64Array; converged: boolean; panels: number } {
  let list: Panel[] = [];
  for (let p = 0; p < options.panels; p++) list.push(kronrodPanel(f, dim, a + ((b - a) * p) / options.panels, a + ((b - a) * (p + 1)) / options.panels));
  for (;;) {
    const value = new Float64Array(dim), error = new Float64Array(dim);
    for (const p of list) for (let k = 0; k < dim; k++) (value[k] += p.value[k]), (error[k] += p.error[k]);
    const scale = options.scaleOf(value);
    let worst = 0;
    for (let k = 0; k < dim; k++) worst = Math.max(worst, scale[k] > 0 ? error[k] / scale[k] : 0);
    if (worst <= options.relTol || list.length >= options.maxPanels) return { value, error, converged: worst <= options.relTol, panels: list.length };
    // bisect the panel with the largest scaled error
    let bi = 0, bw = -1;
    list.forEach((p, i) => {
      let w = 0;
      for (let k = 0; k < dim; k++) w = Math.max(w, scale[k] > 0 ? p.error[k] / scale[k] : 0);
      if (w > bw) (bw = w), (bi = i);
    });
    const p = list[bi];
    const m = 0.5 * (p.a + p.b);
    list = [...list.slice(0, bi), kronrodPanel(f, dim, p.a, m), kronrodPanel(f, dim, m, p.b), ...list.slice(bi + 1)];
  }
}
