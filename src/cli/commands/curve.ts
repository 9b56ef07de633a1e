/** `dispole curve <A> <B>`: induced dipoles and interaction energy against R from the finite-R exact solution. */
import type { Command } from 'commander';
import { exactCurve, separationGrid, type GridSpacing } from '../../engines/exact/curve.js';
import { catastropheDistance } from '../../engines/exact/localisation.js';
import { axialProblem, MAX_EXACT_ORDER } from '../../engines/exact/pair-hamiltonian.js';
import { defaultExactOrder, sphericalPair } from '../../engines/exact/series-terms.js';
import { thirdOrderD10 } from '../../engines/perturbation/multi-order.js';
import { harmonicSpace } from '../../engines/perturbation/harmonic-space.js';
import { d7 } from '../../engines/route.js';
import { computePair } from '../../engines/pair.js';
import type { DrudeSpecies } from '../../model/drude.js';
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import { angstromToBohr } from '../../model/units.js';
import { curveData, curveToCsv, curveToJson, curveToText, type CurveCoefficients, type LengthUnit } from '../../report/curve-report.js';
import { curveFigure } from '../../report/svg/curve-figure.js';
import { integerIn, loadSpeciesFile, oneOf, positiveNumber, resolveAll, SPECIES_TOKEN_HELP } from '../common.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, notice, type OutputFlags } from '../shared-options.js';
import { distanceRange } from '../distance-range.js';
import { builtinSpecies } from '../../model/builtin-species.js';
import type { EnergyUnit } from '../../model/units.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';

/** Options shared by the commands built on the exact solution (curve, density). */
export interface ExactFlags extends OutputFlags {
  species?: string[];
  length: LengthUnit;
  /** Absent: {@link defaultExactOrder} (every printed series term complete). */
  order?: number;
  basisTol: number;
  totalQuanta: number;
}

/** Register the options of {@link ExactFlags} on a command (the shared ones from src/cli/shared-options.ts). */
export function exactOptions(cmd: Command): Command {
  cmd.option(
    '--order <n>',
    'highest multipole order of the coupling: 2 dipole–dipole, 3 adds dipole–quadrupole, 4 adds quadrupole–quadrupole and dipole–octupole, … (default: 6 for isotropic pairs, 7 for anisotropic ones, so every printed series term is complete; a lower order flags the columns it gets wrong)',
    integerIn(2, MAX_EXACT_ORDER),
  );
  return addSharedOptions(cmd, ['species', 'length', 'basisTol', 'totalQuanta']);
}

/** What the exact engine could take instead of a species it refuses (said in the error message). */
function exactAlternative(s: Species): string {
  const standIn = builtinSpecies().find((b) => b.kind === 'drude' && b.name.toLowerCase() === `${s.name.toLowerCase()}-qdo`);
  const qdo = standIn ? `use ${standIn.name} (a QDO fitted to ${s.name}'s alpha, C6 and C8)` : 'use a built-in QDO (see `dispole species`) or an inline drude:q=…,m=…,w=… spec';
  return `${qdo}; \`dispole pair\` gives ${s.name}'s coefficients by the routes that take it`;
}

/** Resolve A and B and check the exact engine can take them (Drude oscillators, axial about the bond axis). */
export function exactPair(ctx: CommandContext, tokens: [string, string], files?: string | readonly string[]): [DrudeSpecies, DrudeSpecies] {
  const pair = resolveAll(tokens, loadSpeciesFile(ctx.io, files));
  return pair.map((s: Species, i) => {
    const why = axialProblem(s);
    if (!why && s.kind === 'drude') return s;
    const field = i === 0 ? 'A' : 'B';
    if (s.kind !== 'drude') throw new InputError(field, `${why}; the finite-R exact solution takes Drude oscillators only: ${exactAlternative(s)}`);
    throw new InputError(field, `${why}; the exact solution takes Drude oscillators with wx = wy`);
  }) as [DrudeSpecies, DrudeSpecies];
}

/** A length from the command line in bohr. */
export const toBohr = (value: number, unit: LengthUnit): number => (unit === 'bohr' ? value : angstromToBohr(value));

