/**
 * A user's formula: parsed by mathjs, checked against the names a layout allows, and turned into exact algebra
 * (a {@link RationalFunction} in q, m, w) when it is rational — alpha names become q²/(m w²), sqrt and fractional
 * powers of perfect-power monomials are taken exactly — or evaluated in floating point otherwise.
 */
import { mathjsModule } from '../../lazy-modules.js';
import Fraction from 'fraction.js';
import type { ConstantNode, FunctionNode, MathNode, OperatorNode, ParenthesisNode, SymbolNode } from 'mathjs';
import { InputError } from '../../model/errors.js';
import { formulaSyntaxError } from './formula-syntax.js';
import type { PolyTerm } from './polynomial.js';
import { AlgebraTooCostly, rfAdd, rfConstant, rfDiv, rfMonomial, rfMul, rfPow, rfRoot, type RationalFunction } from './rational-function.js';
import { zeroExponents, type SymbolTable } from './symbols.js';

/**
 * Floating-point functions a formula may call (they make it non-rational, except sqrt/cbrt of perfect powers).
 * Maps, not object literals: a name such as `constructor` or `__proto__` must not find something inherited.
 */
const FUNCTIONS: ReadonlyMap<string, (x: number) => number> = new Map([
  ['sqrt', Math.sqrt],
  ['cbrt', Math.cbrt],
  ['exp', Math.exp],
  ['log', Math.log],
  ['abs', Math.abs],
]);
const CONSTANTS: ReadonlyMap<string, number> = new Map([
  ['pi', Math.PI],
  ['e', Math.E],
]);
/** Larger powers are evaluated in floating point only. */
const MAX_EXACT_POWER = 64;

/**
 * Stated limits on a formula (checked before any work): its length in characters and how deeply its
 * parentheses nest. The tree itself is walked without recursion, so a long sum or product costs no stack.
 */
