/**
 * Outputs that were wrong or incomplete, each checked: significant digits that stay significant, SI headers,
 * one "no cross-check", skipped routes in `pair --json`, tables that flag pairs no route can handle, several
 * --species files, built-in names not redefinable, one LaTeX notation, --columns, curve's CSV columns and what
 * `curve` suggests for atoms. (Formatting rules: common practice; numbers checked against CODATA where converted.)
 */
import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { sigColumn, sigDigits } from '../../src/model/number-text.js';
import { spreadText } from '../../src/report/format.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

const ZEPHYRINE = readFileSync('worked-examples/zephyrine-response.csv', 'utf8'); // invented demo data

describe('significant digits', () => {
  test('trailing zeros are kept and one column has one notation', () => {
    expect(sigDigits(-34.45, 5)).toBe('-34.450');
    expect(sigDigits(52, 5)).toBe('52.000');
    expect(sigDigits(9.99996, 5)).toBe('10.000'); // rounding up adds a digit before the point, not after
    expect(sigColumn([12183.4, 3.2e-7, undefined], 5)).toEqual(['1.2183e+04', '3.2000e-07', '—']);
    expect(sigColumn([33.866, -1134.65, 0], 5)).toEqual(['33.866', '-1134.7', '0']);
    expect(sigColumn([123456, 1.5], 5)).toEqual(['1.2346e+05', '1.5000e+00']); // 123456 would need padding zeros
    expect(spreadText(1.3)).toBe('1.3e+00');
    expect(spreadText(2.1e-16)).toBe('2.1e-16');
  });
  test('pair --digits 5 prints five significant digits in every cell of a column', async () => {
    const { out } = await run(['pair', 'Quelon', 'Virid', '--digits', '5']);
    const row = out.split('\n').find((l) => l.startsWith('perturbation'))!.split(/\s+/).slice(1);
    for (const cell of row) expect(cell.replace(/^-/, '').replace(/e[+-]\d+$/, '').replace('.', '').replace(/^0+/, '')).toHaveLength(5);
  });
});

describe('pair', () => {
  test('--units si: the header no longer claims atomic units only', async () => {
    const { out } = await run(['pair', 'Quelon', 'Virid', '--units', 'si']);
    expect(out.split('\n')[0]).toMatch(/table in atomic units, SI values \(CODATA 2018\) below$/);
  });
  test('a single route says "no cross-check" once', async () => {
    const { out } = await run(['pair', 'Quelon', 'Virid', '--routes', 'response']);
    expect(out.match(/no cross-check/g)).toHaveLength(1);
  });
  test('--json lists the skipped routes in `routes`, marked skipped with the reason', async () => {
    const j = JSON.parse((await run(['pair', 'H', 'H', '--json'])).out);
    const skipped = j.routes.filter((r: { skipped?: boolean }) => r.skipped);
    expect(skipped.map((r: { name: string }) => r.name)).toContain('force-balance');
    for (const r of skipped) expect(r.reason).toMatch(/\S/);
    expect(j.routes.filter((r: { skipped?: boolean }) => !r.skipped).every((r: { C6: number }) => typeof r.C6 === 'number')).toBe(true);
  });
  test('--csv: one row per route, the spread in the "#" lines', async () => {
    const { code, out } = await run(['pair', 'Quelon', 'Virid', '--csv']);
    expect(code).toBe(0);
    const lines = out.trim().split('\n');
    expect(lines.filter((l) => l.startsWith('# spread'))).toHaveLength(1);
    const rows = lines.filter((l) => !l.startsWith('#'));
    expect(rows[0].split(',').slice(0, 3)).toEqual(['route', 'status', 'C6 (Eh a0^6)']);
    expect(rows.slice(1).map((r) => r.split(',')[0])).toEqual(['perturbation', 'response', 'force-balance']);
  });
});

