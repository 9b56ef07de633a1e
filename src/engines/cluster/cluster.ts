/**
 * N quantum Drude oscillators coupled by their dipole–dipole interaction: an exactly harmonic system of 3N
 * coordinates, solved by its normal modes, plus the dipole–quadrupole term by force balance.
 *
 * Hamiltonian (atomic units; r_i the Drude displacement of centre i at R_i; K_i = diag(m_i w_i²)):
 *   H = Σ_i [p_i²/(2 m_i) + ½ r_iᵀ K_i r_i] + Σ_{i<j} q_i q_j r_iᵀ (R² δ − 3 R R)/R^5 r_j  (+ V_dq, see below),
 * i.e. ½ xᵀ A x with A = K + C in the 3N coordinates x. With D = M^-½ A M^-½ = V Ω² Vᵀ:
 *  - energy: zero-point energy change ΔE = ½ Σ_n ω_n − ½ Σ_ia w_ia (all orders in the dipole coupling); the
 *    pairwise counterpart Σ_{i<j} ΔE_ij uses the exact two-body normal modes (London 1937, Bade 1957), so
 *    ΔE − Σ ΔE_ij is the many-body (non-additive) part;
 *  - screened polarisability: the dipole of centre i per uniform field, α_i,ab(iu) = q_i [(A + M u²)^-1 Q]_ia,b
 *    summed over the partners' rows (the relay-matrix contraction of A. Tkatchenko, R. A. DiStasio, R. Car,
 *    M. Scheffler, Phys. Rev. Lett. 108, 236402 (2012)); α_i = (1/3) tr α_i(0);
 *  - screened C6 of centre i: C6_i = (3/π) ∫_0^∞ α_i(iu)² du, the Casimir–Polder like-pair coefficient of the
 *    screened response (H. B. G. Casimir, D. Polder, Phys. Rev. 73, 360 (1948)); for a lone QDO (3/4) α² w;
 *  - dispersion-induced dipoles by force balance: the mean force on every Drude particle vanishes,
 *    A <x> = F, F_i = −<∂V_dq/∂r_i> with the Gaussian covariance Σ = ½ M^-½ D^-½ M^-½ of the coupled ground state:
 *      F_i,a = −Σ_{j≠i} q_i q_j T3_abc(R_j − R_i) (Σ^{ij}_bc − ½ Σ^{jj}_bc)
 *    (exact to first order in V_dq and to all orders in the dipole coupling, which also couples the induced
 *    displacements through A); mu_i = −q_i <r_i>.
 */
import type { Species } from '../../model/species.js';
import type { DrudeSpecies } from '../../model/drude.js';
import type { Vec3 } from '../../model/types.js';
import { InputError } from '../../model/errors.js';
import { eigenWorkspaceSizes, symmetricEigen, symmetricEigenInWorkspace } from '../../math/symmetric-eigen.js';
import { gramInWorkspace } from '../../math/gram-matrix.js';
import { withWorkspace } from '../../math/thread-team.js';
import { integrateSemiInfinite } from '../../math/semi-infinite-quadrature.js';
import { coupledPairZeroPointShift } from '../force-balance/pair-force-balance.js';
import { dipoleCouplingBlock, writeDipoleCouplingBlock } from './dipole-tensors.js';
import { perturbationRoute } from '../perturbation/route.js';

/** One centre of a cluster. */
export interface ClusterCentre {
  label: string;
  species: Species;
  /** Position, bohr. */
  position: Vec3;
  /** Line of the geometry file, for error messages. */
  line?: number;
}

export type ClusterStage = 'pairs' | 'tridiagonalise' | 'eigenvectors' | 'back-transform' | 'covariance' | 'polarisability';

export interface ClusterOptions {
  /** Relative tolerance of the C6 quadrature (default 1e-10). */
  relTol?: number;
  /** Progress of the long stages (fraction 0…1 of each stage). */
  progress?: (stage: ClusterStage, fraction: number) => void;
  /** Memory the computation may use, bytes (default: the 4 GiB WebAssembly workspace limit only). */
  memoryBytes?: number;
}

