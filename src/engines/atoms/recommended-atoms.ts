/**
 * The recommended built-in atoms He … Xe: each atom of the library (src/data/atom-library.ts) for which
 * first-principles response functions are shipped becomes its rescaled model ({@link recommendedAtom}); atoms
 * without data stay fitted QDOs (with a model warning) until the data arrive. Importing this module installs
 * the provider in the built-in species (src/model/builtin-species.ts); the engines import it, so every entry
 * point that computes a pair resolves He … Xe to the recommended model.
 */
import { ATOM_LIBRARY } from '../../data/atom-library.js';
import { TDHF_ATOMS } from '../../data/tdhf-atoms.js';
import type { FirstPrinciplesResponse } from '../../model/first-principles-response.js';
import { registerRecommendedAtomProvider } from '../../model/builtin-species.js';
import type { Species } from '../../model/species.js';
import { recommendedAtom, type RecommendedAtom } from './recommended-atom.js';

/** First-principles response functions shipped per atom symbol (the data module of the TDHF generator). */
const SHIPPED: Readonly<Record<string, FirstPrinciplesResponse>> = TDHF_ATOMS;

const built = new Map<string, RecommendedAtom | null>();

/** The recommended model of an atom symbol (built once, on first use); undefined without first-principles data. */
export function recommendedAtomBySymbol(symbol: string): RecommendedAtom | undefined {
  if (!built.has(symbol)) {
    const record = ATOM_LIBRARY.find((a) => a.symbol === symbol);
    const data = Object.prototype.hasOwnProperty.call(SHIPPED, symbol) ? SHIPPED[symbol] : undefined;
    built.set(symbol, record && data ? recommendedAtom(record, data) : null);
  }
  return built.get(symbol) ?? undefined;
}

/** Every recommended atom that has data, in library order. */
export function recommendedAtoms(): RecommendedAtom[] {
  return ATOM_LIBRARY.map((a) => recommendedAtomBySymbol(a.symbol)).filter((r): r is RecommendedAtom => r !== undefined);
}

/**
 * The recommended atom a species is (the built-in object, or an equal copy: same name and grid), or undefined.
 */
export function recommendedAtomOf(s: Species): RecommendedAtom | undefined {
  if (s.kind !== 'response-table') return undefined;
  const r = recommendedAtomBySymbol(s.name);
  if (!r) return undefined;
  const t = r.species;
  if (s === t) return r;
  const same = (x: readonly number[] | undefined, y: readonly number[] | undefined) => x?.length === y?.length && (x ?? []).every((v, i) => v === y![i]);
  return same(s.u, t.u) && same(s.alpha, t.alpha) && same(s.hyperB, t.hyperB) && same(s.alpha2, t.alpha2) && same(s.alpha3, t.alpha3) ? r : undefined;
}

registerRecommendedAtomProvider((symbol) => recommendedAtomBySymbol(symbol)?.species);
