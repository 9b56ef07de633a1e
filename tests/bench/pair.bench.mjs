// Time of one `pair` evaluation per route (C6, C8, C10 and D7), isotropic and anisotropic QDO pairs.
// Target (pair-solver issue): all coefficients of a pair by both routes in under 5 ms.
import { computePair, drude, drudeAnisotropic, perturbationCoefficients, harmonicSpace, requiredQuanta } from '../../dist/index.js';

function time(label, fn, { warm = 50, runs = 400 } = {}) {
  for (let i = 0; i < warm; i++) fn(i);
  const t0 = performance.now();
  for (let i = 0; i < runs; i++) fn(i);
  const ms = (performance.now() - t0) / runs;
  console.log(`${label.padEnd(58)} ${ms.toFixed(3)} ms`);
  return ms;
}

// fresh species each call so no per-species cache is reused across calls
const iso = (i) => [drude({ q: 1.1 + 1e-6 * i, m: 0.38, w: 0.72 }, 'A'), drude({ q: 1.45, m: 0.52, w: 0.6 }, 'B')];
const aniso = (i) => [drudeAnisotropic({ q: 1.2 + 1e-6 * i, m: 0.45, wx: 0.8, wy: 0.8, wz: 0.55 }, 'A'), drude({ q: 1.45, m: 0.52, w: 0.6 }, 'B')];

console.log(`node ${process.version}`);
for (const [name, make] of [['isotropic', iso], ['anisotropic', aniso]]) {
  time(`${name}: perturbation route (C6, C8, C10, D7)`, (i) => computePair(...make(i), { routes: ['perturbation'] }));
  time(`${name}: response route (C6, C8, C10, D7)`, (i) => computePair(...make(i), { routes: ['response'] }));
  time(`${name}: both routes + comparison`, (i) => computePair(...make(i), { routes: ['perturbation', 'response'] }));
  time(`${name}: both routes, C6 C8 D7 only`, (i) => computePair(...make(i), { routes: ['perturbation', 'response'], maxEnergyPower: 8 }));
}
