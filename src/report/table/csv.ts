/**
 * CSV (RFC 4180 quoting, "\n" line ends). Provenance comes first as lines starting with "#" (readers such as
 * pandas skip them with comment="#"). Numbers carry full double precision (shortest round-trip form), so
 * `--digits` does not apply; C10 is included.
 */
import type { CoefficientTable } from '../../engines/table.js';
import type { UnitSystem } from '../pair-report.js';
import { csvField } from '../format.js';
import { quantityColumns, rowSpread } from './columns.js';
import { provenanceLines, provenanceOf } from './provenance.js';

export { csvField };

const num = (x: number | undefined): string => (x === undefined ? '' : String(x));

export function tableToCsv(table: CoefficientTable, options: { units: UnitSystem }): string {
  const cols = quantityColumns(options.units, { C10: true });
  const header = ['a', 'b', ...cols.map((c) => `${c.name} (${c.unit})`), 'spread', 'status', 'reference route', 'source a', 'source b', 'warnings'];
  const lines = provenanceLines(provenanceOf(table, options.units)).map((l) => `# ${l}`);
  lines.push(header.map(csvField).join(','));
  for (const row of table.rows) {
    const r = row.result;
    const cells = [
      r.a.name,
      r.b.name,
      ...cols.map((c) => num(c.value(row))),
      num(rowSpread(row)),
      row.status,
      r.routes[0].name,
      r.a.source ?? '',
      r.b.source ?? '',
      r.warnings.join('; '),
    ];
    lines.push(cells.map(csvField).join(','));
  }
  const blanks = cols.map(() => '');
  for (const u of table.uncomputed ?? []) {
    lines.push([u.a.name, u.b.name, ...blanks, '', 'NOT COMPUTED', '', u.a.source ?? '', u.b.source ?? '', `no route can handle the pair: ${u.reason}`].map(csvField).join(','));
  }
  return lines.join('\n') + '\n';
}
