/**
 * The options several commands share, defined ONCE: flags, description, default and parser. Every command adds its
 * shared options from this table with {@link addSharedOptions}, so the same thing has the same name, default and
 * help text everywhere (tests/cli/shared-options.test.ts checks every command's --help against this table).
 * Old spellings stay accepted, hidden from --help, for one version ({@link SharedOptionSpec.aliases}).
 *
 * Also here: choosing the output format (format options and the --out extension must agree) and writing the
 * output (stdout, or --out FILE atomically), so every command behaves the same way.
 */
import { type Command, Option } from 'commander';
import { InputError } from '../model/errors.js';
import { DEFAULT_DIGITS } from '../report/format.js';
import { ENERGY_UNITS } from '../model/units.js';
import { integerIn, oneOf, positiveNumber, SPECIES_FILE_HELP } from './common.js';
import type { CommandContext } from './context.js';

export { DEFAULT_DIGITS };

/** Repeatable option: collect the values in order. */
const collect = (value: string, previous: string[] | undefined): string[] => [...(previous ?? []), value];

export interface SharedOptionSpec {
  /** Commander flags, e.g. `--digits <n>`. */
  flags: string;
  description: string;
  default?: string | number;
  parse?: (value: string, previous: never) => unknown;
  /**
   * Old spellings, hidden from --help and accepted for one version: their flags and, for a flag without a value,
   * the value they stand for.
   */
  aliases?: ReadonlyArray<{ flags: string; value?: string }>;
}

/** The shared options. The key is the attribute name commands read from their parsed flags. */
export const SHARED_OPTIONS = {
  species: {
    flags: '--species <file>',
    description: `${SPECIES_FILE_HELP}; repeatable (a name may be defined once over all files and may not redefine a built-in name)`,
    parse: collect,
  },
  digits: {
    flags: '--digits <n>',
    description: 'significant digits of the numbers in text, Markdown and LaTeX output (trailing zeros kept; one notation per column; CSV and JSON carry full precision)',
    default: DEFAULT_DIGITS,
    parse: integerIn(2, 17),
  },
  length: {
    flags: '--length <unit>',
    description: 'unit of every distance and coordinate on input and output (R, --from, --to, XYZ files): angstrom or bohr',
    default: 'angstrom',
    parse: oneOf(['angstrom', 'bohr'] as const),
    aliases: [{ flags: '--bohr', value: 'bohr' }],
  },
  units: {
    flags: '--units <system>',
    description: 'atomic, or si to add SI values (CODATA 2018): C_n in J·m^n, D7 in C·m^8 and debye·Å^7, dipoles in debye; on commands that also have --energy-unit, energies in that unit',
    default: 'atomic',
    parse: oneOf(['atomic', 'si'] as const),
  },
  energyUnit: {
    flags: '--energy-unit <unit>',
    description: `unit of the energies added by --units si: ${ENERGY_UNITS.join(', ')}`,
    default: 'cm-1',
    parse: oneOf(ENERGY_UNITS),
  },
  agreementTol: {
    flags: '--agreement-tol <x>',
    description: 'largest relative spread between the routes accepted as agreement (beyond it: UNTRUSTED, exit 3)',
    default: 1e-8,
    parse: positiveNumber,
    aliases: [{ flags: '--agree <x>' }],
  },
  quadratureTol: {
    flags: '--quadrature-tol <x>',
    description: 'relative tolerance of the frequency quadratures of the routes',
    default: 1e-13,
    parse: positiveNumber,
    aliases: [{ flags: '--rel-tol <x>' }],
  },
  basisTol: {
    flags: '--basis-tol <x>',
    description: 'relative change allowed between successive basis sizes of the finite-R exact solution',
    default: 1e-10,
    parse: positiveNumber,
    aliases: [{ flags: '--tolerance <x>' }],
  },
  quantaPerCentre: {
    flags: '--quanta-per-centre <n>',
    description: 'harmonic basis of each Drude oscillator in the perturbation route, in quanta (default: the smallest that is exact)',
    parse: integerIn(1, 40),
    aliases: [{ flags: '--max-quanta <n>' }],
  },
  totalQuanta: {
    flags: '--total-quanta <n>',
    description: 'largest basis of the finite-R exact solution: quanta on both centres together',
    default: 24,
    parse: integerIn(6, 40),
    aliases: [{ flags: '--max-quanta <n>' }],
  },
  out: {
    flags: '--out <file>',
    description: 'write the output to FILE (atomically) instead of stdout; the extension .txt, .csv, .json, .md or .tex chooses the format, and a format option must agree with it',
  },
  force: { flags: '--force', description: 'replace existing output files (--out, --svg)' },
  quiet: { flags: '--quiet', description: 'only errors and warnings on stderr (no progress bar, no "wrote FILE" notice)' },
  csv: { flags: '--csv', description: 'CSV output (RFC 4180; provenance on leading "#" lines; full precision)' },
  json: { flags: '--json', description: 'one JSON object (atomic units plus any SI block; full precision)' },
  pretty: { flags: '--pretty', description: 'indent the JSON output by two spaces (default: one line)' },
} as const satisfies Record<string, SharedOptionSpec>;

