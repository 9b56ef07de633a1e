/**
 * The fused matrix elements of the perturbation route give the numbers of the two-step formulas they replace
 * (derived here: <w|V|v> = dot(V|v>, w) and <w|M_p|v> = dot(w, M_p|v>), the same products summed in another order),
 * to 1e-13 relative on seeded random QDO pairs (isotropic and anisotropic) and on a hydrogen pair's pseudo-states.
 * The vectors are the ones the route uses: φ_n = R0 V_n|0> and χ = R0 M_p|0>.
 */
import { describe, expect, test } from 'vitest';
import { hydrogenic } from '../../src/model/hydrogenic.js';
import { couplingTerms } from '../../src/hamiltonian/multipole-coupling.js';
import { AXIS_MONOMIALS } from '../../src/hamiltonian/monomial.js';
import { applyCoupling, applyLocal, dot, groundState, reducedResolvent } from '../../src/engines/perturbation/product-vector.js';
import { couplingDot, localDot } from '../helpers/map-matrix-elements.js';
import type { LocalSpace } from '../../src/engines/perturbation/local-space.js';
import { localSpaceOf } from '../../src/engines/capabilities.js';
import { relDiff } from '../helpers/tolerance.js';
import { seededRandom } from '../helpers/random.js';
import { randomDrude } from '../helpers/random-species.js';

const TOL = 1e-13;


/** Every fused element the route forms for the chains (n, n') against its two-step reference. */
function checkPair(A: LocalSpace, B: LocalSpace): number {
  const zero = groundState();
  const phi = new Map([2, 3, 4, 5].map((n) => [n, reducedResolvent(applyCoupling(couplingTerms(n), zero, A, B), A, B)]));
  let checked = 0;
  for (const [n, np] of [[2, 3], [2, 5], [3, 4]] as const) {
    for (const on of ['a', 'b'] as const) {
      for (const p of AXIS_MONOMIALS) {
        const chi = reducedResolvent(applyLocal(p, on, zero, A, B), A, B);
        const fused = couplingDot(couplingTerms(n), chi, phi.get(np)!, A, B);
        const twoStep = dot(applyCoupling(couplingTerms(n), chi, A, B), phi.get(np)!);
        const local = localDot(p, on, phi.get(n)!, phi.get(np)!, A, B);
        const localRef = dot(phi.get(n)!, applyLocal(p, on, phi.get(np)!, A, B));
        // elements that vanish by symmetry come out as rounding residue: compare against the scale of the sum
        const scale = Math.max(Math.abs(twoStep), 1e-3 * Math.sqrt(dot(chi, chi) * dot(phi.get(np)!, phi.get(np)!)));
        expect(Math.abs(fused - twoStep) / scale).toBeLessThan(TOL);
        if (Math.abs(localRef) > 1e-8) expect(relDiff(local, localRef)).toBeLessThan(TOL);
        else expect(Math.abs(local - localRef)).toBeLessThan(1e-15 * Math.sqrt(dot(phi.get(n)!, phi.get(n)!) * dot(phi.get(np)!, phi.get(np)!)));
        checked++;
      }
    }
  }
  return checked;
}

describe('fused product-vector matrix elements equal the two-step formulas', () => {
  test('random QDO pairs, 3 quanta per centre', () => {
    const rand = seededRandom(1617);
    for (let k = 0; k < 3; k++) {
      const A = localSpaceOf(randomDrude(rand, 'A', k !== 1), 3), B = localSpaceOf(randomDrude(rand, 'B', k !== 2), 3);
      expect(checkPair(A, B)).toBe(18);
    }
  });

  test('a hydrogen pair (pseudo-state spaces)', () => {
    const H = hydrogenic({ Z: 1 }, 'H');
    const A = localSpaceOf(H, 3);
    expect(checkPair(A, A)).toBe(18);
  });
});
