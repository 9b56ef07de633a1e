/** `dispole cluster GEOMETRY.xyz`: N dipole-coupled QDOs — many-body energy, screened alpha and C6, induced dipoles. */
import { type Command, InvalidArgumentError } from 'commander';
import cliProgress from 'cli-progress';
import { computeCluster, type ClusterCentre, type ClusterStage } from '../../engines/cluster/cluster.js';
import { parseXyz } from '../../model/geometry.js';
import { resolveSpecies } from '../../model/builtin-species.js';
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import { clusterToCsv, clusterToJson, clusterToText } from '../../report/cluster-report.js';
import { integerIn, loadSpeciesFile, SPECIES_FILE_HELP, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import type { CliIO } from '../io.js';
import { EXIT } from '../exit-codes.js';

interface ClusterFlags {
  bohr?: boolean;
  species?: string;
  assign: Array<[string, string]>;
  json?: boolean;
  csv?: boolean;
  digits: number;
}

/** Centres from this many on show a progress bar (when stderr is a terminal). */
const PROGRESS_FROM = 150;

function assignment(value: string, previous: Array<[string, string]>): Array<[string, string]> {
  const eq = value.indexOf('=');
  if (eq <= 0 || eq === value.length - 1) throw new InvalidArgumentError(`expected LABEL=SPEC (e.g. X=drude:q=1,m=1,w=1), got "${value}"`);
  return [...previous, [value.slice(0, eq).trim(), value.slice(eq + 1).trim()]];
}

export function registerCluster(program: Command, ctx: CommandContext): void {
  program
    .command('cluster')
    .summary('N dipole-coupled oscillators: many-body dispersion energy, screened alpha and C6, induced dipoles')
    .description(
      'Solve the dipole-coupled quantum Drude oscillators of a geometry (XYZ file: count line, comment line, then ' +
        '"label x y z" per centre, ångström unless --bohr) by their normal modes: the dispersion energy to all orders and ' +
        'its pairwise-additive part, each centre\'s screened polarisability and C6, and each centre\'s dispersion-induced ' +
        'dipole (force balance with the dipole–quadrupole interaction) and their sum.\n' +
        `Each label is resolved by --assign LABEL=SPEC, else as ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<geometry>', 'XYZ file')
    .option('--bohr', 'coordinates in the file are in bohr (default ångström)')
    .option('--species <file>', SPECIES_FILE_HELP)
    .option('--assign <label=spec>', 'species of a label, e.g. X=drude:q=1,m=1,w=1 or X=Quelon (repeatable)', assignment, [])
    .option('--json', 'print one JSON object (atomic units: positions bohr, dipoles e·a0, energies hartree)')
    .option('--csv', 'print one CSV row per centre')
    .option('--digits <n>', 'significant digits in the table', integerIn(3, 17), 8)
    .action((path: string, flags: ClusterFlags) => {
      if (flags.json && flags.csv) throw new InputError('--json/--csv', 'choose one output format');
      const file = loadSpeciesFile(ctx.io, flags.species);
      const unit = flags.bohr ? 'bohr' : 'angstrom';
      const geometry = parseXyz(ctx.io.readFile(path), { unit, fileName: path });
      const assigned = new Map<string, Species>();
      for (const [label, spec] of flags.assign) assigned.set(label, resolveSpecies(spec, file));
      const cache = new Map<string, Species>(assigned);
      const centres: ClusterCentre[] = geometry.centres.map((c) => {
        let species = cache.get(c.label);
        if (!species) {
          try {
            species = resolveSpecies(c.label, file);
          } catch (e) {
            if (e instanceof InputError) {
              throw new InputError(`${path}:${c.line}`, `label ${JSON.stringify(c.label)} is not a known species; give --assign ${c.label}=SPEC, a name from --species FILE, or a built-in name (see \`dispole species\`)`);
            }
            throw e;
          }
          cache.set(c.label, species);
        }
        return { label: c.label, species, position: c.position, line: c.line };
      });
      for (const label of assigned.keys()) {
        if (!geometry.centres.some((c) => c.label === label)) throw new InputError(`--assign ${label}`, `no centre of ${path} has the label ${JSON.stringify(label)}`);
      }
      const bar = centres.length >= PROGRESS_FROM && ctx.io.stderrIsTTY ? progressBar(ctx.io) : undefined;
      let result;
      try {
        result = computeCluster(centres, { progress: bar?.update });
      } finally {
        bar?.stop();
      }
      const source = { file: path, comment: geometry.comment, unit } as const;
      if (flags.json) ctx.io.stdout(JSON.stringify(clusterToJson(result, source)) + '\n');
      else if (flags.csv) ctx.io.stdout(clusterToCsv(result));
      else ctx.io.stdout(clusterToText(result, source, flags.digits));
      if (!result.converged) ctx.exitCode = EXIT.untrusted;
    });
}

const STAGES: ClusterStage[] = ['pairs', 'tridiagonalise', 'eigenvectors', 'back-transform', 'covariance', 'polarisability'];

/** A cli-progress bar on the CLI's stderr, one step per stage. */
function progressBar(io: CliIO) {
  const stream = { isTTY: true, columns: 80, write: (s: string) => (io.stderr(s), true) } as unknown as NodeJS.WritableStream;
  const bar = new cliProgress.SingleBar(
    { stream, format: 'cluster {bar} {percentage}% | {stage}', hideCursor: true, clearOnComplete: true },
    cliProgress.Presets.shades_classic,
  );
  bar.start(STAGES.length * 100, 0, { stage: STAGES[0] });
  return {
    update: (stage: ClusterStage, fraction: number) => bar.update(STAGES.indexOf(stage) * 100 + Math.round(100 * fraction), { stage }),
    stop: () => bar.stop(),
  };
}
