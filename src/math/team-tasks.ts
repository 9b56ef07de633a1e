/**
 * The pieces of dense linear algebra that a ThreadTeam (src/math/thread-team.ts) runs on every thread at once.
 *
 * Each task is a self-contained function of (ctx, args): it may use only its parameters and JavaScript built-ins,
 * because the worker threads receive it as source text (Function.prototype.toString). Work is split into units
 * that the threads take in turn from a shared counter (ctx.next()); every unit writes disjoint memory, and the
 * arithmetic of a unit does not depend on which thread runs it, so results are the same for any team size.
 * A task writes nothing before its first unit: a worker that arrives after the run is over then does nothing.
 * Pointers in args are byte offsets into the team's shared memory.
 */
import type { Kernels } from './simd-kernels.js';

/** What a task sees on its thread. */
export interface TeamContext {
  kernels: Kernels;
  /** The whole shared memory as Float64. */
  f64: Float64Array;
  /** 0 on the main thread, 1 … size−1 on the workers. */
  member: number;
  /** The next unit of work for this thread (a counter shared by the team, from 0). */
  next(): number;
  /** Report a finished unit (progress; a no-op on the workers). */
  done(): void;
}

/**
 * Z ← Q Z for column chunks of Z, Q = H_0 ⋯ H_{n−3} applied block by block (last first) in the compact WY form
 * H_k0 ⋯ H_k0+b−1 = I − U T Uᵀ (LAPACK dlarfb): W = Uᵀ Z (by row slabs, to stay in cache), W ← T W, Z −= U W.
 * The reflector vectors are the columns of the row-major n×n `a` (column k: unit at row k+1, zeros above it up to
 * row k0+1, the first row of its block, which is all that is read).
 * args: a, n, z, tBlocks (block i's b×b upper triangle at tBlocks + i·b²·8), b, chunkWidth, scratch (2·b·chunkWidth
 * f64 per thread), slab, registerTiles (1: the products W = Uᵀ Z and Z −= U W by gemmTile, else by gemm).
 */
function backTransform(ctx: TeamContext, args: Float64Array): void {
  const a = args[0], n = args[1], z = args[2], tBlocks = args[3], nb = args[4], cw = args[5], slab = args[7];
  const w1 = args[6] + ctx.member * 2 * nb * cw * 8, w2 = w1 + nb * cw * 8;
  const count = n - 2, blocks = Math.ceil(count / nb), chunks = Math.ceil(n / cw);
  const K = ctx.kernels, F = ctx.f64;
  const product = args[8] ? K.gemmTile : K.gemm;
  for (let c = ctx.next(); c < chunks; c = ctx.next()) {
    const c0 = c * cw, width = Math.min(cw, n - c0), ld = width * 8;
    for (let bi = blocks - 1; bi >= 0; bi--) {
      const k0 = bi * nb, b = Math.min(nb, count - k0);
      F.fill(0, w1 / 8, w1 / 8 + b * width);
      F.fill(0, w2 / 8, w2 / 8 + b * width);
      for (let s = k0 + 1; s < n; s += slab) product(w1, ld, a + (s * n + k0) * 8, 8, n * 8, z + (s * n + c0) * 8, n * 8, b, width, Math.min(slab, n - s), 1);
      K.gemm(w2, ld, tBlocks + bi * nb * nb * 8, nb * 8, 8, w1, ld, b, width, b, 1);
      product(z + ((k0 + 1) * n + c0) * 8, n * 8, a + ((k0 + 1) * n + k0) * 8, n * 8, 8, w2, ld, n - k0 - 1, width, b, -1);
    }
    ctx.done();
  }
}

/**
 * C += alpha A B on the lower triangle of a square C (order×order), by tiles (row block × column chunk, the
 * diagonal tiles up to the block's last column), each summed over slabs of the depth; `zeroFirst` clears a tile
 * first. A(i, p) at a + i·aRow + p·aCol, B row-major (ldb), C row-major (ldc), all in bytes. Serves the Gram
 * matrix Xᵀ X (kernel gemm) and the rank-2k update of the blocked tridiagonalisation (`registerTiles` 1: kernel
 * gemmTile, for short depths).
 * args: c, ldc, a, aRow, aCol, b, ldb, order, depth, alpha, tileRows, tileCols, slab, zeroFirst, registerTiles.
 */
