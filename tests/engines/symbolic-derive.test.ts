/**
 * The symbolic engine's closed forms: against published closed forms (symbolically, in exact arithmetic), against
 * the numeric perturbation and response routes (at seeded random parameters), and its canonical form.
 */
import Fraction from 'fraction.js';
import { evaluate } from 'mathjs';
import { describe, expect, test } from 'vitest';
import { computePair } from '../../src/engines/pair.js';
import {
  closedFormFromTerms,
  closedFormsEqual,
  evaluateClosedFormNumber,
  reciprocalLinear,
  type ClosedForm,
  type Term,
} from '../../src/engines/symbolic/closed-form.js';
import { deriveQuantities, type SymbolicQuantity } from '../../src/engines/symbolic/derive.js';
import { symbolTable, zeroExponents, type PairLayout, type SymbolTable } from '../../src/engines/symbolic/symbols.js';
import { drude, drudeAnisotropic, type DrudeSpecies } from '../../src/model/drude.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { expectClose } from '../helpers/tolerance.js';

const TWO: PairLayout = { identical: false, anisotropic: false };
const SAME: PairLayout = { identical: true, anisotropic: false };
const TWO_ANISO: PairLayout = { identical: false, anisotropic: true };

/** c · Π name^power / Π (linear forms), as a term over a table. */
function term(table: SymbolTable, c: Fraction | number, powers: Record<string, number>, ...linear: Array<Record<string, number>>): Term {
  const e = zeroExponents(table);
  for (const [name, k] of Object.entries(powers)) e[table.indexOf(name)!] += k;
  let t: Term = { c: new Fraction(c), e, den: [] };
  for (const form of linear) {
    const a = zeroExponents(table);
    for (const [name, k] of Object.entries(form)) a[table.indexOf(name)!] = k;
    const r = reciprocalLinear(a);
    t = { c: t.c.mul(r.c), e: t.e.map((x, i) => x + r.e[i]), den: [...t.den, ...r.den].sort() };
  }
  return t;
}

const formOf = (table: SymbolTable, ...terms: Term[]): ClosedForm => closedFormFromTerms(table, terms);

function derived(layout: PairLayout, q: SymbolicQuantity, variables: 'mass' | 'alpha' = 'mass') {
  return deriveQuantities(layout, [q], variables)[0];
}

describe('closed forms against published results (exact, symbolic)', () => {
  test('like pair: C6 = (3/4) alpha² w (F. London, Z. Phys. Chem. B 11, 222 (1930))', () => {
    const t = symbolTable(SAME);
    const d = derived(SAME, 'C6', 'alpha');
    expect(closedFormsEqual(d.form, formOf(t, term(t, new Fraction(3, 4), { alpha: 2, w: 1 })))).toBe(true);
    expect(d.display.text).toBe('3*alpha^2*w/4');
    // and in q, m, w: alpha² w = q⁴/(m² w³)
    expect(closedFormsEqual(derived(SAME, 'C6').form, formOf(t, term(t, new Fraction(3, 4), { q: 4, m: -2, w: -3 })))).toBe(true);
  });

  test('two species: C6 = (3/2) alphaA alphaB wA wB/(wA + wB) (London 1930)', () => {
    const t = symbolTable(TWO);
    const expected = formOf(t, term(t, new Fraction(3, 2), { alphaa: 1, alphab: 1, wa: 1, wb: 1 }, { wa: 1, wb: 1 }));
    expect(closedFormsEqual(derived(TWO, 'C6', 'alpha').form, expected)).toBe(true);
  });

  test('like pair: C8 = (15/4) alpha²/m (A. P. Jones et al., Phys. Rev. B 87, 144103 (2013); quoted from memory)', () => {
    const t = symbolTable(SAME);
    // alpha²/m = q⁴/(m³ w⁴)
    expect(closedFormsEqual(derived(SAME, 'C8').form, formOf(t, term(t, new Fraction(15, 4), { q: 4, m: -3, w: -4 })))).toBe(true);
  });

  test('two species: C8 = (15/2)[α1A α2B wA wB/(wA + 2wB) + α2A α1B wA wB/(2wA + wB)] (derived here from the Casimir–Polder C8 integral, H. B. G. Casimir and D. Polder, Phys. Rev. 73, 360 (1948), with α2 = (3/4) q²/(m² w³))', () => {
    const t = symbolTable(TWO);
    const c = new Fraction(15, 2).mul(new Fraction(3, 4));
    const expected = formOf(
      t,
      term(t, c, { qa: 2, ma: -1, wa: -1, qb: 2, mb: -2, wb: -2 }, { wa: 1, wb: 2 }),
      term(t, c, { qa: 2, ma: -2, wa: -2, qb: 2, mb: -1, wb: -1 }, { wa: 2, wb: 1 }),
    );
    expect(closedFormsEqual(derived(TWO, 'C8').form, expected)).toBe(true);
  });

  test('D7.a = −9 qa³ qb²/(ma² wa³ mb wb (wa + wb)) and D7.b = −D7.a(A ↔ B) (derived here; confirmed by both numeric routes below)', () => {
    const t = symbolTable(TWO);
    const a = formOf(t, term(t, -9, { qa: 3, qb: 2, ma: -2, wa: -3, mb: -1, wb: -1 }, { wa: 1, wb: 1 }));
    const b = formOf(t, term(t, 9, { qb: 3, qa: 2, mb: -2, wb: -3, ma: -1, wa: -1 }, { wa: 1, wb: 1 }));
    expect(closedFormsEqual(derived(TWO, 'D7.a').form, a)).toBe(true);
    expect(closedFormsEqual(derived(TWO, 'D7.b').form, b)).toBe(true);
    expect(derived(TWO, 'D7.a').display.latex).toBe('-\\frac{9 q_a^3 q_b^2}{m_a^2 m_b \\omega_a^3 \\omega_b (\\omega_a + \\omega_b)}');
    expect(derived(TWO, 'D7.a').display.text).toBe('-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))');
  });

  test('identical species: D7.total = 0 exactly and D7.a < 0 (physics notes: the negative ends point at the partner)', () => {
    expect(derived(SAME, 'D7.total').display.text).toBe('0');
    expect(derived(SAME, 'D7.a').form.coefficient.s).toBe(-1n);
  });

  test('mu.a(R) = D7.a/R^7', () => {
    const t = symbolTable(TWO);
    const mu = derived(TWO, 'mu.a').form;
    const d7 = derived(TWO, 'D7.a').form;
    expect(mu.monomial[t.R]).toBe(-7);
    expect(closedFormsEqual({ ...mu, monomial: mu.monomial.map((x, i) => (i === t.R ? 0 : x)) }, d7)).toBe(true);
  });
});

