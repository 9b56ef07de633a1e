/** Small integer combinatorics shared by the engines (exact in doubles while the values stay below 2^53). */

/** n! for a non-negative integer n. */
export function factorial(n: number): number {
  let f = 1;
  for (let i = 2; i <= n; i++) f *= i;
  return f;
}

/** The binomial coefficient C(n, k) for 0 ≤ k ≤ n, by the multiplicative formula. */
export function binomial(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}