describe('species files', () => {
  const YAML = 'species:\n  Brim:\n    kind: drude\n    q: 1.3\n    m: 0.5\n    w: 0.7\n    source: invented for this test\n';
  test('several --species files are read together (YAML and CSV response data)', async () => {
    const { code, out } = await run(['table', 'Brim', 'Zephyrine', '--species', 'a.yaml', '--species', 'z.csv', '--quiet'], { 'a.yaml': YAML, 'z.csv': ZEPHYRINE });
    expect(code).toBe(0);
    expect(out).toMatch(/^Brim–Zephyrine /m);
  });
  test('a file may not redefine a built-in name; a name may be defined once over all files', async () => {
    const redefine = await run(['pair', 'He', 'Quelon', '--species', 'he.yaml'], { 'he.yaml': YAML.replace('Brim', 'He') });
    expect(redefine.code).toBe(2);
    expect(redefine.err).toMatch(/^dispole: error: he\.yaml: species\.He: redefines the built-in species He/);
    const twice = await run(['pair', 'Brim', 'Quelon', '--species', 'a.yaml', '--species', 'b.yaml'], { 'a.yaml': YAML, 'b.yaml': YAML });
    expect(twice.code).toBe(2);
    expect(twice.err).toMatch(/b\.yaml: species\.Brim: is defined already in a\.yaml/);
  });
  test('"unknown species" lists each name once', async () => {
    const { err } = await run(['pair', 'Nobody', 'Quelon', '--species', 'a.yaml'], { 'a.yaml': YAML });
    const list = /built-in name \(([^)]*)\)/.exec(err)![1].split(', ');
    expect(new Set(list).size).toBe(list.length);
    expect(list).toContain('Quelon');
    expect(err).toMatch(/a name from --species FILE \(Brim\)/);
  });
});

describe('table', () => {
  test('a pair no route can handle is flagged NOT COMPUTED; the other rows are written (exit 3)', async () => {
    const { code, out, err } = await run(['table', 'H', 'Zephyrine', '--species', 'z.csv', '--routes', 'perturbation'], { 'z.csv': ZEPHYRINE });
    expect(code).toBe(3);
    expect(out).toMatch(/^H–H .* (ok|unchecked|model)$/m);
    expect(out).toMatch(/^H–Zephyrine .*NOT COMPUTED$/m);
    expect(out).toMatch(/warning: not computed, no route can handle the pair: .*— H–Zephyrine, Zephyrine–Zephyrine/);
    expect(err).toMatch(/2 of 3 pairs are NOT COMPUTED/);
    const j = JSON.parse((await run(['table', 'H', 'Zephyrine', '--species', 'z.csv', '--routes', 'perturbation', '--json'], { 'z.csv': ZEPHYRINE })).out);
    expect(j.rows).toHaveLength(1);
    expect(j.notComputed.map((n: { a: string; b: string }) => `${n.a}-${n.b}`)).toEqual(['H-Zephyrine', 'Zephyrine-Zephyrine']);
  });
  test('a D7 that rests on a static B only is flagged in the status (not "unchecked")', async () => {
    const lines = readFileSync('worked-examples/zephyrine-lines.csv', 'utf8'); // invented demo data with a static B
    const { out } = await run(['table', 'H', 'Zephyrine-lines', '--species', 'z.csv', '--columns', 'C6,status'], { 'z.csv': lines });
    expect(out).toMatch(/^H–Zephyrine-lines\s+\S+\s+model$/m);
  });
  test('LaTeX: the notation of derive (D_{7}^{(a)}), a page-wide default and --columns', async () => {
    const tex = (await run(['table', 'Quelon', 'Virid', '--latex'])).out;
    const derive = (await run(['derive', 'D7.a', '--latex'])).out;
    expect(derive).toContain('D_{7}^{(a)} =');
    expect(tex).toContain('$D_{7}^{(a)}$');
    expect(tex).not.toContain('D_{7,A}');
    expect(tex).toMatch(/\\begin\{tabular\}\{lrrrrrc\}/); // pair, C6, C8, D7.a, D7.b, spread, sources
    const narrow = (await run(['table', 'Quelon', 'Virid', '--latex', '--columns', 'C6,D7.a'])).out;
    expect(narrow).toMatch(/\\begin\{tabular\}\{lrr\}/);
    const bad = await run(['table', 'Quelon', '--columns', 'C7']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--columns: has the unknown column "C7"; known with --units atomic: C6, C8, C10, D7\.a/);
  });
});

describe('curve', () => {
  test('--csv names each R column once (bohr: only R_bohr)', async () => {
    const { out } = await run(['curve', 'Quelon', 'Virid', '--from', '12', '--to', '20', '--points', '2', '--length', 'bohr', '--order', '3', '--csv']);
    const head = out.split('\n')[0].split(',');
    expect(head.filter((h) => h.startsWith('R_'))).toEqual(['R_bohr']);
    expect(new Set(head).size).toBe(head.length);
  });
  test('an atom the exact solution cannot take: the message says what would work', async () => {
    const { code, err } = await run(['curve', 'H', 'He']);
    expect(code).toBe(2);
    expect(err).toMatch(/^dispole: error: A: H is not a Drude oscillator.*use H-qdo/);
    expect(err).toMatch(/`dispole pair` gives H's coefficients/);
  });
});
