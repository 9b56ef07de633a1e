/** `dispole pair <A> <B>`: C6, C8, C10 and D7 of one pair by every route, compared. */
import type { Command } from 'commander';
import { computePair } from '../../engines/pair.js';
import { defaultRoutes, routeNames } from '../../engines/routes.js';
import { pairToJson, pairToText, type UnitSystem } from '../../report/pair-report.js';
import { integerIn, loadSpeciesFile, oneOf, positiveNumber, resolveAll, SPECIES_FILE_HELP, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';

interface PairFlags {
  json?: boolean;
  units: UnitSystem;
  species?: string;
  routes?: string;
  digits: number;
  agree: number;
  maxQuanta?: number;
  exact?: boolean;
}

export function registerPair(program: Command, ctx: CommandContext): void {
  program
    .command('pair')
    .summary('coefficients C6, C8, C10 and dispersion dipoles D7 of one pair, by every route')
    .description(
      'Compute the dispersion coefficients C6, C8, C10 and the dispersion-induced dipole coefficients D7 of a pair ' +
        '(A at the origin, B at +R on z; D7.a = lim R^7 mu_A,z) by independent routes, and show how well they agree.\n\n' +
        `Each of A, B is ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .option('--json', 'print one JSON object (atomic units)')
    .option('--units <system>', 'atomic, or si to add SI and debye·Å^7 values', oneOf(['atomic', 'si'] as const), 'atomic')
    .option('--species <file>', SPECIES_FILE_HELP)
    .option('--routes <list>', `comma-separated routes to run, first = reference (known: ${routeNames().join(', ')})`)
    .option('--digits <n>', 'significant digits in the table', integerIn(3, 17), 10)
    .option('--agree <x>', 'largest relative spread between routes accepted as agreement', positiveNumber, 1e-8)
    .option('--exact', 'also run the "exact" route (finite-R diagonalisation fitted in 1/R; about a second)')
    .option('--max-quanta <n>', 'harmonic truncation of QDO bases (perturbation route); default: the exact minimum', integerIn(1, 40))
    .action((a: string, b: string, flags: PairFlags) => {
      const file = loadSpeciesFile(ctx.io, flags.species);
      const [A, B] = resolveAll([a, b], file);
      const listed = flags.routes?.split(',').map((s) => s.trim()).filter(Boolean);
      const routes = flags.exact ? [...new Set([...(listed ?? defaultRoutes.map((r) => r.name)), 'exact'])] : listed;
      const result = computePair(A, B, {
        routes,
        agreement: flags.agree,
        maxQuanta: flags.maxQuanta,
      });
      ctx.io.stdout(flags.json ? JSON.stringify(pairToJson(result, flags.units)) + '\n' : pairToText(result, { digits: flags.digits, units: flags.units }));
      if (!result.trusted) ctx.exitCode = EXIT.untrusted;
    });
}
