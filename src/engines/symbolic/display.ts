/**
 * The printed shape of a derived quantity: the canonical single fraction, or — when it is shorter — a common
 * factor times a sum of simple fractions: one per distinct set of excitation energies in the perturbation sum
 * (C8 of two species, anisotropic C6), or one per term of the canonical numerator (q⁴/(8m²)·(1/wx³ + …)).
 */
import Fraction from 'fraction.js';
import { closedFormFromTerms, closedFormTerms, type ClosedForm, type Term } from './closed-form.js';
import { printClosedForm, printGroupedForm, type GroupedForm } from './printer.js';
import type { SymbolTable } from './symbols.js';

export interface Display {
  text: string;
  latex: string;
  /** Which shape was printed. */
  shape: 'fraction' | 'sum';
}

/**
 * Group terms (by their energy denominators, or each term on its own), reduce each group, and pull out the factor
 * common to all groups.
 */
export function groupedForm(table: SymbolTable, terms: readonly Term[], by: 'denominator' | 'term' = 'denominator'): GroupedForm {
  const groups = new Map<string, Term[]>();
  terms.forEach((t, i) => {
    const k = by === 'term' ? String(i) : t.den.join(';');
    const g = groups.get(k);
    if (g) g.push(t);
    else groups.set(k, [t]);
  });
  const parts = [...groups.values()].map((g) => closedFormFromTerms(table, g)).filter((f) => !f.coefficient.equals(0));
  const n = table.symbols.length;
  if (parts.length === 0) return { table, factor: { c: new Fraction(0), e: new Array<number>(n).fill(0) }, parts: [] };
  let c = parts[0].coefficient.abs();
  for (const p of parts) c = c.gcd(p.coefficient);
  if (2 * parts.filter((p) => p.coefficient.s < 0n).length > parts.length) c = c.neg();
  const e = new Array<number>(n).fill(0).map((_, i) => {
    const xs = parts.map((p) => p.monomial[i]);
    if (xs.every((x) => x > 0)) return Math.min(...xs);
    if (xs.every((x) => x < 0)) return Math.max(...xs);
    return 0;
  });
  const scaled: ClosedForm[] = parts.map((p) => ({ ...p, coefficient: p.coefficient.div(c), monomial: p.monomial.map((x, i) => x - e[i]) }));
  const complexity = (p: ClosedForm) => p.denominator.reduce((s, d) => s + d.power, 0);
  const sorted = scaled
    .map((p) => ({ p, text: printClosedForm(p, 'text').replace(/^-/, '') }))
    .sort((x, y) => complexity(x.p) - complexity(y.p) || (x.text < y.text ? -1 : x.text > y.text ? 1 : 0))
    .map((x) => x.p);
  return { table, factor: { c, e }, parts: sorted };
}

/** Text and LaTeX of a quantity, in whichever shape prints shortest. */
export function displayOf(canonical: ClosedForm, terms: readonly Term[]): Display {
  let best: Display = { text: printClosedForm(canonical, 'text'), latex: printClosedForm(canonical, 'latex'), shape: 'fraction' };
  for (const grouped of [groupedForm(canonical.table, terms), groupedForm(canonical.table, closedFormTerms(canonical), 'term')]) {
    if (grouped.parts.length < 2) continue;
    const text = printGroupedForm(grouped, 'text');
    if (text.length < best.text.length) best = { text, latex: printGroupedForm(grouped, 'latex'), shape: 'sum' };
  }
  return best;
}
