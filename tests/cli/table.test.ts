import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { VERSION } from '../../src/version.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[], files: Record<string, string> = {}, tty = false) {
  const io = memoryIO(files);
  io.stderrIsTTY = tty;
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

const SPECIES_FILE = [
  'species:',
  '  Brim:            # invented for this test',
  '    kind: drude',
  '    q: 1.3',
  '    m: 0.5',
  '    w: 0.7',
  '    source: invented for this test',
  '  Fitto:',
  '    kind: fit',
  '    alpha: 11.08',
  '    C6: 64.3',
  '    C8: 1623',
  '    source: invented targets for this test',
  '  Halm:',
  '    kind: drude',
  '    q: 0.95',
  '    m: 0.33',
  '    w: 0.9',
  '',
].join('\n');

describe('dispole table: rows and order', () => {
  test('all unordered pairs of the positional species, like pairs included, in the order given', async () => {
    const { code, out, err } = await run(['table', 'Quelon', 'Virid', 'Sorrel', '--json']);
    expect(code).toBe(0);
    expect(err).toBe('');
    const j = JSON.parse(out);
    expect(j.rows.map((r: { a: string; b: string }) => `${r.a}-${r.b}`)).toEqual([
      'Quelon-Quelon', 'Quelon-Virid', 'Quelon-Sorrel', 'Virid-Virid', 'Virid-Sorrel', 'Sorrel-Sorrel',
    ]);
  });

  test('each row equals the `dispole pair A B --json` result of its pair (same default options)', async () => {
    const j = JSON.parse((await run(['table', 'Quelon', 'Spindlet', 'drude:q=1.2,m=0.4,w=0.9', '--json'])).out);
    expect(j.rows).toHaveLength(6);
    for (const row of j.rows) {
      const p = JSON.parse((await run(['pair', row.a, row.b, '--json'])).out);
      expect({ C6: row.C6, C8: row.C8, C10: row.C10, D7: row.D7, D9: row.D9 }).toEqual(p.coefficients);
      expect(row.spread).toBe(p.spread.max);
      expect(row.trusted).toBe(p.trusted);
      expect(row.routes).toEqual(p.routes.filter((r: { skipped?: boolean }) => !r.skipped).map((r: { name: string }) => r.name));
    }
  });

  test('like pairs have D7.total = 0 (mirror symmetry; derived here) in the text table', async () => {
    const { out } = await run(['table', 'Virid', 'Tarnet']);
    expect(out).toMatch(/^Virid–Virid(\s+\S+){4}\s+0\s/m);
    expect(out).toMatch(/^Tarnet–Tarnet(\s+\S+){4}\s+0\s/m);
  });

  test('--species FILE alone: every species of the file, in file order; fitted species reproduce their targets', async () => {
    const { code, out } = await run(['table', '--species', 'sp.yaml', '--json'], { 'sp.yaml': SPECIES_FILE });
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.species.map((s: { name: string }) => s.name)).toEqual(['Brim', 'Fitto', 'Halm']);
    expect(j.rows).toHaveLength(6);
    // the fitted QDO reproduces alpha, C6, C8 of the like pair (mapping of Jones et al., Phys. Rev. B 87, 144103 (2013))
    const ff = j.rows.find((r: { a: string; b: string }) => r.a === 'Fitto' && r.b === 'Fitto');
    expectClose(ff.C6, 64.3, 1e-12);
    expectClose(ff.C8, 1623, 1e-12);
    expect(ff.sources).toEqual({ a: 'invented targets for this test', b: 'invented targets for this test' });
  });

  test('--species FILE with names: the file only supplies definitions; sources appear in the table', async () => {
    const { out } = await run(['table', 'Brim', 'Quelon', '--species', 'sp.yaml'], { 'sp.yaml': SPECIES_FILE });
    expect(out).toContain('species:\n  Brim: drude q=1.3 m=0.5 w=0.7 [1]\n  Quelon: drude q=1.1 m=0.38 w=0.72 [2]\n');
    expect(out).toContain('sources:\n  [1] invented for this test\n  [2] invented for the worked examples');
    expect(out).toMatch(/^Brim–Quelon .* \[1\]\/\[2\]\s+ok$/m);
    expect(out).not.toContain('Halm');
  });

  test('--pairs: ordered entries by name, position or built-in name, in the order given', async () => {
    const { code, out } = await run(['table', 'Quelon', 'drude:q=1.2,m=0.4,w=0.9', '--pairs', '2-Quelon,Tarnet-Sorrel', '--pairs', 'quelon-quelon', '--csv']);
    expect(code).toBe(0);
    const rows = out.split('\n').filter((l) => l && !l.startsWith('#')).slice(1).map((l) => l.split(',')[0]);
    expect(rows).toEqual(['"drude:q=1.2', 'Tarnet', 'Quelon']);
    expect(out).toMatch(/^"drude:q=1\.2,m=0\.4,w=0\.9",Quelon,/m);
  });
});

