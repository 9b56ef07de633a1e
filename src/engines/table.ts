/**
 * Coefficient tables: C6, C8, C10 and D7 for many pairs at once. Each row is exactly one {@link computePair}
 * result with the same options, so a table row and `dispole pair A B` agree to the bit.
 *
 * Pair selection is deterministic: either every unordered pair of a species list, like pairs included, in list
 * order (i ≤ j, species i at the origin), or an explicit list of ordered pairs "A-B" in the order given.
 */
import { InputError } from '../model/errors.js';
import type { Species } from '../model/species.js';
import { computePair, requireRouteList, type PairOptions, type PairResult } from './pair.js';
import { defaultRoutes, routeByName } from './routes.js';

/** A pair to compute: A at the origin, B at +R on z. */
export type SpeciesPair = readonly [Species, Species];

/**
 * Row status: "ok" — at least two routes ran and agree; "unchecked" — only one route could run, so there is no
 * cross-check; "UNTRUSTED" — a route did not converge or the routes disagree beyond the agreement tolerance;
 * "model" — the routes may agree, but D7 rests on a stand-in model's B (a QDO for a real atom, a static B only; see
 * accuracy.ts): its own status so a model number never reads "ok". UNTRUSTED comes first, then model.
 */
export type RowStatus = 'ok' | 'unchecked' | 'UNTRUSTED' | 'model';

export interface TableRow {
  /** The pair computation, identical to `computePair(a, b, options)`. */
  result: PairResult;
  status: RowStatus;
}

export interface TableOptions extends PairOptions {
  /** Called after each pair with (pairs done, pairs in total); for progress indicators. */
  onProgress?: (done: number, total: number) => void;
}

/** What a reader needs to reproduce the table: the settings passed to every pair. */
export interface TableSettings {
  /** Routes asked for, in order (the default routes when none were named). */
  routes: string[];
  /** Routes that ran for at least one row, in the order asked for. */
  routesRun: string[];
  /** Largest relative spread between routes accepted as agreement; undefined = computePair's default. */
  agreement?: number;
  /** Relative tolerance passed to the routes; undefined = each route's default. */
  relTol?: number;
  /** Harmonic truncation of the perturbation route; undefined = the exact minimum. */
  maxQuanta?: number;
}

/** A pair of the table that no requested route can handle: flagged in the output, the other rows still written. */
export interface UncomputedPair {
  a: Species;
  b: Species;
  /** Why each route declined, joined. */
  reason: string;
}

export interface CoefficientTable {
  /** Distinct species of the table, in order of first appearance in the rows. */
  species: Species[];
  rows: TableRow[];
  /** Pairs no requested route can handle (absent or empty when every pair was computed). */
  uncomputed?: UncomputedPair[];
  settings: TableSettings;
}

/** Every unordered pair of `species`, like pairs included: (0,0), (0,1), …, (0,n−1), (1,1), … — n(n+1)/2 pairs. */
export function allPairs(species: readonly Species[]): SpeciesPair[] {
  const pairs: SpeciesPair[] = [];
  for (let i = 0; i < species.length; i++) for (let j = i; j < species.length; j++) pairs.push([species[i], species[j]]);
  return pairs;
}

/** Reject a species list that names the same species twice (after resolution, so `quelon` equals `Quelon`). */
export function requireDistinctSpecies(species: readonly Species[]): void {
  const seen = new Set<string>();
  for (const s of species) {
    if (seen.has(s.name)) throw new InputError('species', `${JSON.stringify(s.name)} is listed twice; list each species once`);
    seen.add(s.name);
  }
}

/**
 * Parse `--pairs` entries ("A-B", several per string separated by commas) into ordered pairs.
 * Each side is, in this order: a name from `species` (exact, then ignoring case), a 1-based position in `species`,
 * or whatever `fallback` resolves (e.g. a built-in name). A name that itself contains "-" is found by trying every
 * "-" as the separator; the entry must split into two known species in exactly one way.
 * Inline specs contain commas, so they are referred to by position.
 */
