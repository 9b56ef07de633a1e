/**
 * The pieces under the eigensolver: the WebAssembly SIMD kernels (src/math/simd-kernels.ts) against plain loops,
 * the Gram matrix (src/math/gram-matrix.ts), and the thread team (src/math/thread-team.ts): errors on a worker
 * reach the caller, a closed team refuses work. References are the defining formulas (common practice).
 */
import { afterAll, describe, expect, test } from 'vitest';
import { Workspace, instantiateKernels } from '../../src/math/simd-kernels.js';
import { gramInWorkspace, gramMatrix } from '../../src/math/gram-matrix.js';
import { ThreadTeam } from '../../src/math/thread-team.js';
import { expectClose } from '../helpers/tolerance.js';
import { seededRandom } from '../helpers/random.js';

const EPS = 2 ** -52;

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

const team2 = new ThreadTeam(2);
afterAll(() => team2.close());

/**
 * C = A B by plain loops, with Σ_p |A(i,p) B(p,j)| per entry: the rounding of a dot product of length `depth` is
 * below depth·ε·Σ|ab| (common practice), so errors are reported in units of that bound.
 */
function plainProduct(m: number, cols: number, depth: number, a: (i: number, p: number) => number, b: (p: number, j: number) => number) {
  const value = new Float64Array(m * cols), bound = new Float64Array(m * cols);
  for (let i = 0; i < m; i++)
    for (let j = 0; j < cols; j++) {
      let s = 0, abs = 0;
      for (let p = 0; p < depth; p++) {
        const t = a(i, p) * b(p, j);
        s += t;
        abs += Math.abs(t);
      }
      value[i * cols + j] = s;
      bound[i * cols + j] = depth * EPS * abs;
    }
  return { value, bound };
}

function fillRandom(a: Float64Array, seed: number): void {
  const rand = seededRandom(seed);
  for (let i = 0; i < a.length; i++) a[i] = rand() - 0.5;
}

describe('SIMD kernels', () => {
  test.each([
    ['gemm', 1, 1, 1],
    ['gemm', 2, 3, 4],
    ['gemm', 5, 7, 9],
    ['gemm', 4, 8, 4],
    ['gemm', 33, 129, 130],
    ['gemmTile', 1, 1, 1],
    ['gemmTile', 1, 7, 5],
    ['gemmTile', 5, 6, 3],
    ['gemmTile', 9, 1, 70],
    ['gemmTile', 33, 130, 64],
  ] as const)('%s C += α A B against plain loops (m = %i, cols = %i, depth = %i; odd sizes use the edges), A read transposed and row-wise', (kernel, m, cols, depth) => {
    for (const transposed of [true, false]) {
      const ws = new Workspace({ C: m * cols, A: depth * m, B: depth * cols });
      const k = instantiateKernels(ws.memory);
      const Cm = ws.view('C'), A = ws.view('A'), B = ws.view('B');
      fillRandom(Cm, 1 + m);
      fillRandom(A, 2 + cols);
      fillRandom(B, 3 + depth);
      const before = Float64Array.from(Cm);
      // transposed: A(i, p) = A[p·m + i], as in W = Uᵀ Z; row-wise: A(i, p) = A[i·depth + p], as in Z −= U W
      const aOf = transposed ? (i: number, p: number) => A[p * m + i] : (i: number, p: number) => A[i * depth + p];
      const [aRow, aCol] = transposed ? [8, m * 8] : [depth * 8, 8];
      k[kernel](ws.at('C'), cols * 8, ws.at('A'), aRow, aCol, ws.at('B'), cols * 8, m, cols, depth, -1.5);
      const ref = plainProduct(m, cols, depth, aOf, (p, j) => B[p * cols + j]);
      for (let e = 0; e < m * cols; e++) expectClose(Cm[e], before[e] - 1.5 * ref.value[e], 0, 4 * (1.5 * ref.bound[e] + EPS), `C entry ${e}`);
    }
  });

  test('tridiagonalPass: the rank-2 update of the trailing lower triangle and p = A22 v, in two row ranges (the upper triangle is never touched)', () => {
    const n = 13, k = 2;
    const ws = new Workspace({ A: n * n, vp: n, wp: n, v: n, p: n });
    const K = instantiateKernels(ws.memory);
    const A = ws.view('A'), vp = ws.view('vp'), wp = ws.view('wp'), v = ws.view('v'), p = ws.view('p');
    [A, vp, wp, v].forEach((x, i) => fillRandom(x, 20 + i));
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) A[i * n + j] = NaN;
    const ref = Float64Array.from(A), pRef = new Float64Array(n);
    for (let i = k + 1; i < n; i++)
      for (let j = k + 1; j <= i; j++) {
        const x = (ref[i * n + j] -= vp[i] * wp[j] + wp[i] * vp[j]);
        pRef[i] += x * v[j];
        if (j < i) pRef[j] += x * v[i];
      }
    // an odd and an even range, so both the row pairs and the single last row run
    K.tridiagonalPass(ws.at('A'), n, k, k + 1, 8, ws.at('vp'), ws.at('wp'), ws.at('v'), ws.at('p'));
    K.tridiagonalPass(ws.at('A'), n, k, 8, n, ws.at('vp'), ws.at('wp'), ws.at('v'), ws.at('p'));
    expect(Array.from(A)).toEqual(Array.from(ref)); // same rounding: x = A − (vp_i wp_j + wp_i vp_j) in both
    for (let i = 0; i < n; i++) expectClose(p[i], pRef[i], 0, 16 * n * EPS, `p${i}`);
    for (let i = 0; i <= k; i++) expect(p[i]).toBe(0);
  });

  test('symmetricProduct: p += A22 v from the lower triangle in row ranges of blocks of four and single rows, A unchanged, upper triangle never read', () => {
    const n = 17, k = 2;
    const ws = new Workspace({ A: n * n, v: n, p: n });
    const K = instantiateKernels(ws.memory);
    const A = ws.view('A'), v = ws.view('v'), p = ws.view('p');
    fillRandom(A, 31);
    fillRandom(v, 32);
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) A[i * n + j] = NaN;
    const before = Float64Array.from(A);
    const pRef = new Float64Array(n), bound = new Float64Array(n);
    for (let i = k + 1; i < n; i++)
      for (let j = k + 1; j <= i; j++) {
        pRef[i] += A[i * n + j] * v[j];
        bound[i] += Math.abs(A[i * n + j] * v[j]);
        if (j < i) {
          pRef[j] += A[i * n + j] * v[i];
          bound[j] += Math.abs(A[i * n + j] * v[i]);
        }
      }
    // ranges of 6 rows (one block of four, two single rows) and 8 rows (two blocks)
    K.symmetricProduct(ws.at('A'), n, k, k + 1, 9, ws.at('v'), ws.at('p'));
    K.symmetricProduct(ws.at('A'), n, k, 9, n, ws.at('v'), ws.at('p'));
    expect(bytes(A).equals(bytes(before))).toBe(true);
    for (let i = 0; i < n; i++) expectClose(p[i], pRef[i], 0, 4 * n * EPS * bound[i] + 1e-300, `p${i}`);
    for (let i = 0; i <= k; i++) expect(p[i]).toBe(0);
  });
});

