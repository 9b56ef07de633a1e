/** `dispole table [SPECIES...]`: C6, C8 and D7 of many pairs as one table (text, CSV, JSON, Markdown or LaTeX). */
import { Option, type Command } from 'commander';
import cliProgress from 'cli-progress';
import { allPairs, computeTable, requireDistinctSpecies, selectPairs, untrustedCount, type CoefficientTable } from '../../engines/table.js';
import { routeNames } from '../../engines/routes.js';
import { resolveSpecies } from '../../model/builtin-species.js';
import { InputError } from '../../model/errors.js';
import type { UnitSystem } from '../../report/pair-report.js';
import { renderTable, type TableFormat } from '../../report/table/index.js';
import { integerIn, loadSpeciesFile, oneOf, positiveNumber, resolveAll, SPECIES_FILE_HELP, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import type { CliIO } from '../io.js';
import { EXIT } from '../exit-codes.js';

interface TableFlags {
  species?: string;
  pairs?: string[];
  csv?: boolean;
  json?: boolean;
  markdown?: boolean;
  latex?: boolean;
  units: UnitSystem;
  digits: number;
  out?: string;
  force?: boolean;
  quiet?: boolean;
  routes?: string;
  agree: number;
  relTol: number;
  maxQuanta?: number;
}

/** Tables with at least this many pairs show a progress bar (on an interactive stderr, without --quiet). */
export const PROGRESS_MIN_PAIRS = 100;

const FORMAT_FLAGS = ['csv', 'json', 'markdown', 'latex'] as const;

/**
 * A progress bar on stderr, or undefined when stderr is not a terminal, `quiet` is set or the table is small.
 * cli-progress draws synchronously on each update (throttled), so it works inside the synchronous pair loop.
 */
export function progressBar(io: CliIO, total: number, quiet: boolean): { update(done: number): void; stop(): void } | undefined {
  if (quiet || !io.stderrIsTTY || total < PROGRESS_MIN_PAIRS) return undefined;
  const stream = { isTTY: true, columns: 80, write: (s: string) => (io.stderr(s), true) } as unknown as NodeJS.WriteStream;
  const bar = new cliProgress.SingleBar({ stream, format: 'pairs {bar} {value}/{total}  {percentage}%', barsize: 30, clearOnComplete: true, hideCursor: false });
  bar.start(total, 0);
  return { update: (done) => bar.update(done), stop: () => bar.stop() };
}

export function registerTable(program: Command, ctx: CommandContext): void {
  const format = (name: (typeof FORMAT_FLAGS)[number], what: string) =>
    new Option(`--${name}`, what).conflicts(FORMAT_FLAGS.filter((f) => f !== name));
  program
    .command('table')
    .summary('C6, C8 and D7 of every pair of a set of species, as text, CSV, JSON, Markdown or LaTeX')
    .description(
      'Compute C6, C8 and the dispersion dipole coefficients D7 (A at the origin, B at +R on z) for every unordered pair ' +
        'of the species given, like pairs included, in the order given (or only the pairs of --pairs), and print one ' +
        "table with the largest relative spread between the routes and each species' data source. Without SPECIES, a " +
        '--species FILE contributes all its species in file order; with SPECIES, the file only supplies definitions.\n\n' +
        `Each species is ${SPECIES_TOKEN_HELP}.\n\n` +
        'Exit code 3 when any row is UNTRUSTED (the table is still written, with those rows flagged).',
    )
    .argument('[species...]', 'the species of the table')
    .option('--species <file>', SPECIES_FILE_HELP)
    .option(
      '--pairs <list>',
      'only these ordered pairs: entries A-B separated by commas (repeatable); A and B are names, 1-based positions in the species list, or built-in names',
      (value: string, previous: string[] = []) => [...previous, value],
    )
    .addOption(format('csv', 'CSV with "#" provenance lines; full precision'))
    .addOption(format('json', 'one JSON document (atomic units; full precision)'))
    .addOption(format('markdown', 'a Markdown pipe table with provenance'))
    .addOption(format('latex', 'a LaTeX table float using booktabs'))
    .option('--units <system>', 'atomic, or si (C_n in J·m^n, D7 in C·m^8 and debye·Å^7)', oneOf(['atomic', 'si'] as const), 'atomic')
    .option('--digits <n>', 'significant digits in text, Markdown and LaTeX', integerIn(2, 17), 6)
    .option('--out <file>', 'write the table to FILE (atomically) instead of stdout')
    .option('--force', 'replace an existing --out file')
    .option('--quiet', 'no progress bar and no "written" notice on stderr')
    .option('--routes <list>', `comma-separated routes to run, first = reference (known: ${routeNames().join(', ')})`)
    .option('--agree <x>', 'largest relative spread between routes accepted as agreement', positiveNumber, 1e-8)
    .option('--rel-tol <x>', 'relative tolerance passed to the routes (quadratures)', positiveNumber, 1e-13)
    .option('--max-quanta <n>', 'harmonic truncation of QDO bases (perturbation route); default: the exact minimum', integerIn(1, 40))
    .action((names: string[], flags: TableFlags) => {
      const file = loadSpeciesFile(ctx.io, flags.species);
      const listed = names.length > 0 ? resolveAll(names, file) : [...(file?.values() ?? [])];
      requireDistinctSpecies(listed);
      const pairs = flags.pairs ? selectPairs(flags.pairs, listed, (t) => resolveSpecies(t, file)) : allPairs(listed);
      if (pairs.length === 0) {
        throw new InputError('species', 'none given; name them (e.g. dispole table Quelon Virid), give --species FILE, or list --pairs');
      }
      const bar = progressBar(ctx.io, pairs.length, flags.quiet === true);
      let table: CoefficientTable;
      try {
        table = computeTable(pairs, {
          routes: flags.routes?.split(',').map((s) => s.trim()).filter(Boolean),
          agreement: flags.agree,
          relTol: flags.relTol,
          maxQuanta: flags.maxQuanta,
          onProgress: bar ? (done) => bar.update(done) : undefined,
        });
      } finally {
        bar?.stop(); // also on errors: the bar holds a timer that would keep the process alive
      }
      const chosen: TableFormat = FORMAT_FLAGS.find((f) => flags[f]) ?? 'text';
      const text = renderTable(table, chosen, { units: flags.units, digits: flags.digits });
      if (flags.out !== undefined) {
        ctx.io.writeFile(flags.out, text, flags.force === true);
        if (!flags.quiet) ctx.io.stderr(`dispole: table of ${table.rows.length} pairs written to ${flags.out}\n`);
      } else ctx.io.stdout(text);
      const bad = untrustedCount(table);
      if (bad > 0) {
        ctx.io.stderr(`dispole: ${bad} of ${table.rows.length} rows are UNTRUSTED (flagged in the table)\n`);
        ctx.exitCode = EXIT.untrusted;
      }
    });
}
