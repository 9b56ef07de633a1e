/** `dispole check "<formula>" --for <quantity>`: is a hand-derived formula the engine's closed form? */
import type { Command } from 'commander';
import { InputError } from '../../model/errors.js';
import { parseQuantityName, SYMBOLIC_QUANTITIES } from '../../engines/symbolic/derive.js';
import { checkFormula } from '../../engines/symbolic/formula-check.js';
import { checkToJson, checkToText } from '../../report/symbolic-report.js';
import { integerIn } from '../common.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import { ANISOTROPIC_HELP, IDENTICAL_HELP, layoutOf } from './derive.js';

interface CheckFlags extends OutputFlags {
  for: string;
  identical?: boolean;
  anisotropic?: boolean;
  points: number;
  seed: number;
}

export function registerCheck(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('check')
    .summary('compare a formula with the engine\'s closed form (exit 0 identical, 1 differs, 2 bad input)')
    .description(
      [
        'Compare a formula for a quantum Drude oscillator pair with the closed form `dispole derive` gives: exactly (the difference reduced to zero, when the formula is rational in the parameters) and at seeded random parameter points. When they differ, a hint says how: sign, constant factor, exchanged labels, a wrong power.',
        'Names: qa, ma, wa (A, at the origin) and qb, mb, wb (B, at +R on z); alphaa, alphab = q²/(m w²) may replace or join the masses; R in mu.a, mu.b, mu.total. Operators + - * / ^, parentheses, implicit products (9 qa^3), sqrt, cbrt, exp, log, abs, pi. Atomic units. A formula starting with "-" is read as the formula.',
      ].join('\n\n'),
    )
    .argument('<formula>', 'the formula, quoted, e.g. "-9*qa^3*qb^2/(ma^2*mb*wa^3*wb*(wa + wb))"')
    .requiredOption('--for <quantity>', `the quantity it claims to be: ${SYMBOLIC_QUANTITIES.join(', ')}`)
    .option('--identical', IDENTICAL_HELP)
    .option('--anisotropic', ANISOTROPIC_HELP)
    .option('--points <n>', 'random parameter points for the numeric comparison', integerIn(1, 1000), 24)
    .option('--seed <n>', 'seed of the random points', integerIn(0, 2 ** 32 - 1), 1)
    // A formula may start with "-" (e.g. "-9*qa^3…"): let it through as the argument instead of an option.
    .allowUnknownOption()
    .allowExcessArguments();
  addSharedOptions(cmd, ['json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((formula: string, flags: CheckFlags) => {
    refuseExtraArguments(cmd);
    const format = chooseFormat(flags, ['text', 'json']);
    const layout = layoutOf(flags);
    const quantity = parseQuantityName('--for', flags.for, layout);
    const result = checkFormula({ expression: formula, quantity, layout, points: flags.points, seed: flags.seed });
    emitOutput(ctx, flags, format === 'json' ? jsonText(checkToJson(result), flags) : checkToText(result), 'the check');
    if (result.verdict === 'differs') ctx.exitCode = EXIT.differs;
  });
}

/**
 * Unknown options are let through (a formula may start with "-"), so an option check does not know arrives as an
 * extra argument: name it, rather than commander's "too many arguments".
 */
function refuseExtraArguments(cmd: Command): void {
  const args = cmd.args;
  if (args.length <= 1) return;
  const known = cmd.options.map((o) => o.long).filter((o): o is string => o !== undefined);
  const option = args.find((a, i) => a.startsWith('--') || (i > 0 && /^-[A-Za-z]/.test(a)));
  if (option !== undefined) {
    throw new InputError(option.split('=')[0], `is not an option of check; its options: ${known.join(', ')} (see dispole check --help)`);
  }
  throw new InputError('formula', `give one formula, quoted as one argument; got ${args.length} arguments: ${args.map((a) => JSON.stringify(a)).join(' ')}`);
}
