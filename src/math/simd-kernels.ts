/**
 * The dense kernels behind the eigensolver and the cluster covariance, as WebAssembly with 128-bit SIMD
 * (two f64 lanes), written with src/math/wasm-builder.ts. Plain JavaScript cannot vectorise: measured here, the
 * product kernel runs at about three times the speed of the best register-blocked scalar JavaScript.
 *
 * All matrices live in one shared linear memory (a `Workspace`), so worker threads (src/math/thread-team.ts)
 * can run the same kernels on disjoint parts of the same arrays. Pointers and strides are in bytes.
 */
import { FunctionBuilder, encodeModule, type PlainOp } from './wasm-builder.js';

/** The exported kernels (see the builders below for the exact semantics). */
export interface Kernels {
  /** C[i][j] += alpha Σ_p A(i, p) B[p][j] for i < m, j < cols, p < depth; A(i, p) at a + i·aRow + p·aCol. */
  gemm(c: number, ldc: number, a: number, aRow: number, aCol: number, b: number, ldb: number, m: number, cols: number, depth: number, alpha: number): void;
  /**
   * C[i][j] += alpha Σ_p A(i, p) B[p][j], the same product as `gemm` with the sum over p kept in registers for a
   * 4×4 tile of C (then added to C once): fewer loads and stores per multiply, so it is the faster kernel for
   * depths of tens or more. Rounding: C + alpha·(Σ_p a·b summed in order of p).
   */
  gemmTile(c: number, ldc: number, a: number, aRow: number, aCol: number, b: number, ldb: number, m: number, cols: number, depth: number, alpha: number): void;
  /**
   * One step of the fused Householder tridiagonalisation over rows [rowStart, rowEnd) of the trailing lower
   * triangle (columns k+1 … i): A ← A − vp wpᵀ − wp vpᵀ (the pending rank-2 update) and p += A v.
   */
  tridiagonalPass(a: number, n: number, k: number, rowStart: number, rowEnd: number, vp: number, wp: number, v: number, p: number): void;
  /**
   * p += A v over rows [rowStart, rowEnd) of the lower triangle, columns k+1 … i, reading A without changing it
   * (the symmetric product of the blocked reduction; the product half of `tridiagonalPass`).
   */
  symmetricProduct(a: number, n: number, k: number, rowStart: number, rowEnd: number, v: number, p: number): void;
}

/**
 * The parts of the WebAssembly JavaScript API used here (the project compiles without the DOM type library, which
 * is where TypeScript declares them).
 */
export interface WasmMemory {
  readonly buffer: SharedArrayBuffer;
}
export interface WasmModule {
  readonly __brand?: 'WebAssembly.Module';
}
interface WasmApi {
  Memory: new (descriptor: { initial: number; maximum: number; shared: true }) => WasmMemory;
  Module: new (bytes: Uint8Array) => WasmModule;
  Instance: new (module: WasmModule, imports: object) => { exports: object };
}
const wasm = (globalThis as unknown as { WebAssembly: WasmApi }).WebAssembly;

/** WebAssembly page size, bytes. */
const PAGE = 65536;
/** Largest linear memory of 32-bit WebAssembly (65 536 pages = 4 GiB). */
const MAX_PAGES = 65536;

let compiled: WasmModule | undefined;

/** The compiled kernel module (built and compiled once; the workers receive it compiled). */
export function kernelModule(): WasmModule {
  compiled ??= new wasm.Module(kernelModuleBytes());
  return compiled;
}

/** The kernels bound to a memory. */
export function instantiateKernels(memory: WasmMemory, module: WasmModule = kernelModule()): Kernels {
  return new wasm.Instance(module, { env: { memory } }).exports as unknown as Kernels;
}

/**
 * Shared linear memory holding named Float64 arrays; `at(name)` is the byte offset (16-byte aligned) and
 * `view(name)` a Float64Array on it.
 */
export class Workspace {
  readonly memory: WasmMemory;
  readonly f64: Float64Array;
  private readonly offsets = new Map<string, { at: number; length: number }>();

