/** `dispole cia A B`: collision-induced absorption — spectral moments (classical, Wigner–Kirkwood, quantum) and spectrum. */
import type { Command } from 'commander';
import { computeCia, DEFAULT_CIA_NUMERICS, type CiaNumerics } from '../../engines/cia/cia.js';
import type { DipoleSpec } from '../../engines/cia/dipole.js';
import { ATOMIC_WEIGHTS_SOURCE, standardAtomicWeight } from '../../engines/cia/masses.js';
import type { PotentialSpec } from '../../engines/cia/potential.js';
import { computePair, type PairResult } from '../../engines/pair.js';
import { DIPOLE_TO_AU, ENERGY_TO_HARTREE, parseDipoleArgument, parsePotentialArgument, parseSpectrumRange, parseTwoColumnTable } from '../../model/cia-spec.js';
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import { requireFinite } from '../../model/validate.js';
import { ciaToCsv, ciaToJson, ciaToText } from '../../report/cia-report.js';
import { ciaFigure } from '../../report/svg/cia-figure.js';
import { DEFAULT_DIGITS } from '../../report/format.js';
import { integerIn, loadSpeciesFile, resolveAll, SPECIES_FILE_HELP, SPECIES_TOKEN_HELP } from '../common.js';
import type { CommandContext } from '../context.js';
import { addSharedOptions, chooseFormat, emitOutput, jsonText, type OutputFlags } from '../shared-options.js';
import { EXIT } from '../exit-codes.js';
import { countingProgressBar } from '../progress.js';

interface CiaFlags extends OutputFlags {
  masses?: string;
  potential: string;
  dipole: string;
  temperature: string[];
  spectrum?: string;
  svg?: string;
  digits: number;
  maxPartialWaves: number;
  fast?: boolean;
  species?: string[];
}

/** Numerics of --fast: about 1e-4 relative instead of ~1e-6 (for quick looks and tests). */
const FAST: Partial<CiaNumerics> = { pwTol: 1e-6, relTol: 1e-4, stepFactor: 0.14, energyCutKT: 30, spectrumPanels: 3, spectrumNodes: 5, spectrumEnergyCutKT: 20 };

const collect = (value: string, previous: string[] = []) => [...previous, value];

