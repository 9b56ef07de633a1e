/**
 * Printing of closed forms as plain text (mathjs / CAS syntax with explicit `*`, so it can be pasted back into
 * `dispole check` or any computer-algebra system) and as LaTeX, the way a person writes them: sign and rational
 * factor first, the species' symbols in the order q, alpha, m, w, R (A before B), polynomial factors in
 * parentheses, one fraction. A {@link GroupedForm} prints as a common factor times a sum of simple fractions.
 */
import type Fraction from 'fraction.js';
import type { ClosedForm, LinearForm } from './closed-form.js';
import { isZeroForm } from './closed-form.js';
import { constantPoly, type Poly, type PolyTerm } from './polynomial.js';
import type { SymbolRole, SymbolTable } from './symbols.js';

export type Notation = 'text' | 'latex';

/** A common factor c · x^e times a sum of closed forms (used when shorter than one big fraction). */
export interface GroupedForm {
  table: SymbolTable;
  factor: { c: Fraction; e: readonly number[] };
  parts: readonly ClosedForm[];
}

const ROLE_RANK: Record<SymbolRole, number> = { q: 0, alpha: 1, m: 2, w: 3, R: 4, s: 5 };

/** Symbol indices in print order. */
function printOrder(table: SymbolTable): number[] {
  return table.symbols.map((_, i) => i).sort((i, j) => ROLE_RANK[table.symbols[i].role] - ROLE_RANK[table.symbols[j].role] || i - j);
}

function power(table: SymbolTable, i: number, k: number, notation: Notation): string {
  const name = notation === 'latex' ? table.symbols[i].latex : table.symbols[i].name;
  if (k === 1) return name;
  if (notation === 'text') return `${name}^${k}`;
  return `${name}^${String(k).length > 1 ? `{${k}}` : k}`;
}

/** Join factors: `a*b` in text, `a b` in LaTeX. */
const joinFactors = (fs: readonly string[], notation: Notation) => fs.join(notation === 'text' ? '*' : ' ');

/** The symbols of an exponent vector with positive (sign +1) or negative (−1) exponents, in print order. */
function monomialFactors(table: SymbolTable, e: readonly number[], sign: 1 | -1, notation: Notation): string[] {
  return printOrder(table)
    .filter((i) => e[i] * sign > 0)
    .map((i) => power(table, i, e[i] * sign, notation));
}

/** A polynomial with integer coefficients, terms ordered by degree then by print order. */
function polyText(table: SymbolTable, p: Poly, notation: Notation): string {
  const order = printOrder(table);
  const key = (t: PolyTerm) => order.map((i) => t.e[i]);
  const deg = (t: PolyTerm) => t.e.reduce((a, b) => a + b, 0);
  const terms = [...p.values()].sort((a, b) => {
    const d = deg(b) - deg(a);
    if (d) return d;
    const ka = key(a), kb = key(b);
    for (let i = 0; i < ka.length; i++) if (ka[i] !== kb[i]) return kb[i] - ka[i];
    return 0;
  });
  return terms
    .map((t, idx) => {
      const neg = t.c.s < 0n;
      const abs = t.c.abs();
      const fs = monomialFactors(table, t.e, 1, notation);
      const coef = abs.equals(1) && fs.length > 0 ? [] : [fractionText(abs, notation)];
      const body = joinFactors([...coef, ...fs], notation);
      return idx === 0 ? (neg ? `-${body}` : body) : `${neg ? ' - ' : ' + '}${body}`;
    })
    .join('');
}

function fractionText(c: Fraction, notation: Notation): string {
  if (c.d === 1n) return c.n.toString();
  return notation === 'latex' ? `\\frac{${c.n}}{${c.d}}` : `${c.n}/${c.d}`;
}

function linearFormText(table: SymbolTable, f: LinearForm, notation: Notation): string {
  const parts = printOrder(table)
    .filter((i) => f[i] !== 0)
    .map((i) => (f[i] === 1 ? power(table, i, 1, notation) : joinFactors([String(f[i]), power(table, i, 1, notation)], notation)));
  return parts.join(' + ');
}

const isMultiTerm = (p: Poly) => p.size > 1;

/** Numerator and denominator factor lists of a closed form (without its sign). */
function factorLists(f: ClosedForm, notation: Notation): { num: string[]; den: string[] } {
  const table = f.table;
  const c = f.coefficient.abs();
  const num: string[] = [];
  const den: string[] = [];
  if (c.n !== 1n) num.push(c.n.toString());
  if (c.d !== 1n) den.push(c.d.toString());
  num.push(...monomialFactors(table, f.monomial, 1, notation));
  const poly = f.numerator;
  const polyIsOne = poly.size === 1 && [...poly.values()][0].c.equals(1) && [...poly.values()][0].e.every((x) => x === 0);
  if (!polyIsOne) num.push(isMultiTerm(poly) ? `(${polyText(table, poly, notation)})` : polyText(table, poly, notation));
  den.push(...monomialFactors(table, f.monomial, -1, notation));
  for (const { form, power: k } of f.denominator) {
    const base = `(${linearFormText(table, form, notation)})`;
    den.push(k === 1 ? base : notation === 'text' ? `${base}^${k}` : `${base}^${String(k).length > 1 ? `{${k}}` : k}`);
  }
  return { num, den };
}

/** One closed form as text or LaTeX. */
export function printClosedForm(f: ClosedForm, notation: Notation): string {
  if (isZeroForm(f)) return '0';
  const sign = f.coefficient.s < 0n ? '-' : '';
  let { num, den } = factorLists(f, notation);
  // A lone parenthesised numerator needs no parentheses in LaTeX.
  if (notation === 'latex' && num.length === 1 && num[0].startsWith('(') && isMultiTerm(f.numerator)) num = [num[0].slice(1, -1)];
  const top = num.length ? joinFactors(num, notation) : '1';
  if (den.length === 0) return `${sign}${top}`;
  if (notation === 'latex') return `${sign}\\frac{${top}}{${joinFactors(den, notation)}}`;
  const bottom = den.length === 1 ? den[0] : `(${joinFactors(den, notation)})`;
  const numText = num.length === 1 && !num[0].startsWith('(') && isMultiTerm(f.numerator) ? `(${top})` : top;
  return `${sign}${numText}/${bottom}`;
}

/** A grouped form: factor · (part + part + …). */
export function printGroupedForm(g: GroupedForm, notation: Notation): string {
  const factor: ClosedForm = {
    table: g.table,
    coefficient: g.factor.c,
    monomial: g.factor.e,
    numerator: constantPoly(1, g.factor.e.length),
    denominator: [],
  };
  const head = printClosedForm(factor, notation);
  const parts = g.parts.map((p, i) => {
    const body = printClosedForm(p, notation);
    if (i === 0) return body;
    return body.startsWith('-') ? ` - ${body.slice(1)}` : ` + ${body}`;
  });
  const inner = parts.join('');
  const isOne = head === '1' || head === '-1';
  const sign = head === '-1' ? '-' : '';
  if (notation === 'latex') return isOne ? `${sign}\\left(${inner}\\right)` : `${head} \\left(${inner}\\right)`;
  return isOne ? `${sign}(${inner})` : `${head}*(${inner})`;
}