export type SharedOptionName = keyof typeof SHARED_OPTIONS;

/** Commander's attribute name of a long flag: `--quanta-per-centre <n>` → `quantaPerCentre`. */
export const attributeOf = (flags: string): string =>
  flags
    .split(/[ ,|]/)[0]
    .replace(/^--/, '')
    .replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());

/** Add the named shared options to `cmd` (in the order given), with their hidden old spellings. */
export function addSharedOptions(cmd: Command, names: readonly SharedOptionName[]): Command {
  for (const name of names) {
    const spec: SharedOptionSpec = SHARED_OPTIONS[name];
    const option = new Option(spec.flags, spec.description);
    if (spec.parse) option.argParser(spec.parse as (value: string, previous: unknown) => unknown);
    if (spec.default !== undefined) option.default(spec.default);
    cmd.addOption(option);
    for (const alias of spec.aliases ?? []) {
      const hidden = new Option(alias.flags, `old spelling of ${spec.flags.split(' ')[0]}`).hideHelp();
      if (spec.parse && alias.value === undefined) hidden.argParser(spec.parse as (value: string, previous: unknown) => unknown);
      cmd.addOption(hidden);
      // before the action: carry the old spelling's value over to the option (a clash with the new spelling is an error)
      cmd.hook('preAction', (_, action) => {
        const from = attributeOf(alias.flags), to = attributeOf(spec.flags);
        if (action.getOptionValueSource(from) !== 'cli') return;
        const value = alias.value ?? action.getOptionValue(from);
        if (action.getOptionValueSource(to) === 'cli' && action.getOptionValue(to) !== value) {
          throw new InputError(alias.flags.split(' ')[0], `is the old spelling of ${spec.flags.split(' ')[0]}, which is given too with another value; give ${spec.flags.split(' ')[0]} only`);
        }
        action.setOptionValueWithSource(to, value, 'cli');
      });
    }
  }
  if (names.includes('energyUnit') && names.includes('units')) {
    // --energy-unit chooses the unit of the SI energies: without --units si it would change nothing, silently
    cmd.hook('preAction', (_, action) => {
      if (action.getOptionValueSource('energyUnit') === 'cli' && action.getOptionValue('units') !== 'si') {
        throw new InputError('--energy-unit', 'chooses the unit of the SI energies; add --units si (the atomic output is in hartree)');
      }
    });
  }
  return cmd;
}

/** Output formats a command can write. */
export const OUTPUT_FORMATS = ['text', 'csv', 'json', 'markdown', 'latex'] as const;
export type OutputFormat = (typeof OUTPUT_FORMATS)[number];

/** The format option of each non-text format. */
const FORMAT_OPTION: Record<Exclude<OutputFormat, 'text'>, string> = { csv: '--csv', json: '--json', markdown: '--markdown', latex: '--latex' };

