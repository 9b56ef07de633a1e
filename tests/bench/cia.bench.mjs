// dispole cia: spectral moments at 10 temperatures (target < 1 s) and a 400-frequency spectrum at one
// temperature (target < 60 s on 2 cores), for an INVENTED He–Ar-like pair (Tang–Toennies well ~17 K at 7.2 bohr,
// reduced mass 3.64 u, overlap dipole 5 m e·a0 at 6 bohr). Default numerics (not --fast).
import { computeCia } from '../../dist/index.js';

const pair = {
  names: ['X', 'Y'],
  masses: [4, 40],
  massSource: 'invented',
  potential: { kind: 'tang-toennies', A: 40, b: 1.9, C6: 9.5, C8: 180, C10: 4000, dispersionSource: 'invented' },
  dipole: { kind: 'overlap', mu0: 5e-3, R0: 6, rho: 0.6 },
  dipoleContext: { D7: -20, dispersionSource: 'invented' },
};

function time(label, fn) {
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const r = fn();
  const wall = (performance.now() - t0) / 1000;
  const c = process.cpuUsage(cpu0);
  console.log(`${label.padEnd(62)} wall ${wall.toFixed(2)} s   cpu ${((c.user + c.system) / 1e6).toFixed(2)} s`);
  return r;
}

console.log(`node ${process.version}`);
const temps = [50, 100, 150, 200, 250, 300, 350, 400, 450, 500];
const m = time('moments (classical, W–K, quantum) at 10 temperatures', () => computeCia({ ...pair, temperatures: temps }));
console.log(`  partial waves ${m.temperatures[0].quantum.partialWaves}, trusted ${m.trusted}, W–K − quantum at 300 K ${m.temperatures[5].difference.wignerKirkwoodM0.toExponential(2)}`);
const s = time('spectrum, 400 frequencies 0…1596 cm^-1 step 4, 300 K (+ moments)', () => computeCia({ ...pair, temperatures: [300], spectrum: { from: 0, to: 1596, step: 4 } }));
const sp = s.temperatures[0].spectrum;
console.log(`  ${sp.wavenumber.length} frequencies; residuals M0 ${sp.residualM0.toExponential(2)}, M1 ${sp.residualM1.toExponential(2)}`);