function lowerTiles(ctx: TeamContext, args: Float64Array): void {
  const c = args[0], ldc = args[1], a = args[2], aRow = args[3], aCol = args[4], b = args[5], ldb = args[6];
  const order = args[7], depth = args[8], alpha = args[9], tr = args[10], tc = args[11], slab = args[12], zeroFirst = args[13];
  const product = args[14] ? ctx.kernels.gemmTile : ctx.kernels.gemm;
  const rowBlocks = Math.ceil(order / tr);
  const chunksOf = (rb: number) => Math.ceil(Math.min(order, (rb + 1) * tr) / tc);
  let rb = 0, first = 0; // units are taken in increasing order, so the row block only moves forward
  for (let u = ctx.next(); ; u = ctx.next()) {
    while (rb < rowBlocks && u >= first + chunksOf(rb)) {
      first += chunksOf(rb);
      rb++;
    }
    if (rb >= rowBlocks) return;
    const r0 = rb * tr, r1 = Math.min(order, r0 + tr);
    const c0 = (u - first) * tc, c1 = Math.min(c0 + tc, r1);
    if (zeroFirst) for (let r = r0; r < r1; r++) ctx.f64.fill(0, (c + r * ldc) / 8 + c0, (c + r * ldc) / 8 + c1);
    for (let s = 0; s < depth; s += slab)
      product(c + r0 * ldc + c0 * 8, ldc, a + r0 * aRow + s * aCol, aRow, aCol, b + s * ldb + c0 * 8, ldb, r1 - r0, c1 - c0, Math.min(slab, depth - s), alpha);
    ctx.done();
  }
}

/**
 * One step of the fused tridiagonalisation over row chunks (src/math/simd-kernels.ts tridiagonalPass), or with
 * vp = −1 the product p = A22 v alone (symmetricProduct, the blocked reduction); chunk c accumulates its part of
 * p in its own array so the caller can sum them in a fixed order.
 * args: a, n, k, vp, wp, v, pChunks (chunk c at pChunks + c·n·8), chunkCount, chunk row bounds (chunkCount + 1).
 */
function tridiagonalChunks(ctx: TeamContext, args: Float64Array): void {
  const a = args[0], n = args[1], k = args[2], vp = args[3], wp = args[4], v = args[5], pChunks = args[6], chunks = args[7];
  for (let c = ctx.next(); c < chunks; c = ctx.next()) {
    const p = pChunks + c * n * 8;
    ctx.f64.fill(0, p / 8 + k + 1, p / 8 + n);
    if (vp < 0) ctx.kernels.symmetricProduct(a, n, k, args[8 + c], args[9 + c], v, p);
    else ctx.kernels.tridiagonalPass(a, n, k, args[8 + c], args[9 + c], vp, wp, v, p);
  }
}

/**
 * Eigenvectors of a symmetric tridiagonal T = (d, e) by inverse iteration (Golub–Van Loan §8.2.2; LAPACK dstein):
 * for each eigenvalue λ_j of a unit, LU with partial pivoting of T − λ_j I (upper factor with two superdiagonals,
 * LAPACK dlagtf style; pivots below ‖T‖ε raised to it), three solves from a seeded random start, each followed by
 * modified Gram–Schmidt against the earlier vectors of the same cluster (eigenvalues within `ortol`; shifts kept
 * 10·tiny apart inside a cluster) and normalisation; the sign makes the largest component positive. The unit's
 * vectors are written to columns j0 … j1−1 of the row-major n×n Z.
 * args: d, e, lambda (ascending eigenvalues), z, n, tiny, ortol, unitCount, bounds (unitCount + 1 f64: first j of each unit).
 */
