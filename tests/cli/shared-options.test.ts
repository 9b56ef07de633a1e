/**
 * One command line: every command's --help shows each shared option it has with the same flags, description and
 * default, all generated from the one table in src/cli/shared-options.ts; old spellings are hidden but accepted;
 * output formats, --out and --pretty behave the same everywhere. (Consistency checks of our own CLI: common practice.)
 */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { commandIndex } from '../../src/cli/commands/index.js';
import { SHARED_OPTIONS, chooseFormat, formatOfFileName } from '../../src/cli/shared-options.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

/** The help entry of an option: its line and the continuation lines, whitespace collapsed. */
function helpEntry(help: string, flags: string): string | undefined {
  const lines = help.split('\n');
  const i = lines.findIndex((l) => l.trimStart().startsWith(flags + ' ') || l.trim() === flags);
  if (i < 0) return undefined;
  const indent = lines[i].length - lines[i].trimStart().length;
  const parts = [lines[i]];
  for (let k = i + 1; k < lines.length && lines[k].trim() && !lines[k].slice(indent).startsWith('-') && lines[k].length - lines[k].trimStart().length > indent; k++) parts.push(lines[k]);
  return parts.join(' ').replace(/\s+/g, ' ').trim();
}

const expected = (spec: { flags: string; description: string; default?: string | number }) =>
  `${spec.flags} ${spec.description}${spec.default === undefined ? '' : ` (default: ${typeof spec.default === 'string' ? JSON.stringify(spec.default) : spec.default})`}`.replace(/\s+/g, ' ');

/** Shared options every command must have (the output ones), and the ones that make sense per command. */
const EVERYWHERE = ['json', 'pretty', 'out', 'force', 'quiet'] as const;
const PER_COMMAND: Record<string, ReadonlyArray<keyof typeof SHARED_OPTIONS>> = {
  pair: ['species', 'units', 'digits', 'agreementTol', 'quadratureTol', 'quantaPerCentre', 'csv'],
  table: ['species', 'units', 'digits', 'agreementTol', 'quadratureTol', 'quantaPerCentre', 'csv'],
  cluster: ['species', 'length', 'units', 'energyUnit', 'digits', 'csv'],
  curve: ['species', 'length', 'units', 'energyUnit', 'digits', 'basisTol', 'totalQuanta', 'csv'],
  density: ['species', 'length', 'units', 'energyUnit', 'digits', 'basisTol', 'totalQuanta', 'csv'],
  derive: [],
  check: [],
  species: ['species', 'csv'],
};

describe('shared options in every command’s --help', () => {
  test.each(commandIndex.map((c) => [c.name]))('%s: same flags, description and default as the one definition', async (name) => {
    const { code, out } = await run([name, '--help']);
    expect(code).toBe(0);
    for (const [key, spec] of Object.entries(SHARED_OPTIONS)) {
      const entry = helpEntry(out, spec.flags);
      const flag = spec.flags.split(' ')[0];
      if (entry === undefined) {
        // a command may lack a shared option, but must not spell the same flag its own way
        expect(out, `${name} has its own ${flag}`).not.toMatch(new RegExp(`^\\s+${flag.replace(/[-]/g, '\\-')}[ ,]`, 'm'));
        continue;
      }
      expect(entry, `${name} ${key}`).toBe(expected(spec));
    }
    // the commands listed above must have their set; newer commands are held to the same names where they have them
    for (const key of name in PER_COMMAND ? [...EVERYWHERE, ...PER_COMMAND[name]] : []) expect(helpEntry(out, SHARED_OPTIONS[key].flags), `${name} lacks ${SHARED_OPTIONS[key].flags}`).toBeDefined();
    // old spellings are hidden
    for (const old of ['--agree ', '--rel-tol ', '--tolerance ', '--max-quanta ', '--bohr ']) expect(out).not.toContain(`  ${old}`);
  });
  test('--units help claims energies in --energy-unit only conditionally (pair, table, surface have no --energy-unit)', async () => {
    for (const c of commandIndex) {
      const { out } = await run([c.name, '--help']);
      const units = helpEntry(out, SHARED_OPTIONS.units.flags);
      if (units === undefined || helpEntry(out, SHARED_OPTIONS.energyUnit.flags) !== undefined) continue;
      expect(units, c.name).not.toMatch(/energies in --energy-unit/);
    }
    expect(helpEntry((await run(['pair', '--help'])).out, '--energy-unit <unit>')).toBeUndefined();
  });
  test('every command has a description in its --help', async () => {
    for (const c of commandIndex) {
      const { out } = await run([c.name, '--help']);
      const text = out.split('\n').slice(1, 4).join(' ');
      expect(text.trim().length, c.name).toBeGreaterThan(40);
    }
  });
});

