/** Option parsers and helpers shared by the CLI commands. */
import { InvalidArgumentError } from 'commander';
import { parseSpeciesFile } from '../model/species-file.js';
import { isResponseDataFile, responseDataSpeciesFile } from '../model/response-data.js';
import { builtinSpecies, resolveSpecies } from '../model/builtin-species.js';
import { InputError } from '../model/errors.js';
import type { Species } from '../model/species.js';
import type { CliIO } from './io.js';

/** Commander parser for a positive number option. */
export function positiveNumber(value: string): number {
  const x = Number(value);
  if (!(x > 0) || !Number.isFinite(x)) throw new InvalidArgumentError(`must be a finite number > 0, got "${value}"`);
  return x;
}

/** Commander parser for an integer in [min, max]. */
export function integerIn(min: number, max: number) {
  return (value: string): number => {
    const x = Number(value);
    if (!Number.isInteger(x) || x < min || x > max) throw new InvalidArgumentError(`must be an integer from ${min} to ${max}, got "${value}"`);
    return x;
  };
}

/** Commander parser for one of a list of words. */
export function oneOf<T extends string>(allowed: readonly T[]) {
  return (value: string): T => {
    if (!(allowed as readonly string[]).includes(value)) throw new InvalidArgumentError(`must be one of ${allowed.join(', ')}, got "${value}"`);
    return value as T;
  };
}

/**
 * Read the `--species FILE` options (none, one or several; YAML/JSON species files and .csv response-data files
 * may be mixed) into one name → species map. A name defined in two files, or a file redefining a built-in name
 * (case-insensitive, as names resolve), is bad input: the same name must always mean the same species.
 */
export function loadSpeciesFile(io: CliIO, paths: string | readonly string[] | undefined): Map<string, Species> | undefined {
  const list = paths === undefined ? [] : typeof paths === 'string' ? [paths] : paths;
  if (list.length === 0) return undefined;
  const merged = new Map<string, Species>();
  const origin = new Map<string, string>();
  const builtins = new Map(builtinSpecies().map((s) => [s.name.toLowerCase(), s.name]));
  for (const path of list) {
    const text = io.readFile(path);
    // a .csv file is one species' response data (src/model/response-data.ts)
    const file = isResponseDataFile(path) ? responseDataSpeciesFile(text, path) : parseSpeciesFile(text, path);
    for (const [name, species] of file) {
      const builtin = builtins.get(name.toLowerCase());
      if (builtin !== undefined) {
        throw new InputError(`${path}: species.${name}`, `redefines the built-in species ${builtin}; give it a name of its own (e.g. ${name}-custom)`);
      }
      const first = origin.get(name);
      if (first !== undefined) throw new InputError(`${path}: species.${name}`, `is defined already in ${first}; define each name once over all --species files`);
      origin.set(name, path);
      merged.set(name, species);
    }
  }
  return merged;
}

/** Resolve positional species tokens against the file and the built-ins. */
export function resolveAll(tokens: readonly string[], fromFile?: ReadonlyMap<string, Species>): Species[] {
  return tokens.map((t) => resolveSpecies(t, fromFile));
}

/** The `--species FILE` help text, shared so every command says the same. */
export const SPECIES_FILE_HELP = 'YAML or JSON file of species (top-level "species" mapping name → {kind, fields…}), or a .csv file of response data (one species)';

/** The species-token help text. */
export const SPECIES_TOKEN_HELP =
  'a built-in name (see `dispole species`), a name from --species FILE, or an inline spec such as drude:q=1.2,m=0.4,w=0.9, drude:q=1,m=1,wx=0.8,wy=0.8,wz=1.1, fit:alpha=1.38,C6=1.46,C8=14.1 or tdhf:Ar (time-dependent Hartree–Fock closed-shell atom or ion, e.g. tdhf:Z=11,charge=1)';
