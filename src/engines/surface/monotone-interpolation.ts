/**
 * Monotone piecewise-cubic Hermite interpolation (F. N. Fritsch, R. E. Carlson, SIAM J. Numer. Anal. 17, 238
 * (1980)), with the three-point slopes of F. N. Fritsch, J. Butland, SIAM J. Sci. Stat. Comput. 5, 300 (1984):
 * monotone data give a monotone interpolant without overshoot, which keeps an image factor inside [0, 1].
 */

/** The interpolant of (x_k, y_k), x strictly increasing; outside [x_0, x_n] the end values are held. */
export function monotoneCubic(x: readonly number[], y: readonly number[]): (t: number) => number {
  const n = x.length;
  const h = Array.from({ length: n - 1 }, (_, k) => x[k + 1] - x[k]);
  const s = h.map((hk, k) => (y[k + 1] - y[k]) / hk);
  const d = new Float64Array(n);
  for (let k = 1; k < n - 1; k++) {
    if (s[k - 1] * s[k] <= 0) d[k] = 0;
    else {
      const w1 = 2 * h[k] + h[k - 1], w2 = h[k] + 2 * h[k - 1];
      d[k] = (w1 + w2) / (w1 / s[k - 1] + w2 / s[k]);
    }
  }
  // one-sided three-point ends, limited to keep monotonicity
  const end = (h0: number, h1: number, s0: number, s1: number) => {
    let v = ((2 * h0 + h1) * s0 - h0 * s1) / (h0 + h1);
    if (Math.sign(v) !== Math.sign(s0)) v = 0;
    else if (Math.sign(s0) !== Math.sign(s1) && Math.abs(v) > Math.abs(3 * s0)) v = 3 * s0;
    return v;
  };
  d[0] = n > 2 ? end(h[0], h[1], s[0], s[1]) : s[0];
  d[n - 1] = n > 2 ? end(h[n - 2], h[n - 3], s[n - 2], s[n - 3]) : s[0];
  return (t: number) => {
    if (t <= x[0]) return y[0];
    if (t >= x[n - 1]) return y[n - 1];
    let lo = 0, hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (x[mid] <= t) lo = mid;
      else hi = mid;
    }
    const hk = h[lo], u = (t - x[lo]) / hk;
    const h00 = (1 + 2 * u) * (1 - u) ** 2, h10 = u * (1 - u) ** 2, h01 = u * u * (3 - 2 * u), h11 = u * u * (u - 1);
    return h00 * y[lo] + h10 * hk * d[lo] + h01 * y[lo + 1] + h11 * hk * d[lo + 1];
  };
}
