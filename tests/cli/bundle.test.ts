/**
 * The built executable: `dist/cli/bin.cjs` (package.json "bin") runs the bundled CLI with its V8 code cache; it must
 * behave exactly as the module tree it was bundled from (`dist/cli/main.js`), which the other CLI tests exercise
 * in-process. Runs child processes on the build (`dist/` from `npm test`, or DISPOLE_DIST).
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';

const DIST = resolve(process.env.DISPOLE_DIST ?? 'dist');
const BUNDLE = join(DIST, 'cli/dispole.cjs');
const scratch = mkdtempSync(join(tmpdir(), 'dispole-bundle-'));
afterAll(() => rmSync(scratch, { recursive: true, force: true }));

interface Outcome {
  status: number | null;
  stdout: string;
  stderr: string;
}

function run(entry: string, argv: readonly string[]): Outcome {
  const r = spawnSync(process.execPath, [entry, ...argv], { encoding: 'utf8' });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/**
 * 170 centres (a 510 × 510 eigenproblem: above the order at which the eigensolver starts worker threads, whose
 * source text is made from functions of the bundle) on a jittered cubic lattice 7 bohr apart; seeded, so fixed.
 */
function largeClusterFile(): string {
  let seed = 2024;
  const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
  const lines = ['170', 'jittered lattice of invented demo species (Quelon, Virid)'];
  for (let i = 0; i < 170; i++) {
    const [x, y, z] = [i % 6, Math.floor(i / 6) % 6, Math.floor(i / 36)].map((k) => (7 * k + rnd()) * 0.529177210903);
    lines.push(`${i % 3 ? 'Quelon' : 'Virid'} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`);
  }
  const file = join(scratch, 'lattice.xyz');
  writeFileSync(file, `${lines.join('\n')}\n`);
  return file;
}

describe('the bundled executable', () => {
  test('package.json names dist/cli/bin.cjs as the command, and the build made the bundle and its code cache', () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { bin: Record<string, string> };
    expect(pkg.bin).toEqual({ dispole: 'dist/cli/bin.cjs' });
    expect(existsSync(BUNDLE), 'npm run build bundles the CLI').toBe(true);
    expect(existsSync(`${BUNDLE}.v8cache`), 'npm run build records the code cache').toBe(true);
  });

  test('V8 accepts the recorded code cache in a plain node process (else every start-up compiles the bundle again)', () => {
    const probe = [
      "const { readFileSync } = require('node:fs'); const { Script } = require('node:vm');",
      `const file = ${JSON.stringify(BUNDLE)};`,
      "const s = new Script(readFileSync(file, 'latin1'), { filename: file, cachedData: readFileSync(file + '.v8cache') });",
      'process.stdout.write(String(s.cachedDataRejected));',
    ].join('\n');
    const r = spawnSync(process.execPath, ['-e', probe], { encoding: 'utf8' });
    expect(r.stdout).toBe('false');
  });

  const cluster = largeClusterFile();
  test.each([
    ['pair Quelon Virid --json', ['pair', 'Quelon', 'Virid', '--json']],
    ['pair H H (pseudo-state atoms, WebAssembly kernels)', ['pair', 'H', 'H']],
    ['a large cluster (worker threads)', ['cluster', cluster, '--json']],
    ['check with a syntax error (exit 2)', ['check', 'x+', '--for', 'D7.a']],
    ['derive D7 (symbolic engine, mathjs loaded on demand)', ['derive', 'D7', '--latex']],
    ['bad input (exit 2, nothing on stdout)', ['pair', 'Quelon', 'drude:q=0,m=1,w=1']],
    ['top-level help', ['--help']],
  ])('%s: the same bytes and exit code as the module tree', (_name, argv) => {
    const bundled = run(join(DIST, 'cli/bin.cjs'), argv);
    const tree = run(join(DIST, 'cli/main.js'), argv);
    expect(bundled).toEqual(tree);
    expect(bundled.status === 0 || bundled.status === 2).toBe(true);
  }, 120_000);

  test('the ES-module path of earlier builds (dist/cli/bin.js) runs the same program', () => {
    expect(run(join(DIST, 'cli/bin.js'), ['pair', 'Quelon', 'Virid'])).toEqual(run(join(DIST, 'cli/bin.cjs'), ['pair', 'Quelon', 'Virid']));
  });

  test('without a bundle (a plain tsc build) the executable falls back to the module tree', () => {
    const dir = mkdtempSync(join(scratch, 'tree-'));
    copyFileSync(join(DIST, 'cli/bin.cjs'), join(dir, 'bin.cjs'));
    copyFileSync(join(DIST, 'cli/bundle-loader.cjs'), join(dir, 'bundle-loader.cjs'));
    writeFileSync(join(dir, 'main.js'), "process.stdout.write('module tree ' + process.argv.slice(2).join(' '));\n");
    writeFileSync(join(dir, 'package.json'), '{"type":"module"}\n');
    expect(run(join(dir, 'bin.cjs'), ['pair', 'A', 'B'])).toEqual({ status: 0, stdout: 'module tree pair A B', stderr: '' });
  });
});
