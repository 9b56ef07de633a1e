/**
 * The multipole couplings of two Drude oscillators as polynomials in the six Drude coordinates
 * (xA, yA, zA, xB, yB, zB). For a QDO the moment is M_p = −q r^p (the core sits at the centre), so each
 * coupling term c M^A_{pA} M^B_{pB} becomes qA qB c rA^pA rB^pB: the Taylor expansion of
 *   V = qA qB [ g(0) − g(r_B) − g(−r_A) + g(r_B − r_A) ],  g(d) = 1/|R ẑ + d|.
 */
import type Fraction from 'fraction.js';
import { couplingTerms } from './multipole-coupling.js';

/** c · xA^e0 yA^e1 zA^e2 xB^e3 yB^e4 zB^e5, with c exact (the factor qA qB / R^(order+1) is kept apart). */
export interface DrudeMonomialTerm {
  exact: Fraction;
  c: number;
  e: readonly [number, number, number, number, number, number];
}

/** The order-n coupling as a polynomial; multiply by qA qB / R^(n+1) for the energy in hartree. */
export function drudeCouplingPolynomial(order: number): DrudeMonomialTerm[] {
  return couplingTerms(order).map((t) => ({
    exact: t.exact,
    c: t.c,
    e: [t.pA[0], t.pA[1], t.pA[2], t.pB[0], t.pB[1], t.pB[2]] as const,
  }));
}

/** Evaluate the order-n coupling energy (hartree) for Drude displacements rA, rB at separation R. */
export function drudeCouplingEnergy(
  order: number,
  R: number,
  qA: number,
  qB: number,
  rA: readonly number[],
  rB: readonly number[],
): number {
  const x = [...rA, ...rB];
  let s = 0;
  for (const t of drudeCouplingPolynomial(order)) {
    let m = t.c;
    for (let i = 0; i < 6; i++) if (t.e[i]) m *= x[i] ** t.e[i];
    s += m;
  }
  return (qA * qB * s) / R ** (order + 1);
}

/** The exact Coulomb interaction of the four QDO charges (hartree): the quantity the expansion approximates. */
export function drudeExactCoulomb(R: number, qA: number, qB: number, rA: readonly number[], rB: readonly number[]): number {
  const g = (d: readonly number[]) => 1 / Math.hypot(d[0], d[1], R + d[2]);
  const diff = [rB[0] - rA[0], rB[1] - rA[1], rB[2] - rA[2]];
  return qA * qB * (g([0, 0, 0]) - g(rB) - g([-rA[0], -rA[1], -rA[2]]) + g(diff));
}
