/**
 * The exact canonical form of the symbolic engine's results.
 *
 * Perturbation theory for harmonic centres produces sums of {@link Term}s: a rational number times a Laurent
 * monomial in the symbols times reciprocals of excitation energies, which are linear forms in the frequencies
 * with positive integer coefficients (e.g. 1/(wa + wb), 1/(2wa + wb)). {@link closedFormFromTerms} puts such a sum
 * over its common denominator and cancels everything that cancels:
 *
 *   value = coefficient · x^monomial · numerator / Π_k L_k^power_k
 *
 * with `numerator` a polynomial with coprime integer coefficients, positive leading coefficient, no monomial
 * factor and no factor L_k, and every L_k primitive (coprime integer coefficients). Distinct primitive linear
 * forms are coprime and irreducible, so this is the ratio of polynomials in lowest terms: equal rational
 * functions give identical closed forms (derived here; standard polynomial algebra).
 */
import Fraction from 'fraction.js';
import {
  addTerm,
  constantPoly,
  divideExact,
  evaluatePoly,
  evaluatePolyNumber,
  exponentKey,
  monomialContent,
  monomialPoly,
  mulPoly,
  powPoly,
  rationalContent,
  scalePoly,
  shiftPoly,
  type Poly,
  type PolyTerm,
} from './polynomial.js';
import type { SymbolTable } from './symbols.js';

/** c · x^e / Π den, with `den` the sorted keys of primitive linear forms (see {@link linearFormKey}). */
export interface Term {
  c: Fraction;
  e: readonly number[];
  den: readonly string[];
}

/** A linear form Σ a_i x_i (integer a_i ≥ 0, primitive) by its coefficient vector. */
export type LinearForm = readonly number[];

export const linearFormKey = (f: LinearForm): string => f.join(',');
const formOfKey = (k: string): LinearForm => k.split(',').map(Number);

/** The key under which terms with the same monomial and denominator are merged. */
export const termKey = (t: Term): string => `${exponentKey(t.e)}|${t.den.join(';')}`;

/** a · b. */
export function mulTerms(a: Term, b: Term): Term {
  const den = a.den.length === 0 ? b.den : b.den.length === 0 ? a.den : [...a.den, ...b.den].sort();
  return { c: a.c.mul(b.c), e: a.e.map((x, i) => x + b.e[i]), den };
}

/** Add a term into a sum keyed by {@link termKey}, dropping cancelled terms. */
export function accumulate(sum: Map<string, Term>, t: Term): void {
  if (t.c.equals(0)) return;
  const k = termKey(t);
  const prev = sum.get(k);
  if (!prev) {
    sum.set(k, t);
    return;
  }
  const c = prev.c.add(t.c);
  if (c.equals(0)) sum.delete(k);
  else sum.set(k, { c, e: prev.e, den: prev.den });
}

