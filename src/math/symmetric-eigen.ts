/**
 * Dense real symmetric eigensolver on typed arrays, for matrices of a few thousand rows (row-major Float64Array).
 *
 * Steps (standard; G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed. 2013, §8.3–8.4; LAPACK dsytrd,
 * dsterf, dstein, dormtr):
 *  1. Householder reduction to tridiagonal form, Q^T A Q = T: below order 2000 with the symmetric rank-2 update
 *     of step k fused into the matrix–vector product of step k + 1 (one pass over the trailing lower triangle per
 *     step, split into row chunks shared by the threads); from order 2000 blocked (LAPACK dsytrd/dlatrd: a
 *     read-only product per step, the updates of a panel of 32 steps deferred to one rank-64 matrix product);
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
import type { Workspace } from './simd-kernels.js';
import { withWorkspace, type ThreadTeam } from './thread-team.js';

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
  /**
   * Which path to take (default: 'blocked' from order BLOCKED_MIN_ORDER, else 'fused'); for tests. 'blocked' also
   * runs the back-transformation's products on the register-tiled kernel.
   */
  tridiagonalisation?: TridiagonalMethod;
  /**
   * Threads to run on (default: src/math/thread-team.ts withWorkspace — up to order 300 a kept single-thread team,
   * else a team of teamSizeFor(n) threads, closed afterwards).
   */
  team?: ThreadTeam;
}

/** Consecutive eigenvalues closer than this (relative to ‖T‖) are one cluster and re-orthogonalised together. */
const CLUSTER_GAP = 1e-5;
const EPS = 2 ** -52;
/** Reflectors per WY block. */
const BLOCK = 64;
/** Columns of Z per back-transformation unit (W = Uᵀ Z of one block is then 64 KiB). */
const CHUNK_WIDTH = 128;
/** Rows of Z per pass of W = Uᵀ Z (a 256 KiB slab, re-read from cache by every pair of W rows). */
const SLAB = 256;
/** Eigenvectors per inverse-iteration unit (extended to the end of a cluster of close eigenvalues). */
const VECTORS_PER_UNIT = 48;
/** Row chunks of one tridiagonalisation step; fixed so that the sums, hence the results, do not depend on the team. */
const PASS_CHUNKS = 4;
/** Steps with fewer trailing rows run as one chunk on the calling thread (not worth waking the others). */
const PASS_SPLIT_MIN = 256;
/**
 * A shared tridiagonalisation step whose end waited this fraction of the step for a worker counts as stalled;
 * the steps after a stall run on the calling thread alone, SOLO_MIN of them at first, doubling up to SOLO_MAX.
 */
const STALL_FRACTION = 0.3, SOLO_MIN = 8, SOLO_MAX = 256;
/** Columns per panel of the blocked reduction (LAPACK dsytrd's usual block size). */
const PANEL = 32;
/**
 * Order from which the blocked path is used (below it the trailing matrix stays in cache and the fused reduction is
 * as fast; small problems then keep the previous path's results bit for bit).
 */
const BLOCKED_MIN_ORDER = 2000;
/** Rows and columns per tile of the blocked reduction's trailing update. */
const UPDATE_TILE = 96;

/** How the tridiagonalisation runs (normally chosen by the order; tests compare the two). */
export type TridiagonalMethod = 'fused' | 'blocked';

/** Eigen-decomposition of the symmetric n×n matrix `a` (row-major; only its lower triangle is read; not modified). */
export function symmetricEigen(a: Float64Array, n: number, options: SymmetricEigenOptions = {}): SymmetricEigenResult {
  if (a.length !== n * n) throw new RangeError(`matrix has ${a.length} entries, expected ${n}×${n}`);
  const wantVectors = options.vectors ?? true;
  if (n === 0) return { n, values: new Float64Array(0), ...(wantVectors ? { vectors: new Float64Array(0) } : {}) };
  return withWorkspace(
    n,
    (teamSize) => eigenWorkspaceSizes(n, teamSize, wantVectors),
    (team, ws, kept) => {
      ws.view('A').set(a);
      const result = symmetricEigenInWorkspace(team, ws, n, options);
      return kept && result.vectors ? { ...result, vectors: result.vectors.slice() } : result;
    },
    options.team,
  );
}

/** The arrays (f64 lengths by name) that {@link symmetricEigenInWorkspace} needs in a workspace. */
export function eigenWorkspaceSizes(n: number, teamSize: number, vectors = true): Record<string, number> {
  const blocks = Math.ceil(Math.max(0, n - 2) / BLOCK);
  return {
    A: n * n,
    Z: vectors ? n * n : 0,
    vp: n, wp: n, v: n,
    p: PASS_CHUNKS * n,
    d: n, e: n, lambda: n,
    units: n + 1,
    T: blocks * BLOCK * BLOCK,
    G: BLOCK * BLOCK,
    q: n,
    x: 2 * PANEL,
    panel: 2 * PANEL * n,
    panelT: 2 * PANEL * n,
    scratch: teamSize * 2 * BLOCK * CHUNK_WIDTH,
  };
}

