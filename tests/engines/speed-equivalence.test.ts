/**
 * The fast paths give the numbers of the straightforward formulas they replace (seeded random inputs, 1e-13
 * relative; the product vectors bit for bit). The references below are written directly from the formulas in the
 * engines' doc comments (derived here), deliberately slow and simple:
 * - force balance: polynomials as maps of exponent lists, the Dalgarno–Lewis function by repeatedly taking any term of
 *   the highest degree left (A. Dalgarno, J. T. Lewis, Proc. R. Soc. Lond. A 233, 70 (1955)), Gaussian means of
 *   fully expanded products, <x^e> = (e − 1)!! (2 m w)^(−e/2) (common practice);
 * - the trust check: the first maximum of U(τν) by scanning its slope on the geometric grid and bisecting, for every
 *   sampled direction, the best four refined by the coordinate pattern search;
 * - product vectors: every contribution added into a Map one by one.
 */
import { describe, expect, test } from 'vitest';
import type { DrudeSpecies } from '../../src/model/drude.js';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { drudeCouplingPolynomial } from '../../src/hamiltonian/drude-polynomial.js';
import { forceBalanceCoefficients } from '../../src/engines/force-balance/pair-force-balance.js';
import { dalgarnoLewis, harmonicPair, pairKey, productMean, type Poly6 } from '../../src/engines/force-balance/harmonic-polynomial.js';
import { catastropheDistance, localisationCheck } from '../../src/engines/exact/localisation.js';
import { applyCoupling, applyLocal, groundState, reducedResolvent, type ProductVector } from '../../src/engines/perturbation/product-vector.js';
import type { LocalSpace } from '../../src/engines/perturbation/local-space.js';
import { localSpaceOf } from '../../src/engines/capabilities.js';
import { relDiff } from '../helpers/tolerance.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { randomDrude } from '../helpers/random-species.js';

const TOL = 1e-13;


// ---------- force balance: reference polynomials keyed by exponent lists ----------
type RefPoly = Map<string, number>;
const exps = (key: string): number[] => key.split(',').map(Number);
const keyOf = (e: readonly number[]): string => e.join(',');
const refAdd = (p: RefPoly, key: string, c: number) => p.set(key, (p.get(key) ?? 0) + c);

function refCoupling(n: number, A: DrudeSpecies, B: DrudeSpecies): RefPoly {
  const p: RefPoly = new Map();
  for (const t of couplingTerms(n)) refAdd(p, keyOf([...t.pA, ...t.pB]), A.q * B.q * t.c);
  return p;
}

function refMean(p: RefPoly, mass: number[], w: number[]): number {
  let s = 0;
  for (const [key, c] of p) {
    let term = c;
    exps(key).forEach((e, i) => {
      if (e % 2) term = 0;
      else for (let k = e - 1; k > 0; k -= 2) term *= k;
      term *= (2 * mass[i] * w[i]) ** (-e / 2);
    });
    s += term;
  }
  return s;
}

function refProduct(p: RefPoly, q: RefPoly): RefPoly {
  const out: RefPoly = new Map();
  for (const [k1, c1] of p) for (const [k2, c2] of q) refAdd(out, keyOf(exps(k1).map((e, i) => e + exps(k2)[i])), c1 * c2);
  return out;
}

/** L P = −(W − <W>): take a highest-degree term a x^e of the residual, P += a/λ x^e, residual −= L(a/λ x^e). */
function refDalgarnoLewis(W: RefPoly, mass: number[], w: number[]): RefPoly {
  const residual: RefPoly = new Map([...W].map(([k, c]) => [k, -c]));
  const P: RefPoly = new Map();
  const degree = (k: string) => exps(k).reduce((s, e) => s + e, 0);
  for (;;) {
    const open = [...residual.keys()].filter((k) => degree(k) > 0 && residual.get(k) !== 0);
    if (open.length === 0) return P;
    const top = open.reduce((best, k) => (degree(k) > degree(best) ? k : best));
    const e = exps(top);
    const coeff = residual.get(top)! / e.reduce((s, ei, i) => s + w[i] * ei, 0);
    residual.delete(top);
    refAdd(P, top, coeff);
    e.forEach((ei, i) => {
      if (ei >= 2) refAdd(residual, keyOf(e.map((x, j) => (j === i ? x - 2 : x))), (coeff * ei * (ei - 1)) / (2 * mass[i]));
    });
  }
}

const toPoly6 = (p: RefPoly): Poly6 => new Map([...p].map(([k, c]) => [pairKey(exps(k).slice(0, 3), exps(k).slice(3)), c]));

