/**
 * The local state space of a one-electron atom from a radial pseudo-spectrum: states |n l m> = u_nl(r)/r S_lm(r̂)
 * (real spherical harmonics, l ≤ lMax), index ((l² + l + m) · size + n), ground state 1s = index 0.
 *
 * A moment M_p = −x^p0 y^p1 z^p2 (electron charge −1; the nucleus sits at the origin and adds nothing for
 * |p| ≥ 1) acts as
 *   M_p |n l m> = −Σ_{n' l' m'} |n' l' m'> <n' l'| r^|p| |n l> <l' m'| x̂^p0 ŷ^p1 ẑ^p2 |l m>,
 * the radial factor from the pseudo-spectrum, the angular one exact (angular.ts). Components with l' > lMax are
 * dropped: the truncated space is an orthogonal projection, so sums over states stay variational-consistent.
 * For the pair coefficients up to C10 and D7 of spherical atoms lMax = 3 loses nothing: an order-n coupling
 * excites harmonic (pure-l) combinations l_A + l_B = n on the ground state, C6…C10 pair only n ≤ 4, and the D7
 * chain (V2, V3, then a dipole) reaches l ≤ 3 (derived here).
 */
import { type Monomial, degree, monomialKey } from '../../hamiltonian/monomial.js';
import type { LocalEntries, LocalSpace } from '../perturbation/local-space.js';
import { angularTerms, harmonicIndex } from './angular.js';
import type { RadialPseudoSpectrum } from './sturmian-spectrum.js';

/** Decode a state index into (l, m, n). */
export function pseudoStateQuanta(i: number, size: number): { l: number; m: number; n: number } {
  const h = Math.floor(i / size);
  const n = i - h * size;
  const l = Math.floor(Math.sqrt(h));
  return { l, m: h - l * l - l, n };
}

/** Index of |n l m>. */
export const pseudoStateIndex = (l: number, m: number, n: number, size: number): number => harmonicIndex(l, m) * size + n;

/** The perturbation-route state space of a one-electron atom with this pseudo-spectrum. */
export function pseudoStateSpace(spectrum: RadialPseudoSpectrum): LocalSpace {
  const { size, lMax, energies } = spectrum;
  const e0 = energies[0][0];
  const cache = new Map<number, LocalEntries>();
  return {
    excitation(i) {
      const { l, n } = pseudoStateQuanta(i, size);
      return i === 0 ? 0 : energies[l][n] - e0;
    },
    applyMoment(p: Monomial, i: number): LocalEntries {
      const key = monomialKey(p) * 2 ** 20 + i;
      const hit = cache.get(key);
      if (hit) return hit;
      const { l, m, n } = pseudoStateQuanta(i, size);
      const k = degree(p);
      const states: number[] = [];
      const amps: number[] = [];
      for (const t of angularTerms(p, l, m, lMax)) {
        const R = spectrum.radialColumn(t.l, l, k, n);
        const base = pseudoStateIndex(t.l, t.m, 0, size);
        for (let np = 0; np < size; np++) {
          const amp = -t.value * R[np];
          if (amp === 0) continue;
          states.push(base + np);
          amps.push(amp);
        }
      }
      const entries = { states, amps };
      cache.set(key, entries);
      return entries;
    },
  };
}
