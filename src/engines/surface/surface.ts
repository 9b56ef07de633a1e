/**
 * An atom in front of a surface: run the surface routes, take the first (reference) route's values as the
 * coefficients and measure how far the others are from it (the same scheme as pair.ts). Atomic units; the surface
 * is the plane z = 0 and the atom sits at +Z along the normal:
 *   E(Z) ≈ −C3/Z³ − C5/Z⁵,   mu(Z) ≈ D4vector/Z⁴,   D4 = normal component (> 0: pointing away from the surface).
 */
import type { Species } from '../../model/species.js';
import { validateSurface, type SurfaceSpec } from '../../model/surface-spec.js';
import type { Vec3 } from '../../model/types.js';
import { InputError } from '../../model/errors.js';
import { requireFinite } from '../../model/validate.js';
import { isSpherical, speciesWarnings } from '../capabilities.js';
import { speciesAccuracy, type AccuracyLevel } from '../accuracy.js';
import { forceBalanceSurfaceRoute } from './force-balance-surface.js';
import { perturbationSurfaceRoute } from './perturbation-surface.js';
import { responseSurfaceRoute } from './response-surface.js';
import type { SurfaceRoute, SurfaceRouteOptions, SurfaceRouteResult } from './surface-route.js';

/** The surface routes in report order; the first that can run is the reference. */
export const surfaceRoutes: readonly SurfaceRoute[] = [perturbationSurfaceRoute, responseSurfaceRoute, forceBalanceSurfaceRoute];

export interface SurfaceOptions extends SurfaceRouteOptions {
  /** Route names to run (default: all that can). */
  routes?: string[];
  /** Largest relative spread between routes accepted as agreement. Default 1e-8. */
  agreement?: number;
}

export interface SurfaceSpread {
  C3: number;
  C5?: number;
  D4: number;
  /** Largest |Δ D4vector| relative to |D4vector| of the reference. */
  D4vector: number;
  max: number;
}

export interface SurfaceResult {
  species: Species;
  surface: SurfaceSpec;
  /** Unit surface normal in the species' axes (from the surface towards the atom). */
  normal: Vec3;
  coefficients: { C3: number; C5?: number; D4: number; D4vector?: Vec3 };
  routes: SurfaceRouteResult[];
  skipped: Array<{ name: string; reason: string }>;
  spread: SurfaceSpread;
  trusted: boolean;
  warnings: string[];
  /** What the numbers rest on, physically (route agreement is not accuracy). */
  accuracy: SurfaceAccuracy;
}

/** What an atom–surface result rests on: the atom's level (accuracy.ts) per quantity, and the surface model. */
export interface SurfaceAccuracy {
  /** C3 and C5 rest on the atom's linear response; D4 on its B(0; iu, −iu). */
  quantities: { C3: AccuracyLevel; C5: AccuracyLevel; D4: AccuracyLevel };
  statement: string;
}

/** The accuracy block of a surface result. */
export function surfaceAccuracy(species: Species, surface: SurfaceSpec): SurfaceAccuracy {
  const a = speciesAccuracy(species);
  const wall =
    surface.kind === 'conductor'
      ? 'an ideal conductor (image plane at Z = 0)'
      : surface.kind === 'constant'
        ? 'a dielectric with a frequency-independent eps'
        : surface.kind === 'table'
          ? 'tabulated eps(iu), as good as the data'
          : 'a model dielectric function (Drude/Lorentz terms)';
  return {
    quantities: { C3: a.quantities.dispersion, C5: a.quantities.dispersion, D4: a.quantities.D7 },
    statement: `${a.basis}; surface: ${wall}; non-retarded, local, flat surface`,
  };
}

const rel = (x: number, ref: number, scale = Math.abs(ref)) => (scale === 0 ? Math.abs(x - ref) : Math.abs(x - ref) / scale);

function surfaceSpread(results: readonly SurfaceRouteResult[]): SurfaceSpread {
  const ref = results[0];
  // C5 like C3: the largest relative difference from the reference (0 with one route); absent only when the reference has no C5
  const s: SurfaceSpread = { C3: 0, ...(ref.C5 !== undefined ? { C5: 0 } : {}), D4: 0, D4vector: 0, max: 0 };
  const norm = Math.hypot(...ref.D4vector);
  for (const r of results.slice(1)) {
    s.C3 = Math.max(s.C3, rel(r.C3, ref.C3));
    if (r.C5 !== undefined && ref.C5 !== undefined) s.C5 = Math.max(s.C5 ?? 0, rel(r.C5, ref.C5));
    s.D4 = Math.max(s.D4, rel(r.D4, ref.D4));
    const diff = Math.hypot(...r.D4vector.map((x, k) => x - ref.D4vector[k]));
    s.D4vector = Math.max(s.D4vector, norm === 0 ? diff : diff / norm);
  }
  s.max = Math.max(s.C3, s.C5 ?? 0, s.D4, s.D4vector);
  return s;
}

