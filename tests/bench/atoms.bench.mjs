// Real atoms: time of hydrogen pairs by both routes (target, real-atoms issue: the pair command well under a
// second), with the pseudo-spectrum built once per process (cold) and reused (warm), plus response-data species.
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computePair, drude, hydrogenic, hydrogenicSpectrum, parseResponseData, pseudoStateResponse, resolveSpecies } from '../../dist/index.js';

const here = dirname(fileURLToPath(import.meta.url));

function once(label, fn) {
  const t0 = performance.now();
  fn();
  const ms = performance.now() - t0;
  console.log(`${label.padEnd(62)} ${ms.toFixed(1)} ms (single call)`);
}

function time(label, fn, { warm = 3, runs = 10 } = {}) {
  for (let i = 0; i < warm; i++) fn(i);
  const t0 = performance.now();
  for (let i = 0; i < runs; i++) fn(i);
  const ms = (performance.now() - t0) / runs;
  console.log(`${label.padEnd(62)} ${ms.toFixed(1)} ms per call`);
}

console.log(`node ${process.version}`);
const H = hydrogenic({ Z: 1 }, 'H');
once('cold: H–H both routes (builds the basis-10 pseudo-spectrum)', () => computePair(H, H));
time('warm: H–H both routes (C6, C8, C10, D7)', () => computePair(H, H));
time('warm: H–QDO both routes', (i) => computePair(H, drude({ q: 1.2 + 1e-6 * i, m: 0.4, w: 0.9 }, 'q')));
time('warm: H–H response route only', () => computePair(H, H, { routes: ['response'] }));
for (const basis of [7, 14]) { // basis 10 is H's, already cached above
  const s = hydrogenic({ Z: 1, basis }, `H${basis}`);
  once(`cold: H–H perturbation route, basis ${basis}`, () => computePair(s, s, { routes: ['perturbation'] }));
}
once('cold: pseudo-spectrum + response, Z = 3, basis 10', () => pseudoStateResponse(hydrogenicSpectrum(3, 10, 3)));

const r = pseudoStateResponse(hydrogenicSpectrum(1, 10, 3));
const grid = [0, ...Array.from({ length: 29 }, (_, k) => 0.02 * 1.3 ** k)];
const text = ['electrons = 1', 'u [Eh], alpha [a0^3], B [au]', ...grid.map((u) => `${u}, ${r.alpha(1, u)}, ${r.hyperB(u)}`)].join('\n');
time('30-point table: parse + interpolate + pair with Ar (response)', () => {
  const t = parseResponseData(text, 't.csv');
  computePair(t, resolveSpecies('Ar'));
});

// the whole command, as a user runs it (node start-up included)
const bin = join(here, '../../dist/cli/bin.js');
for (const args of [['pair', 'H', 'H'], ['pair', 'He', 'Ar'], ['--version']]) {
  const t0 = performance.now();
  const p = spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
  const ms = performance.now() - t0;
  console.log(`${('process: dispole ' + args.join(' ')).padEnd(62)} ${ms.toFixed(0)} ms wall (exit ${p.status})`);
}