  /** Lay out the arrays (lengths in f64) in `reuse` when it is large enough, else in a new memory of just that size. */
  constructor(sizes: Record<string, number>, reuse?: WasmMemory) {
    let bytes = 0;
    const layout: [string, number, number][] = [];
    for (const [name, length] of Object.entries(sizes)) {
      layout.push([name, bytes, length]);
      bytes += Math.ceil((length * 8) / 16) * 16;
    }
    if (reuse && reuse.buffer.byteLength >= bytes) this.memory = reuse;
    else {
      const pages = Math.max(1, Math.ceil(bytes / PAGE));
      if (pages > MAX_PAGES) throw new RangeError(`workspace of ${bytes} bytes exceeds the 4 GiB WebAssembly memory`);
      this.memory = new wasm.Memory({ initial: pages, maximum: pages, shared: true });
    }
    this.f64 = new Float64Array(this.memory.buffer);
    for (const [name, at, length] of layout) this.offsets.set(name, { at, length });
  }

  at(name: string): number {
    return this.entry(name).at;
  }
  view(name: string): Float64Array {
    const r = this.entry(name);
    return this.f64.subarray(r.at / 8, r.at / 8 + r.length);
  }
  private entry(name: string) {
    const r = this.offsets.get(name);
    if (!r) throw new Error(`no workspace array ${name}`);
    return r;
  }
}

/** The module bytes: all kernels. */
export function kernelModuleBytes(): Uint8Array {
  return encodeModule([gemmKernel(), tridiagonalPassKernel(), gemmTileKernel(), symmetricProductKernel()], { shared: true, maximumPages: MAX_PAGES });
}

/** A loop body written once for two f64 lanes (v128, the column pairs) and for one (f64, an odd last column). */
interface Lanes {
  bytes: number;
  load(f: FunctionBuilder): void;
  store(f: FunctionBuilder): void;
  mul: PlainOp;
  add: PlainOp;
  sub: PlainOp;
}
const PAIR: Lanes = { bytes: 16, load: (f) => f.loadV128(), store: (f) => f.storeV128(), mul: 'f64x2.mul', add: 'f64x2.add', sub: 'f64x2.sub' };
const SINGLE: Lanes = { bytes: 8, load: (f) => f.loadF64(), store: (f) => f.storeF64(), mul: 'f64.mul', add: 'f64.add', sub: 'f64.sub' };

/**
 * gemm: rows of C in pairs and depth in fours (a 2×4 block of A in eight splatted registers), the columns j in
 * SIMD pairs with a scalar last column when `cols` is odd; remainders of m and depth by 1-row / 1-deep blocks.
 * Each C element gets c + x0·y0 + x1·y1 + … in the same order in every lane, so results do not depend on how the
 * columns are split between calls.
 */
