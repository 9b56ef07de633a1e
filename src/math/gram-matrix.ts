/**
 * Gram matrix G = Xᵀ X of the columns of a dense row-major matrix (e.g. a covariance Σ = Y Yᵀ from X = Yᵀ),
 * with the SIMD product kernel of src/math/simd-kernels.ts on a thread team: the lower triangle by tiles shared
 * between the threads (src/math/team-tasks.ts lowerTiles), then mirrored. Cost rows·cols² flops.
 */
import { Workspace } from './simd-kernels.js';
import { withTeamFor, type ThreadTeam } from './thread-team.js';

/** Rows of G per tile, columns of G per tile, rows of X per pass (a 256 KiB slab of X stays in cache). */
const TILE_ROWS = 64, TILE_COLS = 256, SLAB = 128;

export interface GramOptions {
  /** Threads to run on (default: a team sized for the order of G, closed afterwards). */
  team?: ThreadTeam;
  /** Fraction of the tiles done. */
  progress?: (fraction: number) => void;
}

/** G = Xᵀ X (cols×cols, full symmetric, row-major) for X row-major rows×cols. */
export function gramMatrix(X: Float64Array, rows: number, cols: number, options: GramOptions = {}): Float64Array {
  if (X.length !== rows * cols) throw new RangeError(`matrix has ${X.length} entries, expected ${rows}×${cols}`);
  return withTeamFor(cols, options.team, (team) => {
    const ws = new Workspace({ X: rows * cols, G: cols * cols });
    team.attach(ws);
    ws.view('X').set(X);
    return gramInWorkspace(team, ws, 'X', 'G', rows, cols, { progress: options.progress });
  });
}

/**
 * G = Xᵀ X between two arrays of a workspace the team is attached to; returns the G view. With `lowerOnly` the
 * upper triangle is not completed (its entries are unspecified; the caller reads G[r][c] for r ≥ c only).
 */
export function gramInWorkspace(
  team: ThreadTeam,
  ws: Workspace,
  x: string,
  g: string,
  rows: number,
  cols: number,
  options: { progress?: (fraction: number) => void; lowerOnly?: boolean } = {},
): Float64Array {
  const progress = options.progress;
  let units = 0;
  for (let r0 = 0; r0 < cols; r0 += TILE_ROWS) units += Math.ceil(Math.min(cols, r0 + TILE_ROWS) / TILE_COLS);
  // G(r, c) = Σ_s X[s][r] X[s][c]: A = Xᵀ (aRow 8, aCol one row of X), B = X
  team.run('lowerTiles', [ws.at(g), cols * 8, ws.at(x), 8, cols * 8, ws.at(x), cols * 8, cols, rows, 1, TILE_ROWS, TILE_COLS, SLAB, 1], {
    onUnit: progress && (() => progress(Math.min(1, team.unitsTaken() / units))),
  });
  const G = ws.view(g);
  if (options.lowerOnly) return G;
  // upper triangle from the lower, in 32×32 tiles (cache-friendly transposed reads)
  for (let r0 = 0; r0 < cols; r0 += 32)
    for (let c0 = r0; c0 < cols; c0 += 32)
      for (let r = r0; r < Math.min(r0 + 32, cols); r++)
        for (let c = Math.max(c0, r + 1); c < Math.min(c0 + 32, cols); c++) G[r * cols + c] = G[c * cols + r];
  return G;
}
