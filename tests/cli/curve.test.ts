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
const BASE = ['curve', 'Quelon', 'Virid', '--from', '16', '--to', '40', '--points', '4', '--length', 'bohr'];

describe('dispole curve', () => {
  test('table: units in the header, asymptotic columns, basis size and status per point', async () => {
    const { code, out, err } = await run(BASE);
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out).toMatch(/^R \(bohr\)\s+mu_A \(e a0\)\s+series A\s+mu_B \(e a0\)\s+series B\s+mu_total\s+series\s+E_int \(Eh\)\s+series E\s+A ÷ser−1\s+B ÷ser−1\s+E ÷ser−1\s+N\s+dim\s+status$/m);
    // the default order (6 for isotropic pairs) completes every printed term: nothing flagged
    expect(out).toMatch(/through order 6/);
    expect(out).toMatch(/series: mu ≈ D7\/R\^7 \+ D9\/R\^9 \+ D10\/R\^10 \(complete through R\^-10\)/);
    expect(out).not.toMatch(/\*/);
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
    const c = j.coefficients;
    expectClose(far.asymptotic.muA, c.D7.a / 40 ** 7 + c.D9.a / 40 ** 9 + c.D10.a / 40 ** 10, 1e-14);
    expectClose(far.seriesResidual.muA, far.muA / far.asymptotic.muA - 1, 1e-12);
    // order 4 completes the series of an isotropic pair (V2·V4, V2·V5 vanish): nothing flagged
    expect(j.hamiltonian.incomplete).toMatchObject({ dipole: false, energy: false, dipoleVanishesBySymmetry: false });
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
    const { code, out } = await run(['curve', 'Quelon', 'Virid', '--from', '6', '--to', '12', '--points', '3', '--length', 'angstrom', '--csv', '--order', '3']);
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
    const { code, out } = await run(['curve', 'Quelon', 'Virid', '--from', '3.5', '--to', '8', '--points', '3', '--length', 'bohr', '--order', '3']);
    expect(code).toBe(3);
    expect(out).toMatch(/^3\.50* .*(UNTRUSTED|UNCONVERGED)$/m);
    expect(out).toMatch(/escape barrier of the (order-3 )?multipole potential/);
    expect(out).toMatch(/ ok$/m);
  });
  test('bad input: exit 2, the message names the option, nothing on stdout, no file', async () => {
    const cases: Array<[string[], RegExp]> = [
      [['curve', 'Quelon', 'Virid', '--from', '20', '--to', '10', '--svg', 'x.svg'], /--to: must be larger than --from \(20\), got 10/],
      [['curve', 'Quelon', 'Virid', '--points', '1'], /--points <n>' argument '1' is invalid\. must be an integer from 2 to 400/],
      [['curve', 'Quelon', 'Virid', '--csv', '--json'], /--csv: cannot be combined with --json/],
      [['curve', 'Quelon', 'Virid', '--length', 'furlong'], /must be one of angstrom, bohr, got "furlong"/],
      [['curve', 'drude:q=1,m=1,wx=0.8,wy=0.9,wz=1', 'Virid', '--svg', 'x.svg'], /^dispole: error: A: .* is not axially symmetric about the bond axis \(wx ≠ wy\)/m],
      [['curve', 'Quelon', 'Virid', '--order', '9'], /--order <n>' argument '9' is invalid\. must be an integer from 2 to 7/],
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


// The next terms of the series and the default Hamiltonian order (the two pairs of the issue: the invented demo
// species Quelon–Virid and two invented axial anisotropic QDOs).
const PROLATE = 'drude:q=1.2,m=0.5,wx=0.7,wy=0.7,wz=1.1';
const OBLATE = 'drude:q=0.8,m=0.4,wx=1.3,wy=1.3,wz=0.6';
type Point = { R_bohr: number; muA: number; muB: number; energy: number; asymptotic: { muA: number }; seriesResidual: { muA: number; muB: number } };
const json = async (argv: string[]) => {
  const r = await run([...argv, '--json', '--length', 'bohr']);
  expect(r.code, argv.join(' ')).toBe(0);
  return JSON.parse(r.out);
};
const dataRows = (out: string) => out.split('\n').filter((l) => /^\d/.test(l));

describe('dispole curve: series through D9 (and D10) and a default order that makes it right', () => {
  test('Quelon–Virid: the default output is the --order 6 output to the printed precision (R ≥ 10 bohr)', async () => {
    const grid = ['curve', 'Quelon', 'Virid', '--from', '10', '--to', '20', '--points', '3', '--length', 'bohr'];
    const def = await run(grid);
    const six = await run([...grid, '--order', '6']);
    expect(def.code).toBe(0);
    expect(dataRows(def.out)).toHaveLength(3);
    expect(dataRows(def.out)).toEqual(dataRows(six.out));
  });
  test('mu/(D7/R^7 + D9/R^9 + D10/R^10) − 1 falls as R^-4 (the residual as R^-11) within 10 % over a decade', async () => {
    const j = await json(['curve', 'Quelon', 'Virid', '--from', '20', '--to', '200', '--points', '4', '--basis-tol', '1e-12']);
    const pts: Point[] = j.points;
    const slope = (f: (p: Point) => number) => pts.slice(1).map((p, i) => Math.log(Math.abs(f(p) / f(pts[i]))) / Math.log(p.R_bohr / pts[i].R_bohr));
    for (const s of [...slope((p) => p.seriesResidual.muA), ...slope((p) => p.seriesResidual.muB)]) expect(Math.abs(s + 4) / 4).toBeLessThan(0.1);
    // without the third-order D10 the residual falls only as R^-3 (R^-10): the check can fail
    const c = j.coefficients;
    const noD10 = slope((p) => p.muA / (c.D7.a / p.R_bohr ** 7 + c.D9.a / p.R_bohr ** 9) - 1);
    expect(noD10.some((s) => Math.abs(s + 4) / 4 > 0.1)).toBe(true);
  });
  test('the ÷ser−1 cells show only the digits above the basis tolerance (the residual is known to about ±tolerance); JSON keeps all', async () => {
    const args = ['curve', 'Quelon', 'Virid', '--from', '10', '--to', '100', '--points', '4', '--basis-tol', '1e-8', '--length', 'bohr'];
    const text = (await run(args)).out;
    const pts: Point[] = (await json(args)).points;
    const rows = dataRows(text);
    expect(rows).toHaveLength(4);
    rows.forEach((row, i) => {
      const cell = row.trim().split(/\s+/)[9]; // the A ÷ser−1 column
      const x = pts[i].seriesResidual.muA;
      const digits = cell.replace(/e.*$/, '').replace(/[-.]/g, '').length;
      expect(digits).toBe(Math.max(1, Math.min(7, Math.floor(Math.log10(Math.abs(x) / 1e-8)) + 1)));
      expect(Math.abs(Number(cell) - x)).toBeLessThanOrEqual(Math.abs(x) * 10 ** (1 - digits));
    });
    expect(rows.some((row) => row.trim().split(/\s+/)[9].replace(/e.*$/, '').replace(/[-.]/g, '').length < 7)).toBe(true); // the far points lose digits
  });
  test('anisotropic pair: the default order 7 includes D8 (V7); --order 6 lacks exactly that first-order term', async () => {
    const args = ['curve', PROLATE, OBLATE, '--from', '30', '--to', '60', '--points', '2', '--basis-tol', '1e-12'];
    const def = await json(args);
    const six = await json([...args, '--order', '6']);
    expect(def.hamiltonian.multipoleOrder).toBe(7);
    expect(def.hamiltonian.incomplete.dipole).toBe(false);
    expect(six.hamiltonian.incomplete.missingTerms.dipole).toEqual(['D8']);
    expect(def.series.dipole).toBe('D4/R^4 + D6/R^6 + D7/R^7 + D8/R^8 + D9/R^9');
    expect(def.series.energy).toBe('E5/R^5 − C6/R^6 + E7/R^7 − C8/R^8');
    const D8 = def.coefficients.D8;
    def.points.forEach((p: Point, i: number) => {
      const q: Point = six.points[i];
      // (mu at order 7 − mu at order 6) R^8 → D8, with O(R^-2) corrections
      expectClose((p.muA - q.muA) * p.R_bohr ** 8, D8.a, 0.05);
      expectClose((p.muB - q.muB) * p.R_bohr ** 8, D8.b, 0.05);
      expect(Math.abs(p.seriesResidual.muA)).toBeLessThan(1e-3);
    });
  });
  test('--order 2 says the dipole vanishes by symmetry and flags the columns (text, JSON, SVG)', async () => {
    const { code, out, files } = await run(['curve', 'Quelon', 'Virid', '--from', '12', '--to', '24', '--points', '2', '--length', 'bohr', '--order', '2', '--svg', 'o2.svg']);
    expect(code).toBe(0);
    expect(out).toMatch(/both induced dipoles vanish identically by symmetry/);
    expect(out).toMatch(/mu_A \(e a0\)\*/);
    expect(out).toMatch(/^\* not right to the order of the printed series at multipole order 2/m);
    expect(files['o2.svg']).toMatch(/FLAGGED: at multipole order 2 the exact μ \(zero by symmetry\)/);
    const j = await json(['curve', 'Quelon', 'Virid', '--from', '12', '--to', '24', '--points', '2', '--order', '2']);
    expect(j.hamiltonian.incomplete.dipoleVanishesBySymmetry).toBe(true);
    for (const p of j.points) expect(p.muA).toBe(0);
  });
  test('warnings state only what is true: no C8 warning for isotropic QDOs at order 3, but D9 is flagged', async () => {
    const { out } = await run(['curve', 'Quelon', 'Virid', '--from', '12', '--to', '24', '--points', '2', '--length', 'bohr', '--order', '3']);
    expect(out).not.toMatch(/C8[^\n]*lacks|lacks[^\n]*C8/);
    expect(out).toMatch(/its dipole lacks \(part of\) D9 \(complete from order 4\)/);
    expect(out).not.toMatch(/its energy lacks/);
    // anisotropic centres at order 4: the energy lacks E7 (V6) and is flagged
    const an = await run(['curve', PROLATE, OBLATE, '--from', '20', '--to', '40', '--points', '2', '--length', 'bohr', '--order', '4']);
    expect(an.out).toMatch(/its energy lacks \(part of\) E7 \(complete from order 6\)/);
    expect(an.out).toMatch(/E_int \(Eh\)\*/);
  });
});

describe('curve energies in the units a spectroscopist uses (--units si --energy-unit)', () => {
  // 1 Eh in each unit, CODATA 2018 (E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, Rev. Mod. Phys. 93, 025010
  // (2021)): 219474.6313632 cm^-1, 3.1577502480407e5 K, 27.211386245988 eV, 2625.4996394799 kJ/mol
  const CODATA_2018 = { 'cm-1': 219474.6313632, K: 3.1577502480407e5, meV: 27211.386245988, 'kJ/mol': 2625.4996394799 } as const;
  const args = ['curve', 'Quelon', 'Virid', '--from', '16', '--to', '24', '--points', '2', '--length', 'bohr', '--order', '3'];
  test.each(Object.entries(CODATA_2018))('%s: JSON, CSV and text give E_int in that unit (factor %s per hartree)', async (unit, factor) => {
    const j = JSON.parse((await run([...args, '--json', '--units', 'si', '--energy-unit', unit])).out);
    expect(j.siUnits.energy).toBe(unit);
    expect(j.points[0].energy).toBeLessThan(0);
    for (const p of j.points) expectClose(p.si.energy, p.energy * factor, 1e-12);
    const csv = (await run([...args, '--csv', '--units', 'si', '--energy-unit', unit])).out;
    const [head, first] = csv.split('\n');
    const col = head.split(',').indexOf(`E_int_${unit.replace('/', '_per_')}`);
    expect(col).toBeGreaterThan(0);
    expectClose(Number(first.split(',')[col]), j.points[0].energy * factor, 1e-12);
    const text = (await run([...args, '--units', 'si', '--energy-unit', unit])).out;
    expect(text).toContain(`energies in ${unit === 'cm-1' ? 'cm^-1' : unit} (CODATA 2018)`);
  });
  test('--energy-unit without --units si changes nothing and is refused (exit 2, the option named, no output)', async () => {
    for (const cmd of [args, ['cluster', 'g.xyz'], ['density', 'Quelon', 'Virid', '--R', '6']]) {
      const { code, out, err } = await run([...cmd, '--energy-unit', 'K'], { 'g.xyz': '2\n\nQuelon 0 0 0\nVirid 0 0 4\n' });
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err).toMatch(/^dispole: error: --energy-unit: .*add --units si/);
    }
  });
});

describe('curve and density say what the numbers rest on, as pair does', () => {
  test('--help names the QDO stand-ins (He-qdo … Xe-qdo), not the response tables He … Xe', async () => {
    const { out } = await run(['curve', '--help']);
    expect(out.replace(/\s+/g, ' ')).toContain('for the atoms: H-qdo, He-qdo … Xe-qdo');
    expect(out).not.toMatch(/H-qdo, He …/);
  });
  test('curve He-qdo He-qdo: the MODEL warning and level of pair, in text and JSON', async () => {
    const args = ['curve', 'He-qdo', 'He-qdo', '--points', '2', '--order', '3'];
    const pairJson = JSON.parse((await run(['pair', 'He-qdo', 'He-qdo', '--json'])).out);
    const text = (await run(args)).out;
    expect(text).toMatch(/^Model accuracy \(physical; levels He-qdo: model, He-qdo: model\): He-qdo: MODEL/m);
    expect(text).toContain('warning: MODEL: He-qdo is a quantum Drude oscillator standing in for helium');
    const j = JSON.parse((await run([...args, '--json'])).out);
    expect(j.accuracy.level).toEqual({ a: 'model', b: 'model' });
    expect(j.accuracy.statement).toBe(pairJson.accuracy.statement);
    const model = (w: string[]) => w.filter((x) => x.startsWith('MODEL:'));
    expect(model(j.warnings)).toEqual(model(pairJson.warnings));
    expect(model(j.warnings)).toHaveLength(1);
  });
  test('curve Quelon Virid: exact levels and no MODEL warning', async () => {
    const j = JSON.parse((await run([...BASE, '--json', '--order', '3', '--points', '2'])).out);
    expect(j.accuracy.level).toEqual({ a: 'exact', b: 'exact' });
    expect(j.warnings.some((w: string) => w.startsWith('MODEL'))).toBe(false);
  });
});
