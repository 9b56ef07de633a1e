// The cluster's dense eigensolve against single-thread LAPACK (numpy.linalg.eigh) on the same matrix.
// Usage: node tests/bench/lapack-peer.bench.mjs [N …]   (default 1000; N centres → a 3N×3N matrix)
// Optional: DISPOLE_DIST=/path/to/build (default dist/ of this checkout); ROUNDS=n alternating rounds (default 1);
// THREADS=t runs our eigensolve on a team of t threads (default: the engine's choice, all cores from order 500).
//
// The matrix is the mass-weighted force-constant matrix of a seeded random cluster of invented QDOs
// (tests/bench/random-cluster.mjs): diagonal w², off-diagonal blocks q_i q_j (1 − 3 r̂r̂ᵀ)/r³ / sqrt(m_i m_j)
// (dipole–dipole coupling; common practice). It is written once as raw float64 to a temporary file; numpy reads the same bytes.
// numpy runs with one BLAS thread; OPENBLAS_CORETYPE / OPENBLAS_L2_SIZE are removed from its environment only (they
// select an old kernel on some machines here and slow a current numpy). Without python3 + numpy that part is skipped.
// Runs alternate (ours, LAPACK, ours, LAPACK …) so that both see the same machine load; the ratio is per pair.
// Also printed: the eigensolve's stages (wall s) and the peak resident memory of this process (the eigensolve and
// the whole cluster; LAPACK runs in its own process).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { randomCluster } from './random-cluster.mjs';

const dist = resolve(process.env.DISPOLE_DIST ?? new URL('../../dist', import.meta.url).pathname);
const { symmetricEigen } = await import(pathToFileURL(join(dist, 'math/symmetric-eigen.js')).href);
const { ThreadTeam } = await import(pathToFileURL(join(dist, 'math/thread-team.js')).href);
const { computeCluster } = await import(pathToFileURL(join(dist, 'engines/cluster/cluster.js')).href);
const { drude } = await import(pathToFileURL(join(dist, 'model/drude.js')).href);

function forceConstantMatrix(centres) {
  const n = 3 * centres.length;
  const D = new Float64Array(n * n);
  centres.forEach((ci, i) => {
    for (let a = 0; a < 3; a++) D[(3 * i + a) * n + 3 * i + a] = ci.species.w[a] ** 2;
    for (let j = 0; j < i; j++) {
      const cj = centres[j];
      const d = [0, 1, 2].map((a) => cj.position[a] - ci.position[a]);
      const r = Math.hypot(...d);
      const f = (ci.species.q * cj.species.q) / (r ** 3 * Math.sqrt(ci.species.m * cj.species.m));
      for (let a = 0; a < 3; a++)
        for (let b = 0; b < 3; b++) {
          const v = f * ((a === b ? 1 : 0) - (3 * d[a] * d[b]) / (r * r));
          D[(3 * i + a) * n + 3 * j + b] = v;
          D[(3 * j + b) * n + 3 * i + a] = v;
        }
    }
  });
  return D;
}

const PEER = `
import sys, time, resource, numpy as np
n = int(sys.argv[2]); a = np.fromfile(sys.argv[1], dtype=np.float64).reshape(n, n)
t, c = time.perf_counter(), time.process_time(); w, v = np.linalg.eigh(a)
dt, dc = time.perf_counter() - t, time.process_time() - c
print(f"{dt:.4f} {dc:.4f} {w[0]:.17g} {w[-1]:.17g} numpy {np.__version__} {resource.getrusage(resource.RUSAGE_SELF).ru_maxrss}")
`;

function lapack(file, n) {
  const env = { ...process.env, OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  const r = spawnSync('python3', ['-c', PEER, file, String(n)], { env, encoding: 'utf8' });
  if (r.error || r.status !== 0) return undefined;
  const [seconds, cpu, lowest, highest, , version, rssKiB] = r.stdout.trim().split(/\s+/);
  return { seconds: Number(seconds), cpu: Number(cpu), lowest: Number(lowest), highest: Number(highest), version, rssMB: Number(rssKiB) / 1024 };
}

const sizes = process.argv.slice(2).map(Number).filter((x) => x > 0);
const rounds = Number(process.env.ROUNDS ?? 1);
const threads = process.env.THREADS ? Number(process.env.THREADS) : undefined;
console.log(`node ${process.version}, ${availableParallelism()} cores; build ${dist}`);
const dir = mkdtempSync(join(tmpdir(), 'dispole-peer-'));
try {
  for (const N of sizes.length ? sizes : [1000]) {
    const centres = randomCluster(N, drude);
    const n = 3 * N;
    const D = forceConstantMatrix(centres);
    const file = join(dir, `d${n}.f64`);
    writeFileSync(file, new Uint8Array(D.buffer));
    for (let round = 0; round < rounds; round++) {
      const load = loadavg()[0].toFixed(1);
      const cpuSeconds = (since) => {
        const u = process.cpuUsage(since);
        return (u.user + u.system) / 1e6;
      };
      const stages = [];
      const stage = (name) => {
        if (stages.at(-1)?.name !== name) stages.push({ name, at: performance.now() });
      };
      let t = performance.now(), c = process.cpuUsage();
      const team = threads ? new ThreadTeam(threads) : undefined;
      const ours = symmetricEigen(D, n, { progress: (name) => stage(name), team });
      const eig = (performance.now() - t) / 1000, eigCpu = cpuSeconds(c);
      team?.close();
      const split = stages.map((s, i) => `${s.name} ${(((stages[i + 1]?.at ?? t + eig * 1000) - s.at) / 1000).toFixed(2)}`).join(', ');
      t = performance.now();
      c = process.cpuUsage();
      computeCluster(centres);
      const cluster = (performance.now() - t) / 1000, clusterCpu = cpuSeconds(c);
      const peer = lapack(file, n);
      const line = [
        `N ${N} (n ${n}), load ${load}: eigensolve ${eig.toFixed(2)} s (CPU ${eigCpu.toFixed(2)} s, ${threads ? `${threads} thread(s)` : 'all threads'}; ${split}), ` +
          `whole cluster ${cluster.toFixed(2)} s (CPU ${clusterCpu.toFixed(2)} s), peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`,
      ];
      if (peer) {
        const agree = Math.max(Math.abs(ours.values[0] - peer.lowest), Math.abs(ours.values[n - 1] - peer.highest));
        line.push(
          `LAPACK eigh (numpy ${peer.version}, 1 thread) ${peer.seconds.toFixed(2)} s (CPU ${peer.cpu.toFixed(2)} s, peak RSS ${peer.rssMB.toFixed(0)} MB)`,
          `wall ratios eigensolve/eigh ${(eig / peer.seconds).toFixed(2)}, cluster/eigh ${(cluster / peer.seconds).toFixed(2)}`,
          `CPU ratios ${(eigCpu / peer.cpu).toFixed(2)}, ${(clusterCpu / peer.cpu).toFixed(2)}`,
          `extreme eigenvalues agree to ${agree.toExponential(1)}`,
        );
      } else line.push('LAPACK peer skipped (python3 with numpy not found)');
      console.log(line.join('; '));
    }
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
