/** Number and table formatting shared by every report. Deterministic: the same numbers give the same bytes. */

export { sig } from '../model/number-text.js';

/** A relative spread in short exponent form, e.g. `3.1e-15`. */
export const spreadText = (x: number): string => (x === 0 ? '0' : x.toExponential(1).replace('+', ''));

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
