/**
 * A user's formula: parsed by mathjs, checked against the names a layout allows, and turned into exact algebra
 * (a {@link RationalFunction} in q, m, w) when it is rational — alpha names become q²/(m w²), sqrt and fractional
 * powers of perfect-power monomials are taken exactly — or evaluated in floating point otherwise.
 */
import { createRequire } from 'node:module';
import Fraction from 'fraction.js';
import type { ConstantNode, FunctionNode, MathNode, OperatorNode, ParenthesisNode, SymbolNode } from 'mathjs';
import { InputError } from '../../model/errors.js';
import type { PolyTerm } from './polynomial.js';
import { rfAdd, rfConstant, rfDiv, rfMonomial, rfMul, rfPow, rfRoot, type RationalFunction } from './rational-function.js';
import { zeroExponents, type SymbolTable } from './symbols.js';

/** Floating-point functions a formula may call (they make it non-rational, except sqrt/cbrt of perfect powers). */
const FUNCTIONS: Record<string, (x: number) => number> = {
  sqrt: Math.sqrt,
  cbrt: Math.cbrt,
  exp: Math.exp,
  log: Math.log,
  abs: Math.abs,
};
const CONSTANTS: Record<string, number> = { pi: Math.PI, e: Math.E };
/** Larger powers are evaluated in floating point only. */
const MAX_EXACT_POWER = 64;

export interface Formula {
  /** The text as given. */
  source: string;
  tree: MathNode;
  /** Parameter names it uses. */
  names: Set<string>;
  /** Exact form, or why there is none. */
  exact: { rational: RationalFunction } | { reason: string };
}

const FIELD = 'expression';

let parser: ((text: string) => MathNode) | undefined;
/**
 * mathjs's parser, loaded on first use: mathjs takes about a second to load, which `import 'dispole'` and the
 * other commands should not pay. Synchronous, through the package's CommonJS entry point.
 */
function parseMath(text: string): MathNode {
  parser ??= (createRequire(import.meta.url)('mathjs') as typeof import('mathjs')).parse;
  return parser(text);
}

/** A parse error with the character position and a caret under it. */
function parseFailure(source: string, e: Error & { char?: number }): InputError {
  const at = typeof e.char === 'number' ? e.char : undefined;
  const message = e.message.replace(/\s*\(char \d+\)\s*$/, '');
  const caret = at !== undefined ? `\n  ${source}\n  ${' '.repeat(Math.max(0, at - 1))}^` : '';
  return new InputError(FIELD, `cannot be read${at !== undefined ? ` at character ${at}` : ''}: ${message}${caret}`);
}

/**
 * Parse a formula and check its names. `allowed` lists the parameter names of the layout (and R when the
 * quantity depends on the distance); anything else is reported, all at once.
 */
