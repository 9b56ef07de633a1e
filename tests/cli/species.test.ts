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
  test('--csv: one RFC 4180 row per species in the order of --json, levels on "#" lines; awkward names and sources quoted', async () => {
    const yaml = 'species:\n  "Odd, \\"one\\"":\n    kind: drude\n    q: 1\n    m: 1\n    w: 1\n    source: "invented test data,\\nsecond line"\n';
    const io = memoryIO({ 'x.yaml': yaml });
    expect(await runCli(['species', '--csv', '--species', 'x.yaml'], io)).toBe(0);
    const lines = io.out.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^# dispole \S+: the species every command accepts by name/);
    expect(lines[1]).toMatch(/^# levels: exact = /);
    expect(lines[2]).toBe('name,kind,level,definition_atomic_units,source');
    expect(lines[3]).toBe('"Odd, ""one""",drude,exact,drude q=1 m=1 w=1,"invented test data, second line"');
    const json = memoryIO({ 'x.yaml': yaml });
    await runCli(['species', '--json', '--species', 'x.yaml'], json);
    const list = JSON.parse(json.out) as Array<{ name: string; accuracy: { level: string } }>;
    const rows = lines.slice(3);
    expect(rows).toHaveLength(list.length);
    // hydrogen is an exact one-electron atom (non-relativistic, infinite nuclear mass: common practice)
    expect(rows.find((r) => r.startsWith('H,'))).toMatch(/^H,hydrogenic,exact,/);
    rows.slice(1).forEach((r, i) => expect(r.startsWith(`${list[i + 1].name},`)).toBe(true));
    expect(rows.slice(1).map((r) => /,(exact|first-principles|rescaled|model),/.exec(r)![1])).toEqual(list.slice(1).map((s) => s.accuracy.level));
  });
  test('--out species.csv chooses CSV by the extension; --pretty indents the JSON', async () => {
    const io = memoryIO();
    expect(await runCli(['species', '--out', 'species.csv', '--quiet'], io)).toBe(0);
    expect(io.out).toBe('');
    expect((io.files['species.csv'] as string).split('\n')[2]).toBe('name,kind,level,definition_atomic_units,source');
    const pretty = memoryIO();
    expect(await runCli(['species', '--json', '--pretty'], pretty)).toBe(0);
    expect(pretty.out.split('\n')[1]).toMatch(/^ {2}\{$/);
  });
});