export interface ClusterCentreResult {
  label: string;
  species: string;
  /** bohr */
  position: Vec3;
  /** Dispersion-induced dipole, e·a0 (components below 1e-12 of the largest centre dipole reported as 0). */
  dipole: Vec3;
  /** Screened static polarisability (1/3 of the trace), a0³. */
  alpha: number;
  /** The free centre's static polarisability, a0³. */
  alphaFree: number;
  /** Screened like-pair C6 = (3/π)∫α_i(iu)² du, Eh·a0^6. */
  C6: number;
  /** The free centre's like-pair C6, Eh·a0^6. */
  C6Free: number;
}

export interface ClusterResult {
  /** Hartree: zero-point energy change with all couplings, its pairwise-additive sum, and their difference. */
  energy: { manyBody: number; pairwise: number; nonAdditive: number };
  /** Total dispersion-induced dipole, e·a0 (components below 1e-12 of the largest centre dipole reported as 0). */
  dipole: Vec3;
  /** Screened polarisability of the whole cluster (Σ_i alpha_i), a0³. */
  alpha: number;
  centres: ClusterCentreResult[];
  /** Normal-mode frequencies, Eh/hbar. */
  modes: { count: number; lowest: number; highest: number };
  /** The C6 quadrature's record. */
  quadrature: { evaluations: number; converged: boolean; largestRelativeError: number };
  /**
   * Pairs so far apart that their dipole is below the rounding level of the normal-mode covariance: how many,
   * how many were computed from the pair's far-field term D7/R^7 instead (isotropic centres), and
   * how many could not be (anisotropic centres: their dipoles are unresolved and the result is not converged).
   */
  farPairs: { count: number; series: number; unresolved: number };
  /** Why the result is not converged or what was approximated, in words (empty when nothing to say). */
  notes: string[];
  /** False when the C6 quadrature missed its tolerance or far-pair dipoles are unresolved. */
  converged: boolean;
}

/** The centre as a QDO, or an input error naming it (the cluster engine needs harmonic centres). */
function harmonic(c: ClusterCentre): DrudeSpecies {
  const s = c.species;
  switch (s.kind) {
    case 'drude':
      return s;
    default:
      throw new InputError(where(c), `species ${(s as Species).name} is not a quantum Drude oscillator; the cluster engine needs harmonic centres`);
  }
}

const where = (c: ClusterCentre) => (c.line !== undefined ? `line ${c.line} (${c.label})` : c.label);
const isIsotropic = (s: DrudeSpecies) => s.w[0] === s.w[1] && s.w[1] === s.w[2];

