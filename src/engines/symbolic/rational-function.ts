/**
 * Rational functions num/den of Laurent polynomials with exact rational coefficients, for turning a user's
 * formula into exact algebra. No cancellation is attempted (none is needed): two rational functions are equal
 * exactly when n1·d2 − n2·d1 is the zero polynomial (common practice).
 */
import Fraction from 'fraction.js';
import {
  constantPoly,
  evaluatePoly,
  isZeroPoly,
  linearCombination,
  monomialPoly,
  mulPoly,
  singleTerm,
  subPoly,
  type Poly,
} from './polynomial.js';

/**
 * Stated limits of the exact algebra, so that a formula such as (qa+qb+ma+mb+wa+wb)^64 (millions of terms when
 * expanded) is answered in about a second by the numeric comparison instead: the term pairs one product may
 * multiply, the terms any intermediate polynomial may hold, the largest |exponent| of a parameter and the size of
 * a coefficient's numerator and denominator in bits.
 */
export const EXACT_LIMITS = { maxProductWork: 400_000, maxTerms: 5_000, maxExponent: 256, maxCoefficientBits: 512 } as const;

/** 2^maxCoefficientBits: a numerator or denominator beyond it makes the exact algebra too slow (BigInt work). */
const COEFFICIENT_BOUND = 1n << BigInt(EXACT_LIMITS.maxCoefficientBits);

/** The exact algebra would exceed {@link EXACT_LIMITS}; the message says which limit. */
export class AlgebraTooCostly extends Error {
  override readonly name = 'AlgebraTooCostly';
}

/** A polynomial within the limits, else {@link AlgebraTooCostly}. */
function withinLimits(p: Poly): Poly {
  if (p.size > EXACT_LIMITS.maxTerms) throw new AlgebraTooCostly(`an intermediate result has ${p.size} terms, limit ${EXACT_LIMITS.maxTerms}`);
  for (const t of p.values()) {
    if (t.c.n >= COEFFICIENT_BOUND || t.c.d >= COEFFICIENT_BOUND) {
      throw new AlgebraTooCostly(`a coefficient beyond ${EXACT_LIMITS.maxCoefficientBits} bits`);
    }
    for (const k of t.e) {
      if (Math.abs(k) > EXACT_LIMITS.maxExponent) throw new AlgebraTooCostly(`a power ${k} of a parameter, limit ${EXACT_LIMITS.maxExponent}`);
    }
  }
  return p;
}

/** P · Q within {@link EXACT_LIMITS} (the work is checked before multiplying). */
function product(p: Poly, q: Poly): Poly {
  if (p.size * q.size > EXACT_LIMITS.maxProductWork) {
    throw new AlgebraTooCostly(`a product of ${p.size} by ${q.size} terms, limit ${EXACT_LIMITS.maxProductWork} term pairs`);
  }
  return withinLimits(mulPoly(p, q));
}

export interface RationalFunction {
  num: Poly;
  den: Poly;
}

/** Fold a one-term denominator into the numerator (Laurent monomials need no denominator). */
function normalise(r: RationalFunction, n: number): RationalFunction {
  const d = singleTerm(r.den);
  if (!d) return r;
  const inv = monomialPoly(
    d.e.map((x) => -x),
    d.c.inverse(),
  );
  return { num: product(r.num, inv), den: constantPoly(1, n) };
}

export const rfConstant = (c: Fraction, n: number): RationalFunction => ({ num: withinLimits(constantPoly(c, n)), den: constantPoly(1, n) });

/** c · x^e. */
export const rfMonomial = (e: readonly number[], c: Fraction = new Fraction(1)): RationalFunction => ({
  num: monomialPoly(e, c),
  den: constantPoly(1, e.length),
});

const sameDen = (a: RationalFunction, b: RationalFunction) => isZeroPoly(subPoly(a.den, b.den));

export function rfAdd(a: RationalFunction, b: RationalFunction, n: number, sign: 1 | -1 = 1): RationalFunction {
  if (sameDen(a, b)) return { num: withinLimits(linearCombination(1, a.num, sign, b.num)), den: a.den };
  return normalise({ num: linearCombination(1, product(a.num, b.den), sign, product(b.num, a.den)), den: product(a.den, b.den) }, n);
}

export const rfMul = (a: RationalFunction, b: RationalFunction, n: number): RationalFunction =>
  normalise({ num: product(a.num, b.num), den: product(a.den, b.den) }, n);

/** a / b; undefined when b is identically zero. */
export function rfDiv(a: RationalFunction, b: RationalFunction, n: number): RationalFunction | undefined {
  if (isZeroPoly(b.num)) return undefined;
  return normalise({ num: product(a.num, b.den), den: product(a.den, b.num) }, n);
}

/** a^k for an integer k (undefined for a negative power of zero). */
export function rfPow(a: RationalFunction, k: number, n: number): RationalFunction | undefined {
  let base = a;
  if (k < 0) {
    const inv = rfDiv(rfConstant(new Fraction(1), n), a, n);
    if (!inv) return undefined;
    base = inv;
    k = -k;
  }
  let out = rfConstant(new Fraction(1), n);
  for (let i = 0; i < k; i++) out = rfMul(out, base, n);
  return out;
}

/**
 * The k-th root when a is c·x^e with every exponent divisible by k and c an exact k-th power (positive c for
 * even k), else undefined: a perfect-power monomial, as in sqrt(alphaa*ma)*wa.
 */
export function rfRoot(a: RationalFunction, k: number): RationalFunction | undefined {
  const t = singleTerm(a.num);
  if (!t || singleTerm(a.den) === undefined) return undefined;
  if (t.e.some((x) => x % k !== 0)) return undefined;
  const c = t.c;
  if (c.s < 0n && k % 2 === 0) return undefined;
  const root = (x: bigint): bigint | undefined => {
    const r = BigInt(Math.round(Number(x) ** (1 / k)));
    for (const cand of [r - 1n, r, r + 1n]) if (cand >= 0n && cand ** BigInt(k) === x) return cand;
    return undefined;
  };
  const rn = root(c.n);
  const rd = root(c.d);
  if (rn === undefined || rd === undefined) return undefined;
  const sign = c.s < 0n ? -1n : 1n;
  return rfMonomial(
    t.e.map((x) => x / k),
    new Fraction(sign * rn, rd),
  );
}

/** True when a − b is identically zero ({@link AlgebraTooCostly} beyond the limits). */
export const rfEqual = (a: RationalFunction, b: RationalFunction): boolean => isZeroPoly(subPoly(product(a.num, b.den), product(b.num, a.den)));

/** Exact value at a point; undefined where the denominator vanishes. */
export function rfEvaluate(a: RationalFunction, values: readonly Fraction[]): Fraction | undefined {
  const d = evaluatePoly(a.den, values);
  if (d.equals(0)) return undefined;
  return evaluatePoly(a.num, values).div(d);
}
