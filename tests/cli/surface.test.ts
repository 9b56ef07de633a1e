/** `dispole surface` and `dispole derive --surface` through the CLI (in-process, memoryIO). */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

describe('dispole surface --json contract', () => {
  test('hydrogen in front of a conductor: units, coefficients C3 = 1/4 and D4 = 99/16 (derived in tests/engines/surface.test.ts), routes, spread, trusted, warnings', async () => {
    const { code, out, err } = await run(['surface', 'H', '--surface', 'conductor', '--json']);
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out.trim().split('\n')).toHaveLength(1);
    const j = JSON.parse(out);
    expect(j.units).toBe('atomic');
    expectClose(j.coefficients.C3, 0.25, 1e-12); // <r²>/12, J. E. Lennard-Jones, Trans. Faraday Soc. 28, 333 (1932) (quoted from memory)
    expectClose(j.coefficients.D4, 99 / 16, 1e-9);
    expect(j.coefficients.D4vector).toBeUndefined();
    expect(j.routes.map((r: { name: string }) => r.name)).toEqual(['perturbation', 'response']);
    for (const r of j.routes) for (const k of ['C3', 'D4']) expect(typeof r[k]).toBe('number');
    expect(j.spread.max).toBeLessThan(1e-12);
    expect(j.trusted).toBe(true);
    expect(Array.isArray(j.warnings)).toBe(true);
    expect(j.geometry).toMatch(/z from the surface to the atom/);
  });
  test('a tilted anisotropic oscillator reports the D4 vector', async () => {
    const { code, out } = await run(['surface', 'drude:q=1.2,m=0.45,wx=0.8,wy=0.7,wz=0.55', '--surface', 'eps=4', '--normal', '1,0,1', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.coefficients.D4vector).toHaveLength(3);
    expect(j.routes).toHaveLength(3);
  });
  test('--units si adds J·m³, eV·Å³ and debye·Å⁴ values (CODATA 2018)', async () => {
    const j = JSON.parse((await run(['surface', 'Quelon', '--surface', 'conductor', '--json', '--units', 'si'])).out);
    expectClose(j.si.C3.Jm3, j.coefficients.C3 * 4.3597447222071e-18 * 0.529177210903e-10 ** 3, 1e-12);
    expectClose(j.si.C3.eVAngstrom3, j.coefficients.C3 * 27.211386245988 * 0.529177210903 ** 3, 1e-12);
    expectClose(j.si.D4.debyeAngstrom4, j.coefficients.D4 * 2.541746473 * 0.529177210903 ** 4, 1e-9);
  });
  test('spread has a C5 entry like C3: a number for two routes, 0 for one (no cross-check)', async () => {
    const j = JSON.parse((await run(['surface', 'Quelon', '--surface', 'conductor', '--json'])).out);
    expect(typeof j.spread.C5).toBe('number');
    expect(j.spread.C5).toBeLessThan(1e-8);
    const one = JSON.parse((await run(['surface', 'Quelon', '--surface', 'conductor', '--routes', 'response', '--json'])).out);
    expect(one.spread.C5).toBe(0);
    expect(one.spread.C3).toBe(0);
  });
  test('--digits governs every number of the text report (image factor of eps = 2 is 1/3, derived here)', async () => {
    const { code, out } = await run(['surface', 'H', '--surface', 'eps=2', '--digits', '4']);
    expect(code).toBe(0);
    expect(out).toContain('(eps−1)/(eps+1) = 0.3333)');
    expect(out).not.toMatch(/3333333/);
    expect(out).toMatch(/^perturbation +0\.08333 /m); // C3 = (1/3)·(1/4) for hydrogen (Lennard-Jones 1932, quoted from memory)
  });
  test('the text report states the sign convention and the routes agree', async () => {
    const { code, out } = await run(['surface', 'Quelon', '--surface', 'conductor']);
    expect(code).toBe(0);
    expect(out).toMatch(/D4 > 0: dipole points away from the surface/);
    expect(out).toMatch(/All routes agree/);
  });
  test('a table file of eps(iu) is read and used by the response route', async () => {
    const rows = Array.from({ length: 12 }, (_, k) => 0.02 * 1.6 ** k).map((u) => `${u}, ${1 + 0.25 / (0.09 + u * u)}`);
    const { code, out } = await run(['surface', 'H', '--surface', 'table:eps.csv', '--json'], { 'eps.csv': ['# invented dielectric', 'u [Eh], eps', ...rows].join('\n') });
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.warnings).toContain('only one route could run: no cross-check');
    expect(j.routes.map((r: { name: string }) => r.name)).toEqual(['response']);
    expect(j.coefficients.C3).toBeGreaterThan(0);
    expect(j.coefficients.C3).toBeLessThan(0.25);
  });
  test('an ion (tdhf:Z=11,charge=1) is warned: its image-charge energy and image-field dipole are not included', async () => {
    const { code, out } = await run(['surface', 'tdhf:Z=11,charge=1,basis=12', '--surface', 'conductor', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    // classical image of a point charge, −q²/(4Z) (J. D. Jackson, Classical Electrodynamics, 3rd ed. 1999, §2.1)
    expect(j.warnings.join('\n')).toMatch(/is an ion \(charge \+1\): only the dispersion parts \(C3, C5, D4\) are given; the image-charge energy −q²\/\(4Z\)/);
  });
  test('--exact adds the finite-Z curve of a QDO', async () => {
    const { code, out } = await run(['surface', 'Quelon', '--surface', 'conductor', '--exact', '--points', '3', '--length', 'bohr', '--from', '8', '--to', '16', '--total-quanta', '14', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.curve.points).toHaveLength(3);
    const last = j.curve.points[2];
    expectClose(last.muNormal, last.asymptotic.muNormal, 2e-3);
  });
});

describe('dispole surface bad input: exit 2, field named, nothing on stdout', () => {
  const cases: Array<[string, string[], Record<string, string>, RegExp]> = [
    ['eps below 1', ['surface', 'H', '--surface', 'eps=0.5'], {}, /--surface\.eps/],
    ['eps(iu) < 1 in a table', ['surface', 'H', '--surface', 'table:t.csv'], { 't.csv': 'u [Eh], eps\n0, 2\n0.1, 1.5\n0.2, 0.8\n0.3, 1.1\n' }, /t\.csv:4:2/],
    ['unsorted table', ['surface', 'H', '--surface', 'table:t.csv'], { 't.csv': 'u [Eh], eps\n0, 2\n0.2, 1.5\n0.1, 1.3\n0.3, 1.1\n' }, /t\.csv:4:1.*increase strictly/],
    ['non-positive distance', ['surface', 'Quelon', '--surface', 'conductor', '--exact', '--from', '-2'], {}, /--from/],
    ['--to below --from', ['surface', 'Quelon', '--surface', 'conductor', '--exact', '--from', '5', '--to', '3'], {}, /--to/],
    ['zero normal', ['surface', 'H', '--surface', 'conductor', '--normal', '0,0,0'], {}, /--normal/],
    ['exact for a frequency-dependent surface', ['surface', 'Quelon', '--surface', 'drude:wp=0.5,gamma=0.01', '--exact'], {}, /--exact/],
    ['a plasma frequency beyond 1e6 Eh', ['surface', 'H', '--surface', 'drude:wp=1e308,gamma=0'], {}, /--surface\.drude\.wp: .*1000000/],
    ['a damping beyond 1e6 Eh', ['surface', 'H', '--surface', 'drude-lorentz:wp=0.5,w0=0.3,gamma=1e9'], {}, /--surface\.drude-lorentz\[0\]\.gamma/],
    ['--from beyond the upper limit, in the user’s unit', ['surface', 'Quelon', '--surface', 'conductor', '--exact', '--from', '1e308'], {}, /^(?!.*Infinity)(?!.*--to).*--from: .*at most 529177 Å/],
    ['--to beyond the upper limit (bohr)', ['surface', 'Quelon', '--surface', 'conductor', '--exact', '--bohr', '--from', '5', '--to', '2e6'], {}, /--to: .*at most 1e\+06 bohr|--to: .*at most 1000000 bohr/],
    ['curve: --from beyond the upper limit (shared check)', ['curve', 'Quelon', 'Quelon', '--from', '1e308'], {}, /^(?!.*Infinity).*--from: .*at most 529177 Å/],
    ['--from without --exact', ['surface', 'Quelon', '--surface', 'conductor', '--from', '3'], {}, /--from: applies with --exact only/],
    ['--points without --exact', ['surface', 'Quelon', '--surface', 'conductor', '--points', '4'], {}, /--points: applies with --exact only/],
  ];
  for (const [name, argv, files, field] of cases) {
    test(name, async () => {
      const { code, out, err } = await run(argv, files);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err).toMatch(field);
    });
  }
});

describe('dispole derive --surface', () => {
  test('prints the QDO closed forms C3, C5, D4', async () => {
    const { code, out } = await run(['derive', '--surface']);
    expect(code).toBe(0);
    expect(out).toContain('C3 = q^2/(8*m*w)');
    expect(out).toContain('C5 = 3*q^2/(16*m^2*w^2)');
    expect(out).toContain('D4 = 3*q^3/(8*m^2*w^3)');
  });
  test('--json and --anisotropic', async () => {
    const j = JSON.parse((await run(['derive', '--surface', '--anisotropic', 'D4', '--json'])).out);
    expect(j.quantities).toHaveLength(1);
    expect(j.quantities[0].text).toBe('3*q^3/(64*m^2*wz^2)*(1/wx + 1/wy + 6/wz)');
  });
  test('an unknown surface quantity is bad input', async () => {
    const { code, err } = await run(['derive', '--surface', 'C6']);
    expect(code).toBe(2);
    expect(err).toMatch(/quantities/);
  });
});

describe('dispole table --surface (the surface column set)', () => {
  test('one row per species, each equal to `dispole surface` for that species', async () => {
    const t = JSON.parse((await run(['table', 'Quelon', 'H', '--surface', 'conductor', '--json'])).out);
    expect(t.kind).toBe('surface-table');
    expect(t.rows.map((r: { species: { name: string } }) => r.species.name)).toEqual(['Quelon', 'H']);
    const single = JSON.parse((await run(['surface', 'H', '--surface', 'conductor', '--json'])).out);
    expect(t.rows[1].coefficients).toEqual(single.coefficients);
    expectClose(t.rows[1].coefficients.C3, 0.25, 1e-12); // <r²>/12 of hydrogen 1s (Lennard-Jones 1932, quoted from memory)
  });
  test('text and CSV carry C3, C5, D4 with units and the status', async () => {
    const text = (await run(['table', 'Quelon', 'Virid', '--surface', 'eps=3'])).out;
    expect(text).toMatch(/C3 \(Eh a0\^3\).*C5 \(Eh a0\^5\).*D4 \(e a0\^5\)/);
    expect(text).toMatch(/Quelon .* ok/);
    const csv = (await run(['table', 'Quelon', '--surface', 'eps=3', '--csv', '--units', 'si'])).out;
    expect(csv).toMatch(/C3 \(eV Å\^3\)/);
  });
  test('--latex writes the booktabs float (structure checked in tests/report/table.test.ts), also by the .tex extension', async () => {
    const { code, out } = await run(['table', 'H', '--surface', 'conductor', '--latex']);
    expect(code).toBe(0);
    expect(out).toContain('\\begin{tabular}{lrrrrc}');
    expect(out).toMatch(/^ {4}H & \$0\.2500000\$ & /m); // C3 = 1/4 (Lennard-Jones 1932, quoted from memory)
    const io = memoryIO({});
    expect(await runCli(['table', 'H', '--surface', 'conductor', '--out', 't.tex', '--quiet'], io)).toBe(0);
    expect(io.files['t.tex']).toBe(out);
  });
  test('a "levels:" line states what C3/C5 and D4 rest on, per species (text, CSV comment, JSON)', async () => {
    const text = (await run(['table', 'H', 'Quelon', '--surface', 'conductor'])).out;
    expect(text).toMatch(/^levels: C3, C5: .*; D4: .*; species: H exact, Quelon /m);
    const csv = (await run(['table', 'H', '--surface', 'conductor', '--csv'])).out;
    expect(csv).toMatch(/^# levels: C3, C5: exact; D4: exact; species: H exact /m);
    expect(JSON.parse((await run(['table', 'H', '--surface', 'conductor', '--json'])).out).levels).toMatch(/^C3, C5: exact; D4: exact/);
  });
  test('--pairs cannot be combined with --surface', async () => {
    const { code, out, err } = await run(['table', 'Quelon', 'Virid', '--surface', 'conductor', '--pairs', 'Quelon-Virid']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(/--pairs/);
  });
});
