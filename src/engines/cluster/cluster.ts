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
 *    displacements through A); mu_i = −q_i <r_i>. The own blocks Σ^{ii} − Σ0^{ii} come from divided differences
 *    (diagonalCovarianceShift), far pairs from their closed form (farField), and every dipole carries an
 *    estimated error and a flag (dipoleErrorEstimates).
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
import { isotropicPairDipoles } from './pair-dipole.js';

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
  /** Dispersion-induced dipole, e·a0 (unless flagged, components within dipoleError of 0 are reported as 0). */
  dipole: Vec3;
  /** Estimated error of |dipole| (rounding and the far-pair approximation; {@link dipoleErrorEstimates}), e·a0. */
  dipoleError: number;
  /** True when dipoleError exceeds {@link DIPOLE_TOLERANCE} of the larger of |dipole| and the centre's pair terms, and the rounding floor (untrusted). */
  dipoleFlagged: boolean;
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
  /** Total dispersion-induced dipole, e·a0 (unless flagged, components within dipoleError of 0 are reported as 0). */
  dipole: Vec3;
  /** Estimated error of the total dipole (the sum of the centres' estimates), e·a0. */
  dipoleError: number;
  /** True when dipoleError exceeds {@link DIPOLE_TOLERANCE} of the summed sizes of the pair terms. */
  dipoleFlagged: boolean;
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
  /** False when the C6 quadrature missed its tolerance, far-pair dipoles are unresolved or a dipole is flagged. */
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
  const { far, farForce, series, unresolved, Q, relayed } = farField(centres, sp, N, n);

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
  const { lambda, omega, manyBody, fw, x, correction } = withWorkspace(n, (teamSize) => eigenWorkspaceSizes(n, teamSize), (team, ws) => {
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
    const selfShift = diagonalCovarianceShift(lambda, V, w, m, N, n);
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
    const F = forceBalanceSource(centres, sp, sigma, selfShift, N, n, (i, j) => far.size === 0 || !far.has(pairKey(i, j, N)) || relayed.has(pairKey(i, j, N)));
    for (let k = 0; k < n; k++) F[k] += farForce[k];
    progress?.('covariance', 1);
    const x = applyInverse(Yt, omega, F, n);
    // the far pairs' coupling, left out of A, still carries the induction by the rest of their partners' dipoles:
    // one correction step x ← x − A^-1 C_far (x − x_pair) (the pair's own mutual induction is in its closed form)
    const correction = far.size > 0 ? applyInverse(Yt, omega, farInduction(centres, sp, far, x, n), n) : new Float64Array(n);
    for (let k = 0; k < n; k++) x[k] -= correction[k];
    return { lambda, omega, manyBody, fw, x, correction };
  });

  // mu_i = −q_i <r_i>
  const dipoles: Vec3[] = [];
  const total: Vec3 = [0, 0, 0];
  for (let i = 0; i < N; i++) {
    const mu: Vec3 = [-q[i] * x[3 * i], -q[i] * x[3 * i + 1], -q[i] * x[3 * i + 2]];
    dipoles.push(mu);
    for (let a = 0; a < 3; a++) total[a] += mu[a];
  }
  const estimate = dipoleErrorEstimates(centres, sp, far, relayed, Q, correction, lambda[0], n);
  // the solve x = A^-1 F spreads the rounding of the largest displacement over every component; an error at
  // that floor is double precision's own limit (reported, not flagged). Otherwise a dipole is judged against the
  // larger of its pair terms' size and itself (amplified near a soft mode)
  const largest = Math.max(0, ...dipoles.map((d) => Math.hypot(d[0], d[1], d[2])));
  const floor = 16 * roundingLevel(n) * largest;
  dipoles.forEach((d, i) => {
    estimate.error[i] += roundingLevel(n) * largest;
    estimate.scale[i] = Math.max(estimate.scale[i], Math.hypot(d[0], d[1], d[2]));
  });
  const totalError = estimate.error.reduce((s, e) => s + e, 0);
  const totalScale = estimate.scale.reduce((s, e) => s + e, 0);
  const flagged = Array.from(estimate.error, (e, i) => !(e <= Math.max(DIPOLE_TOLERANCE * estimate.scale[i], floor)));
  const totalFlagged = !(totalError <= Math.max(DIPOLE_TOLERANCE * totalScale, N * floor));
  const flaggedCount = flagged.filter(Boolean).length;
  // a component within its vector's estimated error of zero is rounding residue of cancelling sums: 0 (unless
  // the vector is flagged, whose raw value is shown)
  const zeroToRounding = (v: Vec3, error: number, isFlagged: boolean) => {
    if (!isFlagged) for (let a = 0; a < 3; a++) if (Math.abs(v[a]) <= error) v[a] = 0;
  };
  dipoles.forEach((d, i) => zeroToRounding(d, estimate.error[i], flagged[i]));
  zeroToRounding(total, totalError, totalFlagged);

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
    dipoleError: estimate.error[i],
    dipoleFlagged: flagged[i],
    alpha: alpha0[i],
    alphaFree: freeAlpha(sp[i]),
    C6: quad.value[i],
    C6Free: freeC6(sp[i]),
  }));
  return {
    energy: { manyBody, pairwise, nonAdditive: manyBody - pairwise },
    dipole: total,
    dipoleError: totalError,
    dipoleFlagged: totalFlagged,
    alpha: alpha0.reduce((s, a) => s + a, 0),
    centres: result,
    modes: { count: n, lowest: omega[0], highest: omega[n - 1] },
    quadrature: { evaluations: quad.evaluations, converged: quad.converged, largestRelativeError },
    farPairs: { count: far.size, series, unresolved },
    notes: [
      ...(series > 0 ? [`${series} far pair${series > 1 ? 's' : ''} (coupling below ${FAR_COUPLING}): their own dipoles from the pair's closed form, exact to rounding; what the other centres add is in the matrix or in the error estimate`] : []),
      ...(unresolved > 0 ? [`${unresolved} far pair${unresolved > 1 ? 's' : ''} of anisotropic centres: their dipoles are below the rounding level and not resolved (UNCONVERGED)`] : []),
      ...(flaggedCount > 0 || totalFlagged
        ? [`${flaggedCount} centre dipole${flaggedCount === 1 ? '' : 's'}${totalFlagged ? ' and the total dipole' : ''} with an estimated error above ${DIPOLE_TOLERANCE} of their size (UNCONVERGED)`]
        : []),
    ],
    converged: quad.converged && unresolved === 0 && flaggedCount === 0 && !totalFlagged,
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
 * Dimensionless pair coupling x = |q_i q_j| / (√(m_i m_j) R³ w_i w_j) (lowest frequencies) below which a pair may
 * leave the coupling matrix (derived here, checked by the dimer and trimer tests in cluster-limits.test.ts): the
 * normal modes give the covariance between two centres only to an absolute 4√n eps σ̄ (the eigensolver's backward
 * error), so a pair's dipole, of relative size x against it, keeps only about eps/x of relative precision. Such a
 * pair takes its own dipoles from the isolated pair's closed form (pair-dipole.ts, exact to rounding) when the
 * screening of its centres by their other partners changes that closed form by less than the rounding level
 * (2 x (Q_i + Q_j) ≤ 4√n eps, Q = Σ (2x)² over the matrix partners); otherwise it stays in the matrix.
 */
export const FAR_COUPLING = 5e-6;

const pairKey = (i: number, j: number, N: number) => Math.min(i, j) * N + Math.max(i, j);

/**
 * Far pairs ({@link FAR_COUPLING}) and the force that induces their own dipoles: for isotropic centres the
 * dipoles along the pair axis n̂ (from i to j) are those of the isolated pair, mu_i = a n̂, mu_j = b n̂
 * (pair-dipole.ts: all orders in the dipole coupling, exact to rounding at any R; D7/R^7 for R → ∞); they enter as
 * F_i = K_i <r_i> = −m_i w_i² mu_i / q_i, so the coupling matrix screens them like every other source (derived
 * here). The covariance relayed between i and j by third centres is taken from the matrix when it may exceed its
 * rounding level (`relayed`), and the induction across the dropped coupling is added by {@link farInduction}.
 * Anisotropic far pairs are counted as unresolved.
 */
function farField(centres: readonly ClusterCentre[], sp: readonly DrudeSpecies[], N: number, n: number) {
  const far = new Set<number>();
  const farForce = new Float64Array(n);
  let series = 0, unresolved = 0;
  const Q = new Float64Array(N);
  // per centre: |q|/(√m w_min), so that the coupling of a pair is g_i g_j / R³ (no allocation in the N² loop)
  const g = sp.map((x) => Math.abs(x.q) / (Math.sqrt(x.m) * Math.min(x.w[0], x.w[1], x.w[2])));
  const level = roundingLevel(n);
  const coupling = (i: number, j: number) => {
    const Pi = centres[i].position, Pj = centres[j].position;
    const dx = Pj[0] - Pi[0], dy = Pj[1] - Pi[1], dz = Pj[2] - Pi[2];
    const r2 = dx * dx + dy * dy + dz * dz;
    return (g[i] * g[j]) / (r2 * Math.sqrt(r2));
  };
  // Q_i = Σ (2 x_ik)² over the partners that are never far: how strongly i is screened by the matrix
  for (let i = 0; i < N; i++)
    for (let j = i + 1; j < N; j++) {
      const x = coupling(i, j);
      if (x < FAR_COUPLING) continue;
      Q[i] += 4 * x * x;
      Q[j] += 4 * x * x;
    }
  for (let i = 0; i < N; i++) {
    const si = sp[i];
    const Pi = centres[i].position;
    for (let j = i + 1; j < N; j++) {
      const x = coupling(i, j);
      // the closed form is the isolated pair's: the screening of i and j by their other partners changes the
      // pair's own covariance by about 2x (Q_i + Q_j) σ̄, which must stay below the covariance's rounding level
      if (!(x < FAR_COUPLING) || 2 * x * (Q[i] + Q[j]) > level) continue;
      const Pj = centres[j].position;
      const dx = Pj[0] - Pi[0], dy = Pj[1] - Pi[1], dz = Pj[2] - Pi[2];
      const r2 = dx * dx + dy * dy + dz * dz;
      const sj = sp[j];
      const R: Vec3 = [dx, dy, dz];
      const r = Math.sqrt(r2);
      far.add(pairKey(i, j, N));
      if (!isIsotropic(si) || !isIsotropic(sj)) {
        unresolved++;
        continue;
      }
      series++;
      const pair = isotropicPairDipoles(si, sj, r);
      const muI = pair.a, muJ = pair.b;
      for (let a = 0; a < 3; a++) {
        const na = R[a] / r;
        farForce[3 * i + a] -= (si.m * si.w[a] ** 2 * muI * na) / si.q;
        farForce[3 * j + a] -= (sj.m * sj.w[a] ** 2 * muJ * na) / sj.q;
      }
    }
  }
  // far pairs whose covariance relayed by third centres may exceed the covariance's rounding level take it from
  // the matrix (which lacks their direct coupling, so it holds the relayed part only)
  const relayed = new Set<number>();
  for (const key of far) if (Math.sqrt(Q[Math.floor(key / N)] * Q[key % N]) > level) relayed.add(key);
  return { far, farForce, series, unresolved, Q, relayed };
}

/**
 * Largest estimated dipole error, relative to the larger of |mu| and the size of the centre's pair terms, that is
 * still trusted (an error at the rounding floor of the cluster's largest dipole, 16 · 4√n eps |mu|max, is never
 * flagged: double precision cannot do better).
 */
export const DIPOLE_TOLERANCE = 1e-6;

/** Unit roundoff of double precision. */
const EPS = 2 ** -52;

/** Absolute rounding of the covariance between two centres, in units of σ̄ (see {@link dipoleErrorEstimates}). */
const roundingLevel = (n: number) => 4 * Math.sqrt(n) * EPS;

/**
 * Estimated error of each centre's force-balance dipole, e·a0, and the size it is judged against (derived here;
 * bounds of leading order, not rigorous). With w the lowest frequency of a centre, x_ij = |q_i q_j|/(√(m_i m_j)
 * R³ w_i w_j) the pair coupling, σ̄ = max 1/(2 m min(w, ω_min)) of the pair (ω_min the lowest normal mode) and
 * |T3:X| ≤ 30 |X|/R⁴:
 *  - size: Σ_j 9 |q_i|³ q_j² / (m_i² w_i³ m_j w_j (w_i + w_j) R^7), the pairs' leading terms |D7.a|/R^7;
 *  - matrix pairs: the covariance between two centres is known to an absolute 4 √n eps σ̄ (the eigensolver's
 *    backward error is of order eps‖D‖), so the force carries 30 |q_i q_j| 4 √n eps σ̄ / R⁴ (the own blocks are
 *    exact to eps/x relative, diagonalCovarianceShift); relative to the pair's term this is about eps √n/x;
 *  - far pairs (left out of the matrix): the covariance relayed via third centres, ≤ σ̄ √(Q_i Q_j) with
 *    Q_i = Σ_k (2 x_ik)² over i's matrix partners (Cauchy–Schwarz, leading order), taken from the matrix when
 *    that bound exceeds the rounding level (then its error is the rounding level) and left out, with the bound
 *    as its error, otherwise; the screening of the pair's own covariance by the partners' other couplings,
 *    2 x_ij (Q_i + Q_j) σ̄ (below the rounding level by the choice of far pairs); and the induction across the
 *    dropped coupling
 *    beyond the one correction step of {@link farInduction}: 2 q_i² |q_j δx_j| / (R³ m_i w_i²), δx the step;
 *  - every force reaches the dipole through A^-1: a factor |q_i| / (m_i λ_min), λ_min the lowest ω².
 */
function dipoleErrorEstimates(
  centres: readonly ClusterCentre[],
  sp: readonly DrudeSpecies[],
  far: ReadonlySet<number>,
  relayed: ReadonlySet<number>,
  Q: Float64Array,
  correction: Float64Array,
  lambdaMin: number,
  n: number,
): { error: Float64Array; scale: Float64Array } {
  const N = centres.length;
  const error = new Float64Array(N), scale = new Float64Array(N);
  const wMin = sp.map((s) => Math.min(s.w[0], s.w[1], s.w[2]));
  const lever = sp.map((s) => Math.abs(s.q) / (s.m * lambdaMin));
  // a soft normal mode (near the polarisation catastrophe) widens the covariance to 1/(2 m ω_min)
  const omegaMin = Math.sqrt(lambdaMin);
  const sigmaBar = (i: number, j: number) => Math.max(1 / (2 * sp[i].m * Math.min(wMin[i], omegaMin)), 1 / (2 * sp[j].m * Math.min(wMin[j], omegaMin)));
  const round = roundingLevel(n);
  const eachPair = (visit: (i: number, j: number, R: Vec3, r: number, isFar: boolean) => void) => {
    for (let i = 0; i < N; i++)
      for (let j = i + 1; j < N; j++) {
        const R = separation(centres[i], centres[j]);
        visit(i, j, R, Math.hypot(R[0], R[1], R[2]), far.size > 0 && far.has(pairKey(i, j, N)));
      }
  };
  eachPair((i, j, _R, r, isFar) => {
    const si = sp[i], sj = sp[j], wi = wMin[i], wj = wMin[j];
    const size = (a: DrudeSpecies, wa: number, b: DrudeSpecies, wb: number) =>
      (9 * Math.abs(a.q) ** 3 * b.q * b.q) / (a.m * a.m * wa ** 3 * b.m * wb * (wa + wb) * r ** 7);
    scale[i] += size(si, wi, sj, wj);
    scale[j] += size(sj, wj, si, wi);
    if (isFar) return;
    const force = (30 * Math.abs(si.q * sj.q) * round * sigmaBar(i, j)) / r ** 4;
    error[i] += lever[i] * force;
    error[j] += lever[j] * force;
  });
  eachPair((i, j, R, r, isFar) => {
    if (!isFar) return;
    const si = sp[i], sj = sp[j];
    // the relayed covariance: from the matrix (to its rounding level) or left out (below that level)
    const x = Math.abs(si.q * sj.q) / (Math.sqrt(si.m * sj.m) * r ** 3 * wMin[i] * wMin[j]);
    const bound = (relayed.has(pairKey(i, j, N)) ? round : Math.sqrt(Q[i] * Q[j])) + 2 * x * (Q[i] + Q[j]);
    const force = (30 * Math.abs(si.q * sj.q) * sigmaBar(i, j) * bound) / r ** 4;
    error[i] += lever[i] * force;
    error[j] += lever[j] * force;
    const moved = (k: number) => Math.abs(sp[k].q) * Math.hypot(correction[3 * k], correction[3 * k + 1], correction[3 * k + 2]);
    error[i] += (2 * si.q * si.q * moved(j)) / (r ** 3 * si.m * wMin[i] ** 2);
    error[j] += (2 * sj.q * sj.q * moved(i)) / (r ** 3 * sj.m * wMin[j] ** 2);
    if (!isIsotropic(si) || !isIsotropic(sj)) return;
    const pair = isotropicPairDipoles(si, sj, r);
    error[i] += 16 * EPS * Math.abs(pair.a);
    error[j] += 16 * EPS * Math.abs(pair.b);
  });
  // the solve's own rounding
  for (let i = 0; i < N; i++) error[i] += round * scale[i];
  return { error, scale };
}

/**
 * The force the far pairs' dipole coupling exerts on the displacements x beyond each pair's own part (derived
 * here): G_i = Σ_{j far} q_i q_j K_ij (x_j − x_j^(ij)), K = (R² δ − 3 R R)/R^5 (dipole-tensors.ts), with x^(ij) the
 * displacements of the pair alone, −mu^(ij)/q along the axis (its closed form, pair-dipole.ts; zero for
 * anisotropic pairs, which have none). A^-1 G is the first-order change of x when the coupling is added to A.
 */
function farInduction(centres: readonly ClusterCentre[], sp: readonly DrudeSpecies[], far: ReadonlySet<number>, x: Float64Array, n: number): Float64Array {
  const N = centres.length;
  const G = new Float64Array(n);
  const K = new Float64Array(9);
  const d = new Float64Array(3);
  const push = (to: number, from: number, own: number, R: Vec3, r: number, qq: number) => {
    for (let b = 0; b < 3; b++) d[b] = x[3 * from + b] - (own * R[b]) / r;
    for (let a = 0; a < 3; a++) G[3 * to + a] += qq * (K[3 * a] * d[0] + K[3 * a + 1] * d[1] + K[3 * a + 2] * d[2]);
  };
  for (let i = 0; i < N; i++)
    for (let j = i + 1; j < N; j++) {
      if (!far.has(pairKey(i, j, N))) continue;
      const si = sp[i], sj = sp[j];
      const R = separation(centres[i], centres[j]);
      const r = Math.hypot(R[0], R[1], R[2]);
      writeDipoleCouplingBlock(R, 1, K, 0, 3);
      const pair = isIsotropic(si) && isIsotropic(sj) ? isotropicPairDipoles(si, sj, r) : { a: 0, b: 0 };
      push(i, j, -pair.b / sj.q, R, r, si.q * sj.q);
      push(j, i, -pair.a / si.q, R, r, si.q * sj.q);
    }
  return G;
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
 * The shifts of the diagonal covariance blocks from the free centres', ΔΣ^{ii} = Σ^{ii} − diag(1/(2 m_i w_ia)),
 * without the cancellation of Σ − Σ0 (derived here): with f(t) = t^-½, S = f(D), S0 = f(D0), D0 = diag(w²),
 * C = D − D0 (zero diagonal blocks), the divided-difference (Daleckii–Krein) form f(D) − f(D0) = V E,
 * E_kb = f[λ_k, d_b] (VᵀC)_kb, together with (VᵀC)_kb = (λ_k − d_b) V_bk and f[λ, d] = f'(d) + (λ − d) ρ(λ, d) gives
 *   ΔS_ab = f'(d_b) C_ab + Σ_k V_ak V_bk ρ(λ_k, d_b) (λ_k − d_b)²,   C_ab = 0 within a block,
 * every term of second order in the coupling (ρ: pair-dipole.ts); ΔΣ = ΔS/(2 m_i). The plain difference loses
 * all digits below eps·Σ0, i.e. the dipole's relative precision would be eps/x² instead of eps/x (x: the
 * coupling). Returned as 9 entries (row-major 3×3, symmetrised) per centre.
 */
function diagonalCovarianceShift(lambda: Float64Array, V: Float64Array, w: Float64Array, m: readonly number[], N: number, n: number): Float64Array {
  const out = new Float64Array(9 * N);
  const t = new Float64Array(3 * n);
  const root = lambda.map(Math.sqrt);
  for (let i = 0; i < N; i++) {
    for (let b = 0; b < 3; b++) {
      const wb = w[3 * i + b], d = wb * wb;
      const row = (3 * i + b) * n;
      for (let k = 0; k < n; k++) {
        const e = lambda[k] - d, a = root[k], s = a + wb;
        // ρ(λ_k, d) of pair-dipole.ts, inlined (the n² loop)
        t[b * n + k] = (V[row + k] * (a + 2 * wb) * e * e) / (2 * a * d * wb * s * s);
      }
    }
    for (let a = 0; a < 3; a++) {
      const row = (3 * i + a) * n;
      for (let b = 0; b < 3; b++) {
        let s = 0;
        for (let k = 0; k < n; k++) s += V[row + k] * t[b * n + k];
        out[9 * i + 3 * a + b] += s / (4 * m[i]);
        out[9 * i + 3 * b + a] += s / (4 * m[i]);
      }
    }
  }
  return out;
}

/**
 * F_i = −<∂V_dq/∂r_i> over the coupled Gaussian (see the module comment), from the lower triangle of the
 * covariance Σ (n×n) for the blocks between centres and from Σ0 + ΔΣ ({@link diagonalCovarianceShift}) for a
 * centre's own block (T3:Σ0 = 0 exactly for an isotropic centre: T3 is traceless). The contractions use the
 * closed form of T3 (dipole-tensors.ts) against a 3×3 block X (derived here):
 *   Σ_bc T3_abc(R) X_bc = [3 (R_a tr X + (X R)_a + (Xᵀ R)_a) − 15 R_a (Rᵀ X R)/R²] / R^5,
 * which is the same for X and Xᵀ (T3 is symmetric in its indices; so Σ^{ij} can be read as its transpose Σ^{ji}
 * from the lower triangle) and odd in R, so per pair
 *   F_i += q_i q_j [−T3(R):Σ^{ij} + ½ T3(R):Σ^{jj}],  F_j += q_i q_j [T3(R):Σ^{ij} − ½ T3(R):Σ^{ii}],  R = R_j − R_i.
 * For a far pair (`direct` false) the Σ^{ij} term is left out (the pair's own part comes from its closed form,
 * {@link farField}); the own-block terms stay: they carry the other centres' screening of i and j.
 */
function forceBalanceSource(
  centres: readonly ClusterCentre[],
  sp: readonly DrudeSpecies[],
  sigma: Float64Array,
  selfShift: Float64Array,
  N: number,
  n: number,
  direct: (i: number, j: number) => boolean,
): Float64Array {
  const F = new Float64Array(n);
  const X = new Float64Array(9);
  const c = new Float64Array(3);
  const contract = (R0: number, R1: number, R2: number) => {
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
  /** X ← Σ^{ij} (i > j) from the lower triangle */
  const between = (i: number, j: number) => {
    for (let b = 0; b < 3; b++) for (let e = 0; e < 3; e++) X[3 * b + e] = sigma[(3 * i + b) * n + 3 * j + e];
  };
  /** X ← Σ^{ii}, without its isotropic free part */
  const own = (i: number) => {
    const s = sp[i];
    for (let k = 0; k < 9; k++) X[k] = selfShift[9 * i + k];
    if (!isIsotropic(s)) for (let a = 0; a < 3; a++) X[4 * a] += 1 / (2 * s.m * s.w[a]);
  };
  for (let i = 0; i < N; i++) {
    const Pi = centres[i].position;
    for (let j = i + 1; j < N; j++) {
      const Pj = centres[j].position;
      const R0 = Pj[0] - Pi[0], R1 = Pj[1] - Pi[1], R2 = Pj[2] - Pi[2];
      const qq = sp[i].q * sp[j].q;
      if (direct(i, j)) {
        between(j, i); // Σ^{ji} = (Σ^{ij})ᵀ, same contraction
        contract(R0, R1, R2);
        for (let a = 0; a < 3; a++) {
          F[3 * i + a] -= qq * c[a];
          F[3 * j + a] += qq * c[a];
        }
      }
      own(j);
      contract(R0, R1, R2);
      for (let a = 0; a < 3; a++) F[3 * i + a] += 0.5 * qq * c[a];
      own(i);
      contract(R0, R1, R2);
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
