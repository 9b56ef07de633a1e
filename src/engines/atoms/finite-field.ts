/**
 * Finite-field ground state of a one-electron atom in a static field F along z: H = H0 + F z (electron charge −1,
 * so H = H0 − F M_z), diagonalised in the m = 0 pseudo-states of all l ≤ lMax. An independent check of the
 * sum-over-states response: with Buckingham's energy −(1/4) B F² g for an axial field gradient g (coupling
 * −½ g Q_20), Hellmann–Feynman gives the induced quadrupole <Q_20>(F) = ½ B F² + O(F⁴), so
 *   B = lim 2 <Q_20>(F) / F²,   alpha = −lim 2 (E(F) − E(0)) / F²   (derived here; Buckingham convention).
 * The sign of B follows the elongation of the electron cloud along the field: <r² P2> > 0 makes Q_20 < 0.
 */
import { symmetricEigen } from '../../math/symmetric-eigen.js';
import { legendreCoupling } from './angular.js';
import type { RadialPseudoSpectrum } from './sturmian-spectrum.js';

export interface FiniteFieldState {
  /** Ground-state energy in the field, hartree. */
  energy: number;
  /** <Q_20> = −<r² P2(cos θ)>, e·a0². */
  Q20: number;
}

/** Ground state of H0 + F z in the pseudo-state basis (m = 0, l = 0 … lMax). */
export function finiteFieldGroundState(s: RadialPseudoSpectrum, F: number): FiniteFieldState {
  const { size, lMax } = s;
  const dim = size * (lMax + 1);
  const H = new Float64Array(dim * dim);
  const idx = (l: number, n: number) => l * size + n;
  for (let l = 0; l <= lMax; l++) for (let n = 0; n < size; n++) H[idx(l, n) * dim + idx(l, n)] = s.energies[l][n];
  for (let l = 0; l < lMax; l++) {
    const R = s.radial(l + 1, l, 1);
    const c = legendreCoupling(l + 1, 1, l);
    for (let a = 0; a < size; a++)
      for (let b = 0; b < size; b++) {
        const v = F * R[a * size + b] * c;
        H[idx(l + 1, a) * dim + idx(l, b)] = v;
        H[idx(l, b) * dim + idx(l + 1, a)] = v;
      }
  }
  const eig = symmetricEigen(H, dim);
  const psi = Float64Array.from({ length: dim }, (_, i) => eig.vectors![i * dim]); // lowest eigenvalue first
  let r2p2 = 0;
  for (let l = 0; l <= lMax; l++)
    for (let lp = l >= 2 ? l - 2 : l; lp <= Math.min(lMax, l + 2); lp += 2) {
      const c = legendreCoupling(lp, 2, l);
      if (c === 0) continue;
      const R = s.radial(lp, l, 2);
      for (let a = 0; a < size; a++) for (let b = 0; b < size; b++) r2p2 += psi[idx(lp, a)] * R[a * size + b] * c * psi[idx(l, b)];
    }
  return { energy: eig.values[0], Q20: -r2p2 };
}
