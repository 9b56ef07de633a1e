/** `dispole table [SPECIES...]`: C6, C8 and D7 of many pairs as one table (text, CSV, JSON, Markdown or LaTeX). */
import type { Command } from 'commander';
import { allPairs, computeTable, requireDistinctSpecies, selectPairs, untrustedCount, type CoefficientTable } from '../../engines/table.js';
import { routeNames } from '../../engines/routes.js';
import { resolveSpecies } from '../../model/builtin-species.js';
import { InputError } from '../../model/errors.js';
import type { UnitSystem } from '../../report/pair-report.js';
import { renderTable, tableToJson } from '../../report/table/index.js';
import { columnKeys, parseColumnList } from '../../report/table/columns.js';
import { loadSpeciesFile, resolveAll, SPECIES_TOKEN_HELP } from '../common.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import type { CommandContext } from '../context.js';
import { countingProgressBar } from '../progress.js';
import type { CliIO } from '../io.js';
import { EXIT } from '../exit-codes.js';
import { computeSurfaceTable } from '../../engines/surface/surface-table.js';
import { parseSurfaceSpec, SURFACE_SPEC_HELP } from '../../model/surface-spec.js';
import type { Species } from '../../model/species.js';
import { renderSurfaceTable } from '../../report/table/surface-columns.js';

interface TableFlags extends OutputFlags {
  surface?: string;
  species?: string[];
  pairs?: string[];
  units: UnitSystem;
  digits: number;
  columns?: string;
  routes?: string;
  agreementTol: number;
  quadratureTol: number;
  quantaPerCentre?: number;
}

/** Tables with at least this many pairs show a progress bar (on an interactive stderr, without --quiet). */
export const PROGRESS_MIN_PAIRS = 100;

/**
 * A progress bar on stderr, or undefined when stderr is not a terminal, `quiet` is set or the table is small.
 * cli-progress draws synchronously on each update (throttled), so it works inside the synchronous pair loop.
 */