describe('gramMatrix', () => {
  test.each([
    [7, 5],
    [130, 301],
  ])('G = Xᵀ X for %i×%i (tiles, mirrored upper triangle), on 2 threads the same bits as on 1', (rows, cols) => {
    const X = new Float64Array(rows * cols);
    fillRandom(X, rows * cols);
    const G = gramMatrix(X, rows, cols, { team: team2 });
    const G1 = gramMatrix(X, rows, cols, { team: new ThreadTeam(1) });
    const ref = plainProduct(cols, cols, rows, (r, k) => X[k * cols + r], (k, c) => X[k * cols + c]);
    let worst = 0, symmetric = true;
    for (let r = 0; r < cols; r++)
      for (let c = 0; c < cols; c++) {
        worst = Math.max(worst, Math.abs(G[r * cols + c] - ref.value[r * cols + c]) / ref.bound[r * cols + c]);
        if (G[r * cols + c] !== G[c * cols + r]) symmetric = false;
      }
    expect(worst).toBeLessThanOrEqual(4); // in units of the rounding bound
    expect(symmetric).toBe(true);
    expect(bytes(G).equals(bytes(G1))).toBe(true);
  });
  test('lowerOnly: the lower triangle as in the full product, no mirroring into the upper triangle', () => {
    const rows = 9, cols = 70; // 70 > one tile of rows, so a diagonal tile ends inside the matrix
    const ws = new Workspace({ X: rows * cols, G: cols * cols });
    fillRandom(ws.view('X'), 5);
    ws.view('G').fill(-7);
    const team = new ThreadTeam(1);
    team.attach(ws);
    const G = gramInWorkspace(team, ws, 'X', 'G', rows, cols, { lowerOnly: true });
    const full = gramMatrix(ws.view('X').slice(), rows, cols);
    let lowerSame = true;
    for (let r = 0; r < cols; r++) for (let c = 0; c <= r; c++) if (G[r * cols + c] !== full[r * cols + c]) lowerSame = false;
    expect(lowerSame).toBe(true);
    expect(G[cols - 1]).toBe(-7); // row 0, last column: outside every tile of the lower triangle
  });
  test('a matrix of the wrong size is refused', () => {
    expect(() => gramMatrix(new Float64Array(5), 2, 3)).toThrow('matrix has 5 entries, expected 2×3');
  });
});

describe('ThreadTeam', () => {
  test('an error on any thread (here a kernel reading outside the memory) reaches the caller, and the team keeps working', () => {
    const ws = new Workspace({ X: 64, G: 64 });
    team2.attach(ws);
    // a gram tile whose X pointer lies far outside the 64 KiB memory
    const tiles = (x: number) => [ws.at('G'), 64, x, 8, 64, x, 64, 8, 8, 1, 4, 4, 8, 1]; // G = Xᵀ X, 8×8
    expect(() => team2.run('lowerTiles', tiles(1 << 30))).toThrow(/out of bounds/);
    ws.view('X').fill(1);
    team2.run('lowerTiles', tiles(ws.at('X')));
    expect(ws.view('G')[0]).toBe(8);
    team2.attach(null);
  });
  test('sizes must be positive integers; a closed team refuses work', () => {
    expect(() => new ThreadTeam(0)).toThrow('thread team size must be a positive integer, got 0');
    const team = new ThreadTeam(2);
    team.close();
    team.close();
    expect(() => team.run('lowerTiles', [])).toThrow('thread team is closed');
  });
});
