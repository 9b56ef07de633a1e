/**
 * Checking a user's formula against the engine: correct formulas in several spellings are identical (exactly),
 * deliberately wrong ones are caught with the right hint, and bad input is refused with a message that says why.
 * Reference formulas: C6 of London (F. London, Z. Phys. Chem. B 11, 222 (1930)); like-pair C8 = (15/4) alpha²/m
 * (A. P. Jones et al., Phys. Rev. B 87, 144103 (2013), quoted from memory); D7.a of two QDOs (derived here and
 * confirmed against both numeric routes in symbolic-derive.test.ts).
 */
import { describe, expect, test } from 'vitest';
import { checkFormula, type CheckRequest } from '../../src/engines/symbolic/formula-check.js';
import { InputError } from '../../src/model/errors.js';
import type { SymbolicQuantity } from '../../src/engines/symbolic/derive.js';

const TWO = { identical: false, anisotropic: false };
const SAME = { identical: true, anisotropic: false };
const D7A = '-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))';

const check = (expression: string, quantity: SymbolicQuantity, layout = TWO, extra: Partial<CheckRequest> = {}) =>
  checkFormula({ expression, quantity, layout, points: 12, ...extra });

describe('correct formulas are identical, symbolically and numerically', () => {
  test.each([
    ['D7.a, as printed by derive', D7A, 'D7.a', TWO],
    ['D7.a with implicit products and wb(wa + wb)', '-9 qa^3 qb^2 / (ma^2 mb wa^3 wb(wa + wb))', 'D7.a', TWO],
    ['D7.a in alpha form', '-9*alphaa^2*alphab*wa*wb/(qa*(wa + wb))', 'D7.a', TWO],
    ['D7.a with a square root of a perfect square', '-9*sqrt(alphaa^4*alphab^2)*wa*wb/(qa*(wa+wb))', 'D7.a', TWO],
    ['D7.b = −D7.a(A↔B)', '9*qb^3*qa^2/(mb^2*ma*wb^3*wa*(wa + wb))', 'D7.b', TWO],
    ['London C6 for unlike species', '3/2*alphaa*alphab*wa*wb/(wa+wb)', 'C6', TWO],
    ['London C6 for like species', '(3/4) alpha^2 w', 'C6', SAME],
    ['like-pair C8 of Jones et al.', '15/4*alpha^2/m', 'C8', SAME],
    ['decimal coefficients are exact', '0.75*alpha^2*w', 'C6', SAME],
    ['D7.total of identical species', '0', 'D7.total', SAME],
    ['mu.a with R', `${D7A}/R^7`, 'mu.a', TWO],
  ] as const)('%s', (_, expression, quantity, layout) => {
    const r = check(expression, quantity, layout);
    expect(r.verdict).toBe('identical');
    expect(r.symbolic.status).toBe('identical');
    expect(r.numeric.exact).toBe(true);
    expect(r.numeric.maxDeviation).toBe(0);
    expect(r.hint).toBeNull();
  });

  test('a formula that is not rational gets a numeric verdict only', () => {
    const r = check(`${D7A}*exp(0)`, 'D7.a');
    expect(r.symbolic.status).toBe('undecided');
    expect(r.symbolic.note).toBe('no exact comparison: it uses exp');
    expect(r.numeric.exact).toBe(false);
    expect(r.numeric.maxDeviation).toBeLessThan(1e-14);
    expect(r.verdict).toBe('identical');
  });
});

