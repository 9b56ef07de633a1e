/**
 * Rayleigh–Schrödinger perturbation theory for a pair of quantum Drude oscillators with symbols instead of
 * numbers: the same chains as the numeric route (src/engines/perturbation/rspt.ts),
 *   C_{2N} = Σ_{n+n'=2N−2} <0|V_n R0 V_n'|0>,
 *   D7 = <mu>_{23} = 2<0|mu|ψ23> + 2<φ2|mu|φ3> − 2<φ2|φ3><0|mu|0>,   ψ23 = R0[(V2 − <V2>)φ3 + (V3 − <V3>)φ2],
 * with φ_n = R0 V_n|0> and V_n the order-n multipole coupling (couplingTerms), at R = 1.
 *
 * Exactness: states are the unnormalised products |n) = Π_i (a_i†)^{n_i}|0>, on which a|n) = n|n−1) and
 * a†|n) = |n+1) have integer coefficients and (n|n) = n! (common practice; any QM text). A moment
 * M_p = −q Π_i (s_i (a_i + a_i†))^{p_i} with s_i² = 1/(2 m w_i) then only ever produces rational multiples of
 * monomials in q and s, and the reduced resolvent divides by the excitation energy Σ n_i w_i, a linear form.
 * Every closing bracket returns each axis to zero quanta, so each s appears to an even power and the results
 * are rational functions of q, m, w (closed-form.ts puts them over a common denominator).
 */
import Fraction from 'fraction.js';
import { AXIS_MONOMIALS, type Monomial } from '../../hamiltonian/monomial.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import { accumulate, mulTerms, reciprocalLinear, termKey, type Term } from './closed-form.js';
import type { Centre, SymbolTable } from './symbols.js';
import { factorial } from '../../math/combinatorics.js';

/** Amplitude of one product state: a sum of terms keyed by {@link termKey}. */
type Amplitude = Map<string, Term>;
/** A vector over unnormalised product states, keyed by {@link stateKey}. */
type SymbolicVector = Map<number, Amplitude>;

const BASE = 32; // quanta per axis stay far below this
const stateKey = (n: readonly number[]): number => n.reduce((k, x, i) => k + x * BASE ** i, 0);
const stateOf = (key: number): number[] => Array.from({ length: 6 }, (_, i) => Math.floor(key / BASE ** i) % BASE);

/** (a + a†)^k |n) on unnormalised states: target quanta → integer coefficient. */
const ladderCache = new Map<string, Array<[number, number]>>();
function ladderPower(k: number, n: number): Array<[number, number]> {
  const key = `${k},${n}`;
  const hit = ladderCache.get(key);
  if (hit) return hit;
  let v = new Map<number, number>([[n, 1]]);
  for (let step = 0; step < k; step++) {
    const next = new Map<number, number>();
    for (const [j, c] of v) {
      if (j > 0) next.set(j - 1, (next.get(j - 1) ?? 0) + c * j);
      next.set(j + 1, (next.get(j + 1) ?? 0) + c);
    }
    v = next;
  }
  const out = [...v].filter(([, c]) => c !== 0);
  ladderCache.set(key, out);
  return out;
}

/** Add the monomial of one moment q s^p (its sign −1 is applied by the caller) to the exponents e. */
function momentMonomial(table: SymbolTable, centre: Centre, p: Monomial, e: number[]): void {
  e[table.q[centre]] += 1;
  for (let axis = 0; axis < 3; axis++) e[table.s[centre][axis]] += p[axis];
}

