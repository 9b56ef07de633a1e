/**
 * Property tests (fast-check, fixed seeds) of every reader of user text: the formula reader of `check`, XYZ
 * geometries, species files, inline species specs and response-data files. For any input each either returns
 * its result or throws an InputError naming a field — never another exception, never a hang, and never a
 * non-finite number in what it returns. The hostile formulas of the fuzzing pass are included verbatim.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { checkFormula } from '../../src/engines/symbolic/formula-check.js';
import { FORMULA_LIMITS } from '../../src/engines/symbolic/formula.js';
import { InputError } from '../../src/model/errors.js';
import { parseXyz } from '../../src/model/geometry.js';
import { parseResponseData, RESPONSE_DATA_MAX_ROWS } from '../../src/model/response-data.js';
import { parseSpeciesFile } from '../../src/model/species-file.js';
import { parseInlineSpecies } from '../../src/model/species-kinds.js';
import { maxAbs } from '../../src/engines/atoms/rational-interpolation.js';
import { inputErrorOf } from '../helpers/input-error.js';

const TWO = { identical: false, anisotropic: false };
/** Modest runs with fixed seeds: the suite stays well under a minute and repeats exactly. */
const RUNS = { numRuns: 150, seed: 20261202 };

/** The outcome of f: 'ok' with its value, or the InputError (anything else is thrown on, failing the property). */
function outcome<T>(f: () => T): { ok: true; value: T } | { ok: false; error: InputError } {
  try {
    return { ok: true, value: f() };
  } catch (e) {
    if (e instanceof InputError) return { ok: false, error: e };
    throw e;
  }
}

/** Every number in a plain value is finite. */
function allFinite(v: unknown): boolean {
  if (typeof v === 'number') return Number.isFinite(v);
  if (Array.isArray(v)) return v.every(allFinite);
  if (v && typeof v === 'object') return Object.values(v).every(allFinite);
  return true;
}

/** Names a formula might use: the documented ones, prototype members of JavaScript objects, and plain unknowns. */
const NAMES = ['qa', 'qb', 'ma', 'mb', 'wa', 'wb', 'alphaa', 'alphab', 'pi', 'e', 'R', 'q', 'constructor', 'toString', 'valueOf', '__proto__', 'hasOwnProperty', 'isPrototypeOf', 'propertyIsEnumerable', '__defineGetter__', 'x'];
const FUNCTIONS = ['sqrt', 'cbrt', 'exp', 'log', 'abs', 'constructor', '__proto__', 'hasOwnProperty', 'toString', 'valueOf', 'isPrototypeOf', '__lookupGetter__'];
const DOCUMENTED = new Set(['qa', 'qb', 'ma', 'mb', 'wa', 'wb', 'alphaa', 'alphab', 'pi', 'e', 'sqrt', 'cbrt', 'exp', 'log', 'abs']);

/** Random formulas from a small grammar over those names, numbers (huge and tiny too) and the operators. */
const formula: fc.Arbitrary<string> = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.constantFrom(...NAMES),
    fc.constantFrom('0', '1', '2.5', '1e308', '1e309', '1e-400', '64', '65', '0.5'),
    fc.tuple(tie('expr'), fc.constantFrom('+', '-', '*', '/', '^', ' '), tie('expr')).map(([a, op, b]) => `${a}${op}${b}`),
    tie('expr').map((a) => `(${a})`),
    tie('expr').map((a) => `-${a}`),
    fc.tuple(fc.constantFrom(...FUNCTIONS), tie('expr')).map(([f, a]) => `${f}(${a})`),
  ),
})).expr;

