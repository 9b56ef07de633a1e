/**
 * The file guarantees of the real IO (src/cli/io.ts) on the real file system, in a temporary directory: exclusive
 * create under a race, --force keeping the mode, refusal of non-regular targets and inputs, the input size limit,
 * no temporary file left on errors or signals, and the output-stream exit codes (closed pipe, full disk).
 * Behaviour of link(2), rename(2), O_EXCL and O_NONBLOCK as POSIX specifies it (IEEE Std 1003.1; common practice).
 * The race, signal and stream cases run child processes on the build (`dist/` from `npm test`, or DISPOLE_DIST).
 */
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { chmodSync, closeSync, existsSync, mkdirSync, mkdtempSync, openSync, readdirSync, readFileSync, rmSync, statSync, symlinkSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { MAX_INPUT_BYTES, nodeIO } from '../../src/cli/io.js';
import { EXIT } from '../../src/cli/exit-codes.js';
import { inputErrorOf } from '../helpers/input-error.js';

const DIST = resolve(process.env.DISPOLE_DIST ?? 'dist');
const dir = mkdtempSync(join(tmpdir(), 'dispole-io-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
let counter = 0;
const fresh = (name: string) => {
  const d = join(dir, `${name}-${++counter}`);
  mkdirSync(d);
  return d;
};
const temps = (d: string) => readdirSync(d).filter((f) => f.endsWith('.tmp'));

describe('writing --out files', () => {
  test('a new file is created; an existing one is never replaced without force, and stays as it was', () => {
    const d = fresh('create');
    const target = join(d, 'out.txt');
    nodeIO.writeFile(target, 'first\n');
    expect(readFileSync(target, 'utf8')).toBe('first\n');
    const e = inputErrorOf(() => nodeIO.writeFile(target, 'second\n'));
    expect(e.field).toBe(target);
    expect(e.problem).toMatch(/exists already; pass --force/);
    expect(readFileSync(target, 'utf8')).toBe('first\n');
    expect(temps(d)).toEqual([]);
  });

  test('--force replaces a regular file and keeps its permission bits', () => {
    const d = fresh('mode');
    const target = join(d, 'out.txt');
    writeFileSync(target, 'old\n');
    chmodSync(target, 0o640);
    nodeIO.writeFile(target, 'new\n', true);
    expect(readFileSync(target, 'utf8')).toBe('new\n');
    expect(statSync(target).mode & 0o777).toBe(0o640);
    expect(temps(d)).toEqual([]);
  });

  test('symbolic links, directories, FIFOs and devices are refused as targets, even with --force', () => {
    const d = fresh('kinds');
    const real = join(d, 'real.txt');
    writeFileSync(real, 'keep\n');
    symlinkSync(real, join(d, 'link.txt'));
    mkdirSync(join(d, 'sub'));
    execFileSync('mkfifo', [join(d, 'fifo')]);
    for (const [name, kind] of [
      ['link.txt', /symbolic link/],
      ['sub', /directory/],
      ['fifo', /FIFO/],
    ] as const) {
      const e = inputErrorOf(() => nodeIO.writeFile(join(d, name), 'x', true));
      expect(e.field).toBe(join(d, name));
      expect(e.problem).toMatch(kind);
    }
    expect(inputErrorOf(() => nodeIO.writeFile('/dev/null', 'x', true)).problem).toMatch(/device/);
    expect(readFileSync(real, 'utf8')).toBe('keep\n');
    expect(temps(d)).toEqual([]);
  });

  test('an unwritable place is an input error naming the file, and leaves no temporary file', () => {
    const d = fresh('missing');
    const e = inputErrorOf(() => nodeIO.writeFile(join(d, 'no-such-dir', 'out.txt'), 'x'));
    expect(e.field).toBe(join(d, 'no-such-dir', 'out.txt'));
    expect(e.problem).toMatch(/cannot be written \(ENOENT\)/);
    expect(inputErrorOf(() => nodeIO.writeFile('', 'x')).problem).toMatch(/file name is empty/);
    expect(readdirSync(d)).toEqual([]);
  });

  test('8 concurrent writers of one new file without --force: exactly one wins, the rest are refused', async () => {
    const d = fresh('race');
    const target = join(d, 'out.txt');
    const script = [
      `import { nodeIO } from ${JSON.stringify(join(DIST, 'cli/io.js'))};`,
      `const id = process.argv[2];`,
      // all start writing at the same moment (after every process has loaded), so the link(2) step really races
      `while (Date.now() < Number(process.argv[3])) {}`,
      `try { nodeIO.writeFile(${JSON.stringify(target)}, 'writer ' + id + '\\n' + 'x'.repeat(100000)); process.exit(0); }`,
      `catch (e) { process.stderr.write(e.message); process.exit(e.name === 'InputError' ? 2 : 1); }`,
    ].join('\n');
    const file = join(d, 'writer.mjs');
    writeFileSync(file, script);
    const startAt = Date.now() + 3000;
    const runs = Array.from({ length: 8 }, (_, id) =>
      new Promise<{ id: number; code: number | null; err: string }>((done) => {
        const child = spawn(process.execPath, [file, String(id), String(startAt)], { stdio: ['ignore', 'ignore', 'pipe'] });
        let err = '';
        child.stderr.on('data', (b) => (err += b));
        child.on('close', (code) => done({ id, code, err }));
      }),
    );
    const results = await Promise.all(runs);
    const winners = results.filter((r) => r.code === 0);
    expect(winners).toHaveLength(1);
    for (const r of results.filter((x) => x.code !== 0)) {
      expect(r.code).toBe(EXIT.badInput);
      expect(r.err).toMatch(/exists already/);
    }
    expect(readFileSync(target, 'utf8').split('\n')[0]).toBe(`writer ${winners[0].id}`);
    expect(temps(d)).toEqual([]);
  });

  test.each(['SIGTERM', 'SIGINT'] as const)('%s during a large write leaves no temporary file; the signal still ends the process', async (signal) => {
    const d = fresh('signal');
    const target = join(d, 'big.txt');
    const size = 96 * 1024 * 1024;
    const script = [
      `import { nodeIO } from ${JSON.stringify(join(DIST, 'cli/io.js'))};`,
      `nodeIO.writeFile(${JSON.stringify(target)}, new Uint8Array(${size}).fill(65));`,
      // stay alive briefly, as the CLI would while finishing: the queued signal is handled here
      `setTimeout(() => process.exit(0), 2000);`,
    ].join('\n');
    const file = join(d, 'writer.mjs');
    writeFileSync(file, script);
    const child = spawn(process.execPath, [file], { stdio: 'ignore' });
    // send the signal as soon as the temporary file exists, i.e. in the middle of the write
    let sawTemp = false;
    await new Promise<void>((done) => {
      const poll = setInterval(() => {
        if (temps(d).length > 0) {
          sawTemp = true;
          child.kill(signal);
          clearInterval(poll);
          done();
        } else if (child.exitCode !== null) {
          clearInterval(poll);
          done();
        }
      }, 1);
    });
    const ended = await new Promise<{ code: number | null; signal: string | null }>((done) => {
      if (child.exitCode !== null || child.signalCode !== null) done({ code: child.exitCode, signal: child.signalCode });
      else child.on('exit', (code, sig) => done({ code, signal: sig }));
    });
    expect(sawTemp).toBe(true); // the signal did arrive mid-write
    expect(temps(d)).toEqual([]);
    expect(ended.signal).toBe(signal);
    // the write finished before the handler ran: the target is complete, never partial
    if (existsSync(target)) expect(statSync(target).size).toBe(size);
  });
});

describe('reading input files', () => {
  test('FIFOs, devices and directories are refused at once (no blocking, no endless read)', () => {
    const d = fresh('read');
    execFileSync('mkfifo', [join(d, 'fifo')]);
    expect(inputErrorOf(() => nodeIO.readFile(join(d, 'fifo'))).problem).toMatch(/FIFO \(named pipe\); give a regular file/);
    expect(inputErrorOf(() => nodeIO.readFile('/dev/zero')).problem).toMatch(/is a device; give a regular file/);
    expect(inputErrorOf(() => nodeIO.readFile(d)).problem).toMatch(/is a directory/);
    expect(inputErrorOf(() => nodeIO.readFile(join(d, 'absent.yaml'))).problem).toMatch(/cannot be read \(ENOENT\)/);
  });

  test(`a file above the stated limit (${MAX_INPUT_BYTES} bytes) is refused before it is read`, () => {
    const d = fresh('big');
    const big = join(d, 'big.yaml');
    closeSync(openSync(big, 'w'));
    truncateSync(big, MAX_INPUT_BYTES + 1); // sparse: no disk used
    const e = inputErrorOf(() => nodeIO.readFile(big));
    expect(e.field).toBe(big);
    expect(e.problem).toMatch(/input files are limited to 67108864 bytes \(64 MiB\)/);
  });
});

describe('output streams of the command (built CLI)', () => {
  const bin = join(DIST, 'cli/bin.cjs');

  test('a closed pipe ends quietly with exit 0 (as in dispole table … | head -1)', async () => {
    const child = spawn(process.execPath, [bin, 'table', 'Quelon', 'Virid', '--routes', 'perturbation'], { stdio: ['ignore', 'pipe', 'pipe'] });
    child.stdout.destroy(); // the reader is gone before anything is written
    let err = '';
    child.stderr.on('data', (b) => (err += b));
    const code = await new Promise<number | null>((done) => child.on('close', (c) => done(c)));
    expect(err).toBe('');
    expect(code).toBe(EXIT.ok);
  });

  test('an --out file the system refuses to store (file-size limit: EFBIG, as ENOSPC) is an I/O error, exit 4; no file, no temporary file', () => {
    const d = fresh('efbig');
    const target = join(d, 'table.txt');
    // ulimit -f 1: files above 1 KiB fail with EFBIG (Node ignores SIGXFSZ), standing in for a full disk
    const r = spawnSync('bash', ['-c', `ulimit -f 1; exec "${process.execPath}" "${bin}" table Quelon Virid Sorrel Tarnet --out "${target}"`], { encoding: 'utf8' });
    expect(r.status).toBe(EXIT.io);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(`dispole: error: ${target}: cannot be written (EFBIG: file too large for the file system or the process limit)\n`);
    expect(readdirSync(d)).toEqual([]);
  });

  test('a full disk on stdout is an I/O error, exit 4, with a one-line message (dispole pair … > /dev/full)', () => {
    const full = openSync('/dev/full', 'w');
    try {
      const r = spawnSync(process.execPath, [bin, 'pair', 'Quelon', 'Virid'], { stdio: ['ignore', full, 'pipe'], encoding: 'utf8' });
      expect(r.status).toBe(EXIT.io);
      expect(r.stderr).toBe('dispole: error: standard output: cannot be written (ENOSPC)\n');
    } finally {
      closeSync(full);
    }
  });
});
