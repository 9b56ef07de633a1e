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
import { hydrogenicNotes, hydrogenicResponse, hydrogenicSpace } from './atoms/hydrogenic-atom.js';
import { oscillatorSpectrumResponse, responseTableResponse } from './atoms/tabulated-response.js';
import { recommendedAtomOf } from './atoms/recommended-atoms.js';
import type { ResponseTableSpecies } from '../model/response-data.js';
import { tdhfResponse } from './atoms/hartree-fock/tdhf-species.js';

/** A table's response functions: a recommended atom's rescaled first-principles interpolant, else the table's own. */
const tableResponse = (s: ResponseTableSpecies) => recommendedAtomOf(s)?.response ?? responseTableResponse(s);

/** True when the species has a local state space (states, excitation energies, moments) for the perturbation route. */
export function hasLocalSpace(s: Species): boolean {
  switch (s.kind) {
    case 'drude':
    case 'hydrogenic':
      return true;
    case 'response-table':
    case 'oscillator-spectrum':
    case 'tdhf':
      return false;
  }
}

/**
 * The local state space of a species for the perturbation route (maxQuanta: harmonic truncation, QDOs only).
 * Throws for kinds without one ({@link hasLocalSpace} is false): routes check first.
 */
export function localSpaceOf(s: Species, maxQuanta: number): LocalSpace {
  switch (s.kind) {
    case 'drude':
      return harmonicSpace(s, maxQuanta);
    case 'hydrogenic':
      return hydrogenicSpace(s);
    case 'response-table':
    case 'oscillator-spectrum':
    case 'tdhf':
      throw new Error(`${s.name} has response data only, no state space`);
  }
}

/** Scalar response functions, for spherically symmetric species; undefined otherwise. */
export function isotropicResponseOf(s: Species): IsotropicResponse | undefined {
  switch (s.kind) {
    case 'drude':
      return isIsotropicDrude(s) ? drudeIsotropicResponse(s) : undefined;
    case 'hydrogenic':
      return hydrogenicResponse(s);
    case 'response-table':
      return tableResponse(s);
    case 'oscillator-spectrum':
      return oscillatorSpectrumResponse(s);
    case 'tdhf':
      return tdhfResponse(s);
  }
}

/** Cartesian response functions; undefined when the kind has none. */
export function tensorResponseOf(s: Species): TensorResponse | undefined {
  switch (s.kind) {
    case 'drude':
      return drudeTensorResponse(s);
    case 'hydrogenic':
    case 'response-table':
    case 'oscillator-spectrum':
    case 'tdhf':
      return undefined;
  }
}

/** True when the species is spherically symmetric (its D7 and C_n need no permanent-moment terms). */
export function isSpherical(s: Species): boolean {
  switch (s.kind) {
    case 'drude':
      return isIsotropicDrude(s);
    case 'hydrogenic':
    case 'response-table':
    case 'oscillator-spectrum':
    case 'tdhf':
      return true;
  }
}

/** Highest dispersion power (6, 8, 10) a species' response functions support (data may lack alpha2, alpha3). */
export function responsePowerLimit(s: Species): 6 | 8 | 10 {
  switch (s.kind) {
    case 'drude':
    case 'hydrogenic':
    case 'tdhf':
      return 10;
    case 'response-table':
      return tableResponse(s).maxEnergyPower;
    case 'oscillator-spectrum':
      return oscillatorSpectrumResponse(s).maxEnergyPower;
  }
}

/** What a species' numbers rest on (basis and its convergence, interpolation, tails, approximations), for route notes. */
export function speciesNotes(s: Species): string[] {
  switch (s.kind) {
    case 'drude':
      return [];
    case 'hydrogenic':
      return hydrogenicNotes(s);
    case 'response-table':
      return tableResponse(s).notes;
    case 'oscillator-spectrum':
      return oscillatorSpectrumResponse(s).notes;
    case 'tdhf':
      return tdhfResponse(s).notes;
  }
}

/**
 * The warning a pair with a charged species carries: dispole gives only the dispersion terms (C_n) and the
 * dispersion-induced dipoles (D7, D9), not the charge-induced (induction) terms of an ion A with charge q_A,
 * E ∋ −alpha_B q_A²/(2R^4) and mu_B ∋ alpha_B q_A/R^2 (classical induction, common practice; e.g. Stone, The
 * Theory of Intermolecular Forces, 2nd ed. 2013), which dominate at long range. Undefined for neutral species.
 */
export function chargeWarning(s: Species): string | undefined {
  if (s.kind !== 'tdhf' || s.charge === 0) return undefined;
  return (
    `${s.name} is an ion (charge ${s.charge > 0 ? '+' : ''}${s.charge}): only the dispersion (C_n) and dispersion-induced (D7) parts are given; ` +
    `the charge-induced (induction) terms, energy −alpha_B q_A²/(2R^4) and induced dipole alpha_B q_A/R^2 on the partner, dominate at long range and are NOT included`
  );
}

/** The species warnings of a pair (approximate inputs, charged species), each once: `pair`, `curve` and `density` print them. */
export function pairSpeciesWarnings(a: Species, b: Species): string[] {
  const all = [...speciesWarnings(a), ...speciesWarnings(b), chargeWarning(a), chargeWarning(b)];
  return [...new Set(all.filter((w): w is string => w !== undefined))];
}

/** Warnings every pair with this species carries (approximate inputs). */
export function speciesWarnings(s: Species): string[] {
  const approximate =
    (s.kind === 'response-table' && tableResponse(s).approximateB) || (s.kind === 'oscillator-spectrum' && oscillatorSpectrumResponse(s).approximateB);
  return approximate
    ? [`D7 is APPROXIMATE: ${s.name} has only a static B, so B(0; iu, −iu) ≈ B·alpha(iu)/alpha(0) (for hydrogen this overestimates |D7| by 17% in H–H; see README)`]
    : [];
}
