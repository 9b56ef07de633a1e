/**
 * Response route in Cartesian form, for any pair of centres with Cartesian response functions.
 *
 * For V = Σ_k c_k P_k Q_k (P on A, Q on B) the second-order energy splits by intermediate states into
 * dispersion (both centres excited) and induction (one excited, the other's permanent moments <P>, <Q>):
 *   E2 = −(1/2π) ∫_0^∞ Σ_{k,l} c_k c_l χA_{kl}(iu) χB_{kl}(iu) du
 *        − (1/2) Σ_{k,l} c_k c_l [χA_{kl}(0) <Q_k><Q_l> + <P_k><P_l> χB_{kl}(0)],
 * the dispersion part by 1/(a + b) = (2/π) ∫_0^∞ ab/((a² + u²)(b² + u²)) du (H. B. G. Casimir, D. Polder,
 * Phys. Rev. 73, 360 (1948); A. J. Stone, The Theory of Intermolecular Forces, 2nd ed. 2013, ch. 4). Then
 *   C_{2N} = −[R^-2N part of E2],   n + n' = 2N − 2 over the orders of V_n, V_n',
 * and the dipole is −∂E/∂F for a static field F along z on one centre (derived here): the D7 term comes from
 * the V2 × V3 cross part, where ∂_F acts on χA (the dipole–dipole–quadrupole response) and on the permanent
 * moments (∂<P>/∂F = χ_{P,M_z}(0)). For centres without permanent quadrupoles the induction parts vanish and
 * the isotropic formulas of isotropic-kernel.ts are recovered. The first-order terms are reported too:
 *   E5 = Σ_{k∈V4} c_k <P_k><Q_k>  (energy ∝ R^-5),  D4.a = −Σ_{k∈V3} c_k χA_{P_k,M_z}(0) <Q_k>  (dipole ∝ R^-4).
 * The x and y components vanish for centres symmetric under x → −x and y → −y (all kinds here).
 */
import { couplingTerms, type CouplingTerm } from '../../hamiltonian/multipole-coupling.js';
import { type Monomial, monomialKey } from '../../hamiltonian/monomial.js';
import { integrateSemiInfinite } from '../../math/semi-infinite-quadrature.js';
import type { TensorResponse } from './response-model.js';

export interface ResponseOptions {
  /** Relative tolerance of the quadrature. Default 1e-13. */
  relTol?: number;
  /** Highest dispersion power computed (6, 8 or 10); higher ones come back as NaN. Default 10. */
  maxEnergyPower?: 6 | 8 | 10;
}

/** Coefficients from the response route, each with its quadrature error estimate. */
export interface ResponseCoefficients {
  C6: number;
  C8: number;
  C10: number;
  /** z component of lim R^7 <mu_A>, e·a0^8. */
  D7a: number;
  /** z component of lim R^7 <mu_B>, e·a0^8. */
  D7b: number;
  error: { C6: number; C8: number; C10: number; D7a: number; D7b: number };
  /** First-order (permanent-moment) terms; zero for centres without permanent quadrupoles. */
  permanent: { E5: number; D4a: number; D4b: number };
  converged: boolean;
  evaluations: number;
  kernel: 'isotropic' | 'tensor';
}

const Z: Monomial = [0, 0, 1];

/** Distinct (p, p') pairs of one side, so each response function is evaluated once per frequency. */
class PairTable {
  readonly pairs: Array<[Monomial, Monomial]> = [];
  /** The function at a probe frequency, to drop pairs that vanish by symmetry. */
  readonly probe: number[] = [];
  private readonly index = new Map<number, number>();
  constructor(
    private readonly fn: (p: Monomial, q: Monomial, u: number) => number,
    private readonly probeU: number,
  ) {}
  /** Index of (p, q), or −1 when its response vanishes identically (checked at two frequencies). */
  id(p: Monomial, q: Monomial): number {
    const key = monomialKey(p) * 32768 + monomialKey(q);
    let i = this.index.get(key);
    if (i === undefined) {
      const v = this.fn(p, q, this.probeU);
      i = v === 0 && this.fn(p, q, 2.3 * this.probeU) === 0 ? -1 : this.pairs.length;
      if (i >= 0) {
        this.pairs.push([p, q]);
        this.probe.push(v);
      }
      this.index.set(key, i);
    }
    return i;
  }
  evaluate(u: number, out: Float64Array): void {
    for (let i = 0; i < this.pairs.length; i++) out[i] = this.fn(this.pairs[i][0], this.pairs[i][1], u);
  }
}

/** Memoised static quantities of one centre: χ(0) and permanent moments. */
function staticMemo(r: TensorResponse) {
  const chi0 = new Map<number, number>();
  const mean = new Map<number, number>();
  return {
    chi(p: Monomial, q: Monomial): number {
      const key = monomialKey(p) * 32768 + monomialKey(q);
      let v = chi0.get(key);
      if (v === undefined) chi0.set(key, (v = r.chi(p, q, 0)));
      return v;
    },
    dChi: (p: Monomial, q: Monomial): number => r.dChiDFz(p, q, 0),
    mean(p: Monomial): number {
      const key = monomialKey(p);
      let v = mean.get(key);
      if (v === undefined) mean.set(key, (v = r.mean(p)));
      return v;
    },
  };
}

