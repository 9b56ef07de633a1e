/**
 * What each species kind can do for the engines. Species are plain data; this is the one place that maps a
 * kind to its local state space (perturbation route) and response functions (response route).
 * To add a kind, add a case to each function (see DEVELOPERS.md).
 */
import type { Species } from '../model/species.js';
import { isIsotropicDrude } from '../model/drude.js';
import { harmonicSpace } from './perturbation/harmonic-space.js';
import type { LocalSpace } from './perturbation/local-space.js';
import { drudeIsotropicResponse, drudeTensorResponse } from './response/drude-response.js';
import type { IsotropicResponse, TensorResponse } from './response/response-model.js';

/** The local state space of a species for the perturbation route (maxQuanta: harmonic truncation, QDOs only). */
export function localSpaceOf(s: Species, maxQuanta: number): LocalSpace {
  switch (s.kind) {
    case 'drude':
      return harmonicSpace(s, maxQuanta);
  }
}

/** Scalar response functions, for spherically symmetric species; undefined otherwise. */
export function isotropicResponseOf(s: Species): IsotropicResponse | undefined {
  switch (s.kind) {
    case 'drude':
      return isIsotropicDrude(s) ? drudeIsotropicResponse(s) : undefined;
  }
}

/** Cartesian response functions; undefined when the kind has none. */
export function tensorResponseOf(s: Species): TensorResponse | undefined {
  switch (s.kind) {
    case 'drude':
      return drudeTensorResponse(s);
  }
}

/** True when the species is spherically symmetric (its D7 and C_n need no permanent-moment terms). */
export function isSpherical(s: Species): boolean {
  switch (s.kind) {
    case 'drude':
      return isIsotropicDrude(s);
  }
}
