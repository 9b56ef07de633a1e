/** The CLI with real atoms: hydrogen pairs (acceptance contract), the atom library, and response-data files. */
import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { relDiff } from '../helpers/tolerance.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

interface RouteJson {
  name: string;
  C6: number;
  C8?: number;
  D7: { a: number; b: number; total: number };
  notes: string[];
}

// Yan, Babb, Dalgarno & Drake, Phys. Rev. A 54, 2824 (1996)
const YAN = { C6: 6.4990267054, C8: 124.3990835836 };

describe('dispole pair with hydrogen (acceptance)', () => {
  test('pair H H --json: C6, C8 within 1e-9 of Yan et al. (1996); perturbation and response agree on D7 within 1e-9; basis check in the notes', async () => {
    const { code, out, err } = await run(['pair', 'H', 'H', '--json']);
    expect(code).toBe(0);
    expect(err).toBe('');
    const j = JSON.parse(out);
    expect(relDiff(j.coefficients.C6, YAN.C6)).toBeLessThan(1e-9);
    expect(relDiff(j.coefficients.C8, YAN.C8)).toBeLessThan(1e-9);
    const [p, r] = j.routes as RouteJson[];
    expect([p.name, r.name]).toEqual(['perturbation', 'response']);
    expect(relDiff(r.D7.a, p.D7.a)).toBeLessThan(1e-9);
    expect(relDiff(r.D7.b, p.D7.b)).toBeLessThan(1e-9);
    expect(j.trusted).toBe(true);
    expect(j.warnings).toEqual([]);
    expect(p.notes).toContain('H: Sturmian pseudo-spectrum, 10 functions per l (l ≤ 3), exponent Z = 1');
    expect(p.notes.join('\n')).toMatch(/H: basis check, like pair with 7 vs 10 functions: relative change C6 \d\.\de-9/);
  });
  test('pair H drude:q=1.2,m=0.4,w=0.9 --json: the routes agree on C6, C8 and D7 within 1e-9', async () => {
    const { code, out } = await run(['pair', 'H', 'drude:q=1.2,m=0.4,w=0.9', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    const [p, r] = j.routes as RouteJson[];
    for (const k of ['C6', 'C8'] as const) expect(relDiff(r[k]!, p[k]!)).toBeLessThan(1e-9);
    expect(relDiff(r.D7.a, p.D7.a)).toBeLessThan(1e-9);
    expect(relDiff(r.D7.b, p.D7.b)).toBeLessThan(1e-9);
    expect(j.species.a).toMatchObject({ kind: 'hydrogenic', Z: 1, basis: 10 });
  });
  test('hydrogenic inline spec with a larger basis; out-of-range basis is bad input (exit 2, nothing on stdout)', async () => {
    const ok = await run(['pair', 'hydrogenic:Z=1,basis=12', 'Quelon', '--json']);
    expect(ok.code).toBe(0);
    const bad = await run(['pair', 'hydrogenic:basis=99', 'H']);
    expect(bad.code).toBe(2);
    expect(bad.out).toBe('');
    expect(bad.err).toBe('dispole: error: hydrogenic:basis=99.basis: must be an integer from 4 to 24, got 99\n');
  });
});

describe('atom library on the command line', () => {
  test('pair He-qdo Ar-qdo and pair Ne-qdo Xe-qdo (the fitted QDOs) work out of the box, every route agreeing', async () => {
    for (const [a, b] of [['He-qdo', 'Ar-qdo'], ['Ne-qdo', 'Xe-qdo']]) {
      const { code, out } = await run(['pair', a, b]);
      expect(code).toBe(0);
      expect(out).toMatch(/All routes agree/);
      expect(out).toContain(`Pair ${a} – ${b}`);
    }
  });
  test('species lists H, the fitted rare gases and the library table with numbered sources', async () => {
    const { code, out } = await run(['species']);
    expect(code).toBe(0);
    expect(out).toMatch(/^H\s+hydrogenic Z=1 basis=10/m);
    expect(out).toMatch(/^Ar-qdo\s+drude q=[\d.]+ m=[\d.]+ w=[\d.]+\s+QDO fitted to the atom library values below/m);
    expect(out).toMatch(/^He\s+1\.383192174455 \[\d+\]\s+1\.460977837725 \[\d+\]/m);
    expect(out).toContain('K. T. Tang, J. P. Toennies, J. Chem. Phys. 118, 4976 (2003)');
    expect(out).toContain('Z.-C. Yan, J. F. Babb, A. Dalgarno, G. W. F. Drake, Phys. Rev. A 54, 2824 (1996)');
  });
});

describe('response-data files', () => {
  const table = readFileSync(new URL('../../worked-examples/zephyrine-response.csv', import.meta.url), 'utf8');
  const lines = readFileSync(new URL('../../worked-examples/zephyrine-lines.csv', import.meta.url), 'utf8');
  test('a tabulated species (invented Zephyrine) pairs with H by the response route only; what was assumed is in the notes', async () => {
    const { code, out } = await run(['pair', 'Zephyrine', 'H', '--species', 'z.csv', '--json'], { 'z.csv': table });
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.routes.filter((r: RouteJson & { skipped?: boolean }) => !r.skipped).map((r: RouteJson) => r.name)).toEqual(['response']);
    expect(typeof j.coefficients.C8).toBe('number'); // the table has alpha2
    expect(j.coefficients.C10).toBeUndefined();
    expect(j.warnings).toEqual(['only one route could run: no cross-check']);
    const notes = (j.routes[0] as RouteJson).notes.join('\n');
    expect(notes).toContain('Zephyrine: alpha beyond the grid (u > 31.0059) follows N/u² with N = 8 (given)');
    expect(notes).toContain('Zephyrine: no alpha3 column: C10 and above are not computed');
  });
  test('a pseudo-spectrum with a static B: D7 flagged APPROXIMATE in the warnings', async () => {
    const { code, out } = await run(['pair', 'Zephyrine-lines', 'Quelon', '--species', 'l.csv'], { 'l.csv': lines });
    expect(code).toBe(0);
    expect(out).toContain('warning: D7 is APPROXIMATE: Zephyrine-lines has only a static B');
  });
  test('a bad data file: exit 2, the message names file, line and column, nothing on stdout', async () => {
    const bad = table.replace(/\n0\.02, 2\.76559137/, '\n0.02, -2.76559137');
    const { code, out, err } = await run(['pair', 'Zephyrine', 'H', '--species', 'bad.csv'], { 'bad.csv': bad });
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toBe('dispole: error: bad.csv:8:2: alpha must be > 0 (a polarisability at imaginary frequency is positive), got -2.76559137\n');
  });
});