export const FORMULA_LIMITS = { maxLength: 20_000, maxNesting: 200 } as const;

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
  // a syntax error in the common small language is reported (in mathjs's words) before mathjs is loaded
  const early = formulaSyntaxError(text);
  if (early) throw Object.assign(new SyntaxError(early.message), { char: early.char });
  parser ??= mathjsModule().parse;
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
  checkSize(source);
  let tree: MathNode;
  try {
    tree = parseMath(source);
  } catch (e) {
    if (e instanceof RangeError) throw new InputError(FIELD, `is nested too deeply to be read; simplify it (limits: ${limitsText()})`);
    throw parseFailure(source, e as Error);
  }
  const names = new Set<string>();
  const unknown = new Set<string>();
  const unknownFunctions = new Set<string>();
  forEachNode(tree, (node, path, parent) => {
    switch (node.type) {
      case 'ConstantNode': {
        const v = (node as ConstantNode).value as unknown;
        if (typeof v !== 'number') throw new InputError(FIELD, `contains ${JSON.stringify(String(v))}, which is not a number`);
        if (!Number.isFinite(v)) throw new InputError(FIELD, `contains a number beyond the double-precision range (largest about 1.8e308)`);
        return;
      }
      case 'SymbolNode': {
        const name = (node as SymbolNode).name;
        if (path === 'fn' && parent?.type === 'FunctionNode') {
          if (!FUNCTIONS.has(name) && !allowed.includes(name)) unknownFunctions.add(name);
          if (allowed.includes(name)) names.add(name);
          return;
        }
        if (allowed.includes(name)) names.add(name);
        else if (!CONSTANTS.has(name)) unknown.add(name);
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
        if (f.fn.type !== 'SymbolNode') throw new InputError(FIELD, `calls something that is not a name; allowed functions: ${[...FUNCTIONS.keys()].join(', ')}`);
        if (f.args.length !== 1) {
          const name = f.fn.name;
          if (FUNCTIONS.has(name)) throw new InputError(FIELD, `${name} takes one argument, got ${f.args.length}`);
          // a parameter written as a call: a product was meant, or (empty parentheses) the name alone
          if (allowed.includes(name)) throw new InputError(FIELD, f.args.length === 0 ? `${name}() has empty parentheses: write ${name}` : `${name}(…) with ${f.args.length} arguments: write ${name}*(…) for a product`);
          // any other name: reported with the unknown functions below (its symbol is visited next)
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
    throw new InputError(FIELD, `unknown function${unknownFunctions.size > 1 ? 's' : ''} ${[...unknownFunctions].sort().join(', ')}; allowed: ${[...FUNCTIONS.keys()].join(', ')}`);
  }
  let exact: Formula['exact'];
  try {
    exact = { rational: fold(tree, exactArithmetic(table)) };
  } catch (e) {
    if (e instanceof NotRational) exact = { reason: e.message };
    else if (e instanceof AlgebraTooCostly) exact = { reason: `exact algebra would be too costly (${e.message})` };
    else throw e;
  }
  return { source, tree, names, exact };
}

/** The limits as one phrase, for messages. */
const limitsText = () => `at most ${FORMULA_LIMITS.maxLength} characters, parentheses nested at most ${FORMULA_LIMITS.maxNesting} deep`;

/** Refuse a formula beyond the stated length or parenthesis nesting before parsing it. */
function checkSize(source: string): void {
  if (source.length > FORMULA_LIMITS.maxLength) {
    throw new InputError(FIELD, `is ${source.length} characters long; the limit is ${FORMULA_LIMITS.maxLength} (${limitsText()})`);
  }
  let depth = 0;
  for (const ch of source) {
    if (ch === '(' || ch === '[' || ch === '{') depth++;
    else if (ch === ')' || ch === ']' || ch === '}') depth--;
    if (depth > FORMULA_LIMITS.maxNesting) {
      throw new InputError(FIELD, `nests parentheses more than ${FORMULA_LIMITS.maxNesting} deep (${limitsText()})`);
    }
  }
}

/** The operands of a node in evaluation order (a call's name is not an operand). */
function operands(node: MathNode): readonly MathNode[] {
  switch (node.type) {
    case 'ParenthesisNode':
      return [(node as ParenthesisNode).content];
    case 'FunctionNode':
      return (node as FunctionNode).args;
    case 'OperatorNode':
      return (node as OperatorNode).args;
    default:
      return [];
  }
}

/** Visit every node (pre-order) with an explicit stack: no recursion, so any depth is safe. */
function forEachNode(root: MathNode, visit: (node: MathNode, path: string | null, parent: MathNode | null) => void): void {
  const stack: Array<[MathNode, string | null, MathNode | null]> = [[root, null, null]];
  while (stack.length > 0) {
    const [node, path, parent] = stack.pop()!;
    visit(node, path, parent);
    const children: Array<[MathNode, string | null, MathNode | null]> = [];
    node.forEach((child, childPath) => children.push([child, childPath, node]));
    for (let i = children.length - 1; i >= 0; i--) stack.push(children[i]);
  }
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
  call(name: string, x: T): T;
  neg(a: T): T;
  add(a: T, b: T): T;
  sub(a: T, b: T): T;
  mul(a: T, b: T): T;
  div(a: T, b: T): T;
  pow(a: T, b: T): T;
}

/**
 * Evaluate a checked formula tree in an arithmetic, post-order with an explicit stack (no recursion, so a sum of
 * thousands of terms is fine). `wa(wa + wb)` parses as a call of wa: it is the product.
 */
function fold<T>(root: MathNode, ar: Arithmetic<T>): T {
  const stack: Array<{ node: MathNode; expanded: boolean }> = [{ node: root, expanded: false }];
  const values: T[] = [];
  while (stack.length > 0) {
    const top = stack.pop()!;
    const kids = operands(top.node);
    if (!top.expanded && kids.length > 0) {
      stack.push({ node: top.node, expanded: true });
      for (let i = kids.length - 1; i >= 0; i--) stack.push({ node: kids[i], expanded: false });
      continue;
    }
    const args = values.splice(values.length - kids.length, kids.length);
    values.push(combine(top.node, args, ar));
  }
  return values[0];
}

/** One node's value from its operands' values. */
function combine<T>(node: MathNode, args: T[], ar: Arithmetic<T>): T {
  switch (node.type) {
    case 'ConstantNode':
      return ar.constant((node as ConstantNode).value as number);
    case 'ParenthesisNode':
      return args[0];
    case 'SymbolNode':
      return ar.symbol((node as SymbolNode).name);
    case 'FunctionNode': {
      const name = (node as FunctionNode).fn.name;
      return FUNCTIONS.has(name) ? ar.call(name, args[0]) : ar.mul(ar.symbol(name), args[0]);
    }
    case 'OperatorNode': {
      const [a, b] = args;
      switch ((node as OperatorNode).fn as string) {
        case 'unaryPlus':
          return a;
        case 'unaryMinus':
          return ar.neg(a);
        case 'add':
          return ar.add(a, b);
        case 'subtract':
          return ar.sub(a, b);
        case 'multiply':
          return ar.mul(a, b);
        case 'divide':
          return ar.div(a, b);
        case 'pow':
          return ar.pow(a, b);
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
      if (CONSTANTS.has(name)) throw new NotRational(`it uses the constant ${name}`);
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
    symbol: (name) => values.get(name) ?? CONSTANTS.get(name) ?? NaN,
    call: (name, x) => FUNCTIONS.get(name)!(x),
    neg: (a) => -a,
    add: (a, b) => a + b,
    sub: (a, b) => a - b,
    mul: (a, b) => a * b,
    div: (a, b) => a / b,
    pow: (a, b) => a ** b,
  });
}
