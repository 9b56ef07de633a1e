/**
 * Dense real symmetric eigensolver on typed arrays, for matrices of a few thousand rows (row-major Float64Array).
 *
 * Steps (standard; G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed. 2013, §8.3–8.4; LAPACK dsytrd,
 * dsterf, dstein, dormtr):
 *  1. Householder reduction to tridiagonal form, Q^T A Q = T, with the symmetric rank-2 update of step k fused
 *     into the matrix–vector product of step k + 1 (one pass over the trailing lower triangle per step);
 *  2. eigenvalues of T by the implicit QL method with Wilkinson-type shifts (tql2 of EISPACK / JAMA, without
 *     vectors);
 *  3. eigenvectors of T by inverse iteration (tridiagonal LU with partial pivoting), re-orthogonalised
 *     (modified Gram–Schmidt) inside clusters of close eigenvalues — orthogonality outside clusters is then of
 *     order ε‖T‖/gap ≤ ε / CLUSTER_GAP;
 *  4. back-transformation V = Q Z with the reflectors applied in blocks (compact WY form, I − U T Uᵀ).
 * Cost ≈ (4/3 + 2) n³ flops with vectors, (4/3) n³ without.
 */

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
}

/** Consecutive eigenvalues closer than this (relative to ‖T‖) are one cluster and re-orthogonalised together. */
const CLUSTER_GAP = 1e-5;
const EPS = 2 ** -52;
const BLOCK = 32;

/** Eigen-decomposition of the symmetric n×n matrix `a` (row-major; only its lower triangle is read; not modified). */
export function symmetricEigen(a: Float64Array, n: number, options: SymmetricEigenOptions = {}): SymmetricEigenResult {
  if (a.length !== n * n) throw new RangeError(`matrix has ${a.length} entries, expected ${n}×${n}`);
  const wantVectors = options.vectors ?? true;
  if (n === 0) return { n, values: new Float64Array(0), ...(wantVectors ? { vectors: new Float64Array(0) } : {}) };
  const A = Float64Array.from(a);
  const { d, e, tau } = tridiagonalise(A, n, options.progress);
  const values = tridiagonalEigenvalues(d, e);
  if (!wantVectors) return { n, values };
  const Z = tridiagonalEigenvectors(d, e, values, options.progress);
  applyReflectors(A, tau, n, Z, options.progress);
  return { n, values, vectors: Z };
}

/**
 * Householder tridiagonalisation in place. On return d, e hold T (e[k] = T[k+1][k], e[n−1] = 0) and the reflector
 * H_k = I − τ_k u_k u_kᵀ has u_k[k+1] = 1 and u_k[i] = A[i][k] for i ≥ k + 2.
 */
