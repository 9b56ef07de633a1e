/** The command-line program: builds the commander tree and maps errors to exit codes. */
import { Command, CommanderError } from 'commander';
import { ConvergenceError, InputError } from '../model/errors.js';
import { VERSION } from '../version.js';
import { commandRegistrars } from './commands/index.js';
import type { CommandContext } from './context.js';
import type { CliIO } from './io.js';

import { EXIT } from './exit-codes.js';

export { EXIT };

/** Run the CLI on `argv` (without the node and script names); returns the exit code. */
export async function runCli(argv: readonly string[], io: CliIO): Promise<number> {
  const ctx: CommandContext = { io, exitCode: 0 };
  const program = new Command('dispole')
    .description('Dispersion-induced dipoles (D7) and dispersion coefficients (C6, C8, C10) of atom and oscillator pairs')
    .version(VERSION)
    .showHelpAfterError('(run with --help for usage)')
    .configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) })
    .exitOverride();
  for (const register of commandRegistrars) register(program, ctx);
  for (const c of program.commands) c.exitOverride().configureOutput({ writeOut: (s) => io.stdout(s), writeErr: (s) => io.stderr(s) });
  try {
    await program.parseAsync([...argv], { from: 'user' });
    return ctx.exitCode;
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : EXIT.badInput;
    if (e instanceof InputError) {
      io.stderr(`dispole: error: ${e.message}\n`);
      return EXIT.badInput;
    }
    if (e instanceof ConvergenceError) {
      io.stderr(`dispole: error: ${e.message}\n`);
      return EXIT.untrusted;
    }
    throw e;
  }
}
