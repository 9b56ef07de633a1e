/** `dispole species`: list the built-in species (and those of a species file) with their data and sources. */
import type { Command } from 'commander';
import { atomLibrarySpecies, builtinSpecies } from '../../model/builtin-species.js';
import { atomLibraryText, recommendedAtomsText } from '../../report/atom-library.js';
import { speciesAccuracy } from '../../engines/accuracy.js';
import { describeSpecies, type Species } from '../../model/species.js';
import { speciesKinds } from '../../model/species-kinds.js';
import { speciesToJson } from '../../report/species-json.js';
import { speciesToCsv } from '../../report/species-csv.js';
import { textTable } from '../../report/format.js';
import { loadSpeciesFile } from '../common.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import type { CommandContext } from '../context.js';

/** What a species' numbers rest on, for `species --json`. */
function accuracyJson(s: Species) {
  const a = speciesAccuracy(s);
  return { level: a.level, quantities: a.quantities, statement: a.basis };
}

/** What the accuracy levels mean (text and CSV). */
const LEVELS_TEXT =
  'exact = no approximation beyond converged numerics (a QDO or data as given are exact for themselves); first-principles = a stated level of theory, no empirical input; rescaled = first-principles response rescaled to published static values; model = a stand-in whose D7 rests on a model B.';

export function registerSpecies(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('species')
    .summary('list the built-in species with their parameters and sources')
    .description(
      'List every species a command accepts by name: the built-in ones (the invented demo set, hydrogen and the noble-gas atoms) ' +
        'with their parameters in atomic units, their source and what their numbers rest on, then the atom library with its ' +
        'published values and the inline kinds. With --species FILE, the species of the file come first. ' +
        '--json gives every species with its parameters and accuracy, --csv one row per species (name, kind, level, definition, source).',
    );
  addSharedOptions(cmd, ['species', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((flags: OutputFlags & { species?: string[] }) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json']);
    const file = loadSpeciesFile(ctx.io, flags.species);
    const all: Species[] = [...(file?.values() ?? []), ...builtinSpecies()];
    if (format === 'json') {
      emitOutput(ctx, flags, jsonText(all.map((s) => ({ ...speciesToJson(s), accuracy: accuracyJson(s) })), flags), 'the species list');
      return;
    }
    if (format === 'csv') {
      const rows = all.map((s) => ({ name: s.name, kind: s.kind, level: speciesAccuracy(s).level, definition: describeSpecies(s), source: s.source }));
      emitOutput(ctx, flags, speciesToCsv(rows, LEVELS_TEXT), 'the species list');
      return;
    }
    // library atoms: the long per-value sources are listed once, under the library tables below
    const shortSource = (s: Species) => {
      const level = speciesAccuracy(s).level;
      if (atomLibrarySpecies.includes(s) && s.kind === 'drude') return 'QDO fitted to the atom library values below';
      if (level === 'rescaled') return 'recommended: first-principles response rescaled (see below)';
      return (level === 'model' && s.kind === 'drude' ? 'QDO fitted to the atom library values below' : s.source) ?? '';
    };
    const rows = all.map((s) => [s.name, describeSpecies(s), shortSource(s), speciesAccuracy(s).level]);
    const out: string[] = [];
    out.push(textTable(['name', 'parameters (atomic units)', 'source', 'level'], rows, 'left') + '\n');
    out.push(`Levels: ${LEVELS_TEXT}\n`);
    out.push('\n' + atomLibraryText() + '\n');
    out.push('\n' + recommendedAtomsText() + '\n');
    out.push('\nInline kinds: ' + Object.entries(speciesKinds).map(([k, v]) => `${k} (${v.summary})`).join('; ') + '\n');
    emitOutput(ctx, flags, out.join(''), 'the species list');
  });
}
