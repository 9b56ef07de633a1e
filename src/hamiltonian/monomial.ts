/** Cartesian monomials x^a y^b z^c, the building blocks of every multipole coupling. */

/** Exponents (a, b, c) of x^a y^b z^c. */
export type Monomial = readonly [number, number, number];

/** Total degree a + b + c. */
export const degree = (p: Monomial): number => p[0] + p[1] + p[2];

/** A compact integer key for a monomial (exponents below 32). */
export const monomialKey = (p: Monomial): number => p[0] + 32 * p[1] + 1024 * p[2];

/** All monomials of exactly degree n, in a fixed order (z-power descending, then y). */
export function monomialsOfDegree(n: number): Monomial[] {
  const out: Monomial[] = [];
  for (let c = n; c >= 0; c--) for (let b = n - c; b >= 0; b--) out.push([n - b - c, b, c]);
  return out;
}

/** The unit monomials: the dipole components x, y, z. */
export const AXIS_MONOMIALS: readonly Monomial[] = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

/** Human form, e.g. `x^2 z`. */
export function monomialString(p: Monomial, names: readonly string[] = ['x', 'y', 'z']): string {
  const parts: string[] = [];
  p.forEach((e, i) => {
    if (e === 1) parts.push(names[i]);
    else if (e > 1) parts.push(`${names[i]}^${e}`);
  });
  return parts.length ? parts.join(' ') : '1';
}