export function registerCia(program: Command, ctx: CommandContext): void {
  const cmd = program
    .command('cia')
    .summary('collision-induced absorption of a pair: spectral moments (classical, Wigner–Kirkwood, quantum) and the absorption spectrum')
    .description(
      'Translational collision-induced absorption band of the unlike pair A–B (per n1 n2): the spectral moments M0, M1 ' +
        '(quantum, from the two-body Slater sum with bound states; classical exp(−V/kT); and with the Wigner–Kirkwood ' +
        'correction), the classical M2, the band integrals gamma1 and alpha1, and with --spectrum the quantum line shape ' +
        'and absorption coefficient per amagat². The dipole function mu(R) points along +z with A at the origin and B at ' +
        '+R on z. With tt: potentials and exp: dipoles, C6, C8, C10 and D7 (and D9 when available) are the pair’s own ' +
        "from dispole's reference route unless given.\n\n" +
        `Each of A, B is ${SPECIES_TOKEN_HELP}.\n\n` +
        'Exit code 2 for bad input (the field is named), 3 when a sum did not converge (numbers flagged UNTRUSTED).',
    )
    .argument('<A>', 'species at the origin')
    .argument('<B>', 'species at +R on z')
    .option('--masses <MA,MB>', `the two atomic masses in u (default for built-in atoms: standard atomic weights, ${ATOMIC_WEIGHTS_SOURCE})`)
    .requiredOption('--potential <spec>', 'tt:A=<Eh>,b=<1/bohr>[,C6=…,C8=…,C10=…] (Tang–Toennies), hfd:He-He or hfd:Ar-Ar (published HFD sets), or table:<file>[,R=bohr|angstrom][,V=hartree|kelvin|cm-1|mev]')
    .requiredOption('--dipole <spec>', 'exp:mu0=<e·a0>,R0=<bohr>,rho=<bohr>[,gauss=<e·a0>,sigma=<bohr>][,damp=<1/bohr>|none][,D7=…][,D9=…], or table:<file>[,R=bohr|angstrom][,mu=au|debye]')
    .requiredOption('--temperature <T>', 'temperature in K (repeatable)', collect)
    .option('--spectrum <from:to:step>', 'also the absorption spectrum on this wavenumber grid (cm^-1), at every temperature')
    .option('--svg <file>', 'also write a figure: V(R), mu(R) and the spectra')
    .option('--max-partial-waves <n>', 'largest partial wave of the quantum sums (reaching it flags the result unconverged)', integerIn(1, 100000), DEFAULT_CIA_NUMERICS.maxPartialWaves)
    .option('--fast', 'coarser numerics (about 1e-4 relative instead of ~1e-6)');
  // the options every command shares, from their one definition (csv: the spectrum if computed, else the moments)
  addSharedOptions(cmd, ['species', 'digits', 'csv', 'json', 'pretty', 'out', 'force', 'quiet']);
  cmd.action((a: string, b: string, flags: CiaFlags) => {
      const format = chooseFormat(flags, ['text', 'csv', 'json']);
      const [A, B] = resolveAll([a, b], loadSpeciesFile(ctx.io, flags.species));
      if (sameSpecies(A, B)) {
        throw new InputError('B', `${B.name} is the same species as A: a like pair has no induced dipole by symmetry (mu(R) = 0), so no translational collision-induced band`);
      }
      const masses = resolveMasses(flags.masses, [A.name, B.name]);
      const potArg = parsePotentialArgument(flags.potential);
      const dipArg = parseDipoleArgument(flags.dipole);
      let pair: PairResult | undefined;
      const reference = () => (pair ??= computePair(A, B));
      const refText = () => `from dispole's reference route (${reference().routes[0].name}) for ${A.name}–${B.name}${reference().trusted ? '' : ' (UNTRUSTED there)'}`;
      const temperatures = flags.temperature.map((t) => requireTemperature(requireFinite('--temperature', t)));

      let potential: PotentialSpec;
      if (potArg.kind === 'tt') {
        const given = potArg.C6 !== undefined && potArg.C8 !== undefined && potArg.C10 !== undefined;
        const c = given ? undefined : reference().coefficients;
        potential = {
          kind: 'tang-toennies',
          A: potArg.A,
          b: potArg.b,
          C6: potArg.C6 ?? c!.C6,
          C8: potArg.C8 ?? c!.C8 ?? 0,
          C10: potArg.C10 ?? c!.C10 ?? 0,
          dispersionSource: given ? 'given by the user' : refText(),
        };
      } else if (potArg.kind === 'hfd') {
        potential = { kind: 'hfd', set: potArg.set };
        // a published set belongs to one pair of atoms: say so when the species look like another pair
        const element = (name: string) => name.replace(/^tdhf:/, '').replace(/-qdo$/, '');
        const setAtoms = potArg.set.split('-').sort().join('–');
        const pairAtoms = [element(A.name), element(B.name)].sort().join('–');
        if (setAtoms !== pairAtoms) ctx.io.stderr(`dispole: warning: --potential hfd:${potArg.set} is the published ${setAtoms} potential, used here for the pair ${A.name}–${B.name}\n`);
      } else {
        const t = parseTwoColumnTable(ctx.io.readFile(potArg.file), potArg.file, potArg.lengthUnit, ENERGY_TO_HARTREE[potArg.energyUnit]);
        potential = { kind: 'table', file: potArg.file, R: t.R, V: t.values };
      }
      let dipole: DipoleSpec;
      let D7: number | undefined, D9: number | undefined, dSource = 'given by the user';
      if (dipArg.kind === 'exp') {
        dipole = { kind: 'overlap', mu0: dipArg.mu0, R0: dipArg.R0, rho: dipArg.rho, ...(dipArg.gauss ? { gauss: dipArg.gauss } : {}), ...(dipArg.damping !== undefined ? { damping: dipArg.damping } : {}), ...(dipArg.D7 !== undefined ? { D7: dipArg.D7 } : {}), ...(dipArg.D9 !== undefined ? { D9: dipArg.D9 } : {}) };
        if (dipArg.D7 === undefined) {
          D7 = reference().coefficients.D7.total;
          D9 = reference().routes[0].D9?.total;
          dSource = refText();
        }
      } else {
        const t = parseTwoColumnTable(ctx.io.readFile(dipArg.file), dipArg.file, dipArg.lengthUnit, DIPOLE_TO_AU[dipArg.dipoleUnit]);
        dipole = { kind: 'table', file: dipArg.file, R: t.R, mu: t.values };
      }
      const spectrum = flags.spectrum !== undefined ? parseSpectrumRange(flags.spectrum) : undefined;
      const bar = spectrum ? countingProgressBar(ctx.io, { total: 1000, label: 'spectrum (per mille)', quiet: flags.quiet === true }) : undefined;
      let result;
      try {
        result = computeCia({
          names: [A.name, B.name],
          masses: masses.values,
          massSource: masses.source,
          potential,
          dipole,
          dipoleContext: { D7, D9, dispersionSource: dSource },
          temperatures,
          spectrum,
          numerics: { ...(flags.fast ? FAST : {}), maxPartialWaves: flags.maxPartialWaves },
          onProgress: bar ? (done, total) => bar.update(Math.round((1000 * done) / total)) : undefined,
        });
      } finally {
        bar?.stop();
      }
      if (flags.svg !== undefined) {
        ctx.io.writeFile(flags.svg, ciaFigure(result), flags.force === true);
        if (!flags.quiet) ctx.io.stderr(`dispole: wrote the figure to ${flags.svg}\n`);
      }
      const text = format === 'json' ? jsonText(ciaToJson(result), flags) : format === 'csv' ? ciaToCsv(result) : ciaToText(result, flags.digits);
      emitOutput(ctx, flags, text, `the ${A.name}–${B.name} absorption result`);
      if (!result.trusted) {
        ctx.io.stderr(`dispole: UNTRUSTED: ${result.warnings.join('; ')}\n`);
        ctx.exitCode = EXIT.untrusted;
      }
    });
}

