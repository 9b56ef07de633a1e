/** What a command's action receives: the IO and a slot for a non-zero exit code (e.g. untrusted results). */
import type { CliIO } from './io.js';

export interface CommandContext {
  io: CliIO;
  exitCode: number;
}