export function parseFormula(source: string, table: SymbolTable, allowed: readonly string[]): Formula {
  if (source.trim() === '') throw new InputError(FIELD, `is empty; give a formula in ${allowed.join(', ')}`);
  let tree: MathNode;
  try {
    tree = parseMath(source);
  } catch (e) {
    throw parseFailure(source, e as Error);
  }
  const names = new Set<string>();
  const unknown = new Set<string>();
  const unknownFunctions = new Set<string>();
  tree.traverse((node, path, parent) => {
    switch (node.type) {
      case 'ConstantNode': {
        const v = (node as ConstantNode).value as unknown;
        if (typeof v !== 'number') throw new InputError(FIELD, `contains ${JSON.stringify(String(v))}, which is not a number`);
        return;
      }
      case 'SymbolNode': {
        const name = (node as SymbolNode).name;
        if (path === 'fn' && parent?.type === 'FunctionNode') {
          if (!(name in FUNCTIONS) && !allowed.includes(name)) unknownFunctions.add(name);
          if (allowed.includes(name)) names.add(name);
          return;
        }
        if (allowed.includes(name)) names.add(name);
        else if (!(name in CONSTANTS)) unknown.add(name);
        return;
      }
      case 'OperatorNode': {
        const op = node as OperatorNode<never, never>;
        if (!['add', 'subtract', 'multiply', 'divide', 'pow', 'unaryMinus', 'unaryPlus'].includes(op.fn)) {
          throw new InputError(FIELD, `uses the operator ${JSON.stringify((op as unknown as { op: string }).op)}; allowed: + - * / ^ and parentheses`);
        }
        return;
      }
      case 'FunctionNode': {
        const f = node as FunctionNode;
        if (f.args.length !== 1) {
          const name = f.fn.name;
          throw new InputError(FIELD, name in FUNCTIONS ? `${name} takes one argument, got ${f.args.length}` : `${name}(…) with ${f.args.length} arguments: write ${name}*(…)`);
        }
        return;
      }
      case 'ParenthesisNode':
        return;
      case 'AssignmentNode':
        throw new InputError(FIELD, 'is an assignment; give only the right-hand side (the formula itself)');
      default:
        throw new InputError(FIELD, `contains an unsupported construct (${node.type.replace(/Node$/, '')}); only a formula in ${allowed.join(', ')} is allowed`);
    }
  });
  if (unknown.size > 0) {
    const hasUnsuffixed = [...unknown].some((n) => /^(q|m|w|alpha)$/.test(n));
    const hasSuffixed = [...unknown].some((n) => /^(q|m|w|alpha)[ab][xyz]?$/.test(n));
    const more =
      hasUnsuffixed && !table.layout.identical
        ? ' (q, m, w, alpha without a or b are the names for one species on both centres)'
        : hasSuffixed && table.layout.identical
          ? ' (names ending in a or b are for two different species)'
          : unknown.has('R')
            ? ' (R appears only in mu.a, mu.b and mu.total)'
            : '';
    throw new InputError(
      FIELD,
      `unknown variable name${unknown.size > 1 ? 's' : ''} ${[...unknown].sort().join(', ')}; allowed: ${allowed.join(', ')}${more}`,
    );
  }
  if (unknownFunctions.size > 0) {
    throw new InputError(FIELD, `unknown function${unknownFunctions.size > 1 ? 's' : ''} ${[...unknownFunctions].sort().join(', ')}; allowed: ${Object.keys(FUNCTIONS).join(', ')}`);
  }
  let exact: Formula['exact'];
  try {
    exact = { rational: fold(tree, exactArithmetic(table)) };
  } catch (e) {
    if (!(e instanceof NotRational)) throw e;
    exact = { reason: e.message };
  }
  return { source, tree, names, exact };
}

class NotRational extends Error {}

/** An exact rational number from a double as written (shortest round-trip decimal, exponent notation too). */
function exactNumber(x: number): Fraction {
  const [mant, exp] = String(x).toLowerCase().split('e');
  const f = new Fraction(mant);
  const k = exp === undefined ? 0 : Number(exp);
  return k >= 0 ? f.mul(new Fraction(10n ** BigInt(k))) : f.div(new Fraction(10n ** BigInt(-k)));
}

/** What a formula's operations mean in one arithmetic (exact rational functions, or doubles). */
interface Arithmetic<T> {
  constant(x: number): T;
  symbol(name: string): T;
  call(name: keyof typeof FUNCTIONS, x: T): T;
  neg(a: T): T;
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  pow(a: T, b: T): T;
}

/** Evaluate a checked formula tree in an arithmetic. `wa(wa + wb)` parses as a call of wa: it is the product. */
function fold<T>(node: MathNode, ar: Arithmetic<T>): T {
  const rec = (x: MathNode) => fold(x, ar);
  switch (node.type) {
    case 'ConstantNode':
      return ar.constant((node as ConstantNode).value as number);
    case 'ParenthesisNode':
      return rec((node as ParenthesisNode).content);
    case 'SymbolNode':
      return ar.symbol((node as SymbolNode).name);
    case 'FunctionNode': {
      const f = node as FunctionNode;
      const name = f.fn.name;
      return name in FUNCTIONS ? ar.call(name, rec(f.args[0])) : ar.mul(ar.symbol(name), rec(f.args[0]));
    }
    case 'OperatorNode': {
      const op = node as OperatorNode<never, never>;
      const [a, b] = op.args;
      switch (op.fn as string) {
        case 'unaryPlus':
          return rec(a);
        case 'unaryMinus':
          return ar.neg(rec(a));
        case 'add':
          return ar.add(rec(a), rec(b));
        case 'subtract':
          return ar.sub(rec(a), rec(b));
        case 'multiply':
          return ar.mul(rec(a), rec(b));
        case 'divide':
          return ar.div(rec(a), rec(b));
        case 'pow':
          return ar.pow(rec(a), rec(b));
      }
    }
  }
  throw new Error(`internal: formula node ${node.type} passed the checks`);
}

