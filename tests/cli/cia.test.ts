/** `dispole cia`: the JSON contract, text/CSV/SVG outputs, bad input (exit 2, field named) and unconverged sums (exit 3). */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[], files: Record<string, string> = {}) {
  const io = memoryIO(files);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

// Quelon and Virid are the invented demo species; the masses, potential and dipole parameters are invented too.
const BASE = ['cia', 'Quelon', 'Virid', '--masses', '1,1', '--potential', 'tt:A=60,b=1.75', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--fast'];

describe('dispole cia', () => {
  test('--json: the contract (units "atomic", temperatures with T, classical, quantum, wignerKirkwood, gamma1, alpha1)', async () => {
    const { code, out, err } = await run([...BASE, '--temperature', '100', '--temperature', '200', '--json']);
    expect(err).toBe('');
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.units).toBe('atomic');
    expect(j.unitsDetail.M0).toBe('e^2 a0^5');
    expect(j.temperatures.map((t: { T: number }) => t.T)).toEqual([100, 200]);
    for (const t of j.temperatures) {
      for (const k of ['M0', 'M1', 'M2']) expect(Number.isFinite(t.classical[k])).toBe(true);
      for (const k of ['M0', 'M1']) expect(Number.isFinite(t.quantum[k])).toBe(true);
      expect(Number.isFinite(t.wignerKirkwood.M0)).toBe(true);
      expect(t.gamma1).toBeGreaterThan(0);
      expect(t.alpha1).toBeGreaterThan(0);
      expectClose(t.M0, t.quantum.M0, 0);
    }
    expect(j.dipole.convention).toMatch(/A at the origin and B at \+R on z/);
    // C6, C8, C10 and D7 are the pair's own from the reference route
    expect(j.potential.basis).toMatch(/from dispole's reference route \(perturbation\) for Quelon–Virid/);
    expect(j.dipole.basis).toMatch(/D7 from dispole's reference route/);
    expect(j.trusted).toBe(true);
  });
  test('text report: units, both routes and their difference, the sign convention', async () => {
    const { code, out } = await run([...BASE, '--temperature', '150']);
    expect(code).toBe(0);
    expect(out).toMatch(/Units: M0 e²·a0\^5, M1 e²·a0\^5·Eh\/ħ, M2 e²·a0\^5·\(Eh\/ħ\)²/);
    expect(out).toMatch(/M0 quantum\s+M0 classical\s+M0 W–K\s+Δ cl\s+Δ W–K/);
    expect(out).toMatch(/sign convention: mu\(R\) along \+z/);
    expect(out).toMatch(/All numbers converged\./);
  });
  test('the header shows the pair\'s C6…C10, D7 and D9 to --digits in text; JSON keeps them at full precision', async () => {
    const text = (await run([...BASE, '--temperature', '150', '--digits', '4'])).out;
    const json = JSON.parse((await run([...BASE, '--temperature', '150', '--json'])).out);
    const C6 = Number(/C6 = ([-\d.e+]+)/.exec(json.potential.label)![1]);
    expect(String(C6).replace(/[-.]/g, '').length).toBeGreaterThan(8); // computed, not a short input
    const shown = /C6 = ([-\d.e+]+),/.exec(text)![1];
    expect(shown.replace(/[-.]/g, '').replace(/^0+/, '').length).toBeLessThanOrEqual(4);
    expectClose(Number(shown), C6, 5e-4);
    expect(/D7 = ([-\d.e+]+)/.exec(text)![1].replace(/[-.]/g, '').length).toBeLessThanOrEqual(4);
    expect(text).toMatch(/A = 60 Eh, b = 1\.75 1\/bohr/); // the user's own numbers as given
  });
  test('--spectrum with --csv and --svg: spectrum rows, a figure, the progress bar stays off without a terminal', async () => {
    const { code, out, err, files } = await run([...BASE, '--temperature', '100', '--spectrum', '0:3000:100', '--csv', '--svg', 'cia.svg']);
    expect(code).toBe(0);
    const lines = out.trim().split('\n').filter((l) => !l.startsWith('#'));
    expect(lines[0]).toBe('T_K,wavenumber_cm-1,absorption_cm-1_amagat-2,S_e2a0^5_per_Eh,free_free,bound_free,bound_bound');
    expect(lines).toHaveLength(32);
    expect(String(files['cia.svg'])).toMatch(/<svg[\s\S]*absorption spectrum[\s\S]*<\/svg>\s*$/);
    expect(err).toBe('dispole: wrote the figure to cia.svg\n');
  });
  test('hfd:He-He and a tabulated dipole in debye and ångström are accepted', async () => {
    const table = ['# R/Å  mu/D (invented)', ...Array.from({ length: 60 }, (_, i) => { const R = 1.5 + 0.1 * i; return `${R} ${(0.02 * Math.exp(-(R - 2.5) / 0.35)).toExponential(6)}`; })].join('\n');
    const { code, out, err } = await run(['cia', 'He', 'Ar', '--potential', 'hfd:He-He', '--dipole', 'table:mu.txt,R=angstrom,mu=debye', '--temperature', '50', '--fast', '--json'], { 'mu.txt': table });
    expect(code).toBe(0);
    // the He–He set used for He–Ar is allowed, but said
    expect(err).toBe('dispole: warning: --potential hfd:He-He is the published He–He potential, used here for the pair He–Ar\n');
    const j = JSON.parse(out);
    expect(j.potential.basis).toMatch(/Aziz, F\. R\. W\. McCourt, C\. C\. K\. Wong, Mol\. Phys\. 61, 1487 \(1987\)/);
    expect(j.pair.massSource).toMatch(/CIAAW/);
  });
});

describe('dispole cia: where the semiclassical expansion fails', () => {
  // invented He–Ar-like Born–Mayer part; at 1 K bound pairs dominate and the ħ² series is meaningless (common practice:
  // the Wigner–Kirkwood expansion is an expansion in ħ²/(m kT σ²), E. Wigner, Phys. Rev. 40, 749 (1932), quoted from memory)
  test('at 1 K the Wigner–Kirkwood moments are far from the quantum ones and a warning says the expansion does not hold', async () => {
    const { code, out } = await run(['cia', 'He', 'Ar', '--potential', 'tt:A=40,b=1.9', '--dipole', 'exp:mu0=5e-3,R0=6,rho=0.6', '--temperature', '1', '--fast', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(Math.abs(j.temperatures[0].wignerKirkwood.M0 / j.temperatures[0].quantum.M0 - 1)).toBeGreaterThan(0.1);
    expect(j.warnings.join('\n')).toMatch(/at 1 K the Wigner–Kirkwood moments differ from the quantum ones by .*: the semiclassical ħ² expansion does not hold there/);
  });
});

describe('dispole cia: bad input → exit 2 naming the field, nothing on stdout', () => {
  const bad = async (argv: string[], field: RegExp, files: Record<string, string> = {}) => {
    const { code, out, err } = await run(argv, files);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(field);
  };
  test('negative or zero temperature', async () => {
    await bad([...BASE, '--temperature=-5'], /--temperature: must be from 1 K to 20000 K, got -5/);
    await bad([...BASE, '--temperature', '0'], /--temperature: must be from 1 K to 20000 K, got 0/);
    // outside the range the quantum sums are built for (a reviewer's 0.1 K gave M0 ~ 1e37, 1e308 K a crash)
    await bad([...BASE, '--temperature', '0.1'], /--temperature: must be from 1 K to 20000 K, got 0\.1/);
    await bad([...BASE, '--temperature', '1e308'], /--temperature: must be from 1 K to 20000 K, got 1e\+308/);
    await bad(['cia', 'Quelon', 'Virid', '--masses', '1e308,1', '--potential', 'tt:A=60,b=1.75', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /--masses: MA must be a mass from 0\.001 u to 10000 u, got "1e308"/);
    // a like pair has no induced dipole by symmetry
    await bad(['cia', 'Quelon', 'Quelon', '--masses', '1,1', '--potential', 'tt:A=60,b=1.75', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /B: Quelon is the same species as A: a like pair has no induced dipole by symmetry/);
    await bad(['cia', 'Quelon', 'drude:q=1.1,m=0.38,w=0.72', '--masses', '1,1', '--potential', 'tt:A=60,b=1.75', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /is the same species as A/);
  });
  test('a negative Born–Mayer repulsion', async () => {
    await bad(['cia', 'Quelon', 'Virid', '--masses', '1,1', '--potential', 'tt:A=-4,b=1.9', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /--potential\.A: the Born–Mayer repulsion must be > 0/);
  });
  test('a potential file with a non-increasing grid', async () => {
    await bad([...BASE.slice(0, 5), '--potential', 'table:v.txt', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /v\.txt:4: the R grid must increase strictly/, { 'v.txt': '4 1\n5 -0.001\n7 -1e-4\n6 -2e-5\n8 -1e-5\n' });
  });
  test('a dipole table that does not cover the range', async () => {
    await bad([...BASE.slice(0, 7), '--dipole', 'table:mu.txt', '--temperature', '100'], /mu\.txt: the dipole table does not cover the range/, { 'mu.txt': '6 1e-3\n7 5e-4\n8 2e-4\n9 1e-4\n' });
  });
  test('frequencies outside the computed range', async () => {
    await bad([...BASE, '--temperature', '100', '--spectrum', '0:90000:10'], /--spectrum: the range must satisfy 0 ≤ FROM < TO ≤ /);
    await bad([...BASE, '--temperature', '100', '--spectrum', '-50:100:10'], /--spectrum/);
  });
  test('masses missing for species without a standard mass', async () => {
    await bad(['cia', 'Quelon', 'Virid', '--potential', 'tt:A=40,b=1.9', '--dipole', 'exp:mu0=5e-3,R0=5,rho=1', '--temperature', '100'], /--masses: required: Quelon, Virid has no built-in standard mass/);
  });
});

test('dispole cia: a partial-wave sum cut before convergence is flagged UNCONVERGED with exit 3', async () => {
  const { code, out, err } = await run([...BASE, '--temperature', '100', '--max-partial-waves', '3']);
  expect(code).toBe(3);
  expect(out).toMatch(/UNCONVERGED/);
  expect(out).toMatch(/UNTRUSTED/);
  expect(err).toMatch(/partial-wave sum did not converge by l = 3/);
});
