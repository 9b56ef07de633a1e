/**
 * Dense real symmetric eigensolver on typed arrays, for matrices of a few thousand rows (row-major Float64Array).
 *
 * Steps (standard; G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed. 2013, §8.3–8.4; LAPACK dsytrd,
 * dsterf, dstein, dormtr):
 *  1. Householder reduction to tridiagonal form, Q^T A Q = T, with the symmetric rank-2 update of step k fused
 *     into the matrix–vector product of step k + 1 (one pass over the trailing lower triangle per step, split into
 *     row chunks shared by the threads);
 *  2. eigenvalues of T by the implicit QL method with Wilkinson-type shifts (tql2 of EISPACK / JAMA, without
 *     vectors);
 *  3. eigenvectors of T by inverse iteration (tridiagonal LU with partial pivoting), re-orthogonalised
 *     (modified Gram–Schmidt) inside clusters of close eigenvalues — orthogonality outside clusters is then of
 *     order ε‖T‖/gap ≤ ε / CLUSTER_GAP;
 *  4. back-transformation V = Q Z with the reflectors applied in blocks (compact WY form, I − U T Uᵀ), column
 *     chunks of Z shared by the threads.
 * Cost ≈ (4/3 + 2) n³ flops with vectors, (4/3) n³ without. The O(n³) loops are the SIMD kernels of
 * src/math/simd-kernels.ts on a shared WebAssembly memory; from order 500 they run on all cores
 * (src/math/thread-team.ts). The work split does not depend on the number of threads, so neither do the results.
 */
import { Workspace, type WasmMemory } from './simd-kernels.js';
import { ThreadTeam, withTeamFor } from './thread-team.js';

/** Eigenvalues (ascending) and, when asked for, eigenvectors: vectors[i·n + k] = component i of eigenvector k. */
export interface SymmetricEigenResult {
  n: number;
  values: Float64Array;
  vectors?: Float64Array;
}

export interface SymmetricEigenOptions {
  /** Compute eigenvectors too (default true). */
  vectors?: boolean;
  /** Called with a stage name and the fraction of that stage done (for progress indicators). */
  progress?: (stage: 'tridiagonalise' | 'eigenvectors' | 'back-transform', fraction: number) => void;
  /** Threads to run on (default: a team sized by src/math/thread-team.ts teamSizeFor(n), closed afterwards). */
  team?: ThreadTeam;
}

/** Consecutive eigenvalues closer than this (relative to ‖T‖) are one cluster and re-orthogonalised together. */
const CLUSTER_GAP = 1e-5;
const EPS = 2 ** -52;
/** Reflectors per WY block. */
const BLOCK = 32;
/** Columns of Z per back-transformation unit (W = Uᵀ Z of one block is then 32 KiB). */
const CHUNK_WIDTH = 128;
/** Rows of Z per pass of W = Uᵀ Z (a 256 KiB slab, re-read from cache by every pair of W rows). */
const SLAB = 256;
/** Eigenvectors per inverse-iteration unit (extended to the end of a cluster of close eigenvalues). */
const VECTORS_PER_UNIT = 48;
/** Tiles of the trailing update of the blocked tridiagonalisation (rows × columns). */
const UPDATE_TILE_ROWS = 64, UPDATE_TILE_COLS = 256;
/** Row chunks of one tridiagonalisation step; fixed so that the sums, hence the results, do not depend on the team. */
const PASS_CHUNKS = 4;
/** Steps (and trailing updates) with fewer trailing rows run on the calling thread alone (not worth sharing). */
const PASS_SPLIT_MIN = 256;
/** Workspaces up to this order are kept for the next call (many small problems, e.g. 6×6 pair modes). */
const KEEP_ORDER = 300;

let kept: { team: ThreadTeam; memory?: WasmMemory; busy: boolean } | undefined;

