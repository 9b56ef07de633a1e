import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { VERSION } from '../../src/version.js';
import { expectClose } from '../helpers/tolerance.js';
import pkg from '../../package.json' with { type: 'json' };

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

describe('dispole pair --json contract', () => {
  test('prints exactly one JSON object with units, coefficients and routes', async () => {
    const { code, out, err } = await run(['pair', 'Quelon', 'drude:q=1.2,m=0.4,w=0.9', '--json']);
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out.trim().split('\n')).toHaveLength(1);
    const j = JSON.parse(out);
    expect(j.units).toBe('atomic');
    for (const k of ['C6', 'C8']) expect(typeof j.coefficients[k]).toBe('number');
    expect(Object.keys(j.coefficients.D7).sort()).toEqual(['a', 'b', 'total']);
    expect(j.routes.map((r: { name: string }) => r.name).slice(0, 2)).toEqual(['perturbation', 'response']);
    for (const r of j.routes) {
      expect(typeof r.C6).toBe('number');
      expect(typeof r.C8).toBe('number');
      expectClose(r.D7.total, r.D7.a + r.D7.b, 1e-15, 1e-15);
    }
    // London: C6 = (3/2) αA αB wA wB/(wA + wB) (Z. Phys. Chem. B 11, 222 (1930))
    const aA = 1.1 ** 2 / (0.38 * 0.72 ** 2), aB = 1.2 ** 2 / (0.4 * 0.81);
    expectClose(j.coefficients.C6, (1.5 * aA * aB * 0.72 * 0.9) / (0.72 + 0.9), 1e-13);
    expect(j.trusted).toBe(true);
  });
  test('--units si adds SI values (CODATA 2018 conversions)', async () => {
    const j = JSON.parse((await run(['pair', 'Quelon', 'Virid', '--json', '--units', 'si'])).out);
    expectClose(j.si.C6, j.coefficients.C6 * 4.3597447222071e-18 * 0.529177210903e-10 ** 6, 1e-12);
    expectClose(j.si.D7.a.debyeAngstrom7, j.coefficients.D7.a * 2.541746473 * 0.529177210903 ** 7, 1e-9);
  });
  test('identical species: D7.total = 0 and D7.a = −D7.b', async () => {
    const j = JSON.parse((await run(['pair', 'Sorrel', 'Sorrel', '--json'])).out);
    expect(Math.abs(j.coefficients.D7.total)).toBeLessThan(1e-12 * Math.abs(j.coefficients.D7.a));
    expect(j.coefficients.D7.a).toBeLessThan(0);
  });
});

describe('dispole pair human output', () => {
  test('shows a table per route with units and the spread', async () => {
    const { code, out } = await run(['pair', 'Quelon', 'Virid']);
    expect(code).toBe(0);
    expect(out).toMatch(/route\s+C6 \(Eh a0\^6\)\s+C8 \(Eh a0\^8\)/);
    // the default --digits 7, trailing zeros kept
    expect(out).toMatch(/^perturbation\s+33\.86632 /m);
    expect(out).toMatch(/^response\s+33\.86632 /m);
    expect(out).toMatch(/^spread \(rel\.\)/m);
    expect(out).toMatch(/All routes agree/);
  });
  test('an anisotropic species reports the first-order (permanent quadrupole) terms', async () => {
    const { out } = await run(['pair', 'Spindlet', 'Virid']);
    expect(out).toMatch(/first-order terms: E5 = 0 Eh a0\^5/);
    expect(out).toMatch(/warning: anisotropic species carry permanent quadrupoles/);
  });
  test('a species file is read through --species', async () => {
    const file = 'species:\n  Brim:\n    kind: drude\n    q: 1.3\n    m: 0.5\n    w: 0.7\n    source: invented for this test\n';
    const { code, out } = await run(['pair', 'Brim', 'Quelon', '--species', 'sp.yaml'], { 'sp.yaml': file });
    expect(code).toBe(0);
    expect(out).toMatch(/invented for this test/);
  });
  test('a truncation below the exact minimum is flagged and exits 3', async () => {
    const { code, out } = await run(['pair', 'Quelon', 'Virid', '--max-quanta', '1']);
    expect(code).toBe(3);
    expect(out).toMatch(/perturbation \(UNCONVERGED\)/);
    expect(out).toMatch(/UNTRUSTED/);
  });
});

describe('dispole pair bad input: exit 2, nothing on stdout', () => {
  test.each([
    [['pair', 'Quelon', 'drude:q=1,m=-1,w=1'], /drude:q=1,m=-1,w=1\.m: must be a finite number > 0, got -1/],
    [['pair', 'Quelon', 'Nosuch'], /Nosuch: is not a known species/],
    [['pair', 'Quelon'], /missing required argument 'B'/],
    [['pair', 'Quelon', 'Virid', '--units', 'imperial'], /must be one of atomic, si, got "imperial"/],
    [['pair', 'Quelon', 'Virid', '--routes', 'psychic'], /routes: unknown route "psychic"; known: perturbation, response/],
    [['pair', 'Quelon', 'Virid', '--species', 'missing.yaml'], /missing\.yaml: cannot be read \(ENOENT\)/],
    [['pair', 'Quelon', 'Virid', '--digits', '99'], /must be an integer from 2 to 17, got "99"/],
    [['pair', 'Quelon', 'Virid', '--jsno'], /unknown option '--jsno'/],
  ])('%j', async (argv, message) => {
    const { code, out, err } = await run(argv as string[]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message);
  });
});