/** Apply the product of one moment on each centre, c · M^A_pA M^B_pB (pA or pB may be null), to v. */
function applyMoments(table: SymbolTable, v: SymbolicVector, parts: Array<{ c: Fraction; pA: Monomial | null; pB: Monomial | null }>): SymbolicVector {
  const out: SymbolicVector = new Map();
  const n = table.symbols.length;
  const factors = parts.map(({ c, pA, pB }) => {
    const e = new Array<number>(n).fill(0);
    let sign = 1;
    if (pA) {
      momentMonomial(table, 'a', pA, e);
      sign = -sign;
    }
    if (pB) {
      momentMonomial(table, 'b', pB, e);
      sign = -sign;
    }
    return { term: { c: c.mul(sign), e, den: [] } as Term, p: [...(pA ?? [0, 0, 0]), ...(pB ?? [0, 0, 0])] };
  });
  for (const [key, amp] of v) {
    const state = stateOf(key);
    for (const { term, p } of factors) {
      // Targets of the six independent ladder powers, combined.
      let targets: Array<{ n: number[]; k: number }> = [{ n: [], k: 1 }];
      for (let i = 0; i < 6; i++) {
        const next: Array<{ n: number[]; k: number }> = [];
        for (const t of targets) for (const [j, c] of ladderPower(p[i], state[i])) next.push({ n: [...t.n, j], k: t.k * c });
        targets = next;
      }
      for (const { n: target, k } of targets) {
        const tk = stateKey(target);
        let dest = out.get(tk);
        if (!dest) out.set(tk, (dest = new Map()));
        const scaled = { c: term.c.mul(k), e: term.e, den: term.den };
        for (const t of amp.values()) accumulate(dest, mulTerms(t, scaled));
      }
    }
  }
  for (const [k, a] of out) if (a.size === 0) out.delete(k);
  return out;
}

/** V_n |v> (R = 1). */
const applyCoupling = (table: SymbolTable, order: number, v: SymbolicVector): SymbolicVector =>
  applyMoments(table, v, couplingTerms(order).map((t) => ({ c: t.exact, pA: t.pA, pB: t.pB })));

/** The dipole component mu_axis of one centre, mu = −q r, on v. */
const applyDipole = (table: SymbolTable, centre: Centre, axis: number, v: SymbolicVector): SymbolicVector =>
  applyMoments(table, v, [{ c: new Fraction(1), pA: centre === 'a' ? AXIS_MONOMIALS[axis] : null, pB: centre === 'b' ? AXIS_MONOMIALS[axis] : null }]);

/** The reduced resolvent: drop the ground state, divide each state by its excitation energy Σ n_i w_i. */
function reducedResolvent(table: SymbolTable, v: SymbolicVector): SymbolicVector {
  const out: SymbolicVector = new Map();
  const n = table.symbols.length;
  for (const [key, amp] of v) {
    if (key === 0) continue;
    const state = stateOf(key);
    const form = new Array<number>(n).fill(0);
    for (let axis = 0; axis < 3; axis++) {
      form[table.w.a[axis]] += state[axis];
      form[table.w.b[axis]] += state[3 + axis];
    }
    const r = reciprocalLinear(form);
    const dest: Amplitude = new Map();
    for (const t of amp.values()) accumulate(dest, mulTerms(t, r));
    out.set(key, dest);
  }
  return out;
}


/** <u|v> = Σ_n u_n v_n (n|n), (n|n) = Π n_i!. */
function dot(u: SymbolicVector, v: SymbolicVector): Map<string, Term> {
  const out = new Map<string, Term>();
  for (const [key, a] of u) {
    const b = v.get(key);
    if (!b) continue;
    const norm = stateOf(key).reduce((p, x) => p * factorial(x), 1);
    for (const s of a.values()) for (const t of b.values()) {
      const st = mulTerms(s, t);
      accumulate(out, { c: st.c.mul(norm), e: st.e, den: st.den });
    }
  }
  return out;
}

/** Σ_i b_i·v_i, each scalar b_i a sum of terms (e.g. 1, or minus a ground-state expectation value). */
function linearCombination(parts: ReadonlyArray<readonly [Iterable<Term>, SymbolicVector]>): SymbolicVector {
  const out: SymbolicVector = new Map();
  for (const [scalar, v] of parts) {
    const b = [...scalar];
    for (const [key, amp] of v) {
      let dest = out.get(key);
      if (!dest) out.set(key, (dest = new Map()));
      for (const t of amp.values()) for (const s of b) accumulate(dest, mulTerms(t, s));
    }
  }
  for (const [k, a] of out) if (a.size === 0) out.delete(k);
  return out;
}

const negated = (sum: Map<string, Term>): Term[] => [...sum.values()].map((t) => ({ ...t, c: t.c.neg() }));

/** Replace every s^2k by (2 m w)^-k; an odd power of s is a programming error. */
function resolveLadders(table: SymbolTable, t: Term): Term {
  const e = [...t.e];
  let c = t.c;
  for (const c0 of ['a', 'b'] as const) {
    for (const si of new Set(table.s[c0])) {
      const k = e[si];
      if (k === 0) continue;
      if (k % 2 !== 0) throw new Error(`internal: odd power of a ladder length in a closed bracket`);
      const { m, w } = table.ladderOf(si)!;
      e[si] = 0;
      e[m] -= k / 2;
      e[w] -= k / 2;
      c = c.mul(new Fraction(2).pow(-k / 2));
    }
  }
  return { c, e, den: t.den };
}

