// Default `dispole curve` (25 points) of the two pairs of the series issue, as whole commands from dist/:
// Quelon–Virid (invented demo species; default order 6) and two invented axial anisotropic QDOs (default order 7).
// Target (series issue): under 5 s each. Also the in-process split: the exact solves and the asymptotic series.
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { drude, drudeAnisotropic, exactCurve, separationGrid } from '../../dist/index.js';

const bin = fileURLToPath(new URL('../../dist/cli/bin.js', import.meta.url));
const pairs = [
  ['Quelon', 'Virid'],
  ['drude:q=1.2,m=0.5,wx=0.7,wy=0.7,wz=1.1', 'drude:q=0.8,m=0.4,wx=1.3,wy=1.3,wz=0.6'],
];
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

console.log(`node ${process.version}; default \`curve A B\` (25 points), whole command, 3 runs each`);
for (const [a, b] of pairs) {
  const times = [];
  let status = 0;
  for (let k = 0; k < 3; k++) {
    const t = performance.now();
    const r = spawnSync(process.execPath, [bin, 'curve', a, b], { encoding: 'utf8' });
    times.push(performance.now() - t);
    status = r.status ?? -1;
  }
  console.log(`${a} – ${b}: median ${median(times).toFixed(0)} ms (min ${Math.min(...times).toFixed(0)}), exit ${status}`);
}

// in-process: the exact solves alone on the default grids (from = 4 widths, to = 5 × from)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
const prolate = drudeAnisotropic({ q: 1.2, m: 0.5, wx: 0.7, wy: 0.7, wz: 1.1 }, 'prolate');
const oblate = drudeAnisotropic({ q: 0.8, m: 0.4, wx: 1.3, wy: 1.3, wz: 0.6 }, 'oblate');
for (const [A, B, order, from] of [[quelon, virid, 6, 10], [prolate, oblate, 7, 11], [quelon, virid, 3, 7.9]]) {
  const t = performance.now();
  const c = exactCurve(A, B, separationGrid(from, 5 * from, 25, 'log'), { order });
  console.log(`exact solves ${A.name}–${B.name}, order ${order}, ${from}–${5 * from} bohr: ${(performance.now() - t).toFixed(0)} ms, largest basis ${Math.max(...c.points.map((p) => p.quanta))} quanta`);
}