/** Eigen-decomposition of the symmetric n×n matrix `a` (row-major; only its lower triangle is read; not modified). */
export function symmetricEigen(a: Float64Array, n: number, options: SymmetricEigenOptions = {}): SymmetricEigenResult {
  if (a.length !== n * n) throw new RangeError(`matrix has ${a.length} entries, expected ${n}×${n}`);
  const wantVectors = options.vectors ?? true;
  if (n === 0) return { n, values: new Float64Array(0), ...(wantVectors ? { vectors: new Float64Array(0) } : {}) };
  const solve = (team: ThreadTeam, reuse?: WasmMemory) => {
    const ws = new Workspace(eigenWorkspaceSizes(n, team.size, wantVectors), reuse);
    team.attach(ws);
    ws.view('A').set(a);
    return { result: symmetricEigenInWorkspace(team, ws, n, options), memory: ws.memory };
  };
  if (!options.team && n <= KEEP_ORDER) {
    // small problems: one kept single-thread team and memory (no per-call set-up); the vectors are copied out
    kept ??= { team: new ThreadTeam(1), busy: false };
    if (!kept.busy) {
      kept.busy = true;
      try {
        const { result, memory } = solve(kept.team, kept.memory);
        kept.memory = memory;
        return result.vectors ? { ...result, vectors: result.vectors.slice() } : result;
      } finally {
        kept.busy = false;
      }
    }
  }
  return withTeamFor(n, options.team, (team) => solve(team).result);
}

/** The arrays (f64 lengths by name) that {@link symmetricEigenInWorkspace} needs in a workspace. */
export function eigenWorkspaceSizes(n: number, teamSize: number, vectors = true): Record<string, number> {
  const blocks = Math.ceil(Math.max(0, n - 2) / BLOCK);
  return {
    A: n * n,
    Z: vectors ? n * n : 0,
    v: n,
    q: n,
    p: PASS_CHUNKS * n,
    VW: n * 2 * BLOCK,
    WVt: 2 * BLOCK * n,
    t: 2 * BLOCK,
    d: n, e: n, lambda: n,
    units: n + 1,
    T: blocks * BLOCK * BLOCK,
    G: BLOCK * BLOCK,
    scratch: teamSize * 2 * BLOCK * CHUNK_WIDTH,
  };
}

/**
 * Eigen-decomposition of the symmetric matrix in workspace array `A` (lower triangle read; overwritten by the
 * reflectors), on a team attached to that workspace. The eigenvectors are workspace array `Z` (a view, not a
 * copy): large callers build the matrix and use the vectors in place, without extra n² arrays.
 */
export function symmetricEigenInWorkspace(team: ThreadTeam, ws: Workspace, n: number, options: Omit<SymmetricEigenOptions, 'team'> = {}): SymmetricEigenResult {
  if (n === 0) return { n, values: new Float64Array(0), ...((options.vectors ?? true) ? { vectors: new Float64Array(0) } : {}) };
  const { d, e, tau } = tridiagonalise(team, ws, n, options.progress);
  const values = tridiagonalEigenvalues(d, e);
  if (!(options.vectors ?? true)) return { n, values };
  tridiagonalEigenvectors(team, ws, d, e, values, options.progress);
  applyReflectors(team, ws, tau, n, options.progress);
  return { n, values, vectors: ws.view('Z') };
}

/**
 * Householder tridiagonalisation in place (workspace array A), blocked as LAPACK dsytrd/dlatrd: within a panel of
 * BLOCK columns each column is brought up to date from the panel's earlier reflectors (V, W), its reflector v is
 * formed and w = τ A22 v − (τ²/2)(vᵀ A22 v) v uses the panel-start A22 (read-only symmetric product by row chunks)
 * corrected by −V(Wᵀv) − W(Vᵀv); after the panel A22 ← A22 − V Wᵀ − W Vᵀ as one rank-2·BLOCK product on the
 * lower triangle (tiles shared by the team). Same reflectors as the unblocked reduction A22 ← A22 − v wᵀ − w vᵀ
 * per step (Golub–Van Loan §8.3.1). On return d, e hold T (e[k] = T[k+1][k], e[n−1] = 0) and column k of A
 * holds the reflector H_k = I − τ_k u_k u_kᵀ: u_k[i] = A[i][k], with u_k[k+1] = 1 and zeros above (the form the
 * back-transformation reads).
 */
