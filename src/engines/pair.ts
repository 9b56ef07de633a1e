/**
 * Pair-level computation: run the routes on a pair, take the first (reference) route's values as the
 * coefficients, and measure how far the other routes are from it.
 */
import type { Species } from '../model/species.js';
import { ConvergenceError, InputError } from '../model/errors.js';
import type { D7Triple, Route, RouteOptions, RouteResult } from './route.js';
import { defaultRoutes, routeByName, routeNames } from './routes.js';
import { pairSpeciesWarnings } from './capabilities.js';
import { pairAccuracy, type PairAccuracy } from './accuracy.js';

export interface PairOptions extends RouteOptions {
  /** Route names to run (default: the default routes). The first run is the reference. */
  routes?: string[];
  /** Largest relative spread between routes that counts as agreement. Default 1e-8. */
  agreement?: number;
}

export interface Spread {
  C6: number;
  C8?: number;
  C10?: number;
  D7a: number;
  D7b: number;
  /** |Δ total| relative to max(|D7.a|, |D7.b|), since the total itself may vanish. */
  D7total: number;
  /** The same for D9, over the routes that give it (absent when fewer than two do). */
  D9a?: number;
  D9b?: number;
  D9total?: number;
  /** The largest of the above. */
  max: number;
}

export interface PairResult {
  a: Species;
  b: Species;
  /** The reference route's values; D9 from the first route that gives it. */
  coefficients: { C6: number; C8?: number; C10?: number; D7: D7Triple; D9?: D7Triple };
  routes: RouteResult[];
  /** Routes that could not handle the pair, with the reason (a warning only when the route was asked for by name). */
  skipped: Array<{ name: string; reason: string }>;
  spread: Spread;
  /** True when every route converged and the spread is within `agreement`. */
  trusted: boolean;
  /** What the numbers rest on physically (level per species, one sentence, D7 uncertainty where estimated); see accuracy.ts. */
  accuracy: PairAccuracy;
  warnings: string[];
}

const rel = (x: number, ref: number, scale = Math.abs(ref)) => (scale === 0 ? Math.abs(x - ref) : Math.abs(x - ref) / scale);

/** Relative spread of each coefficient over the routes, against the first route. */
export function routeSpread(results: readonly RouteResult[]): Spread {
  const ref = results[0];
  const s: Spread = { C6: 0, D7a: 0, D7b: 0, D7total: 0, max: 0 };
  const dScale = Math.max(Math.abs(ref.D7.a), Math.abs(ref.D7.b));
  for (const r of results.slice(1)) {
    s.C6 = Math.max(s.C6, rel(r.C6, ref.C6));
    if (r.C8 !== undefined && ref.C8 !== undefined) s.C8 = Math.max(s.C8 ?? 0, rel(r.C8, ref.C8));
    if (r.C10 !== undefined && ref.C10 !== undefined) s.C10 = Math.max(s.C10 ?? 0, rel(r.C10, ref.C10));
    s.D7a = Math.max(s.D7a, rel(r.D7.a, ref.D7.a));
    s.D7b = Math.max(s.D7b, rel(r.D7.b, ref.D7.b));
    s.D7total = Math.max(s.D7total, rel(r.D7.total, ref.D7.total, dScale));
  }
  const withD9 = results.filter((r) => r.D9 !== undefined);
  if (withD9.length >= 2) {
    const d9 = withD9[0].D9!;
    const scale9 = Math.max(Math.abs(d9.a), Math.abs(d9.b));
    s.D9a = s.D9b = s.D9total = 0;
    for (const r of withD9.slice(1)) {
      s.D9a = Math.max(s.D9a, rel(r.D9!.a, d9.a));
      s.D9b = Math.max(s.D9b, rel(r.D9!.b, d9.b));
      s.D9total = Math.max(s.D9total, rel(r.D9!.total, d9.total, scale9));
    }
  }
  s.max = Math.max(s.C6, s.C8 ?? 0, s.C10 ?? 0, s.D7a, s.D7b, s.D7total, s.D9a ?? 0, s.D9b ?? 0, s.D9total ?? 0);
  return s;
}

/** Every number a route reports, by name (C6 … D9.total), for the finiteness check. */
function reportedNumbers(r: RouteResult): Array<[string, number]> {
  const out: Array<[string, number]> = [['C6', r.C6]];
  if (r.C8 !== undefined) out.push(['C8', r.C8]);
  if (r.C10 !== undefined) out.push(['C10', r.C10]);
  out.push(['D7.a', r.D7.a], ['D7.b', r.D7.b], ['D7.total', r.D7.total]);
  if (r.D9) out.push(['D9.a', r.D9.a], ['D9.b', r.D9.b], ['D9.total', r.D9.total]);
  return out;
}

/**
 * The parameter of a species farthest from 1 on a log scale ("w=1e-200"), the likeliest cause of an overflow
 * or underflow; undefined for kinds without scalar parameters.
 */