/** Parse and check a surface normal "x,y,z" (or a vector): finite, not zero. */
export function surfaceNormal(value: unknown, field = 'normal'): Vec3 {
  const parts = typeof value === 'string' ? value.split(',') : Array.isArray(value) ? value : [];
  if (parts.length !== 3) throw new InputError(field, `must be three numbers x,y,z (the surface normal in the species' axes), got ${JSON.stringify(value)}`);
  const n = parts.map((x, i) => requireFinite(`${field}[${i}]`, x)) as Vec3;
  if (!(Math.hypot(...n) > 0)) throw new InputError(field, 'must not be the zero vector');
  return n;
}

/** Compute an atom's surface coefficients by every requested route and compare them. */
export function computeSurface(species: Species, surface: SurfaceSpec, options: SurfaceOptions = {}): SurfaceResult {
  validateSurface(surface);
  const normalIn = options.normal === undefined ? ([0, 0, 1] as Vec3) : surfaceNormal(options.normal);
  const len = Math.hypot(...normalIn);
  const normal = normalIn.map((x) => x / len) as Vec3;
  const wanted = options.routes
    ? options.routes.map((name) => {
        const r = surfaceRoutes.find((x) => x.name === name);
        if (!r) throw new InputError('routes', `unknown surface route ${JSON.stringify(name)}; known: ${surfaceRoutes.map((x) => x.name).join(', ')}`);
        return r;
      })
    : surfaceRoutes;
  const routeOptions: SurfaceRouteOptions = { ...options, normal };
  const skipped: Array<{ name: string; reason: string }> = [];
  const results: SurfaceRouteResult[] = [];
  for (const route of wanted) {
    const why = route.unsupported(species, surface, routeOptions);
    if (why) skipped.push({ name: route.name, reason: why });
    else results.push(route.run(species, surface, routeOptions));
  }
  if (results.length === 0) throw new InputError('routes', `no requested route can handle ${species.name} at this surface: ${skipped.map((s) => s.reason).join('; ')}`);
  const spread = surfaceSpread(results);
  const agreement = options.agreement ?? 1e-8;
  const warnings: string[] = [];
  for (const r of results) if (!r.converged) warnings.push(`route ${r.name} did not converge: its numbers are untrusted`);
  if (spread.max > agreement) warnings.push(`routes disagree: largest relative spread ${spread.max.toExponential(2)} > ${agreement.toExponential(0)}`);
  if (results.length < 2) warnings.push('only one route could run: no cross-check');
  if (speciesWarnings(species).length > 0) {
    warnings.push(`D4 is APPROXIMATE: ${species.name} has only a static B, so B(0; iu, −iu) ≈ B·alpha(iu)/alpha(0)`);
  }
  if (species.kind === 'tdhf' && species.charge !== 0) {
    // classical image of a point charge (common practice; J. D. Jackson, Classical Electrodynamics, 3rd ed. 1999, §2.1)
    warnings.push(
      `${species.name} is an ion (charge ${species.charge > 0 ? '+' : ''}${species.charge}): only the dispersion parts (C3, C5, D4) are given; the image-charge energy −q²/(4Z) (times the static image factor for a dielectric) and the dipole alpha·q/(4Z²) induced by the image field dominate at long range and are NOT included`,
    );
  }
  if (options.routes) for (const s of skipped) warnings.push(`route ${s.name} skipped: ${s.reason}`);
  const ref = results[0];
  const tilt = Math.hypot(ref.D4vector[0] - ref.D4 * normal[0], ref.D4vector[1] - ref.D4 * normal[1], ref.D4vector[2] - ref.D4 * normal[2]);
  const showVector = !isSpherical(species) && tilt > 1e-12 * Math.abs(ref.D4);
  if (speciesAccuracy(species).quantities.D7 === 'model' && species.kind === 'drude') {
    warnings.push(`MODEL: ${speciesAccuracy(species).basis}; D4 rests on the model's B, as D7 does for pairs`);
  }
  if (showVector) warnings.push('the dipole is tilted against the surface normal (anisotropic centre with tilted axes): see D4vector');
  return {
    species,
    surface,
    normal,
    coefficients: {
      C3: ref.C3,
      ...(ref.C5 !== undefined ? { C5: ref.C5 } : {}),
      D4: ref.D4,
      ...(showVector ? { D4vector: ref.D4vector } : {}),
    },
    routes: results,
    skipped,
    spread,
    accuracy: surfaceAccuracy(species, surface),
    trusted: results.every((r) => r.converged) && spread.max <= agreement && Object.values(ref).every((v) => typeof v !== 'number' || Number.isFinite(v)),
    warnings,
  };
}