describe('force balance: typed Dalgarno–Lewis plans and direct Gaussian means equal the straightforward formulas', () => {
  const rand = seededRandom(2016);
  const pairs = Array.from({ length: 6 }, (_, i) => [randomDrude(rand, 'A', i % 2 === 0), randomDrude(rand, 'B', i % 3 !== 0)] as const);

  test('C8 and C10 = −Σ (<V_n P_n\'> − <V_n><P_n\'>) to 1e-13', () => {
    for (const [A, B] of pairs) {
      const h = harmonicPair(A, B);
      const mass = [...h.mass], w = [...h.w];
      const V = new Map([2, 3, 4, 5, 6].map((n) => [n, refCoupling(n, A, B)]));
      const P = new Map([2, 3, 4, 5, 6].map((n) => [n, refDalgarnoLewis(V.get(n)!, mass, w)]));
      const C = (power: number) => {
        let e = 0;
        for (let n = 2; n <= power - 4; n++) {
          const X = V.get(n)!, Y = P.get(power - 2 - n)!;
          e += refMean(refProduct(X, Y), mass, w) - refMean(X, mass, w) * refMean(Y, mass, w);
        }
        return -e;
      };
      const fast = forceBalanceCoefficients(A, B, 10);
      expect(relDiff(fast.C8!, C(8))).toBeLessThan(TOL);
      expect(relDiff(fast.C10!, C(10))).toBeLessThan(TOL);
    }
  });

  test('the Dalgarno–Lewis function solved degree by degree and <X Y> without the product, to 1e-13', () => {
    for (const [A, B] of pairs.slice(0, 3)) {
      const h = harmonicPair(A, B);
      const mass = [...h.mass], w = [...h.w];
      for (const n of [3, 5, 6]) {
        const ref = refDalgarnoLewis(refCoupling(n, A, B), mass, w);
        const fast = dalgarnoLewis(toPoly6(refCoupling(n, A, B)), h);
        const expected = toPoly6(ref);
        expect(fast.size).toBe(expected.size);
        const scale = Math.max(...[...expected.values()].map(Math.abs));
        for (const [key, c] of expected) expect(Math.abs(fast.get(key)! - c) / scale).toBeLessThan(TOL);
        // <X P> is a sum with cancellation: its error is measured against Σ |x_i p_j| <x^(k_i + k_j)>
        const X = refCoupling(8 - n, A, B);
        const abs = (p: RefPoly): RefPoly => new Map([...p].map(([k, c]) => [k, Math.abs(c)]));
        const magnitude = refMean(refProduct(abs(X), abs(ref)), mass, w);
        expect(Math.abs(productMean(toPoly6(X), fast, h) - refMean(refProduct(X, ref), mass, w)) / magnitude).toBeLessThan(TOL);
      }
    }
  });
});

// ---------- trust check: reference barrier search ----------
function refLocalisationBarrier(A: DrudeSpecies, B: DrudeSpecies, order: number, R: number): number {
  if (R <= catastropheDistance(A, B)) return 0;
  const scale = [A, A, A, B, B, B].map((s, i) => 2 / Math.sqrt(2 * s.m * s.w[i % 3]));
  const harmonic = [...A.w, ...B.w];
  const U = (nu: number[]): number[] => {
    const a = new Array(order + 1).fill(0);
    nu.forEach((v, i) => (a[2] += harmonic[i] * v * v));
    for (let n = 2; n <= order; n++)
      for (const t of drudeCouplingPolynomial(n))
        a[n] += ((A.q * B.q) / R ** (n + 1)) * t.e.reduce((m, e, i) => m * (nu[i] * scale[i]) ** e, t.c);
    return a;
  };
  const barrier = (nu: number[]): number => {
    const a = U(nu);
    if (a[2] <= 0) return 0;
    const slope = (tau: number) => a.reduce((s, an, n) => (n >= 2 ? s + n * an * tau ** (n - 2) : s), 0);
    let lo = 0;
    for (let tau = 1e-3; tau < 1e7; tau *= 1.15) {
      if (slope(tau) <= 0) {
        let hi = tau;
        for (let k = 0; k < 60; k++) [lo, hi] = slope(0.5 * (lo + hi)) > 0 ? [0.5 * (lo + hi), hi] : [lo, 0.5 * (lo + hi)];
        return 0.5 * (lo + hi);
      }
      lo = tau;
    }
    return Infinity;
  };
  // directions: Kronecker sequence with g^7 = g + 1, Box–Muller, both signs; then the 12 axis directions
  let g = 1.1;
  for (let k = 0; k < 50; k++) g -= (g ** 7 - g - 1) / (7 * g ** 6 - 1);
  const dirs: number[][] = [];
  for (let n = 1; n <= 1500; n++) {
    const u = [1, 2, 3, 4, 5, 6].map((i) => (0.5 + n * g ** -i) % 1);
    const v = [0, 2, 4].flatMap((i) => {
      const r = Math.sqrt(-2 * Math.log(1 - u[i]));
      return [r * Math.cos(2 * Math.PI * u[i + 1]), r * Math.sin(2 * Math.PI * u[i + 1])];
    });
    const norm = Math.hypot(...v);
    dirs.push(v.map((x) => x / norm), v.map((x) => -x / norm));
  }
  for (let i = 0; i < 12; i++) dirs.push([0, 1, 2, 3, 4, 5].map((j) => (j === i >> 1 ? (i % 2 ? -1 : 1) : 0)));
  const ranked = dirs.map((nu) => ({ nu, tau: barrier(nu) })).sort((p, q) => p.tau - q.tau);
  let best = ranked[0].tau;
  for (let { nu, tau } of ranked.slice(0, 4)) {
    if (!Number.isFinite(tau) || tau === 0) continue;
    for (let step = 0.2; step > 1e-4; step /= 2)
      for (let improved = true; improved; ) {
        improved = false;
        for (let i = 0; i < 12; i++) {
          const moved = nu.map((v, j) => (j === i >> 1 ? v + (i % 2 ? -step : step) : v));
          const norm = Math.hypot(...moved);
          const trial = moved.map((x) => x / norm);
          const t = barrier(trial);
          if (t < tau) [nu, tau, improved] = [trial, t, true];
        }
      }
    best = Math.min(best, tau);
  }
  return best;
}

