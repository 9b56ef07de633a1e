/**
 * Closed forms of the dispersion coefficients and dispersion dipoles of two quantum Drude oscillators, from
 * the symbolic perturbation chains (symbolic-rspt.ts), in the species' q, m, w or — isotropic only — in
 * q, alpha, w with m = q²/(alpha w²). Units: C_n in Eh·a0^n, D7 in e·a0^8, mu in e·a0 (all atomic units).
 */
import { InputError } from '../../model/errors.js';
import { closedFormFromTerms, type ClosedForm, type Term } from './closed-form.js';
import { displayOf, type Display } from './display.js';
import { symbolicCoefficients, type SymbolicCoefficients } from './symbolic-rspt.js';
import { symbolTable, type PairLayout, type SymbolTable } from './symbols.js';

/** Every quantity the symbolic engine derives. */
export const SYMBOLIC_QUANTITIES = ['C6', 'C8', 'C10', 'D7.a', 'D7.b', 'D7.total', 'D9.a', 'D9.b', 'D9.total', 'mu.a', 'mu.b', 'mu.total'] as const;
export type SymbolicQuantity = (typeof SYMBOLIC_QUANTITIES)[number];

/** What `derive` prints when no quantity is named. */
export const DEFAULT_QUANTITIES: readonly SymbolicQuantity[] = ['C6', 'C8', 'D7.a', 'D7.b', 'D7.total'];

/** Quantities whose anisotropic closed forms are not derived (too many distinct excitation energies). */
const ISOTROPIC_ONLY: readonly SymbolicQuantity[] = ['C8', 'C10', 'D9.a', 'D9.b', 'D9.total'];

export const QUANTITY_MEANING: Record<SymbolicQuantity, { meaning: string; units: string }> = {
  C6: { meaning: 'dispersion coefficient, E(R) ∋ −C6/R^6', units: 'Eh a0^6' },
  C8: { meaning: 'dispersion coefficient, E(R) ∋ −C8/R^8', units: 'Eh a0^8' },
  C10: { meaning: 'dispersion coefficient, E(R) ∋ −C10/R^10', units: 'Eh a0^10' },
  'D7.a': { meaning: 'dispersion dipole of A, lim R^7 mu_A,z (A at the origin, B at +R on z)', units: 'e a0^8' },
  'D7.b': { meaning: 'dispersion dipole of B, lim R^7 mu_B,z', units: 'e a0^8' },
  'D7.total': { meaning: 'dispersion dipole of the pair, D7.a + D7.b', units: 'e a0^8' },
  'D9.a': { meaning: 'next dispersion dipole of A, the R^-9 coefficient of mu_A,z (V3·V4 chain; V2·V5 vanishes for isotropic QDOs)', units: 'e a0^10' },
  'D9.b': { meaning: 'next dispersion dipole of B, the R^-9 coefficient of mu_B,z', units: 'e a0^10' },
  'D9.total': { meaning: 'next dispersion dipole of the pair, D9.a + D9.b', units: 'e a0^10' },
  'mu.a': { meaning: 'leading dispersion dipole of A at distance R, D7.a/R^7', units: 'e a0' },
  'mu.b': { meaning: 'leading dispersion dipole of B at distance R, D7.b/R^7', units: 'e a0' },
  'mu.total': { meaning: 'leading dispersion dipole of the pair at distance R, D7.total/R^7', units: 'e a0' },
};

/** The variables a closed form is written in: q, m, w ("mass") or q, alpha, w ("alpha"). */
export type VariableSet = 'mass' | 'alpha';

export interface DerivedQuantity {
  name: SymbolicQuantity;
  variables: VariableSet;
  /** The canonical form (over the layout's symbol table). */
  form: ClosedForm;
  display: Display;
}

/** The names a user may ask for, validated. */
export function parseQuantityName(field: string, name: string, layout: PairLayout): SymbolicQuantity {
  const q = SYMBOLIC_QUANTITIES.find((x) => x.toLowerCase() === name.trim().toLowerCase());
  if (!q) throw new InputError(field, `unknown quantity ${JSON.stringify(name)}; known: ${SYMBOLIC_QUANTITIES.join(', ')}`);
  if (layout.anisotropic && ISOTROPIC_ONLY.includes(q)) {
    throw new InputError(field, `${q} is derived for isotropic species only; anisotropic species give C6, D7.a, D7.b, D7.total and mu.*`);
  }
  return q;
}

/** Does this quantity use the distance R? */
export const usesDistance = (q: SymbolicQuantity): boolean => q.startsWith('mu.');

type BaseQuantity = 'C6' | 'C8' | 'C10' | 'D7.a' | 'D7.b' | 'D7.total' | 'D9.a' | 'D9.b' | 'D9.total';

