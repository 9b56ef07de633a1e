/**
 * Species-independent plans for the force-balance energies C8, C10, … (see pair-force-balance.ts):
 *
 *   C_2N = −Σ_{n+n'=2N−2} (<V_n P_n'>_0 − <V_n>_0 <P_n'>_0),
 *
 * with V_n the order-n coupling (q_A q_B times fixed numbers on fixed monomials) and P_n' its Dalgarno–Lewis
 * function (L P = −(W − <W>_0), harmonic-polynomial.ts). Which monomials appear in V_n and P_n', which term of P
 * feeds which lower one, and which products V_n,i P_n',j have an all-even monomial (the only ones with a non-zero
 * Gaussian mean) depend on the order alone, so they are worked out once per order and per pair of orders; a QDO
 * pair then only fills typed arrays: the P coefficients degree by degree from the top, then the covariances as
 * Σ v_i p_j <x^(k_i + k_j)>_0 over the planned products, without forming a polynomial product.
 * The arithmetic is that of harmonic-polynomial.ts (derived here; Dalgarno & Lewis 1955 for L).
 */
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { DrudeSpecies } from '../../model/drude.js';
import { coordinateMeans, monomialMean, type HarmonicPair } from './harmonic-polynomial.js';

const EXPONENT_BITS = 4;
const EXPONENT_MASK = 15;
/** The lowest bit of each exponent: two keys multiply to an all-even monomial iff these bits agree. */
const PARITY_BITS = 0x111111;

const exponent = (key: number, c: number): number => (key >> (EXPONENT_BITS * c)) & EXPONENT_MASK;
const degreeOf = (key: number): number => {
  let d = 0;
  for (let c = 0; c < 6; c++) d += exponent(key, c);
  return d;
};

/** The order-n coupling and the shape of its Dalgarno–Lewis function. */
interface OrderPlan {
  /** V_n = q_A q_B Σ_i vUnit[i] x^vKeys[i] (at R = 1). */
  vKeys: Int32Array;
  vUnit: Float64Array;
  /** Monomials of P, degree descending (the order they are solved in); all of degree ≥ 1. */
  pKeys: Int32Array;
  /** Index in pKeys of each V term (−1 for a constant term, which only shifts <W>_0). */
  vToP: Int32Array;
  /** Lowering of term i of P: entries lowerStart[i] … lowerStart[i+1]−1 of lowerTarget/lowerCoord/lowerFactor. */
  lowerStart: Int32Array;
  lowerTarget: Int32Array;
  lowerCoord: Int32Array;
  /** e (e − 1) of the coordinate lowered (the residual gains coeff · e (e − 1) / (2 m_c) there). */
  lowerFactor: Float64Array;
}

const orderPlans = new Map<number, OrderPlan>();

function orderPlan(order: number): OrderPlan {
  const hit = orderPlans.get(order);
  if (hit) return hit;
  const vMap = new Map<number, number>();
  for (const t of couplingTerms(order)) {
    const key = t.pA[0] + (t.pA[1] << 4) + (t.pA[2] << 8) + (t.pB[0] << 12) + (t.pB[1] << 16) + (t.pB[2] << 20);
    vMap.set(key, (vMap.get(key) ?? 0) + t.c);
  }
  // every monomial P can reach: the V monomials and all their lowerings by two in one coordinate
  const reach = new Set<number>();
  const visit = (key: number): void => {
    if (degreeOf(key) === 0 || reach.has(key)) return;
    reach.add(key);
    for (let c = 0; c < 6; c++) if (exponent(key, c) >= 2) visit(key - (2 << (EXPONENT_BITS * c)));
  };
  for (const key of vMap.keys()) visit(key);
  const degrees = new Map([...reach].map((key) => [key, degreeOf(key)]));
  const pKeys = Int32Array.from([...reach].sort((a, b) => degrees.get(b)! - degrees.get(a)! || a - b));
  const index = new Map<number, number>();
  pKeys.forEach((key, i) => index.set(key, i));
  const lowerStart = new Int32Array(pKeys.length + 1);
  const target: number[] = [], coord: number[] = [], factor: number[] = [];
  pKeys.forEach((key, i) => {
    lowerStart[i] = target.length;
    for (let c = 0; c < 6; c++) {
      const e = exponent(key, c);
      const lower = key - (2 << (EXPONENT_BITS * c));
      if (e >= 2 && index.has(lower)) {
        target.push(index.get(lower)!);
        coord.push(c);
        factor.push(e * (e - 1));
      }
    }
  });
  lowerStart[pKeys.length] = target.length;
  const vKeys = Int32Array.from(vMap.keys());
  const plan: OrderPlan = {
    vKeys,
    vUnit: Float64Array.from(vMap.values()),
    pKeys,
    vToP: Int32Array.from(vKeys, (key) => index.get(key) ?? -1),
    lowerStart,
    lowerTarget: Int32Array.from(target),
    lowerCoord: Int32Array.from(coord),
    lowerFactor: Float64Array.from(factor),
  };
  orderPlans.set(order, plan);
  return plan;
}