export function selectPairs(entries: readonly string[], species: readonly Species[], fallback?: (token: string) => Species): SpeciesPair[] {
  const side = (token: string): Species | undefined => {
    const t = token.trim();
    if (t === '') return undefined;
    const byName = species.find((s) => s.name === t) ?? species.find((s) => s.name.toLowerCase() === t.toLowerCase());
    if (byName) return byName;
    if (/^[1-9]\d*$/.test(t) && Number(t) <= species.length) return species[Number(t) - 1];
    if (!fallback) return undefined;
    try {
      return fallback(t);
    } catch (e) {
      if (e instanceof InputError) return undefined;
      throw e;
    }
  };
  const known = species.length > 0 ? ` (${species.map((s) => s.name).join(', ')}) or a position 1…${species.length}` : '';
  const pairs: SpeciesPair[] = [];
  const seen = new Set<string>();
  const items = entries.flatMap((e) => e.split(',')).map((e) => e.trim());
  for (const entry of items) {
    const field = `--pairs entry ${JSON.stringify(entry)}`;
    if (entry === '') throw new InputError('--pairs', 'has an empty entry; give entries A-B separated by commas, e.g. Quelon-Virid,Sorrel-Sorrel');
    const splits: SpeciesPair[] = [];
    let firstMiss: string | undefined;
    for (let k = entry.indexOf('-'); k >= 0; k = entry.indexOf('-', k + 1)) {
      const left = entry.slice(0, k), right = entry.slice(k + 1);
      const a = side(left), b = side(right);
      if (a && b) {
        if (!splits.some(([x, y]) => x === a && y === b)) splits.push([a, b]);
      } else firstMiss ??= !a ? left : right;
    }
    if (splits.length === 1) {
      const [a, b] = splits[0];
      const key = JSON.stringify([a.name, b.name]);
      if (seen.has(key)) throw new InputError(field, `repeats the pair ${a.name}–${b.name}; list each pair once`);
      seen.add(key);
      pairs.push(splits[0]);
      continue;
    }
    if (splits.length > 1) {
      throw new InputError(field, `is ambiguous: it splits into ${splits.map(([a, b]) => `${a.name} and ${b.name}`).join(', or ')}; refer to the species by position`);
    }
    if (firstMiss === undefined) throw new InputError(field, 'must be two species joined by "-", e.g. Quelon-Virid');
    throw new InputError(field, `${JSON.stringify(firstMiss.trim())} is not a species of this table; use a name${known || ' (a built-in name or one from --species FILE)'}`);
  }
  if (pairs.length === 0) throw new InputError('--pairs', 'lists no pairs; give entries A-B separated by commas, e.g. Quelon-Virid');
  return pairs;
}

/** The status of one pair result (see {@link RowStatus}). */
export function rowStatus(r: PairResult): RowStatus {
  if (!r.trusted) return 'UNTRUSTED';
  if (r.accuracy.quantities.D7 === 'model') return 'model';
  return r.routes.length < 2 ? 'unchecked' : 'ok';
}

/** Number of rows whose status is UNTRUSTED. */
export const untrustedCount = (table: CoefficientTable): number => table.rows.filter((r) => r.status === 'UNTRUSTED').length;

/**
 * Why no requested route can handle the pair (each route's reason), or undefined when one can. Unknown route
 * names give undefined here, so computePair reports them as bad input.
 */
function noRouteReason(a: Species, b: Species, names?: readonly string[]): string | undefined {
  const routes = names ? names.map(routeByName) : defaultRoutes;
  if (routes.some((r) => r === undefined)) return undefined;
  const reasons = routes.map((r) => r!.unsupported(a, b));
  return reasons.every((why) => why) ? reasons.join('; ') : undefined;
}

/** Compute every pair with {@link computePair} (same options for all) and collect the table. */
export function computeTable(pairs: readonly SpeciesPair[], options: TableOptions = {}): CoefficientTable {
  if (pairs.length === 0) throw new InputError('species', 'none given: the table needs at least one pair');
  requireRouteList(options.routes);
  const { onProgress, ...pairOptions } = options;
  const rows: TableRow[] = [];
  const uncomputed: UncomputedPair[] = [];
  for (const [a, b] of pairs) {
    const reason = noRouteReason(a, b, pairOptions.routes);
    if (reason !== undefined) {
      uncomputed.push({ a, b, reason });
      onProgress?.(rows.length + uncomputed.length, pairs.length);
      continue;
    }
    const result = computePair(a, b, pairOptions);
    rows.push({ result, status: rowStatus(result) });
    onProgress?.(rows.length + uncomputed.length, pairs.length);
  }
  const byName = new Map<string, Species>();
  for (const [a, b] of pairs) for (const s of [a, b]) if (!byName.has(s.name)) byName.set(s.name, s);
  const routes = options.routes ?? defaultRoutes.map((r) => r.name);
  const ran = new Set(rows.flatMap((r) => r.result.routes.map((x) => x.name)));
  return {
    species: [...byName.values()],
    rows,
    ...(uncomputed.length ? { uncomputed } : {}),
    settings: {
      routes,
      routesRun: routes.filter((r) => ran.has(r)),
      ...(options.agreement !== undefined ? { agreement: options.agreement } : {}),
      ...(options.relTol !== undefined ? { relTol: options.relTol } : {}),
      ...(options.maxQuanta !== undefined ? { maxQuanta: options.maxQuanta } : {}),
    },
  };
}
