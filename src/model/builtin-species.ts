/**
 * Built-in species, resolvable by name on the command line.
 *
 * The demo set is INVENTED for the worked examples: the noble-gas-like atoms of the fictional moon Tessaly
 * (Quelon, Virid, Sorrel, Tarnet) and one elongated anisotropic centre (Spindlet). Their parameters are
 * made up, chosen only to be of a realistic size; they describe no real substance.
 */
import { ATOM_LIBRARY, HYDROGEN_EXACT } from '../data/atom-library.js';
import { drude, drudeAnisotropic, drudeFromTargets } from './drude.js';
import { InputError } from './errors.js';
import { hydrogenic } from './hydrogenic.js';
import { parseInlineSpecies } from './species-kinds.js';
import type { Species } from './species.js';

const INVENTED = 'invented for the worked examples (fictional moon Tessaly); not a real substance';

/** The invented demo species, in a fixed order. */
export const demoSpecies: readonly Species[] = [
  drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon', INVENTED),
  drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid', INVENTED),
  drude({ q: 0.9, m: 0.31, w: 0.95 }, 'Sorrel', INVENTED),
  drude({ q: 1.8, m: 0.6, w: 0.48 }, 'Tarnet', INVENTED),
  drudeAnisotropic({ q: 1.2, m: 0.45, wx: 0.8, wy: 0.8, wz: 0.55 }, 'Spindlet', INVENTED),
];

/**
 * Real atoms: H computed from first principles (kind hydrogenic), and QDOs fitted to published (alpha, C6, C8):
 * H-qdo (hydrogen's exact values, to compare the model with the exact atom) and He, Ne, Ar, Kr, Xe
 * (src/data/atom-library.ts names the source of every value).
 */
export const atomLibrarySpecies: readonly Species[] = [
  hydrogenic({ Z: 1 }, 'H', 'hydrogen computed from first principles (Sturmian pseudo-spectrum; exact non-relativistic, infinite nuclear mass)'),
  drudeFromTargets(
    { alpha: HYDROGEN_EXACT.alpha1.value, C6: HYDROGEN_EXACT.C6.value, C8: HYDROGEN_EXACT.C8.value },
    'H-qdo',
    `QDO fitted to hydrogen's exact alpha = 9/2 and C6, C8 (${HYDROGEN_EXACT.C6.source})`,
  ),
  ...ATOM_LIBRARY.map((a) =>
    drudeFromTargets(
      { alpha: a.alpha.value, C6: a.C6.value, C8: a.C8.value },
      a.symbol,
      `QDO fitted to alpha (${a.alpha.source}), C6 (${a.C6.source}), C8 (${a.C8.source})`,
    ),
  ),
];

/** Extra built-in collections register here; the demo set comes first, then the atom library. */
const collections: Array<() => readonly Species[]> = [() => demoSpecies, () => atomLibrarySpecies];

/** Register another collection of built-in species (used by data modules at import time). */
export function registerBuiltinCollection(provider: () => readonly Species[]): void {
  collections.push(provider);
}

/** All built-in species, demo set first. */
export function builtinSpecies(): Species[] {
  return collections.flatMap((c) => c());
}

/**
 * Resolve a command-line species token: an inline spec (`kind:…`), a name from a species file,
 * or a built-in name (case-insensitive). Unknown names list what is available.
 */
export function resolveSpecies(token: string, fromFile?: ReadonlyMap<string, Species>): Species {
  if (token.includes(':')) return parseInlineSpecies(token);
  const inFile = fromFile?.get(token);
  if (inFile) return inFile;
  const all = builtinSpecies();
  const hit = all.find((s) => s.name === token) ?? all.find((s) => s.name.toLowerCase() === token.toLowerCase());
  if (hit) return hit;
  const names = [...(fromFile?.keys() ?? []), ...all.map((s) => s.name)];
  throw new InputError(
    token,
    `is not a known species; use a built-in name (${names.join(', ')}), a name from --species FILE, or an inline spec like drude:q=1.2,m=0.4,w=0.9`,
  );
}