/** Solve the dipole-coupled cluster and its force-balance dipoles. */
export function computeCluster(centres: readonly ClusterCentre[], options: ClusterOptions = {}): ClusterResult {
  const N = centres.length;
  if (N === 0) throw new InputError('geometry', 'has no centres');
  const sp = centres.map(harmonic);
  for (const c of centres) {
    if (!c.position.every((x) => Math.abs(x) <= MAX_COORDINATE)) {
      throw new InputError(where(c), `position must be finite and within ±${MAX_COORDINATE} bohr, got [${c.position.join(', ')}]`);
    }
  }
  requireMemory(N, options.memoryBytes);
  const n = 3 * N;
  const q = sp.map((s) => s.q), m = sp.map((s) => s.m);
  const w = new Float64Array(n);
  sp.forEach((s, i) => w.set(s.w, 3 * i));
  const progress = options.progress;

  // far pairs (FAR_COUPLING): left out of the coupling matrix, whose rounding would swamp them; they contribute
  // their exact pair energy and their far-field dipoles, fed in as the force that induces them
  const { far, farForce, series, unresolved } = farField(centres, sp, N, n);

  // pairwise energies (and the two-body stability check, which names the lines)
  let pairwise = 0, farPairwise = 0;
  for (let i = 0; i < N; i++) {
    for (let j = i + 1; j < N; j++) {
      const e = pairEnergy(centres[i], sp[i], centres[j], sp[j]);
      pairwise += e;
      if (far.size > 0 && far.has(pairKey(i, j, N))) farPairwise += e;
    }
    if (progress && i % 50 === 0) progress('pairs', i / N);
  }

  // the O(n³) steps share one team of threads (src/math/thread-team.ts) and one workspace of two n×n arrays:
  // A holds D, then the reflectors, then Yᵀ; Z holds the normal modes V, then the covariance Σ
  const { lambda, omega, manyBody, fw, x } = withWorkspace(n, (teamSize) => eigenWorkspaceSizes(n, teamSize), (team, ws) => {
    // D = M^-½ (K + C) M^-½, lower triangle (the eigensolver reads no more); the coupling blocks are written in
    // place: half a million small arrays would cost more than the rest of this loop, and the garbage collector
    // runs alongside the main thread once the large workspace exists
    const D = ws.view('A');
    for (let i = 0; i < N; i++) {
      for (let a = 0; a < 3; a++) for (let b = 0; b <= a; b++) D[(3 * i + a) * n + 3 * i + b] = a === b ? w[3 * i + a] ** 2 : 0;
      const Pi = centres[i].position;
      for (let j = 0; j < i; j++) {
        const Pj = centres[j].position;
        const R = [Pj[0] - Pi[0], Pj[1] - Pi[1], Pj[2] - Pi[2]] as const;
        const coupling = far.size > 0 && far.has(pairKey(i, j, N)) ? 0 : (q[i] * q[j]) / Math.sqrt(m[i] * m[j]);
        writeDipoleCouplingBlock(R, coupling, D, 3 * i * n + 3 * j, n);
      }
    }
    const eig = symmetricEigenInWorkspace(team, ws, n, { progress: progress && ((stage, f) => progress(stage, f)) });
    const lambda = eig.values, V = eig.vectors!;
    if (!(lambda[0] > 0)) {
      throw new InputError('geometry', `the dipole-coupled cluster is unstable (lowest normal mode ω² = ${lambda[0].toExponential(3)} Eh²): centres are too close together (polarisation catastrophe)`);
    }
    const omega = lambda.map(Math.sqrt);
    const manyBody = zeroPointShift(lambda, V, w, n) + farPairwise;
    const fw = polarisabilityWeights(V, q, m, N, n);
    // Y = M^-½ V (2Ω)^-½, so that the covariance is Σ = Y Yᵀ, the Gram matrix of the columns of Yᵀ
    progress?.('covariance', 0);
    const Yt = ws.view('A');
    const invRoot = omega.map((x) => 1 / Math.sqrt(x));
    for (let r0 = 0; r0 < n; r0 += 32)
      for (let k0 = 0; k0 < n; k0 += 32)
        for (let r = r0; r < Math.min(r0 + 32, n); r++) {
          const s = 1 / Math.sqrt(2 * m[Math.floor(r / 3)]);
          for (let k = k0; k < Math.min(k0 + 32, n); k++) Yt[k * n + r] = V[r * n + k] * s * invRoot[k];
        }
    // Σ into Z (V is done with), lower triangle only
    const sigma = gramInWorkspace(team, ws, 'A', 'Z', n, n, { progress: progress && ((f) => progress('covariance', 0.9 * f)), lowerOnly: true });
    const F = forceBalanceSource(centres, q, sigma, N, n, (i, j) => far.size === 0 || !far.has(pairKey(i, j, N)));
    for (let k = 0; k < n; k++) F[k] += farForce[k];
    progress?.('covariance', 1);
    return { lambda, omega, manyBody, fw, x: applyInverse(Yt, omega, F, n) };
  });

  // mu_i = −q_i <r_i>
  const dipoles: Vec3[] = [];
  const total: Vec3 = [0, 0, 0];
  for (let i = 0; i < N; i++) {
    const mu: Vec3 = [-q[i] * x[3 * i], -q[i] * x[3 * i + 1], -q[i] * x[3 * i + 2]];
    dipoles.push(mu);
    for (let a = 0; a < 3; a++) total[a] += mu[a];
  }
  // components below 1e-12 of the largest centre dipole are rounding residue of cancelling sums: report them as 0
  const resolution = 1e-12 * Math.max(0, ...dipoles.map((d) => Math.hypot(d[0], d[1], d[2])));
  for (const v of [...dipoles, total]) for (let a = 0; a < 3; a++) if (Math.abs(v[a]) <= resolution) v[a] = 0;

  // screened polarisabilities: α_i(iu) = Σ_n f_in/(ω_n² + u²)
  const alphaAt = (u: number, out: Float64Array) => {
    const u2 = u * u;
    const inv = new Float64Array(n);
    for (let k = 0; k < n; k++) inv[k] = 1 / (lambda[k] + u2);
    for (let i = 0; i < N; i++) {
      let s = 0;
      const row = i * n;
      for (let k = 0; k < n; k++) s += fw[row + k] * inv[k];
      out[i] = s;
    }
    return out;
  };
  const alpha0 = alphaAt(0, new Float64Array(N));
  const buf = new Float64Array(N);
  let calls = 0;
  const quad = integrateSemiInfinite(
    (u) => {
      alphaAt(u, buf);
      for (let i = 0; i < N; i++) buf[i] = (3 / Math.PI) * buf[i] * buf[i];
      if (progress && ++calls % 20 === 0) progress('polarisability', Math.min(0.99, calls / 400));
      return buf;
    },
    N,
    { scale: omega[n >> 1], relTol: options.relTol ?? 1e-10 },
  );
  progress?.('polarisability', 1);
  let largestRelativeError = 0;
  for (let i = 0; i < N; i++) largestRelativeError = Math.max(largestRelativeError, quad.error[i] / Math.abs(quad.value[i]));

  const result: ClusterCentreResult[] = centres.map((c, i) => ({
    label: c.label,
    species: sp[i].name,
    position: [...c.position] as Vec3,
    dipole: dipoles[i],
    alpha: alpha0[i],
    alphaFree: freeAlpha(sp[i]),
    C6: quad.value[i],
    C6Free: freeC6(sp[i]),
  }));
  return {
    energy: { manyBody, pairwise, nonAdditive: manyBody - pairwise },
    dipole: total,
    alpha: alpha0.reduce((s, a) => s + a, 0),
    centres: result,
    modes: { count: n, lowest: omega[0], highest: omega[n - 1] },
    quadrature: { evaluations: quad.evaluations, converged: quad.converged, largestRelativeError },
    farPairs: { count: far.size, series, unresolved },
    notes: [
      ...(series > 0 ? [`${series} far pair${series > 1 ? 's' : ''} (dipole below the covariance's rounding level): dipoles from the pair's far-field term D7/R^7 (perturbation route)`] : []),
      ...(unresolved > 0 ? [`${unresolved} far pair${unresolved > 1 ? 's' : ''} of anisotropic centres: their dipoles are below the rounding level and not resolved (UNCONVERGED)`] : []),
    ],
    converged: quad.converged && unresolved === 0,
  };
}