describe('deliberately wrong formulas are caught with the right hint', () => {
  test.each([
    ['wrong sign', D7A.slice(1), 'D7.a', "yours = -1 × the engine's D7.a: wrong sign"],
    ['factor 2', `2*${D7A}`, 'D7.a', "yours = 2 × the engine's D7.a: a factor 2 too large"],
    ['factor 1/2', `${D7A}/2`, 'D7.a', "yours = 1/2 × the engine's D7.a: a factor 2 too small"],
    ['sign and factor', `-2*${D7A}`, 'D7.a', "yours = -2 × the engine's D7.a: wrong sign and a factor 2 too large"],
    ['frequencies exchanged', '-9*qa^3*qb^2/(ma^2*mb*wb^3*wa*(wa + wb))', 'D7.a', "yours is the engine's D7.a with the frequencies of A and B exchanged"],
    ['A and B exchanged', '-9*qb^3*qa^2/(mb^2*ma*wb^3*wa*(wa + wb))', 'D7.a', "yours is the engine's D7.a with A and B exchanged (every a ↔ b)"],
    ['masses exchanged', '-9*qa^3*qb^2/(mb^2*ma*wa^3*wb*(wa + wb))', 'D7.a', "yours is the engine's D7.a with the masses exchanged (ma ↔ mb)"],
    ['wrong power of wa', '-9*qa^3*qb^2/(ma^2*mb*wa^2*wb*(wa + wb))', 'D7.a', 'yours / engine = wa: check the power of wa'],
    ['wrong powers in alpha form', '-9*alphaa*alphab*wa*wb/(qa*(wa + wb))', 'D7.a', 'yours / engine = alphaa^(-1): check the power of alphaa'],
    ['London C6 without the 1/2', '3*alphaa*alphab*wa*wb/(wa+wb)', 'C6', "yours = 2 × the engine's C6: a factor 2 too large"],
    ['a stray 1/π', '3/2*alphaa*alphab*wa*wb/(wa+wb)/pi', 'C6', "yours = 1/π × the engine's C6: a factor π too small"],
    ['another quantity', '9*qa^2*qb^3/(ma*mb^2*wa*wb^3*(wa + wb))', 'D7.a', "yours is the engine's D7.b, not its D7.a"],
  ] as const)('%s', (_, expression, quantity, hint) => {
    const r = check(expression, quantity);
    expect(r.verdict).toBe('differs');
    expect(r.hint).toBe(hint);
    if (!expression.includes('pi')) expect(r.symbolic.status).toBe('differs');
    expect(r.numeric.maxDeviation).toBeGreaterThan(1e-3);
  });

  test('a wrong denominator is neither a factor nor a power law: the hint names the parameters involved', () => {
    const r = check('-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + 2*wb))', 'D7.a');
    expect(r.verdict).toBe('differs');
    expect(r.hint).toMatch(/^yours \/ engine is neither a constant nor a power law; it changes with wa, wb \(ratios at the first points: /);
  });

  test('identical species: a non-zero D7.total is caught', () => {
    expect(check('q', 'D7.total', SAME).hint).toBe("the engine's D7.total is exactly 0 here; yours is not");
  });

  test('the points are reproducible from the seed and change with it', () => {
    const a = check(D7A.slice(1), 'D7.a', TWO, { seed: 7 });
    const b = check(D7A.slice(1), 'D7.a', TWO, { seed: 7 });
    const c = check(D7A.slice(1), 'D7.a', TWO, { seed: 8 });
    expect(a.samples).toEqual(b.samples);
    expect(a.samples).not.toEqual(c.samples);
  });
});

describe('bad input is refused with a message naming the problem', () => {
  const refuse = (expression: string, quantity: SymbolicQuantity = 'D7.a', layout = TWO) => {
    try {
      check(expression, quantity, layout);
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      return (e as InputError).message;
    }
    throw new Error(`accepted ${expression}`);
  };

  test('a parse error gives the character position and a caret', () => {
    expect(refuse('-9*qa^3/(ma')).toBe('expression: cannot be read at character 12: Parenthesis ) expected\n  -9*qa^3/(ma\n             ^');
  });
  test('unknown names are listed together with the allowed ones', () => {
    expect(refuse('qa*foo/bar')).toBe('expression: unknown variable names bar, foo; allowed: qa, ma, wa, qb, mb, wb, alphaa, alphab');
    expect(refuse('q*m')).toMatch(/unknown variable names m, q; .*\(q, m, w, alpha without a or b are the names for one species on both centres\)$/);
    expect(refuse('qa*w', 'C6', SAME)).toBe('expression: unknown variable name qa; allowed: q, m, w, alpha (names ending in a or b are for two different species)');
    expect(refuse('qa/R^7', 'C6')).toMatch(/unknown variable name R; .*\(R appears only in mu\.a, mu\.b and mu\.total\)$/);
  });
  test('assignments, unknown functions, other operators and empty input', () => {
    expect(refuse('D = qa')).toBe('expression: is an assignment; give only the right-hand side (the formula itself)');
    expect(refuse('gamma(qa)')).toBe('expression: unknown function gamma; allowed: sqrt, cbrt, exp, log, abs');
    expect(refuse('toString()')).toBe('expression: unknown function toString; allowed: sqrt, cbrt, exp, log, abs');
    expect(refuse('foo(qa, qb)')).toBe('expression: unknown function foo; allowed: sqrt, cbrt, exp, log, abs');
    expect(refuse('qa()')).toBe('expression: qa() has empty parentheses: write qa');
    expect(refuse('qa(qb, ma)')).toBe('expression: qa(…) with 2 arguments: write qa*(…) for a product');
    expect(refuse('sqrt(qa, qb)')).toBe('expression: sqrt takes one argument, got 2');
    expect(refuse('qa > 1')).toBe('expression: uses the operator ">"; allowed: + - * / ^ and parentheses');
    expect(refuse('  ')).toBe('expression: is empty; give a formula in qa, ma, wa, qb, mb, wb, alphaa, alphab');
    expect(refuse('qa/(wa - wa)')).toBe('expression: divides by something that is identically zero');
  });
  test('anisotropic species have no C8 closed form', () => {
    expect(() => checkFormula({ expression: 'qa', quantity: 'C8', layout: { identical: false, anisotropic: true } })).toThrow(
      'quantity: C8 is not derived for this layout; available: C6, D7.a, D7.b, D7.total, mu.a, mu.b, mu.total',
    );
  });
});
