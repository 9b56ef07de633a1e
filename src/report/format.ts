/** Number and table formatting shared by every report. Deterministic: the same numbers give the same bytes. */

import { sigColumn, sigDigits } from '../model/number-text.js';

export { sig, sigDigits, sigColumn, columnNotation, type Notation } from '../model/number-text.js';

/** Significant digits of printed numbers when nothing else is asked (every command's `--digits` default). */
export const DEFAULT_DIGITS = 7;

/** A CSV field, quoted when it holds a comma, quote or line break (RFC 4180). */
export function csvField(s: string): string {
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Text on one line: line breaks (possible in YAML names and sources) become spaces, so no format's layout breaks. */
export const oneLine = (s: string): string => s.replace(/\s*[\r\n]+\s*/g, ' ');

/**
 * A label that echoes numbers at full precision (e.g. coefficients computed by another route) with every decimal
 * number of more than `digits` significant digits shown to `digits`, for text reports (JSON keeps the label as is).
 */
export function labelToDigits(label: string, digits: number): string {
  const significant = (m: string) => m.replace(/e.*$/i, '').replace(/[-.]/g, '').replace(/^0+/, '').length;
  return label.replace(/-?\d+\.\d+(?:e[+-]?\d+)?/gi, (m) => (significant(m) > digits ? sigDigits(Number(m), digits) : m));
}

/** A relative spread: two significant digits, always in exponent form (`3.1e-15`, `1.3e+00`). */
export const spreadText = (x: number): string => (x === 0 ? '0' : sigDigits(x, 2, 'exponent'));

/** Left-aligned text table with a header row; columns padded by two spaces. */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[], align: 'left' | 'right' = 'right'): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: readonly string[]) =>
    cells
      .map((c, i) => (i === 0 || align === 'left' ? c.padEnd(widths[i]) : c.padStart(widths[i])))
      .join('  ')
      .trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

/**
 * Rows of cells whose numeric columns are formatted column by column ({@link sigColumn}: one notation per column).
 * `cells[r][c]` is a number (formatted), undefined ("—") or a string (kept as is).
 */
export function formatColumns(cells: ReadonlyArray<ReadonlyArray<number | string | undefined>>, digits: number): string[][] {
  const width = Math.max(0, ...cells.map((r) => r.length));
  const out = cells.map((r) => r.map((c) => (typeof c === 'string' ? c : '')));
  for (let c = 0; c < width; c++) {
    const numeric = cells.map((r) => r[c]).filter((v): v is number => typeof v === 'number');
    const texts = sigColumn(numeric, digits);
    let k = 0;
    cells.forEach((r, i) => {
      if (typeof r[c] === 'number') out[i][c] = texts[k++];
      else if (r[c] === undefined && c < r.length) out[i][c] = '—';
    });
  }
  return out;
}
