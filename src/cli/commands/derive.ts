/** `dispole derive [quantities…]`: closed forms of C6, C8, C10, D7 for quantum Drude oscillator pairs. */
import type { Command } from 'commander';
import { DEFAULT_QUANTITIES, defaultQuantities, deriveQuantities, parseQuantityName, SYMBOLIC_QUANTITIES, type VariableSet } from '../../engines/symbolic/derive.js';
import type { PairLayout } from '../../engines/symbolic/symbols.js';
import { derivedToJson, derivedToText } from '../../report/symbolic-report.js';
import { InputError } from '../../model/errors.js';
import { oneOf } from '../common.js';
import type { CommandContext } from '../context.js';
import { deriveSurfaceQuantities, parseSurfaceQuantity, SURFACE_QUANTITIES } from '../../engines/symbolic/symbolic-surface.js';
import { surfaceDerivedToJson, surfaceDerivedToText } from '../../report/surface-report.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';

interface DeriveFlags extends OutputFlags {
  in: VariableSet;
  identical?: boolean;
  anisotropic?: boolean;
  surface?: boolean;
}

/** The layout options shared by `derive` and `check`. */
export function layoutOf(flags: { identical?: boolean; anisotropic?: boolean }): PairLayout {
  return { identical: Boolean(flags.identical), anisotropic: Boolean(flags.anisotropic) };
}

export const IDENTICAL_HELP = 'the same species on both centres (names q, m, w, alpha instead of qa, qb, …)';
export const ANISOTROPIC_HELP = 'frequencies along the lab axes (names wax, way, waz, wbx, …; C6 and D7 only)';

export function registerDerive(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('derive')
    .summary('exact closed forms of C6, C8, C10 and D7 for quantum Drude oscillator pairs')
    .description(
      [
        'Run the perturbation route with symbols instead of numbers and print the closed forms, reduced to lowest terms. Species A (qa, ma, wa) sits at the origin, B (qb, mb, wb) at +R on z; atomic units.',
        `Quantities: ${SYMBOLIC_QUANTITIES.join(', ')} (default: ${DEFAULT_QUANTITIES.join(' ')}); mu.x = D7.x/R^7. The text form is valid input for \`dispole check\` and for computer-algebra systems.`,
      ].join('\n\n'),
    )
    .argument('[quantities...]', 'quantities to derive (space- or comma-separated)')
    .option('--latex', 'print LaTeX equations instead of plain text')
    .option('--in <variables>', 'write the results in q, m, w ("mass") or in q, alpha, w ("alpha", alpha = q²/(m w²))', oneOf(['mass', 'alpha'] as const), 'mass')
    .option('--identical', IDENTICAL_HELP)
    .option('--anisotropic', ANISOTROPIC_HELP)
    .option('--surface', `one oscillator in front of a perfect conductor instead of a pair: ${SURFACE_QUANTITIES.join(', ')} (z from the surface to the atom)`);
  addSharedOptions(cmd, ['json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((tokens: string[], flags: DeriveFlags) => {
    const format = chooseFormat(flags, ['text', 'latex', 'json']);
    if (flags.surface) {
      // one oscillator in q, m, w: a second species (--identical) and the alpha form have no meaning here
      if (flags.identical) throw new InputError('--identical', 'has no meaning with --surface (one oscillator, already named q, m, w); leave it out');
      if (flags.in !== 'mass') throw new InputError('--in', `--in ${flags.in} is not available with --surface: the surface closed forms are written in q, m, w (--in mass) only`);
      const words = tokens.flatMap((t) => t.split(',')).map((t) => t.trim()).filter(Boolean);
      const names = words.length ? [...new Set(words.map((w) => parseSurfaceQuantity('quantities', w)))] : [...SURFACE_QUANTITIES];
      const anisotropic = Boolean(flags.anisotropic);
      const derived = deriveSurfaceQuantities(names, anisotropic);
      emitOutput(ctx, flags, format === 'json' ? jsonText(surfaceDerivedToJson(derived, anisotropic), flags) : surfaceDerivedToText(derived, anisotropic, format === 'latex' ? 'latex' : 'text'), 'the closed forms');
      return;
    }
    const layout = layoutOf(flags);
    const words = tokens.flatMap((t) => t.split(',')).map((t) => t.trim()).filter(Boolean);
    const names = words.length ? [...new Set(words.map((w) => parseQuantityName('quantities', w, layout)))] : defaultQuantities(layout);
    const derived = deriveQuantities(layout, names, flags.in);
    emitOutput(ctx, flags, format === 'json' ? jsonText(derivedToJson(layout, derived), flags) : derivedToText(layout, derived, format === 'latex' ? 'latex' : 'text'), 'the closed forms');
  });
}
