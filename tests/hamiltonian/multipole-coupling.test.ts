import Fraction from 'fraction.js';
import { describe, expect, test } from 'vitest';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { drudeCouplingEnergy, drudeCouplingPolynomial, drudeExactCoulomb } from '../../src/hamiltonian/drude-polynomial.js';
import { inverseDistanceTaylor } from '../../src/hamiltonian/inverse-distance-taylor.js';
import { monomialKey } from '../../src/hamiltonian/monomial.js';
import { expectClose } from '../helpers/tolerance.js';
import { seededRandom, uniform } from '../helpers/random.js';

/** Legendre polynomials P_l(x) by the three-term recurrence (common practice). */
function legendre(l: number, x: number): number {
  let p0 = 1, p1 = x;
  if (l === 0) return 1;
  for (let k = 2; k <= l; k++) [p0, p1] = [p1, ((2 * k - 1) * x * p1 - (k - 1) * p0) / k];
  return p1;
}
/** Degree-l part of 1/|R ẑ + d| from the Legendre expansion Σ_l (−|d|)^l P_l(d_z/|d|) / R^(l+1) (textbook). */
function legendreTerm(l: number, R: number, d: readonly number[]): number {
  const r = Math.hypot(d[0], d[1], d[2]);
  return r === 0 ? (l === 0 ? 1 / R : 0) : ((-r) ** l * legendre(l, d[2] / r)) / R ** (l + 1);
}

describe('Taylor coefficients of 1/|ẑ + d|', () => {
  test('low orders are the known derivative tensors: −d_z, (2d_z² − d_x² − d_y²)/2', () => {
    const t = inverseDistanceTaylor(2);
    const c = (p: [number, number, number]) => t.get(monomialKey(p))?.c.valueOf() ?? 0;
    expect(c([0, 0, 0])).toBe(1);
    expect(c([0, 0, 1])).toBe(-1);
    expect(c([0, 0, 2])).toBe(1);
    expect(c([2, 0, 0])).toBe(-0.5);
    expect(c([1, 1, 0])).toBe(0);
  });
  test('each degree is traceless-harmonic: it matches the Legendre form at random points', () => {
    const rand = seededRandom(7);
    const t = inverseDistanceTaylor(6);
    for (let trial = 0; trial < 20; trial++) {
      const d = [uniform(rand, -1, 1), uniform(rand, -1, 1), uniform(rand, -1, 1)];
      for (let l = 0; l <= 6; l++) {
        let s = 0;
        for (const { p, c } of t.values()) if (p[0] + p[1] + p[2] === l) s += c.valueOf() * d[0] ** p[0] * d[1] ** p[1] * d[2] ** p[2];
        expectClose(s, legendreTerm(l, 1, d), 1e-12, 1e-14, `degree ${l}`);
      }
    }
  });
});

/**
 * The binomial series Σ_k binom(−1/2, k) t^k, t = 2 d_z + d·d, expanded by exact polynomial multiplication and
 * truncated at degree N (the textbook route the closed form in inverse-distance-taylor.ts was derived from).
 */
function seriesByMultiplication(N: number): Map<string, Fraction> {
  type Poly = Map<string, { e: number[]; c: Fraction }>;
  const t: Poly = new Map([[[0, 0, 1], 2], [[2, 0, 0], 1], [[0, 2, 0], 1], [[0, 0, 2], 1]].map(([e, c]) => [String(e), { e: e as number[], c: new Fraction(c as number) }]));
  const out = new Map<string, Fraction>([['0,0,0', new Fraction(1)]]);
  let power: Poly = new Map([['0,0,0', { e: [0, 0, 0], c: new Fraction(1) }]]);
  let binom = new Fraction(1);
  for (let k = 1; k <= N; k++) {
    const next: Poly = new Map();
    for (const x of power.values())
      for (const y of t.values()) {
        const e = [0, 1, 2].map((i) => x.e[i] + y.e[i]);
        if (e[0] + e[1] + e[2] > N) continue;
        const prev = next.get(String(e));
        next.set(String(e), { e, c: prev ? prev.c.add(x.c.mul(y.c)) : x.c.mul(y.c) });
      }
    power = next;
    binom = binom.mul(new Fraction(-1, 2).sub(k - 1)).div(k);
    for (const [key, term] of power) out.set(key, (out.get(key) ?? new Fraction(0)).add(term.c.mul(binom)));
  }
  for (const [key, c] of out) if (c.equals(0)) out.delete(key);
  return out;
}

