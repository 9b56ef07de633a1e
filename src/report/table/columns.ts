/**
 * The column model shared by every table format: which quantities are shown in which units, the pair label,
 * the status legend, the numbered list of species sources and the distinct warnings of the rows.
 * Pure: strings and numbers out.
 */
import { untrustedCount, type CoefficientTable, type TableRow } from '../../engines/table.js';
import { InputError } from '../../model/errors.js';
import { LATEX_NAME } from '../latex-names.js';
import type { Species } from '../../model/species.js';
import { oneLine, sigColumn, spreadText } from '../format.js';
import { coefficientsToSI, type UnitSystem } from '../pair-report.js';
import { dipoleCoefficientAuToSI } from '../../model/units.js';

/** A numeric column: its name and unit as plain text and as LaTeX math, and a row's value in those units. */
export interface QuantityColumn {
  /** The name `--columns` uses, e.g. "D7.a" or (SI, debye·Å^7) "D7.a-debye". */
  key: string;
  /** Plain name, e.g. "D7.a". */
  name: string;
  /** Plain unit, e.g. "e a0^8". */
  unit: string;
  /** LaTeX math name, e.g. "D_{7}^{(a)}" (the notation of `derive --latex`, src/report/latex-names.ts). */
  latexName: string;
  /** LaTeX math unit, e.g. "e\\,a_0^8". */
  latexUnit: string;
  value(row: TableRow): number | undefined;
}

const D7_PARTS = [
  ['a', 'D7.a'],
  ['b', 'D7.b'],
  ['total', 'D7.total'],
] as const;
const D9_PARTS = [
  ['a', 'D9.a'],
  ['b', 'D9.b'],
  ['total', 'D9.total'],
] as const;

/** The D9 columns (on request: `--columns D9.a,…`): e·a0^10, or C·m^10 in SI; "—" where the routes give no D9. */
function d9Columns(units: UnitSystem): QuantityColumn[] {
  return D9_PARTS.map(([k, name]) => ({
    key: name,
    name,
    unit: units === 'atomic' ? 'e a0^10' : 'C m^10',
    latexName: LATEX_NAME[name],
    latexUnit: units === 'atomic' ? 'e\\,a_0^{10}' : '\\mathrm{C\\,m^{10}}',
    value: (r: TableRow) => {
      const d9 = r.result.coefficients.D9;
      return d9 === undefined ? undefined : units === 'atomic' ? d9[k] : dipoleCoefficientAuToSI(d9[k], 9);
    },
  }));
}

/**
 * The numeric columns of a table: C6, C8 (and C10 when asked), then D7.a, D7.b, D7.total.
 * Atomic units: C_n in Eh·a0^n, D7 in e·a0^8. SI (CODATA 2018, via coefficientsToSI): C_n in J·m^n, D7 in C·m^8
 * followed by D7 again in debye·Å^7 (keys "D7.a-debye" …).
 */
export function quantityColumns(units: UnitSystem, options: { C10?: boolean; D9?: boolean } = {}): QuantityColumn[] {
  const base = coefficientColumns(units, options);
  return options.D9 ? [...base, ...d9Columns(units)] : base;
}

