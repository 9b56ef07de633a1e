/** The aligned plain-text table (the default format): provenance header, the table, then warnings. */
import type { CoefficientTable } from '../../engines/table.js';
import { textTable } from '../format.js';
import { collectWarnings, humanTable, untrustedSummary, type HumanTableOptions } from './columns.js';
import { provenanceLines, provenanceOf } from './provenance.js';

export function tableToText(table: CoefficientTable, options: HumanTableOptions): string {
  const { header, rows } = humanTable(table, options, 'text');
  const lines = provenanceLines(provenanceOf(table, options.units));
  lines.push('', textTable(header, rows), '', untrustedSummary(table));
  for (const w of collectWarnings(table)) lines.push(`warning: ${w.text} — ${w.pairs.join(', ')}`);
  return lines.join('\n') + '\n';
}
