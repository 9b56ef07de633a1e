/**
 * A surface table: {@link computeSurface} for each species of a list in front of one surface (the surface column set
 * of `dispole table --surface`). Each row is exactly one computeSurface result with the same options.
 */
import { InputError } from '../../model/errors.js';
import type { Species } from '../../model/species.js';
import type { SurfaceSpec } from '../../model/surface-spec.js';
import { computeSurface, surfaceRoutes, type SurfaceOptions, type SurfaceResult } from './surface.js';

/** ok: two or more routes agree; unchecked: one route only; UNTRUSTED: unconverged or disagreeing routes. */
export type SurfaceRowStatus = 'ok' | 'unchecked' | 'UNTRUSTED';

export interface SurfaceTableRow {
  result: SurfaceResult;
  status: SurfaceRowStatus;
}

export interface SurfaceTable {
  surface: SurfaceSpec;
  rows: SurfaceTableRow[];
  /** Species no requested route can handle, with the reasons. */
  uncomputed: Array<{ species: Species; reason: string }>;
}

/** Compute every species' surface coefficients (same options for all). */
export function computeSurfaceTable(species: readonly Species[], surface: SurfaceSpec, options: SurfaceOptions = {}): SurfaceTable {
  if (species.length === 0) throw new InputError('species', 'none given: the surface table needs at least one species');
  const rows: SurfaceTableRow[] = [];
  const uncomputed: SurfaceTable['uncomputed'] = [];
  const routes = options.routes
    ? options.routes.map((name) => surfaceRoutes.find((r) => r.name === name) ?? (() => {
        throw new InputError('routes', `unknown surface route ${JSON.stringify(name)}; known: ${surfaceRoutes.map((r) => r.name).join(', ')}`);
      })())
    : surfaceRoutes;
  for (const s of species) {
    const reasons = routes.map((r) => r.unsupported(s, surface, options));
    if (reasons.every((x) => x)) {
      uncomputed.push({ species: s, reason: reasons.join('; ') });
      continue;
    }
    const result = computeSurface(s, surface, options);
    rows.push({ result, status: !result.trusted ? 'UNTRUSTED' : result.routes.length < 2 ? 'unchecked' : 'ok' });
  }
  return { surface, rows, uncomputed };
}
