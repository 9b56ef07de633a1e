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
  ['curve', 'Quelon', 'Virid', '--from', '4', '--to', '12', '--length', 'angstrom', '--points', '8'],
  ['pair', 'H', 'H'],
  ['pair', 'H', 'Zephyrine', '--species', 'worked-examples/zephyrine-response.csv'],
];

let worst = 0;
for (const argv of steps) {
  process.stdout.write(`\n$ dispole ${argv.join(' ')}\n`);
  const code = await runCli(argv, nodeIO);
  worst = Math.max(worst, code);
}
process.exitCode = worst;
