/**
 * The multipole couplings rewritten in the circular coordinates ρ± = x ± i y of each centre.
 *
 * Substituting x = (ρ+ + ρ−)/2 and y = (ρ+ − ρ−)/(2i) into c · x_A^a y_A^b z_A^c x_B^a' y_B^b' z_B^c'
 * (the Cartesian terms of {@link couplingTerms}) gives terms c' ρ+A^p ρ−A^q z_A^r ρ+B^p' ρ−B^q' z_B^r'. The
 * interaction is invariant under a joint rotation about the axis, so every surviving term has
 * (p − q) + (p' − q') = 0 (it conserves L_z of the pair), and under the joint mirror y → −y, so only even total
 * powers of y occur and every c' is real. Both facts are checked here in exact rational arithmetic (derived here).
 */
import Fraction from 'fraction.js';
import { couplingTerms } from '../../hamiltonian/multipole-coupling.js';
import type { CircularMonomial } from './circular-states.js';
import { binomial } from '../../math/combinatorics.js';

/** One term c · (ρ+^p ρ−^q z^r)_A (ρ+^p ρ−^q z^r)_B of the order-n coupling (factor qA qB / R^(n+1) kept apart). */
export interface CircularCouplingTerm {
  exact: Fraction;
  c: number;
  a: CircularMonomial;
  b: CircularMonomial;
  order: number;
}


/** x^a y^b = (−i)^b Σ coef ρ+^P ρ−^Q; returns the real coefficients (the (−i)^b factor is applied by the caller). */
function planarExpansion(a: number, b: number): Array<{ coef: Fraction; p: number; q: number }> {
  const out = new Map<number, { coef: Fraction; p: number; q: number }>();
  const scale = new Fraction(1, 2 ** (a + b));
  for (let j = 0; j <= a; j++)
    for (let k = 0; k <= b; k++) {
      const p = j + k;
      const q = a - j + b - k;
      const coef = scale.mul(binomial(a, j) * binomial(b, k) * ((b - k) % 2 === 0 ? 1 : -1));
      const prev = out.get(p);
      out.set(p, { coef: prev ? prev.coef.add(coef) : coef, p, q });
    }
  return [...out.values()];
}

const cache = new Map<number, CircularCouplingTerm[]>();

/** The order-n coupling in circular coordinates; throws if a term would break L_z or reality (a programming error). */
export function circularCouplingTerms(order: number): CircularCouplingTerm[] {
  const hit = cache.get(order);
  if (hit) return hit;
  const sum = new Map<string, { exact: Fraction; a: CircularMonomial; b: CircularMonomial }>();
  for (const t of couplingTerms(order)) {
    const yPower = t.pA[1] + t.pB[1];
    if (yPower % 2 !== 0) throw new Error(`coupling term with odd y power ${yPower}: not mirror symmetric`);
    const phase = (yPower / 2) % 2 === 0 ? 1 : -1; // (−i)^(bA + bB)
    for (const ea of planarExpansion(t.pA[0], t.pA[1]))
      for (const eb of planarExpansion(t.pB[0], t.pB[1])) {
        const a: CircularMonomial = [ea.p, ea.q, t.pA[2]];
        const b: CircularMonomial = [eb.p, eb.q, t.pB[2]];
        const key = `${a.join(',')};${b.join(',')}`;
        const c = t.exact.mul(ea.coef).mul(eb.coef).mul(phase);
        const prev = sum.get(key);
        sum.set(key, { exact: prev ? prev.exact.add(c) : c, a, b });
      }
  }
  const out: CircularCouplingTerm[] = [];
  for (const { exact, a, b } of sum.values()) {
    if (exact.equals(0)) continue;
    if (a[0] - a[1] + b[0] - b[1] !== 0) throw new Error(`coupling term ${a}|${b} changes L_z: the expansion is wrong`);
    out.push({ exact, c: exact.valueOf(), a, b, order });
  }
  cache.set(order, out);
  return out;
}
