/** The CLI's only contact with the outside world; tests pass an in-memory implementation. */
import { existsSync, readFileSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../model/errors.js';

export interface CliIO {
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): string;
  /** Write atomically (temp file + rename). Refuses to replace an existing file unless `force`. */
  writeFile(path: string, data: string | Uint8Array, force?: boolean): void;
  /** True when stderr is an interactive terminal (progress indicators go there only then). */
  stderrIsTTY: boolean;
}

/** The real process IO. */
export const nodeIO: CliIO = {
  stdout: (t) => void process.stdout.write(t),
  stderr: (t) => void process.stderr.write(t),
  readFile(path) {
    try {
      return readFileSync(path, 'utf8');
    } catch (e) {
      throw new InputError(path, `cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
  },
  writeFile(path, data, force = false) {
    if (!force && existsSync(path)) throw new InputError(path, 'exists already; pass --force to replace it');
    const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
    try {
      writeFileSync(tmp, data);
      renameSync(tmp, path);
    } catch (e) {
      try {
        unlinkSync(tmp);
      } catch {
        /* nothing to clean */
      }
      throw new InputError(path, `cannot be written (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
    }
  },
  stderrIsTTY: Boolean(process.stderr.isTTY),
};

/** An in-memory IO for tests: collects output, serves files from a map. */
export function memoryIO(files: Record<string, string> = {}): CliIO & { out: string; err: string; files: Record<string, string | Uint8Array> } {
  const io = {
    out: '',
    err: '',
    files: { ...files } as Record<string, string | Uint8Array>,
    stdout(t: string) {
      io.out += t;
    },
    stderr(t: string) {
      io.err += t;
    },
    readFile(path: string) {
      const f = io.files[path];
      if (f === undefined) throw new InputError(path, 'cannot be read (ENOENT)');
      return typeof f === 'string' ? f : new TextDecoder().decode(f);
    },
    writeFile(path: string, data: string | Uint8Array, force = false) {
      if (!force && path in io.files) throw new InputError(path, 'exists already; pass --force to replace it');
      io.files[path] = data;
    },
    stderrIsTTY: false,
  };
  return io;
}
