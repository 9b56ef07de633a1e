/**
 * The `dispole` command's process: runs the CLI on `process.argv` and maps what escapes it to an exit code.
 *
 * Importing this module runs the command. `bin.ts` (the executable) loads the bundled copy of this module and its
 * whole import graph (`dist/cli/dispole.cjs`, made by `npm run build`) when it exists, else this module itself.
 */
import { runCli } from './program.js';
import { nodeIO, OutputFailure } from './io.js';
import { EXIT } from './exit-codes.js';

/** Exit code for an internal error (EX_SOFTWARE of BSD sysexits.h; common practice). */
const INTERNAL = 70;

/** Last words on stderr, ignoring a stderr that cannot be written either. */
function say(text: string): void {
  try {
    process.stderr.write(text);
  } catch {
    /* nowhere to say it */
  }
}

/**
 * A failed write to stdout: the reader closed the pipe (EPIPE, e.g. `| head -1`) → stop quietly with 0; anything
 * else (ENOSPC on `> /dev/full`, EIO) → an I/O error, exit {@link EXIT.io}.
 */
function onStdoutError(e: NodeJS.ErrnoException): void {
  if (e.code === 'EPIPE') process.exit(EXIT.ok);
  say(`dispole: error: standard output: cannot be written (${e.code ?? e.message})\n`);
  process.exit(EXIT.io);
}

process.stdout.on('error', onStdoutError);
process.stderr.on('error', () => process.exit(process.exitCode ?? EXIT.io));

runCli(process.argv.slice(2), nodeIO).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    if (e instanceof OutputFailure) {
      say(`dispole: error: ${e.message}\n`);
      process.exitCode = EXIT.io;
      return;
    }
    const code = (e as NodeJS.ErrnoException | undefined)?.code;
    if (code === 'EPIPE' || code === 'ENOSPC' || code === 'EIO') {
      onStdoutError(e as NodeJS.ErrnoException);
      return;
    }
    say(`dispole: internal error: ${(e as Error).stack ?? String(e)}\n`);
    process.exitCode = INTERNAL;
  },
);
