// Default `dispole curve` (25 points) of the two pairs of the series issue, as whole commands:
// Quelon–Virid (invented demo species; default order 6) and two invented axial anisotropic QDOs (default order 7).
// Target (series issue): under 5 s wall each on 2 cores; aim ≤ 2.5 s CPU (Quelon–Virid) and ≤ 3 s (the axial pair).
// Usage: node tests/bench/curve.bench.mjs [runs]   (default 3; DISPOLE_DIST=/path/to/build, default dist/ of this
// checkout; DISPOLE_BASE=/path/to/other/build to run that one in turn, A B A B …, and print the ratios pair by pair).
// Each process reports its own CPU time (user + system, all threads: process.cpuUsage at exit).
// Also the in-process split: the exact solves alone on the default grids.
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const dist = resolve(process.env.DISPOLE_DIST ?? new URL('../../dist', import.meta.url).pathname);
const base = process.env.DISPOLE_BASE ? resolve(process.env.DISPOLE_BASE) : undefined;
const runs = Number(process.argv[2] ?? 3);
const pairs = [
  ['Quelon', 'Virid'],
  ['drude:q=1.2,m=0.5,wx=0.7,wy=0.7,wz=1.1', 'drude:q=0.8,m=0.4,wx=1.3,wy=1.3,wz=0.6'],
];
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
// printed by the child at exit: its CPU seconds (user + system, every thread of the process)
const reportCpu = `process.on('exit', () => { const u = process.cpuUsage(); process.stderr.write('\\ncpu ' + (u.user + u.system) / 1e6 + '\\n'); });`;

/** One run of `curve a b` from a build: wall and CPU seconds, exit status. */
function run(build, a, b) {
  const t = process.hrtime.bigint();
  const r = spawnSync(
    process.execPath,
    ['--import', `data:text/javascript,${encodeURIComponent(reportCpu)}`, join(build, 'cli/bin.js'), 'curve', a, b],
    { encoding: 'utf8' },
  );
  const wall = Number(process.hrtime.bigint() - t) / 1e9;
  const cpu = Number(/cpu ([0-9.e-]+)\s*$/.exec(r.stderr ?? '')?.[1] ?? NaN);
  return { wall, cpu, status: r.status ?? -1 };
}

console.log(`node ${process.version}; default \`curve A B\` (25 points), whole command, ${runs} runs each after one warm-up; load ${loadavg()[0].toFixed(1)}`);
console.log(`build: ${dist}${base ? `; against: ${base} (in turn)` : ''}`);
for (const [a, b] of pairs) {
  run(dist, a, b);
  if (base) run(base, a, b);
  const A = [], B = [];
  for (let k = 0; k < runs; k++) {
    A.push(run(dist, a, b));
    if (base) B.push(run(base, a, b));
  }
  const line = (xs) =>
    `wall median ${median(xs.map((x) => x.wall)).toFixed(2)} s (min ${Math.min(...xs.map((x) => x.wall)).toFixed(2)}), ` +
    `CPU median ${median(xs.map((x) => x.cpu)).toFixed(2)} s (min ${Math.min(...xs.map((x) => x.cpu)).toFixed(2)}), exit ${xs.at(-1).status}`;
  console.log(`${a} – ${b}: ${line(A)}`);
  if (base) {
    console.log(`  against: ${line(B)}`);
    const ratio = (f) => median(A.map((x, k) => f(x) / f(B[k]))).toFixed(2);
    console.log(`  ratio build/against (median of pairs): wall ${ratio((x) => x.wall)}, CPU ${ratio((x) => x.cpu)}`);
  }
}

// in-process: the exact solves alone on the default grids (from = 4 widths, to = 5 × from)
const { drude, drudeAnisotropic, exactCurve, separationGrid } = await import(pathToFileURL(join(dist, 'index.js')).href);
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
const prolate = drudeAnisotropic({ q: 1.2, m: 0.5, wx: 0.7, wy: 0.7, wz: 1.1 }, 'prolate');
const oblate = drudeAnisotropic({ q: 0.8, m: 0.4, wx: 1.3, wy: 1.3, wz: 0.6 }, 'oblate');
for (const [A, B, order, from] of [[quelon, virid, 6, 10], [prolate, oblate, 7, 11], [quelon, virid, 3, 7.9]]) {
  const t = performance.now();
  const c = exactCurve(A, B, separationGrid(from, 5 * from, 25, 'log'), { order });
  console.log(`exact solves ${A.name}–${B.name}, order ${order}, ${from}–${5 * from} bohr: ${(performance.now() - t).toFixed(0)} ms, largest basis ${Math.max(...c.points.map((p) => p.quanta))} quanta`);
}