describe('old spellings stay accepted for one version', () => {
  test('pair --agree and --max-quanta mean --agreement-tol and --quanta-per-centre', async () => {
    const a = JSON.parse((await run(['pair', 'Quelon', 'Virid', '--json', '--quanta-per-centre', '3'])).out);
    const b = JSON.parse((await run(['pair', 'Quelon', 'Virid', '--json', '--max-quanta', '3', '--agree', '1e-8'])).out);
    expect(b.coefficients).toEqual(a.coefficients);
    const low = await run(['pair', 'Quelon', 'Virid', '--max-quanta', '1']);
    expect(low.code).toBe(3); // the old spelling still truncates
  });
  test('an old and a new spelling with different values are refused', async () => {
    const r = await run(['pair', 'Quelon', 'Virid', '--agree', '1e-6', '--agreement-tol', '1e-8']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^dispole: error: --agree: is the old spelling of --agreement-tol/);
  });
});

describe('output routing', () => {
  test('the --out extension picks the format; a contradicting format option is refused (exit 2, no file)', async () => {
    const csv = await run(['pair', 'Quelon', 'Virid', '--out', 't.csv', '--quiet']);
    expect(csv.code).toBe(0);
    expect(csv.out).toBe('');
    expect((csv.files['t.csv'] as string).split('\n').find((l) => !l.startsWith('#'))).toMatch(/^route,status,C6 \(Eh a0\^6\)/);
    const clash = await run(['pair', 'Quelon', 'Virid', '--out', 't.csv', '--json']);
    expect(clash.code).toBe(2);
    expect(clash.err).toBe('dispole: error: --out: t.csv names a csv file but --json asks for json; change the extension or drop the option\n');
    expect(clash.files['t.csv']).toBeUndefined();
    const json = await run(['table', 'Quelon', '--out', 't.json', '--quiet']);
    expect(JSON.parse(json.files['t.json'] as string).units).toBe('atomic');
    expect(formatOfFileName('x.TEX')).toBe('latex');
    expect(formatOfFileName('x.dat')).toBeUndefined();
    expect(chooseFormat({ out: 'x.dat' }, ['text', 'csv'])).toBe('text');
    const svg = await run(['pair', 'Quelon', 'Virid', '--out', 'x.svg']);
    expect(svg.code).toBe(2);
    expect(svg.err).toMatch(/--out: x\.svg names a \.svg file, which this output is not/);
    expect(svg.files['x.svg']).toBeUndefined();
  });
  test('--json is one line; --pretty indents it; --pretty without JSON is refused', async () => {
    const one = await run(['derive', 'C6', '--json']);
    expect(one.out.trim().split('\n')).toHaveLength(1);
    const pretty = await run(['derive', 'C6', '--json', '--pretty']);
    expect(pretty.out.split('\n').length).toBeGreaterThan(5);
    expect(JSON.parse(pretty.out)).toEqual(JSON.parse(one.out));
    const bad = await run(['species', '--pretty']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--pretty: applies to JSON output only/);
  });
  test('one error style: commander’s own errors carry the tool prefix too', async () => {
    const r = await run(['pair', 'Quelon', 'Virid', '--jsno']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^dispole: error: unknown option '--jsno'/);
    expect(r.err).not.toMatch(/^error:/m);
  });
});
