/**
 * Interpolation of smooth tabulated functions by barycentric rational interpolants
 *   r(x) = Σ_j w_j y_j / (x − x_j) / Σ_j w_j / (x − x_j),   r(x_j) = y_j at the support points.
 *
 * - AAA (Y. Nakatsukasa, O. Sète, L. N. Trefethen, SIAM J. Sci. Comput. 40, A1494 (2018)): support points
 *   chosen greedily, weights from the smallest singular vector of the Loewner matrix. Response functions at
 *   imaginary frequency are Stieltjes functions of u² (alpha(iu) = Σ f/(ω² + u²)), which rational functions
 *   approximate at a geometric rate, so a 30-point table is reproduced to many digits.
 * - Floater–Hormann (M. S. Floater, K. Hormann, Numer. Math. 107, 315 (2007)): fixed weights of blending
 *   degree d, no poles on the real line, error O(h^(d+1)); the robust fallback when AAA's interpolant fails
 *   the pole checks (e.g. for noisy data).
 */
import { mlMatrixModule } from '../../lazy-modules.js';

/** A barycentric rational function. */
export interface Barycentric {
  x: Float64Array;
  y: Float64Array;
  w: Float64Array;
}

/** Evaluate a barycentric form (exact at support points). */
export function evaluateBarycentric(b: Barycentric, t: number): number {
  let num = 0, den = 0;
  for (let j = 0; j < b.x.length; j++) {
    const d = t - b.x[j];
    if (d === 0) return b.y[j];
    const c = b.w[j] / d;
    num += c * b.y[j];
    den += c;
  }
  return num / den;
}

/** Floater–Hormann weights of blending degree d on nodes x (strictly increasing). */
export function floaterHormann(x: ArrayLike<number>, y: ArrayLike<number>, d: number): Barycentric {
  const n = x.length - 1;
  const dd = Math.min(d, n);
  const w = new Float64Array(n + 1);
  for (let k = 0; k <= n; k++) {
    let s = 0;
    for (let i = Math.max(0, k - dd); i <= Math.min(k, n - dd); i++) {
      let p = 1;
      for (let j = i; j <= i + dd; j++) if (j !== k) p /= Math.abs(x[k] - x[j]);
      s += p;
    }
    w[k] = (k - dd) % 2 === 0 ? s : -s;
  }
  return { x: Float64Array.from(x), y: Float64Array.from(y), w };
}

export interface AaaResult extends Barycentric {
  /** Largest |r(x_i) − y_i| / max|y| over all data points. */
  residual: number;
}

/** max |y_i| (0 for no values) by a loop: spreading a large array into Math.max overflows the call stack. */
export function maxAbs(y: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < y.length; i++) {
    const a = Math.abs(y[i]);
    if (a > m || Number.isNaN(a)) m = a;
  }
  return m;
}

/**
 * AAA rational interpolation of (x_i, y_i). `forced` indices start the support set (e.g. both ends of the
 * interval, so the interpolant is pinned there). Stops when the residual is below `tol` · max|y| or the
 * support set holds half the points (then the weights are a least-squares fit on the rest).
 */
export function aaa(x: ArrayLike<number>, y: ArrayLike<number>, forced: readonly number[] = [], tol = 1e-13): AaaResult {
  const M = x.length;
  const ymax = maxAbs(y) || 1;
  const support: number[] = [];
  const rest = new Set(Array.from({ length: M }, (_, i) => i));
  let w = new Float64Array(0);
  const current = (): Barycentric => ({
    x: Float64Array.from(support, (i) => x[i]),
    y: Float64Array.from(support, (i) => y[i]),
    w,
  });
  const maxSupport = Math.max(forced.length + 1, Math.floor(M / 2));
  const { Matrix, SingularValueDecomposition } = mlMatrixModule();
  const pick = (i: number) => {
    support.push(i);
    rest.delete(i);
    const rows = [...rest];
    const A = new Matrix(Math.max(rows.length, 1), support.length);
    rows.forEach((r, a) => support.forEach((s, b) => A.set(a, b, (y[r] - y[s]) / (x[r] - x[s]))));
    if (rows.length < support.length) {
      w = Float64Array.from(support, () => 1);
      return;
    }
    const svd = new SingularValueDecomposition(A, { autoTranspose: true });
    const V = svd.rightSingularVectors;
    const last = V.columns - 1;
    w = Float64Array.from(support, (_, b) => V.get(b, last));
  };
  for (const i of forced) pick(i);
  for (;;) {
    const b = current();
    let worst = -1, err = 0;
    for (const i of rest) {
      const e = Math.abs(evaluateBarycentric(b, x[i]) - y[i]);
      if (!(e <= err)) {
        err = e;
        worst = i;
      }
    }
    if (worst < 0 || err <= tol * ymax || support.length >= maxSupport) return { ...b, residual: err / ymax };
    pick(worst);
  }
}

/** Σ_j w_j / (x − x_j), the barycentric denominator (its zeros off the support points are the poles). */
function denominator(b: Barycentric, t: number): number {
  let d = 0;
  for (let j = 0; j < b.x.length; j++) d += b.w[j] / (t - b.x[j]);
  return d;
}

/**
 * Checks that a barycentric interpolant has no pole in [lo, hi]. Between two neighbouring support points the
 * denominator D(x) = Σ w_j/(x − x_j) runs from sign(w_j)·∞ to −sign(w_{j+1})·∞, so weights of equal sign force a
 * zero of D (a pole); beyond the outermost support points D must keep the sign it has next to them
 * (−sign(w_first) below, sign(w_last) above). Dense sampling must also stay finite and below `bound`.
 * (Sign rule: e.g. C. Schneider, W. Werner, Math. Comp. 47, 285 (1986).)
 */
export function poleFree(b: Barycentric, lo: number, hi: number, bound: number): boolean {
  const order = Array.from(b.x, (_, i) => i).sort((p, q) => b.x[p] - b.x[q]);
  for (let k = 1; k < order.length; k++) if (Math.sign(b.w[order[k]]) === Math.sign(b.w[order[k - 1]])) return false;
  const first = order[0], last = order[order.length - 1];
  if (lo < b.x[first] && Math.sign(denominator(b, lo)) !== -Math.sign(b.w[first])) return false;
  if (hi > b.x[last] && Math.sign(denominator(b, hi)) !== Math.sign(b.w[last])) return false;
  const samples = 4000;
  for (let i = 0; i <= samples; i++) {
    const v = evaluateBarycentric(b, lo + ((hi - lo) * i) / samples);
    if (!Number.isFinite(v) || Math.abs(v) > bound) return false;
  }
  return true;
}
