/** `dispole density <A> <B> --R … --svg FILE`: where the charge moves, as a colour map of Δρ on the axis plane. */
import type { Command } from 'commander';
import { densityChange, type DensityMap } from '../../engines/exact/density.js';
import { exactSolver } from '../../engines/exact/exact-solver.js';
import { defaultExactOrder, orderCompleteness, sphericalPair } from '../../engines/exact/series-terms.js';
import type { DrudeSpecies } from '../../model/drude.js';
import { bohrToAngstrom, type EnergyUnit } from '../../model/units.js';
import { sig, sigDigits } from '../../report/format.js';
import { InputError } from '../../model/errors.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, notice } from '../shared-options.js';
import { reportUnits, unitName } from '../../report/curve-report.js';
import { densityFigure, type DensityPanel } from '../../report/svg/density-figure.js';
import { integerIn, positiveNumber, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { exactOptions, exactPair, toBohr, type ExactFlags } from './curve.js';
import { computePair } from '../../engines/pair.js';
import { pairSpeciesWarnings } from '../../engines/capabilities.js';
import { accuracyStatementLine, accuracyToJson } from '../../report/accuracy-report.js';
import { EXIT } from '../exit-codes.js';
import { requireDistance } from '../distance-range.js';

interface DensityFlags extends ExactFlags {
  R: number;
  svg?: string;
  grid: number;
  digits: number;
  units: 'atomic' | 'si';
  energyUnit: EnergyUnit;
}

/** Largest gain and loss of a map and where they are (bohr, relative to the centre). */
function extremes(m: DensityMap) {
  let gain = { value: 0, x: 0, z: 0 }, loss = { value: 0, x: 0, z: 0 };
  for (let i = 0; i < m.x.length; i++)
    for (let j = 0; j < m.z.length; j++) {
      const v = m.change[i * m.z.length + j];
      if (v > gain.value) gain = { value: v, x: m.x[i], z: m.z[j] };
      if (v < loss.value) loss = { value: v, x: m.x[i], z: m.z[j] };
    }
  return { gain, loss, isolatedPeak: m.peak };
}

export function registerDensity(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('density')
    .summary('map of the change of each centre’s Drude-particle density at one R (SVG)')
    .description(
      'Solve the pair at separation R (A at the origin, B at +R on z) and draw, for each centre, the change of its ' +
        'Drude-particle density (interacting minus isolated ground state) in the plane containing the axis: ' +
        'one colour family where the particle gains density, another where it loses it, both panels on one shared scale. ' +
        'Prints a summary; --csv and --json export the grids (--json with the summary). --units si adds the dipoles in ' +
        'debye and the interaction energy in --energy-unit (the densities stay in --length units).\n\n' +
        `Each of A, B is ${SPECIES_TOKEN_HELP}.`,
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .requiredOption('--R <distance>', 'separation (in --length units)', positiveNumber)
    .option('--svg <file>', 'write the figure to FILE')
    .option('--grid <n>', 'grid points per side of each map', integerIn(41, 401), 161);
  exactOptions(cmd);
  addSharedOptions(cmd, ['units', 'energyUnit', 'digits', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((a: string, b: string, flags: DensityFlags) => {
    const format = chooseFormat(flags, ['text', 'csv', 'json']);
    if (flags.svg !== undefined && flags.svg === flags.out) throw new InputError('--svg', 'names the same file as --out');
    const [A, B] = exactPair(ctx, [a, b], flags.species);
    const R = toBohr(requireDistance('--R', flags.R, flags.length), flags.length);
    const state = exactSolver(A, B, { order: flags.order ?? defaultExactOrder(A, B), tolerance: flags.basisTol, maxQuanta: flags.totalQuanta }).solve(R);
    const p = state.point;
    // a user-chosen order below the default: say what the dipoles and energy printed here lack
    const orderNotes = orderCompleteness(state.model.order, sphericalPair(A, B)).notes;
    // what the numbers rest on, as `pair` and `curve` say it (MODEL: a fitted QDO's response rests on the model's B)
    const accuracy = computePair(A, B, { routes: ['perturbation'], maxEnergyPower: 6 }).accuracy;
    const modelWarnings = [...pairSpeciesWarnings(A, B), ...accuracy.warnings];
    const unit = unitName(flags.length);
    const len = (x: number) => (flags.length === 'bohr' ? x : bohrToAngstrom(x));
    const maps = (['a', 'b'] as const).map((c) => {
      const s: DrudeSpecies = c === 'a' ? A : B;
      const half = 3.6 * Math.max(...s.w.map((w) => 1 / Math.sqrt(2 * s.m * w)));
      const axis = Float64Array.from({ length: flags.grid }, (_, k) => -half + (2 * half * k) / (flags.grid - 1));
      return densityChange(state, c, axis, axis);
    });
    const panels = maps.map((m, k): DensityPanel => {
      const s = k === 0 ? A : B;
      const width = (w: number) => len(1 / Math.sqrt(2 * s.m * w));
      return {
        label: k === 0 ? 'A' : 'B',
        name: s.name,
        x: Float64Array.from(m.x, len),
        z: Float64Array.from(m.z, len),
        change: flags.length === 'bohr' ? m.change : Float64Array.from(m.change, (v) => v / bohrToAngstrom(1) ** 3),
        partnerSide: k === 0 ? 1 : -1,
        width: { perp: width(s.w[0]), z: width(s.w[2]) },
      };
    }) as [DensityPanel, DensityPanel];
    const status = p.trusted ? '' : `UNTRUSTED: ${p.reasons.join('; ')}`;
    // --units si: dipoles in debye, the energy in --energy-unit (CODATA 2018, the conversions of curve)
    const u = reportUnits({ units: flags.units, energyUnit: flags.energyUnit });
    const siLine = (f: (x: number) => string, mu: string, muB: string) =>
      `SI (CODATA 2018): ${mu} = ${f(u.mu(p.muA))} D, ${muB} = ${f(u.mu(p.muB))} D, E_int = ${f(u.e(p.energy))} ${u.eText}`;
    const footer = [
      `Exact ground state, multipole order ${state.model.order}: basis ${p.quanta} quanta, dimension ${p.dimension} (${p.fullDimension} without the L_{z} = 0 and mirror reduction).`,
      u.si
        ? `Induced dipoles μ_{A,z} = ${sig(u.mu(p.muA), 5)} D, μ_{B,z} = ${sig(u.mu(p.muB), 5)} D; interaction energy ${sig(u.e(p.energy), 5)} ${u.eText.replace('^-1', '^{-1}')}. Dotted: half maximum of the isolated density.`
        : `Induced dipoles μ_{A,z} = ${sig(p.muA, 5)} e a_{0}, μ_{B,z} = ${sig(p.muB, 5)} e a_{0}; interaction energy ${sig(p.energy, 5)} E_{h}. Dotted: half maximum of the isolated density.`,
      ...(status ? [status.length > 150 ? status.slice(0, 147) + '…' : status] : []),
      ...(orderNotes.length ? [`FLAGGED: multipole order ${state.model.order} is below the default; see the text report.`] : []),
    ];
    const separation = `R = ${sig(flags.R, 5)} ${unit}`;
    if (flags.svg !== undefined) {
      const svg = densityFigure({
        title: `Change of the Drude-particle densities, ${A.name} – ${B.name} at ${separation} (plane y = 0)`,
        panels,
        lengthUnit: unit,
        densityUnit: flags.length === 'bohr' ? 'a_{0}^{-3}' : 'Å^{-3}',
        separation,
        footer,
      });
      ctx.io.writeFile(flags.svg, svg, flags.force);
      notice(ctx, flags, `wrote the figure to ${flags.svg}`);
    }
    const densityUnit = flags.length === 'bohr' ? 'a0^-3' : 'angstrom^-3';
    const summary = {
      R: flags.R,
      R_bohr: R,
      unit: flags.length,
      hamiltonian: { multipoleOrder: state.model.order, ...(orderNotes.length ? { incomplete: orderNotes } : {}) },
      basis: { quanta: p.quanta, dimension: p.dimension, dimensionUnreduced: p.fullDimension, residual: p.residual },
      muA: p.muA,
      muB: p.muB,
      energy: p.energy,
      densityChange: { a: extremes(maps[0]), b: extremes(maps[1]), units: 'a0^-3 (positions in bohr relative to the centre)' },
      converged: p.converged,
      trusted: p.trusted,
      reasons: p.reasons,
      ...(u.si ? { si: { units: { dipole: 'debye', energy: flags.energyUnit, constants: 'CODATA 2018' }, muA: u.mu(p.muA), muB: u.mu(p.muB), energy: u.e(p.energy) } } : {}),
      ...(flags.svg !== undefined ? { svg: flags.svg } : {}),
      accuracy: accuracyToJson(accuracy),
      warnings: [...orderNotes, ...modelWarnings],
    };
    let text: string;
    if (format === 'json') {
      const grid = (d: DensityPanel) => ({ x: Array.from(d.x), z: Array.from(d.z), change: Array.from(d.change) });
      text = jsonText({ ...summary, grid: { units: { length: flags.length, density: densityUnit }, layout: 'change[i * z.length + j] at (x[i], z[j]), relative to the centre', a: grid(panels[0]), b: grid(panels[1]) } }, flags);
    } else if (format === 'csv') {
      const lines = [
        `# dispole: change of the Drude-particle density, ${A.name} – ${B.name} at ${separation}, plane y = 0; x across and z along the axis, relative to each centre`,
        `# trusted: ${p.trusted}${p.trusted ? '' : ` (${p.reasons.join('; ')})`}`,
        `# ${accuracyStatementLine(accuracy, A.name, B.name)}`,
        ...modelWarnings.map((w) => `# warning: ${w}`),
        ...(u.si ? [`# ${siLine(String, 'mu_A,z', 'mu_B,z')}`] : []),
        `centre,x_${flags.length},z_${flags.length},delta_rho_${densityUnit.replace('^', '')}`,
      ];
      for (const d of panels)
        for (let i = 0; i < d.x.length; i++) for (let j = 0; j < d.z.length; j++) lines.push(`${d.label},${d.x[i]},${d.z[j]},${d.change[i * d.z.length + j]}`);
      text = lines.join('\n') + '\n';
    } else {
      const f = (x: number) => sigDigits(x, flags.digits);
      const lines = [`Pair ${A.name} – ${B.name} at ${separation}: exact ground state through multipole order ${state.model.order}`, `  basis ${p.quanta} quanta, dimension ${p.dimension} (${p.fullDimension} unreduced), residual ${sigDigits(p.residual, 2, 'exponent')} Eh`, `  mu_A,z = ${f(p.muA)} e a0, mu_B,z = ${f(p.muB)} e a0, E_int = ${f(p.energy)} Eh`];
      if (u.si) lines.push(`  ${siLine(f, 'mu_A,z', 'mu_B,z')}`);
      for (const [k, e] of [['A', summary.densityChange.a], ['B', summary.densityChange.b]] as const)
        lines.push(`  ${k}: largest gain ${f(e.gain.value)} a0^-3 at (x, z) = (${f(e.gain.x)}, ${f(e.gain.z)}) bohr, largest loss ${f(e.loss.value)} a0^-3 at (${f(e.loss.x)}, ${f(e.loss.z)}) bohr; isolated peak ${f(e.isolatedPeak)} a0^-3`);
      if (flags.svg !== undefined) lines.push(`  wrote ${flags.svg}`);
      if (!p.trusted) lines.push(`UNTRUSTED: ${p.reasons.join('; ')}`);
      lines.push(accuracyStatementLine(accuracy, A.name, B.name));
      for (const n of [...orderNotes, ...modelWarnings]) lines.push(`warning: ${n}`);
      text = lines.join('\n') + '\n';
    }
    emitOutput(ctx, flags, text, 'the density summary');
    if (!p.trusted) ctx.exitCode = EXIT.untrusted;
  });
}
