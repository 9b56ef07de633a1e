/**
 * `dispole check`: exit 0 identical, 1 differs, 2 bad input. Reference formulas: London C6 (F. London,
 * Z. Phys. Chem. B 11, 222 (1930)) and D7.a of two QDOs (derived here; checked against both numeric routes in
 * tests/engines/symbolic-derive.test.ts).
 */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { EXIT, runCli } from '../../src/cli/program.js';

async function run(argv: string[]) {
  const io = memoryIO();
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

const D7A = '-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))';

describe('dispole check', () => {
  test('identical: exit 0, a formula starting with "-" is read as the formula', async () => {
    const { code, out, err } = await run(['check', D7A, '--for', 'D7.a']);
    expect(code).toBe(EXIT.ok);
    expect(err).toBe('');
    expect(out.split('\n')[0]).toBe('D7.a: identical');
    expect(out).toContain("symbolic  your formula minus the engine's reduces to zero exactly");
    expect(out).toContain('numeric   largest relative deviation 0 over 24 random points (exact rational arithmetic, seed 1)');
  });

  test('differs: exit 1 with the hint and sample values', async () => {
    const { code, out, err } = await run(['check', '3*alphaa*alphab*wa*wb/(wa+wb)', '--for', 'C6', '--points', '8']);
    expect(code).toBe(EXIT.differs);
    expect(err).toBe('');
    expect(out.split('\n')[0]).toBe('C6: DIFFERS');
    expect(out).toContain("hint      yours = 2 × the engine's C6: a factor 2 too large");
    expect(out).toMatch(/qa\s+ma\s+wa\s+qb\s+mb\s+wb\s+alphaa\s+alphab\s+yours\s+engine/);
  });

  test('--json and --identical: the verdict object', async () => {
    const { code, out } = await run(['check', '3/4*alpha^2*w', '--for', 'C6', '--identical', '--json']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.verdict).toBe('identical');
    expect(j.symbolic.status).toBe('identical');
    expect(j.numeric).toMatchObject({ points: 24, seed: 1, exact: true, maxDeviation: 0, measure: 'relative' });
    expect(j.engine).toEqual({ text: '3*alpha^2*w/4', latex: '\\frac{3 \\alpha^2 \\omega}{4}', variables: 'alpha' });
    expect(j.hint).toBeNull();
  });

  test('every closed form derive prints passes check (round trip)', async () => {
    const derived = (await run(['derive', 'C6', 'C8', 'C10', 'D7.a', 'D7.b', 'D7.total', 'mu.b'])).out;
    const lines = derived.split('\n').filter((l) => l.includes(' = ') && !l.startsWith('#'));
    expect(lines).toHaveLength(7);
    for (const line of lines) {
      const [name, formula] = line.split(' = ');
      const r = await run(['check', formula, '--for', name, '--points', '4']);
      expect(r.code, line).toBe(0);
    }
  });

  test('anisotropic identical species: derive output passes check, a changed weight does not', async () => {
    const lines = (await run(['derive', '--anisotropic', '--identical'])).out.split('\n').filter((l) => l.includes(' = ') && !l.startsWith('#'));
    // in the isotropic limit C6 = (q⁴/(8m²))(1 + 1 + 4)/w³ = (3/4) q⁴/(m² w³), London's (3/4) alpha² w
    expect(lines[0]).toBe('C6 = q^4/(8*m^2)*(1/wx^3 + 1/wy^3 + 4/wz^3)');
    for (const line of lines) {
      const [name, formula] = line.split(' = ');
      expect((await run(['check', formula, '--for', name, '--anisotropic', '--identical', '--points', '4'])).code, line).toBe(0);
    }
    const wrong = await run(['check', 'q^4/(8*m^2)*(1/wx^3 + 1/wy^3 + 2/wz^3)', '--for', 'C6', '--anisotropic', '--identical']);
    expect(wrong.code).toBe(1);
    expect(wrong.out).toContain('hint      yours / engine is neither a constant nor a power law; it changes with wx, wy, wz');
  });

  test('bad input: exit 2, nothing on stdout, the position of a parse error', async () => {
    const parse = await run(['check', '-9*qa^3/(ma', '--for', 'D7.a']);
    expect(parse.code).toBe(EXIT.badInput);
    expect(parse.out).toBe('');
    expect(parse.err).toBe('dispole: error: expression: cannot be read at character 12: Parenthesis ) expected\n  -9*qa^3/(ma\n             ^\n');
    const names = await run(['check', 'qa*x*y', '--for', 'C6']);
    expect(names.code).toBe(2);
    expect(names.err).toBe('dispole: error: expression: unknown variable names x, y; allowed: qa, ma, wa, qb, mb, wb, alphaa, alphab\n');
    const missing = await run(['check', 'qa']);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain("required option '--for <quantity>' not specified");
    const quantity = await run(['check', 'qa', '--for', 'E5']);
    expect(quantity.code).toBe(2);
    expect(quantity.err).toBe('dispole: error: --for: unknown quantity "E5"; known: C6, C8, C10, D7.a, D7.b, D7.total, D9.a, D9.b, D9.total, mu.a, mu.b, mu.total\n');
  });
});

describe('a like-pair formula checked as an unlike pair', () => {
  test('London C6 = (3/4) α² w written with A\'s names only differs, and the hint points to --identical', async () => {
    const io = memoryIO();
    // London, Z. Phys. Chem. B 11, 222 (1930): the like-pair C6 of two oscillators
    expect(await runCli(['check', '3/4*alphaa^2*wa', '--for', 'C6'], io)).toBe(1);
    expect(io.out).toMatch(/uses the parameters of one species only: for a like pair, check with --identical/);
    const io2 = memoryIO();
    expect(await runCli(['check', '3/4*alpha^2*w', '--for', 'C6', '--identical'], io2)).toBe(0);
  });
});