describe('the formula reader of check', () => {
  test('any formula from the grammar: a verdict or an InputError on "expression"; names outside the documented ones are never accepted', () => {
    fc.assert(
      fc.property(formula, (text) => {
        const r = outcome(() => checkFormula({ expression: text, quantity: 'C6', layout: TWO, points: 4 }));
        if (!r.ok) {
          expect(r.error.field).toBe('expression');
          return;
        }
        const used = text.match(/(?<![\w.])[A-Za-z_]\w*/g) ?? []; // names, not the exponents of numbers
        for (const name of used) expect(DOCUMENTED.has(name), `accepted the name ${name} in ${text}`).toBe(true);
        expect(['identical', 'differs']).toContain(r.value.verdict);
      }),
      RUNS,
    );
  });

  test('any printable text: a verdict or an InputError, never a crash', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 60 }), (text) => {
        const r = outcome(() => checkFormula({ expression: text, quantity: 'D7.a', layout: TWO, points: 3 }));
        if (!r.ok) expect(r.error.field).toBe('expression');
      }),
      RUNS,
    );
  });

  // The fuzzing pass's cases, verbatim (exit 0 "identical", a crash, or a wrong message before the fix).
  const LONDON = '3*qa^2*qb^2/(2*ma*mb*wa*wb*(wa + wb))';
  test.each([
    [`hasOwnProperty(qa)*1000 + ${LONDON}`, /unknown function hasOwnProperty; allowed: sqrt, cbrt, exp, log, abs/],
    [`isPrototypeOf(qa)*1000 + ${LONDON}`, /unknown function isPrototypeOf/],
    [`propertyIsEnumerable(qa)*1000 + ${LONDON}`, /unknown function propertyIsEnumerable/],
    ['__proto__(qa)', /unknown function __proto__/],
    ['__defineGetter__(qa)', /unknown function __defineGetter__/],
    ['constructor', /unknown variable name constructor; allowed: qa, ma, wa/],
    ['toString(qa)', /unknown function toString/],
    ['valueOf', /unknown variable name valueOf/],
    ['1e309', /a number beyond the double-precision range/],
    ['qa*'.repeat(25_000) + 'qa', new RegExp(`is 75002 characters long; the limit is ${FORMULA_LIMITS.maxLength}`)],
    ['('.repeat(300) + 'qa' + ')'.repeat(300), new RegExp(`nests parentheses more than ${FORMULA_LIMITS.maxNesting} deep`)],
    ['-'.repeat(15_000) + 'qa', /nested too deeply to be read|characters long/],
  ])('%#: refused with a message naming the problem', (text, message) => {
    const e = inputErrorOf(() => checkFormula({ expression: text, quantity: 'C6', layout: TWO, points: 4 }));
    expect(e.field).toBe('expression');
    expect(e.problem).toMatch(message);
  });

  test('a 12 KB sum (qa+ × 4000) is read without recursion and compared exactly', () => {
    const r = checkFormula({ expression: 'qa+'.repeat(4000) + 'qa', quantity: 'C6', layout: TWO, points: 4 });
    expect(r.verdict).toBe('differs');
    expect(r.symbolic.status).toBe('differs');
  });

  test('parentheses 150 deep (within the limit) are read', () => {
    const r = checkFormula({ expression: '('.repeat(150) + LONDON + ')'.repeat(150), quantity: 'C6', layout: TWO, points: 4 });
    expect(r.verdict).toBe('identical');
  });

  test('(qa+qb+ma+mb+wa+wb)^64 gets the numeric verdict with a note on why (no exact expansion of millions of terms)', () => {
    const r = checkFormula({ expression: '(qa+qb+ma+mb+wa+wb)^64', quantity: 'C6', layout: TWO, points: 4 });
    expect(r.symbolic.status).toBe('undecided');
    expect(r.symbolic.note).toMatch(/exact algebra would be too costly \(an intermediate result has \d+ terms, limit 5000\)/);
    expect(r.verdict).toBe('differs');
  });
});

