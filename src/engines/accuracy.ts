/**
 * What a pair's numbers rest on — physically, not numerically. Route agreement checks the arithmetic (every
 * route solves the same model); this module says how good the model is.
 *
 * Levels (per species, and per quantity: the dispersion coefficients C_n and the B-dependent D7):
 * - `exact`: dispole adds no approximation to the species as defined beyond converged numerics — hydrogen-like
 *   atoms (exact non-relativistic), a QDO given by its parameters (exact for that QDO: it is a model of itself),
 *   and user response data with B(0; iu, −iu) (as good as the data).
 * - `first-principles`: computed at a stated level of theory without empirical input (time-dependent Hartree–Fock).
 * - `rescaled`: first-principles response functions rescaled to published static values (the recommended He … Xe;
 *   src/engines/atoms/recommended-atom.ts); D7 carries an uncertainty estimate.
 * - `model`: a stand-in whose D7 rests on a model's B — a QDO fitted to a real atom's alpha, C6, C8 (H-qdo,
 *   He-qdo, …, `fit:` species), or user data with only a static B (B(iu) ≈ B·alpha(iu)/alpha(0)). Such pairs carry
 *   a MODEL warning, with the model's B beside the published one where that is sourced.
 *
 * The D7 uncertainty of a pair with a recommended atom is the largest difference between its D7 and the D7 of the
 * same pair with every recommended atom replaced by (i) its unscaled first-principles functions and (ii) its fitted
 * QDO (a conservative spread between three models of the same atom, not a statistical error).
 */
import { drudeHyperpolarisabilityB, isIsotropicDrude, isotropicParameters } from '../model/drude.js';
import { atomLibrarySpecies, qdoStandInOf } from '../model/builtin-species.js';
import { sig } from '../model/number-text.js';
import type { Species } from '../model/species.js';
import { recommendedAtomBySymbol, recommendedAtomOf } from './atoms/recommended-atoms.js';
import { responseTableResponse } from './atoms/tabulated-response.js';
import type { D7Triple, RouteOptions } from './route.js';
import { responseRoute } from './response/route.js';

/** The levels, from best to worst. */
export const ACCURACY_LEVELS = ['exact', 'first-principles', 'rescaled', 'model'] as const;
export type AccuracyLevel = (typeof ACCURACY_LEVELS)[number];

/** The worse of some levels (exact < first-principles < rescaled < model). */
export const worstLevel = (...levels: AccuracyLevel[]): AccuracyLevel => ACCURACY_LEVELS[Math.max(...levels.map((l) => ACCURACY_LEVELS.indexOf(l)))];

/** What one species' numbers rest on. */
export interface SpeciesAccuracy {
  level: AccuracyLevel;
  /** Level of the dispersion coefficients C6, C8, C10 and of the B-dependent D7. */
  quantities: { dispersion: AccuracyLevel; D7: AccuracyLevel };
  /** What the numbers rest on, in a few words (used in the pair's statement and in listings). */
  basis: string;
  /** The MODEL warning a pair with this species carries (level model), naming the model's B and the published one. */
  warning?: string;
}

/** The accuracy block of a pair result (`accuracy` in `dispole pair --json`). */
export interface PairAccuracy {
  /** Level per species. */
  level: { a: AccuracyLevel; b: AccuracyLevel };
  /**
   * Level per quantity for the pair (the worse of the two species). D9 (present when a route gave D9) rests on
   * the same response and hyperpolarisability as D7, so it has D7's level.
   */
  quantities: { dispersion: AccuracyLevel; D7: AccuracyLevel; D9?: AccuracyLevel };
  /** One sentence: what the pair's numbers rest on. */
  statement: string;
  /** Estimated physical uncertainty (absolute, e·a0^8) where a recommended atom is involved. */
  uncertainty?: {
    D7: D7Triple;
    method: string;
    /** The D7 of the alternative models the spread is taken over. */
    models: Array<{ model: 'first-principles (unscaled)' | 'fitted QDO'; D7: D7Triple }>;
  };
  /** Model warnings (also in the pair's warnings). */
  warnings: string[];
}