export function registerTable(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('table')
    .summary('C6, C8 and D7 of every pair of a set of species, as text, CSV, JSON, Markdown or LaTeX')
    .description(
      'Compute C6, C8 and the dispersion dipole coefficients D7 (A at the origin, B at +R on z) for every unordered pair ' +
        'of the species given, like pairs included, in the order given (or only the pairs of --pairs), and print one ' +
        "table with the largest relative spread between the routes and each species' data source. Without SPECIES, the " +
        '--species files contribute all their species in file order; with SPECIES, the files only supply definitions.\n\n' +
        `Each species is ${SPECIES_TOKEN_HELP}.\n\n` +
        'Exit code 3 when any row is UNTRUSTED or NOT COMPUTED (no route can handle the pair); the table is still written, with those rows flagged.',
    )
    .argument('[species...]', 'the species of the table')
    .option(
      '--pairs <list>',
      'only these ordered pairs: entries A-B separated by commas (repeatable); A and B are names, 1-based positions in the species list, or built-in names',
      (value: string, previous: string[] = []) => [...previous, value],
    )
    .option('--markdown', 'a Markdown pipe table with provenance')
    .option('--latex', 'a LaTeX table float using booktabs')
    .option(
      '--columns <list>',
      `columns of the text, Markdown and LaTeX tables, comma-separated, from ${columnKeys('atomic').join(', ')} (with --units si also D7.a-debye, D7.b-debye, D7.total-debye); default: all for text and Markdown, C6,C8,D7.a,D7.b,spread,sources,status for LaTeX`,
    )
    .option('--routes <list>', `comma-separated routes to run, first = reference (known: ${routeNames().join(', ')})`)
    .option('--surface <spec>', `instead of pairs, each species in front of this surface: the surface column set C3, C5, D4 (${SURFACE_SPEC_HELP})`);
  addSharedOptions(cmd, ['species', 'units', 'digits', 'agreementTol', 'quadratureTol', 'quantaPerCentre', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((names: string[], flags: TableFlags) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json', 'markdown', 'latex']);
    const columns = flags.columns !== undefined ? parseColumnList(flags.columns, flags.units) : undefined;
    if (columns && (format === 'csv' || format === 'json')) throw new InputError('--columns', 'applies to the text, Markdown and LaTeX tables (CSV and JSON carry every column)');
    const file = loadSpeciesFile(ctx.io, flags.species);
    const listed = names.length > 0 ? resolveAll(names, file) : [...(file?.values() ?? [])];
    requireDistinctSpecies(listed);
    if (flags.surface !== undefined) {
      surfaceTableAction(ctx, flags, format, listed);
      return;
    }
    const pairs = flags.pairs ? selectPairs(flags.pairs, listed, (t) => resolveSpecies(t, file)) : allPairs(listed);
    if (pairs.length === 0) {
      throw new InputError('species', 'none given; name them (e.g. dispole table Quelon Virid), give --species FILE, or list --pairs');
    }
    const bar = countingProgressBar(ctx.io, { total: pairs.length, label: 'pairs', quiet: flags.quiet === true, minTotal: PROGRESS_MIN_PAIRS });
    let table: CoefficientTable;
    try {
      table = computeTable(pairs, {
        routes: flags.routes?.split(',').map((s) => s.trim()).filter(Boolean),
        agreement: flags.agreementTol,
        relTol: flags.quadratureTol,
        maxQuanta: flags.quantaPerCentre,
        onProgress: bar ? (done) => bar.update(done) : undefined,
      });
    } finally {
      bar?.stop(); // also on errors: the bar holds a timer that would keep the process alive
    }
    const text = format === 'json' ? jsonText(tableToJson(table, { units: flags.units }), flags) : renderTable(table, format, { units: flags.units, digits: flags.digits, columns });
    const total = table.rows.length + (table.uncomputed?.length ?? 0);
    emitOutput(ctx, flags, text, `the table of ${total} pairs`);
    const bad = untrustedCount(table);
    if (bad > 0) ctx.io.stderr(`dispole: ${bad} of ${total} rows are UNTRUSTED (flagged in the table)\n`);
    const missing = table.uncomputed?.length ?? 0;
    if (missing > 0) ctx.io.stderr(`dispole: ${missing} of ${total} pairs are NOT COMPUTED: no route can handle them (flagged in the table)\n`);
    if (bad > 0 || missing > 0) ctx.exitCode = EXIT.untrusted;
  });
}

/** `table --surface SPEC`: one row per species in front of the surface (the surface column set). */
function surfaceTableAction(ctx: CommandContext, flags: TableFlags, format: string, listed: Species[]): void {
  if (flags.pairs) throw new InputError('--pairs', 'cannot be combined with --surface (a surface table has one row per species)');
  if (flags.columns !== undefined) throw new InputError('--columns', 'does not apply to the surface column set (C3, C5, D4, spread, status, source)');
  if (listed.length === 0) throw new InputError('species', 'none given; name them (e.g. dispole table Quelon Virid --surface conductor) or give --species FILE');
  const surface = parseSurfaceSpec(flags.surface!, '--surface', (path) => ctx.io.readFile(path));
  const table = computeSurfaceTable(listed, surface, {
    routes: flags.routes?.split(',').map((s) => s.trim()).filter(Boolean),
    agreement: flags.agreementTol,
    relTol: flags.quadratureTol,
  });
  const text = renderSurfaceTable(table, format as 'text' | 'csv' | 'json' | 'markdown' | 'latex', { units: flags.units, digits: flags.digits });
  emitOutput(ctx, flags, flags.pretty && format === 'json' ? jsonText(JSON.parse(text), flags) : text, `the surface table of ${listed.length} species`);
  const bad = table.rows.filter((r) => r.status === 'UNTRUSTED').length + table.uncomputed.length;
  if (bad > 0) ctx.exitCode = EXIT.untrusted;
}