/**
 * Eigen-decomposition of the symmetric matrix in workspace array `A` (lower triangle read; overwritten by the
 * reflectors), on a team attached to a workspace with the arrays of {@link eigenWorkspaceSizes}(n, team.size).
 * The eigenvectors are workspace array `Z` (a view, not a copy): large callers build the matrix and use the
 * vectors in place, without extra n² arrays (fresh memory is slow to touch).
 */
export function symmetricEigenInWorkspace(team: ThreadTeam, ws: Workspace, n: number, options: Omit<SymmetricEigenOptions, 'team'> = {}): SymmetricEigenResult {
  if (n === 0) return { n, values: new Float64Array(0), ...((options.vectors ?? true) ? { vectors: new Float64Array(0) } : {}) };
  const method = options.tridiagonalisation ?? (n >= BLOCKED_MIN_ORDER ? 'blocked' : 'fused');
  const { d, e, tau } = tridiagonalise(team, ws, n, method, options.progress);
  const values = tridiagonalEigenvalues(d, e);
  if (!(options.vectors ?? true)) return { n, values };
  tridiagonalEigenvectors(team, ws, d, e, values, options.progress);
  applyReflectors(team, ws, tau, n, method === 'blocked', options.progress);
  return { n, values, vectors: ws.view('Z') };
}

/**
 * Householder tridiagonalisation in place (workspace array A). On return d, e hold T (e[k] = T[k+1][k],
 * e[n−1] = 0) and column k of A holds the reflector H_k = I − τ_k u_k u_kᵀ: u_k[i] = A[i][k], with
 * u_k[k+1] = 1 and zeros above, back to the first row of its WY block (the form the back-transformation reads).
 */
function tridiagonalise(team: ThreadTeam, ws: Workspace, n: number, method: TridiagonalMethod, progress?: SymmetricEigenOptions['progress']) {
  const blocked = method === 'blocked';
  const d = new Float64Array(n), e = new Float64Array(n), tau = new Float64Array(n);
  progress?.('tridiagonalise', 0);
  (blocked ? reduceBlocked : reduceFused)(team, ws, n, { d, e, tau }, progress);
  const A = ws.view('A');
  if (n >= 2) {
    d[n - 2] = A[(n - 2) * n + n - 2];
    e[n - 2] = A[(n - 1) * n + n - 2];
  }
  d[n - 1] = A[(n - 1) * n + n - 1];
  // reflector columns: unit at row k+1, zeros on and above the diagonal from the first row of the WY block
  // (k0 + 1 for the block starting at k0), which is all the back-transformation reads
  for (let k = 0; k < n - 2; k++) {
    for (let i = k - (k % BLOCK) + 1; i <= k; i++) A[i * n + k] = 0;
    A[(k + 1) * n + k] = 1;
  }
  progress?.('tridiagonalise', 1);
  return { d, e, tau };
}

/** T so far (d, e) and the reflectors' τ, filled step by step by the reductions. */
interface Tridiagonal {
  d: Float64Array;
  e: Float64Array;
  tau: Float64Array;
}

/**
 * Step k's reflector from column k of A (rows k …, brought up to date by the caller): d[k], e[k], τ_k, and
 * v = u_k (v[k+1] = 1, v[i] = A[i][k]/(x0 − α) below, all zero when the column is already reduced; entries
 * before k+1 zeroed too), stored also in column k of A below the subdiagonal. H x = α e1 with the sign of α
 * chosen against cancellation (Golub & Van Loan 2013, §5.1.2). Returns τ_k.
 */
function householderStep(A: Float64Array, n: number, k: number, v: Float64Array, t: Tridiagonal): number {
  t.d[k] = A[k * n + k];
  let sigma = 0;
  for (let i = k + 2; i < n; i++) sigma += A[i * n + k] * A[i * n + k];
  const x0 = A[(k + 1) * n + k];
  v.fill(0);
  let tau = 0;
  if (sigma === 0) {
    t.e[k] = x0;
  } else {
    const mu = Math.sqrt(x0 * x0 + sigma);
    const alpha = x0 <= 0 ? mu : -mu;
    const v0 = x0 - alpha;
    tau = -v0 / alpha;
    t.e[k] = alpha;
    v[k + 1] = 1;
    for (let i = k + 2; i < n; i++) {
      v[i] = A[i * n + k] / v0;
      A[i * n + k] = v[i];
    }
  }
  t.tau[k] = tau;
  return tau;
}

