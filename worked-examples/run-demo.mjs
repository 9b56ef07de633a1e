// The worked example (invented Tessaly scenario, see README.md here): runs dispole commands in-process and prints
// each command line before its output. Run with `npm run demo` (builds first).
import { runCli, nodeIO } from './demo-io.mjs';

/** Steps: each is the argv of one dispole command. Other examples add their steps to this list. */
const steps = [
  ['pair', 'Quelon', 'Virid'],
  ['pair', 'Quelon', 'Quelon', '--digits', '8'],
  ['pair', 'Spindlet', 'Virid', '--units', 'si'],
  ['table', '--species', 'worked-examples/tessaly-species.yaml', '--markdown'],
  ['cluster', 'worked-examples/cluster-tessaly-ring.xyz'],
  ['curve', 'Quelon', 'Virid', '--from', '5.5', '--to', '12', '--length', 'angstrom', '--points', '8'],
  ['pair', 'H', 'H'],
  ['pair', 'H', 'Zephyrine', '--species', 'worked-examples/zephyrine-response.csv'],
  ['surface', 'Quelon', '--surface', 'table:worked-examples/tessalite-eps.csv', '--units', 'si'],
  ['surface', 'Spindlet', '--surface', 'eps=5.5', '--normal', '1,0,2'],
  // collision-induced absorption of Quelon–Virid: masses, Born–Mayer and overlap-dipole parameters INVENTED
  ['cia', 'Quelon', 'Virid', '--masses', '6.9,12.3', '--potential', 'tt:A=60,b=1.75', '--dipole', 'exp:mu0=4e-3,R0=6.2,rho=0.62', '--temperature', '160', '--temperature', '240', '--spectrum', '0:1000:10'],
];

// the step-by-step explanation of every step lives in worked-examples/README.md
process.stdout.write('dispole worked example (invented Tessaly scenario). What each step shows, step by step: worked-examples/README.md\n');

let worst = 0;
for (const argv of steps) {
  process.stdout.write(`\n$ dispole ${argv.join(' ')}\n`);
  const code = await runCli(argv, nodeIO);
  worst = Math.max(worst, code);
}
process.exitCode = worst;
process.stdout.write('\nThe explanation of each step: worked-examples/README.md\n');