/** File-name extensions and the format they mean. */
const EXTENSION_FORMAT: Record<string, OutputFormat> = {
  txt: 'text',
  text: 'text',
  csv: 'csv',
  json: 'json',
  md: 'markdown',
  markdown: 'markdown',
  tex: 'latex',
};

/** Extensions that name a kind of file dispole's reports are not (figures, geometries, species files): refused for --out. */
const FOREIGN_EXTENSIONS = ['svg', 'png', 'pdf', 'eps', 'xyz', 'yaml', 'yml', 'html', 'xml'];

/** The format a file name's extension asks for, if it is one of ours. */
export function formatOfFileName(file: string): OutputFormat | undefined {
  const m = /\.([A-Za-z]+)$/.exec(file);
  return m ? EXTENSION_FORMAT[m[1].toLowerCase()] : undefined;
}

/** Parsed flags that select and route the output. */
export interface OutputFlags {
  csv?: boolean;
  json?: boolean;
  markdown?: boolean;
  latex?: boolean;
  pretty?: boolean;
  out?: string;
  force?: boolean;
  quiet?: boolean;
}

/**
 * The output format: the one format option given, else the --out extension, else text. Two format options, a format
 * option that contradicts the --out extension, or a format the command does not write are bad input.
 */
export function chooseFormat(flags: OutputFlags, allowed: readonly OutputFormat[]): OutputFormat {
  const asked = (Object.keys(FORMAT_OPTION) as Array<keyof typeof FORMAT_OPTION>).filter((f) => flags[f]);
  if (asked.length > 1) throw new InputError(FORMAT_OPTION[asked[0]], `cannot be combined with ${FORMAT_OPTION[asked[1]]} (choose one output format)`);
  if (flags.out !== undefined && flags.out.trim() === '') throw new InputError('--out', 'is empty; give a file name, e.g. --out result.csv');
  const foreign = flags.out !== undefined ? /\.([A-Za-z]+)$/.exec(flags.out)?.[1].toLowerCase() : undefined;
  if (foreign !== undefined && FOREIGN_EXTENSIONS.includes(foreign)) {
    throw new InputError('--out', `${flags.out} names a .${foreign} file, which this output is not; use .txt, .csv, .json, .md or .tex (figures go to --svg)`);
  }
  const byName = flags.out !== undefined ? formatOfFileName(flags.out) : undefined;
  if (asked.length === 1 && byName !== undefined && byName !== asked[0]) {
    throw new InputError('--out', `${flags.out} names a ${byName} file but ${FORMAT_OPTION[asked[0]]} asks for ${asked[0]}; change the extension or drop the option`);
  }
  const format = asked[0] ?? byName ?? 'text';
  if (!allowed.includes(format)) {
    const where = asked.length ? FORMAT_OPTION[asked[0]] : '--out';
    throw new InputError(where, `this command writes ${allowed.join(', ')}, not ${format}`);
  }
  if (flags.pretty && format !== 'json') throw new InputError('--pretty', 'applies to JSON output only (add --json or --out FILE.json)');
  return format;
}

/** A JSON document as text: one line, or indented with --pretty; always a final newline. */
export const jsonText = (value: unknown, flags: OutputFlags): string => JSON.stringify(value, null, flags.pretty ? 2 : undefined) + '\n';

/** Write a command's output: to --out FILE (atomically; --force replaces) with a notice unless --quiet, else stdout. */
export function emitOutput(ctx: CommandContext, flags: OutputFlags, text: string, what: string): void {
  if (flags.out === undefined) {
    ctx.io.stdout(text);
    return;
  }
  ctx.io.writeFile(flags.out, text, flags.force === true);
  notice(ctx, flags, `wrote ${what} to ${flags.out}`);
}

/** A "dispole: …" notice on stderr, unless --quiet. */
export function notice(ctx: CommandContext, flags: { quiet?: boolean }, message: string): void {
  if (!flags.quiet) ctx.io.stderr(`dispole: ${message}\n`);
}
