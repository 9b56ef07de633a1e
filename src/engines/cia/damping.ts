/**
 * The Tang–Toennies damping functions
 *   f_n(x) = 1 − e^(−x) Σ_{k=0..n} x^k / k!,
 * and their first two derivatives in x (K. T. Tang, J. P. Toennies, J. Chem. Phys. 80, 3726 (1984), Eq. 6):
 *   f_n'(x) = e^(−x) x^n / n!,   f_n''(x) = e^(−x) (x^(n−1)/(n−1)! − x^n/n!).
 * For small x the sum is replaced by the tail series e^(−x) Σ_{k>n} x^k/k! to avoid cancellation.
 */
export function tangToenniesDamping(n: number, x: number): [number, number, number] {
  if (!(x > 0)) return [0, 0, 0];
  const ex = Math.exp(-x);
  let term = 1;
  for (let k = 1; k <= n; k++) term *= x / k; // x^n/n!
  const d1 = ex * term;
  const d2 = ex * (term * (n / x) - term);
  let f: number;
  if (x < n + 1) {
    // tail: e^(−x) Σ_{k>n} x^k/k!, converges fast for x ≲ n
    let t = term;
    let sum = 0;
    for (let k = n + 1; k < n + 200; k++) {
      t *= x / k;
      sum += t;
      if (t < 1e-17 * sum) break;
    }
    f = ex * sum;
  } else {
    let t = 1;
    let sum = 1;
    for (let k = 1; k <= n; k++) {
      t *= x / k;
      sum += t;
    }
    f = 1 - ex * sum;
  }
  return [f, d1, d2];
}
