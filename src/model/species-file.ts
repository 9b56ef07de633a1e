/**
 * Species files (YAML or JSON; JSON is valid YAML). Shape:
 *
 *   species:
 *     Quelon:                 # the name used on the command line
 *       kind: drude           # a kind from species-kinds.ts
 *       q: 1.1                # the kind's fields, atomic units
 *       m: 0.38
 *       w: 0.72
 *       source: invented      # optional provenance, carried into reports
 *
 * Pure: takes the file's text; the CLI reads the file.
 */
import { yamlModule } from '../lazy-modules.js';
import { InputError } from './errors.js';
import { buildSpecies } from './species-kinds.js';
import type { Species } from './species.js';

/** Parse a species file's text into species keyed by name, with errors naming the file and entry. */
export function parseSpeciesFile(text: string, fileName: string): Map<string, Species> {
  let doc: unknown;
  try {
    doc = yamlModule().parse(text);
  } catch (e) {
    throw new InputError(fileName, `is not valid YAML or JSON: ${(e as Error).message.split('\n')[0]}`);
  }
  if (!isRecord(doc) || !isRecord(doc.species)) {
    throw new InputError(`${fileName}: species`, 'is missing: the file needs a top-level "species" mapping of name → entry');
  }
  const out = new Map<string, Species>();
  for (const [name, entry] of Object.entries(doc.species)) {
    const where = `${fileName}: species.${name}`;
    if (!isRecord(entry)) throw new InputError(where, 'must be a mapping with kind and its fields');
    const { kind, source, ...fields } = entry;
    if (typeof kind !== 'string') throw new InputError(`${where}.kind`, 'is missing (e.g. kind: drude)');
    if (source !== undefined && typeof source !== 'string') throw new InputError(`${where}.source`, 'must be text');
    try {
      out.set(name, buildSpecies(kind, fields, name, source));
    } catch (e) {
      if (e instanceof InputError) throw new InputError(`${fileName}: species.${e.field}`, e.problem);
      throw e;
    }
  }
  if (out.size === 0) throw new InputError(`${fileName}: species`, 'is empty');
  return out;
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}
