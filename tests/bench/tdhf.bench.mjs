// First-principles closed-shell atoms (time-dependent Hartree–Fock): an arbitrary atom from scratch (target: Xe in
// under 10 s on 2 cores) and pairs that reuse the shipped data (src/data/tdhf-atoms.ts). CPU time is printed beside
// wall time: on a shared machine the wall time also measures the other users.
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computeTdhfAtom } from '../../dist/engines/atoms/hartree-fock/atom-response.js';

const here = dirname(fileURLToPath(import.meta.url));
console.log(`node ${process.version}`);

for (const [label, Z, charge] of [['He', 2, 0], ['Ne', 10, 0], ['Na+', 11, 1], ['Ar', 18, 0], ['Kr', 36, 0], ['Xe', 54, 0]]) {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const r = computeTdhfAtom(Z, charge);
  const wall = (performance.now() - t0) / 1000;
  const c = process.cpuUsage(c0);
  const cpu = (c.user + c.system) / 1e6;
  console.log(`${('from scratch: ' + label + ' (SCF + alpha_1..3 + B on ' + r.response.u.length + ' points)').padEnd(66)} ${wall.toFixed(2)} s wall, ${cpu.toFixed(2)} s CPU`);
}

const bin = join(here, '../../dist/cli/bin.js');
for (const args of [['pair', 'tdhf:He', 'tdhf:Ar'], ['pair', 'tdhf:Xe', 'tdhf:Kr'], ['pair', 'tdhf:Z=11,charge=1', 'tdhf:He'], ['--version']]) {
  const t0 = performance.now();
  const p = spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8' });
  const ms = performance.now() - t0;
  console.log(`${('process: dispole ' + args.join(' ')).padEnd(66)} ${ms.toFixed(0)} ms wall (exit ${p.status})`);
}