/**
 * Runs the symmetric product (or the fused pass) of step k over row chunks of about equal area (rows k+1 … n−1;
 * row i has i − k entries), shared by the team while no worker has stalled a step lately: a worker descheduled
 * in the middle of its chunk holds up the whole step, so after such a stall the next steps run on the calling
 * thread alone (the same chunks in the same order, so the same results), twice as many after each further stall.
 * `args` is the tridiagonalChunks argument list; the chunk sums are added into p[k+1 …] in chunk order.
 */
function stepRunner(team: ThreadTeam, ws: Workspace, n: number) {
  const pChunks = ws.view('p');
  let soloUntil = 0, soloSteps = SOLO_MIN;
  return (k: number, args: number[], p: Float64Array) => {
    const rows = n - k - 1;
    const chunks = rows >= PASS_SPLIT_MIN ? PASS_CHUNKS : 1;
    args[2] = k;
    args[7] = chunks;
    for (let c = 0; c <= chunks; c++) args[8 + c] = k + 1 + Math.round(rows * Math.sqrt(c / chunks));
    const shared = chunks > 1 && k >= soloUntil;
    const from = performance.now();
    team.run('tridiagonalChunks', args, { local: !shared });
    if (shared) {
      if (team.lastWaitMs > STALL_FRACTION * (performance.now() - from)) {
        soloUntil = k + 1 + soloSteps;
        soloSteps = Math.min(SOLO_MAX, 2 * soloSteps);
      } else soloSteps = Math.max(SOLO_MIN, soloSteps >> 1);
    }
    p.fill(0, k + 1, n);
    for (let c = 0; c < chunks; c++) for (let i = k + 1; i < n; i++) p[i] += pChunks[c * n + i];
  };
}

/**
 * The fused reduction: the symmetric rank-2 update of step k is fused into the matrix–vector product of step
 * k + 1 (one pass over the trailing lower triangle per step, src/math/simd-kernels.ts tridiagonalPass). Fastest
 * while the trailing matrix stays in cache; every entry is read and written at every step.
 */
function reduceFused(team: ThreadTeam, ws: Workspace, n: number, t: Tridiagonal, progress?: SymmetricEigenOptions['progress']): void {
  const A = ws.view('A'), v = ws.view('v'), vp = ws.view('vp'), wp = ws.view('wp');
  const p = new Float64Array(n);
  vp.fill(0);
  wp.fill(0); // pending rank-2 update of the previous step
  const args = [ws.at('A'), n, 0, ws.at('vp'), ws.at('wp'), ws.at('v'), ws.at('p'), 0, ...new Array(PASS_CHUNKS + 1).fill(0)];
  const step = stepRunner(team, ws, n);
  const every = Math.max(1, Math.floor(n / 50));
  for (let k = 0; k < n - 2; k++) {
    // bring column k (rows ≥ k) up to date with the pending update
    for (let i = k; i < n; i++) A[i * n + k] -= vp[i] * wp[k] + wp[i] * vp[k];
    const tk = householderStep(A, n, k, v, t);
    // fused pass over the trailing lower triangle: apply the pending update, accumulate p = A22 v
    step(k, args, p);
    // w = τ p − (τ²/2)(pᵀv) v becomes the pending update A22 ← A22 − v wᵀ − w vᵀ
    let pv = 0;
    for (let i = k + 1; i < n; i++) pv += p[i] * v[i];
    const c = 0.5 * tk * tk * pv;
    vp.fill(0, 0, k + 1);
    wp.fill(0, 0, k + 1);
    for (let i = k + 1; i < n; i++) {
      vp[i] = v[i];
      wp[i] = tk * p[i] - c * v[i];
    }
    if (progress && k % every === 0) progress('tridiagonalise', k / n);
  }
  // the last 2×2 block
  for (let i = Math.max(0, n - 2); i < n; i++)
    for (let j = Math.max(0, n - 2); j <= i; j++) A[i * n + j] -= vp[i] * wp[j] + wp[i] * vp[j];
}

/**
 * The blocked reduction (LAPACK dsytrd/dlatrd; Golub & Van Loan 2013, §8.3.1): within a panel of PANEL columns
 * the updates are deferred. Step k = k0 + j brings column k up to date from the panel's earlier v, w, forms its
 * reflector, reads p = A22 v from the matrix as it was at the panel's start (src/math/simd-kernels.ts
 * symmetricProduct: read only, half the memory traffic of the fused pass) and corrects it,
 *   p ← A22 v − Σ_{r<j} (v_r (w_rᵀ v) + w_r (v_rᵀ v)),   w = τ p − (τ²/2)(pᵀ v) v;
 * after the panel, the trailing matrix takes the rank-2·PANEL update A ← A − Σ_r (v_r w_rᵀ + w_r v_rᵀ) as a
 * matrix product shared by the team (lowerTiles, gemmTile). The panel is kept twice: `panel` row i =
 * (v_0[i], w_0[i], v_1[i], w_1[i], …) and `panelT` row 2r = w_r, row 2r+1 = v_r, so that every product above
 * is a kernel call on contiguous rows.
 */