/** The constant value of a rational function, or undefined when it depends on a symbol. */
function constantValue(r: RationalFunction): Fraction | undefined {
  const isConstant = (t: PolyTerm) => t.e.every((x) => x === 0);
  if (![...r.num.values(), ...r.den.values()].every(isConstant)) return undefined;
  const num = [...r.num.values()][0]?.c ?? new Fraction(0);
  return num.div([...r.den.values()][0].c);
}

/** Exact arithmetic over q, m, w: alpha = q²/(m w²); roots of perfect-power monomials; anything else is NotRational. */
function exactArithmetic(table: SymbolTable): Arithmetic<RationalFunction> {
  const n = table.symbols.length;
  return {
    constant: (x) => rfConstant(exactNumber(x), n),
    symbol(name) {
      if (name in CONSTANTS) throw new NotRational(`it uses the constant ${name}`);
      return symbolRational(table, name);
    },
    call(name, x) {
      const k = name === 'sqrt' ? 2 : name === 'cbrt' ? 3 : 0;
      if (k === 0) throw new NotRational(`it uses ${name}`);
      const root = rfRoot(x, k);
      if (!root) throw new NotRational(`${name} of something that is not a perfect power of a monomial`);
      return root;
    },
    neg: (a) => rfMul(rfConstant(new Fraction(-1), n), a, n),
    add: (a, b) => rfAdd(a, b, n),
    sub: (a, b) => rfAdd(a, b, n, -1),
    mul: (a, b) => rfMul(a, b, n),
    div(a, b) {
      const q = rfDiv(a, b, n);
      if (!q) throw new InputError(FIELD, 'divides by something that is identically zero');
      return q;
    },
    pow(a, b) {
      const k = constantValue(b);
      if (!k) throw new NotRational('an exponent is not a constant');
      if (k.abs().compare(MAX_EXACT_POWER) > 0) throw new NotRational(`the power ${k.toFraction()} is too large for exact algebra`);
      const root = k.d === 1n ? a : rfRoot(a, Number(k.d));
      if (!root) throw new NotRational(`a power ${k.toFraction()} of something that is not a perfect power of a monomial`);
      const p = rfPow(root, Number(k.s * k.n), n);
      if (!p) throw new InputError(FIELD, 'raises something identically zero to a negative power');
      return p;
    },
  };
}

/** A parameter name as a rational function (alpha = q²/(m w²)). */
function symbolRational(table: SymbolTable, name: string): RationalFunction {
  const i = table.indexOf(name)!;
  const e = zeroExponents(table);
  if (table.symbols[i].role !== 'alpha') {
    e[i] = 1;
    return rfMonomial(e);
  }
  const c = table.alpha.a === i ? 'a' : 'b';
  e[table.q[c]] = 2;
  e[table.m[c]] = -1;
  e[table.w[c][0]] = -2;
  return rfMonomial(e);
}

/** Floating-point value at a point (values by name). */
export function evaluateFormula(node: MathNode, values: ReadonlyMap<string, number>): number {
  return fold<number>(node, {
    constant: (x) => x,
    symbol: (name) => values.get(name) ?? CONSTANTS[name],
    call: (name, x) => FUNCTIONS[name](x),
    neg: (a) => -a,
    add: (a, b) => a + b,
    sub: (a, b) => a - b,
    mul: (a, b) => a * b,
    div: (a, b) => a / b,
    pow: (a, b) => a ** b,
  });
}