describe('dispole table: formats and determinism', () => {
  test.each([[[]], [['--csv']], [['--json']], [['--markdown']], [['--latex']], [['--units', 'si', '--digits', '9']]])(
    'two runs give identical bytes (%j)',
    async (extra) => {
      const argv = ['table', 'Quelon', 'Spindlet', 'Sorrel', ...extra];
      const first = await run(argv);
      expect(first.code).toBe(0);
      expect((await run(argv)).out).toBe(first.out);
      expect(first.out).toContain(VERSION);
    },
  );

  test('--units si says so in the header; --latex gives a booktabs float', async () => {
    expect((await run(['table', 'Quelon', '--units', 'si'])).out).toContain('units: SI, CODATA 2018 (C_n in J·m^n, D7 in C·m^8 and in debye·Å^7)');
    const tex = (await run(['table', 'Quelon', 'Virid', '--latex', '--digits', '4'])).out;
    expect(tex).toMatch(/\\toprule[\s\S]*\\midrule[\s\S]*\\bottomrule/);
    expect(tex).toContain('    Quelon--Virid & $33.87$ & ');
  });
});

describe('dispole table --out', () => {
  test('writes the file (nothing on stdout) and says so on stderr; --quiet silences the notice', async () => {
    const r = await run(['table', 'Quelon', 'Virid', '--csv', '--out', 't.csv']);
    expect(r.code).toBe(0);
    expect(r.out).toBe('');
    expect(r.err).toBe('dispole: wrote the table of 3 pairs to t.csv\n');
    expect(r.files['t.csv']).toBe((await run(['table', 'Quelon', 'Virid', '--csv'])).out);
    expect((await run(['table', 'Quelon', '--out', 'u.txt', '--quiet'])).err).toBe('');
  });
  test('an existing file is not replaced without --force (exit 2, file unchanged), and is with it', async () => {
    const r = await run(['table', 'Quelon', '--out', 'old.txt'], { 'old.txt': 'keep me' });
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toBe('dispole: error: old.txt: exists already; pass --force to replace it\n');
    expect(r.files['old.txt']).toBe('keep me');
    const f = await run(['table', 'Quelon', '--out', 'old.txt', '--force'], { 'old.txt': 'keep me' });
    expect(f.code).toBe(0);
    expect(f.files['old.txt']).toMatch(/^dispole /);
  });
});

describe('dispole table: untrusted rows', () => {
  test('a truncated basis makes rows UNTRUSTED: flagged, still printed, exit 3', async () => {
    const r = await run(['table', 'Quelon', 'Virid', '--max-quanta', '1']);
    expect(r.code).toBe(3);
    expect(r.out).toMatch(/^Quelon–Virid .*UNTRUSTED$/m);
    expect(r.out).toContain('UNTRUSTED: 3 of 3 rows');
    expect(r.err).toBe('dispole: 3 of 3 rows are UNTRUSTED (flagged in the table)\n');
  });
  test('with --out the table is still written, and the exit code is 3', async () => {
    const r = await run(['table', 'Quelon', '--max-quanta', '1', '--json', '--out', 't.json', '--quiet']);
    expect(r.code).toBe(3);
    expect(JSON.parse(r.files['t.json'] as string).rows[0].status).toBe('UNTRUSTED');
  });
});