describe('trust check: closed-form slope roots and cached directions give the barrier of the scan-and-bisect search', () => {
  test('orders 3, 4 (closed form) and 5 (scan) on random pairs and separations, to 1e-13', () => {
    const rand = seededRandom(1616);
    for (let k = 0; k < 6; k++) {
      const A = randomDrude(rand, 'A', k % 2 === 0), B = randomDrude(rand, 'B', k % 3 === 0);
      const order = [3, 4, 3, 4, 5, 4][k];
      const R = catastropheDistance(A, B) * uniform(rand, 1.2, 3);
      const fast = localisationCheck(A, B, order, R);
      const ref = refLocalisationBarrier(A, B, order, R);
      expect(relDiff(fast.barrier, ref)).toBeLessThan(TOL);
      expect(fast.maxQuanta).toBe(Number.isFinite(ref) ? Math.max(-1, Math.ceil(ref * ref - 3) - 1) : Number.MAX_SAFE_INTEGER);
    }
  });
});

// ---------- product vectors: reference Map accumulation ----------
function refApplyCoupling(n: number, v: ProductVector, A: LocalSpace, B: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    const iA = Math.floor(key / 2 ** 26), iB = key % 2 ** 26;
    for (const t of couplingTerms(n)) {
      const a = A.applyMoment(t.pA, iA), b = B.applyMoment(t.pB, iB);
      a.states.forEach((sa, j) =>
        b.states.forEach((sb, k) => {
          const target = sa * 2 ** 26 + sb;
          out.set(target, (out.get(target) ?? 0) + t.c * amp * a.amps[j] * b.amps[k]);
        }),
      );
    }
  }
  return out;
}

function refApplyLocalA(v: ProductVector, A: LocalSpace): ProductVector {
  const out: ProductVector = new Map();
  for (const [key, amp] of v) {
    const iA = Math.floor(key / 2 ** 26), iB = key % 2 ** 26;
    const e = A.applyMoment([0, 0, 1], iA);
    e.states.forEach((s, j) => out.set(s * 2 ** 26 + iB, (out.get(s * 2 ** 26 + iB) ?? 0) + amp * e.amps[j]));
  }
  return out;
}

const entries = (v: ProductVector) => [...v.entries()];

describe('product vectors: the typed accumulator gives the Map-by-Map result bit for bit, in the same order', () => {
  test('V_n applied repeatedly to QDO spaces and a one-centre moment, random pairs', () => {
    const rand = seededRandom(616);
    for (let k = 0; k < 3; k++) {
      const A = localSpaceOf(randomDrude(rand, 'A', k !== 1), 3), B = localSpaceOf(randomDrude(rand, 'B', true), 3);
      let fast = groundState(), ref = groundState();
      for (const n of [2, 3, 4, 2]) {
        // the reference multiplies t.c·amp·a·b in the engine's grouping ((c·amp)·a)·b, so equality is exact
        fast = reducedResolvent(applyCoupling(couplingTerms(n), fast, A, B), A, B);
        ref = reducedResolvent(refApplyCoupling(n, ref, A, B), A, B);
        expect(entries(fast)).toEqual(entries(ref));
        expect(entries(applyLocal([0, 0, 1], 'a', fast, A, B))).toEqual(entries(refApplyLocalA(ref, A)));
      }
    }
  });
});
