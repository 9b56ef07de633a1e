/**
 * Sparse multivariate Laurent polynomials with exact rational coefficients (fraction.js, BigInt inside):
 * Σ c_k x^e_k with integer exponent vectors e_k (negative exponents allowed) over the symbols of one
 * {@link SymbolTable}. The small exact algebra the symbolic engine needs: sums, products, integer powers,
 * exact division by a polynomial (for cancelling linear factors), contents, evaluation.
 */
import Fraction from 'fraction.js';

export interface PolyTerm {
  /** Exponents, one per symbol (same length in every term of a polynomial). */
  e: readonly number[];
  c: Fraction;
}

/** A polynomial: exponent key → term. No zero coefficients are stored. */
export type Poly = ReadonlyMap<string, PolyTerm>;

const ZERO = new Fraction(0);

/** The key of an exponent vector. */
export const exponentKey = (e: readonly number[]): string => e.join(',');

/** c · x^e as a polynomial (empty when c = 0). */
export function monomialPoly(e: readonly number[], c: Fraction | number = 1): Poly {
  const f = new Fraction(c);
  return f.equals(0) ? new Map() : new Map([[exponentKey(e), { e: [...e], c: f }]]);
}

/** A constant polynomial over `n` symbols. */
export const constantPoly = (c: Fraction | number, n: number): Poly => monomialPoly(new Array<number>(n).fill(0), c);

/** Add c·x^e into a mutable polynomial, dropping cancelled terms. */
export function addTerm(into: Map<string, PolyTerm>, e: readonly number[], c: Fraction): void {
  if (c.equals(0)) return;
  const k = exponentKey(e);
  const prev = into.get(k);
  if (!prev) {
    into.set(k, { e, c });
    return;
  }
  const sum = prev.c.add(c);
  if (sum.equals(0)) into.delete(k);
  else into.set(k, { e: prev.e, c: sum });
}

/** a·P + b·Q. */
export function linearCombination(a: Fraction | number, p: Poly, b: Fraction | number, q: Poly): Poly {
  const out = new Map<string, PolyTerm>();
  const fa = new Fraction(a);
  const fb = new Fraction(b);
  if (!fa.equals(0)) for (const t of p.values()) addTerm(out, t.e, t.c.mul(fa));
  if (!fb.equals(0)) for (const t of q.values()) addTerm(out, t.e, t.c.mul(fb));
  return out;
}

export const subPoly = (p: Poly, q: Poly): Poly => linearCombination(1, p, -1, q);
export const scalePoly = (p: Poly, c: Fraction | number): Poly => linearCombination(c, p, 0, p);

const addExponents = (a: readonly number[], b: readonly number[]): number[] => a.map((x, i) => x + b[i]);

/** P · Q. */
export function mulPoly(p: Poly, q: Poly): Poly {
  const out = new Map<string, PolyTerm>();
  for (const s of p.values()) for (const t of q.values()) addTerm(out, addExponents(s.e, t.e), s.c.mul(t.c));
  return out;
}

/** P^k for an integer k ≥ 0 (P^0 = 1 over `n` symbols). */
export function powPoly(p: Poly, k: number, n: number): Poly {
  let out = constantPoly(1, n);
  for (let i = 0; i < k; i++) out = mulPoly(out, p);
  return out;
}

/** x^d · P (d may have negative entries). */
export function shiftPoly(p: Poly, d: readonly number[]): Poly {
  const out = new Map<string, PolyTerm>();
  for (const t of p.values()) out.set(exponentKey(addExponents(t.e, d)), { e: addExponents(t.e, d), c: t.c });
  return out;
}

export const isZeroPoly = (p: Poly): boolean => p.size === 0;

/** The only term of a one-term polynomial, else undefined. */
export function singleTerm(p: Poly): PolyTerm | undefined {
  if (p.size !== 1) return undefined;
  return p.values().next().value;
}

/** Lexicographic comparison of exponent vectors (first symbol most significant). */
export function compareLex(a: readonly number[], b: readonly number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

/** The lexicographically leading term (undefined for zero). */
export function leadingTerm(p: Poly): PolyTerm | undefined {
  let best: PolyTerm | undefined;
  for (const t of p.values()) if (!best || compareLex(t.e, best.e) > 0) best = t;
  return best;
}

/**
 * P / D when D divides P exactly (polynomials with non-negative exponents), else undefined.
 * Division algorithm in lex order: a single divisor is a Gröbner basis of its ideal, so the first leading
 * term that D's leading term does not divide proves a non-zero remainder (common practice; Cox, Little,
 * O'Shea, Ideals, Varieties, and Algorithms).
 */
export function divideExact(p: Poly, d: Poly): Poly | undefined {
  const ld = leadingTerm(d);
  if (!ld) throw new RangeError('division by the zero polynomial');
  const rest = new Map(p);
  const quotient = new Map<string, PolyTerm>();
  while (rest.size > 0) {
    const lr = leadingTerm(rest)!;
    const e = lr.e.map((x, i) => x - ld.e[i]);
    if (e.some((x) => x < 0)) return undefined;
    const c = lr.c.div(ld.c);
    addTerm(quotient, e, c);
    for (const t of d.values()) addTerm(rest, addExponents(t.e, e), t.c.mul(c).neg());
  }
  return quotient;
}

/** The largest monomial dividing every term (element-wise minimum of the exponents). */
export function monomialContent(p: Poly, n: number): number[] {
  let min: number[] | undefined;
  for (const t of p.values()) min = min ? min.map((x, i) => Math.min(x, t.e[i])) : [...t.e];
  return min ?? new Array<number>(n).fill(0);
}

/**
 * The rational content: the positive c with P/c having coprime integer coefficients, signed so that P/c has a
 * positive leading (lex) coefficient.
 */
export function rationalContent(p: Poly): Fraction {
  let g: Fraction | undefined;
  for (const t of p.values()) g = g ? g.gcd(t.c) : t.c.abs();
  if (!g) return new Fraction(1);
  const lead = leadingTerm(p)!;
  return lead.c.compare(ZERO) < 0 ? g.neg() : g;
}

/** Exact value at a point (values per symbol; unused symbols may be anything). */
export function evaluatePoly(p: Poly, values: readonly Fraction[]): Fraction {
  let s = new Fraction(0);
  for (const t of p.values()) {
    let v = t.c;
    t.e.forEach((k, i) => {
      if (k !== 0) v = v.mul(values[i].pow(k));
    });
    s = s.add(v);
  }
  return s;
}

/** Floating-point value at a point. */
export function evaluatePolyNumber(p: Poly, values: readonly number[]): number {
  let s = 0;
  for (const t of p.values()) {
    let v = t.c.valueOf();
    t.e.forEach((k, i) => {
      if (k !== 0) v *= values[i] ** k;
    });
    s += v;
  }
  return s;
}
