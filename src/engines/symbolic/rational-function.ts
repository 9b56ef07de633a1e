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
  return { num: mulPoly(r.num, inv), den: constantPoly(1, n) };
}

export const rfConstant = (c: Fraction, n: number): RationalFunction => ({ num: constantPoly(c, n), den: constantPoly(1, n) });

/** c · x^e. */
export const rfMonomial = (e: readonly number[], c: Fraction = new Fraction(1)): RationalFunction => ({
  num: monomialPoly(e, c),
  den: constantPoly(1, e.length),
});

const sameDen = (a: RationalFunction, b: RationalFunction) => isZeroPoly(subPoly(a.den, b.den));

export function rfAdd(a: RationalFunction, b: RationalFunction, n: number, sign: 1 | -1 = 1): RationalFunction {
  if (sameDen(a, b)) return { num: linearCombination(1, a.num, sign, b.num), den: a.den };
  return normalise({ num: linearCombination(1, mulPoly(a.num, b.den), sign, mulPoly(b.num, a.den)), den: mulPoly(a.den, b.den) }, n);
}

export const rfMul = (a: RationalFunction, b: RationalFunction, n: number): RationalFunction =>
  normalise({ num: mulPoly(a.num, b.num), den: mulPoly(a.den, b.den) }, n);

/** a / b; undefined when b is identically zero. */
export function rfDiv(a: RationalFunction, b: RationalFunction, n: number): RationalFunction | undefined {
  if (isZeroPoly(b.num)) return undefined;
  return normalise({ num: mulPoly(a.num, b.den), den: mulPoly(a.den, b.num) }, n);
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

/** True when a − b is identically zero. */
export const rfEqual = (a: RationalFunction, b: RationalFunction): boolean => isZeroPoly(subPoly(mulPoly(a.num, b.den), mulPoly(b.num, a.den)));

/** Exact value at a point; undefined where the denominator vanishes. */
export function rfEvaluate(a: RationalFunction, values: readonly Fraction[]): Fraction | undefined {
  const d = evaluatePoly(a.den, values);
  if (d.equals(0)) return undefined;
  return evaluatePoly(a.num, values).div(d);
}