describe('the built command', () => {
  const bin = 'dist/cli/bin.cjs';
  test('runs end to end as a process (after `npm run build`)', () => {
    expect(existsSync(bin), 'npm test builds dist/ first').toBe(true);
    const out = execFileSync('node', [bin, 'pair', 'Quelon', 'Virid', '--json'], { encoding: 'utf8' });
    expect(JSON.parse(out).units).toBe('atomic');
    const bad = spawnSync('node', [bin, 'pair', 'Quelon', 'drude:q=0,m=1,w=1'], { encoding: 'utf8' });
    expect(bad.status).toBe(2);
    expect(bad.stdout).toBe('');
    expect(bad.stderr).toMatch(/^dispole: error: drude:q=0,m=1,w=1\.q: must be a finite number > 0, got 0/);
  });
  test('the version matches package.json', () => {
    expect(VERSION).toBe(pkg.version);
  });
});

describe('route notes in the human report', () => {
  test('each note once, with the routes that made it; skipped routes give their reason', async () => {
    const { out } = await run(['pair', 'H', 'H']);
    expect(out).toMatch(/^Route notes:$/m);
    expect(out).toMatch(/^ {2}perturbation, response: H: basis check, like pair with 7 vs 10 functions/m);
    expect(out).toMatch(/^ {2}force-balance: skipped \(H is not a quantum Drude oscillator/m);
    expect(out).not.toMatch(/harmonic truncation/);
  });
  test('a single route says there is no cross-check', async () => {
    const { code, out } = await run(['pair', 'Quelon', 'Virid', '--routes', 'response']);
    expect(code).toBe(0);
    expect(out).toMatch(/Only the response route could run: no cross-check\./);
  });
});

describe('pair: charged tdhf species and D9 in every format', () => {
  test('an ion (tdhf:Z=11,charge=1) warns that the charge-induced terms are not included; the neutral atom does not', async () => {
    // induction of an ion: E ∋ −alpha_B q²/(2R^4), mu_B ∋ alpha_B q/R^2 (classical electrostatics; common practice, e.g. A. J. Stone, The Theory of Intermolecular Forces, 2013)
    const ion = JSON.parse((await run(['pair', 'tdhf:Z=11,charge=1,basis=12', 'Quelon', '--json'])).out);
    const w = ion.warnings.filter((x: string) => x.includes('is an ion'));
    expect(w).toHaveLength(1);
    expect(w[0]).toMatch(/charge \+1\): only the dispersion \(C_n\) and dispersion-induced \(D7\) parts are given; the charge-induced \(induction\) terms.*−alpha_B q_A²\/\(2R\^4\).*alpha_B q_A\/R\^2.*dominate at long range and are NOT included/);
    const neutral = JSON.parse((await run(['pair', 'tdhf:He,basis=12', 'Quelon', '--json'])).out);
    expect(neutral.warnings.some((x: string) => x.includes('is an ion'))).toBe(false);
  });
  test('--csv has the D9 columns the text and JSON show (perturbation route), empty for routes without D9', async () => {
    const j = JSON.parse((await run(['pair', 'Quelon', 'Virid', '--json'])).out);
    const csv = (await run(['pair', 'Quelon', 'Virid', '--csv'])).out.split('\n').filter((l) => l && !l.startsWith('#'));
    const head = csv[0].split(',');
    const i = head.indexOf('D9.a (e a0^10)');
    expect(i).toBeGreaterThan(head.indexOf('D7.total (e a0^8)'));
    const pert = csv.find((l) => l.startsWith('perturbation,'))!.split(',');
    expect(Number(pert[i])).toBe(j.coefficients.D9.a);
    expect(Number(pert[i + 2])).toBe(j.coefficients.D9.total);
    expect(csv.find((l) => l.startsWith('response,'))!.split(',')[i]).toBe('');
    expect(j.accuracy.quantities).toEqual({ dispersion: 'exact', D7: 'exact', D9: 'exact' });
  });
  test('response-only pair (He Ar): no D9 in JSON, and the text and CSV say why', async () => {
    const j = JSON.parse((await run(['pair', 'He', 'Ar', '--json'])).out);
    expect(j.coefficients.D9).toBeUndefined();
    expect(j.accuracy.quantities.D9).toBeUndefined();
    expect((await run(['pair', 'He', 'Ar'])).out).toMatch(/^D9: not available from the response route \(no response formula yet\)$/m);
    expect((await run(['pair', 'He', 'Ar', '--csv'])).out).toMatch(/^# D9: not available from the response route/m);
    expect((await run(['pair', 'Quelon', 'Virid'])).out).not.toContain('D9: not');
  });
  test('help and the unknown-species error name the tdhf: inline spec', async () => {
    expect((await run(['pair', '--help'])).out).toMatch(/tdhf:Ar/);
    expect((await run(['pair', 'Quelon', 'Nosuch'])).err).toMatch(/inline spec like drude:q=1\.2,m=0\.4,w=0\.9 or tdhf:Ar/);
  });
});
