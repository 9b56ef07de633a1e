/**
 * The lowest eigenpair of a large sparse real symmetric matrix by Davidson's method with the diagonal
 * preconditioner (E. R. Davidson, J. Comput. Phys. 17, 87 (1975)): grow an orthonormal subspace V, take the
 * lowest Ritz pair (θ, x) of V^T A V, and add the correction t = (D − θ)^-1 r of the residual r = A x − θ x.
 * It suits the pair Hamiltonian, whose diagonal (the unperturbed excitation energies) dominates.
 * Typed arrays throughout; the small subspace matrix is diagonalised by the dense solver of src/math.
 */
import { symmetricEigen } from '../../math/symmetric-eigen.js';

export interface SymmetricOperator {
  size: number;
  /** y = A x (y is overwritten). */
  apply(x: Float64Array, y: Float64Array): void;
  /** The diagonal of A (for the preconditioner). */
  diagonal: Float64Array;
}

export interface DavidsonOptions {
  /** Stop when ||A x − θ x|| ≤ tolerance (x normalised). Default 1e-13. */
  tolerance?: number;
  /** Largest number of matrix–vector products. Default 400. */
  maxIterations?: number;
  /** Subspace size at which the method restarts from the current Ritz vector. Default 24. */
  maxSubspace?: number;
  /** Start vector (need not be normalised); default the unit vector of the smallest diagonal element. */
  initial?: Float64Array;
}

export interface DavidsonResult {
  value: number;
  /** Normalised eigenvector. */
  vector: Float64Array;
  /** ||A x − θ x||, recomputed from scratch at the end. */
  residualNorm: number;
  iterations: number;
  converged: boolean;
}

const dot = (u: Float64Array, v: Float64Array): number => {
  let s = 0;
  for (let i = 0; i < u.length; i++) s += u[i] * v[i];
  return s;
};

/** Orthogonalise t against the (orthonormal) vectors twice and normalise; returns the norm before normalising. */
function orthonormalise(t: Float64Array, basis: readonly Float64Array[]): number {
  const before = Math.sqrt(dot(t, t));
  for (let pass = 0; pass < 2; pass++)
    for (const v of basis) {
      const c = dot(v, t);
      for (let i = 0; i < t.length; i++) t[i] -= c * v[i];
    }
  const norm = Math.sqrt(dot(t, t));
  if (norm > 0) for (let i = 0; i < t.length; i++) t[i] /= norm;
  return before > 0 ? norm / before : 0;
}

/** Lowest eigenpair of `A`. */
export function davidsonLowest(A: SymmetricOperator, options: DavidsonOptions = {}): DavidsonResult {
  const n = A.size;
  const tol = options.tolerance ?? 1e-13;
  const maxIter = options.maxIterations ?? 400;
  const maxSub = Math.max(4, Math.min(options.maxSubspace ?? 24, n));
  const D = A.diagonal;

  let start = new Float64Array(n);
  if (options.initial && options.initial.length === n && dot(options.initial, options.initial) > 0) start.set(options.initial);
  else {
    let k = 0;
    for (let i = 1; i < n; i++) if (D[i] < D[k]) k = i;
    start[k] = 1;
  }
  orthonormalise(start, []);

  let V: Float64Array[] = [];
  let AV: Float64Array[] = [];
  let S: number[][] = [];
  const push = (v: Float64Array) => {
    const av = new Float64Array(n);
    A.apply(v, av);
    V.push(v);
    AV.push(av);
    const row = V.map((u) => dot(u, av));
    S.forEach((r, i) => r.push(row[i]));
    S.push(row);
  };
  push(start);
  let iterations = 1;
  let theta = 0;
  let x = start;
  const r = new Float64Array(n);
  let residual = Infinity;

  for (;;) {
    const k = S.length;
    const eig = symmetricEigen(Float64Array.from(S.flat()), k);
    theta = eig.values[0];
    const y = Float64Array.from({ length: k }, (_, j) => eig.vectors![j * k]);
    x = new Float64Array(n);
    r.fill(0);
    for (let j = 0; j < V.length; j++) {
      const vj = V[j], avj = AV[j], yj = y[j];
      for (let i = 0; i < n; i++) {
        x[i] += yj * vj[i];
        r[i] += yj * avj[i];
      }
    }
    for (let i = 0; i < n; i++) r[i] -= theta * x[i];
    residual = Math.sqrt(dot(r, r));
    if (residual <= tol || iterations >= maxIter || V.length >= n) break;

    const t = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const d = D[i] - theta;
      t[i] = r[i] / (Math.abs(d) > 1e-8 ? d : d >= 0 ? 1e-8 : -1e-8);
    }
    if (V.length >= maxSub) {
      // restart from the Ritz vector (A x recomputed, so rounding does not accumulate)
      orthonormalise(x, []);
      V = [];
      AV = [];
      S = [];
      push(x);
      iterations++;
    }
    if (orthonormalise(t, V) < 1e-14) break; // no new direction: stagnated at the rounding level
    push(t);
    iterations++;
  }

  // final check from scratch
  const vector = x;
  orthonormalise(vector, []);
  const Ax = new Float64Array(n);
  A.apply(vector, Ax);
  const value = dot(vector, Ax);
  for (let i = 0; i < n; i++) r[i] = Ax[i] - value * vector[i];
  const residualNorm = Math.sqrt(dot(r, r));
  return { value, vector, residualNorm, iterations, converged: residualNorm <= tol };
}