/** A value vector over the table for a pair of species. */
function valuesFor(table: SymbolTable, A: DrudeSpecies, B: DrudeSpecies, R = 1): number[] {
  const v = new Array<number>(table.symbols.length).fill(1);
  for (const [c, s] of [['a', A], ['b', B]] as const) {
    v[table.q[c]] = s.q;
    v[table.m[c]] = s.m;
    for (let axis = 0; axis < 3; axis++) v[table.w[c][axis]] = s.w[axis];
    if (table.alpha[c] >= 0) v[table.alpha[c]] = s.q ** 2 / (s.m * s.w[0] ** 2);
  }
  v[table.R] = R;
  return v;
}

const randomIso = (rand: () => number, name: string) =>
  drude({ q: uniform(rand, 0.5, 2.5), m: uniform(rand, 0.2, 3), w: uniform(rand, 0.2, 1.5) }, name);

describe('closed forms evaluated at numbers equal the numeric routes to 1e-12 (seeded random QDO pairs)', () => {
  const TOL = 1e-12;
  const quantities: SymbolicQuantity[] = ['C6', 'C8', 'C10', 'D7.a', 'D7.b', 'D7.total'];

  test('two isotropic species: C6, C8, C10, D7 against the perturbation and response routes', () => {
    const rand = seededRandom(4711);
    const forms = deriveQuantities(TWO, quantities);
    const table = symbolTable(TWO);
    for (let i = 0; i < 6; i++) {
      const A = randomIso(rand, 'A');
      const B = randomIso(rand, 'B');
      const pair = computePair(A, B);
      expect(pair.routes.map((r) => r.name)).toEqual(expect.arrayContaining(['perturbation', 'response']));
      const v = valuesFor(table, A, B);
      const value = (q: SymbolicQuantity) => evaluateClosedFormNumber(forms.find((f) => f.name === q)!.form, v);
      for (const r of pair.routes) {
        expectClose(value('C6'), r.C6, TOL, 0, `${r.name} C6`);
        expectClose(value('C8'), r.C8!, TOL, 0, `${r.name} C8`);
        expectClose(value('C10'), r.C10!, TOL, 0, `${r.name} C10`);
        expectClose(value('D7.a'), r.D7.a, TOL, 0, `${r.name} D7.a`);
        expectClose(value('D7.b'), r.D7.b, TOL, 0, `${r.name} D7.b`);
        expectClose(value('D7.total'), r.D7.total, 0, TOL * Math.max(Math.abs(r.D7.a), Math.abs(r.D7.b)), `${r.name} D7.total`);
      }
    }
  });

  test('the printed text, read back by mathjs, gives the same numbers (alpha form included)', () => {
    const rand = seededRandom(99);
    const A = randomIso(rand, 'A');
    const B = randomIso(rand, 'B');
    const pair = computePair(A, B);
    const scope = {
      qa: A.q, ma: A.m, wa: A.w[0], qb: B.q, mb: B.m, wb: B.w[0],
      alphaa: A.q ** 2 / (A.m * A.w[0] ** 2), alphab: B.q ** 2 / (B.m * B.w[0] ** 2),
    };
    const ref = pair.coefficients;
    const expected: Record<string, number> = { C6: ref.C6, C8: ref.C8!, C10: ref.C10!, 'D7.a': ref.D7.a, 'D7.b': ref.D7.b, 'D7.total': ref.D7.total };
    for (const variables of ['mass', 'alpha'] as const) {
      for (const d of deriveQuantities(TWO, quantities, variables)) {
        expectClose(evaluate(d.display.text, scope) as number, expected[d.name], TOL, 0, `${variables} ${d.name}: ${d.display.text}`);
      }
    }
  });

  test('identical species: the derived forms equal both routes', () => {
    const rand = seededRandom(31337);
    const forms = deriveQuantities(SAME, quantities);
    const table = symbolTable(SAME);
    for (let i = 0; i < 4; i++) {
      const A = randomIso(rand, 'A');
      const pair = computePair(A, { ...A, name: 'B' });
      const v = valuesFor(table, A, A);
      for (const r of pair.routes) {
        const value = (q: SymbolicQuantity) => evaluateClosedFormNumber(forms.find((f) => f.name === q)!.form, v);
        expectClose(value('C6'), r.C6, TOL, 0, `${r.name} C6`);
        expectClose(value('C8'), r.C8!, TOL, 0, `${r.name} C8`);
        expectClose(value('C10'), r.C10!, TOL, 0, `${r.name} C10`);
        expectClose(value('D7.a'), r.D7.a, TOL, 0, `${r.name} D7.a`);
      }
    }
  });

  test('anisotropic species (stretch): C6 and D7 against both routes', () => {
    const rand = seededRandom(2718);
    const forms = deriveQuantities(TWO_ANISO, ['C6', 'D7.a', 'D7.b']);
    const table = symbolTable(TWO_ANISO);
    const w = () => uniform(rand, 0.3, 1.4);
    for (let i = 0; i < 3; i++) {
      const A = drudeAnisotropic({ q: uniform(rand, 0.5, 2), m: uniform(rand, 0.3, 2), wx: w(), wy: w(), wz: w() }, 'A');
      const B = drudeAnisotropic({ q: uniform(rand, 0.5, 2), m: uniform(rand, 0.3, 2), wx: w(), wy: w(), wz: w() }, 'B');
      const pair = computePair(A, B);
      const v = valuesFor(table, A, B);
      expect(pair.routes.length).toBeGreaterThanOrEqual(2);
      for (const r of pair.routes) {
        expectClose(evaluateClosedFormNumber(forms[0].form, v), r.C6, TOL, 0, `${r.name} C6`);
        expectClose(evaluateClosedFormNumber(forms[1].form, v), r.D7.a, TOL, 0, `${r.name} D7.a`);
        expectClose(evaluateClosedFormNumber(forms[2].form, v), r.D7.b, TOL, 0, `${r.name} D7.b`);
      }
    }
  });
});

