/** `dispole surface <A> --surface SPEC`: C3, C5 and the Z^-4 dispersion dipole D4 of an atom in front of a surface. */
import type { Command } from 'commander';
import { separationGrid, type GridSpacing } from '../../engines/exact/curve.js';
import { imageFactor } from '../../engines/surface/image-factor.js';
import { MAX_SURFACE_ORDER, surfaceExactCurve } from '../../engines/surface/exact-surface.js';
import { computeSurface, surfaceNormal, surfaceRoutes } from '../../engines/surface/surface.js';
import { InputError } from '../../model/errors.js';
import { parseSurfaceSpec, SURFACE_SPEC_HELP } from '../../model/surface-spec.js';
import type { LengthUnit } from '../../report/curve-report.js';
import type { UnitSystem } from '../../report/pair-report.js';
import { surfaceCurveJson, surfaceCurveText, surfaceToJson, surfaceToText } from '../../report/surface-report.js';
import { integerIn, loadSpeciesFile, oneOf, positiveNumber, resolveAll, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { EXIT } from '../exit-codes.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import { distanceRange } from '../distance-range.js';

interface SurfaceFlags extends OutputFlags {
  surface: string;
  normal?: string;
  units: UnitSystem;
  species?: string[];
  routes?: string;
  digits: number;
  agreementTol: number;
  quadratureTol: number;
  exact?: boolean;
  from?: number;
  to?: number;
  points: number;
  spacing: GridSpacing;
  length: LengthUnit;
  order: number;
  basisTol: number;
  totalQuanta: number;
}

/** Options that only shape the --exact curve (commander attribute names = option names here). */
const EXACT_ONLY = ['from', 'to', 'points', 'spacing', 'order'] as const;

export function registerSurface(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('surface')
    .summary('an atom in front of a conductor or dielectric: C3, C5 and the Z^-4 dispersion dipole D4, by every route')
    .description(
      'Compute the image (van der Waals) energy E(Z) ≈ −C3/Z^3 − C5/Z^5 and the dispersion-induced dipole mu_z(Z) ≈ D4/Z^4 ' +
        'of an atom at distance Z from a flat surface (z from the surface to the atom; D4 > 0: the dipole points away from ' +
        'the surface), by independent routes, and show how well they agree. Non-retarded; atomic units.\n\n' +
        `A is ${SPECIES_TOKEN_HELP}.\nSurfaces: ${SURFACE_SPEC_HELP}.`,
    )
    .argument('<A>', 'the atom or oscillator')
    .requiredOption('--surface <spec>', `the surface: ${SURFACE_SPEC_HELP}`)
    .option('--normal <x,y,z>', "surface normal in the atom's own axes (tilts an anisotropic centre; default 0,0,1)")
    .option('--routes <list>', `comma-separated routes to run, first = reference (known: ${surfaceRoutes.map((r) => r.name).join(', ')})`)
    .option('--exact', 'also solve a QDO at finite Z in its multipole-expanded image potential (conductor or constant eps)')
    .option('--from <Z>', 'with --exact: smallest distance from the surface (default: four ground-state widths)', positiveNumber)
    .option('--to <Z>', 'with --exact: largest distance (default: 5 × --from)', positiveNumber)
    .option('--points <n>', 'with --exact: number of distances', integerIn(2, 200), 10)
    .option('--spacing <kind>', 'with --exact: grid spacing, log or linear', oneOf(['log', 'linear'] as const), 'log')
    .option('--order <n>', `with --exact: highest multipole order of the image potential (2…${MAX_SURFACE_ORDER})`, integerIn(2, MAX_SURFACE_ORDER), 4);
  addSharedOptions(cmd, ['species', 'units', 'digits', 'agreementTol', 'quadratureTol', 'length', 'basisTol', 'totalQuanta', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((a: string, flags: SurfaceFlags, command: Command) => {
    const format = chooseFormat(flags, ['text', 'json']);
    if (!flags.exact) {
      const given = EXACT_ONLY.find((o) => command.getOptionValueSource(o) === 'cli');
      if (given) throw new InputError(`--${given}`, 'applies with --exact only (the finite-Z solution); add --exact or leave it out');
    }
    const surface = parseSurfaceSpec(flags.surface, '--surface', (path) => ctx.io.readFile(path));
    const normal = flags.normal !== undefined ? surfaceNormal(flags.normal, '--normal') : undefined;
    const [A] = resolveAll([a], loadSpeciesFile(ctx.io, flags.species));
    const routes = flags.routes?.split(',').map((s) => s.trim()).filter(Boolean);
    const result = computeSurface(A, surface, {
      routes,
      agreement: flags.agreementTol,
      relTol: flags.quadratureTol,
      ...(normal ? { normal } : {}),
    });
    let curve: ReturnType<typeof surfaceExactCurve> | undefined;
    if (flags.exact) {
      if (A.kind !== 'drude') throw new InputError('--exact', `the finite-Z solution takes quantum Drude oscillators; ${A.name} is ${A.kind}`);
      const factor = imageFactor(surface);
      if (!factor.instantaneous) throw new InputError('--exact', 'the finite-Z solution needs an instantaneous image: --surface conductor or eps=VALUE');
      const width = Math.max(...A.w.map((w) => 1 / Math.sqrt(2 * A.m * w)));
      const defaultFrom = Number((4 * width).toPrecision(2));
      const { from, to } = distanceRange(flags, defaultFrom);
      curve = surfaceExactCurve(A, separationGrid(from, to, flags.points, flags.spacing), {
        delta: factor.delta(0),
        order: flags.order,
        tolerance: flags.basisTol,
        maxQuanta: flags.totalQuanta,
        normal: result.normal,
      });
    }
    const trusted = result.trusted && (!curve || curve.points.every((p) => p.trusted));
    let text: string;
    if (format === 'json') {
      const json = surfaceToJson(result, flags.units);
      if (curve) Object.assign(json, { curve: surfaceCurveJson(curve, result.coefficients), trusted });
      text = jsonText(json, flags);
    } else {
      text = surfaceToText(result, { digits: flags.digits, units: flags.units });
      if (curve) text += '\n' + surfaceCurveText(curve, result.coefficients, flags.digits, flags.length);
    }
    emitOutput(ctx, flags, text, `the surface result for ${A.name}`);
    if (!trusted) ctx.exitCode = EXIT.untrusted;
  });
}
