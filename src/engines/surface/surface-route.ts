/**
 * The common shape of the surface routes: each computes the coefficients of an atom at distance Z in front of a
 * surface (the surface plane z = 0, the atom at +Z along the normal; atomic units):
 *   E(Z) ≈ −C3/Z³ − C5/Z⁵,     mu(Z) ≈ D4/Z⁴ (vector; D4 its component along the normal, away from the surface).
 */
import type { Species } from '../../model/species.js';
import type { SurfaceSpec } from '../../model/surface-spec.js';
import type { Vec3 } from '../../model/types.js';

export interface SurfaceRouteResult {
  /** Route name as used in JSON: "perturbation", "response", "force-balance". */
  name: string;
  /** E ∋ −C3/Z³, Eh·a0³. */
  C3: number;
  /** E ∋ −C5/Z⁵, Eh·a0⁵ (absent when the route or the species' data do not give it). */
  C5?: number;
  /** Normal component of lim Z⁴ <mu>, e·a0⁵ (positive: the dipole points away from the surface). */
  D4: number;
  /** lim Z⁴ <mu> in the species' own axes, e·a0⁵. */
  D4vector: Vec3;
  /** Error estimates where the route has them. */
  error?: Partial<Record<'C3' | 'C5' | 'D4', number>>;
  /** False when the route did not reach its tolerance. */
  converged: boolean;
  notes: string[];
}

export interface SurfaceRouteOptions {
  /** Surface normal in the species' axes (from the surface towards the atom); default +z. */
  normal?: Vec3;
  /** Relative tolerance of quadratures. Default 1e-13. */
  relTol?: number;
  /** Harmonic truncation for QDOs in the perturbation route (total quanta); default 4, the exact minimum. */
  maxQuanta?: number;
}

export interface SurfaceRoute {
  name: string;
  summary: string;
  /** null when the route can handle the atom and surface, else the reason it cannot. */
  unsupported(s: Species, surface: SurfaceSpec, options: SurfaceRouteOptions): string | null;
  run(s: Species, surface: SurfaceSpec, options: SurfaceRouteOptions): SurfaceRouteResult;
}

/** The unit normal of the options (default +z). */
export function unitNormal(options: SurfaceRouteOptions): Vec3 {
  const n = options.normal ?? [0, 0, 1];
  const len = Math.hypot(...n);
  return n.map((x) => x / len) as Vec3;
}

/** n · v. */
export const alongNormal = (v: Vec3, n: Vec3): number => v[0] * n[0] + v[1] * n[1] + v[2] * n[2];

/**
 * The result of a route that works at a conductor (Δ = 1) and scales to an instantaneous surface by its image factor Δ
 * (every image charge scales by Δ, so every first-order coefficient does).
 */
export function instantaneousResult(
  name: string,
  conductor: { C3: number; C5: number; D4vector: Vec3 },
  delta: number,
  normal: Vec3,
  extra: { converged: boolean; notes: string[] },
): SurfaceRouteResult {
  const D4vector = conductor.D4vector.map((x) => delta * x) as Vec3;
  return { name, C3: delta * conductor.C3, C5: delta * conductor.C5, D4: alongNormal(D4vector, normal), D4vector, ...extra };
}
