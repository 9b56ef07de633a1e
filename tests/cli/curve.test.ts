/** `dispole curve`: table, CSV, JSON and SVG outputs, length units, and bad input. */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

// Quelon and Virid are the invented demo species (src/model/builtin-species.ts)
const BASE = ['curve', 'Quelon', 'Virid', '--from', '10', '--to', '40', '--points', '4'];

describe('dispole curve', () => {
  test('table: units in the header, asymptotic columns, basis size and status per point', async () => {
    const { code, out, err } = await run(BASE);
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out).toMatch(/^R \(bohr\)\s+mu_A \(e a0\)\s+D7\.a\/R\^7\s+mu_B \(e a0\)\s+D7\.b\/R\^7\s+mu_total\s+D7\/R\^7\s+E_int \(Eh\)\s+-C6\/R\^6-C8\/R\^8\s+N\s+dim\s+status$/m);
    expect(out.match(/ ok$/gm)).toHaveLength(4);
    expect(out).toMatch(/All points converged and trusted\./);
  });
  test('--json: one object; the dipoles approach D7/R^7 and the energy −C6/R^6 as R grows', async () => {
    const { code, out } = await run([...BASE, '--json', '--order', '4']);
    expect(code).toBe(0);
    expect(out.trim().split('\n')).toHaveLength(1);
    const j = JSON.parse(out);
    expect(j.units).toEqual({ R: 'bohr', dipole: 'e a0', energy: 'hartree', coefficients: 'atomic' });
    expect(j.hamiltonian.multipoleOrder).toBe(4);
    expect(j.points).toHaveLength(4);
    const far = j.points[3];
    expectClose(far.R_bohr, 40, 1e-14);
    expectClose(far.asymptotic.muA, j.coefficients.D7.a / 40 ** 7, 1e-14);
    // the relative corrections of the dipole fall off as R^-2 (the next term is R^-9; see the exact route's fit)
    const dev = (p: { muA: number; asymptotic: { muA: number } }) => Math.abs(p.muA / p.asymptotic.muA - 1);
    expect(dev(far)).toBeLessThan(0.03);
    expect(dev(far)).toBeLessThan(dev(j.points[0]) / 10);
    expectClose(far.energy, far.asymptotic.energy, 3e-4); // the R^-10 term (C10/(C6 R^4) ≈ 1.4e-4 here) is left out
    // London: C6 = (3/2) αA αB wA wB/(wA + wB) (F. London, Z. Phys. Chem. B 11, 222 (1930))
    const aA = 1.1 ** 2 / (0.38 * 0.72 ** 2), aB = 1.45 ** 2 / (0.52 * 0.6 ** 2);
    expectClose(j.coefficients.C6, (1.5 * aA * aB * 0.72 * 0.6) / (0.72 + 0.6), 1e-13);
    expect(far.muA).toBeLessThan(0);
    expect(far.muB).toBeGreaterThan(0);
    for (const p of j.points) {
      expect(p.trusted).toBe(true);
      expect(p.basis.dimension).toBeLessThan(p.basis.dimensionUnreduced);
      expect(p.record.length).toBeGreaterThanOrEqual(3);
      expect(p.basis.residual).toBeLessThan(1e-10);
    }
  });
  test('--csv in ångström: one header row, R converted with the CODATA 2018 bohr radius', async () => {
    const { code, out } = await run(['curve', 'Quelon', 'Virid', '--from', '6', '--to', '12', '--points', '3', '--length', 'angstrom', '--csv']);
    expect(code).toBe(0);
    const lines = out.trim().split('\n');
    expect(lines).toHaveLength(4);
    expect(lines[0].startsWith('R_angstrom,R_bohr,mu_A_ea0,mu_B_ea0,mu_total_ea0,E_int_hartree,')).toBe(true);
    const first = lines[1].split(',');
    expect(Number(first[0])).toBeCloseTo(6, 12);
    expectClose(Number(first[1]), 6 / 0.529177210903, 1e-14); // a0 = 0.529177210903 Å (CODATA 2018)
  });
  test('--svg writes the figure; an existing file is refused without --force (exit 2, nothing printed)', async () => {
    const ok = await run([...BASE, '--svg', 'mu.svg']);
    expect(ok.code).toBe(0);
    const svg = ok.files['mu.svg'] as string;
    expect(svg.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg ')).toBe(true);
    expect(svg).toContain('R (bohr)');
    expect(ok.err).toMatch(/wrote the figure to mu\.svg/);
    const again = await run([...BASE, '--svg', 'mu.svg'], { 'mu.svg': 'old' });
    expect(again.code).toBe(2);
    expect(again.out).toBe('');
    expect(again.err).toMatch(/mu\.svg: exists already; pass --force to replace it/);
    expect(again.files['mu.svg']).toBe('old');
    const forced = await run([...BASE, '--svg', 'mu.svg', '--force'], { 'mu.svg': 'old' });
    expect(forced.code).toBe(0);
    expect(forced.files['mu.svg']).not.toBe('old');
  });
  test('points the basis cannot resolve are flagged UNTRUSTED with the reason (exit 3)', async () => {
    const { code, out } = await run(['curve', 'Quelon', 'Virid', '--from', '3.5', '--to', '8', '--points', '3']);
    expect(code).toBe(3);
    expect(out).toMatch(/^3\.5 .*(UNTRUSTED|UNCONVERGED)$/m);
    expect(out).toMatch(/escape barrier of the (order-3 )?multipole potential/);
    expect(out).toMatch(/ ok$/m);
  });
  test('bad input: exit 2, the message names the option, nothing on stdout, no file', async () => {
    const cases: Array<[string[], RegExp]> = [
      [['curve', 'Quelon', 'Virid', '--from', '20', '--to', '10', '--svg', 'x.svg'], /--to: must be larger than --from \(20\), got 10/],
      [['curve', 'Quelon', 'Virid', '--points', '1'], /--points <n>' argument '1' is invalid\. must be an integer from 2 to 400/],
      [['curve', 'Quelon', 'Virid', '--csv', '--json'], /--csv: cannot be combined with --json/],
      [['curve', 'Quelon', 'Virid', '--length', 'furlong'], /must be one of bohr, angstrom, got "furlong"/],
      [['curve', 'drude:q=1,m=1,wx=0.8,wy=0.9,wz=1', 'Virid', '--svg', 'x.svg'], /^dispole: error: A: .* is not axially symmetric about the bond axis \(wx ≠ wy\)/m],
      [['curve', 'Quelon', 'Virid', '--order', '9'], /--order <n>' argument '9' is invalid\. must be an integer from 2 to 6/],
    ];
    for (const [argv, message] of cases) {
      const { code, out, err, files } = await run(argv);
      expect(code, argv.join(' ')).toBe(2);
      expect(out).toBe('');
      expect(err).toMatch(message);
      expect(files['x.svg']).toBeUndefined();
    }
  });
});

describe('dispole pair --exact', () => {
  test('adds the route "exact" after the default routes; all agree within the default 1e-8', async () => {
    const { code, out } = await run(['pair', 'Quelon', 'Virid', '--exact', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    const names = j.routes.map((r: { name: string }) => r.name);
    expect(names[0]).toBe('perturbation');
    expect(names[names.length - 1]).toBe('exact');
    const exact = j.routes[names.length - 1];
    expect(exact.converged).toBe(true);
    expect(exact.C10).toBeUndefined();
    expectClose(exact.D7.a, j.coefficients.D7.a, 1e-8);
    expectClose(exact.C8, j.coefficients.C8, 1e-8);
    expect(j.trusted).toBe(true);
  });
  test('with --routes, the exact route is added to the listed ones; an anisotropic centre skips it with the reason', async () => {
    const j = JSON.parse((await run(['pair', 'Quelon', 'Virid', '--routes', 'response', '--exact', '--json'])).out);
    expect(j.routes.map((r: { name: string }) => r.name)).toEqual(['response', 'exact']);
    const aniso = await run(['pair', 'Spindlet', 'Virid', '--exact']);
    expect(aniso.out).toMatch(/warning: route exact skipped: Spindlet is anisotropic/);
  });
});