/**
 * Bytes the cluster computation needs for N centres: the workspace of two (3N)² Float64 arrays and the
 * eigensolver's smaller ones (its 4 GiB WebAssembly memory is a hard limit, src/math/simd-kernels.ts), plus the
 * N × 3N polarisability weights and a few 3N vectors outside it.
 */
export function clusterMemoryBytes(N: number): { workspace: number; total: number } {
  const n = 3 * N;
  const sizes = eigenWorkspaceSizes(n, 16);
  const workspace = 8 * Object.values(sizes).reduce((s, x) => s + x, 0);
  return { workspace, total: workspace + 8 * (N * n + 16 * n) };
}

/** Largest |coordinate|, bohr: keeps R^7 and the squared distances of the tensors far from overflow. */
export const MAX_COORDINATE = 1e15;

/** The WebAssembly workspace limit (65 536 pages of 64 KiB). */
const WORKSPACE_LIMIT = 4 * 1024 ** 3;

/** The largest N whose need fits (bisection on the monotone {@link clusterMemoryBytes}). */
export function largestClusterFitting(memoryBytes = Infinity): number {
  const fits = (N: number) => {
    const need = clusterMemoryBytes(N);
    return need.workspace <= WORKSPACE_LIMIT && need.total <= memoryBytes;
  };
  let lo = 1, hi = 1;
  while (fits(hi)) hi *= 2;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (fits(mid)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Refuse, before any work, a cluster whose memory need exceeds the workspace limit or `memoryBytes`. */
function requireMemory(N: number, memoryBytes = Infinity): void {
  const need = clusterMemoryBytes(N);
  if (need.workspace <= WORKSPACE_LIMIT && need.total <= memoryBytes) return;
  const gib = (b: number) => `${(b / 1024 ** 3).toFixed(1)} GiB`;
  const limit = need.workspace > WORKSPACE_LIMIT ? `the eigensolver's workspace is limited to ${gib(WORKSPACE_LIMIT)} (WebAssembly memory)` : `this machine has ${gib(memoryBytes)}`;
  throw new InputError(
    'geometry',
    `has ${N} centres; solving them needs about ${gib(need.total)} (two ${3 * N}×${3 * N} double-precision matrices) but ${limit}: the largest cluster that fits has ${largestClusterFitting(memoryBytes)} centres`,
  );
}

/**
 * Dimensionless pair coupling x = |q_i q_j| / (√(m_i m_j) R³ w_i w_j) (lowest frequencies) below which a pair
 * counts as far (derived here, checked by the dimer test): the pair's dipole is of relative size x² against the
 * O(1) covariance, so the normal modes resolve it only to about eps/x²; the model's far-field series is D7/R^7
 * with corrections of relative size about 2x (the dipole–dipole screening; the model has no R^-9 multipoles). At
 * x = 5e-6 both errors are about 1e-5.
 */
export const FAR_COUPLING = 5e-6;

const pairKey = (i: number, j: number, N: number) => Math.min(i, j) * N + Math.max(i, j);

/**
 * Far pairs ({@link FAR_COUPLING}) and the force that induces their far-field dipoles: for isotropic centres the
 * dipole along the pair axis n̂ (from i to j) is mu_i = (D7.a/R^7) n̂, mu_j = (D7.b/R^7) n̂, with D7 of the
 * perturbation route (exact for QDOs); it enters as F_i = K_i <r_i> = −m_i w_i² mu_i / q_i, so
 * the coupling matrix screens it like every other source (derived here). Anisotropic far pairs are counted as
 * unresolved.
 */
function farField(centres: readonly ClusterCentre[], sp: readonly DrudeSpecies[], N: number, n: number) {
  const far = new Set<number>();
  const farForce = new Float64Array(n);
  // D7 of each species pair, computed once (centres of one species share the species object)
  const coefficients = new Map<DrudeSpecies, Map<DrudeSpecies, { a7: number; b7: number }>>();
  let series = 0, unresolved = 0;
  // per centre: |q|/(√m w_min), so that the coupling of a pair is g_i g_j / R³ (no allocation in the N² loop)
  const g = sp.map((x) => Math.abs(x.q) / (Math.sqrt(x.m) * Math.min(x.w[0], x.w[1], x.w[2])));
  for (let i = 0; i < N; i++) {
    const si = sp[i];
    const Pi = centres[i].position;
    for (let j = i + 1; j < N; j++) {
      const Pj = centres[j].position;
      const dx = Pj[0] - Pi[0], dy = Pj[1] - Pi[1], dz = Pj[2] - Pi[2];
      const r2 = dx * dx + dy * dy + dz * dz;
      if (!((g[i] * g[j]) / (r2 * Math.sqrt(r2)) < FAR_COUPLING)) continue;
      const sj = sp[j];
      const R: Vec3 = [dx, dy, dz];
      const r = Math.sqrt(r2);
      far.add(pairKey(i, j, N));
      if (!isIsotropic(si) || !isIsotropic(sj)) {
        unresolved++;
        continue;
      }
      let row = coefficients.get(si);
      if (!row) coefficients.set(si, (row = new Map()));
      let c = row.get(sj);
      if (!c) {
        const res = perturbationRoute.run(si, sj, {});
        c = { a7: res.D7.a, b7: res.D7.b };
        row.set(sj, c);
      }
      series++;
      const muI = c.a7 / r ** 7, muJ = c.b7 / r ** 7;
      for (let a = 0; a < 3; a++) {
        const na = R[a] / r;
        farForce[3 * i + a] -= (si.m * si.w[a] ** 2 * muI * na) / si.q;
        farForce[3 * j + a] -= (sj.m * sj.w[a] ** 2 * muJ * na) / sj.q;
      }
    }
  }
  return { far, farForce, series, unresolved };
}

/** R_j − R_i, bohr. */
const separation = (ci: ClusterCentre, cj: ClusterCentre): Vec3 => [
  cj.position[0] - ci.position[0],
  cj.position[1] - ci.position[1],
  cj.position[2] - ci.position[2],
];

/** Exact zero-point-energy change of one dipole-coupled pair (hartree); an input error when the pair is unstable. */
export function pairEnergy(ci: ClusterCentre, si: DrudeSpecies, cj: ClusterCentre, sj: DrudeSpecies): number {
  const R = separation(ci, cj);
  const r = Math.hypot(R[0], R[1], R[2]);
  const overlap = () => {
    const ai = freeAlpha(si), aj = freeAlpha(sj);
    return new InputError(
      where(cj),
      `centre ${cj.label} overlaps centre ${ci.label}${ci.line !== undefined ? ` on line ${ci.line}` : ''}: ${r.toPrecision(4)} bohr apart, ` +
        `where the dipole-coupled pair is unstable (polarisation catastrophe; for isotropic centres below (4 αi αj)^(1/6) = ${((4 * ai * aj) ** (1 / 6)).toPrecision(4)} bohr)`,
    );
  };
  if (isIsotropic(si) && isIsotropic(sj)) {
    const g = (si.q * sj.q) / r ** 3;
    try {
      // along the pair axis the coupling is −2g, across it g (twice)
      return coupledPairZeroPointShift(si.m, si.w[0], sj.m, sj.w[0], -2 * g) + 2 * coupledPairZeroPointShift(si.m, si.w[0], sj.m, sj.w[0], g);
    } catch (e) {
      if (e instanceof RangeError) throw overlap();
      throw e;
    }
  }
  // anisotropic: the 6×6 normal-mode problem
  const blk = dipoleCouplingBlock(R);
  const D6 = new Float64Array(36);
  const f = (si.q * sj.q) / Math.sqrt(si.m * sj.m);
  for (let a = 0; a < 3; a++) {
    D6[a * 6 + a] = si.w[a] ** 2;
    D6[(a + 3) * 6 + a + 3] = sj.w[a] ** 2;
    for (let b = 0; b < 3; b++) {
      D6[a * 6 + 3 + b] = f * blk[3 * a + b];
      D6[(3 + b) * 6 + a] = f * blk[3 * a + b];
    }
  }
  const ev = symmetricEigen(D6, 6);
  if (!(ev.values[0] > 0)) throw overlap();
  return zeroPointShift(ev.values, ev.vectors!, [...si.w, ...sj.w], 6);
}

/**
 * ½ Σ_n ω_n − ½ Σ_i w_i without the cancellation of the plain difference (derived here): since D_ii = w_i²,
 * Σ_n V_in² (λ_n − w_i²) = 0 for every i, so with f = √ and d_i = w_i²
 *   Σ_n f(λ_n) − Σ_i f(d_i) = Σ_n Σ_i V_in² [f(λ_n) − f(d_i) − f'(d_i)(λ_n − d_i)]
 *                            = −Σ_n Σ_i V_in² (λ_n − d_i)² / (2 √d_i (√λ_n + √d_i)²),
 * every term of one sign and of second order in the coupling.
 */
function zeroPointShift(lambda: Float64Array, V: Float64Array, w: ArrayLike<number>, n: number): number {
  const sq = lambda.map(Math.sqrt);
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = w[i] * w[i];
    const row = i * n;
    for (let k = 0; k < n; k++) {
      const v = V[row + k];
      const diff = lambda[k] - d;
      const sum = sq[k] + w[i];
      s += (v * v * diff * diff) / (w[i] * sum * sum);
    }
  }
  return -0.25 * s;
}

/**
 * F_i = −<∂V_dq/∂r_i> over the coupled Gaussian (see the module comment), from the lower triangle of the
 * covariance Σ (n×n). The contractions use the closed form of T3 (dipole-tensors.ts) against a 3×3 block X
 * (derived here):
 *   Σ_bc T3_abc(R) X_bc = [3 (R_a tr X + (X R)_a + (Xᵀ R)_a) − 15 R_a (Rᵀ X R)/R²] / R^5,
 * which is the same for X and Xᵀ (T3 is symmetric in its indices; so Σ^{ij} can be read as its transpose Σ^{ji}
 * from the lower triangle) and odd in R, so per pair
 *   F_i += q_i q_j [−T3(R):Σ^{ij} + ½ T3(R):Σ^{jj}],  F_j += q_i q_j [T3(R):Σ^{ij} − ½ T3(R):Σ^{ii}],  R = R_j − R_i.
 */
function forceBalanceSource(
  centres: readonly ClusterCentre[],
  q: readonly number[],
  sigma: Float64Array,
  N: number,
  n: number,
  include: (i: number, j: number) => boolean,
): Float64Array {
  const F = new Float64Array(n);
  const X = new Float64Array(9);
  const c = new Float64Array(3);
  /** c ← T3(R):X for the 3×3 block of Σ at rows 3i…, columns 3j… (i ≥ j; a diagonal block from its lower triangle) */
  const contract = (R0: number, R1: number, R2: number, i: number, j: number) => {
    for (let b = 0; b < 3; b++)
      for (let e = 0; e < 3; e++) X[3 * b + e] = i > j || b >= e ? sigma[(3 * i + b) * n + 3 * j + e] : sigma[(3 * j + e) * n + 3 * i + b];
    const r2 = R0 * R0 + R1 * R1 + R2 * R2;
    const r5 = r2 * r2 * Math.sqrt(r2);
    const tr = X[0] + X[4] + X[8];
    const XR0 = X[0] * R0 + X[1] * R1 + X[2] * R2, XR1 = X[3] * R0 + X[4] * R1 + X[5] * R2, XR2 = X[6] * R0 + X[7] * R1 + X[8] * R2;
    const XtR0 = X[0] * R0 + X[3] * R1 + X[6] * R2, XtR1 = X[1] * R0 + X[4] * R1 + X[7] * R2, XtR2 = X[2] * R0 + X[5] * R1 + X[8] * R2;
    const RXR = (R0 * XR0 + R1 * XR1 + R2 * XR2) / r2;
    c[0] = (3 * (R0 * tr + XR0 + XtR0) - 15 * R0 * RXR) / r5;
    c[1] = (3 * (R1 * tr + XR1 + XtR1) - 15 * R1 * RXR) / r5;
    c[2] = (3 * (R2 * tr + XR2 + XtR2) - 15 * R2 * RXR) / r5;
    return c;
  };
  for (let i = 0; i < N; i++) {
    const Pi = centres[i].position;
    for (let j = i + 1; j < N; j++) {
      if (!include(i, j)) continue;
      const Pj = centres[j].position;
      const R0 = Pj[0] - Pi[0], R1 = Pj[1] - Pi[1], R2 = Pj[2] - Pi[2];
      const qq = q[i] * q[j];
      contract(R0, R1, R2, j, i); // Σ^{ji} = (Σ^{ij})ᵀ, same contraction
      for (let a = 0; a < 3; a++) {
        F[3 * i + a] -= qq * c[a];
        F[3 * j + a] += qq * c[a];
      }
      contract(R0, R1, R2, j, j);
      for (let a = 0; a < 3; a++) F[3 * i + a] += 0.5 * qq * c[a];
      contract(R0, R1, R2, i, i);
      for (let a = 0; a < 3; a++) F[3 * j + a] -= 0.5 * qq * c[a];
    }
  }
  return F;
}

/**
 * <x> = A^-1 F = M^-½ V Ω^-2 Vᵀ M^-½ F = 2 Y Ω^-1 Yᵀ F with Y = M^-½ V (2Ω)^-½ (derived here), from Yᵀ (row k
 * of Yt is column k of Y).
 */
function applyInverse(Yt: Float64Array, omega: Float64Array, F: Float64Array, n: number): Float64Array {
  const x = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const row = k * n;
    let t = 0;
    for (let r = 0; r < n; r++) t += Yt[row + r] * F[r];
    t *= 2 / omega[k];
    for (let r = 0; r < n; r++) x[r] += Yt[row + r] * t;
  }
  return x;
}

