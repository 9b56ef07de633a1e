import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';

describe('dispole species', () => {
  test('lists the invented demo set with parameters and sources', async () => {
    const io = memoryIO();
    expect(await runCli(['species'], io)).toBe(0);
    expect(io.out).toMatch(/^Quelon\s+drude q=1\.1 m=0\.38 w=0\.72\s+invented/m);
    expect(io.out).toMatch(/^Spindlet\s+drude q=1\.2 m=0\.45 wx=0\.8,wy=0\.8,wz=0\.55/m);
    expect(io.out).toMatch(/Inline kinds: drude \(/);
  });
  test('--json gives an array with names and kinds; --species adds a file\'s entries first', async () => {
    const io = memoryIO({ 'x.yaml': 'species:\n  Brim:\n    kind: drude\n    q: 1\n    m: 1\n    w: 1\n' });
    expect(await runCli(['species', '--json', '--species', 'x.yaml'], io)).toBe(0);
    const list = JSON.parse(io.out);
    expect(list[0]).toMatchObject({ name: 'Brim', kind: 'drude', q: 1 });
    expect(list.map((s: { name: string }) => s.name)).toContain('Virid');
  });
});
