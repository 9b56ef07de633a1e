// Symbolic engine: time to derive closed forms (symbolic-engine issue: D7 of an unlike pair in under 2 s) and to
// check a formula, in-process (first call = cold, JIT and caches empty) and as whole processes.
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { checkFormula, deriveQuantities } from '../../dist/index.js';

const here = dirname(fileURLToPath(import.meta.url));
const TWO = { identical: false, anisotropic: false };
const D7 = ['D7.a', 'D7.b', 'D7.total'];

function once(label, fn) {
  const t0 = performance.now();
  fn();
  console.log(`${label.padEnd(66)} ${(performance.now() - t0).toFixed(1)} ms (single call)`);
}

function time(label, fn, { warm = 2, runs = 10 } = {}) {
  for (let i = 0; i < warm; i++) fn();
  const t0 = performance.now();
  for (let i = 0; i < runs; i++) fn();
  console.log(`${label.padEnd(66)} ${((performance.now() - t0) / runs).toFixed(1)} ms per call`);
}

console.log(`node ${process.version}`);
once('cold: derive D7.a, D7.b, D7.total, unlike isotropic pair', () => deriveQuantities(TWO, D7));
time('warm: derive D7.a, D7.b, D7.total, unlike isotropic pair', () => deriveQuantities(TWO, D7));
time('warm: derive C6, C8, D7.a, D7.b, D7.total (the default)', () => deriveQuantities(TWO, ['C6', 'C8', ...D7]));
time('warm: derive C6 … C10, D7, mu, in q, alpha, w', () =>
  deriveQuantities(TWO, ['C6', 'C8', 'C10', ...D7, 'mu.a', 'mu.b', 'mu.total'], 'alpha'));
time('warm: derive C6, D7.a, D7.b, D7.total, anisotropic unlike pair', () =>
  deriveQuantities({ identical: false, anisotropic: true }, ['C6', ...D7]), { warm: 1, runs: 3 });
const formula = '-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))';
once('cold: check D7.a (loads mathjs, derives every quantity)', () => checkFormula({ expression: formula, quantity: 'D7.a', layout: TWO }));
time('warm: check D7.a, 24 exact points', () => checkFormula({ expression: formula, quantity: 'D7.a', layout: TWO }));
time('warm: check a wrong D7.a (hint search)', () => checkFormula({ expression: formula.slice(1), quantity: 'D7.a', layout: TWO }));

// the whole command, as a user runs it (node start-up included)
const bin = join(here, '../../dist/cli/bin.js');
for (const args of [['derive', ...D7], ['derive'], ['check', formula, '--for', 'D7.a'], ['--version']]) {
  const t0 = performance.now();
  const p = spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
  const ms = performance.now() - t0;
  console.log(`${('process: dispole ' + args.map((a) => (a.includes(' ') ? `"${a}"` : a)).join(' ')).slice(0, 66).padEnd(66)} ${ms.toFixed(0)} ms wall (exit ${p.status})`);
}