function gemmKernel(): FunctionBuilder {
  const f = new FunctionBuilder('gemm', ['i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'f64']);
  const [C, LDC, A, AROW, ACOL, B, LDB, M, COLS, DEPTH, ALPHA] = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const i = f.local('i32'), p = f.local('i32'), t = f.local('i32'), jb = f.local('i32');
  const limit = f.local('i32'), rowLimit = f.local('i32'), pairs = f.local('i32');
  const cRow = [f.local('i32'), f.local('i32')], aRow = [f.local('i32'), f.local('i32')];
  const aAt = f.local('i32');
  const bRow = [f.local('i32'), f.local('i32'), f.local('i32'), f.local('i32')];
  // A(i+r, p+d)·alpha, splatted (x: its lane 0 serves the odd column, so no more registers are live in the loop);
  // rows of B at column j (y, ys)
  const x = [0, 1].map(() => [0, 1, 2, 3].map(() => f.local('v128')));
  const y = [0, 1, 2, 3].map(() => f.local('v128'));
  const ys = [0, 1, 2, 3].map(() => f.local('f64'));

  f.get(COLS).i32(1).op('i32.shr_s').set(pairs);

  /** C[i+r][j…] += Σ_d x[r][d] B[p+d][j…] for one column pair or one column; jb advances */
  const columns = (L: Lanes, rows: number, depth: number) => {
    const yy = L === PAIR ? y : ys;
    for (let d = 0; d < depth; d++) {
      f.get(bRow[d]).get(jb).op('i32.add');
      L.load(f);
      f.set(yy[d]);
    }
    for (let r = 0; r < rows; r++) {
      f.get(cRow[r]).get(jb).op('i32.add'); // store address
      f.get(cRow[r]).get(jb).op('i32.add');
      L.load(f);
      for (let d = 0; d < depth; d++) {
        f.get(x[r][d]);
        if (L === SINGLE) f.extractLane(0);
        f.get(yy[d]).op(L.mul, L.add);
      }
      L.store(f);
    }
    f.get(jb).i32(L.bytes).op('i32.add').set(jb);
  };
  /** C rows i … i+rows−1 += A(i.., p..p+depth−1) B(p.., :) */
  const block = (rows: number, depth: number) => {
    for (let r = 0; r < rows; r++) {
      // A(i+r, p+d): aRow[r] + p·ACOL + d·ACOL
      f.get(aRow[r]).get(p).get(ACOL).op('i32.mul', 'i32.add').set(aAt);
      for (let d = 0; d < depth; d++) {
        f.get(ALPHA).get(aAt).loadF64().op('f64.mul', 'f64x2.splat').set(x[r][d]);
        if (d + 1 < depth) f.get(aAt).get(ACOL).op('i32.add').set(aAt);
      }
    }
    f.get(B).get(p).get(LDB).op('i32.mul', 'i32.add').set(bRow[0]);
    for (let d = 1; d < depth; d++) f.get(bRow[d - 1]).get(LDB).op('i32.add').set(bRow[d]);
    f.i32(0).set(jb).i32(0).set(t);
    f.whileLess(t, pairs, 1, () => columns(PAIR, rows, depth));
    f.get(COLS).i32(1).op('i32.and').ifTrue(() => columns(SINGLE, rows, depth));
  };
  /** all depth for rows i … i+rows−1 */
  const rowsBlock = (rows: number) => {
    f.get(C).get(i).get(LDC).op('i32.mul', 'i32.add').set(cRow[0]);
    f.get(A).get(i).get(AROW).op('i32.mul', 'i32.add').set(aRow[0]);
    if (rows === 2) {
      f.get(cRow[0]).get(LDC).op('i32.add').set(cRow[1]);
      f.get(aRow[0]).get(AROW).op('i32.add').set(aRow[1]);
    }
    f.i32(0).set(p);
    f.get(DEPTH).i32(-4).op('i32.and').set(limit);
    f.whileLess(p, limit, 4, () => block(rows, 4));
    f.whileLess(p, DEPTH, 1, () => block(rows, 1));
  };
  f.i32(0).set(i);
  f.get(M).i32(-2).op('i32.and').set(rowLimit);
  f.whileLess(i, rowLimit, 2, () => rowsBlock(2));
  f.get(M).i32(1).op('i32.and').ifTrue(() => rowsBlock(1));
  return f;
}

/** The locals (and parameters) of a row block in the lower-triangle passes, as indices. */
interface RowBlock {
  A: number;
  N: number;
  K: number;
  V: number;
  i: number;
  jp: number;
  count: number;
  pairs: number;
  t: number;
  us: number[];
  uv: number[];
  rowPtr: number[];
  sv: number[];
}

/**
 * Start of a block of rows i … i+rows−1 in the lower-triangle passes: per row r, v_(i+r) (scalar `us[r]`, splatted
 * `uv[r]`), the row pointer at A[i+r][k+1] and a zero row sum `sv[r]`; then jp = byte offset of column k+1,
 * count = i − k − 1 (the columns before the block's first diagonal), pairs = count/2 and the pair counter t = 0.
 */
function startRowBlock(f: FunctionBuilder, b: RowBlock, rows: number): void {
  for (let r = 0; r < rows; r++) {
    f.get(b.V).get(b.i).i32(3).op('i32.shl', 'i32.add').loadF64(8 * r).tee(b.us[r]).op('f64x2.splat').set(b.uv[r]);
    f.get(b.A).get(b.i).i32(r).op('i32.add').get(b.N).op('i32.mul').get(b.K).op('i32.add').i32(1).op('i32.add').i32(3).op('i32.shl', 'i32.add').set(b.rowPtr[r]);
    f.zeroV128().set(b.sv[r]);
  }
  f.get(b.K).i32(1).op('i32.add').i32(3).op('i32.shl').set(b.jp);
  f.get(b.i).get(b.K).op('i32.sub').i32(1).op('i32.sub').set(b.count);
  f.get(b.count).i32(1).op('i32.shr_s').set(b.pairs);
  f.i32(0).set(b.t);
}

/**
 * tridiagonalPass(a, n, k, rowStart, rowEnd, vp, wp, v, p): for each row i in [rowStart, rowEnd) (in pairs,
 * sharing the loads of vp, wp, v, p), with x = A[i][j] − (vp_i wp_j + wp_i vp_j) stored back:
 *   p[j] += x v_i (j < i),  p[i] += Σ_{j<i} x v_j + A[i][i] v_i  (A[i][i] updated the same way),
 * over columns j = k+1 … i, i.e. the symmetric product p = A22 v from the lower triangle only.
 * Vectors are byte pointers to arrays indexed like the rows; `a` is row-major n×n.
 */
function tridiagonalPassKernel(): FunctionBuilder {
  const f = new FunctionBuilder('tridiagonalPass', ['i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32']);
  const [A, N, K, START, END, VP, WP, V, P] = [0, 1, 2, 3, 4, 5, 6, 7, 8];
  const i = f.local('i32'), t = f.local('i32'), jp = f.local('i32'), pairs = f.local('i32'), count = f.local('i32');
  const rowLimit = f.local('i32'), evenPairs = f.local('i32');
  const rowPtr = [f.local('i32'), f.local('i32')];
  const vs = [f.local('f64'), f.local('f64')], ws = [f.local('f64'), f.local('f64')], us = [f.local('f64'), f.local('f64')];
  const vv = [f.local('v128'), f.local('v128')], wv = [f.local('v128'), f.local('v128')], uv = [f.local('v128'), f.local('v128')];
  const sv = [f.local('v128'), f.local('v128')], xv = [f.local('v128'), f.local('v128')];
  const vj = f.local('v128'), wj = f.local('v128'), uj = f.local('v128');
  const ss = [f.local('f64'), f.local('f64')], xs = [f.local('f64'), f.local('f64')];
  const vjs = f.local('f64'), wjs = f.local('f64'), ujs = f.local('f64');
  const diag = [f.local('f64'), f.local('f64')], off = f.local('f64');

  /** one column pair (or one column) j of rows i…: x = A − (v_i wp_j + w_i vp_j) stored, s += x v_j, p_j += Σ x v_i */
  const column = (L: Lanes, rows: number) => {
    const [vjL, wjL, ujL, vr, wr, ur, xL, sL] = L === PAIR ? [vj, wj, uj, vv, wv, uv, xv, sv] : [vjs, wjs, ujs, vs, ws, us, xs, ss];
    for (const [array, into] of [[VP, vjL], [WP, wjL], [V, ujL]] as const) {
      f.get(array).get(jp).op('i32.add');
      L.load(f);
      f.set(into);
    }
    for (let r = 0; r < rows; r++) {
      f.get(rowPtr[r]);
      f.get(rowPtr[r]);
      L.load(f);
      f.get(vr[r]).get(wjL).op(L.mul).get(wr[r]).get(vjL).op(L.mul, L.add, L.sub).tee(xL[r]);
      L.store(f);
      f.get(sL[r]).get(xL[r]).get(ujL).op(L.mul, L.add).set(sL[r]);
      f.get(rowPtr[r]).i32(L.bytes).op('i32.add').set(rowPtr[r]);
    }
    f.get(P).get(jp).op('i32.add');
    f.get(P).get(jp).op('i32.add');
    L.load(f);
    f.get(xL[0]).get(ur[0]).op(L.mul);
    if (rows === 2) f.get(xL[1]).get(ur[1]).op(L.mul, L.add);
    f.op(L.add);
    L.store(f);
    f.get(jp).i32(L.bytes).op('i32.add').set(jp);
  };
  const rowsBlock = (rows: number) => {
    for (let r = 0; r < rows; r++) {
      // scalars of row i+r
      f.get(VP).get(i).i32(3).op('i32.shl', 'i32.add').loadF64(8 * r).tee(vs[r]).op('f64x2.splat').set(vv[r]);
      f.get(WP).get(i).i32(3).op('i32.shl', 'i32.add').loadF64(8 * r).tee(ws[r]).op('f64x2.splat').set(wv[r]);
    }
    startRowBlock(f, { A, N, K, V, i, jp, count, pairs, t, us, uv, rowPtr, sv }, rows);
    f.get(pairs).i32(-2).op('i32.and').set(evenPairs);
    f.whileLess(t, evenPairs, 2, () => {
      column(PAIR, rows);
      column(PAIR, rows);
    });
    f.get(pairs).i32(1).op('i32.and').ifTrue(() => column(PAIR, rows));
    for (let r = 0; r < rows; r++) f.get(sv[r]).extractLane(0).get(sv[r]).extractLane(1).op('f64.add').set(ss[r]);
    f.get(count).i32(1).op('i32.and').ifTrue(() => column(SINGLE, rows)); // odd column left over
    // diagonal (rowPtr[0] at A[i][i], rowPtr[1] at A[i+1][i]); jp now indexes entry i
    f.get(rowPtr[0]);
    f.get(rowPtr[0]).loadF64().f64(2).get(vs[0]).op('f64.mul').get(ws[0]).op('f64.mul', 'f64.sub').tee(diag[0]);
    f.storeF64();
    if (rows === 1) {
      f.get(P).get(jp).op('i32.add');
      f.get(P).get(jp).op('i32.add').loadF64().get(ss[0]).get(diag[0]).get(us[0]).op('f64.mul', 'f64.add', 'f64.add').storeF64();
      return;
    }
    f.get(rowPtr[1]);
    f.get(rowPtr[1]).loadF64().get(vs[1]).get(ws[0]).op('f64.mul').get(ws[1]).get(vs[0]).op('f64.mul', 'f64.add', 'f64.sub').tee(off);
    f.storeF64();
    f.get(rowPtr[1]);
    f.get(rowPtr[1]).loadF64(8).f64(2).get(vs[1]).op('f64.mul').get(ws[1]).op('f64.mul', 'f64.sub').tee(diag[1]);
    f.storeF64(8);
    // p[i] += s0 + d0 u0 + off u1; p[i+1] += s1 + off u0 + d1 u1
    f.get(P).get(jp).op('i32.add');
    f.get(P).get(jp).op('i32.add').loadF64().get(ss[0]).get(diag[0]).get(us[0]).op('f64.mul', 'f64.add').get(off).get(us[1]).op('f64.mul', 'f64.add', 'f64.add').storeF64();
    f.get(P).get(jp).op('i32.add');
    f.get(P).get(jp).op('i32.add').loadF64(8).get(ss[1]).get(off).get(us[0]).op('f64.mul', 'f64.add').get(diag[1]).get(us[1]).op('f64.mul', 'f64.add', 'f64.add').storeF64(8);
  };
  f.get(START).set(i);
  f.get(END).get(START).op('i32.sub').i32(-2).op('i32.and').get(START).op('i32.add').set(rowLimit);
  f.whileLess(i, rowLimit, 2, () => rowsBlock(2));
  f.get(END).get(START).op('i32.sub').i32(1).op('i32.and').ifTrue(() => rowsBlock(1));
  return f;
}

/**
 * gemmTile: C tiles of up to 4 rows × 4 columns (eight v128 accumulators), each summed over the whole depth with
 * one splatted A(i, p) per row and two v128 loads of B[p] per step, then C += alpha·acc. Row remainders run as
 * single rows, column remainders as a pair and a single column (lane 0 of the accumulators).
 */
function gemmTileKernel(): FunctionBuilder {
  const f = new FunctionBuilder('gemmTile', ['i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'f64']);
  const [C, LDC, A, AROW, ACOL, B, LDB, M, COLS, DEPTH, ALPHA] = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const i = f.local('i32'), j = f.local('i32'), p = f.local('i32');
  const rowLimit = f.local('i32'), colLimit = f.local('i32'), bAt = f.local('i32'), cAt = f.local('i32');
  const aAt = [0, 1, 2, 3].map(() => f.local('i32'));
  const acc = [0, 1, 2, 3].map(() => [f.local('v128'), f.local('v128')]);
  const bv = [f.local('v128'), f.local('v128')], av = f.local('v128'), alpha = f.local('v128');
  f.get(ALPHA).op('f64x2.splat').set(alpha);

  /** the tile of `rows` rows from i and `cols` (4, 2 or 1) columns from j */
  const tile = (rows: number, cols: 4 | 2 | 1) => {
    const vectors = cols === 4 ? 2 : 1;
    for (let r = 0; r < rows; r++) {
      f.get(A).get(i).get(AROW).op('i32.mul', 'i32.add');
      if (r > 0) f.get(AROW).i32(r).op('i32.mul', 'i32.add');
      f.set(aAt[r]);
      for (let h = 0; h < vectors; h++) f.zeroV128().set(acc[r][h]);
    }
    f.get(B).get(j).i32(3).op('i32.shl', 'i32.add').set(bAt);
    f.i32(0).set(p);
    f.whileLess(p, DEPTH, 1, () => {
      for (let h = 0; h < vectors; h++) {
        f.get(bAt);
        if (cols === 1) f.loadSplatF64();
        else f.loadV128(16 * h);
        f.set(bv[h]);
      }
      for (let r = 0; r < rows; r++) {
        f.get(aAt[r]).loadSplatF64().set(av);
        for (let h = 0; h < vectors; h++) f.get(acc[r][h]).get(av).get(bv[h]).op('f64x2.mul', 'f64x2.add').set(acc[r][h]);
        f.get(aAt[r]).get(ACOL).op('i32.add').set(aAt[r]);
      }
      f.get(bAt).get(LDB).op('i32.add').set(bAt);
    });
    for (let r = 0; r < rows; r++) {
      f.get(C).get(i).i32(r).op('i32.add').get(LDC).op('i32.mul', 'i32.add').get(j).i32(3).op('i32.shl', 'i32.add').set(cAt);
      for (let h = 0; h < vectors; h++) {
        f.get(cAt);
        if (cols === 1) {
          f.get(cAt).loadF64().get(ALPHA).get(acc[r][h]).extractLane(0).op('f64.mul', 'f64.add').storeF64();
        } else {
          f.get(cAt).loadV128(16 * h).get(alpha).get(acc[r][h]).op('f64x2.mul', 'f64x2.add').storeV128(16 * h);
        }
      }
    }
  };
  /** all columns for rows i … i+rows−1 */
  const rowBlock = (rows: number) => {
    f.i32(0).set(j);
    f.whileLess(j, colLimit, 4, () => tile(rows, 4));
    f.get(COLS).i32(2).op('i32.and').ifTrue(() => {
      tile(rows, 2);
      f.get(j).i32(2).op('i32.add').set(j);
    });
    f.get(COLS).i32(1).op('i32.and').ifTrue(() => tile(rows, 1));
  };
  f.get(COLS).i32(-4).op('i32.and').set(colLimit);
  f.get(M).i32(-4).op('i32.and').set(rowLimit);
  f.i32(0).set(i);
  f.whileLess(i, rowLimit, 4, () => rowBlock(4));
  f.whileLess(i, M, 1, () => rowBlock(1));
  return f;
}

/**
 * symmetricProduct(a, n, k, rowStart, rowEnd, v, p): p += A v from the lower triangle, rows [rowStart, rowEnd),
 * columns k+1 … i, A read only. Rows in blocks of four (four row streams from memory, four independent row sums,
 * one load and store of p_j per four rows), the columns they share as SIMD pairs (an odd one last), then the
 * block's own 4×4 lower triangle entry by entry; remaining rows one at a time the same way:
 *   p[j] += A[i][j] v_i (j < i),  p[i] += Σ_{j<i} A[i][j] v_j + A[i][i] v_i.
 */
function symmetricProductKernel(): FunctionBuilder {
  const f = new FunctionBuilder('symmetricProduct', ['i32', 'i32', 'i32', 'i32', 'i32', 'i32', 'i32']);
  const [A, N, K, START, END, V, P] = [0, 1, 2, 3, 4, 5, 6];
  const R = 4;
  const i = f.local('i32'), t = f.local('i32'), jp = f.local('i32'), pairs = f.local('i32'), count = f.local('i32');
  const rowLimit = f.local('i32');
  const rowPtr = [0, 1, 2, 3].map(() => f.local('i32'));
  const us = [0, 1, 2, 3].map(() => f.local('f64')), uv = [0, 1, 2, 3].map(() => f.local('v128'));
  const sv = [0, 1, 2, 3].map(() => f.local('v128')), ss = [0, 1, 2, 3].map(() => f.local('f64'));
  const xv = f.local('v128'), pv = f.local('v128'), vj = f.local('v128');
  const xs = f.local('f64'), ps = f.local('f64'), vjs = f.local('f64');

  /** column pair (or single column) at jp for `rows` rows: s_r += x_r v_j, p_j += Σ_r x_r u_r */
  const column = (L: Lanes, rows: number) => {
    const [x, pj, vjL, ur, sL] = L === PAIR ? [xv, pv, vj, uv, sv] : [xs, ps, vjs, us, ss];
    f.get(V).get(jp).op('i32.add');
    L.load(f);
    f.set(vjL);
    f.zeroV128();
    if (L === SINGLE) f.extractLane(0);
    f.set(pj);
    for (let r = 0; r < rows; r++) {
      f.get(rowPtr[r]);
      L.load(f);
      f.set(x);
      f.get(sL[r]).get(x).get(vjL).op(L.mul, L.add).set(sL[r]);
      f.get(pj).get(x).get(ur[r]).op(L.mul, L.add).set(pj);
      f.get(rowPtr[r]).i32(L.bytes).op('i32.add').set(rowPtr[r]);
    }
    f.get(P).get(jp).op('i32.add');
    f.get(P).get(jp).op('i32.add');
    L.load(f);
    f.get(pj).op(L.add);
    L.store(f);
    f.get(jp).i32(L.bytes).op('i32.add').set(jp);
  };
  const rowsBlock = (rows: number) => {
    // then the columns k+1 … i−1 that all rows of the block have
    startRowBlock(f, { A, N, K, V, i, jp, count, pairs, t, us, uv, rowPtr, sv }, rows);
    f.whileLess(t, pairs, 1, () => column(PAIR, rows));
    for (let r = 0; r < rows; r++) f.get(sv[r]).extractLane(0).get(sv[r]).extractLane(1).op('f64.add').set(ss[r]);
    f.get(count).i32(1).op('i32.and').ifTrue(() => column(SINGLE, rows));
    // the block's lower triangle: rowPtr[r] at A[i+r][i], jp indexes entry i
    for (let r = 0; r < rows; r++) {
      for (let c = 0; c < r; c++) {
        f.get(rowPtr[r]).loadF64(8 * c).set(xs);
        f.get(ss[r]).get(xs).get(us[c]).op('f64.mul', 'f64.add').set(ss[r]);
        f.get(ss[c]).get(xs).get(us[r]).op('f64.mul', 'f64.add').set(ss[c]);
      }
      f.get(ss[r]).get(rowPtr[r]).loadF64(8 * r).get(us[r]).op('f64.mul', 'f64.add').set(ss[r]);
    }
    for (let r = 0; r < rows; r++) {
      f.get(P).get(jp).op('i32.add');
      f.get(P).get(jp).op('i32.add').loadF64(8 * r).get(ss[r]).op('f64.add').storeF64(8 * r);
    }
  };
  f.get(START).set(i);
  f.get(END).get(START).op('i32.sub').i32(-R).op('i32.and').get(START).op('i32.add').set(rowLimit);
  f.whileLess(i, rowLimit, R, () => rowsBlock(R));
  f.whileLess(i, END, 1, () => rowsBlock(1));
  return f;
}