describe('readers of files and specs', () => {
  const numberText = fc.oneof(fc.constantFrom('0', '1', '-1', '1e308', '1e309', 'NaN', 'Infinity', '', 'x', '1d2', '.5', '-0'), fc.double().map(String));

  test('XYZ: any text gives a geometry of finite positions or an InputError naming file:line', () => {
    const line = fc.tuple(fc.constantFrom('X', 'Quelon', '1', ''), numberText, numberText, numberText, fc.option(numberText)).map((f) => f.filter((x) => x !== null).join(' '));
    const text = fc.tuple(fc.constantFrom('1', '2', '3', '0', '-1', 'x', ''), fc.string({ maxLength: 10 }), fc.array(line, { maxLength: 4 })).map(([n, c, ls]) => [n, c, ...ls].join('\n'));
    fc.assert(
      fc.property(fc.oneof(text, fc.string({ maxLength: 80 })), (t) => {
        const r = outcome(() => parseXyz(t, { fileName: 'g.xyz' }));
        if (r.ok) expect(allFinite(r.value.centres.map((c) => c.position))).toBe(true);
        else expect(r.error.field).toMatch(/^g\.xyz:\d+$/);
      }),
      RUNS,
    );
  });

  test('inline specs: any kind:key=value text gives a species with finite fields or an InputError', () => {
    const key = fc.constantFrom('q', 'm', 'w', 'wx', 'wy', 'wz', 'alpha', 'C6', 'C8', 'Z', 'basis', '__proto__', 'constructor', 'toString', 'x');
    const spec = fc
      .tuple(fc.constantFrom('drude', 'fit', 'hydrogenic', 'spectrum', 'table', '__proto__', 'constructor', 'toString', 'x'), fc.array(fc.tuple(key, numberText), { maxLength: 5 }))
      .map(([kind, kv]) => `${kind}:${kv.map(([k, v]) => `${k}=${v}`).join(',')}`);
    fc.assert(
      fc.property(fc.oneof(spec, fc.string({ maxLength: 40 })), (t) => {
        const r = outcome(() => parseInlineSpecies(t));
        if (r.ok) expect(allFinite(r.value)).toBe(true);
        else expect(r.error.field.length).toBeGreaterThan(0);
      }),
      RUNS,
    );
  });

  test('species files: any YAML gives species with finite fields or an InputError naming the file', () => {
    const entry = fc.record({ kind: fc.constantFrom('drude', 'fit', 'hydrogenic', '__proto__', 'constructor'), q: numberText, m: numberText, w: numberText });
    const yaml = fc.dictionary(fc.constantFrom('A', 'B', '__proto__', 'constructor', 'toString'), entry, { maxKeys: 3 }).map((d) => JSON.stringify({ species: d }));
    fc.assert(
      fc.property(fc.oneof(yaml, fc.string({ maxLength: 60 })), (t) => {
        const r = outcome(() => parseSpeciesFile(t, 'f.yaml'));
        if (r.ok) expect(allFinite([...r.value.values()])).toBe(true);
        else expect(r.error.field).toMatch(/^f\.yaml/);
      }),
      RUNS,
    );
  });

  test('response data: any table text gives finite data or an InputError naming file:line[:column]', () => {
    const header = fc.constantFrom('u [Eh], alpha [a0^3], B [au]', 'energy [Eh], strength', 'u [Eh], alpha [a0^3]', 'u, alpha', '__proto__ [Eh], alpha [a0^3]');
    const row = fc.array(numberText, { minLength: 1, maxLength: 3 }).map((c) => c.join(', '));
    const text = fc.tuple(fc.constantFrom('', 'B = -1', 'electrons = 2', '__proto__ = 1', 'constructor = 2'), header, fc.array(row, { maxLength: 8 })).map(([s, h, rows]) => [s, h, ...rows].join('\n'));
    fc.assert(
      fc.property(fc.oneof(text, fc.string({ maxLength: 80 })), (t) => {
        const r = outcome(() => parseResponseData(t, 'r.csv'));
        if (r.ok) expect(allFinite(r.value)).toBe(true);
        else expect(r.error.field).toMatch(/^r\.csv(:\d+(:\d+)?)?$/);
      }),
      RUNS,
    );
  });

  test(`a response table above ${RESPONSE_DATA_MAX_ROWS} rows is refused with the limit; 130 000 rows do not crash`, () => {
    const rows = Array.from({ length: 130_000 }, (_, k) => `${k / 100}, ${1 / (1 + (k / 100) ** 2)}`);
    const e = inputErrorOf(() => parseResponseData(['B = -1', 'u [Eh], alpha [a0^3]', ...rows].join('\n'), 'big.csv'));
    expect(e.field).toBe(`big.csv:${RESPONSE_DATA_MAX_ROWS + 3}`);
    expect(e.problem).toMatch(`has more than ${RESPONSE_DATA_MAX_ROWS} data rows`);
  });
});

test('max |y| of a million values (no spread of a large array into Math.max, which overflows the call stack)', () => {
  const y = Float64Array.from({ length: 1_000_000 }, (_, k) => (k % 2 ? -1 : 1) * (k % 997));
  expect(maxAbs(y)).toBe(996);
  expect(maxAbs([])).toBe(0);
  expect(maxAbs([1, NaN, 2])).toBeNaN(); // NaN is not hidden
});
