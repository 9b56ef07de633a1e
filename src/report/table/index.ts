/** Every format of a coefficient table, behind one function. Pure: the same table gives the same bytes. */
import type { CoefficientTable } from '../../engines/table.js';
import type { UnitSystem } from '../pair-report.js';
import { tableToCsv } from './csv.js';
import { tableToJsonText } from './json.js';
import { tableToLatex } from './latex.js';
import { tableToMarkdown } from './markdown.js';
import { tableToText } from './text.js';

export const TABLE_FORMATS = ['text', 'csv', 'json', 'markdown', 'latex'] as const;
export type TableFormat = (typeof TABLE_FORMATS)[number];

/** Render `table` in `format`; `digits` applies to text, Markdown and LaTeX (CSV and JSON keep full precision). */
export function renderTable(table: CoefficientTable, format: TableFormat, options: { units: UnitSystem; digits: number; columns?: readonly string[] }): string {
  switch (format) {
    case 'text':
      return tableToText(table, options);
    case 'csv':
      return tableToCsv(table, options);
    case 'json':
      return tableToJsonText(table, options);
    case 'markdown':
      return tableToMarkdown(table, options);
    case 'latex':
      return tableToLatex(table, options);
  }
}

export { tableToText } from './text.js';
export { tableToCsv, csvField } from './csv.js';
export { tableToJson, tableToJsonText } from './json.js';
export { tableToMarkdown, markdownEscape } from './markdown.js';
export { tableToLatex, latexEscape, latexNumber } from './latex.js';
export { provenanceOf, provenanceLines, type Provenance } from './provenance.js';
export { quantityColumns, type HumanTableOptions, type QuantityColumn } from './columns.js';