function coefficientColumns(units: UnitSystem, options: { C10?: boolean }): QuantityColumn[] {
  const powers = options.C10 ? ([6, 8, 10] as const) : ([6, 8] as const);
  const si = (r: TableRow) => coefficientsToSI(r.result.coefficients);
  const d7 = (suffix: string, unit: string, latexUnit: string, value: (r: TableRow, k: 'a' | 'b' | 'total') => number): QuantityColumn[] =>
    D7_PARTS.map(([k, name]) => ({ key: name + suffix, name, unit, latexName: LATEX_NAME[name], latexUnit, value: (r: TableRow) => value(r, k) }));
  const dispersion = powers.map((n) => ({
    key: `C${n}`,
    name: `C${n}`,
    unit: units === 'atomic' ? `Eh a0^${n}` : `J m^${n}`,
    latexName: LATEX_NAME[`C${n}`],
    latexUnit: units === 'atomic' ? `E_\\mathrm{h}\\,a_0^{${n}}` : `\\mathrm{J\\,m^{${n}}}`,
    value: (r: TableRow) => (units === 'atomic' ? r.result.coefficients : si(r))[`C${n}`],
  }));
  if (units === 'atomic') return [...dispersion, ...d7('', 'e a0^8', 'e\\,a_0^{8}', (r, k) => r.result.coefficients.D7[k])];
  return [
    ...dispersion,
    ...d7('', 'C m^8', '\\mathrm{C\\,m^{8}}', (r, k) => si(r).D7[k].Cm8),
    ...d7('-debye', 'D Å^7', '\\mathrm{D}\\,\\mathring{\\mathrm{A}}^{7}', (r, k) => si(r).D7[k].debyeAngstrom7),
  ];
}

/** Columns besides the quantities that `--columns` may name. */
export const EXTRA_COLUMNS = ['spread', 'sources', 'status'] as const;

/**
 * The default column choice of a format: every quantity for text and Markdown; for LaTeX (a page is about
 * 16 cm wide) C6, C8, D7.a, D7.b (D7.total = D7.a + D7.b adds nothing; in SI the debye·Å^7 values) and the spread.
 */
export function defaultColumnKeys(format: 'text' | 'markdown' | 'latex', units: UnitSystem, C10 = false): string[] {
  const all = quantityColumns(units, { C10 }).map((c) => c.key);
  if (format !== 'latex') return [...all, ...EXTRA_COLUMNS];
  const d7 = units === 'atomic' ? ['D7.a', 'D7.b'] : ['D7.a-debye', 'D7.b-debye'];
  return ['C6', 'C8', ...(C10 ? ['C10'] : []), ...d7, ...EXTRA_COLUMNS];
}

/** The columns `--columns` may name, for the help text and error messages. */
export function columnKeys(units: UnitSystem): string[] {
  return [...quantityColumns(units, { C10: true, D9: true }).map((c) => c.key), ...EXTRA_COLUMNS];
}

/** Check a `--columns` list (comma-separated keys) against the known columns; returns the keys in the order given. */
export function parseColumnList(list: string, units: UnitSystem): string[] {
  const known = columnKeys(units);
  const keys = list.split(',').map((k) => k.trim()).filter(Boolean);
  if (keys.length === 0) throw new InputError('--columns', `is empty; name columns from ${known.join(', ')}`);
  for (const k of keys) {
    if (!known.includes(k)) throw new InputError('--columns', `has the unknown column ${JSON.stringify(k)}; known with --units ${units}: ${known.join(', ')}`);
  }
  if (new Set(keys).size !== keys.length) throw new InputError('--columns', 'names a column twice');
  return keys;
}

/** One sentence naming the units of the numbers. */
export function unitsSentence(units: UnitSystem): string {
  return units === 'atomic'
    ? 'atomic (C_n in Eh·a0^n, D7 in e·a0^8)'
    : 'SI, CODATA 2018 (C_n in J·m^n, D7 in C·m^8 and in debye·Å^7)';
}

export { oneLine };

/** The pair as shown in a row: "A–B" (A at the origin). */
export const pairLabel = (row: TableRow): string => oneLine(`${row.result.a.name}–${row.result.b.name}`);

/** A row's largest relative spread between routes; undefined when only one route ran (nothing to compare). */
export const rowSpread = (row: TableRow): number | undefined => (row.result.routes.length < 2 ? undefined : row.result.spread.max);

/** What the status words mean (printed with every format). */
export const STATUS_LEGEND =
  'ok = the routes agree; unchecked = only one route could run (no cross-check); model = D7 rests on a model or an approximate input (see the warnings); UNTRUSTED = a route did not converge or the routes disagree; NOT COMPUTED = no route can handle the pair (reason in the warnings)';