function reduceBlocked(team: ThreadTeam, ws: Workspace, n: number, t: Tridiagonal, progress?: SymmetricEigenOptions['progress']): void {
  const A = ws.view('A'), v = ws.view('v'), col = ws.view('wp'), x = ws.view('x'), p = ws.view('q');
  const P = ws.view('panel'), PT = ws.view('panelT');
  const at = { a: ws.at('A'), v: ws.at('v'), col: ws.at('wp'), x: ws.at('x'), p: ws.at('q'), panel: ws.at('panel'), panelT: ws.at('panelT') };
  const W = 2 * PANEL; // panel row length
  const K = team.kernels;
  const args = [at.a, n, 0, -1, 0, at.v, ws.at('p'), 0, ...new Array(PASS_CHUNKS + 1).fill(0)];
  const step = stepRunner(team, ws, n);
  const every = Math.max(1, Math.floor(n / 50));
  for (let k0 = 0; k0 < n - 2; k0 += PANEL) {
    const width = Math.min(PANEL, n - 2 - k0);
    for (let j = 0; j < width; j++) {
      const k = k0 + j, depth = 2 * j;
      if (j > 0) {
        // column k (rows k …): A[i][k] −= Σ_q panel[k][q] panelT[q][i]
        col.fill(0, k, n);
        K.gemmTile(at.col + k * 8, 0, at.panel + k * W * 8, 0, 8, at.panelT + k * 8, n * 8, 1, n - k, depth, 1);
        for (let i = k; i < n; i++) A[i * n + k] -= col[i];
      }
      const tk = householderStep(A, n, k, v, t);
      step(k, args, p);
      if (j > 0) {
        // x = panelᵀ v (x_2r = v_rᵀ v, x_2r+1 = w_rᵀ v), then p −= Σ_q x_q panelT[q]
        x.fill(0, 0, depth);
        K.gemmTile(at.x, 0, at.v + (k + 1) * 8, 0, 8, at.panel + (k + 1) * W * 8, W * 8, 1, depth, n - k - 1, 1);
        K.gemmTile(at.p + (k + 1) * 8, 0, at.x, 0, 8, at.panelT + (k + 1) * 8, n * 8, 1, n - k - 1, depth, -1);
      }
      let pv = 0;
      for (let i = k + 1; i < n; i++) pv += p[i] * v[i];
      const c = 0.5 * tk * tk * pv;
      const wRow = PT.subarray(depth * n, (depth + 1) * n), vRow = PT.subarray((depth + 1) * n, (depth + 2) * n);
      for (let i = k + 1; i < n; i++) {
        const w = tk * p[i] - c * v[i];
        P[i * W + depth] = v[i];
        P[i * W + depth + 1] = w;
        wRow[i] = w;
        vRow[i] = v[i];
      }
      if (progress && k % every === 0) progress('tridiagonalise', k / n);
    }
    // trailing matrix (rows and columns from k1): A −= panel[:, 0:2·width] panelT[0:2·width, :], lower triangle
    const k1 = k0 + width, order = n - k1;
    team.run(
      'lowerTiles',
      [at.a + (k1 * n + k1) * 8, n * 8, at.panel + k1 * W * 8, W * 8, 8, at.panelT + k1 * 8, n * 8, order, 2 * width, -1, UPDATE_TILE, UPDATE_TILE, 2 * width, 0, 1],
      { local: order < PASS_SPLIT_MIN },
    );
  }
}

/** √(a² + b²): the plain formula where a² + b² can neither overflow nor underflow (Math.hypot is several times slower). */
function hypot(a: number, b: number): number {
  const s = a * a + b * b;
  return s > 1e-290 && s < 1e290 ? Math.sqrt(s) : Math.hypot(a, b);
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
        let r = hypot(p, 1);
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
          r = hypot(p, e[i]);
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
  progress?.('eigenvectors', 0);
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
 * UᵀU of the block; the products with Z run on the team (src/math/team-tasks.ts backTransform), on the
 * register-tiled kernel when `registerTiles` (the blocked path; the others keep the previous kernel's rounding).
 */
function applyReflectors(team: ThreadTeam, ws: Workspace, tau: Float64Array, n: number, registerTiles: boolean, progress?: SymmetricEigenOptions['progress']): void {
  const count = n - 2;
  progress?.('back-transform', 0);
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
  team.run('backTransform', [a, n, ws.at('Z'), ws.at('T'), BLOCK, CHUNK_WIDTH, ws.at('scratch'), SLAB, registerTiles ? 1 : 0], {
    onUnit: progress && (() => progress('back-transform', Math.min(1, team.unitsTaken() / chunks))),
  });
  progress?.('back-transform', 1);
}
