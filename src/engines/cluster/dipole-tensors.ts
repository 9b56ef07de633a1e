/**
 * Interaction tensors of point multipoles, derivatives of 1/R at R = R_j − R_i (bohr; common practice, e.g.
 * A. J. Stone, The Theory of Intermolecular Forces, 2nd ed. 2013, ch. 3):
 *   T2_ab  = ∂a∂b (1/R)    = (3 R_a R_b − R² δ_ab) / R^5
 *   T3_abc = ∂a∂b∂c (1/R)  = −15 R_a R_b R_c / R^7 + 3 (R_a δ_bc + R_b δ_ac + R_c δ_ab) / R^5
 * For two QDOs (Drude displacements r_i, r_j; M = −q r) the Taylor expansion of the four-charge Coulomb energy gives
 *   V_dd = −q_i q_j r_iᵀ T2 r_j                     (for R along z: q_i q_j (x_i x_j + y_i y_j − 2 z_i z_j)/R³)
 *   V_dq = (q_i q_j / 2) T3_abc (r_i,a r_i,b r_j,c − r_j,a r_j,b r_i,c)
 * (derived here from V = q_i q_j [g(0) − g(r_j) − g(−r_i) + g(r_j − r_i)], g(d) = 1/|R + d|; the tests check both
 * against src/hamiltonian/multipole-coupling.ts for R along z).
 */
import type { Vec3 } from '../../model/types.js';

/** The dipole–dipole coupling block −T2(R) = (R² δ_ab − 3 R_a R_b)/R^5 (row-major 3×3), so V_dd = q_i q_j r_iᵀ K r_j. */
export function dipoleCouplingBlock(R: Readonly<Vec3>): Float64Array {
  const out = new Float64Array(9);
  writeDipoleCouplingBlock(R, 1, out, 0, 3);
  return out;
}

/**
 * Write f·(R² δ_ab − 3 R_a R_b)/R^5 into `out` at out[offset + a·stride + b] (a, b = 0…2), in place: a large
 * matrix is assembled block by block without allocating a 3×3 array per pair.
 */
export function writeDipoleCouplingBlock(R: Readonly<Vec3>, f: number, out: Float64Array, offset: number, stride: number): void {
  const r2 = R[0] * R[0] + R[1] * R[1] + R[2] * R[2];
  const g = f / (r2 * r2 * Math.sqrt(r2));
  for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) out[offset + a * stride + b] = g * ((a === b ? r2 : 0) - 3 * R[a] * R[b]);
}

/** T3_abc(R) as a 27-entry array, index 9a + 3b + c. */
export function thirdDerivativeTensor(R: Vec3): Float64Array {
  const r2 = R[0] * R[0] + R[1] * R[1] + R[2] * R[2];
  const r = Math.sqrt(r2);
  const r5 = r2 * r2 * r, r7 = r5 * r2;
  const out = new Float64Array(27);
  for (let a = 0; a < 3; a++)
    for (let b = 0; b < 3; b++)
      for (let c = 0; c < 3; c++) {
        const delta = (a === b ? R[c] : 0) + (a === c ? R[b] : 0) + (b === c ? R[a] : 0);
        out[9 * a + 3 * b + c] = (-15 * R[a] * R[b] * R[c]) / r7 + (3 * delta) / r5;
      }
  return out;
}