/** The products V_n,i P_n',j with an all-even monomial, and the distinct monomials they give. */
interface ProductPlan {
  vIndex: Int32Array;
  pIndex: Int32Array;
  /** Index into monomialKeys of each product. */
  monomial: Int32Array;
  monomialKeys: Int32Array;
  /** V terms with an all-even monomial (for <V_n>_0) and P terms with one (for <P_n'>_0). */
  vEven: Int32Array;
  pEven: Int32Array;
}

const productPlans = new Map<string, ProductPlan>();

function productPlan(n: number, nP: number): ProductPlan {
  const id = `${n},${nP}`;
  const hit = productPlans.get(id);
  if (hit) return hit;
  const V = orderPlan(n), P = orderPlan(nP);
  const vIndex: number[] = [], pIndex: number[] = [], monomial: number[] = [];
  const monomials = new Map<number, number>();
  // P's terms by parity class, ascending: the pairs (i, j) visited below are those of the full double loop whose
  // parities agree, in the same order (so the plan, and every sum over it, is the same)
  const byParity = new Map<number, number[]>();
  for (let j = 0; j < P.pKeys.length; j++) {
    const parity = P.pKeys[j] & PARITY_BITS;
    const list = byParity.get(parity);
    if (list) list.push(j);
    else byParity.set(parity, [j]);
  }
  for (let i = 0; i < V.vKeys.length; i++)
    for (const j of byParity.get(V.vKeys[i] & PARITY_BITS) ?? []) {
      const key = V.vKeys[i] + P.pKeys[j];
      if (!monomials.has(key)) monomials.set(key, monomials.size);
      vIndex.push(i);
      pIndex.push(j);
      monomial.push(monomials.get(key)!);
    }
  const even = (keys: Int32Array) => Int32Array.from([...keys.keys()].filter((i) => (keys[i] & PARITY_BITS) === 0));
  const plan: ProductPlan = {
    vIndex: Int32Array.from(vIndex),
    pIndex: Int32Array.from(pIndex),
    monomial: Int32Array.from(monomial),
    monomialKeys: Int32Array.from(monomials.keys()),
    vEven: even(V.vKeys),
    pEven: even(P.pKeys),
  };
  productPlans.set(id, plan);
  return plan;
}

/** The second-order energies of one QDO pair: the Dalgarno–Lewis functions and covariances, each computed once. */
export class SecondOrderEnergies {
  private readonly qq: number;
  private readonly moments: Float64Array;
  private readonly p = new Map<number, Float64Array>();

  constructor(A: DrudeSpecies, B: DrudeSpecies, private readonly h: HarmonicPair) {
    this.qq = A.q * B.q;
    this.moments = coordinateMeans(h);
  }

  /** Coefficients of P_n (on orderPlan(n).pKeys), solved degree by degree from the top. */
  private dalgarnoLewis(n: number): Float64Array {
    const hit = this.p.get(n);
    if (hit) return hit;
    const plan = orderPlan(n);
    const { w, mass } = this.h;
    const residual = new Float64Array(plan.pKeys.length);
    for (let i = 0; i < plan.vKeys.length; i++) if (plan.vToP[i] >= 0) residual[plan.vToP[i]] -= this.qq * plan.vUnit[i];
    for (let i = 0; i < plan.pKeys.length; i++) {
      const key = plan.pKeys[i];
      let lambda = 0;
      for (let c = 0; c < 6; c++) lambda += w[c] * ((key >> (4 * c)) & 15);
      const coeff = residual[i] / lambda;
      residual[i] = coeff; // the slot now holds P's coefficient
      for (let l = plan.lowerStart[i]; l < plan.lowerStart[i + 1]; l++)
        residual[plan.lowerTarget[l]] += (coeff * plan.lowerFactor[l]) / (2 * mass[plan.lowerCoord[l]]);
    }
    this.p.set(n, residual);
    return residual;
  }

  /** <V_n P_n'>_0 − <V_n>_0 <P_n'>_0 (hartree at R = 1). */
  covariance(n: number, nP: number): number {
    const plan = productPlan(n, nP);
    const V = orderPlan(n), P = orderPlan(nP);
    const p = this.dalgarnoLewis(nP);
    const moments = this.moments;
    const { monomialKeys, vIndex, pIndex, monomial, vEven, pEven } = plan;
    const means = new Float64Array(monomialKeys.length);
    for (let k = 0; k < monomialKeys.length; k++) means[k] = monomialMean(monomialKeys[k], moments);
    const vUnit = V.vUnit;
    let product = 0;
    for (let t = 0; t < vIndex.length; t++) product += vUnit[vIndex[t]] * p[pIndex[t]] * means[monomial[t]];
    let vMean = 0, pMean = 0;
    for (let t = 0; t < vEven.length; t++) vMean += vUnit[vEven[t]] * monomialMean(V.vKeys[vEven[t]], moments);
    for (let t = 0; t < pEven.length; t++) pMean += p[pEven[t]] * monomialMean(P.pKeys[pEven[t]], moments);
    return this.qq * (product - vMean * pMean);
  }

  /** C_power = −Σ_{n=2}^{power−4} cov(V_n, P_{power−2−n}) (hartree bohr^power). */
  coefficient(power: number): number {
    let e = 0;
    for (let n = 2; n <= power - 4; n++) e += this.covariance(n, power - 2 - n);
    return -e;
  }
}
