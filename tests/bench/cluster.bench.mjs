// Time of `computeCluster` (energies, screened alpha and C6, all force-balance dipoles) for 100 … 1000 centres,
// split by stage. Target (N-oscillator issue): 1000 centres in under 30 s on the 2-core machine.
// Usage: node tests/bench/cluster.bench.mjs [N …]   (default 100 200 400 700 1000; DISPOLE_DIST=/path/to/build to
// measure another build than dist/)
// Besides wall time, each line shows the process CPU time (all threads), the thread count the engine chose and the
// 1-minute load average before the run: on a shared machine the wall time is an upper bound.
import { availableParallelism, loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const dist = resolve(process.env.DISPOLE_DIST ?? new URL('../../dist', import.meta.url).pathname);
const fromBuild = (path) => import(pathToFileURL(join(dist, path)).href);
const { computeCluster } = await fromBuild('engines/cluster/cluster.js');
const { teamSizeFor } = await fromBuild('math/thread-team.js');
const { drude } = await fromBuild('model/drude.js');
import { randomCluster as randomClusterOf } from './random-cluster.mjs';

const randomCluster = (N) => randomClusterOf(N, drude);

const sizes = process.argv.slice(2).map(Number).filter((x) => x > 0);
console.log(`node ${process.version}, ${availableParallelism()} cores`);
console.log('N'.padStart(5), 'total s'.padStart(8), 'cpu s'.padStart(7), 'threads', ' load', '  stages (s)');
let previous;
for (const N of sizes.length ? sizes : [100, 200, 400, 700, 1000]) {
  const centres = randomCluster(N);
  const stages = new Map();
  let stage = '', since = performance.now();
  const load = loadavg()[0];
  const cpu0 = process.cpuUsage();
  const t0 = since;
  const r = computeCluster(centres, {
    progress: (s) => {
      if (s === stage) return;
      const now = performance.now();
      if (stage) stages.set(stage, (now - since) / 1000);
      stage = s;
      since = now;
    },
  });
  const end = performance.now();
  const cpu = process.cpuUsage(cpu0);
  stages.set(stage, (end - since) / 1000);
  const total = (end - t0) / 1000;
  const growth = previous ? `  (×${(total / previous.t).toFixed(1)} for N ×${(N / previous.N).toFixed(2)})` : '';
  console.log(
    String(N).padStart(5),
    total.toFixed(2).padStart(8),
    ((cpu.user + cpu.system) / 1e6).toFixed(2).padStart(7),
    String(teamSizeFor(3 * N)).padStart(7),
    load.toFixed(1).padStart(5),
    ' ',
    [...stages].map(([k, v]) => `${k} ${v.toFixed(2)}`).join(', '),
    growth,
    r.converged ? '' : 'UNCONVERGED',
  );
  previous = { N, t: total };
}
