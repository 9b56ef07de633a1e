/**
 * A syntax pre-check of a formula that needs no expression library: it finds the syntax errors of formulas written
 * with numbers, names, + - * / ^, parentheses and function calls, and reports each exactly as the mathjs parser
 * would (the same message and character position), so that `check` with a mistyped formula answers without loading
 * mathjs (a large share of that command's start-up).
 *
 * It is a recogniser only: it builds no tree, and it answers `undefined` both for a formula it finds well formed and
 * for anything outside the small language it knows (other characters, named operators such as `mod` or `in`, named
 * constants, unusual number forms), which then go to mathjs as before. Where it does report an error, it follows the
 * precedence levels of mathjs 15's recursive-descent parser (lib/esm/expression/parse.js: additive, multiplicative,
 * implicit multiplication with its rules on constants and operators, the `2/3 x` rule, unary signs, `^`, calls and
 * parentheses) — derived here from that grammar; tests/engines/formula-syntax.test.ts compares both on seeded random
 * formulas.
 */

/** A syntax error as mathjs reports it: the message ends in "(char N)", N the 1-based column of the token. */
export interface FormulaSyntaxError {
  message: string;
  char: number;
}

type TokenType = 'number' | 'symbol' | 'delimiter' | 'end';
interface Token {
  type: TokenType;
  text: string;
  /** 1-based column where mathjs reports an error at this token. */
  col: number;
}

/** What the grammar rules need to know of a parsed operand (mathjs decides implicit products by node type). */
type Kind = 'constant' | 'signedConstant' | 'operator' | 'other';

/** Words mathjs reads as operators or constants: a formula containing one is left to mathjs. */
const RESERVED = new Set(['mod', 'to', 'in', 'and', 'or', 'xor', 'not', 'true', 'false', 'null', 'undefined', 'NaN', 'Infinity']);
const DELIMITERS = new Set(['+', '-', '*', '/', '^', '(', ')', ',']);

class Unknown extends Error {}

/** Tokens of the source, or undefined where a character or word is outside the known language. */
function tokenize(source: string): Token[] | undefined {
  const tokens: Token[] = [];
  let i = 0;
  const n = source.length;
  for (;;) {
    while (i < n && (source[i] === ' ' || source[i] === '\t')) i++;
    if (i >= n) break;
    const start = i;
    const c = source[i];
    if (c >= '0' && c <= '9') {
      const m = /^\d+(\.\d+)?([eE][+-]?\d+)?/.exec(source.slice(i, i + 400));
      if (!m) return undefined;
      i += m[0].length;
      // "2x" (a number glued to a name), "2." or "1e" and other number forms: mathjs's own tokenizer decides
      if (i < n && /[\w.$\u00c0-\uffff]/.test(source[i])) return undefined;
      tokens.push({ type: 'number', text: m[0], col: start + 1 });
    } else if (/[A-Za-z_]/.test(c)) {
      while (i < n && /\w/.test(source[i])) i++;
      const word = source.slice(start, i);
      if (RESERVED.has(word) || (i < n && /[$\u00c0-\uffff]/.test(source[i]))) return undefined;
      tokens.push({ type: 'symbol', text: word, col: start + 1 });
    } else if (DELIMITERS.has(c)) {
      // "**", ".^" and the like are not in the language; two one-character delimiters in a row are
      i++;
      tokens.push({ type: 'delimiter', text: c, col: start + 1 });
    } else {
      return undefined;
    }
  }
  tokens.push({ type: 'end', text: '', col: n + 1 });
  return tokens;
}

const failure = (message: string, t: Token): FormulaSyntaxError => ({ message: `${message} (char ${t.col})`, char: t.col });
class Failure extends Error {
  constructor(readonly error: FormulaSyntaxError) {
    super(error.message);
  }
}

/** A recursive-descent recogniser over the token list with mathjs's rule order. */
class Recogniser {
  private at = 0;
  constructor(private readonly tokens: Token[]) {}