describe('dispole table: progress indicator', () => {
  const many = ['Quelon', 'Virid', 'Sorrel', 'Tarnet', ...Array.from({ length: 10 }, (_, i) => `drude:q=1,m=0.5,w=${(0.5 + 0.05 * i).toFixed(2)}`)];
  const argv = ['table', ...many, '--routes', 'perturbation,response', '--csv'];
  test('shown on an interactive stderr for a large table (105 pairs), output unchanged', async () => {
    const tty = await run(argv, {}, true);
    expect(tty.code).toBe(0);
    expect(tty.err).toContain('105/105');
    expect(tty.out).toBe((await run(argv)).out);
  });
  test('not shown when stderr is not a terminal, with --quiet, or for a small table', async () => {
    expect((await run(argv)).err).toBe('');
    expect((await run([...argv, '--quiet'], {}, true)).err).toBe('');
    expect((await run(['table', 'Quelon', 'Virid'], {}, true)).err).toBe('');
  });
});

describe('dispole table: bad input → exit 2, message on stderr, nothing on stdout', () => {
  test.each([
    [['table', 'Quelon', 'Nobody'], 'dispole: error: Nobody: is not a known species; use a built-in name'],
    [['table', 'Quelon', 'Virid', '--pairs', 'Quelon+Virid'], 'dispole: error: --pairs entry "Quelon+Virid": must be two species joined by "-", e.g. Quelon-Virid\n'],
    [['table', 'Quelon', 'Virid', '--pairs', 'Quelon-Nobody'], 'dispole: error: --pairs entry "Quelon-Nobody": "Nobody" is not a species of this table; use a name (Quelon, Virid) or a position 1…2\n'],
    [['table'], 'dispole: error: species: none given; name them (e.g. dispole table Quelon Virid), give --species FILE, or list --pairs\n'],
    [['table', 'Quelon', 'quelon'], 'dispole: error: species: "Quelon" is listed twice; list each species once\n'],
    [['table', 'Quelon', '--csv', '--json'], 'dispole: error: --csv: cannot be combined with --json (choose one output format)\n'],
    [['table', 'Quelon', '--digits', '1'], 'must be an integer from 2 to 17, got "1"'],
    [['table', 'Quelon', '--units', 'cgs'], 'must be one of atomic, si, got "cgs"'],
    [['table', 'Quelon', '--routes', 'perturbation,guess'], 'dispole: error: routes: unknown route "guess"; known: perturbation, response'],
    [['table', 'Quelon', 'drude:q=1,m=0,w=1'], 'dispole: error: drude:q=1,m=0,w=1.m: must be a finite number > 0, got 0\n'],
    [['table', '--species', 'missing.yaml'], 'dispole: error: missing.yaml: cannot be read (ENOENT)\n'],
  ])('%j', async (argv, message) => {
    const r = await run(argv);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toContain(message);
  });
});

describe('worked example: the invented Tessaly species file', () => {
  test('gives 15 agreeing pairs; the fitted species reproduces its invented targets', async () => {
    const file = readFileSync(new URL('../../worked-examples/tessaly-species.yaml', import.meta.url), 'utf8');
    expect(file).toMatch(/INVENTED/);
    const r = await run(['table', '--species', 'tessaly.yaml', '--routes', 'perturbation,response', '--json'], { 'tessaly.yaml': file });
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.rows).toHaveLength(15);
    expect(j.rows.every((row: { status: string }) => row.status === 'ok')).toBe(true);
    const dd = j.rows.find((row: { a: string; b: string }) => row.a === 'Duskel' && row.b === 'Duskel');
    expectClose(dd.C6, 52, 1e-12);
    expectClose(dd.C8, 1450, 1e-12);
  });
});
