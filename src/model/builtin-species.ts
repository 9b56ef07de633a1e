/**
 * Built-in species, resolvable by name on the command line.
 *
 * The demo set is INVENTED for the worked examples: the noble-gas-like atoms of the fictional moon Tessaly
 * (Quelon, Virid, Sorrel, Tarnet) and one elongated anisotropic centre (Spindlet). Their parameters are
 * made up, chosen only to be of a realistic size; they describe no real substance.
 */
import { ATOM_LIBRARY, HYDROGEN_EXACT, type AtomRecord, type SourcedValue } from '../data/atom-library.js';
import { drude, drudeAnisotropic, drudeFromTargets } from './drude.js';
import { InputError } from './errors.js';
import { hydrogenic } from './hydrogenic.js';
import { parseInlineSpecies } from './species-kinds.js';
import type { Species } from './species.js';
import { closestName } from './closest-name.js';

const INVENTED = 'invented for the worked examples (fictional moon Tessaly); not a real substance';

/** The invented demo species, in a fixed order. */
export const demoSpecies: readonly Species[] = [
  drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon', INVENTED),
  drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid', INVENTED),
  drude({ q: 0.9, m: 0.31, w: 0.95 }, 'Sorrel', INVENTED),
  drude({ q: 1.8, m: 0.6, w: 0.48 }, 'Tarnet', INVENTED),
  drudeAnisotropic({ q: 1.2, m: 0.45, wx: 0.8, wy: 0.8, wz: 0.55 }, 'Spindlet', INVENTED),
];

/** A built-in QDO that stands in for a real atom: the atom and its published static B (when sourced). */
export interface QdoStandIn {
  /** Element symbol, e.g. "He". */
  symbol: string;
  /** Element name, e.g. "helium". */
  element: string;
  /** The atom's published static B (Buckingham, atomic units), if sourced; H: the exact −213/2. */
  publishedB?: SourcedValue;
}

const standIns = new Map<Species, QdoStandIn>();

/** A QDO fitted to an atom's (alpha, C6, C8), remembered as a stand-in for that atom. */
function fittedStandIn(targets: { alpha: number; C6: number; C8: number }, name: string, source: string, atom: QdoStandIn): Species {
  const s = drudeFromTargets(targets, name, source);
  standIns.set(s, atom);
  return s;
}

const qdoSource = (a: AtomRecord) => `QDO fitted to alpha (${a.alpha.source}), C6 (${a.C6.source}), C8 (${a.C8.source})`;
const qdoOf = (a: AtomRecord, name: string) =>
  fittedStandIn({ alpha: a.alpha.value, C6: a.C6.value, C8: a.C8.value }, name, qdoSource(a), { symbol: a.symbol, element: a.name, ...(a.B ? { publishedB: a.B } : {}) });

/**
 * Real atoms under fixed names: H computed from first principles (kind hydrogenic), and QDOs fitted to published
 * (alpha, C6, C8) under the names H-qdo (hydrogen's exact values, to compare the model with the exact atom) and
 * He-qdo, Ne-qdo, Ar-qdo, Kr-qdo, Xe-qdo (src/data/atom-library.ts names the source of every value).
 * The plain names He … Xe are the recommended atoms ({@link recommendedAtomSpecies}).
 */
export const atomLibrarySpecies: readonly Species[] = [
  hydrogenic({ Z: 1 }, 'H', 'hydrogen computed from first principles (Sturmian pseudo-spectrum; exact non-relativistic, infinite nuclear mass)'),
  fittedStandIn(
    { alpha: HYDROGEN_EXACT.alpha1.value, C6: HYDROGEN_EXACT.C6.value, C8: HYDROGEN_EXACT.C8.value },
    'H-qdo',
    `QDO fitted to hydrogen's exact alpha = 9/2 and C6, C8 (${HYDROGEN_EXACT.C6.source})`,
    { symbol: 'H', element: 'hydrogen', publishedB: HYDROGEN_EXACT.B },
  ),
  ...ATOM_LIBRARY.map((a) => qdoOf(a, `${a.symbol}-qdo`)),
];

/** The QDO stand-ins under the plain names, used while an atom has no first-principles response data. */
const qdoUnderSymbol = new Map(ATOM_LIBRARY.map((a) => [a.symbol, qdoOf(a, a.symbol)]));

/** Gives the recommended (rescaled first-principles) species of an atom symbol, or undefined without data. */
export type RecommendedAtomProvider = (symbol: string) => Species | undefined;
let recommendedProvider: RecommendedAtomProvider = () => undefined;

/**
 * Install the provider of recommended atoms (src/engines/atoms/recommended-atoms.ts does so when imported; the
 * model layer cannot build them itself, since the rescaling needs the response quadrature).
 */
export function registerRecommendedAtomProvider(provider: RecommendedAtomProvider): void {
  recommendedProvider = provider;
}

/**
 * The built-in atoms He … Xe under their plain names: the recommended model where first-principles response data
 * exist for the atom, else (until then) the fitted QDO, which carries a model warning.
 */
export function recommendedAtomSpecies(): Species[] {
  return ATOM_LIBRARY.map((a) => recommendedProvider(a.symbol) ?? qdoUnderSymbol.get(a.symbol)!);
}

/**
 * The atom a built-in QDO stands in for (H-qdo, He-qdo, …, and He … Xe while they are QDOs); undefined for every
 * other species. Matches the built-in object or an equal copy (same name and parameters).
 */
export function qdoStandInOf(s: Species): QdoStandIn | undefined {
  const hit = standIns.get(s);
  if (hit || s.kind !== 'drude') return hit;
  for (const [t, atom] of standIns) if (t.kind === 'drude' && t.name === s.name && t.q === s.q && t.m === s.m && t.w.every((w, i) => w === s.w[i])) return atom;
  return undefined;
}

/** Extra built-in collections register here; the demo set comes first, then the atom library, then He … Xe. */
const collections: Array<() => readonly Species[]> = [() => demoSpecies, () => atomLibrarySpecies, recommendedAtomSpecies];

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
  // an atom symbol builds only that atom's recommended model (the others are built on first use)
  const atom = ATOM_LIBRARY.find((a) => a.symbol === token) ?? ATOM_LIBRARY.find((a) => a.symbol.toLowerCase() === token.toLowerCase());
  if (atom) return recommendedProvider(atom.symbol) ?? qdoUnderSymbol.get(atom.symbol)!;
  // exact names collection by collection: a demo name does not build the recommended atoms (start-up cost)
  for (const collection of collections) {
    const exact = collection().find((s) => s.name === token);
    if (exact) return exact;
  }
  const all = builtinSpecies();
  const hit = all.find((s) => s.name.toLowerCase() === token.toLowerCase());
  if (hit) return hit;
  const names = [...new Set(all.map((s) => s.name))]; // each name once
  const fileNames = [...(fromFile?.keys() ?? [])].filter((n) => !names.includes(n));
  const meant = token.trim() === '' ? undefined : closestName(token, [...names, ...fileNames]);
  throw new InputError(
    token.trim() === '' ? 'species' : token,
    `${token.trim() === '' ? 'is empty' : `is not a known species${meant ? ` (did you mean ${meant}?)` : ''}`}; use a built-in name (${names.join(', ')}), a name from --species FILE${fileNames.length ? ` (${fileNames.join(', ')})` : ''}, or an inline spec like drude:q=1.2,m=0.4,w=0.9 or tdhf:Ar (closed-shell atom or ion by time-dependent Hartree–Fock, e.g. tdhf:Z=11,charge=1)`,
  );
}
