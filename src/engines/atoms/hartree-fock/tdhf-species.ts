/**
 * The `tdhf` species' capabilities: its first-principles response data — the shipped table
 * (src/data/tdhf-atoms.ts) when the species is a neutral shipped atom at the default basis, else computed here
 * (cached per Z, charge and basis) — and the interpolated response functions and route notes built from them
 * with the tabulated-data machinery (tabulated-response.ts).
 */
import { TDHF_ATOMS } from '../../../data/tdhf-atoms.js';
import { DEFAULT_TDHF_BASIS, type TdhfSpecies } from '../../../model/closed-shell.js';
import { ConvergenceError } from '../../../model/errors.js';
import type { FirstPrinciplesResponse } from '../../../model/first-principles-response.js';
import { sig } from '../../../model/number-text.js';
import type { ResponseTableSpecies } from '../../../model/response-data.js';
import { responseTableResponse, type DataResponse } from '../tabulated-response.js';
import { computeTdhfAtom } from './atom-response.js';

const computed = new Map<string, FirstPrinciplesResponse>();

/** The shipped record for a neutral atom at the default basis, if there is one. */
export function shippedTdhfData(s: Pick<TdhfSpecies, 'symbol' | 'charge' | 'basis'>): FirstPrinciplesResponse | undefined {
  return s.charge === 0 && s.basis === DEFAULT_TDHF_BASIS && Object.prototype.hasOwnProperty.call(TDHF_ATOMS, s.symbol) ? TDHF_ATOMS[s.symbol] : undefined;
}

/**
 * The species' response data (shipped or computed). Throws {@link ConvergenceError} when the SCF does not
 * converge or the Hartree–Fock state is unstable (no trusted numbers exist then).
 */
export function tdhfData(s: TdhfSpecies): FirstPrinciplesResponse {
  const shipped = shippedTdhfData(s);
  if (shipped) return shipped;
  const key = `${s.Z}|${s.charge}|${s.basis}`;
  let d = computed.get(key);
  if (!d) {
    const c = computeTdhfAtom(s.Z, s.charge, s.basis);
    if (!c.converged) {
      // an SCF that did not converge reports its commutator; an unstable state (A − B not positive) its lowest pivot
      const unstable = Math.min(...c.ranks.map((r) => r.stability.AminusB));
      throw c.atom.converged
        ? new ConvergenceError(`${s.name}: time-dependent Hartree–Fock response of an unstable Hartree–Fock state (${c.problems.join('; ')})`, Math.abs(unstable), 0)
        : new ConvergenceError(`${s.name}: Hartree–Fock SCF (${c.problems.join('; ')})`, c.atom.residual, 1e-8);
    }
    d = c.response;
    computed.set(key, d);
  }
  return d;
}

const responses = new Map<string, DataResponse>();

/** Response functions for the response route, with notes on what they rest on. */
export function tdhfResponse(s: TdhfSpecies): DataResponse {
  const key = `${s.Z}|${s.charge}|${s.basis}|${s.name}`;
  const hit = responses.get(key);
  if (hit) return hit;
  const d = tdhfData(s);
  const table: ResponseTableSpecies = {
    kind: 'response-table',
    name: s.name,
    u: d.u,
    alpha: d.alpha1,
    alpha2: d.alpha2,
    alpha3: d.alpha3,
    hyperB: d.B,
    electrons: d.electrons,
  };
  const base = responseTableResponse(table);
  const origin = shippedTdhfData(s) ? 'shipped data (src/data/tdhf-atoms.ts)' : 'computed now';
  const notes = [
    `${s.name}: FIRST-PRINCIPLES at the ${d.level} level, no empirical input and no electron correlation (static alpha below the exact value by 4.4 % for He, 10.7 % for Ne, 2.9 % for Ar; see README)`,
    `${s.name}: ${d.basis}; Hartree–Fock energy ${sig(d.energy, 12)} Eh; ${origin}`,
    `${s.name}: ${d.convergence}`,
    ...base.notes,
  ];
  const r: DataResponse = { ...base, notes };
  responses.set(key, r);
  return r;
}