function tridiagonalise(team: ThreadTeam, ws: Workspace, n: number, progress?: SymmetricEigenOptions['progress']) {
  const A = ws.view('A'), v = ws.view('v'), pChunks = ws.view('p'), q = ws.view('q'), VW = ws.view('VW'), WVt = ws.view('WVt'), t2 = ws.view('t');
  const a = ws.at('A'), vw = ws.at('VW'), vAt = ws.at('v'), qAt = ws.at('q'), tAt = ws.at('t');
  const K = team.kernels;
  const LD = 2 * BLOCK; // VW[i·LD + r] = V[i][r], VW[i·LD + BLOCK + r] = W[i][r]
  const d = new Float64Array(n), e = new Float64Array(n), tau = new Float64Array(n);
  const args = [a, n, 0, vAt, ws.at('p'), 0, ...new Array(PASS_CHUNKS + 1).fill(0)];
  const every = Math.max(1, Math.floor(n / 50));
  for (let k0 = 0; k0 < n - 2; k0 += BLOCK) {
    const width = Math.min(BLOCK, n - 2 - k0);
    VW.fill(0, k0 * LD);
    for (let j = 0; j < width; j++) {
      const k = k0 + j;
      const col = a + (k * n + k) * 8; // A[k][k], column stride n·8
      if (j > 0) {
        // column k (rows k … n−1) −= V W[k]ᵀ + W V[k]ᵀ over the panel's earlier columns
        K.gemm(col, n * 8, vw + k * LD * 8, LD * 8, 8, vw + (k * LD + BLOCK) * 8, 8, n - k, 1, j, -1);
        K.gemm(col, n * 8, vw + (k * LD + BLOCK) * 8, LD * 8, 8, vw + k * LD * 8, 8, n - k, 1, j, -1);
      }
      d[k] = A[k * n + k];
      let sigma = 0;
      for (let i = k + 2; i < n; i++) sigma += A[i * n + k] * A[i * n + k];
      const x0 = A[(k + 1) * n + k];
      if (sigma === 0) {
        e[k] = x0; // already tridiagonal here: H_k = I (τ = 0), V and W columns stay zero
        continue;
      }
      const mu = Math.sqrt(x0 * x0 + sigma);
      const alpha = x0 <= 0 ? mu : -mu; // H x = alpha e1, sign chosen against cancellation
      const v0 = x0 - alpha;
      const t = -v0 / alpha;
      e[k] = alpha;
      tau[k] = t;
      v.fill(0, 0, k + 1);
      v[k + 1] = 1;
      for (let i = k + 2; i < n; i++) {
        v[i] = A[i * n + k] / v0;
        A[i * n + k] = v[i];
      }
      for (let i = k + 1; i < n; i++) VW[i * LD + j] = v[i];
      // p = A22 v from the panel-start lower triangle, by row chunks of about equal area (row i has i − k entries)
      const rows = n - k - 1;
      const chunks = rows >= PASS_SPLIT_MIN ? PASS_CHUNKS : 1;
      args[2] = k;
      args[5] = chunks;
      for (let c = 0; c <= chunks; c++) args[6 + c] = k + 1 + Math.round(rows * Math.sqrt(c / chunks));
      team.run('symmetricProductChunks', args, { local: chunks === 1 });
      q.fill(0, k + 1);
      for (let c = 0; c < chunks; c++) for (let i = k + 1; i < n; i++) q[i] += pChunks[c * n + i];
      if (j > 0) {
        // p −= V (Wᵀ v) + W (Vᵀ v) over the panel's earlier columns (rows k+1 … n−1)
        const below = vw + (k + 1) * LD * 8;
        t2.fill(0);
        K.gemm(tAt, 8, below + BLOCK * 8, 8, LD * 8, vAt + (k + 1) * 8, 8, j, 1, rows, 1);
        K.gemm(tAt + BLOCK * 8, 8, below, 8, LD * 8, vAt + (k + 1) * 8, 8, j, 1, rows, 1);
        K.gemm(qAt + (k + 1) * 8, 8, below, LD * 8, 8, tAt, 8, rows, 1, j, -1);
        K.gemm(qAt + (k + 1) * 8, 8, below + BLOCK * 8, LD * 8, 8, tAt + BLOCK * 8, 8, rows, 1, j, -1);
      }
      // w = τ p − (τ²/2)(pᵀv) v
      let pv = 0;
      for (let i = k + 1; i < n; i++) pv += q[i] * v[i];
      const c = 0.5 * t * t * pv;
      for (let i = k + 1; i < n; i++) VW[i * LD + BLOCK + j] = t * q[i] - c * v[i];
      if (progress && k % every === 0) progress('tridiagonalise', k / n);
    }
    // A22 ← A22 − V Wᵀ − W Vᵀ for rows and columns ≥ kEnd: A operand [V W], B operand [Wᵀ; Vᵀ]
    const kEnd = k0 + width;
    for (let r = 0; r < BLOCK; r++) {
      const wRow = r * n, vRow = (BLOCK + r) * n;
      for (let i = kEnd; i < n; i++) {
        WVt[wRow + i] = VW[i * LD + BLOCK + r];
        WVt[vRow + i] = VW[i * LD + r];
      }
    }
    team.run('lowerTiles', [a + (kEnd * n + kEnd) * 8, n * 8, vw + kEnd * LD * 8, LD * 8, 8, ws.at('WVt') + kEnd * 8, n * 8, n - kEnd, LD, -1, UPDATE_TILE_ROWS, UPDATE_TILE_COLS, LD, 0], {
      local: n - kEnd < PASS_SPLIT_MIN,
    });
  }
  if (n >= 2) {
    d[n - 2] = A[(n - 2) * n + n - 2];
    e[n - 2] = A[(n - 1) * n + n - 2];
  }
  d[n - 1] = A[(n - 1) * n + n - 1];
  // reflector columns: unit at row k+1, zeros on and above the diagonal
  for (let k = 0; k < n - 2; k++) {
    for (let i = 0; i <= k; i++) A[i * n + k] = 0;
    A[(k + 1) * n + k] = 1;
  }
  progress?.('tridiagonalise', 1);
  return { d, e, tau };
}

