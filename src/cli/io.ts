/**
 * The CLI's only contact with the outside world; tests pass an in-memory implementation.
 *
 * File guarantees of {@link nodeIO} (stated in the README):
 * - Reading: only regular files (symbolic links to them are followed); FIFOs, devices, sockets and directories are
 *   refused without blocking, and so is a file larger than {@link MAX_INPUT_BYTES}.
 * - Writing: the data go to a temporary file in the target's directory, which then becomes the target in one step.
 *   Without `force` the step is link(2), which fails when the name exists, so an existing file is never replaced,
 *   even by concurrent runs (exactly one of them wins). With `force`, rename(2) replaces a regular file and keeps its
 *   permission bits. A target that is a symbolic link, a directory, a device or a FIFO is refused (symbolic links are
 *   not followed, so a link never redirects the write). The temporary file is removed on every error path and on
 *   SIGINT, SIGTERM and SIGHUP (the signal is honoured after the clean-up, with its usual exit status); only SIGKILL
 *   or a power cut can leave one behind.
 */
import {
  chmodSync,
  closeSync,
  constants,
  fstatSync,
  fsyncSync,
  linkSync,
  lstatSync,
  openSync,
  readSync,
  renameSync,
  unlinkSync,
  writeSync,
  type Stats,
} from 'node:fs';
import { cryptoModule } from '../lazy-modules.js';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../model/errors.js';

export interface CliIO {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): string;
  /** Write atomically (temp file + link/rename). Refuses to replace an existing file unless `force`. */
  writeFile(path: string, data: string | Uint8Array, force?: boolean): void;
  /** True when stderr is an interactive terminal (progress indicators go there only then). */
  stderrIsTTY: boolean;
}

/** Largest input file read (species files, response data, XYZ geometries): 64 MiB. */
export const MAX_INPUT_BYTES = 64 * 1024 * 1024;

/**
 * The operating system failed to store the output (disk full, quota, I/O error, read-only file system): not the
 * user's input, so it has its own exit code (EXIT.io).
 */
export class OutputFailure extends Error {
  override readonly name = 'OutputFailure';
  constructor(
    readonly target: string,
    readonly code: string,
  ) {
    super(`${target}: cannot be written (${code}${DEVICE_TROUBLE.has(code) ? `: ${DEVICE_TROUBLE.get(code)}` : ''})`);
  }
}

/** Error codes that mean the system, not the request, failed. */
const DEVICE_TROUBLE = new Map([
  ['ENOSPC', 'no space left on the device'],
  ['EDQUOT', 'disk quota exceeded'],
  ['EIO', 'input/output error'],
  ['EFBIG', 'file too large for the file system or the process limit'],
  ['EROFS', 'read-only file system'],
]);

const errnoCode = (e: unknown): string => (e as NodeJS.ErrnoException).code ?? (e as Error).message;

/** What kind of thing a non-regular file is, for messages. */
function kindOf(st: Stats): string {
  if (st.isDirectory()) return 'a directory';
  if (st.isFIFO()) return 'a FIFO (named pipe)';
  if (st.isCharacterDevice() || st.isBlockDevice()) return 'a device';
  if (st.isSocket()) return 'a socket';
  if (st.isSymbolicLink()) return 'a symbolic link';
  return 'not a regular file';
}

/** Read a regular file of at most {@link MAX_INPUT_BYTES} as UTF-8 (opened non-blocking, so a FIFO cannot hang it). */
function readRegularFile(path: string): string {
  let fd: number;
  try {
    fd = openSync(path, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    throw new InputError(path, `cannot be read (${errnoCode(e)})`);
  }
  try {
    const st = fstatSync(fd);
    if (!st.isFile()) throw new InputError(path, `is ${kindOf(st)}; give a regular file`);
    if (st.size > MAX_INPUT_BYTES) throw new InputError(path, `is ${st.size} bytes; input files are limited to ${MAX_INPUT_BYTES} bytes (64 MiB)`);
    // Read at most the limit + 1 bytes, in case the file grows while it is read.
    const buf = Buffer.alloc(Math.min(st.size, MAX_INPUT_BYTES) + 1);
    let n = 0;
    for (;;) {
      const got = readSync(fd, buf, n, buf.length - n, null);
      if (got === 0) break;
      n += got;
      if (n === buf.length) {
        if (n > MAX_INPUT_BYTES) throw new InputError(path, `is larger than the limit of ${MAX_INPUT_BYTES} bytes (64 MiB) for input files`);
        break; // the file grew after fstat: the limit check above ends it at the next size
      }
    }
    return buf.subarray(0, n).toString('utf8');
  } catch (e) {
    if (e instanceof InputError) throw e;
    throw new InputError(path, `cannot be read (${errnoCode(e)})`);
  } finally {
    closeSync(fd);
  }
}

/** Temporary files being written now; removed by the signal handler. */
const pendingTemps = new Set<string>();
const CLEANUP_SIGNALS = ['SIGINT', 'SIGTERM', 'SIGHUP'] as const;
let signalsHooked = false;

/**
 * Catch SIGINT/SIGTERM/SIGHUP from the first write on: remove pending temporary files, then re-raise the signal
 * with the default action, so the process ends as it would have (status 128 + signal number). Writes are
 * synchronous, so the handler runs after a write finished or cleaned up — never halfway.
 */
function hookSignals(): void {
  if (signalsHooked) return;
  signalsHooked = true;
  const onSignal = (signal: NodeJS.Signals) => {
    for (const tmp of pendingTemps) removeQuietly(tmp);
    pendingTemps.clear();
    for (const s of CLEANUP_SIGNALS) process.removeAllListeners(s);
    process.kill(process.pid, signal);
  };
  for (const s of CLEANUP_SIGNALS) process.on(s, onSignal);
}

function removeQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    /* already gone */
  }
}

