/**
 * Least-squares fits of a function of R to a series in 1/R with chosen exponents,
 *   y(R) ≈ Σ_k c_k R^-e_k,
 * and the powers of 1/R that the exact energy and dipoles can contain (derived here). H0 is separately even under
 * r_A → −r_A and under r_B → −r_B; a coupling term of V_n with degrees (pA, pB) has those parities and falls off
 * as R^-(n+1). A term of the perturbation series built from couplings t_1 … t_k falls off as R^-Σ(n_i+1) and
 * survives only if the total parities match the observable (k ≥ 2 for spherical centres, whose first-order terms
 * vanish; k ≥ 1 for anisotropic ones, whose permanent moments give E5, E7, … and D4, D6, …):
 * both even for the energy, (odd, even) for mu_A,z, (even, odd) for mu_B,z. For order 4 this gives
 *   R^6 ΔE = −C6 − C8 R^-2 − c4 R^-4 − c5 R^-5 − …     (no R^-7, R^-9 energy terms)
 *   R^7 mu = D7 + d2 R^-2 + d3 R^-3 + …                 (no R^-8 dipole term).
 * The columns are scaled by (R_min/R)^e so the least-squares problem is well conditioned; solved by Householder QR.
 */
import { mlMatrixModule } from '../../lazy-modules.js';

/** Which observable a series describes: its parities under r_A → −r_A and under r_B → −r_B. */
export type SeriesObservable = 'energy' | 'muA' | 'muB';

/**
 * The powers p of R^-p that occur in the observable for couplings through `order`, up to `maxPower`, ascending
 * (see above). The first is the leading power: 6 for the energy, 7 for the dipoles (5 and 4 with `firstOrder`,
 * for centres with permanent moments).
 */
export function seriesPowers(order: number, observable: SeriesObservable, maxPower: number, firstOrder = false): number[] {
  const want = observable === 'energy' ? [0, 0] : observable === 'muA' ? [1, 0] : [0, 1];
  const kinds = new Set<string>();
  for (let n = 2; n <= order; n++) for (let pA = 1; pA < n; pA++) kinds.add(`${n + 1},${pA % 2},${(n - pA) % 2}`);
  const couplings = [...kinds].map((k) => k.split(',').map(Number));
  let states = new Set<string>(['0,0,0']);
  const found = new Set<number>();
  for (let k = 1; states.size > 0; k++) {
    const next = new Set<string>();
    for (const st of states) {
      const [p, a, b] = st.split(',').map(Number);
      for (const [dp, da, db] of couplings) {
        const q = p + dp;
        if (q > maxPower) continue;
        const sa = (a + da) % 2, sb = (b + db) % 2;
        next.add(`${q},${sa},${sb}`);
        if ((k >= 2 || firstOrder) && sa === want[0] && sb === want[1]) found.add(q);
      }
    }
    states = next;
  }
  return [...found].sort((x, y) => x - y);
}

export interface SeriesFit {
  exponents: number[];
  /** c_k of y ≈ Σ c_k R^-e_k. */
  coefficients: number[];
  /** Largest |fit − y| over the points. */
  maxResidual: number;
}

/** Fit y(R) ≈ Σ_k c_k R^-e_k by least squares (needs at least as many points as exponents). */
export function fitInverseSeries(R: readonly number[], y: readonly number[], exponents: readonly number[]): SeriesFit {
  if (R.length !== y.length || R.length < exponents.length) throw new RangeError('need at least as many points as terms');
  const { Matrix, QrDecomposition } = mlMatrixModule();
  const R0 = Math.min(...R);
  const rows = R.map((r) => exponents.map((e) => (R0 / r) ** e));
  const scaled = new QrDecomposition(new Matrix(rows)).solve(Matrix.columnVector([...y])).to1DArray();
  const coefficients = scaled.map((c, k) => c * R0 ** exponents[k]);
  let maxResidual = 0;
  rows.forEach((row, i) => {
    const f = row.reduce((s, v, k) => s + v * scaled[k], 0);
    maxResidual = Math.max(maxResidual, Math.abs(f - y[i]));
  });
  return { exponents: [...exponents], coefficients, maxResidual };
}
