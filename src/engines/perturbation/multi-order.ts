/**
 * Rayleigh–Schrödinger perturbation theory to any order in several parameters at once, for single terms of the
 * series: H = H0 + Σ_n λ_n V_n (λ_n = R^-(n+1)), and the coefficient of one monomial λ^α (α a multiset of coupling
 * orders, e.g. {2, 2, 3} for λ2² λ3) in the energy and in <mu_z> of each centre. Intermediate normalisation
 * (<0|ψ> = 1), with R0 = Q (H0 − E0)^-1 Q and β, γ running over sub-multisets:
 *   ψ_α = R0 [ −Σ_n V_n ψ_{α−n} + Σ_{0<γ<α} E_γ ψ_{α−γ} ],   E_α = Σ_n <0|V_n|ψ_{α−n}>,
 *   <mu>_α = N_α − Σ_{0<β≤α} S_β <mu>_{α−β},   N_α = Σ_{β≤α} <ψ_β|mu|ψ_{α−β}>,   S_α = Σ_{β≤α} <ψ_β|ψ_{α−β}>
 * (the power series of (H0 − E0)ψ = (E − E0 − V)ψ and of <ψ|mu|ψ>/<ψ|ψ>, collected per monomial; standard RSPT,
 * e.g. J. O. Hirschfelder, W. B. Brown, S. T. Epstein, Adv. Quantum Chem. 1, 255 (1964)).
 * Used for the third-order dipole D10 (α = {2, 2, 3}, the first R^-10 term of spherical pairs) and, as an
 * independent cross-check, for D7 and D9 (rspt.ts evaluates those from its closed second-order expressions).
 * Atomic units at R = 1: the coefficient of λ^α is that of R^-Σ(n+1).
 */
import { AXIS_MONOMIALS } from '../../hamiltonian/monomial.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { LocalSpace } from './local-space.js';
import { applyCoupling, applyLocal, combine, dot, groundState, reducedResolvent, type ProductVector } from './product-vector.js';

/** A multiset of coupling orders, ascending. */
type Orders = readonly number[];
const keyOf = (a: Orders): string => a.join(',');

/** All sub-multisets of `a` (ascending order within each; the empty one first). */
function subMultisets(a: Orders): number[][] {
  let out: number[][] = [[]];
  const counts = new Map<number, number>();
  for (const n of a) counts.set(n, (counts.get(n) ?? 0) + 1);
  for (const [n, c] of counts) {
    const next: number[][] = [];
    for (const s of out) for (let k = 0; k <= c; k++) next.push([...s, ...Array<number>(k).fill(n)]);
    out = next;
  }
  return out.map((s) => s.sort((x, y) => x - y));
}

/** a − b for multisets (b ⊆ a). */
function minus(a: Orders, b: Orders): number[] {
  const rest = [...a];
  for (const n of b) rest.splice(rest.indexOf(n), 1);
  return rest;
}

/** The coefficient of λ^α in the energy and in <mu_z> of A and of B. */
export interface MultiOrderTerm {
  energy: number;
  muA: number;
  muB: number;
}

/** RSPT coefficient of the monomial λ^α (α: coupling orders, each ≥ 2). */
export function multiOrderTerm(A: LocalSpace, B: LocalSpace, alpha: Orders): MultiOrderTerm {
  const target = [...alpha].sort((x, y) => x - y);
  const subs = subMultisets(target).sort((x, y) => x.length - y.length);
  const psi = new Map<string, ProductVector>([['', groundState()]]);
  const energy = new Map<string, number>();
  for (const beta of subs) {
    if (beta.length === 0) continue;
    let source: ProductVector = new Map();
    let e = 0;
    for (const n of new Set(beta)) {
      const prev = psi.get(keyOf(minus(beta, [n])))!;
      const v = applyCoupling(couplingTerms(n), prev, A, B);
      e += v.get(0) ?? 0;
      source = combine(1, source, -1, v);
    }
    energy.set(keyOf(beta), e);
    for (const gamma of subMultisets(beta)) {
      if (gamma.length === 0 || gamma.length === beta.length) continue;
      const eg = energy.get(keyOf(gamma))!;
      if (eg !== 0) source = combine(1, source, eg, psi.get(keyOf(minus(beta, gamma)))!);
    }
    psi.set(keyOf(beta), reducedResolvent(source, A, B));
  }
  const overlap = new Map<string, number>();
  for (const beta of subs) {
    let s = 0;
    for (const gamma of subMultisets(beta)) s += dot(psi.get(keyOf(gamma))!, psi.get(keyOf(minus(beta, gamma)))!);
    overlap.set(keyOf(beta), s);
  }
  const dipole = (on: 'a' | 'b'): number => {
    const z = AXIS_MONOMIALS[2];
    const muPsi = new Map(subs.map((b) => [keyOf(b), applyLocal(z, on, psi.get(keyOf(b))!, A, B)] as const));
    const m = new Map<string, number>();
    for (const beta of subs) {
      let n = 0;
      for (const gamma of subMultisets(beta)) n += dot(psi.get(keyOf(gamma))!, muPsi.get(keyOf(minus(beta, gamma)))!);
      for (const gamma of subMultisets(beta)) if (gamma.length > 0) n -= overlap.get(keyOf(gamma))! * m.get(keyOf(minus(beta, gamma)))!;
      m.set(keyOf(beta), n);
    }
    return m.get(keyOf(target))!;
  };
  return { energy: energy.get(keyOf(target))!, muA: dipole('a'), muB: dipole('b') };
}

/**
 * The third-order dipole coefficient D10 of a pair of centres even under inversion: lim R^10 of mu_z beyond the
 * D7, D9 terms comes from λ2² λ3 only at third order (derived here: the parity rules of rspt.ts allow even powers at
 * third order, and Σ(n+1) = 10 needs orders {2, 2, 3}); first and second order add R^-10 terms only for centres with
 * permanent moments (V9), so this is the whole D10 of spherical pairs. e·a0^11.
 */
export function thirdOrderD10(A: LocalSpace, B: LocalSpace): { a: number; b: number } {
  const t = multiOrderTerm(A, B, [2, 2, 3]);
  return { a: t.muA, b: t.muB };
}
