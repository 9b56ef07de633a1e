/**
 * Which columns of a table are exact, first-principles, rescaled or model (src/engines/accuracy.ts): the
 * dispersion columns (C6, C8, C10) and the B-dependent D7 columns each get the levels of their rows, so a reader
 * sees at once which numbers rest on a model. Pure: strings out.
 */
import { ACCURACY_LEVELS, speciesAccuracy, type AccuracyLevel } from '../../engines/accuracy.js';
import type { CoefficientTable } from '../../engines/table.js';
import { oneLine } from '../format.js';

/** "rescaled (6 rows), model (4 rows)": the levels a column takes over the rows, best first. */
export function levelCounts(levels: AccuracyLevel[]): string {
  return ACCURACY_LEVELS.filter((l) => levels.includes(l))
    .map((l) => {
      const n = levels.filter((x) => x === l).length;
      return levels.length === n ? l : `${l} (${n} row${n === 1 ? "" : "s"})`;
    })
    .join(', ');
}

/** The column levels and each species' level in one line (provenance of every table format). */
export function levelsSentence(table: CoefficientTable): string {
  const rows = table.rows.map((r) => r.result.accuracy.quantities);
  const species = table.species.map((s) => `${oneLine(s.name)} ${speciesAccuracy(s).level}`).join(', ');
  return `C6, C8, C10: ${levelCounts(rows.map((q) => q.dispersion))}; D7: ${levelCounts(rows.map((q) => q.D7))}; species: ${species} (exact: no approximation beyond converged numerics; first-principles: no empirical input; rescaled: first-principles response rescaled to published values; model: a stand-in, D7 rests on a model B)`;
}

/** True when every number of the table is exact (then formats may leave the levels out of the notes). */
export const allExact = (table: CoefficientTable): boolean =>
  table.rows.every((r) => r.result.accuracy.quantities.dispersion === 'exact' && r.result.accuracy.quantities.D7 === 'exact');