/**
 * Polish an eigenvector of a diagonally dominant matrix by preconditioned fixed-point sweeps
 * x_i ← x_i − r_i/(D_i − θ) for every i but the dominant component, θ the Rayleigh quotient (the
 * Jacobi iteration of intermediate-normalised perturbation theory; common practice). Unlike the subspace
 * mixing of Davidson, each component is corrected with the relative precision of its own size, so small
 * components (such as the R^-7 dipole amplitudes at large R) come out with all their digits.
 * The residual norm is ruled by the large components and stalls at their rounding level while the small ones
 * may still be settling, so the sweeps go on for `extraSweeps` after the norm stops halving — or, when the caller
 * names the quantities it needs (`watch`: values of the normalised vector, e.g. expectation values), only until
 * those have stopped changing (by at most a few units of rounding, two sweeps running) and the norm has stalled.
 * It stops early if the sweeps diverge (strong coupling) and then returns the best vector seen.
 */
export function polishEigenvector(
  A: SymmetricOperator,
  start: DavidsonResult,
  tolerance: number,
  {
    maxSweeps = 80,
    extraSweeps = 8,
    watch,
  }: { maxSweeps?: number; extraSweeps?: number; watch?: (x: Float64Array, norm2: number) => readonly number[] } = {},
): DavidsonResult {
  const n = A.size;
  const D = A.diagonal;
  let best = start;
  let k = 0;
  for (let i = 1; i < n; i++) if (Math.abs(start.vector[i]) > Math.abs(start.vector[k])) k = i;
  const x = Float64Array.from(start.vector);
  const Ax = new Float64Array(n);
  let previous = start.residualNorm;
  let lowest = start.residualNorm;
  let stalled = 0;
  let watched: readonly number[] | undefined;
  let steady = 0;
  const bestVector = new Float64Array(n); // the best vector so far, overwritten in place
  for (let sweep = 1; sweep <= maxSweeps; sweep++) {
    A.apply(x, Ax);
    const norm2 = dot(x, x);
    const theta = dot(x, Ax) / norm2;
    let res2 = 0;
    for (let i = 0; i < n; i++) res2 += (Ax[i] - theta * x[i]) ** 2;
    const residualNorm = Math.sqrt(res2 / norm2);
    if (residualNorm > 10 * lowest) break; // diverging
    lowest = Math.min(lowest, residualNorm);
    if (residualNorm <= 2 * lowest) {
      const scale = 1 / Math.sqrt(norm2);
      for (let i = 0; i < n; i++) bestVector[i] = x[i] * scale;
      best = {
        value: theta,
        vector: bestVector,
        residualNorm,
        iterations: start.iterations + sweep,
        converged: residualNorm <= tolerance,
      };
    }
    stalled = residualNorm < 0.5 * previous ? 0 : stalled + 1;
    if (stalled > extraSweeps) break;
    if (watch) {
      const now = watch(x, norm2);
      const size = Math.max(...now.map(Math.abs));
      const still = watched !== undefined && now.every((v, i) => Math.abs(v - watched![i]) <= 8 * Number.EPSILON * size);
      steady = still ? steady + 1 : 0;
      watched = now;
      // only once the residual has stalled too: before that the small components are still settling
      if (steady >= 2 && stalled > 0 && best.iterations === start.iterations + sweep) break;
    }
    previous = Math.min(previous, residualNorm);
    for (let i = 0; i < n; i++) {
      if (i === k) continue;
      const d = D[i] - theta;
      if (Math.abs(d) > 1e-8) x[i] -= (Ax[i] - theta * x[i]) / d;
    }
  }
  return best;
}
