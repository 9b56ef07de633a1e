/**
 * The `dispole table --json` document. Contract (kept): {"units":"atomic","rows":[{"a","b","C6","C8",
 * "D7":{"a","b","total"},"spread"}]}; every row also has C10, status, trusted, its routes and warnings, and
 * the document records the provenance. Numbers are always atomic units (C_n in Eh·a0^n, D7 in e·a0^8); with
 * `--units si` each row gains an `si` block, as in `dispole pair --json`.
 */
import { untrustedCount, type CoefficientTable } from '../../engines/table.js';
import { VERSION } from '../../version.js';
import { coefficientsToSI, type UnitSystem } from '../pair-report.js';
import { speciesToJson } from '../species-json.js';
import { rowSpread, STATUS_LEGEND } from './columns.js';
import { GEOMETRY } from './provenance.js';
import { levelsSentence } from './levels.js';
import { accuracyToJson } from '../accuracy-report.js';

export function tableToJson(table: CoefficientTable, options: { units: UnitSystem }): Record<string, unknown> {
  const s = table.settings;
  return {
    units: 'atomic',
    unitsNote: 'C_n in Eh·a0^n, D7 in e·a0^8; spread = largest relative difference between the routes (null when only one ran)',
    geometry: GEOMETRY,
    dispole: { version: VERSION },
    routes: { requested: s.routes, run: s.routesRun },
    tolerances: { agreement: s.agreement ?? null, relTol: s.relTol ?? null, maxQuanta: s.maxQuanta ?? null },
    statusLegend: STATUS_LEGEND,
    levels: levelsSentence(table),
    species: table.species.map(speciesToJson),
    untrustedRows: untrustedCount(table),
    ...(options.units === 'si' ? { si: { units: 'C6 J·m^6, C8 J·m^8, C10 J·m^10, D7 C·m^8 and debye·Å^7 (CODATA 2018)' } } : {}),
    // pairs no route can handle: listed apart, so every entry of `rows` keeps its numbers
    ...(table.uncomputed?.length ? { notComputed: table.uncomputed.map((u) => ({ a: u.a.name, b: u.b.name, status: 'NOT COMPUTED', reason: u.reason })) } : {}),
    rows: table.rows.map((row) => {
      const r = row.result;
      const c = r.coefficients;
      return {
        a: r.a.name,
        b: r.b.name,
        C6: c.C6,
        C8: c.C8 ?? null,
        C10: c.C10 ?? null,
        D7: { a: c.D7.a, b: c.D7.b, total: c.D7.total },
        D9: c.D9 ? { a: c.D9.a, b: c.D9.b, total: c.D9.total } : null,
        spread: rowSpread(row) ?? null,
        status: row.status,
        trusted: r.trusted,
        accuracy: accuracyToJson(r.accuracy),
        routes: r.routes.map((x) => x.name),
        ...(r.a.source !== undefined || r.b.source !== undefined ? { sources: { a: r.a.source ?? null, b: r.b.source ?? null } } : {}),
        warnings: r.warnings,
        ...(options.units === 'si' ? { si: coefficientsToSI(c) } : {}),
      };
    }),
  };
}

/** The JSON document as text: two-space indentation, final newline (deterministic key order). */
export const tableToJsonText = (table: CoefficientTable, options: { units: UnitSystem }): string =>
  JSON.stringify(tableToJson(table, options), null, 2) + '\n';
