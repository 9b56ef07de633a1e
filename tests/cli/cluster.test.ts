import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { BOHR_IN_ANGSTROM, DIPOLE_AU_IN_DEBYE } from '../../src/model/units.js';
import { expectClose } from '../helpers/tolerance.js';

const RING = readFileSync(new URL('../../worked-examples/cluster-tessaly-ring.xyz', import.meta.url), 'utf8');
const WEDGE = readFileSync(new URL('../../worked-examples/cluster-tessaly-wedge.xyz', import.meta.url), 'utf8');

async function run(argv: string[], files: Record<string, string> = {}, tty = false) {
  const io = memoryIO(files);
  io.stderrIsTTY = tty;
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

describe('dispole cluster --json contract', () => {
  test('one object with units, energy, dipole and per-centre position (bohr), dipole, C6 and alpha', async () => {
    const { code, out, err } = await run(['cluster', 'ring.xyz', '--json'], { 'ring.xyz': RING });
    expect(code).toBe(0);
    expect(err).toBe('');
    expect(out.trim().split('\n')).toHaveLength(1);
    const j = JSON.parse(out);
    expect(j.units).toBe('atomic');
    expect(typeof j.energy.manyBody).toBe('number');
    expect(typeof j.energy.pairwise).toBe('number');
    expect(j.energy.manyBody).toBeLessThan(0);
    expect(j.dipole).toHaveLength(3);
    expect(j.centres).toHaveLength(7);
    for (const c of j.centres) {
      expect(typeof c.label).toBe('string');
      expect(c.position).toHaveLength(3);
      expect(c.dipole).toHaveLength(3);
      // names of our own: in cluster (screened) and isolated
      for (const k of ['C6InCluster', 'C6Isolated', 'alphaInCluster', 'alphaIsolated']) expect(typeof c[k]).toBe('number');
      expect(c.alpha).toBeUndefined();
      expect(c.C6Free).toBeUndefined();
      for (let a = 0; a < 3; a++) expectClose(c.dipoleDebye[a], c.dipole[a] * DIPOLE_AU_IN_DEBYE, 1e-15, 1e-300);
    }
    expectClose(j.centres[1].position[0], 3.8 / BOHR_IN_ANGSTROM, 1e-15);
    // the ring is centrosymmetric: no total dipole
    const typical = Math.hypot(...j.centres[1].dipole);
    for (const x of j.dipole) expectClose(x, 0, 0, 1e-10 * typical);
  });
  test('--bohr reads the coordinates as bohr', async () => {
    const { code, out } = await run(['cluster', 'ring.xyz', '--json', '--bohr'], { 'ring.xyz': RING.replace(/3\.800/g, '7.2').replace(/1\.900/g, '3.6').replace(/3\.291/g, '6.235') });
    expect(code).toBe(0);
    expect(JSON.parse(out).centres[1].position[0]).toBe(7.2);
  });
  test('--assign gives a label its species; the wedge has a nonzero total dipole', async () => {
    const { code, out } = await run(['cluster', 'w.xyz', '--json', '--assign', 'X=drude:q=1.3,m=0.5,w=0.7'], { 'w.xyz': WEDGE });
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.centres[3].species).toBe('drude:q=1.3,m=0.5,w=0.7');
    expect(Math.hypot(...j.dipole)).toBeGreaterThan(1e-4);
  });
});