const b4 = (x: number) => sig(x, 4);

/** "|B| is 46 % too small for hydrogen, 39 % for helium": how far fitted QDOs miss published B values. */
function qdoBRecord(): string {
  const parts: string[] = [];
  for (const s of atomLibrarySpecies) {
    const atom = qdoStandInOf(s);
    if (!atom?.publishedB || s.kind !== 'drude') continue;
    const ratio = drudeHyperpolarisabilityB(isotropicParameters(s)) / atom.publishedB.value;
    parts.push(`${Math.round((1 - ratio) * 100)} % for ${atom.element}`);
  }
  return parts.length ? `fitted QDOs miss |B| by ${parts.join(', ')}` : '';
}

/** The level, basis and warning of one species. */
export function speciesAccuracy(s: Species): SpeciesAccuracy {
  const same = (level: AccuracyLevel, basis: string, warning?: string): SpeciesAccuracy => ({ level, quantities: { dispersion: level, D7: level }, basis, ...(warning ? { warning } : {}) });
  switch (s.kind) {
    case 'hydrogenic':
      return same('exact', `${s.name}: exact non-relativistic one-electron atom (Z = ${sig(s.Z, 6)}), converged Sturmian basis`);
    case 'drude': {
      const atom = qdoStandInOf(s);
      const modelB = isIsotropicDrude(s) ? drudeHyperpolarisabilityB(isotropicParameters(s)) : undefined;
      const Btext = modelB === undefined ? '' : ` B = ${b4(modelB)}`;
      if (atom) {
        const rec = recommendedAtomBySymbol(atom.symbol);
        const recB = rec && !atom.publishedB ? `; the recommended ${atom.symbol} uses B = ${b4(rec.response.hyperB(0))} (rescaled first-principles estimate)` : '';
        const pub = atom.publishedB
          ? `published static B of ${atom.element} = ${b4(atom.publishedB.value)} (${atom.publishedB.source})`
          : `no published static B of ${atom.element} in the library${recB}; ${qdoBRecord()}`;
        const better =
          atom.symbol === 'H'
            ? 'prefer H (exact)'
            : recommendedAtomBySymbol(atom.symbol)
              ? `prefer ${atom.symbol} (the recommended model)`
              : `no first-principles data for ${atom.element} are shipped yet`;
        return same(
          'model',
          `${s.name}: MODEL, a QDO standing in for ${atom.element} (model B = ${b4(modelB!)}${atom.publishedB ? ` vs published ${b4(atom.publishedB.value)}` : ''})`,
          `MODEL: ${s.name} is a quantum Drude oscillator standing in for ${atom.element}; C6 and C8 of the like pair are the published values by construction, ` +
            `but D7 rests on the model's B = ${b4(modelB!)} (${pub}), so D7 may be off by tens of per cent; the routes agreeing does not change that; ${better}`,
        );
      }
      if (s.fittedFrom) {
        // a user's fit: exact for the QDO it defines; said plainly what D7 rests on if it stands in for a real atom
        return same('exact', `${s.name}: exact for the QDO fitted to alpha, C6, C8 (a model of itself; if these are a real atom's values, D7 rests on the model's${Btext}, not the atom's)`);
      }
      return same('exact', `${s.name}: exact for the QDO as defined (a model of itself${Btext ? `;${Btext}` : ''})`);
    }
    case 'response-table': {
      const rec = recommendedAtomOf(s);
      if (rec) {
        const f = rec.factors;
        const targets = ['alpha', 'C6', 'C8', ...(f.s3From === 'C10' ? ['C10'] : []), ...(f.sBFrom === 'published B' ? ['B'] : [])].join(', ');
        return same('rescaled', `${s.name}: first-principles (time-dependent Hartree–Fock) response rescaled to the published ${targets}${f.sBFrom === 'estimate' ? ' (B scaled by an estimate: no published B)' : ''}`);
      }
      if (responseTableResponse(s).approximateB) {
        return { level: 'model', quantities: { dispersion: 'exact', D7: 'model' }, basis: `${s.name}: user data with a static B only, B(iu) ≈ B·alpha(iu)/alpha(0) (MODEL for D7)` };
      }
      return same('exact', `${s.name}: exact for the response data as given (as good as the data; interpolated, see the route notes)`);
    }
    case 'oscillator-spectrum':
      return { level: 'model', quantities: { dispersion: 'exact', D7: 'model' }, basis: `${s.name}: user pseudo-spectrum with a static B only, B(iu) ≈ B·alpha(iu)/alpha(0) (MODEL for D7)` };
    case 'tdhf':
      return same('first-principles', `${s.name}: time-dependent Hartree–Fock, no empirical input (no electron correlation: alpha and C6 typically a few per cent low, B more)`);
  }
}