function extremeParameter(s: Species): string | undefined {
  if (s.kind !== 'drude') return undefined;
  const fields: Array<[string, number]> = [['q', s.q], ['m', s.m], ...(s.w[0] === s.w[1] && s.w[1] === s.w[2] ? [['w', s.w[0]] as [string, number]] : s.w.map((w, i) => [`w${'xyz'[i]}`, w] as [string, number]))];
  const [field, value] = fields.reduce((best, f) => (Math.abs(Math.log10(f[1])) > Math.abs(Math.log10(best[1])) ? f : best));
  return `${field}=${value}`;
}

/**
 * A warning when a route returned ∞ or NaN (double-precision overflow or underflow): such a result is never
 * trusted. It names the quantities, the species and their most extreme parameters.
 */
function nonFiniteWarning(r: RouteResult, a: Species, b: Species): string | undefined {
  const bad = reportedNumbers(r).filter(([, x]) => !Number.isFinite(x));
  if (bad.length === 0) return undefined;
  const suspects = [a, b].map((s, i) => `${i === 0 ? 'A' : 'B'} = ${s.name}${extremeParameter(s) ? ` (most extreme parameter ${extremeParameter(s)})` : ''}`);
  return `route ${r.name}: ${bad.map(([k, x]) => `${k} = ${x}`).join(', ')} not finite (overflow or underflow in double precision); untrusted — check the parameters of ${suspects.join(' and ')}`;
}

/** Run a route; a convergence failure is reported with the pair and the species' most extreme parameters. */
function runNamingPair(route: Route, a: Species, b: Species, options: RouteOptions): RouteResult {
  try {
    return route.run(a, b, options);
  } catch (e) {
    if (!(e instanceof ConvergenceError)) throw e;
    const params = [a, b].map((s) => `${s.name}: ${extremeParameter(s) ?? 'its data'}`);
    const hint = `; check ${params.join(' and ')} (most extreme parameter of each)`;
    throw new ConvergenceError(`route ${route.name} on ${a.name}–${b.name}${hint}: ${e.what}`, e.reached, e.wanted);
  }
}

/** A requested route list must name at least one route (`--routes ""` or `--routes ,` name none). */
export function requireRouteList(routes: readonly string[] | undefined): void {
  if (routes !== undefined && routes.length === 0) {
    throw new InputError('routes', `the list is empty; name at least one route, comma-separated (known: ${routeNames().join(', ')})`);
  }
}

/** Compute a pair's coefficients by every requested route and compare them. */
export function computePair(a: Species, b: Species, options: PairOptions = {}): PairResult {
  requireRouteList(options.routes);
  const wanted: Route[] = options.routes
    ? options.routes.map((name) => {
        const r = routeByName(name);
        if (!r) throw new InputError('routes', `unknown route ${JSON.stringify(name)}; known: ${routeNames().join(', ')}`);
        return r;
      })
    : defaultRoutes;
  const skipped: Array<{ name: string; reason: string }> = [];
  const results: RouteResult[] = [];
  for (const route of wanted) {
    const why = route.unsupported(a, b);
    if (why) skipped.push({ name: route.name, reason: why });
    else results.push(runNamingPair(route, a, b, options));
  }
  if (results.length === 0) throw new InputError('routes', `no requested route can handle ${a.name}–${b.name}: ${skipped.map((s) => s.reason).join('; ')}`);
  const spread = routeSpread(results);
  const agreement = options.agreement ?? 1e-8;
  const warnings: string[] = [];
  for (const r of results) if (!r.converged) warnings.push(`route ${r.name} did not converge: its numbers are untrusted`);
  const infinite = results.map((r) => nonFiniteWarning(r, a, b)).filter((w): w is string => w !== undefined);
  warnings.push(...infinite);
  if (spread.max > agreement) warnings.push(`routes disagree: largest relative spread ${spread.max.toExponential(2)} > ${agreement.toExponential(0)}`);
  if (results.length < 2) warnings.push('only one route could run: no cross-check');
  warnings.push(...pairSpeciesWarnings(a, b));
  if (options.routes) for (const s of skipped) warnings.push(`route ${s.name} skipped: ${s.reason}`);
  const ref = results[0];
  const d9 = results.find((r) => r.D9 !== undefined)?.D9;
  const accuracy = pairAccuracy(a, b, ref.D7, options, d9 !== undefined);
  warnings.push(...accuracy.warnings);
  if (ref.permanent) {
    warnings.push(
      'anisotropic species carry permanent quadrupoles and higher moments: besides D7 and D9 there are first-order induced dipoles ∝ R^-4, R^-6, R^-8 (D4, D6, D8) and electrostatic energies ∝ R^-5, R^-7 (E5, E7); C_n, D7 and D9 here include the induction parts',
    );
  }
  return {
    a,
    b,
    coefficients: {
      C6: ref.C6,
      ...(ref.C8 !== undefined ? { C8: ref.C8 } : {}),
      ...(ref.C10 !== undefined ? { C10: ref.C10 } : {}),
      D7: ref.D7,
      ...(d9 ? { D9: d9 } : {}),
    },
    routes: results,
    skipped,
    spread,
    trusted: results.every((r) => r.converged) && infinite.length === 0 && spread.max <= agreement,
    accuracy,
    warnings,
  };
}