describe('dispole cluster output formats', () => {
  test('the table shows energies, the total dipole in debye and one row per centre', async () => {
    const { code, out } = await run(['cluster', 'ring.xyz'], { 'ring.xyz': RING });
    expect(code).toBe(0);
    expect(out).toMatch(/many-body/);
    expect(out).toMatch(/pairwise/);
    expect(out).toMatch(/\|mu\| = .* D/);
    expect(out.split('\n').filter((l) => /^(Virid|Quelon) /.test(l))).toHaveLength(7);
  });
  test('--csv prints a header and one row per centre', async () => {
    const { code, out } = await run(['cluster', 'ring.xyz', '--csv'], { 'ring.xyz': RING });
    expect(code).toBe(0);
    const all = out.trim().split('\n');
    // the totals come first, as "#" lines
    expect(all.filter((l) => l.startsWith('#')).map((l) => l.split(':')[0])).toEqual(expect.arrayContaining(['# energy.manyBody', '# energy.pairwise', '# energy.nonAdditive', '# dipole (e a0)']));
    const rows = all.filter((l) => !l.startsWith('#'));
    expect(rows[0]).toMatch(/^label,species,x_bohr,y_bohr,z_bohr,mu_x_ea0/);
    expect(rows[0]).toContain('alpha_in_cluster_a0^3,alpha_isolated_a0^3,C6_in_cluster_Eh_a0^6,C6_isolated_Eh_a0^6');
    expect(rows).toHaveLength(8);
    expect(rows[1].split(',')).toHaveLength(rows[0].split(',').length);
  });
  test('--json and --csv together are refused', async () => {
    const { code, err } = await run(['cluster', 'ring.xyz', '--csv', '--json'], { 'ring.xyz': RING });
    expect(code).toBe(2);
    expect(err).toMatch(/choose one output format/);
  });
});

describe('dispole cluster input errors', () => {
  const cases: Array<[string, string, string[], RegExp]> = [
    ['unknown label', '2\n\nQuelon 0 0 0\nArgon 0 0 4\n', [], /g\.xyz:4: label "Argon" is not a known species; give --assign Argon=SPEC/],
    ['malformed line', '2\n\nQuelon 0 0 0\nVirid 0 0\n', [], /g\.xyz:4: expected "label x y z" \(4 fields\), got 3/],
    ['overlapping centres', '2\n\nQuelon 0 0 0\nVirid 0 0 0.5\n', [], /g\.xyz: line 4 \(Virid\): centre Virid overlaps centre Quelon on line 3/],
    ['assignment to a missing label', '1\n\nQuelon 0 0 0\n', ['--assign', 'Y=Virid'], /--assign Y: no centre of g\.xyz has the label "Y"/],
    ['bad assignment', '1\n\nQuelon 0 0 0\n', ['--assign', 'Y'], /expected LABEL=SPEC/],
    ['bad species in an assignment', '1\n\nY 0 0 0\n', ['--assign', 'Y=drude:q=-1,m=1,w=1'], /q: must be a finite number > 0, got -1/],
  ];
  test.each(cases)('%s: exit 2 with the line', async (_name, text, extra, message) => {
    const { code, out, err } = await run(['cluster', 'g.xyz', ...extra], { 'g.xyz': text });
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toMatch(message);
  });
  test('a missing file is a bad input', async () => {
    const { code, err } = await run(['cluster', 'nope.xyz']);
    expect(code).toBe(2);
    expect(err).toMatch(/nope\.xyz: cannot be read/);
  });
});

describe('dispole cluster progress', () => {
  const lattice = (n: number) => {
    const lines = [`${n}`, 'invented cubic lattice'];
    for (let i = 0; i < n; i++) lines.push(`Quelon ${4 * (i % 6)} ${4 * (Math.floor(i / 6) % 6)} ${4 * Math.floor(i / 36)}`);
    return lines.join('\n') + '\n';
  };
  test('a long run shows a progress bar on stderr only when stderr is a terminal', async () => {
    const files = { 'big.xyz': lattice(160) };
    const tty = await run(['cluster', 'big.xyz', '--json'], files, true);
    expect(tty.code).toBe(0);
    expect(tty.err).toMatch(/cluster .*%/);
    const piped = await run(['cluster', 'big.xyz', '--json'], files, false);
    expect(piped.err).toBe('');
    expect(JSON.parse(piped.out).energy).toEqual(JSON.parse(tty.out).energy);
  });
});
