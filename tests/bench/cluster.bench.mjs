// Time of `computeCluster` (energies, screened alpha and C6, all force-balance dipoles) for 100 … 1000 centres,
// split by stage. Target (N-oscillator issue): 1000 centres in under 30 s on the 2-core machine.
// Usage: node tests/bench/cluster.bench.mjs [N …]   (default 100 200 400 700 1000)
// Besides wall time, each line shows the process CPU time (all threads), the thread count the engine chose and the
// 1-minute load average before the run: on a shared machine the wall time is an upper bound.
import { availableParallelism, loadavg } from 'node:os';
import { computeCluster } from '../../dist/engines/cluster/cluster.js';
import { teamSizeFor } from '../../dist/math/thread-team.js';
import { drude } from '../../dist/model/drude.js';

const Quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const Virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/** N centres at random in a cube, at least 6 bohr apart (a dense invented liquid-like cluster); seeded. */
function randomCluster(N) {
  let seed = 12345;
  const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  const L = Math.cbrt(N) * 7.5;
  const pts = [];
  while (pts.length < N) {
    const p = [rnd() * L, rnd() * L, rnd() * L];
    if (pts.every((q) => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) > 6)) pts.push(p);
  }
  return pts.map((p, i) => ({ label: i % 3 ? 'Quelon' : 'Virid', species: i % 3 ? Quelon : Virid, position: p }));
}

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
