/** `dispole curve <A> <B>`: induced dipoles and interaction energy against R from the finite-R exact solution. */
import type { Command } from 'commander';
import { exactCurve, separationGrid, type GridSpacing } from '../../engines/exact/curve.js';
import { catastropheDistance } from '../../engines/exact/localisation.js';
import { axialProblem, MAX_EXACT_ORDER } from '../../engines/exact/pair-hamiltonian.js';
import { computePair } from '../../engines/pair.js';
import type { DrudeSpecies } from '../../model/drude.js';
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import { angstromToBohr } from '../../model/units.js';
import { curveData, curveToCsv, curveToJson, curveToText, type CurveCoefficients, type LengthUnit } from '../../report/curve-report.js';
import { curveFigure } from '../../report/svg/curve-figure.js';
import { integerIn, loadSpeciesFile, oneOf, positiveNumber, resolveAll, SPECIES_FILE_HELP, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';

/** Options shared by the commands built on the exact solution (curve, density). */
export interface ExactFlags {
  species?: string;
  length: LengthUnit;
  order: number;
  tolerance: number;
  maxQuanta: number;
  force?: boolean;
}

/** Register the options of {@link ExactFlags} on a command. */
export function exactOptions(cmd: Command): Command {
  return cmd
    .option('--length <unit>', 'length unit of R on input and output: bohr or angstrom', oneOf(['bohr', 'angstrom'] as const), 'bohr')
    .option('--order <n>', 'highest multipole order of the coupling: 2 dipole–dipole, 3 adds dipole–quadrupole, 4 adds quadrupole–quadrupole and dipole–octupole', integerIn(2, MAX_EXACT_ORDER), 3)
    .option('--tolerance <x>', 'relative change allowed between successive basis sizes', positiveNumber, 1e-10)
    .option('--max-quanta <n>', 'largest basis: total quanta on both centres', integerIn(6, 40), 24)
    .option('--species <file>', SPECIES_FILE_HELP)
    .option('--force', 'replace an existing output file');
}

/** Resolve A and B and check the exact engine can take them (Drude oscillators, axial about the bond axis). */
export function exactPair(ctx: CommandContext, tokens: [string, string], file?: string): [DrudeSpecies, DrudeSpecies] {
  const pair = resolveAll(tokens, loadSpeciesFile(ctx.io, file));
  return pair.map((s: Species, i) => {
    const why = axialProblem(s);
    if (why || s.kind !== 'drude') throw new InputError(i === 0 ? 'A' : 'B', `${why}; the exact solution takes Drude oscillators with wx = wy`);
    return s;
  }) as [DrudeSpecies, DrudeSpecies];
}

/** A length from the command line in bohr. */
export const toBohr = (value: number, unit: LengthUnit): number => (unit === 'bohr' ? value : angstromToBohr(value));

/** C6, C8, D7 (and first-order terms of anisotropic centres) from the perturbation route, for the asymptotic forms. */
export function asymptoticCoefficients(A: DrudeSpecies, B: DrudeSpecies): CurveCoefficients {
  const ref = computePair(A, B, { routes: ['perturbation'], maxEnergyPower: 8 });
  const perm = ref.routes[0].permanent;
  return { C6: ref.coefficients.C6, C8: ref.coefficients.C8, D7: ref.coefficients.D7, ...(perm ? { E5: perm.E5, D4: perm.D4 } : {}) };
}

interface CurveFlags extends ExactFlags {
  from?: number;
  to?: number;
  points: number;
  spacing: GridSpacing;
  csv?: boolean;
  json?: boolean;
  svg?: string;
  digits: number;
}

export function registerCurve(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('curve')
    .summary('induced dipoles mu_A, mu_B and interaction energy against R (finite-R exact solution)')
    .description(
      'Solve the pair at a grid of separations (A at the origin, B at +R on z) in a harmonic basis converged in size, ' +
        'and list mu_A,z, mu_B,z, their sum and the interaction energy beside the asymptotic forms D7/R^7 and ' +
        '−C6/R^6 − C8/R^8. Points the basis cannot resolve are flagged UNTRUSTED with the reason (exit code 3).\n\n' +
        `Each of A, B is ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .option('--from <R>', 'smallest separation (default: a few ground-state widths, outside the polarisation catastrophe)', positiveNumber)
    .option('--to <R>', 'largest separation (default: 5 × --from)', positiveNumber)
    .option('--points <n>', 'number of separations', integerIn(2, 400), 25)
    .option('--spacing <kind>', 'grid spacing: log or linear', oneOf(['log', 'linear'] as const), 'log')
    .option('--csv', 'print CSV (full precision) instead of the table')
    .option('--json', 'print one JSON object instead of the table')
    .option('--svg <file>', 'also write a figure (log–log |mu| and −ΔE against R with the asymptotes) to FILE')
    .option('--digits <n>', 'significant digits in the table', integerIn(3, 17), 7);
  exactOptions(cmd).action((a: string, b: string, flags: CurveFlags) => {
    if (flags.csv && flags.json) throw new InputError('--csv', 'cannot be combined with --json (choose one output format)');
    const [A, B] = exactPair(ctx, [a, b], flags.species);
    const width = (s: DrudeSpecies) => Math.max(...s.w.map((w) => 1 / Math.sqrt(2 * s.m * w)));
    const defaultFrom = Number(Math.max(3 * (width(A) + width(B)), 1.5 * catastropheDistance(A, B)).toPrecision(2));
    const from = flags.from !== undefined ? toBohr(flags.from, flags.length) : defaultFrom;
    const to = flags.to !== undefined ? toBohr(flags.to, flags.length) : 5 * from;
    if (!(to > from)) throw new InputError('--to', `must be larger than --from (${flags.from ?? `${defaultFrom} bohr`}), got ${flags.to ?? `${to} bohr`}`);
    const R = separationGrid(from, to, flags.points, flags.spacing);
    const curve = exactCurve(A, B, R, { order: flags.order, tolerance: flags.tolerance, maxQuanta: flags.maxQuanta });
    const data = curveData(A, B, curve, asymptoticCoefficients(A, B), { tolerance: flags.tolerance, lengthUnit: flags.length });
    if (flags.svg !== undefined) {
      ctx.io.writeFile(flags.svg, curveFigure(data), flags.force);
      ctx.io.stderr(`dispole: wrote the figure to ${flags.svg}\n`);
    }
    ctx.io.stdout(flags.json ? JSON.stringify(curveToJson(data)) + '\n' : flags.csv ? curveToCsv(data) : curveToText(data, flags.digits));
    if (!data.trusted) ctx.exitCode = EXIT.untrusted;
  });
}