describe('closed-form Taylor coefficients against the series they come from', () => {
  test('every coefficient through degree 10 is the same exact rational as the binomial series (derived here)', () => {
    const closed = inverseDistanceTaylor(10);
    const series = seriesByMultiplication(10);
    expect(closed.size).toBe(series.size);
    for (const { p, c } of closed.values()) expect(c.equals(series.get(String(p)) ?? new Fraction(NaN)), `d^(${p})`).toBe(true);
  });
});

describe('multipole couplings of two QDOs', () => {
  test('order 2 is the dipole–dipole form qAqB(xAxB + yAyB − 2zAzB)/R³ (physics notes §2)', () => {
    const terms = drudeCouplingPolynomial(2).map((t) => [t.e.join(''), t.exact.toFraction()]);
    expect(terms.sort()).toEqual([['001001', '-2'], ['010010', '1'], ['100100', '1']].sort());
  });
  test('order 3 equals the hand-derived Legendre form h(rB − rA) − h(rB) − h(−rA), h = degree-3 part', () => {
    const rand = seededRandom(11);
    const R = 1.7;
    for (let trial = 0; trial < 25; trial++) {
      const rA = [0, 1, 2].map(() => uniform(rand, -0.5, 0.5));
      const rB = [0, 1, 2].map(() => uniform(rand, -0.5, 0.5));
      const diff = rB.map((x, i) => x - rA[i]);
      const hand = legendreTerm(3, R, diff) - legendreTerm(3, R, rB) - legendreTerm(3, R, rA.map((x) => -x));
      expectClose(drudeCouplingEnergy(3, R, 1, 1, rA, rB), hand, 1e-12, 1e-15);
    }
  });
  test('order 3 contains the dipole–quadrupole terms derived by hand: −3 zA² zB + (3/2)(xA² + yA²) zB + 3 xA zA xB + 3 yA zA yB', () => {
    const got = new Map(drudeCouplingPolynomial(3).map((t) => [t.e.join(''), t.exact.valueOf()]));
    expect(got.get('002001')).toBe(-3);
    expect(got.get('200001')).toBe(1.5);
    expect(got.get('020001')).toBe(1.5);
    expect(got.get('101100')).toBe(3);
    expect(got.get('011010')).toBe(3);
  });
  test('no term acts on one centre alone (neutral centres)', () => {
    for (let n = 2; n <= 6; n++) for (const t of couplingTerms(n)) expect(t.pA.some((x) => x > 0) && t.pB.some((x) => x > 0)).toBe(true);
  });
  test('the truncated expansion converges to the exact Coulomb interaction: the remainder falls off as R^-9', () => {
    const rA = [0.31, -0.22, 0.4];
    const rB = [-0.15, 0.27, -0.33];
    const remainder = (R: number) => {
      let series = 0;
      for (let n = 2; n <= 7; n++) series += drudeCouplingEnergy(n, R, 1.1, 0.9, rA, rB);
      return series - drudeExactCoulomb(R, 1.1, 0.9, rA, rB);
    };
    const r10 = remainder(10);
    const r20 = remainder(20);
    // the first omitted term is the order-8 coupling ∝ R^-9
    expectClose(r10 / r20, 2 ** 9, 0.1); // the R^-10 term shifts the ratio by a few per cent
    const V = (n: number) => drudeCouplingEnergy(n, 10, 1.1, 0.9, rA, rB);
    expectClose(r10, -(V(8) + V(9)), 0.03); // what remains is the order-10 term, ~ (|r|/R)² smaller
    expect(Math.abs(r10)).toBeLessThan(1e-3 * Math.abs(drudeCouplingEnergy(2, 10, 1.1, 0.9, rA, rB)));
  });
});