describe('canonical form (exact rational-function algebra; common practice)', () => {
  const t = symbolTable(TWO);

  test('sums are reduced to lowest terms: (1/wa + 1/wb)/(wa + wb) = 1/(wa wb)', () => {
    const f = formOf(t, term(t, 1, { wa: -1 }, { wa: 1, wb: 1 }), term(t, 1, { wb: -1 }, { wa: 1, wb: 1 }));
    expect(closedFormsEqual(f, formOf(t, term(t, 1, { wa: -1, wb: -1 })))).toBe(true);
    expect(f.denominator).toEqual([]);
  });

  test('common factors are pulled out: 2 wa/(2wa + 2wb) − 1 = −wb/(wa + wb)', () => {
    const f = formOf(t, term(t, 2, { wa: 1 }, { wa: 2, wb: 2 }), term(t, -1, {}));
    expect(closedFormsEqual(f, formOf(t, term(t, -1, { wb: 1 }, { wa: 1, wb: 1 })))).toBe(true);
    expect(f.coefficient.toFraction()).toBe('-1');
  });

  test('cancelling terms give the zero form', () => {
    const f = formOf(t, term(t, 3, { qa: 2 }, { wa: 1, wb: 2 }), term(t, -3, { qa: 2 }, { wa: 1, wb: 2 }));
    expect(f.coefficient.equals(0)).toBe(true);
  });
});
