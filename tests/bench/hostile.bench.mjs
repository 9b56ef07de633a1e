// Hostile inputs answer quickly (issue: every bad input and fault gets a clear answer): whole processes on the
// build, wall time and exit code of the fuzzing pass's slowest cases. Build: `npm run build` (or DISPOLE_DIST).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const dist = resolve(process.env.DISPOLE_DIST ?? join(here, '../../dist'));
const bin = join(dist, 'cli/bin.js');
const dir = mkdtempSync(join(tmpdir(), 'dispole-hostile-'));
const xyz = (n) => [String(n), 'invented grid', ...Array.from({ length: n }, (_, k) => `Quelon ${10 * (k % 1000)} ${10 * Math.floor(k / 1000)} 0`)].join('\n');
writeFileSync(join(dir, 'many.xyz'), xyz(20_000));
writeFileSync(join(dir, 'million.xyz'), xyz(1_000_000));
writeFileSync(join(dir, 'big.csv'), ['B = -1', 'u [Eh], alpha [a0^3]', ...Array.from({ length: 130_000 }, (_, k) => `${k / 100}, ${1 / (1 + (k / 100) ** 2)}`)].join('\n'));

const LONDON = '3*qa^2*qb^2/(2*ma*mb*wa*wb*(wa + wb))';
const cases = [
  ['check (qa+qb+ma+mb+wa+wb)^64', ['check', '(qa+qb+ma+mb+wa+wb)^64', '--for', 'C6']],
  ['check a 12 KB sum qa+qa+…', ['check', 'qa+'.repeat(4000) + 'qa', '--for', 'C6']],
  ['check 1/1 + 1/2 + … + 1/2899 (19 KB)', ['check', Array.from({ length: 2899 }, (_, k) => `1/${k + 1}`).join('+'), '--for', 'C6']],
  ['check a product of 1499 factors (qa+k/7)', ['check', Array.from({ length: 1499 }, (_, k) => `(qa+${k + 1}/7)`).join('*'), '--for', 'C6']],
  ['check parentheses 300 deep', ['check', '('.repeat(300) + 'qa' + ')'.repeat(300), '--for', 'C6']],
  ['check hasOwnProperty(qa)*1000 + London', ['check', `hasOwnProperty(qa)*1000 + ${LONDON}`, '--for', 'C6']],
  ['cluster 20 000 centres (refused up front)', ['cluster', join(dir, 'many.xyz')]],
  ['cluster 1 000 000 centres (grid scan, then refused)', ['cluster', join(dir, 'million.xyz')]],
  ['pair with a 130 000-row response table', ['pair', 'big', 'Quelon', '--species', join(dir, 'big.csv')]],
  ['pair --species /dev/zero', ['pair', 'Quelon', 'Virid', '--species', '/dev/zero']],
  ['pair Quelon drude:q=1,m=1,w=1e-200', ['pair', 'Quelon', 'drude:q=1,m=1,w=1e-200']],
];
console.log(`node ${process.version}; build ${dist}`);
try {
  for (const [label, args] of cases) {
    const t0 = performance.now();
    const p = spawnSync(process.execPath, [bin, ...args], { encoding: 'utf8', maxBuffer: 1 << 26 });
    const ms = performance.now() - t0;
    console.log(`${label.padEnd(56)} ${ms.toFixed(0).padStart(6)} ms wall (exit ${p.status})`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
