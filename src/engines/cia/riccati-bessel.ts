/**
 * Riccati–Bessel functions ĵ_l(x) = x j_l(x) and n̂_l(x) = x y_l(x) (so ĵ_l → sin(x − lπ/2),
 * n̂_l → −cos(x − lπ/2)), from the recurrence z_{l+1} = (2l + 1)/x z_l − z_{l−1}
 * (M. Abramowitz, I. A. Stegun, Handbook of Mathematical Functions (1964), 10.1.19 and 10.3).
 * n̂ by upward recurrence (stable); ĵ upward when x > l, otherwise by Miller's downward recurrence normalised
 * to ĵ_0 = sin x or ĵ_1 = sin x/x − cos x (common practice, e.g. Numerical Recipes §6.7).
 */
export function riccatiBessel(l: number, x: number): [number, number] {
  const s = Math.sin(x), c = Math.cos(x);
  // n̂
  let n0 = -c, n1 = -c / x - s;
  if (l === 0) return [s, n0];
  for (let k = 1; k < l; k++) {
    const n2 = ((2 * k + 1) / x) * n1 - n0;
    n0 = n1;
    n1 = n2;
  }
  const nl = n1;
  const j0 = s, j1 = s / x - c;
  if (x > l) {
    let a = j0, b = j1;
    for (let k = 1; k < l; k++) {
      const t = ((2 * k + 1) / x) * b - a;
      a = b;
      b = t;
    }
    return [b, nl];
  }
  // Miller: start well above l and x, recur down, renormalise on the way to avoid overflow
  const top = l + 30 + Math.ceil(Math.sqrt(40 * (l + 1)));
  let up = 0, cur = 1e-300, jl = 0, r0 = 0, r1 = 0;
  for (let k = top; k >= 1; k--) {
    const down = ((2 * k + 1) / x) * cur - up; // ĵ_{k−1}
    up = cur;
    cur = down;
    if (k - 1 === l) jl = cur;
    if (k === l) jl = up;
    if (Math.abs(cur) > 1e250) {
      cur *= 1e-250;
      up *= 1e-250;
      jl *= 1e-250;
    }
    if (k === 1) {
      r0 = cur; // ĵ_0 unnormalised
      r1 = up; // ĵ_1 unnormalised
    }
  }
  const scale = Math.abs(j0) > Math.abs(j1) ? j0 / r0 : j1 / r1;
  return [jl * scale, nl];
}