/**
 * Exact quantities of the symbolic engine as sums of terms in q, m, w (ladder lengths resolved, like terms
 * merged, not yet over a common denominator: see closedFormFromTerms).
 */
export interface SymbolicCoefficients {
  C6?: Term[];
  C8?: Term[];
  C10?: Term[];
  /** lim R^7 <mu_z> on A and on B (e a0^8). */
  D7a?: Term[];
  D7b?: Term[];
  /** The R^-9 coefficient of <mu_z> on A and on B (e a0^10): the chains V2·V5 and V3·V4. */
  D9a?: Term[];
  D9b?: Term[];
}

export interface SymbolicRequest {
  energyPowers: ReadonlyArray<6 | 8 | 10>;
  /** D7 (the V2·V3 chain). */
  dipoles: boolean;
  /** D9 (the V2·V5 and V3·V4 chains; V2·V5 is skipped for isotropic layouts, where it vanishes by symmetry). */
  dipoles9?: boolean;
}

/** Run the symbolic chains for the requested quantities. */
export function symbolicCoefficients(table: SymbolTable, request: SymbolicRequest): SymbolicCoefficients {
  const unit: Term = { c: new Fraction(1), e: new Array<number>(table.symbols.length).fill(0), den: [] };
  const ground: SymbolicVector = new Map([[0, new Map([[termKey(unit), unit]])]]);
  const V0 = new Map<number, SymbolicVector>();
  const phi = new Map<number, SymbolicVector>();
  const v0 = (n: number) => {
    let hit = V0.get(n);
    if (!hit) V0.set(n, (hit = applyCoupling(table, n, ground)));
    return hit;
  };
  const phiOf = (n: number) => {
    let hit = phi.get(n);
    if (!hit) phi.set(n, (hit = reducedResolvent(table, v0(n))));
    return hit;
  };
  const finish = (sum: Iterable<Term>): Term[] => {
    const merged = new Map<string, Term>();
    for (const t of sum) accumulate(merged, resolveLadders(table, t));
    return [...merged.values()];
  };
  const expectation = (v: SymbolicVector) => dot(ground, v);

  const out: SymbolicCoefficients = {};
  for (const power of request.energyPowers) {
    const all: Term[] = [];
    for (let n = 2; n <= power - 4; n++) all.push(...dot(v0(n), phiOf(power - 2 - n)).values());
    out[`C${power}`] = finish(all);
  }
  /** The coefficient of λ_n λ_n' in <mu_z> (the same expression as rspt.ts), as raw terms per centre. */
  const mixed = (n: number, np: number) => {
    const phiN = phiOf(n);
    const phiNp = phiOf(np);
    const one = [unit];
    const source = linearCombination([
      [one, applyCoupling(table, n, phiNp)],
      [negated(expectation(v0(n))), phiNp],
      [one, applyCoupling(table, np, phiN)],
      [negated(expectation(v0(np))), phiN],
    ]);
    const psi = reducedResolvent(table, source);
    const overlap = dot(phiN, phiNp);
    return (centre: Centre): Term[] => {
      const mu0 = applyDipole(table, centre, 2, ground);
      const all: Term[] = [];
      const twice = (t: Term): Term => ({ ...t, c: t.c.mul(2) });
      for (const t of dot(mu0, psi).values()) all.push(twice(t));
      for (const t of dot(phiN, applyDipole(table, centre, 2, phiNp)).values()) all.push(twice(t));
      for (const s of negated(expectation(mu0))) for (const t of overlap.values()) all.push(mulTerms(twice(t), s));
      return all;
    };
  };
  if (request.dipoles) {
    const d7 = mixed(2, 3);
    out.D7a = finish(d7('a'));
    out.D7b = finish(d7('b'));
  }
  if (request.dipoles9) {
    // V2·V5 vanishes for spherical centres (exact/series-terms.ts); computed only for anisotropic layouts
    const chains = table.layout.anisotropic ? [mixed(2, 5), mixed(3, 4)] : [mixed(3, 4)];
    out.D9a = finish(chains.flatMap((f) => f('a')));
    out.D9b = finish(chains.flatMap((f) => f('b')));
  }
  return out;
}