/** The alternative models of a species for the uncertainty spread (recommended atoms only). */
function alternatives(s: Species): { unscaled: Species; qdo: Species } | undefined {
  const rec = recommendedAtomOf(s);
  if (!rec) return undefined;
  const qdo = atomLibrarySpecies.find((q) => q.name === `${rec.record.symbol}-qdo`);
  return qdo ? { unscaled: rec.unscaled, qdo } : undefined;
}

/** D7 of a pair by the response route (no other route handles response tables), or undefined when it cannot run. */
function responseD7(a: Species, b: Species, options: RouteOptions): D7Triple | undefined {
  if (responseRoute.unsupported(a, b)) return undefined;
  const r = responseRoute.run(a, b, options);
  return r.converged ? r.D7 : undefined;
}

/** The accuracy of a pair whose reference D7 is `D7` (`withD9`: a route gave D9, listed with D7's level). */
export function pairAccuracy(a: Species, b: Species, D7: D7Triple, options: RouteOptions = {}, withD9 = false): PairAccuracy {
  const sa = speciesAccuracy(a), sb = speciesAccuracy(b);
  const levelD7 = worstLevel(sa.quantities.D7, sb.quantities.D7);
  const quantities = { dispersion: worstLevel(sa.quantities.dispersion, sb.quantities.dispersion), D7: levelD7, ...(withD9 ? { D9: levelD7 } : {}) };
  const warnings = [...new Set([sa.warning, sb.warning].filter((w): w is string => w !== undefined))];
  const altA = alternatives(a), altB = alternatives(b);
  let uncertainty: PairAccuracy['uncertainty'];
  if (altA || altB) {
    const models: NonNullable<PairAccuracy['uncertainty']>['models'] = [];
    for (const [model, key] of [['first-principles (unscaled)', 'unscaled'], ['fitted QDO', 'qdo']] as const) {
      const d = responseD7(altA?.[key] ?? a, altB?.[key] ?? b, options);
      if (d) models.push({ model, D7: d });
    }
    const dev = (k: keyof D7Triple) => Math.max(0, ...models.map((m) => Math.abs(m.D7[k] - D7[k])));
    uncertainty = {
      D7: { a: dev('a'), b: dev('b'), total: dev('total') },
      method: 'largest difference from the same pair with each recommended atom replaced by its unscaled first-principles functions, and by its fitted QDO',
      models,
    };
  }
  const bases = a === b || sa.basis === sb.basis ? [sa.basis] : [sa.basis, sb.basis];
  const tail = uncertainty
    ? '; D7 uncertainty from the spread between the unscaled first-principles, rescaled and fitted-QDO models'
    : quantities.D7 === 'model'
      ? '; D7 rests on a model B and is not a prediction for the real atom'
      : '';
  return { level: { a: sa.level, b: sb.level }, quantities, statement: `${bases.join('; ')}${tail}.`, ...(uncertainty ? { uncertainty } : {}), warnings };
}
