// Speed issue: in-process ratios and compute times (start-up excluded), each measured in one run.
// Usage: node tests/bench/speed.bench.mjs   (DISPOLE_DIST=/path/to/build to measure another build than dist/)
// - the finite-R trust check (localisationCheck) against the whole exact solve at the same R (which includes it);
// - `pair H H` compute: computePair(H, H) in a fresh process, first call (pseudo-spectra built, JIT cold) and warm
//   (DISPOLE_DIST_OLD=/path/to/other/build: both builds alternating, with the first-call ratio);
// - force-balance coefficients of one QDO pair with and without C10.
// Species: invented demo QDOs Quelon/Virid, and hydrogen (exact, first principles).
// Whole-process ratios (start-up, tables) are measured from outside with /usr/bin/time or a benchmark tool: see
// tests/bench/RESULTS.md for the commands.
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const dist = resolve(process.env.DISPOLE_DIST ?? new URL('../../dist', import.meta.url).pathname);
const lib = await import(pathToFileURL(join(dist, 'index.js')).href);
const { drude, exactSolver, localisationCheck, forceBalanceCoefficients } = lib;

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`node ${process.version}; build ${dist}; load ${loadavg()[0].toFixed(1)}`);

// --- trust check against the exact solve, per R (alternating, same load) ---
const A = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const B = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
for (const order of [3, 4]) {
  const Rs = Array.from({ length: 12 }, (_, i) => 6 + i * 1.5);
  exactSolver(A, B, { order }).solve(8); // warm-up (JIT, dense solver module)
  localisationCheck(A, B, order, 8);
  // per R the fastest of 5 rounds of each (a loaded machine pre-empts single calls for tens of ms)
  const checks = Rs.map(() => Infinity), solves = Rs.map(() => Infinity);
  for (let round = 0; round < 5; round++) {
    const solver = exactSolver(A, B, { order });
    Rs.forEach((R, i) => {
      let t = performance.now();
      solver.solve(R);
      solves[i] = Math.min(solves[i], performance.now() - t);
      t = performance.now();
      localisationCheck(A, B, order, R);
      checks[i] = Math.min(checks[i], performance.now() - t);
    });
  }
  const ratios = Rs.map((_, i) => checks[i] / solves[i]);
  console.log(
    `trust check, order ${order}, R = 6…22.5 bohr: ${median(checks).toFixed(2)} ms per R; exact solve (check included) ${median(solves).toFixed(2)} ms per R; ` +
      `check/solve median ${(100 * median(ratios)).toFixed(0)} % (range ${(100 * Math.min(...ratios)).toFixed(0)}–${(100 * Math.max(...ratios)).toFixed(0)} %)`,
  );
}

// --- pair H H compute in a fresh process (module loading excluded) ---
// With DISPOLE_DIST_OLD=<build>, that build runs too, alternating with this one (same load), and the first-call
// ratio new/old is the median of the per-round ratios.
const childFor = (build) => `
const lib = await import(${JSON.stringify(pathToFileURL(join(build, 'index.js')).href)});
let t = performance.now();
lib.computePair(lib.resolveSpecies('H'), lib.resolveSpecies('H'));
const first = performance.now() - t;
const warm = [];
for (let i = 0; i < 3; i++) { t = performance.now(); lib.computePair(lib.resolveSpecies('H'), lib.resolveSpecies('H')); warm.push(performance.now() - t); }
console.log(first.toFixed(0), Math.min(...warm).toFixed(0));
`;
const builds = [['this build', dist], ...(process.env.DISPOLE_DIST_OLD ? [['old build', resolve(process.env.DISPOLE_DIST_OLD)]] : [])];
const rounds = builds.length > 1 ? 9 : 3;
const times = builds.map(() => ({ firsts: [], warms: [] }));
for (let i = 0; i < rounds; i++)
  builds.forEach(([, build], b) => {
    const r = spawnSync(process.execPath, ['--input-type=module', '-e', childFor(build)], { encoding: 'utf8' });
    const [first, warm] = r.stdout.trim().split(' ').map(Number);
    times[b].firsts.push(first);
    times[b].warms.push(warm);
  });
builds.forEach(([name], b) => {
  const { firsts, warms } = times[b];
  console.log(`pair H H compute, ${name} (fresh process, after module loading): first call ${median(firsts)} ms (runs ${firsts.join(', ')}); warm ${median(warms)} ms`);
});
if (builds.length > 1) {
  const ratios = times[0].firsts.map((x, i) => x / times[1].firsts[i]);
  console.log(`pair H H first call, this build / old build: median ${median(ratios).toFixed(2)} (range ${Math.min(...ratios).toFixed(2)}–${Math.max(...ratios).toFixed(2)}, ${rounds} rounds)`);
}

// --- force balance per pair ---
const pairs = Array.from({ length: 50 }, (_, i) => [drude({ q: 0.8 + 0.01 * i, m: 0.4, w: 0.7 }), drude({ q: 1.3, m: 0.5 + 0.004 * i, w: 0.6 })]);
for (const power of [10, 8, 10, 8]) {
  const t = performance.now();
  for (let k = 0; k < 20; k++) for (const [P, Q] of pairs) forceBalanceCoefficients(P, Q, power);
  if (power === 10 || power === 8) console.log(`force balance up to C${power}: ${((1000 * (performance.now() - t)) / (20 * pairs.length)).toFixed(0)} µs per pair`);
}