  private get token(): Token {
    return this.tokens[this.at];
  }
  private next(): void {
    if (this.at < this.tokens.length - 1) this.at++;
  }
  private is(text: string): boolean {
    return this.token.type === 'delimiter' && this.token.text === text;
  }
  private fail(message: string): never {
    throw new Failure(failure(message, this.token));
  }

  /** The whole formula: an expression, then nothing. */
  start(): void {
    this.additive();
    if (this.token.type === 'end') return;
    if (this.token.type === 'delimiter') this.fail(`Unexpected operator ${this.token.text}`);
    this.fail(`Unexpected part "${this.token.text}"`);
  }

  private additive(): Kind {
    let kind = this.multiplicative();
    while (this.is('+') || this.is('-')) {
      this.next();
      this.multiplicative();
      kind = 'operator';
    }
    return kind;
  }

  private multiplicative(): Kind {
    let kind = this.implicit();
    while (this.is('*') || this.is('/')) {
      this.next();
      this.implicit();
      kind = 'operator';
    }
    return kind;
  }

  /** Implicit products: a name, "(" or (after anything but a constant or an operator) a number continues one. */
  private implicit(): Kind {
    let kind = this.rule2();
    let last = kind;
    for (;;) {
      const t = this.token;
      const continues = t.type === 'symbol' || (t.type === 'number' && last !== 'constant' && last !== 'operator' && last !== 'signedConstant') || this.is('(');
      if (!continues) return kind;
      last = this.rule2();
      kind = 'operator';
    }
  }

  /** "2/3 x" reads as (2/3)·x: after a (signed) constant, "/ number" followed by a name or "(" joins the division. */
  private rule2(): Kind {
    let kind = this.unary();
    let last = kind;
    while (this.is('/') && (last === 'constant' || last === 'signedConstant')) {
      const a = this.tokens[this.at + 1], b = this.tokens[this.at + 2];
      if (!(a?.type === 'number' && b && (b.type === 'symbol' || (b.type === 'delimiter' && b.text === '(')))) break;
      this.next();
      last = this.unary();
      kind = 'operator';
    }
    return kind;
  }

  private unary(): Kind {
    if (this.is('-') || this.is('+')) {
      this.next();
      const inner = this.unary();
      return inner === 'constant' ? 'signedConstant' : 'operator';
    }
    return this.power();
  }

  private power(): Kind {
    const kind = this.primary();
    if (!this.is('^')) return kind;
    this.next();
    this.unary();
    return 'operator';
  }

  private primary(): Kind {
    const t = this.token;
    if (t.type === 'symbol') {
      this.next();
      if (this.is('(')) {
        this.next();
        if (!this.is(')')) {
          this.additive();
          while (this.is(',')) {
            this.next();
            this.additive();
          }
        }
        if (!this.is(')')) this.fail('Parenthesis ) expected');
        this.next();
        // a call followed by "(" is a call of the call's result in mathjs: leave that to it
        if (this.is('(')) throw new Unknown();
      }
      return 'other';
    }
    if (t.type === 'number') {
      this.next();
      return 'constant';
    }
    if (this.is('(')) {
      this.next();
      this.additive();
      if (!this.is(')')) this.fail('Parenthesis ) expected');
      this.next();
      return 'other';
    }
    if (t.type === 'end') this.fail('Unexpected end of expression');
    this.fail('Value expected');
  }
}

/**
 * The syntax error mathjs would report for this formula, when the formula lies in the small language checked here;
 * undefined when it is well formed or outside that language (then only mathjs can tell).
 */
export function formulaSyntaxError(source: string): FormulaSyntaxError | undefined {
  const tokens = tokenize(source);
  if (!tokens || tokens.length === 1) return undefined; // blank: the caller's own message

  try {
    new Recogniser(tokens).start();
    return undefined;
  } catch (e) {
    if (e instanceof Failure) return e.error;
    if (e instanceof Unknown || e instanceof RangeError) return undefined;
    throw e;
  }
}
