// `dispole table` speed. Target (coefficient-table issue): 100 species (5 050 pairs) by the perturbation and
// response routes in under 10 s. Species are 100 INVENTED isotropic QDOs (no real data).
// Measures: the engine (computeTable), each renderer, the whole command in-process, and the command as a process.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { allPairs, computeTable, drude, memoryIO, renderTable, runCli, TABLE_FORMATS } from '../../dist/index.js';

const here = dirname(fileURLToPath(import.meta.url));
const bin = join(here, '../../dist/cli/bin.js');

// 100 invented isotropic QDOs spread over realistic ranges by golden-ratio (Weyl) sequences (common practice),
// so every run uses the same species
const frac = (x) => x - Math.floor(x);
const params = Array.from({ length: 100 }, (_, i) => ({
  name: `Inv${String(i).padStart(3, '0')}`,
  q: +(0.7 + 1.2 * frac(0.6180339887 * (i + 1))).toFixed(4),
  m: +(0.25 + 0.55 * frac(0.7548776662 * (i + 1))).toFixed(4),
  w: +(0.4 + 0.8 * frac(0.5698402910 * (i + 1))).toFixed(4),
}));
const species = params.map((p) => drude(p, p.name, 'invented for the benchmark'));
const yaml = 'species:\n' + params.map((p) => `  ${p.name}: { kind: drude, q: ${p.q}, m: ${p.m}, w: ${p.w}, source: invented for the benchmark }`).join('\n') + '\n';
const ROUTES = ['perturbation', 'response'];

const ms = (t0) => performance.now() - t0;
const line = (label, t) => console.log(`${label.padEnd(64)} ${(t / 1000).toFixed(2)} s`);

console.log(`node ${process.version}; 100 invented species, ${allPairs(species).length} pairs`);

// warm-up on a small table so JIT compilation is not all charged to the first measurement
computeTable(allPairs(species.slice(0, 10)), { routes: ROUTES });

let t0 = performance.now();
const table = computeTable(allPairs(species), { routes: ROUTES, relTol: 1e-13 });
line('engine: computeTable, perturbation + response', ms(t0));
const bad = table.rows.filter((r) => r.status !== 'ok').length;
console.log(`  rows not "ok": ${bad}; largest spread ${Math.max(...table.rows.map((r) => r.result.spread.max)).toExponential(1)}`);

for (const f of TABLE_FORMATS) {
  t0 = performance.now();
  const text = renderTable(table, f, { units: 'atomic', digits: 6 });
  line(`render ${f} (${(text.length / 1e6).toFixed(2)} MB)`, ms(t0));
}

t0 = performance.now();
const io = memoryIO({ 'bench.yaml': yaml });
const code = await runCli(['table', '--species', 'bench.yaml', '--routes', ROUTES.join(','), '--csv'], io);
line(`CLI in-process: table --species (100) --routes ${ROUTES.join(',')} --csv`, ms(t0));
if (code !== 0) console.log(`  exit code ${code}: ${io.err}`);

const dir = mkdtempSync(join(tmpdir(), 'dispole-bench-'));
try {
  writeFileSync(join(dir, 'bench.yaml'), yaml);
  for (const [label, extra] of [
    [`process: dispole table --species (100) --routes ${ROUTES.join(',')} --csv`, ['--routes', ROUTES.join(','), '--csv']],
    ['process: the same with --latex', ['--routes', ROUTES.join(','), '--latex']],
    ['process: default routes (all default routes), --csv', ['--csv']],
  ]) {
    t0 = performance.now();
    const r = spawnSync(process.execPath, [bin, 'table', '--species', join(dir, 'bench.yaml'), ...extra, '--out', join(dir, 'out'), '--force', '--quiet'], { encoding: 'utf8' });
    line(label, ms(t0));
    if (r.status !== 0) console.log(`  exit code ${r.status}: ${r.stderr.trim()}`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