/** mu.x is D7.x/R^7: the same closed form with R^-7. */
const baseOf = (q: SymbolicQuantity): BaseQuantity => (q.startsWith('mu.') ? (`D7.${q.slice(3)}` as BaseQuantity) : (q as BaseQuantity));

/** Raw term sums (q, m, w) of base quantities, from one run of the perturbation chains. */
function baseTerms(table: SymbolTable, names: readonly BaseQuantity[]): Map<BaseQuantity, Term[]> {
  const powers = new Set<6 | 8 | 10>();
  let dipoles = false;
  let dipoles9 = false;
  for (const q of names) {
    if (q === 'C6' || q === 'C8' || q === 'C10') powers.add(Number(q.slice(1)) as 6 | 8 | 10);
    else if (q.startsWith('D9.')) dipoles9 = true;
    else dipoles = true;
  }
  const raw: SymbolicCoefficients = symbolicCoefficients(table, { energyPowers: [...powers].sort((x, y) => x - y), dipoles, dipoles9 });
  const pick = (q: BaseQuantity): Term[] => {
    switch (q) {
      case 'C6':
      case 'C8':
      case 'C10':
        return raw[q]!;
      case 'D7.a':
        return raw.D7a!;
      case 'D7.b':
        return raw.D7b!;
      case 'D7.total':
        return [...raw.D7a!, ...raw.D7b!];
      case 'D9.a':
        return raw.D9a!;
      case 'D9.b':
        return raw.D9b!;
      case 'D9.total':
        return [...raw.D9a!, ...raw.D9b!];
    }
  };
  return new Map(names.map((q) => [q, pick(q)]));
}

/** Canonical forms and terms of `names`, each base quantity reduced once (mu.x shares D7.x's reduction). */
function formsOf(
  table: SymbolTable,
  names: readonly SymbolicQuantity[],
  rewrite: (t: Term) => Term,
): Map<SymbolicQuantity, { form: ClosedForm; terms: Term[] }> {
  const bases = [...new Set(names.map(baseOf))];
  const raw = baseTerms(table, bases);
  const reduced = new Map(
    bases.map((b) => {
      const terms = raw.get(b)!.map(rewrite);
      return [b, { form: closedFormFromTerms(table, terms), terms }] as const;
    }),
  );
  const shiftR = (e: readonly number[]) => e.map((x, i) => (i === table.R ? x - 7 : x));
  return new Map(
    names.map((q) => {
      const base = reduced.get(baseOf(q))!;
      if (!usesDistance(q)) return [q, base] as const;
      const form = base.form.coefficient.equals(0) ? base.form : { ...base.form, monomial: shiftR(base.form.monomial) };
      return [q, { form, terms: base.terms.map((t) => ({ ...t, e: shiftR(t.e) })) }] as const;
    }),
  );
}

/** Rewrite a term from q, m, w into q, alpha, w: m = q²/(alpha w²). */
function toAlpha(table: SymbolTable, t: Term): Term {
  const e = [...t.e];
  for (const c of table.layout.identical ? (['a'] as const) : (['a', 'b'] as const)) {
    const k = e[table.m[c]];
    if (k === 0) continue;
    e[table.m[c]] = 0;
    e[table.q[c]] += 2 * k;
    e[table.alpha[c]] -= k;
    e[table.w[c][0]] -= 2 * k;
  }
  return { c: t.c, e, den: t.den };
}

/** Derive the closed forms of `names` for a pair layout. */
export function deriveQuantities(layout: PairLayout, names: readonly SymbolicQuantity[], variables: VariableSet = 'mass'): DerivedQuantity[] {
  if (variables === 'alpha' && layout.anisotropic) {
    throw new InputError('variables', 'the alpha form needs isotropic species (one polarisability per species); use the mass form for anisotropic ones');
  }
  const table = symbolTable(layout);
  const forms = formsOf(table, names, variables === 'alpha' ? (t) => toAlpha(table, t) : (t) => t);
  return names.map((name) => {
    const { form, terms } = forms.get(name)!;
    return { name, variables, form, display: displayOf(form, terms) };
  });
}

/** The quantities a layout supports. */
export const supportedQuantities = (layout: PairLayout): SymbolicQuantity[] =>
  SYMBOLIC_QUANTITIES.filter((q) => !(layout.anisotropic && ISOTROPIC_ONLY.includes(q)));

/** The default quantities a layout supports. */
export const defaultQuantities = (layout: PairLayout): SymbolicQuantity[] => DEFAULT_QUANTITIES.filter((q) => supportedQuantities(layout).includes(q));
