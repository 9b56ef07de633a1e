/**
 * The column model shared by every table format: which quantities are shown in which units, the pair label,
 * the status legend, the numbered list of species sources and the distinct warnings of the rows.
 * Pure: strings and numbers out.
 */
import { untrustedCount, type CoefficientTable, type TableRow } from '../../engines/table.js';
import type { Species } from '../../model/species.js';
import { sig, spreadText } from '../format.js';
import { coefficientsToSI, type UnitSystem } from '../pair-report.js';

/** A numeric column: its name and unit as plain text and as LaTeX math, and a row's value in those units. */
export interface QuantityColumn {
  /** Plain name, e.g. "D7.a". */
  name: string;
  /** Plain unit, e.g. "e a0^8". */
  unit: string;
  /** LaTeX math name, e.g. "D_{7,A}". */
  latexName: string;
  /** LaTeX math unit, e.g. "e\\,a_0^8". */
  latexUnit: string;
  value(row: TableRow): number | undefined;
}

const D7_PARTS = [
  ['a', 'D7.a', 'D_{7,A}'],
  ['b', 'D7.b', 'D_{7,B}'],
  ['total', 'D7.total', 'D_{7,A}+D_{7,B}'],
] as const;

/**
 * The numeric columns of a table: C6, C8 (and C10 when asked), then D7.a, D7.b, D7.total.
 * Atomic units: C_n in Eh·a0^n, D7 in e·a0^8. SI (CODATA 2018, via coefficientsToSI): C_n in J·m^n, D7 in C·m^8
 * followed by D7 again in debye·Å^7.
 */
export function quantityColumns(units: UnitSystem, options: { C10?: boolean } = {}): QuantityColumn[] {
  const powers = options.C10 ? ([6, 8, 10] as const) : ([6, 8] as const);
  const si = (r: TableRow) => coefficientsToSI(r.result.coefficients);
  const d7 = (unit: string, latexUnit: string, value: (r: TableRow, k: 'a' | 'b' | 'total') => number): QuantityColumn[] =>
    D7_PARTS.map(([k, name, latexName]) => ({ name, unit, latexName, latexUnit, value: (r: TableRow) => value(r, k) }));
  const dispersion = powers.map((n) => ({
    name: `C${n}`,
    unit: units === 'atomic' ? `Eh a0^${n}` : `J m^${n}`,
    latexName: `C_{${n}}`,
    latexUnit: units === 'atomic' ? `E_\\mathrm{h}\\,a_0^{${n}}` : `\\mathrm{J\\,m^{${n}}}`,
    value: (r: TableRow) => (units === 'atomic' ? r.result.coefficients : si(r))[`C${n}`],
  }));
  if (units === 'atomic') return [...dispersion, ...d7('e a0^8', 'e\\,a_0^{8}', (r, k) => r.result.coefficients.D7[k])];
  return [
    ...dispersion,
    ...d7('C m^8', '\\mathrm{C\\,m^{8}}', (r, k) => si(r).D7[k].Cm8),
    ...d7('D Å^7', '\\mathrm{D}\\,\\mathring{\\mathrm{A}}^{7}', (r, k) => si(r).D7[k].debyeAngstrom7),
  ];
}

/** One sentence naming the units of the numbers. */
export function unitsSentence(units: UnitSystem): string {
  return units === 'atomic'
    ? 'atomic (C_n in Eh·a0^n, D7 in e·a0^8)'
    : 'SI, CODATA 2018 (C_n in J·m^n, D7 in C·m^8 and in debye·Å^7)';
}

/** Text on one line: line breaks (possible in YAML names and sources) become spaces, so no format's layout breaks. */
export const oneLine = (s: string): string => s.replace(/\s*[\r\n]+\s*/g, ' ');

/** The pair as shown in a row: "A–B" (A at the origin). */
export const pairLabel = (row: TableRow): string => oneLine(`${row.result.a.name}–${row.result.b.name}`);

/** A row's largest relative spread between routes; undefined when only one route ran (nothing to compare). */
export const rowSpread = (row: TableRow): number | undefined => (row.result.routes.length < 2 ? undefined : row.result.spread.max);

/** What the status words mean (printed with every format). */
export const STATUS_LEGEND =
  'ok = the routes agree; unchecked = only one route could run (no cross-check); UNTRUSTED = a route did not converge or the routes disagree';

/** Distinct species sources, numbered from 1 in order of the table's species. */
export interface SourceList {
  sources: string[];
  /** 1-based number of a species' source; undefined when it has none. */
  numberOf(s: Species): number | undefined;
}

export function sourceList(table: CoefficientTable): SourceList {
  const sources: string[] = [];
  for (const s of table.species) if (s.source !== undefined && !sources.includes(oneLine(s.source))) sources.push(oneLine(s.source));
  return {
    sources,
    numberOf: (s) => (s.source === undefined ? undefined : sources.indexOf(oneLine(s.source)) + 1),
  };
}

/** A row's source references as "[1]/[2]" (A/B; "—" for a species without a source). */
export function sourceRefs(row: TableRow, list: SourceList): string {
  const ref = (s: Species) => {
    const n = list.numberOf(s);
    return n === undefined ? '—' : `[${n}]`;
  };
  return `${ref(row.result.a)}/${ref(row.result.b)}`;
}

/** The rows' warnings, each distinct text once with the pairs it applies to, in order of first appearance. */
export function collectWarnings(table: CoefficientTable): Array<{ text: string; pairs: string[] }> {
  const byText = new Map<string, string[]>();
  for (const row of table.rows) {
    for (const w of row.result.warnings) {
      const list = byText.get(oneLine(w)) ?? [];
      list.push(pairLabel(row));
      byText.set(oneLine(w), list);
    }
  }
  return [...byText].map(([text, pairs]) => ({ text, pairs }));
}

/** Options of the formats meant for people (text, Markdown, LaTeX). */
export interface HumanTableOptions {
  units: UnitSystem;
  /** Significant digits of the coefficients. */
  digits: number;
}

/**
 * Header and cells of the table for people: pair, the quantities with units (`digits` significant digits, "—"
 * where a route gives none), spread, sources (only when some species has one) and status (last column).
 */
export function humanTable(table: CoefficientTable, options: HumanTableOptions): { header: string[]; rows: string[][]; sources: SourceList } {
  const cols = quantityColumns(options.units);
  const list = sourceList(table);
  const withSources = list.sources.length > 0;
  const header = ['pair', ...cols.map((c) => `${c.name} (${c.unit})`), 'spread', ...(withSources ? ['sources'] : []), 'status'];
  const rows = table.rows.map((row) => {
    const spread = rowSpread(row);
    return [
      pairLabel(row),
      ...cols.map((c) => {
        const v = c.value(row);
        return v === undefined ? '—' : sig(v, options.digits);
      }),
      spread === undefined ? '—' : spreadText(spread),
      ...(withSources ? [sourceRefs(row, list)] : []),
      row.status,
    ];
  });
  return { header, rows, sources: list };
}

/** The closing line about untrusted rows (every format says it in its own markup). */
export function untrustedSummary(table: CoefficientTable): string {
  const bad = untrustedCount(table);
  return bad === 0 ? 'No row is UNTRUSTED.' : `UNTRUSTED: ${bad} of ${table.rows.length} rows (see the status column and the warnings).`;
}
