/** The command-line program: builds the commander tree and maps errors to exit codes. */
import { Command, CommanderError, Help } from 'commander';
import { ConvergenceError, InputError } from '../model/errors.js';
import { VERSION } from '../version.js';
import { commandIndex, selectedCommand } from './commands/index.js';
import type { CommandContext } from './context.js';
import type { CliIO } from './io.js';

import { EXIT } from './exit-codes.js';

export { EXIT };

/** Run the CLI on `argv` (without the node and script names); returns the exit code. */
export async function runCli(argv: readonly string[], io: CliIO): Promise<number> {
  const ctx: CommandContext = { io, exitCode: 0 };
  // one error style: commander's own messages ("error: unknown option …") get the prefix of ours ("dispole: error: …")
  const output = {
    writeOut: (s: string) => io.stdout(s),
    writeErr: (s: string) => io.stderr(s),
    outputError: (s: string, write: (s: string) => void) => write(s.startsWith('error:') ? `dispole: ${s}` : s),
  };
  const program = new Command('dispole')
    .description('Dispersion-induced dipoles (D7) and dispersion coefficients (C6, C8, C10) of atom and oscillator pairs')
    .version(VERSION)
    .showHelpAfterError('(run with --help for usage)')
    .configureOutput(output)
    .exitOverride();
  // Only the command that runs is imported; the others are placeholders with their help line (see commands/index.ts).
  const selected = selectedCommand(argv);
  const placeholderTerms = new Map<Command, string>();
  for (const entry of commandIndex) {
    if (entry === selected) (await entry.load())(program, ctx);
    else placeholderTerms.set(program.command(entry.name).summary(entry.summary), entry.term);
  }
  const help = new Help();
  program.configureHelp({ subcommandTerm: (cmd) => placeholderTerms.get(cmd) ?? help.subcommandTerm(cmd) });
  for (const c of program.commands) c.exitOverride().configureOutput(output);
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