/** Eigenvalues of the tridiagonal (d, e), ascending, by implicit QL (EISPACK tql2 / JAMA, without vectors). */
export function tridiagonalEigenvalues(d0: Float64Array, e0: Float64Array): Float64Array {
  const n = d0.length;
  const d = Float64Array.from(d0), e = Float64Array.from(e0);
  e[n - 1] = 0;
  let f = 0, tst1 = 0;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l]) + Math.abs(e[l]));
    let m = l;
    while (m < n - 1 && Math.abs(e[m]) > EPS * tst1) m++;
    if (m > l) {
      let iter = 0;
      do {
        if (++iter > 60) throw new Error('tridiagonal QL did not converge');
        let g = d[l];
        let p = (d[l + 1] - g) / (2 * e[l]);
        let r = Math.hypot(p, 1);
        if (p < 0) r = -r;
        d[l] = e[l] / (p + r);
        d[l + 1] = e[l] * (p + r);
        const dl1 = d[l + 1];
        let h = g - d[l];
        for (let i = l + 2; i < n; i++) d[i] -= h;
        f += h;
        p = d[m];
        let c = 1, c2 = 1, c3 = 1, s = 0, s2 = 0;
        const el1 = e[l + 1];
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * e[i];
          h = c * p;
          r = Math.hypot(p, e[i]);
          e[i + 1] = s * r;
          s = e[i] / r;
          c = p / r;
          p = c * d[i] - s * g;
          d[i + 1] = h + s * (c * g + s * d[i]);
        }
        p = (-s * s2 * c3 * el1 * e[l]) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l]) > EPS * tst1);
    }
    d[l] += f;
    e[l] = 0;
  }
  return d.sort();
}