/**
 * Temperatures the quantum pair sums are built for, kelvin: below 1 K the partial-wave and bound-state sums need
 * energy resolutions beyond the solver's grids, above 2e4 K the number of partial waves and the radial grid grow
 * past what a command should allocate (30 000 K already takes ~10 s).
 */
export const CIA_TEMPERATURE_RANGE = { min: 1, max: 2e4 } as const;
/** Atomic masses accepted, u (an electron-mass particle is 5.5e-4 u; the heaviest nuclei are below 300 u). */
export const CIA_MASS_RANGE = { min: 1e-3, max: 1e4 } as const;

function requireTemperature(T: number): number {
  const { min, max } = CIA_TEMPERATURE_RANGE;
  if (!(T >= min && T <= max)) throw new InputError('--temperature', `must be from ${min} K to ${max} K, got ${T}`);
  return T;
}

/** Same name, or the same data under another name (a like pair either way). */
function sameSpecies(A: Species, B: Species): boolean {
  if (A.name === B.name) return true;
  const strip = (s: Species) => JSON.stringify({ ...s, name: undefined, source: undefined });
  return strip(A) === strip(B);
}

/** --masses MA,MB, or the standard atomic weights of built-in atoms. */
function resolveMasses(text: string | undefined, names: [string, string]): { values: [number, number]; source: string } {
  if (text !== undefined) {
    const parts = text.split(',');
    if (parts.length !== 2) throw new InputError('--masses', `must be MA,MB in u, got ${JSON.stringify(text)}`);
    const values = parts.map((p, i) => {
      const m = Number(p.trim());
      const { min, max } = CIA_MASS_RANGE;
      if (!(m >= min && m <= max) || p.trim() === '') throw new InputError('--masses', `${i === 0 ? 'MA' : 'MB'} must be a mass from ${min} u to ${max} u, got ${JSON.stringify(p)}`);
      return m;
    }) as [number, number];
    return { values, source: 'given by the user' };
  }
  const std = names.map(standardAtomicWeight);
  const missing = names.filter((_, i) => std[i] === undefined);
  if (missing.length > 0) throw new InputError('--masses', `required: ${missing.join(', ')} has no built-in standard mass (built-in: H, He, Ne, Ar, Kr, Xe); give --masses MA,MB in u`);
  return { values: std as [number, number], source: ATOMIC_WEIGHTS_SOURCE };
}