/** The target's status when it exists (symbolic links not followed), else undefined. */
function existing(path: string): Stats | undefined {
  try {
    return lstatSync(path);
  } catch (e) {
    if (errnoCode(e) === 'ENOENT') return undefined;
    throw new InputError(path, `cannot be written (${errnoCode(e)})`);
  }
}

/** A write failure as the right error: the system's fault (OutputFailure) or a bad target (InputError). */
function writeFailure(path: string, e: unknown): Error {
  if (e instanceof InputError || e instanceof OutputFailure) return e;
  const code = errnoCode(e);
  if (DEVICE_TROUBLE.has(code)) return new OutputFailure(path, code);
  if (code === 'EEXIST') return new InputError(path, 'exists already; pass --force to replace it');
  return new InputError(path, `cannot be written (${code})`);
}

/** Write all of `data` to a new file `tmp` (exclusive create) with `mode`, flushed to the disk. */
function writeNewFile(tmp: string, data: string | Uint8Array, mode: number): void {
  const fd = openSync(tmp, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, mode);
  try {
    const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
    let off = 0;
    while (off < bytes.length) off += writeSync(fd, bytes, off, bytes.length - off);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** See the module comment for the guarantees. */
function writeFileAtomically(path: string, data: string | Uint8Array, force: boolean): void {
  if (path === '') throw new InputError('output file', 'the file name is empty; give a file name');
  const before = existing(path);
  if (before) {
    if (!before.isFile()) throw new InputError(path, `is ${kindOf(before)}; only a regular file can be written or replaced (symbolic links are not followed)`);
    if (!force) throw new InputError(path, 'exists already; pass --force to replace it');
  }
  hookSignals();
  const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.${cryptoModule().randomBytes(4).toString('hex')}.tmp`);
  pendingTemps.add(tmp);
  try {
    // A replaced file keeps its permission bits; a new one gets 0666 minus the umask, as usual.
    writeNewFile(tmp, data, before ? before.mode & 0o7777 : 0o666);
    if (before) {
      chmodSync(tmp, before.mode & 0o7777); // the umask may have cleared bits
      renameSync(tmp, path);
    } else if (force) {
      renameSync(tmp, path);
    } else {
      linkOrRefuse(tmp, path);
      unlinkSync(tmp);
    }
  } catch (e) {
    throw writeFailure(path, e);
  } finally {
    removeQuietly(tmp);
    pendingTemps.delete(tmp);
  }
}

/**
 * link(2) the finished temporary file to the target name: fails with EEXIST when another process created the
 * name meanwhile. File systems without hard links fall back to an exclusive create of the target.
 */
function linkOrRefuse(tmp: string, path: string): void {
  try {
    linkSync(tmp, path);
  } catch (e) {
    const code = errnoCode(e);
    if (code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EOPNOTSUPP' && code !== 'EXDEV') throw e;
    const fallbackData = readFileBytes(tmp);
    try {
      writeNewFile(path, fallbackData, 0o666);
    } catch (inner) {
      if (errnoCode(inner) !== 'EEXIST') removeQuietly(path);
      throw inner;
    }
  }
}

function readFileBytes(path: string): Buffer {
  const fd = openSync(path, constants.O_RDONLY);
  try {
    const size = fstatSync(fd).size;
    const buf = Buffer.alloc(size);
    let n = 0;
    while (n < size) {
      const got = readSync(fd, buf, n, size - n, null);
      if (got === 0) break;
      n += got;
    }
    return buf.subarray(0, n);
  } finally {
    closeSync(fd);
  }
}

/** The real process IO. */
export const nodeIO: CliIO = {
  stdout: (t) => void process.stdout.write(t),
  stderr: (t) => void process.stderr.write(t),
  readFile: readRegularFile,
  writeFile: (path, data, force = false) => writeFileAtomically(path, data, force),
  stderrIsTTY: Boolean(process.stderr.isTTY),
};

/** An in-memory IO for tests: collects output, serves files from a map. */
export function memoryIO(files: Record<string, string> = {}): CliIO & { out: string; err: string; files: Record<string, string | Uint8Array> } {
  const io = {
    out: '',
    err: '',
    files: Object.assign(Object.create(null), files) as Record<string, string | Uint8Array>,
    stdout(t: string) {
      io.out += t;
    },
    stderr(t: string) {
      io.err += t;
    },
    readFile(path: string) {
      const f = Object.hasOwn(io.files, path) ? io.files[path] : undefined;
      if (f === undefined) throw new InputError(path, 'cannot be read (ENOENT)');
      if (f.length > MAX_INPUT_BYTES) throw new InputError(path, `is ${f.length} bytes; input files are limited to ${MAX_INPUT_BYTES} bytes (64 MiB)`);
      return typeof f === 'string' ? f : new TextDecoder().decode(f);
    },
    writeFile(path: string, data: string | Uint8Array, force = false) {
      if (path === '') throw new InputError('output file', 'the file name is empty; give a file name');
      if (!force && Object.hasOwn(io.files, path)) throw new InputError(path, 'exists already; pass --force to replace it');
      io.files[path] = data;
    },
    stderrIsTTY: false,
  };
  return io;
}
