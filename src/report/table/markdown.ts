/** A Markdown document (GitHub pipe table): provenance as a list, the table, then warnings. */
import type { CoefficientTable } from '../../engines/table.js';
import { collectWarnings, humanTable, untrustedSummary, type HumanTableOptions } from './columns.js';
import { provenanceOf } from './provenance.js';

/** Escape text for a Markdown table cell or list item (backslash, pipe, brackets and inline markup characters). */
export function markdownEscape(s: string): string {
  return s.replace(/[\\|*_`<>[\]]/g, (c) => `\\${c}`);
}

export function tableToMarkdown(table: CoefficientTable, options: HumanTableOptions): string {
  const p = provenanceOf(table, options.units);
  const { header, columns, rows } = humanTable(table, options, 'markdown');
  const statusAt = columns.findIndex((c) => c.key === 'status') + 1; // 0 when no status column
  const e = markdownEscape;
  const lines: string[] = [`**${e(p.title)}**`, ''];
  for (const [label, value] of [['units', p.units], ['geometry', p.geometry], ['routes', p.routes], ['tolerances', p.tolerances], ['spread', p.spread], ['status', p.status], ['levels', p.levels]]) {
    lines.push(`- ${label}: ${e(value)}`);
  }
  lines.push('- species:');
  for (const s of p.species) lines.push(`  - ${e(s.name)}: ${e(s.definition)}${s.source !== undefined ? ` ${e(`[${s.source}]`)}` : ''}`);
  if (p.sources.length) {
    lines.push('- sources:');
    p.sources.forEach((src, i) => lines.push(`  - ${e(`[${i + 1}]`)} ${e(src)}`));
  }
  const line = (cells: string[]) => `| ${cells.join(' | ')} |`;
  const align = header.map((_, i) => (i === 0 || columns[i - 1].key === 'status' ? '---' : '---:'));
  lines.push('', line(header.map(e)), line(align));
  for (const cells of rows) {
    lines.push(line(cells.map((c, i) => (i === statusAt && /^(UNTRUSTED|NOT COMPUTED)$/.test(c) ? `**${c}**` : e(c)))));
  }
  const summary = untrustedSummary(table);
  lines.push('', summary.startsWith('UNTRUSTED') ? `**${summary}**` : summary);
  const warnings = collectWarnings(table);
  if (warnings.length) lines.push('', ...warnings.map((w) => `- warning: ${e(w.text)} — ${e(w.pairs.join(', '))}`));
  return lines.join('\n') + '\n';
}
