/** `dispole density`: the SVG map of the density change, its summary, and bad input. */
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
describe('dispole density', () => {
  test('writes a two-panel SVG map and a JSON summary; each negative end points to the partner', async () => {
    const { code, out, files } = await run(['density', 'Quelon', 'Virid', '--R', '6', '--svg', 'rho.svg', '--grid', '61', '--json', '--length', 'bohr', '--order', '3']);
    expect(code).toBe(0);
    const svg = files['rho.svg'] as string;
    // a vector map (no embedded raster), both centres named
    expect(svg).not.toMatch(/<image /);
    expect(svg.match(/<rect /g)!.length).toBeGreaterThan(50);
    expect(svg).toContain('centre A = Quelon');
    expect(svg).toContain('centre B = Virid');
    expect(svg).toMatch(/z − z<tspan[^>]*>A<\/tspan>/);
    const j = JSON.parse(out);
    expect(j.trusted).toBe(true);
    expectClose(j.R_bohr, 6, 1e-15);
    // A's Drude particle (charge −q) moves towards B at +z, so mu_A,z < 0 < mu_B,z (README, "Geometry and sign")
    expect(j.muA).toBeLessThan(0);
    expect(j.muB).toBeGreaterThan(0);
    expect(j.densityChange.a.gain.z).toBeGreaterThan(0);
    expect(j.densityChange.b.gain.z).toBeLessThan(0);
    // the isolated density at the centre is (m w/π)^(3/2) (Gaussian ground state; common practice)
    expectClose(j.densityChange.a.isolatedPeak, ((0.38 * 0.72) / Math.PI) ** 1.5, 1e-13);
  });
  test('the same R in ångström gives the same state; the text summary names the file', async () => {
    const bohr = JSON.parse((await run(['density', 'Quelon', 'Virid', '--R', '6', '--svg', 'a.svg', '--grid', '41', '--json', '--length', 'bohr', '--order', '3'])).out);
    const ang = await run(['density', 'Quelon', 'Virid', '--R', String(6 * 0.529177210903), '--length', 'angstrom', '--svg', 'b.svg', '--grid', '41', '--digits', '12', '--order', '3']);
    expect(ang.code).toBe(0);
    expect(ang.out).toMatch(/^Pair Quelon – Virid at R = 3\.1751 Å/);
    expect(ang.out).toMatch(/wrote b\.svg/);
    const mu = Number(/mu_A,z = (\S+) e a0/.exec(ang.out)![1]);
    expectClose(mu, bohr.muA, 1e-9);
    expect(ang.files['b.svg'] as string).toContain('Å');
  });
  test('a separation inside the polarisation catastrophe still draws, marked UNTRUSTED (exit 3)', async () => {
    const { code, out, files } = await run(['density', 'Quelon', 'Virid', '--R', '2.4', '--svg', 'c.svg', '--grid', '41', '--length', 'bohr', '--order', '3']);
    expect(code).toBe(3);
    expect(out).toMatch(/UNTRUSTED: .*polarisation-catastrophe distance/);
    expect(files['c.svg'] as string).toContain('UNTRUSTED');
  });
  test.each([
    [['--svg', 'x.svg'], /required option '--R <distance>' not specified/],
    [['--R', '6', '--pretty'], /--pretty: applies to JSON output only/],
    [['--R', '-1', '--svg', 'x.svg'], /--R <distance>' argument '-1' is invalid\. must be a finite number > 0/],
    [['--R', '6', '--svg', 'x.svg', '--grid', '7'], /--grid <n>' argument '7' is invalid\. must be an integer from 41 to 401/],
  ])('bad input %j: exit 2 with the option named, nothing printed, no file', async (extra, message) => {
    const { code, out, err, files } = await run(['density', 'Quelon', 'Virid', ...(extra as string[])]);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message as RegExp);
    expect(files['x.svg']).toBeUndefined();
  });
  test('an unknown species is refused with the list of known ones (exit 2)', async () => {
    const { code, err } = await run(['density', 'Nobody', 'Virid', '--R', '6', '--svg', 'x.svg']);
    expect(code).toBe(2);
    expect(err).toMatch(/Nobody: is not a known species; use a built-in name \(.*Quelon/);
  });

  test('--R beyond 1e6 bohr is refused with the limit in the unit asked for (1e308 Å overflowed to an infinite R in bohr)', async () => {
    const a = await run(['density', 'Quelon', 'Virid', '--R', '1e308']);
    expect(a.code).toBe(2);
    expect(a.out).toBe('');
    expect(a.err).toBe('dispole: error: --R: must be a distance > 0 and at most 529177 Å, got 1e+308 Å\n');
    const b = await run(['density', 'Quelon', 'Virid', '--R', '2e6', '--length', 'bohr']);
    expect(b.code).toBe(2);
    expect(b.err).toContain('--R: must be a distance > 0 and at most 1000000 bohr, got 2000000 bohr');
  });
});

describe('dispole density --units si', () => {
  // 1 e a0 = 2.541746473 D and 1 Eh = 3.1577502480407e5 K, from CODATA 2018 (Tiesinga, Mohr, Newell, Taylor,
  // Rev. Mod. Phys. 93, 025010 (2021)); the debye is 1e-21/c C m (common practice)
  const args = ['density', 'Quelon', 'Virid', '--R', '6', '--grid', '41', '--length', 'bohr', '--order', '3'];
  test('JSON: an si block with the dipoles in debye and E_int in --energy-unit; the atomic values unchanged', async () => {
    const atomic = JSON.parse((await run([...args, '--json'])).out);
    expect(atomic.si).toBeUndefined();
    const { code, out } = await run([...args, '--json', '--units', 'si', '--energy-unit', 'K']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.muA).toBe(atomic.muA);
    expect(j.si.units).toEqual({ dipole: 'debye', energy: 'K', constants: 'CODATA 2018' });
    expectClose(j.si.muA, atomic.muA * 2.541746473, 1e-9);
    expectClose(j.si.muB, atomic.muB * 2.541746473, 1e-9);
    expectClose(j.si.energy, atomic.energy * 3.1577502480407e5, 1e-12);
  });
  test('text, CSV and the figure say the SI values (default energy unit cm^-1)', async () => {
    const j = JSON.parse((await run([...args, '--json'])).out);
    const text = (await run([...args, '--units', 'si', '--digits', '8'])).out;
    const m = /SI \(CODATA 2018\): mu_A,z = (\S+) D, mu_B,z = (\S+) D, E_int = (\S+) cm\^-1/.exec(text);
    expect(m).not.toBeNull();
    expectClose(Number(m![1]), j.muA * 2.541746473, 1e-7);
    expectClose(Number(m![3]), j.energy * 219474.6313632, 1e-7); // CODATA 2018: 1 Eh = 219474.6313632 cm^-1
    const csv = (await run([...args, '--csv', '--units', 'si'])).out;
    expect(csv).toMatch(/^# SI \(CODATA 2018\): mu_A,z = \S+ D, mu_B,z = \S+ D, E_int = \S+ cm\^-1$/m);
    const { files } = await run([...args, '--units', 'si', '--energy-unit', 'meV', '--svg', 'si.svg']);
    expect(files['si.svg'] as string).toMatch(/interaction energy \S+ meV/);
    expect(files['si.svg'] as string).not.toMatch(/E<tspan[^>]*>h<\/tspan>\. Dotted/);
  });
});

describe('density says what the numbers rest on, as pair does', () => {
  test('He-qdo with Quelon: level per species and the MODEL warning in text, JSON and CSV', async () => {
    const args = ['density', 'He-qdo', 'Quelon', '--R', '8', '--grid', '41', '--order', '3'];
    const text = (await run(args)).out;
    expect(text).toMatch(/^Model accuracy \(physical; levels He-qdo: model, Quelon: exact\)/m);
    expect(text).toContain('warning: MODEL: He-qdo is a quantum Drude oscillator standing in for helium');
    const j = JSON.parse((await run([...args, '--json'])).out);
    expect(j.accuracy.level).toEqual({ a: 'model', b: 'exact' });
    expect(j.warnings.filter((w: string) => w.startsWith('MODEL:'))).toHaveLength(1);
    expect((await run([...args, '--csv'])).out).toMatch(/^# warning: MODEL: He-qdo/m);
    const exact = JSON.parse((await run(['density', 'Quelon', 'Virid', '--R', '8', '--grid', '41', '--order', '3', '--json'])).out);
    expect(exact.warnings.some((w: string) => w.startsWith('MODEL'))).toBe(false);
  });
});