/** C6, C8, C10, D7 (z) of two centres with Cartesian response, by quadrature plus the static induction terms. */
export function tensorResponseCoefficients(A: TensorResponse, B: TensorResponse, options: ResponseOptions = {}): ResponseCoefficients {
  const maxPower = options.maxEnergyPower ?? 10;
  const chiA = new PairTable(A.chi, A.scale), chiB = new PairTable(B.chi, B.scale);
  const dA = new PairTable(A.dChiDFz, A.scale), dB = new PairTable(B.dChiDFz, B.scale);
  const sA = staticMemo(A), sB = staticMemo(B);
  // products: coefficient, index into A's table, into B's table, output slot; kind 0 χχ, 1 ∂χA χB, 2 χA ∂χB
  const prodC: number[] = [], prodA: number[] = [], prodB: number[] = [], prodSlot: number[] = [], prodKind: number[] = [];
  const statics = new Float64Array(5);

  const add = (s: readonly CouplingTerm[], t: readonly CouplingTerm[], weight: number, slot: number, kind: 0 | 1 | 2) => {
    for (const k of s)
      for (const l of t) {
        const ia = (kind === 1 ? dA : chiA).id(k.pA, l.pA);
        if (ia < 0) continue;
        const ib = (kind === 2 ? dB : chiB).id(k.pB, l.pB);
        if (ib < 0) continue;
        prodC.push(weight * k.c * l.c);
        prodA.push(ia);
        prodB.push(ib);
        prodSlot.push(slot);
        prodKind.push(kind);
      }
  };
  const addInduction = (s: readonly CouplingTerm[], t: readonly CouplingTerm[], slot: number) => {
    for (const k of s)
      for (const l of t) {
        const c = k.c * l.c;
        const mA = sA.mean(k.pA) * sA.mean(l.pA), mB = sB.mean(k.pB) * sB.mean(l.pB);
        if (slot < 3) {
          statics[slot] += 0.5 * c * (sA.chi(k.pA, l.pA) * mB + mA * sB.chi(k.pB, l.pB));
        } else if (slot === 3) {
          const fieldMoments = sA.chi(k.pA, Z) * sA.mean(l.pA) + sA.mean(k.pA) * sA.chi(l.pA, Z);
          statics[3] += c * ((mB === 0 ? 0 : sA.dChi(k.pA, l.pA) * mB) + (fieldMoments === 0 ? 0 : fieldMoments * sB.chi(k.pB, l.pB)));
        } else {
          const fieldMoments = sB.chi(k.pB, Z) * sB.mean(l.pB) + sB.mean(k.pB) * sB.chi(l.pB, Z);
          statics[4] += c * ((mA === 0 ? 0 : sB.dChi(k.pB, l.pB) * mA) + (fieldMoments === 0 ? 0 : fieldMoments * sA.chi(k.pA, l.pA)));
        }
      }
  };

  const energySlots: Array<[number, number]> = [[6, 0], [8, 1], [10, 2]];
  for (const [power, slot] of energySlots) {
    if (power > maxPower) continue;
    for (let n = 2; n <= power - 4; n++) {
      add(couplingTerms(n), couplingTerms(power - 2 - n), 1 / (2 * Math.PI), slot, 0);
      addInduction(couplingTerms(n), couplingTerms(power - 2 - n), slot);
    }
  }
  add(couplingTerms(2), couplingTerms(3), 1 / Math.PI, 3, 1);
  add(couplingTerms(2), couplingTerms(3), 1 / Math.PI, 4, 2);
  addInduction(couplingTerms(2), couplingTerms(3), 3);
  addInduction(couplingTerms(2), couplingTerms(3), 4);

  const vals = {
    chiA: new Float64Array(chiA.pairs.length),
    chiB: new Float64Array(chiB.pairs.length),
    dA: new Float64Array(dA.pairs.length),
    dB: new Float64Array(dB.pairs.length),
  };
  const out = new Float64Array(5);
  const f = (u: number) => {
    chiA.evaluate(u, vals.chiA);
    chiB.evaluate(u, vals.chiB);
    dA.evaluate(u, vals.dA);
    dB.evaluate(u, vals.dB);
    out.fill(0);
    for (let i = 0; i < prodC.length; i++) {
      const kind = prodKind[i];
      const a = kind === 1 ? vals.dA[prodA[i]] : vals.chiA[prodA[i]];
      const b = kind === 2 ? vals.dB[prodB[i]] : vals.chiB[prodB[i]];
      out[prodSlot[i]] += prodC[i] * a * b;
    }
    return out;
  };
  const r = integrateSemiInfinite(f, 5, { scale: Math.sqrt(A.scale * B.scale), relTol: options.relTol ?? 1e-13 });
  const v = r.value.map((x, i) => (i < 3 && 6 + 2 * i > maxPower ? NaN : x + statics[i]));
  const [C6, C8, C10, D7a, D7b] = v;
  const [eC6, eC8, eC10, eA, eB] = r.error;

  let E5 = 0, D4a = 0, D4b = 0;
  for (const k of couplingTerms(4)) E5 += k.c * sA.mean(k.pA) * sB.mean(k.pB);
  for (const k of couplingTerms(3)) {
    D4a -= k.c * sA.chi(k.pA, Z) * sB.mean(k.pB);
    D4b -= k.c * sA.mean(k.pA) * sB.chi(k.pB, Z);
  }
  return {
    C6, C8, C10, D7a, D7b,
    error: { C6: eC6, C8: eC8, C10: eC10, D7a: eA, D7b: eB },
    permanent: { E5, D4a, D4b },
    converged: r.converged,
    evaluations: r.evaluations,
    kernel: 'tensor',
  };
}
