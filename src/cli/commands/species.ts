/** `dispole species`: list the built-in species (and those of a species file) with their data and sources. */
import type { Command } from 'commander';
import { atomLibrarySpecies, builtinSpecies } from '../../model/builtin-species.js';
import { atomLibraryText } from '../../report/atom-library.js';
import { describeSpecies, type Species } from '../../model/species.js';
import { speciesKinds } from '../../model/species-kinds.js';
import { speciesToJson } from '../../report/species-json.js';
import { textTable } from '../../report/format.js';
import { loadSpeciesFile, SPECIES_FILE_HELP } from '../common.js';
import type { CommandContext } from '../context.js';

export function registerSpecies(program: Command, ctx: CommandContext): void {
  program
    .command('species')
    .summary('list the built-in species with their parameters and sources')
    .option('--json', 'print a JSON array')
    .option('--species <file>', `also list the species of a file: ${SPECIES_FILE_HELP}`)
    .action((flags: { json?: boolean; species?: string }) => {
      const file = loadSpeciesFile(ctx.io, flags.species);
      const all: Species[] = [...(file?.values() ?? []), ...builtinSpecies()];
      if (flags.json) {
        ctx.io.stdout(JSON.stringify(all.map(speciesToJson)) + '\n');
        return;
      }
      // library QDOs: the long per-value sources are listed once, under the library table below
      const shortSource = (s: Species) => (atomLibrarySpecies.includes(s) && s.kind === 'drude' ? 'QDO fitted to the atom library values below' : (s.source ?? ''));
      ctx.io.stdout(textTable(['name', 'parameters (atomic units)', 'source'], all.map((s) => [s.name, describeSpecies(s), shortSource(s)]), 'left') + '\n');
      ctx.io.stdout('\n' + atomLibraryText() + '\n');
      ctx.io.stdout('\nInline kinds: ' + Object.entries(speciesKinds).map(([k, v]) => `${k} (${v.summary})`).join('; ') + '\n');
    });
}
