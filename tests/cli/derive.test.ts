/** `dispole derive`: closed forms as text, LaTeX and JSON; exit codes and messages for bad input. */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';

async function run(argv: string[]) {
  const io = memoryIO();
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

describe('dispole derive', () => {
  test('default: C6, C8, D7.a, D7.b, D7.total as pasteable lines after a commented header', async () => {
    const { code, out, err } = await run(['derive']);
    expect(code).toBe(0);
    expect(err).toBe('');
    const lines = out.trim().split('\n');
    expect(lines.filter((l) => l.startsWith('#'))).toHaveLength(2);
    expect(lines.filter((l) => !l.startsWith('#')).map((l) => l.split(' = ')[0])).toEqual(['C6', 'C8', 'D7.a', 'D7.b', 'D7.total']);
    // London C6 (Z. Phys. Chem. B 11, 222 (1930)) and D7.a (derived here) in q, m, w
    expect(lines).toContain('C6 = 3*qa^2*qb^2/(2*ma*mb*wa*wb*(wa + wb))');
    expect(lines).toContain('D7.a = -9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))');
  });

  test('--latex --identical --in alpha prints London’s (3/4) alpha² w', async () => {
    const { code, out } = await run(['derive', 'C6,D7.a', '--latex', '--identical', '--in', 'alpha']);
    expect(code).toBe(0);
    const eqs = out.trim().split('\n').filter((l) => !l.startsWith('%'));
    expect(eqs).toEqual(['C_6 = \\frac{3 \\alpha^2 \\omega}{4}', 'D_{7}^{(a)} = -\\frac{9 \\alpha^3 \\omega}{2 q}']);
  });

  test('--json: one object with symbols and text/LaTeX per quantity', async () => {
    const { code, out } = await run(['derive', 'D7.a', 'mu.a', '--json']);
    expect(code).toBe(0);
    expect(out.trim().split('\n')).toHaveLength(1);
    const j = JSON.parse(out);
    expect(j.units).toBe('atomic');
    expect(j.variables).toBe('mass');
    expect(j.layout).toEqual({ species: 'two', frequencies: 'isotropic' });
    expect(j.symbols.map((s: { name: string }) => s.name)).toEqual(['qa', 'qb', 'ma', 'mb', 'wa', 'wb', 'R']);
    expect(j.quantities.map((q: { name: string }) => q.name)).toEqual(['D7.a', 'mu.a']);
    expect(j.quantities[1].text).toBe('-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*R^7*(wa + wb))');
    expect(j.quantities[0].units).toBe('e a0^8');
  });

  test('--anisotropic: default list without C8; C8 asked for is refused (exit 2, nothing on stdout)', async () => {
    const ok = await run(['derive', '--anisotropic']);
    expect(ok.code).toBe(0);
    expect(ok.out.split('\n').filter((l) => /^[A-Z]/.test(l)).map((l) => l.split(' = ')[0])).toEqual(['C6', 'D7.a', 'D7.b', 'D7.total']);
    const bad = await run(['derive', 'C8', '--anisotropic']);
    expect(bad.code).toBe(2);
    expect(bad.out).toBe('');
    expect(bad.err).toBe(
      'dispole: error: quantities: C8 is derived for isotropic species only; anisotropic species give C6, D7.a, D7.b, D7.total and mu.*\n',
    );
  });

  test('unknown quantity and unknown --in value: exit 2 with the allowed values', async () => {
    const q = await run(['derive', 'C9']);
    expect(q.code).toBe(2);
    expect(q.out).toBe('');
    expect(q.err).toBe('dispole: error: quantities: unknown quantity "C9"; known: C6, C8, C10, D7.a, D7.b, D7.total, D9.a, D9.b, D9.total, mu.a, mu.b, mu.total\n');
    const v = await run(['derive', '--in', 'beta']);
    expect(v.code).toBe(2);
    expect(v.err).toContain('must be one of mass, alpha, got "beta"');
    const a = await run(['derive', '--in', 'alpha', '--anisotropic']);
    expect(a.code).toBe(2);
    expect(a.err).toContain('variables: the alpha form needs isotropic species');
  });
});

describe('dispole derive --surface refuses options without meaning there (exit 2, option named, nothing on stdout)', () => {
  for (const [argv, field] of [
    [['derive', '--surface', '--in', 'alpha'], /--in/],
    [['derive', '--surface', 'C3', '--identical'], /--identical/],
  ] as const) {
    test(argv.join(' '), async () => {
      const { code, out, err } = await run([...argv]);
      expect(code).toBe(2);
      expect(out).toBe('');
      expect(err).toMatch(field);
    });
  }
  test('--in mass stays allowed: C3 = q²/(8 m w) (derived here, tests/engines/surface.test.ts)', async () => {
    const { code, out } = await run(['derive', '--surface', 'C3', '--in', 'mass']);
    expect(code).toBe(0);
    expect(out).toContain('C3 = q^2/(8*m*w)');
  });
});
