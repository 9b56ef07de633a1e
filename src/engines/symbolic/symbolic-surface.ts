/**
 * Closed forms for one quantum Drude oscillator (q, m, w or wx, wy, wz along its axes; the surface normal along z)
 * in front of a perfect conductor, in exact rational arithmetic: the force-balance route of
 * src/engines/surface/force-balance-surface.ts with symbols instead of numbers.
 *   C3 = −<W_2>_0,  C5 = −<W_4>_0,  D4 = q <∂W_3/∂z>_0 / (m w_z²)
 * with W_n the image polynomials of image-hamiltonian.ts (exact coefficients from the Taylor expansion of 1/R) and
 * the Gaussian moments <x^a y^b z^c>_0 = Π (e − 1)!! (1/(2 m w_i))^(e/2) (common practice). Units: C3 in Eh·a0³,
 * C5 in Eh·a0⁵, D4 in e·a0⁵; E(Z) ≈ −C3/Z³ − C5/Z⁵, mu_z ≈ D4/Z⁴ with z from the surface to the atom.
 * Isotropic results (derived here): C3 = q²/(8 m w), C5 = 3 q²/(16 m² w²), D4 = 3 q³/(8 m² w³).
 */
import Fraction from 'fraction.js';
import { InputError } from '../../model/errors.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { Monomial } from '../../hamiltonian/monomial.js';
import { closedFormFromTerms, type ClosedForm, type Term } from './closed-form.js';
import { displayOf, type Display } from './display.js';
import { symbolTable, zeroExponents, type SymbolTable } from './symbols.js';

/** Quantities derived for a QDO in front of a conductor. */
export const SURFACE_QUANTITIES = ['C3', 'C5', 'D4'] as const;
export type SurfaceQuantity = (typeof SURFACE_QUANTITIES)[number];

export const SURFACE_QUANTITY_MEANING: Record<SurfaceQuantity, { meaning: string; units: string }> = {
  C3: { meaning: 'image (van der Waals) energy coefficient, E(Z) ∋ −C3/Z^3', units: 'Eh a0^3' },
  C5: { meaning: 'next image energy coefficient, E(Z) ∋ −C5/Z^5', units: 'Eh a0^5' },
  D4: { meaning: 'dispersion dipole along the normal, lim Z^4 mu_z (z from the surface to the atom)', units: 'e a0^5' },
};

export interface DerivedSurfaceQuantity {
  name: SurfaceQuantity;
  form: ClosedForm;
  display: Display;
}

/** A quantity name, validated (case-insensitive). */
export function parseSurfaceQuantity(field: string, name: string): SurfaceQuantity {
  const q = SURFACE_QUANTITIES.find((x) => x.toLowerCase() === name.trim().toLowerCase());
  if (!q) throw new InputError(field, `unknown surface quantity ${JSON.stringify(name)}; known with --surface: ${SURFACE_QUANTITIES.join(', ')}`);
  return q;
}

/** Exact W_n of a one-particle centre as [coefficient, exponents of x, y, z] (a factor q² kept apart). */
function exactImagePolynomial(order: number): Array<{ c: Fraction; p: Monomial }> {
  const merged = new Map<string, { c: Fraction; p: Monomial }>();
  const scale = new Fraction(-1, 2 ** (order + 2));
  for (const t of couplingTerms(order)) {
    const p: Monomial = [t.pA[0] + t.pB[0], t.pA[1] + t.pB[1], t.pA[2] + t.pB[2]];
    const c = t.exact.mul(scale).mul(t.pA[2] % 2 === 0 ? 1 : -1);
    const k = p.join(',');
    const prev = merged.get(k);
    merged.set(k, { p, c: prev ? prev.c.add(c) : c });
  }
  return [...merged.values()].filter((t) => !t.c.equals(0));
}

/** The Gaussian mean of c·x^p (times q^qPower) as a term over the table: Π (e−1)!!/2^(e/2) m^(−e/2) w_i^(−e/2). */
function gaussianTerm(table: SymbolTable, c: Fraction, p: Monomial, qPower: number): Term | undefined {
  if (p.some((e) => e % 2 === 1)) return undefined;
  let coeff = c;
  const e = zeroExponents(table);
  e[table.q.a] += qPower;
  p.forEach((k, axis) => {
    for (let j = k - 1; j > 1; j -= 2) coeff = coeff.mul(j);
    coeff = coeff.div(2 ** (k / 2));
    e[table.m.a] -= k / 2;
    e[table.w.a[axis]] -= k / 2;
  });
  return { c: coeff, e, den: [] };
}

/** Raw terms of one quantity. */
function surfaceTerms(table: SymbolTable, name: SurfaceQuantity): Term[] {
  const out: Term[] = [];
  if (name === 'C3' || name === 'C5') {
    for (const t of exactImagePolynomial(name === 'C3' ? 2 : 4)) {
      const term = gaussianTerm(table, t.c.neg(), t.p, 2);
      if (term) out.push(term);
    }
    return out;
  }
  // D4 = q <∂W_3/∂z>_0 / (m w_z²): q³ from q·q², m^-1 and w_z^-2 added
  for (const t of exactImagePolynomial(3)) {
    if (t.p[2] === 0) continue;
    const term = gaussianTerm(table, t.c.mul(t.p[2]), [t.p[0], t.p[1], t.p[2] - 1], 3);
    if (!term) continue;
    const e = [...term.e];
    e[table.m.a] -= 1;
    e[table.w.a[2]] -= 2;
    out.push({ ...term, e });
  }
  return out;
}

/** Closed forms of `names` for an isotropic (q, m, w) or anisotropic (q, m, wx, wy, wz) QDO. */
export function deriveSurfaceQuantities(names: readonly SurfaceQuantity[], anisotropic = false): DerivedSurfaceQuantity[] {
  const table = symbolTable({ identical: true, anisotropic });
  return names.map((name) => {
    const terms = surfaceTerms(table, name);
    const form = closedFormFromTerms(table, terms);
    return { name, form, display: displayOf(form, terms) };
  });
}
