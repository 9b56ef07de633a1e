/** `dispole pair <A> <B>`: C6, C8, C10 and D7 of one pair by every route, compared. */
import type { Command } from 'commander';
import { computePair } from '../../engines/pair.js';
import { defaultRoutes, routeNames } from '../../engines/routes.js';
import { pairToCsv, pairToJson, pairToText, type UnitSystem } from '../../report/pair-report.js';
import { loadSpeciesFile, resolveAll, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';

interface PairFlags extends OutputFlags {
  units: UnitSystem;
  species?: string[];
  routes?: string;
  digits: number;
  agreementTol: number;
  quadratureTol: number;
  quantaPerCentre?: number;
  exact?: boolean;
}

export function registerPair(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('pair')
    .summary('coefficients C6, C8, C10 and dispersion dipoles D7 of one pair, by every route')
    .description(
      'Compute the dispersion coefficients C6, C8, C10 and the dispersion-induced dipole coefficients D7 of a pair ' +
        '(A at the origin, B at +R on z; D7.a = lim R^7 mu_A,z) by independent routes, and show how well they agree.\n\n' +
        `Each of A, B is ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .option('--routes <list>', `comma-separated routes to run, first = reference (known: ${routeNames().join(', ')})`)
    .option('--exact', 'also run the "exact" route (finite-R diagonalisation fitted in 1/R; about a second)');
  addSharedOptions(cmd, ['species', 'units', 'digits', 'agreementTol', 'quadratureTol', 'quantaPerCentre', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((a: string, b: string, flags: PairFlags) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json']);
    const file = loadSpeciesFile(ctx.io, flags.species);
    const [A, B] = resolveAll([a, b], file);
    const listed = flags.routes?.split(',').map((s) => s.trim()).filter(Boolean);
    const routes = flags.exact ? [...new Set([...(listed ?? defaultRoutes.map((r) => r.name)), 'exact'])] : listed;
    const result = computePair(A, B, {
      routes,
      agreement: flags.agreementTol,
      relTol: flags.quadratureTol,
      maxQuanta: flags.quantaPerCentre,
    });
    const text =
      format === 'json' ? jsonText(pairToJson(result, flags.units), flags) : format === 'csv' ? pairToCsv(result, flags.units) : pairToText(result, { digits: flags.digits, units: flags.units });
    emitOutput(ctx, flags, text, `the pair ${A.name}–${B.name}`);
    if (!result.trusted) ctx.exitCode = EXIT.untrusted;
  });
}
