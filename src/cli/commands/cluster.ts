/** `dispole cluster GEOMETRY.xyz`: N dipole-coupled QDOs — many-body energy, screened alpha and C6, induced dipoles. */
import { totalmem } from 'node:os';
import { type Command, InvalidArgumentError } from 'commander';
import cliProgress from 'cli-progress';
import { computeCluster, largestClusterFitting, type ClusterCentre, type ClusterStage } from '../../engines/cluster/cluster.js';
import { parseXyz } from '../../model/geometry.js';
import { resolveSpecies } from '../../model/builtin-species.js';
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import { clusterToCsv, clusterToJson, clusterToText } from '../../report/cluster-report.js';
import { loadSpeciesFile, SPECIES_TOKEN_HELP } from '../common.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import type { EnergyUnit } from '../../model/units.js';
import type { CommandContext } from '../context.js';
import type { CliIO } from '../io.js';
import { EXIT } from '../exit-codes.js';

interface ClusterFlags extends OutputFlags {
  length: 'angstrom' | 'bohr';
  species?: string[];
  assign: Array<[string, string]>;
  digits: number;
  units: 'atomic' | 'si';
  energyUnit: EnergyUnit;
}

/** Centres from this many on show a progress bar (when stderr is a terminal). */
const PROGRESS_FROM = 150;

function assignment(value: string, previous: Array<[string, string]>): Array<[string, string]> {
  const eq = value.indexOf('=');
  if (eq <= 0 || eq === value.length - 1) throw new InvalidArgumentError(`expected LABEL=SPEC (e.g. X=drude:q=1,m=1,w=1), got "${value}"`);
  return [...previous, [value.slice(0, eq).trim(), value.slice(eq + 1).trim()]];
}

export function registerCluster(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('cluster')
    .summary('N dipole-coupled oscillators: many-body dispersion energy, screened alpha and C6, induced dipoles')
    .description(
      'Solve the dipole-coupled quantum Drude oscillators of a geometry (XYZ file: count line, comment line, then ' +
        '"label x y z" per centre, in --length units) by their normal modes: the dispersion energy to all orders and ' +
        'its pairwise-additive part, each centre\'s screened polarisability and C6, and each centre\'s dispersion-induced ' +
        'dipole (force balance with the dipole–quadrupole interaction) and their sum.\n' +
        `Each label is resolved by --assign LABEL=SPEC, else as ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<geometry>', 'XYZ file')
    .option('--assign <label=spec>', 'species of a label, e.g. X=drude:q=1,m=1,w=1 or X=Quelon (repeatable)', assignment, []);
  addSharedOptions(cmd, ['species', 'length', 'units', 'energyUnit', 'digits', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((path: string, flags: ClusterFlags) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json']);
    const file = loadSpeciesFile(ctx.io, flags.species);
    const unit = flags.length;
    // the memory limit is checked on the count line, before a large file's centres are read
    const maxCentres = { count: largestClusterFitting(totalmem()), why: 'the normal-mode solution needs two (3N)×(3N) double-precision matrices, which must fit the 4 GiB WebAssembly workspace and this machine\'s memory' };
    const geometry = parseXyz(ctx.io.readFile(path), { unit, fileName: path, maxCentres });
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
    const bar = centres.length >= PROGRESS_FROM && ctx.io.stderrIsTTY && !flags.quiet ? progressBar(ctx.io) : undefined;
    let result;
    try {
      result = computeCluster(centres, { progress: bar?.update, memoryBytes: totalmem() });
    } catch (e) {
      // the engine names a centre by its line ("line 4 (H)"): say which file
      if (e instanceof InputError && /^line \d/.test(e.field)) throw new InputError(`${path}: ${e.field}`, e.problem);
      throw e;
    } finally {
      bar?.stop();
    }
    const source = { file: path, comment: geometry.comment, unit } as const;
    const options = { digits: flags.digits, units: flags.units, energyUnit: flags.energyUnit };
    const text =
      format === 'json' ? jsonText(clusterToJson(result, source, options), flags) : format === 'csv' ? clusterToCsv(result, source, options) : clusterToText(result, source, options);
    emitOutput(ctx, flags, text, `the cluster report`);
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
