/**
 * The provenance of a table: everything a reader needs to reproduce it — the dispole version, the routes, the
 * tolerances and the species definitions with their sources. No dates or host names, so two runs give the
 * same bytes.
 */
import type { CoefficientTable } from '../../engines/table.js';
import { describeSpecies } from '../../model/species.js';
import { VERSION } from '../../version.js';
import type { UnitSystem } from '../pair-report.js';
import { oneLine, sourceList, STATUS_LEGEND, unitsSentence } from './columns.js';
import { levelsSentence } from './levels.js';

export interface Provenance {
  /** One line: version, what the table holds and how many pairs. */
  title: string;
  units: string;
  geometry: string;
  spread: string;
  routes: string;
  tolerances: string;
  /** Species in table order: name, parameters (atomic units) and the number of its source, if any. */
  species: Array<{ name: string; definition: string; source?: number }>;
  /** Distinct sources, numbered from 1. */
  sources: string[];
  status: string;
  /** Which columns are exact, first-principles, rescaled or model (see levels.ts). */
  levels: string;
}

export const GEOMETRY =
  'A at the origin, B at +R on z; mu_A,z(R) ≈ D7.a/R^7, mu_B,z(R) ≈ D7.b/R^7, D7.total = D7.a + D7.b; E(R) ≈ −C6/R^6 − C8/R^8 − C10/R^10';

/**
 * The routes asked for and those that ran. Each pair's reference is the first listed route that ran for it, so
 * when the first listed route ran for no pair (e.g. only the response route takes the recommended atoms), the
 * sentence names the route(s) that served as reference instead.
 */
function routesSentence(table: CoefficientTable): string {
  const s = table.settings;
  const used = [...new Set(table.rows.map((r) => r.result.routes[0].name))];
  const named = s.routes[0];
  const listed = s.routes.map((r, i) => (i === 0 && used.includes(named) ? `${r} (reference)` : r)).join(', ');
  const ran = s.routesRun.length < s.routes.length ? `; ran: ${s.routesRun.join(', ') || 'none'}` : '';
  const reference =
    used.length === 0 || (used.length === 1 && used[0] === named)
      ? ''
      : `; reference: ${used.join(' or ')} (the first listed route that ran for each pair${used.includes(named) ? '' : `; ${named} ran for no pair`})`;
  return listed + ran + reference;
}

export function provenanceOf(table: CoefficientTable, units: UnitSystem): Provenance {
  const s = table.settings;
  const list = sourceList(table);
  const n = table.rows.length;
  return {
    title: `dispole ${VERSION}: dispersion coefficients and dispersion-induced dipoles of ${n} pair${n === 1 ? '' : 's'}`,
    units: unitsSentence(units),
    geometry: GEOMETRY,
    spread: 'largest relative difference between the routes over C6, C8, C10, D7.a, D7.b (D7.total relative to the larger of |D7.a|, |D7.b|)',
    routes: routesSentence(table),
    tolerances: [
      `agreement ${s.agreement === undefined ? 'default' : s.agreement.toExponential()}`,
      `route relTol ${s.relTol === undefined ? 'default' : s.relTol.toExponential()}`,
      `perturbation basis ${s.maxQuanta === undefined ? 'exact minimum' : `${s.maxQuanta} quanta per centre`}`,
    ].join('; '),
    species: table.species.map((sp) => {
      const num = list.numberOf(sp);
      return { name: oneLine(sp.name), definition: describeSpecies(sp), ...(num !== undefined ? { source: num } : {}) };
    }),
    sources: list.sources,
    status: STATUS_LEGEND,
    levels: levelsSentence(table),
  };
}

/** Provenance as plain lines ("label: value"; species and sources indented), for text, CSV and LaTeX comments. */
export function provenanceLines(p: Provenance): string[] {
  return [
    p.title,
    `units: ${p.units}`,
    `geometry: ${p.geometry}`,
    `routes: ${p.routes}`,
    `tolerances: ${p.tolerances}`,
    `spread: ${p.spread}`,
    `status: ${p.status}`,
    `levels: ${p.levels}`,
    'species:',
    ...p.species.map((s) => `  ${s.name}: ${s.definition}${s.source !== undefined ? ` [${s.source}]` : ''}`),
    ...(p.sources.length ? ['sources:', ...p.sources.map((src, i) => `  [${i + 1}] ${src}`)] : []),
  ];
}