/** The status word of pairs no route can handle. */
export const NOT_COMPUTED = 'NOT COMPUTED';

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
  for (const u of table.uncomputed ?? []) {
    const text = oneLine(`not computed, no route can handle the pair: ${u.reason}`);
    byText.set(text, [...(byText.get(text) ?? []), oneLine(`${u.a.name}–${u.b.name}`)]);
  }
  return [...byText].map(([text, pairs]) => ({ text, pairs }));
}

/** Options of the formats meant for people (text, Markdown, LaTeX). */
export interface HumanTableOptions {
  units: UnitSystem;
  /** Significant digits of the coefficients. */
  digits: number;
  /** Column keys in order (see {@link columnKeys}); default {@link defaultColumnKeys} of the format. */
  columns?: readonly string[];
}

/** A cell of the human table, with what it is (so formats can mark it up). */
export interface HumanColumn {
  key: string;
  header: string;
  /** A quantity column (numbers), or one of the extra columns. */
  quantity?: QuantityColumn;
}

/**
 * Header and cells of the table for people: pair, then the chosen columns — quantities with units (`digits`
 * significant digits, one notation per column, "—" where a route gives none), spread, sources (only when some
 * species has one) and status. Pairs no route can handle come last, flagged NOT COMPUTED.
 */
export function humanTable(
  table: CoefficientTable,
  options: HumanTableOptions,
  format: 'text' | 'markdown' | 'latex' = 'text',
): { header: string[]; columns: HumanColumn[]; rows: string[][]; sources: SourceList; statuses: string[] } {
  const list = sourceList(table);
  const C10 = options.columns?.includes('C10') ?? false;
  const all = quantityColumns(options.units, { C10, D9: options.columns?.some((k) => k.startsWith('D9.')) ?? false });
  const keys = (options.columns ?? defaultColumnKeys(format, options.units)).filter((k) => k !== 'sources' || list.sources.length > 0);
  const columns: HumanColumn[] = keys.map((key) => {
    const quantity = all.find((c) => c.key === key);
    return { key, header: quantity ? `${quantity.name} (${quantity.unit})` : key, ...(quantity ? { quantity } : {}) };
  });
  const uncomputed = table.uncomputed ?? [];
  const numbers = columns.map((c) => (c.quantity ? sigColumn(table.rows.map((row) => c.quantity!.value(row)), options.digits) : []));
  const rows = table.rows.map((row, i) => [
    pairLabel(row),
    ...columns.map((c, j) => {
      if (c.quantity) return numbers[j][i];
      if (c.key === 'spread') {
        const spread = rowSpread(row);
        return spread === undefined ? '—' : spreadText(spread);
      }
      if (c.key === 'sources') return sourceRefs(row, list);
      return row.status;
    }),
  ]);
  for (const u of uncomputed) rows.push([oneLine(`${u.a.name}–${u.b.name}`), ...columns.map((c) => (c.key === 'status' ? NOT_COMPUTED : '—'))]);
  const statuses = [...table.rows.map((r) => r.status as string), ...uncomputed.map(() => NOT_COMPUTED)];
  return { header: ['pair', ...columns.map((c) => c.header)], columns, rows, sources: list, statuses };
}

/** The closing line about untrusted and uncomputed rows (every format says it in its own markup). */
export function untrustedSummary(table: CoefficientTable): string {
  const bad = untrustedCount(table);
  const missing = table.uncomputed?.length ?? 0;
  const total = table.rows.length + missing;
  const parts: string[] = [];
  if (bad > 0) parts.push(`UNTRUSTED: ${bad} of ${total} rows (see the status column and the warnings).`);
  if (missing > 0) parts.push(`${NOT_COMPUTED}: ${missing} of ${total} pairs (no route can handle them; see the warnings).`);
  return parts.length ? parts.join(' ') : 'No row is UNTRUSTED.';
}