function gcdInt(a: number, b: number): number {
  a = Math.abs(a);
  b = Math.abs(b);
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * 1/(Σ a_i x_i) as a term: the common factor g of the a_i moves into the coefficient, and a form with a single
 * symbol becomes a negative power of it (1/(2w) = (1/2) w^-1).
 */
export function reciprocalLinear(a: LinearForm): Term {
  const g = a.reduce(gcdInt, 0);
  if (g === 0) throw new RangeError('reciprocal of the zero form');
  const used = a.map((x, i) => (x !== 0 ? i : -1)).filter((i) => i >= 0);
  const e = a.map(() => 0);
  if (used.length === 1) {
    e[used[0]] = -1;
    return { c: new Fraction(1, g), e, den: [] };
  }
  return { c: new Fraction(1, g), e, den: [linearFormKey(a.map((x) => x / g))] };
}

/** The canonical closed form (see the module comment). The zero form has coefficient 0. */
export interface ClosedForm {
  table: SymbolTable;
  coefficient: Fraction;
  monomial: readonly number[];
  numerator: Poly;
  denominator: ReadonlyArray<{ form: LinearForm; power: number }>;
}

/** The linear form as a polynomial. */
export function linearFormPoly(f: LinearForm): Poly {
  const out = new Map<string, PolyTerm>();
  f.forEach((a, i) => {
    if (a === 0) return;
    const e = f.map(() => 0);
    e[i] = 1;
    addTerm(out, e, new Fraction(a));
  });
  return out;
}

/** The zero closed form. */
export function zeroForm(table: SymbolTable): ClosedForm {
  const n = table.symbols.length;
  return { table, coefficient: new Fraction(0), monomial: new Array<number>(n).fill(0), numerator: constantPoly(1, n), denominator: [] };
}

export const isZeroForm = (f: ClosedForm): boolean => f.coefficient.equals(0);

/** Put a sum of terms over its common denominator and reduce it to the canonical closed form. */
export function closedFormFromTerms(table: SymbolTable, terms: Iterable<Term>): ClosedForm {
  const n = table.symbols.length;
  const merged = new Map<string, Term>();
  for (const t of terms) accumulate(merged, t);
  const list = [...merged.values()];
  if (list.length === 0) return zeroForm(table);

  // Common denominator: each linear form to its highest power, each symbol to its lowest exponent.
  const powerOf = (t: Term) => {
    const m = new Map<string, number>();
    for (const k of t.den) m.set(k, (m.get(k) ?? 0) + 1);
    return m;
  };
  const maxPower = new Map<string, number>();
  const powers = list.map(powerOf);
  for (const p of powers) for (const [k, v] of p) maxPower.set(k, Math.max(maxPower.get(k) ?? 0, v));
  const minExp = list.reduce<number[]>((acc, t) => acc.map((x, i) => Math.min(x, t.e[i])), [...list[0].e]);

  const formPolys = new Map<string, Poly>([...maxPower.keys()].map((k) => [k, linearFormPoly(formOfKey(k))]));
  const powCache = new Map<string, Poly>();
  const formPow = (k: string, p: number): Poly => {
    const key = `${k}^${p}`;
    let hit = powCache.get(key);
    if (!hit) powCache.set(key, (hit = powPoly(formPolys.get(k)!, p, n)));
    return hit;
  };

  const numer = new Map<string, PolyTerm>();
  list.forEach((t, idx) => {
    let part: Poly = monomialPoly(t.e.map((x, i) => x - minExp[i]), t.c);
    for (const [k, K] of maxPower) {
      const missing = K - (powers[idx].get(k) ?? 0);
      if (missing > 0) part = mulPoly(part, formPow(k, missing));
    }
    for (const term of part.values()) addTerm(numer, term.e, term.c);
  });
  return reduce(table, numer, minExp, maxPower, formPolys);
}

/** Cancel linear factors, then pull the monomial and rational contents out of the numerator. */
function reduce(table: SymbolTable, numer: Poly, mono: number[], maxPower: Map<string, number>, formPolys: Map<string, Poly>): ClosedForm {
  const n = table.symbols.length;
  if (numer.size === 0) return zeroForm(table);
  let num = numer;
  const denominator: Array<{ form: LinearForm; power: number }> = [];
  for (const [k, K] of [...maxPower].sort((a, b) => (a[0] < b[0] ? -1 : 1))) {
    let power = K;
    while (power > 0 && vanishesOn(num, formOfKey(k))) {
      const q = divideExact(num, formPolys.get(k)!);
      if (!q) break;
      num = q;
      power--;
    }
    if (power > 0) denominator.push({ form: formOfKey(k), power });
  }
  const content = monomialContent(num, n);
  num = shiftPoly(num, content.map((x) => -x));
  const c = rationalContent(num);
  num = scalePoly(num, c.inverse());
  return {
    table,
    coefficient: c,
    monomial: mono.map((x, i) => x + content[i]),
    numerator: num,
    denominator: orderDenominator(denominator),
  };
}

/**
 * A cheap necessary condition for L | N: N vanishes at a point of the hyperplane L = 0 (the other symbols at
 * fixed unrelated rationals). False proves N is not divisible by L; true is confirmed by exact division.
 */
function vanishesOn(num: Poly, form: LinearForm): boolean {
  const v = form.findIndex((a) => a !== 0);
  const values = form.map((_, i) => new Fraction(PRIMES[i % PRIMES.length], PRIMES[(i + 5) % PRIMES.length]));
  let rest = new Fraction(0);
  form.forEach((a, i) => {
    if (i !== v && a !== 0) rest = rest.add(values[i].mul(a));
  });
  values[v] = rest.neg().div(form[v]);
  return evaluatePoly(num, values).equals(0);
}

const PRIMES = [3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37, 41, 43];

/** Denominator factors in a fixed order: fewer symbols first, then by coefficients. */
function orderDenominator(d: Array<{ form: LinearForm; power: number }>): Array<{ form: LinearForm; power: number }> {
  const used = (f: LinearForm) => f.filter((x) => x !== 0).length;
  return d.sort((a, b) => used(a.form) - used(b.form) || compareForms(b.form, a.form));
}

function compareForms(a: LinearForm, b: LinearForm): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

/** The closed form expanded back into terms (one per numerator term). */
export function closedFormTerms(f: ClosedForm): Term[] {
  if (isZeroForm(f)) return [];
  const den: string[] = [];
  for (const { form, power } of f.denominator) for (let i = 0; i < power; i++) den.push(linearFormKey(form));
  den.sort();
  return [...f.numerator.values()].map((t) => ({ c: t.c.mul(f.coefficient), e: t.e.map((x, i) => x + f.monomial[i]), den }));
}

/** The closed form as numerator / denominator polynomials (numerator Laurent; denominator Π L_k^power_k). */
export function closedFormRatio(f: ClosedForm): { num: Poly; den: Poly } {
  const n = f.table.symbols.length;
  let den = constantPoly(1, n);
  for (const { form, power } of f.denominator) den = mulPoly(den, powPoly(linearFormPoly(form), power, n));
  if (isZeroForm(f)) return { num: new Map(), den };
  return { num: scalePoly(shiftPoly(f.numerator, f.monomial), f.coefficient), den };
}

/** Exact value at a point given per symbol (every symbol the form uses must be set). */
export function evaluateClosedForm(f: ClosedForm, values: readonly Fraction[]): Fraction {
  if (isZeroForm(f)) return new Fraction(0);
  let v = f.coefficient.mul(evaluatePoly(f.numerator, values));
  f.monomial.forEach((k, i) => {
    if (k !== 0) v = v.mul(values[i].pow(k));
  });
  for (const { form, power } of f.denominator) v = v.div(evaluatePoly(linearFormPoly(form), values).pow(power));
  return v;
}

/** Floating-point value at a point. */
export function evaluateClosedFormNumber(f: ClosedForm, values: readonly number[]): number {
  if (isZeroForm(f)) return 0;
  let v = f.coefficient.valueOf() * evaluatePolyNumber(f.numerator, values);
  f.monomial.forEach((k, i) => {
    if (k !== 0) v *= values[i] ** k;
  });
  for (const { form, power } of f.denominator) v /= form.reduce((s, a, i) => (a === 0 ? s : s + a * values[i]), 0) ** power;
  return v;
}

/** Structural equality of two canonical forms (equal rational functions ⇔ equal forms). */
export function closedFormsEqual(a: ClosedForm, b: ClosedForm): boolean {
  if (!a.coefficient.equals(b.coefficient)) return false;
  if (isZeroForm(a)) return true;
  if (exponentKey(a.monomial) !== exponentKey(b.monomial)) return false;
  if (a.denominator.length !== b.denominator.length) return false;
  for (let i = 0; i < a.denominator.length; i++) {
    if (a.denominator[i].power !== b.denominator[i].power) return false;
    if (linearFormKey(a.denominator[i].form) !== linearFormKey(b.denominator[i].form)) return false;
  }
  if (a.numerator.size !== b.numerator.size) return false;
  for (const [k, t] of a.numerator) if (!b.numerator.get(k)?.c.equals(t.c)) return false;
  return true;
}
