/**
 * Pair-level computation: run the routes on a pair, take the first (reference) route's values as the
 * coefficients, and measure how far the other routes are from it.
 */
import type { Species } from '../model/species.js';
import { InputError } from '../model/errors.js';
import type { D7Triple, Route, RouteOptions, RouteResult } from './route.js';
import { defaultRoutes, routeByName, routeNames } from './routes.js';
import { speciesWarnings } from './capabilities.js';

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
  /** The largest of the above. */
  max: number;
}

export interface PairResult {
  a: Species;
  b: Species;
  /** The reference route's values. */
  coefficients: { C6: number; C8?: number; C10?: number; D7: D7Triple };
  routes: RouteResult[];
  /** Routes that could not handle the pair, with the reason (a warning only when the route was asked for by name). */
  skipped: Array<{ name: string; reason: string }>;
  spread: Spread;
  /** True when every route converged and the spread is within `agreement`. */
  trusted: boolean;
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
  s.max = Math.max(s.C6, s.C8 ?? 0, s.C10 ?? 0, s.D7a, s.D7b, s.D7total);
  return s;
}

/** Compute a pair's coefficients by every requested route and compare them. */
export function computePair(a: Species, b: Species, options: PairOptions = {}): PairResult {
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
    else results.push(route.run(a, b, options));
  }
  if (results.length === 0) throw new InputError('routes', `no requested route can handle ${a.name}–${b.name}: ${skipped.map((s) => s.reason).join('; ')}`);
  const spread = routeSpread(results);
  const agreement = options.agreement ?? 1e-8;
  const warnings: string[] = [];
  for (const r of results) if (!r.converged) warnings.push(`route ${r.name} did not converge: its numbers are untrusted`);
  if (spread.max > agreement) warnings.push(`routes disagree: largest relative spread ${spread.max.toExponential(2)} > ${agreement.toExponential(0)}`);
  if (results.length < 2) warnings.push('only one route could run: no cross-check');
  warnings.push(...new Set([...speciesWarnings(a), ...speciesWarnings(b)]));
  if (options.routes) for (const s of skipped) warnings.push(`route ${s.name} skipped: ${s.reason}`);
  const ref = results[0];
  if (ref.permanent) {
    warnings.push(
      'anisotropic species carry permanent quadrupoles: besides D7 there is a first-order induced dipole ∝ R^-4 (D4) and an electrostatic energy ∝ R^-5 (E5); C_n and D7 here include the induction parts',
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
    },
    routes: results,
    skipped,
    spread,
    trusted: results.every((r) => r.converged) && spread.max <= agreement,
    warnings,
  };
}
