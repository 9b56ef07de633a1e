/**
 * Every CLI command, in help order. A new command is one file in this folder plus one entry here.
 *
 * Commands are loaded on demand: a run imports only the module of the command it names (and so only that command's
 * engines), while `--help`, `--version` and unknown commands need just the names, usage terms and summaries kept
 * here. tests/cli/command-index.test.ts checks that each entry's term and summary are the ones its module registers.
 */
import type { Command } from 'commander';
import type { CommandContext } from '../context.js';

export type CommandRegistrar = (program: Command, ctx: CommandContext) => void;

export interface CommandEntry {
  name: string;
  /** The command's line in the top-level help: name, "[options]" and its arguments. */
  term: string;
  summary: string;
  /** Imports the command's module; resolves to its registrar. */
  load: () => Promise<CommandRegistrar>;
}

export const commandIndex: readonly CommandEntry[] = [
  {
    name: 'pair',
    term: 'pair [options] <A> <B>',
    summary: 'coefficients C6, C8, C10 and dispersion dipoles D7 of one pair, by every route',
    load: async () => (await import('./pair.js')).registerPair,
  },
  {
    name: 'surface',
    term: 'surface [options] <A>',
    summary: 'an atom in front of a conductor or dielectric: C3, C5 and the Z^-4 dispersion dipole D4, by every route',
    load: async () => (await import('./surface.js')).registerSurface,
  },
  {
    name: 'cluster',
    term: 'cluster [options] <geometry>',
    summary: 'N dipole-coupled oscillators: many-body dispersion energy, screened alpha and C6, induced dipoles',
    load: async () => (await import('./cluster.js')).registerCluster,
  },
  {
    name: 'curve',
    term: 'curve [options] <A> <B>',
    summary: 'induced dipoles mu_A, mu_B and interaction energy against R (finite-R exact solution)',
    load: async () => (await import('./curve.js')).registerCurve,
  },
  {
    name: 'density',
    term: 'density [options] <A> <B>',
    summary: 'map of the change of each centre’s Drude-particle density at one R (SVG)',
    load: async () => (await import('./density.js')).registerDensity,
  },
  {
    name: 'derive',
    term: 'derive [options] [quantities...]',
    summary: 'exact closed forms of C6, C8, C10 and D7 for quantum Drude oscillator pairs',
    load: async () => (await import('./derive.js')).registerDerive,
  },
  {
    name: 'check',
    term: 'check [options] <formula>',
    summary: "compare a formula with the engine's closed form (exit 0 identical, 1 differs, 2 bad input)",
    load: async () => (await import('./check.js')).registerCheck,
  },
  {
    name: 'species',
    term: 'species [options]',
    summary: 'list the built-in species with their parameters and sources',
    load: async () => (await import('./species.js')).registerSpecies,
  },
  {
    name: 'table',
    term: 'table [options] [species...]',
    summary: 'C6, C8 and D7 of every pair of a set of species, as text, CSV, JSON, Markdown or LaTeX',
    load: async () => (await import('./table.js')).registerTable,
  },
  {
    name: 'cia',
    term: 'cia [options] <A> <B>',
    summary: 'collision-induced absorption of a pair: spectral moments (classical, Wigner–Kirkwood, quantum) and the absorption spectrum',
    load: async () => (await import('./cia.js')).registerCia,
  },
];

/**
 * The command an argument list runs (`dispole NAME …` or `dispole help NAME`), or undefined when it names none
 * (top-level help, version, an unknown command).
 */
export function selectedCommand(argv: readonly string[]): CommandEntry | undefined {
  const name = argv[0] === 'help' ? argv[1] : argv[0];
  return commandIndex.find((entry) => entry.name === name);
}