function tridiagonalise(A: Float64Array, n: number, progress?: SymmetricEigenOptions['progress']) {
  const d = new Float64Array(n), e = new Float64Array(n), tau = new Float64Array(n);
  const v = new Float64Array(n), p = new Float64Array(n);
  const vp = new Float64Array(n), wp = new Float64Array(n); // pending rank-2 update of the previous step
  const every = Math.max(1, Math.floor(n / 50));
  for (let k = 0; k < n - 2; k++) {
    // bring column k (rows ≥ k) up to date with the pending update
    for (let i = k; i < n; i++) A[i * n + k] -= vp[i] * wp[k] + wp[i] * vp[k];
    d[k] = A[k * n + k];
    let sigma = 0;
    for (let i = k + 2; i < n; i++) sigma += A[i * n + k] * A[i * n + k];
    const x0 = A[(k + 1) * n + k];
    v.fill(0, 0, k + 1);
    p.fill(0);
    let t = 0;
    if (sigma === 0) {
      e[k] = x0;
      v.fill(0, k + 1);
    } else {
      const mu = Math.sqrt(x0 * x0 + sigma);
      const alpha = x0 <= 0 ? mu : -mu; // H x = alpha e1, sign chosen against cancellation
      const v0 = x0 - alpha;
      t = -v0 / alpha;
      e[k] = alpha;
      v[k + 1] = 1;
      for (let i = k + 2; i < n; i++) {
        v[i] = A[i * n + k] / v0;
        A[i * n + k] = v[i];
      }
    }
    tau[k] = t;
    // fused pass over the trailing lower triangle: apply the pending update, accumulate p = A22 v;
    // two rows per sweep so each load of the short vectors serves both
    let i = k + 1;
    for (; i + 1 < n; i += 2) {
      const r0 = i * n, r1 = r0 + n;
      const v0 = vp[i], w0 = wp[i], u0 = v[i];
      const v1 = vp[i + 1], w1 = wp[i + 1], u1 = v[i + 1];
      let s0 = 0, s1 = 0;
      for (let j = k + 1; j < i; j++) {
        const vj = vp[j], wj = wp[j], uj = v[j];
        const x0 = A[r0 + j] - (v0 * wj + w0 * vj);
        const x1 = A[r1 + j] - (v1 * wj + w1 * vj);
        A[r0 + j] = x0;
        A[r1 + j] = x1;
        s0 += x0 * uj;
        s1 += x1 * uj;
        p[j] += x0 * u0 + x1 * u1;
      }
      const d0 = A[r0 + i] - 2 * v0 * w0;
      const off = A[r1 + i] - (v1 * w0 + w1 * v0);
      const d1 = A[r1 + i + 1] - 2 * v1 * w1;
      A[r0 + i] = d0;
      A[r1 + i] = off;
      A[r1 + i + 1] = d1;
      p[i] += s0 + d0 * u0 + off * u1;
      p[i + 1] += s1 + off * u0 + d1 * u1;
    }
    if (i < n) {
      const row = i * n;
      const vi = vp[i], wi = wp[i], ui = v[i];
      let s = 0;
      for (let j = k + 1; j < i; j++) {
        const x = A[row + j] - (vi * wp[j] + wi * vp[j]);
        A[row + j] = x;
        s += x * v[j];
        p[j] += x * ui;
      }
      const diag = A[row + i] - 2 * vi * wi;
      A[row + i] = diag;
      p[i] += s + diag * ui;
    }
    // w = τ p − (τ²/2)(pᵀv) v becomes the pending update A22 ← A22 − v wᵀ − w vᵀ
    let pv = 0;
    for (let i = k + 1; i < n; i++) pv += p[i] * v[i];
    const c = 0.5 * t * t * pv;
    vp.fill(0, 0, k + 1);
    wp.fill(0, 0, k + 1);
    for (let i = k + 1; i < n; i++) {
      vp[i] = v[i];
      wp[i] = t * p[i] - c * v[i];
    }
    if (progress && k % every === 0) progress('tridiagonalise', k / n);
  }
  // the last 2×2 block
  for (let i = Math.max(0, n - 2); i < n; i++)
    for (let j = Math.max(0, n - 2); j <= i; j++) A[i * n + j] -= vp[i] * wp[j] + wp[i] * vp[j];
  if (n >= 2) {
    d[n - 2] = A[(n - 2) * n + n - 2];
    e[n - 2] = A[(n - 1) * n + n - 2];
  }
  d[n - 1] = A[(n - 1) * n + n - 1];
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

/** Eigenvectors of the tridiagonal (d, e) for the given ascending eigenvalues, as columns of a row-major n×n matrix. */
function tridiagonalEigenvectors(d: Float64Array, e: Float64Array, values: Float64Array, progress?: SymmetricEigenOptions['progress']): Float64Array {
  const n = d.length;
  let norm = 0;
  for (let i = 0; i < n; i++) norm = Math.max(norm, Math.abs(d[i]) + Math.abs(e[i]) + (i > 0 ? Math.abs(e[i - 1]) : 0));
  if (norm === 0) norm = 1;
  const tiny = EPS * norm;
  const ortol = CLUSTER_GAP * norm;
  const Z = new Float64Array(n * n);
  const vecs: Float64Array[] = []; // the current cluster's vectors
  const U0 = new Float64Array(n), U1 = new Float64Array(n), U2 = new Float64Array(n), L = new Float64Array(n);
  const piv = new Uint8Array(n);
  let seed = 0x2545f491;
  const random = () => {
    seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
    return seed / 4294967296 - 0.5;
  };
  let shifted = -Infinity;
  const every = Math.max(1, Math.floor(n / 50));
  for (let j = 0; j < n; j++) {
    let lambda = values[j];
    if (j === 0 || lambda - values[j - 1] > ortol) vecs.length = 0; // a new cluster
    if (lambda - shifted < 10 * tiny) lambda = shifted + 10 * tiny; // keep shifts distinct inside a cluster
    shifted = lambda;
    factorShifted(d, e, lambda, tiny, U0, U1, U2, L, piv);
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = random();
    for (let it = 0; it < 3; it++) {
      solveShifted(U0, U1, U2, L, piv, x);
      for (const u of vecs) {
        let dot = 0;
        for (let i = 0; i < n; i++) dot += u[i] * x[i];
        for (let i = 0; i < n; i++) x[i] -= dot * u[i];
      }
      let s = 0;
      for (let i = 0; i < n; i++) s += x[i] * x[i];
      const inv = 1 / Math.sqrt(s);
      for (let i = 0; i < n; i++) x[i] *= inv;
    }
    // fix the sign (largest component positive) so results are reproducible
    let big = 0;
    for (let i = 1; i < n; i++) if (Math.abs(x[i]) > Math.abs(x[big])) big = i;
    if (x[big] < 0) for (let i = 0; i < n; i++) x[i] = -x[i];
    vecs.push(x);
    for (let i = 0; i < n; i++) Z[i * n + j] = x[i];
    if (progress && j % every === 0) progress('eigenvectors', j / n);
  }
  progress?.('eigenvectors', 1);
  return Z;
}

/** LU factorisation with partial pivoting of T − λI (upper factor with two superdiagonals; LAPACK dlagtf style). */
function factorShifted(d: Float64Array, e: Float64Array, lambda: number, tiny: number, U0: Float64Array, U1: Float64Array, U2: Float64Array, L: Float64Array, piv: Uint8Array): void {
  const n = d.length;
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

/** Solve (T − λI) x = y in place with the factors of {@link factorShifted}. */
function solveShifted(U0: Float64Array, U1: Float64Array, U2: Float64Array, L: Float64Array, piv: Uint8Array, y: Float64Array): void {
  const n = y.length;
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
  // guard against overflow in nearly singular solves: rescale (the caller normalises anyway)
  let big = 0;
  for (let k = 0; k < n; k++) big = Math.max(big, Math.abs(y[k]));
  if (big > 1e150 || (big > 0 && big < 1e-150)) for (let k = 0; k < n; k++) y[k] /= big;
}

/** Z ← Q Z with Q = H_0 H_1 ⋯ H_{n−3}, the reflectors applied in blocks as I − U T Uᵀ (LAPACK dlarft/dlarfb). */
function applyReflectors(A: Float64Array, tau: Float64Array, n: number, Z: Float64Array, progress?: SymmetricEigenOptions['progress']): void {
  const count = n - 2;
  if (count <= 0) return;
  const CHUNK = 256;
  const W = new Float64Array(BLOCK * CHUNK);
  const T = new Float64Array(BLOCK * BLOCK);
  const U = new Float64Array(n * BLOCK); // U[i·BLOCK + r] = u_{k0+r}[i]
  const blocks = Math.ceil(count / BLOCK);
  for (let bi = blocks - 1; bi >= 0; bi--) {
    const k0 = bi * BLOCK;
    const b = Math.min(BLOCK, count - k0);
    U.fill(0);
    for (let r = 0; r < b; r++) {
      U[(k0 + r + 1) * BLOCK + r] = 1;
      for (let i = k0 + r + 2; i < n; i++) U[i * BLOCK + r] = A[i * n + k0 + r];
    }
    // T (upper triangular): T_jj = τ_j, T[0:j, j] = −τ_j T[0:j, 0:j] (U[:, 0:j]ᵀ u_j)
    T.fill(0);
    const dots = new Float64Array(BLOCK);
    for (let j = 0; j < b; j++) {
      const tj = tau[k0 + j];
      T[j * BLOCK + j] = tj;
      if (j === 0 || tj === 0) continue;
      dots.fill(0);
      for (let i = k0 + j + 1; i < n; i++) {
        const uj = U[i * BLOCK + j];
        for (let r = 0; r < j; r++) dots[r] += U[i * BLOCK + r] * uj;
      }
      for (let r = 0; r < j; r++) {
        let acc = 0;
        for (let c = r; c < j; c++) acc += T[r * BLOCK + c] * dots[c];
        T[r * BLOCK + j] = -tj * acc;
      }
    }
    const bq = b - (b % 4);
    for (let c0 = 0; c0 < n; c0 += CHUNK) {
      const cw = Math.min(CHUNK, n - c0);
      W.fill(0);
      // W = Uᵀ Z (rows k0+1 … n−1), four reflectors per pass over a row of Z
      for (let i = k0 + 1; i < n; i++) {
        const zi = i * n + c0, ui = i * BLOCK;
        let r = 0;
        for (; r < bq; r += 4) {
          const u0 = U[ui + r], u1 = U[ui + r + 1], u2 = U[ui + r + 2], u3 = U[ui + r + 3];
          if (u0 === 0 && u1 === 0 && u2 === 0 && u3 === 0) continue;
          const w0 = r * CHUNK, w1 = w0 + CHUNK, w2 = w1 + CHUNK, w3 = w2 + CHUNK;
          for (let c = 0; c < cw; c++) {
            const z = Z[zi + c];
            W[w0 + c] += u0 * z;
            W[w1 + c] += u1 * z;
            W[w2 + c] += u2 * z;
            W[w3 + c] += u3 * z;
          }
        }
        for (; r < b; r++) {
          const ur = U[ui + r];
          if (ur === 0) continue;
          const wr = r * CHUNK;
          for (let c = 0; c < cw; c++) W[wr + c] += ur * Z[zi + c];
        }
      }
      // W ← T W (upper triangular, in place from the top row)
      for (let r = 0; r < b; r++) {
        const wr = r * CHUNK;
        const trr = T[r * BLOCK + r];
        for (let c = 0; c < cw; c++) W[wr + c] *= trr;
        for (let q = r + 1; q < b; q++) {
          const trq = T[r * BLOCK + q];
          if (trq === 0) continue;
          const wq = q * CHUNK;
          for (let c = 0; c < cw; c++) W[wr + c] += trq * W[wq + c];
        }
      }
      // Z −= U W, four reflectors per pass
      for (let i = k0 + 1; i < n; i++) {
        const zi = i * n + c0, ui = i * BLOCK;
        let r = 0;
        for (; r < bq; r += 4) {
          const u0 = U[ui + r], u1 = U[ui + r + 1], u2 = U[ui + r + 2], u3 = U[ui + r + 3];
          if (u0 === 0 && u1 === 0 && u2 === 0 && u3 === 0) continue;
          const w0 = r * CHUNK, w1 = w0 + CHUNK, w2 = w1 + CHUNK, w3 = w2 + CHUNK;
          for (let c = 0; c < cw; c++) Z[zi + c] -= u0 * W[w0 + c] + u1 * W[w1 + c] + u2 * W[w2 + c] + u3 * W[w3 + c];
        }
        for (; r < b; r++) {
          const ur = U[ui + r];
          if (ur === 0) continue;
          const wr = r * CHUNK;
          for (let c = 0; c < cw; c++) Z[zi + c] -= ur * W[wr + c];
        }
      }
    }
    progress?.('back-transform', (blocks - bi) / blocks);
  }
}