function inverseIteration(ctx: TeamContext, args: Float64Array): void {
  const n = args[4] | 0, tiny = args[5], ortol = args[6], units = args[7] | 0;
  const F = ctx.f64;
  const at = (pointer: number) => (pointer / 8) | 0; // integer indices keep the loops in integer arithmetic
  const d = F.subarray(at(args[0]), at(args[0]) + n), e = F.subarray(at(args[1]), at(args[1]) + n);
  const values = F.subarray(at(args[2]), at(args[2]) + n), z = at(args[3]), bounds = at(args[8]);
  const U0 = new Float64Array(n), U1 = new Float64Array(n), U2 = new Float64Array(n), L = new Float64Array(n);
  const piv = new Uint8Array(n);

  /** LU of T − λI into U0 (diagonal), U1, U2 (superdiagonals), L (multipliers), piv (row swapped). */
  function factor(lambda: number): void {
    let a = d[0] - lambda;
    let b = n > 1 ? e[0] : 0;
    for (let k = 0; k < n - 1; k++) {
      const c = e[k];
      const an = d[k + 1] - lambda;
      const bn = k + 1 < n - 1 ? e[k + 1] : 0;
      if (Math.abs(a) >= Math.abs(c)) {
        if (Math.abs(a) < tiny) a = a < 0 ? -tiny : tiny;
        const mult = c / a;
        U0[k] = a; U1[k] = b; U2[k] = 0; L[k] = mult; piv[k] = 0;
        a = an - mult * b;
        b = bn;
      } else {
        const mult = a / c;
        U0[k] = c; U1[k] = an; U2[k] = bn; L[k] = mult; piv[k] = 1;
        a = b - mult * an;
        b = -mult * bn;
      }
    }
    if (Math.abs(a) < tiny) a = a < 0 ? -tiny : tiny;
    U0[n - 1] = a;
    U1[n - 1] = 0;
    U2[n - 1] = 0;
  }
  /** y ← (T − λI)⁻¹ y, rescaled against overflow in nearly singular solves (the caller normalises anyway). */
  function solve(y: Float64Array): void {
    for (let k = 0; k < n - 1; k++) {
      if (piv[k]) {
        const t = y[k];
        y[k] = y[k + 1];
        y[k + 1] = t;
      }
      y[k + 1] -= L[k] * y[k];
    }
    y[n - 1] /= U0[n - 1];
    if (n > 1) y[n - 2] = (y[n - 2] - U1[n - 2] * y[n - 1]) / U0[n - 2];
    for (let k = n - 3; k >= 0; k--) y[k] = (y[k] - U1[k] * y[k + 1] - U2[k] * y[k + 2]) / U0[k];
    let big = 0;
    for (let k = 0; k < n; k++) big = Math.max(big, Math.abs(y[k]));
    if (big > 1e150 || (big > 0 && big < 1e-150)) for (let k = 0; k < n; k++) y[k] /= big;
  }

  let X = new Float64Array(0); // the unit's vectors, one per row (kept between units: fresh memory is slow to touch)
  for (let u = ctx.next(); u < units; u = ctx.next()) {
    const j0 = F[bounds + u] | 0, j1 = F[bounds + u + 1] | 0;
    if (X.length < (j1 - j0) * n) X = new Float64Array((j1 - j0) * n);
    let cluster = 0; // first vector (row of X) of the current cluster
    let shifted = -Infinity;
    for (let j = j0; j < j1; j++) {
      let lambda = values[j];
      if (j === j0 || lambda - values[j - 1] > ortol) cluster = j - j0; // a new cluster
      if (lambda - shifted < 10 * tiny) lambda = shifted + 10 * tiny; // keep shifts distinct inside a cluster
      shifted = lambda;
      factor(lambda);
      const x = X.subarray((j - j0) * n, (j - j0 + 1) * n);
      let seed = (0x2545f491 ^ Math.imul(j + 1, 0x9e3779b9)) >>> 0; // seeded by j: the same start on any thread
      for (let i = 0; i < n; i++) {
        seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
        x[i] = seed / 4294967296 - 0.5;
      }
      for (let it = 0; it < 3; it++) {
        solve(x);
        for (let r = cluster; r < j - j0; r++) {
          let dot = 0;
          for (let i = 0; i < n; i++) dot += X[r * n + i] * x[i];
          for (let i = 0; i < n; i++) x[i] -= dot * X[r * n + i];
        }
        let s = 0;
        for (let i = 0; i < n; i++) s += x[i] * x[i];
        const inv = 1 / Math.sqrt(s);
        for (let i = 0; i < n; i++) x[i] *= inv;
      }
      let big = 0;
      for (let i = 1; i < n; i++) if (Math.abs(x[i]) > Math.abs(x[big])) big = i;
      if (x[big] < 0) for (let i = 0; i < n; i++) x[i] = -x[i];
    }
    // columns j0 … j1−1 of Z, by blocks of 64 rows (contiguous reads of X, short strided writes)
    const width = j1 - j0;
    for (let i0 = 0; i0 < n; i0 += 64) {
      const i1 = Math.min(n, i0 + 64);
      for (let c = 0; c < width; c++) {
        const from = c * n, to = z + j0 + c;
        for (let i = i0; i < i1; i++) F[to + i * n] = X[from + i];
      }
    }
    ctx.done();
  }
}

/** The tasks by name; thread-team.ts sends their source to the workers in this order. */
export const TEAM_TASKS = { tridiagonalChunks, lowerTiles, inverseIteration, backTransform } as const;
export type TeamTaskName = keyof typeof TEAM_TASKS;