/**
 * Weights of the screened polarisabilities α_i(iu) = Σ_k fw[i·n + k]/(ω_k² + u²) (the field on all centres, the
 * dipole of centre i, 1/3 of the trace): fw_ik = (q_i/(3√m_i)) Σ_a V_ia,k P_a,k with P_a,k = Σ_j (q_j/√m_j) V_ja,k.
 */
function polarisabilityWeights(V: Float64Array, q: readonly number[], m: readonly number[], N: number, n: number): Float64Array {
  const P = new Float64Array(3 * n);
  for (let j = 0; j < N; j++) {
    const g = q[j] / Math.sqrt(m[j]);
    for (let a = 0; a < 3; a++) {
      const row = (3 * j + a) * n;
      for (let k = 0; k < n; k++) P[a * n + k] += g * V[row + k];
    }
  }
  const fw = new Float64Array(N * n);
  for (let i = 0; i < N; i++) {
    const g = q[i] / (3 * Math.sqrt(m[i]));
    for (let a = 0; a < 3; a++) {
      const row = (3 * i + a) * n;
      for (let k = 0; k < n; k++) fw[i * n + k] += g * V[row + k] * P[a * n + k];
    }
  }
  return fw;
}

/** Static polarisability of a free QDO, 1/3 of the trace of q²/(m w_a²), a0³. */
export function freeAlpha(s: DrudeSpecies): number {
  return (s.q * s.q * (1 / s.w[0] ** 2 + 1 / s.w[1] ** 2 + 1 / s.w[2] ** 2)) / (3 * s.m);
}

/** Like-pair C6 of a free QDO from (3/π)∫α(iu)² du with α(iu) = (q²/3m) Σ_a 1/(w_a² + u²): (q⁴/6m²) Σ_ab 1/(w_a w_b (w_a + w_b)). */
export function freeC6(s: DrudeSpecies): number {
  let sum = 0;
  for (const a of s.w) for (const b of s.w) sum += 1 / (a * b * (a + b));
  return (s.q ** 4 / (6 * s.m * s.m)) * sum;
}
