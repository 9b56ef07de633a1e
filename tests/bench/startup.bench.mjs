// Whole-process ratios of the speed issue, each measured in one run: commands started as processes in turn
// (A B A B …, after one warm-up each) so that both see the same machine load; the ratio is taken pair by pair and
// its median printed with the medians of the wall times.
// Usage: node tests/bench/startup.bench.mjs [runs]   (default 7; DISPOLE_DIST=/path/to/build for another build)
// Goals: `pair Quelon Virid` ≤ 2× `node -e 0`, `--help` ≤ 1.5×, `check` with a syntax error ≤ 2×; the default-route
// table over 100 invented species ≤ 1.5× the perturbation + response table.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const dist = resolve(process.env.DISPOLE_DIST ?? new URL('../../dist', import.meta.url).pathname);
const bin = join(dist, 'cli/bin.cjs'); // the package's command: the bundled CLI with its code cache
const tree = join(dist, 'cli/main.js'); // the same program from the module tree (no bundle), for comparison
const runs = Number(process.argv[2] ?? 7);
const node = process.execPath;

// the 100 invented species of tests/bench/table.bench.mjs (golden-ratio sequences; no real data)
const frac = (x) => x - Math.floor(x);
const dir = mkdtempSync(join(tmpdir(), 'dispole-startup-'));
const speciesFile = join(dir, 'species.yaml');
writeFileSync(
  speciesFile,
  'species:\n' +
    Array.from({ length: 100 }, (_, i) => {
      const q = +(0.7 + 1.2 * frac(0.6180339887 * (i + 1))).toFixed(4);
      const m = +(0.25 + 0.55 * frac(0.7548776662 * (i + 1))).toFixed(4);
      const w = +(0.4 + 0.8 * frac(0.569840291 * (i + 1))).toFixed(4);
      return `  Inv${String(i).padStart(3, '0')}: { kind: drude, q: ${q}, m: ${m}, w: ${w}, source: invented for the benchmark }`;
    }).join('\n') +
    '\n',
);

const wall = (args) => {
  const t = process.hrtime.bigint();
  spawnSync(node, args, { stdio: 'ignore' });
  return Number(process.hrtime.bigint() - t) / 1e9;
};
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

function compare(label, a, b, goal, n = runs) {
  wall(a);
  wall(b);
  const ta = [], tb = [], ratio = [];
  for (let i = 0; i < n; i++) {
    ta.push(wall(a));
    tb.push(wall(b));
    ratio.push(ta[i] / tb[i]);
  }
  console.log(
    `${label.padEnd(48)} ${median(ta).toFixed(3)} s vs ${median(tb).toFixed(3)} s: ratio ${median(ratio).toFixed(2)} ` +
      `(range ${Math.min(...ratio).toFixed(2)}–${Math.max(...ratio).toFixed(2)}; goal ≤ ${goal})`,
  );
}

console.log(`node ${process.version}; build ${dist}; ${runs} alternating runs; load ${loadavg()[0].toFixed(1)}`);
try {
  const bare = ['-e', '0'];
  compare('dispole --help / node -e 0', [bin, '--help'], bare, 1.5);
  compare('dispole pair Quelon Virid / node -e 0', [bin, 'pair', 'Quelon', 'Virid'], bare, 2);
  compare('dispole check "x+" --for D7.a / node -e 0', [bin, 'check', 'x+', '--for', 'D7.a'], bare, 2);
  compare('pair Quelon Virid: bundle / module tree', [bin, 'pair', 'Quelon', 'Virid'], [tree, 'pair', 'Quelon', 'Virid'], '1 (information)');
  compare(
    'table, default routes / perturbation + response',
    [bin, 'table', '--species', speciesFile, '--csv'],
    [bin, 'table', '--species', speciesFile, '--routes', 'perturbation,response', '--csv'],
    1.5,
    Math.min(runs, 3),
  );
} finally {
  rmSync(dir, { recursive: true, force: true });
}