/**
 * Eigenvectors of the tridiagonal (d, e) for the given ascending eigenvalues, into the columns of workspace array Z,
 * by inverse iteration (src/math/team-tasks.ts inverseIteration) on units of consecutive eigenvalues that never
 * split a cluster (the vectors of a cluster are orthogonalised against each other).
 */
function tridiagonalEigenvectors(team: ThreadTeam, ws: Workspace, d: Float64Array, e: Float64Array, values: Float64Array, progress?: SymmetricEigenOptions['progress']): void {
  const n = d.length;
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(d[i]) + Math.abs(e[i]) + (i > 0 ? Math.abs(e[i - 1]) : 0));
  if (norm === 0) norm = 1;
  const tiny = EPS * norm;
  const ortol = CLUSTER_GAP * norm;
  ws.view('d').set(d);
  ws.view('e').set(e);
  ws.view('lambda').set(values);
  const bounds = ws.view('units');
  let units = 0;
  bounds[0] = 0;
  for (let j = 1; j <= n; j++) if (j === n || (j - bounds[units] >= VECTORS_PER_UNIT && values[j] - values[j - 1] > ortol)) bounds[++units] = j;
  team.run('inverseIteration', [ws.at('d'), ws.at('e'), ws.at('lambda'), ws.at('Z'), n, tiny, ortol, units, ws.at('units')], {
    onUnit: progress && (() => progress('eigenvectors', Math.min(1, team.unitsTaken() / units))),
    local: n < PASS_SPLIT_MIN,
  });
  progress?.('eigenvectors', 1);
}

/**
 * Z ← Q Z with Q = H_0 H_1 ⋯ H_{n−3}, the reflectors applied in blocks as I − U T Uᵀ (LAPACK dlarft/dlarfb):
 * T is upper triangular with T_jj = τ_j and T[0:j, j] = −τ_j T[0:j, 0:j] (U[:, 0:j]ᵀ u_j), from the Gram matrix
 * UᵀU of the block; the products with Z run on the team (src/math/team-tasks.ts backTransform).
 */
function applyReflectors(team: ThreadTeam, ws: Workspace, tau: Float64Array, n: number, progress?: SymmetricEigenOptions['progress']): void {
  const count = n - 2;
  if (count <= 0) return;
  const blocks = Math.ceil(count / BLOCK);
  const a = ws.at('A'), Tall = ws.view('T'), G = ws.view('G'), g = ws.at('G');
  for (let bi = 0; bi < blocks; bi++) {
    const k0 = bi * BLOCK, b = Math.min(BLOCK, count - k0);
    G.fill(0);
    const u = a + ((k0 + 1) * n + k0) * 8; // U[0][0] = u_k0[k0+1]; U[i][r] at u + (i·n + r)·8
    team.kernels.gemm(g, BLOCK * 8, u, 8, n * 8, u, n * 8, b, b, n - k0 - 1, 1);
    const T = Tall.subarray(bi * BLOCK * BLOCK, (bi + 1) * BLOCK * BLOCK).fill(0);
    for (let j = 0; j < b; j++) {
      const tj = tau[k0 + j];
      T[j * BLOCK + j] = tj;
      if (tj === 0) continue;
      for (let r = 0; r < j; r++) {
        let acc = 0;
        for (let c = r; c < j; c++) acc += T[r * BLOCK + c] * G[c * BLOCK + j];
        T[r * BLOCK + j] = -tj * acc;
      }
    }
  }
  const chunks = Math.ceil(n / CHUNK_WIDTH);
  team.run('backTransform', [a, n, ws.at('Z'), ws.at('T'), BLOCK, CHUNK_WIDTH, ws.at('scratch'), SLAB], {
    onUnit: progress && (() => progress('back-transform', Math.min(1, team.unitsTaken() / chunks))),
  });
  progress?.('back-transform', 1);
}
