// Finite-R exact solution: ground state of an unlike isotropic QDO pair (invented demo species Quelon–Virid) in
// the basis of up to N total quanta, with and without the L_z = 0 / mirror-even symmetry reduction: basis
// dimension, build time (basis + sparse matrices) and solve time (Davidson + polishing).
// Target (finite-R exact solution issue): N = 8 in under 1 s with the reduction.
import { drude, exactModel, hamiltonianAt, solveInBasis, exactRoute, exactCurve, separationGrid } from '../../dist/index.js';

const A = (i) => drude({ q: 1.1 + 1e-9 * i, m: 0.38, w: 0.72 }, 'Quelon');
const B = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');
const R = 6;

function groundState(i, N, reduced, order = 3) {
  const t0 = performance.now();
  const model = exactModel(A(i), B, { order, maxQuanta: N, reduced });
  const t1 = performance.now();
  const s = solveInBasis(model, hamiltonianAt(model, R), N, 1e-11);
  const t2 = performance.now();
  return { dim: s.dimension, nnz: model.coupling.col.length, build: t1 - t0, solve: t2 - t1, total: t2 - t0, energy: s.energy, residual: s.residual };
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

console.log(`node ${process.version}; pair Quelon–Virid at R = ${R} bohr, multipole order 3`);
const first = groundState(999, 8, true);
console.log(`first call in a fresh process (N = 8, reduced; includes JIT warm-up): ${first.total.toFixed(1)} ms`);
groundState(998, 6, false); // warm up the unreduced path too
console.log('N   reduction   dimension   nonzeros   build ms   solve ms   total ms   E_int (Eh)      (medians)');
for (const [N, reduced, runs] of [[8, true, 9], [8, false, 7], [12, true, 5], [12, false, 3], [16, true, 3], [20, true, 3]]) {
  const warm = Array.from({ length: runs }, (_, k) => groundState(k, N, reduced));
  const cold = warm[0];
  console.log(
    [
      String(N).padEnd(3),
      (reduced ? 'yes' : 'no').padEnd(11),
      String(cold.dim).padStart(9),
      String(cold.nnz).padStart(10),
      median(warm.map((w) => w.build)).toFixed(1).padStart(10),
      median(warm.map((w) => w.solve)).toFixed(1).padStart(10),
      median(warm.map((w) => w.total)).toFixed(1).padStart(10),
      cold.energy.toPrecision(12).padStart(17),
    ].join(' '),
  );
}

let t = performance.now();
const route = exactRoute.run(A(1), B, {});
console.log(`\nroute "exact" (20 separations, order 4, converged to 1e-12 per point, fit): ${(performance.now() - t).toFixed(0)} ms, converged ${route.converged}`);
t = performance.now();
const curve = exactCurve(A(2), B, separationGrid(8, 40, 25, 'log'), { order: 3 });
console.log(`curve of 25 points, 8–40 bohr, order 3, tolerance 1e-10: ${(performance.now() - t).toFixed(0)} ms, largest basis ${Math.max(...curve.points.map((p) => p.quanta))} quanta`);