/** C6, C8, D7, D9 (and the first-order terms of anisotropic centres) from the perturbation route, for the asymptotic series. */
export function asymptoticCoefficients(A: DrudeSpecies, B: DrudeSpecies): CurveCoefficients {
  const ref = computePair(A, B, { routes: ['perturbation'], maxEnergyPower: 8 });
  const perm = ref.routes[0].permanent;
  const { C6, C8, D7, D9 } = ref.coefficients;
  // spherical pairs: the third-order R^-10 term too (the next term after D9; tests/engines/d9-series.test.ts)
  const D10 = sphericalPair(A, B) ? thirdOrderD10(harmonicSpace(A, 3), harmonicSpace(B, 3)) : undefined;
  return {
    C6,
    C8,
    D7,
    ...(D9 ? { D9 } : {}),
    ...(D10 ? { D10: d7(D10.a, D10.b) } : {}),
    ...(perm ? { E5: perm.E5, E7: perm.E7, D4: perm.D4, D6: perm.D6, D8: perm.D8 } : {}),
  };
}

interface CurveFlags extends ExactFlags {
  from?: number;
  to?: number;
  points: number;
  spacing: GridSpacing;
  svg?: string;
  digits: number;
  units: 'atomic' | 'si';
  energyUnit: EnergyUnit;
}

export function registerCurve(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('curve')
    .summary('induced dipoles mu_A, mu_B and interaction energy against R (finite-R exact solution)')
    .description(
      'Solve the pair at a grid of separations (A at the origin, B at +R on z) in a harmonic basis converged in size, ' +
        'and list mu_A,z, mu_B,z, their sum and the interaction energy beside the asymptotic series (the dipole through ' +
        'D9/R^9, the energy through C8/R^8, first-order terms of anisotropic centres included) and exact ÷ series − 1. ' +
        'The default --order makes every printed term complete; a lower one flags the columns it gets wrong. Points the basis cannot resolve are flagged UNTRUSTED with the reason (exit code 3).\n\n' +
        `Each of A, B is ${SPECIES_TOKEN_HELP}; the exact solution takes Drude oscillators (for the atoms: H-qdo, He-qdo … Xe-qdo).`,
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .option('--from <R>', 'smallest separation, in --length units (default: a few ground-state widths, outside the polarisation catastrophe)', positiveNumber)
    .option('--to <R>', 'largest separation, in --length units (default: 5 × --from)', positiveNumber)
    .option('--points <n>', 'number of separations', integerIn(2, 400), 25)
    .option('--spacing <kind>', 'grid spacing: log or linear', oneOf(['log', 'linear'] as const), 'log')
    .option('--svg <file>', 'also write a figure (log–log |mu| and −ΔE against R with the asymptotes) to FILE');
  exactOptions(cmd);
  addSharedOptions(cmd, ['units', 'energyUnit', 'digits', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((a: string, b: string, flags: CurveFlags) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json']);
    const [A, B] = exactPair(ctx, [a, b], flags.species);
    const order = flags.order ?? defaultExactOrder(A, B);
    const width = (s: DrudeSpecies) => Math.max(...s.w.map((w) => 1 / Math.sqrt(2 * s.m * w)));
    // higher multipole terms bring the escape barrier closer: from order 4 on, start at 4 widths instead of 3
    const widths = order >= 4 ? 4 : 3;
    const defaultFrom = Number(Math.max(widths * (width(A) + width(B)), 1.5 * catastropheDistance(A, B)).toPrecision(2));
    const { from, to } = distanceRange(flags, defaultFrom);
    if (flags.svg !== undefined && flags.out !== undefined && flags.svg === flags.out) throw new InputError('--svg', 'names the same file as --out');
    const R = separationGrid(from, to, flags.points, flags.spacing);
    const curve = exactCurve(A, B, R, { order, tolerance: flags.basisTol, maxQuanta: flags.totalQuanta });
    const data = curveData(A, B, curve, asymptoticCoefficients(A, B), { tolerance: flags.basisTol, lengthUnit: flags.length });
    const units = { units: flags.units, energyUnit: flags.energyUnit };
    const text = format === 'json' ? jsonText(curveToJson(data, units), flags) : format === 'csv' ? curveToCsv(data, units) : curveToText(data, { digits: flags.digits, ...units });
    if (flags.svg !== undefined) {
      ctx.io.writeFile(flags.svg, curveFigure(data, units), flags.force);
      notice(ctx, flags, `wrote the figure to ${flags.svg}`);
    }
    emitOutput(ctx, flags, text, 'the curve');
    if (!data.trusted) ctx.exitCode = EXIT.untrusted;
  });
}
