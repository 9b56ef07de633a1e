/**
 * The surface column set of `dispole table --surface`: one row per species with C3, C5, D4 (atomic units, or SI via
 * surfaceCoefficientsToSI), the route spread, the status and the species' source, as text, CSV, JSON or Markdown.
 * Pure: the same table gives the same bytes.
 */
import type { SurfaceTable, SurfaceTableRow } from '../../engines/surface/surface-table.js';
import { describeSurface } from '../../model/surface-spec.js';
import { VERSION } from '../../version.js';
import { csvField, formatColumns, spreadText, textTable } from '../format.js';
import type { UnitSystem } from '../pair-report.js';
import { SURFACE_GEOMETRY, surfaceCoefficientsToSI, surfaceToJson } from '../surface-report.js';
import { markdownEscape } from './markdown.js';

interface SurfaceColumn {
  name: string;
  unit: string;
  value(row: SurfaceTableRow): number | undefined;
}

/** The quantity columns of the surface set in the chosen units. */
export function surfaceQuantityColumns(units: UnitSystem): SurfaceColumn[] {
  const c = (r: SurfaceTableRow) => r.result.coefficients;
  if (units === 'atomic') {
    return [
      { name: 'C3', unit: 'Eh a0^3', value: (r) => c(r).C3 },
      { name: 'C5', unit: 'Eh a0^5', value: (r) => c(r).C5 },
      { name: 'D4', unit: 'e a0^5', value: (r) => c(r).D4 },
    ];
  }
  const si = (r: SurfaceTableRow) => surfaceCoefficientsToSI(c(r));
  return [
    { name: 'C3', unit: 'J m^3', value: (r) => si(r).C3.Jm3 },
    { name: 'C3', unit: 'eV Å^3', value: (r) => si(r).C3.eVAngstrom3 },
    { name: 'C5', unit: 'J m^5', value: (r) => si(r).C5?.Jm5 },
    { name: 'D4', unit: 'C m^5', value: (r) => si(r).D4.Cm5 },
    { name: 'D4', unit: 'D Å^4', value: (r) => si(r).D4.debyeAngstrom4 },
  ];
}

const spreadOf = (r: SurfaceTableRow) => (r.result.routes.length < 2 ? undefined : r.result.spread.max);

function warningsOf(t: SurfaceTable): Array<{ text: string; species: string[] }> {
  const by = new Map<string, string[]>();
  for (const r of t.rows) for (const w of r.result.warnings) by.set(w, [...(by.get(w) ?? []), r.result.species.name]);
  for (const u of t.uncomputed) by.set(`not computed, no route can handle the species: ${u.reason}`, [...(by.get(`not computed, no route can handle the species: ${u.reason}`) ?? []), u.species.name]);
  return [...by].map(([text, species]) => ({ text, species }));
}

const headerLines = (t: SurfaceTable, units: UnitSystem) => [
  `Surface: ${describeSurface(t.surface)}`,
  `Geometry: ${SURFACE_GEOMETRY}`,
  `Units: ${units === 'atomic' ? 'atomic (C3 in Eh·a0^3, C5 in Eh·a0^5, D4 in e·a0^5)' : 'SI, CODATA 2018'}`,
];

/** Text, CSV, JSON or Markdown. */
export function renderSurfaceTable(t: SurfaceTable, format: 'text' | 'csv' | 'json' | 'markdown', options: { units: UnitSystem; digits: number }): string {
  const cols = surfaceQuantityColumns(options.units);
  const header = ['species', ...cols.map((c) => `${c.name} (${c.unit})`), 'spread', 'status', 'source'];
  if (format === 'json') {
    return JSON.stringify({
      units: 'atomic',
      kind: 'surface-table',
      geometry: SURFACE_GEOMETRY,
      surface: describeSurface(t.surface),
      rows: t.rows.map((r) => ({ ...surfaceToJson(r.result, options.units), status: r.status })),
      uncomputed: t.uncomputed.map((u) => ({ species: u.species.name, reason: u.reason })),
      dispole: { version: VERSION },
    }) + '\n';
  }
  if (format === 'csv') {
    const lines = headerLines(t, options.units).map((l) => `# ${l}`);
    lines.push(header.map(csvField).join(','));
    for (const r of t.rows) {
      const cells = [r.result.species.name, ...cols.map((c) => String(c.value(r) ?? '')), String(spreadOf(r) ?? ''), r.status, r.result.species.source ?? ''];
      lines.push(cells.map(csvField).join(','));
    }
    for (const u of t.uncomputed) lines.push([u.species.name, ...cols.map(() => ''), '', 'NOT COMPUTED', u.species.source ?? ''].map(csvField).join(','));
    return lines.join('\n') + '\n';
  }
  // sources as numbered references, listed below the table
  const sources: string[] = [];
  const ref = (src: string | undefined) => {
    if (src === undefined) return '—';
    if (!sources.includes(src)) sources.push(src);
    return `[${sources.indexOf(src) + 1}]`;
  };
  const numbers = formatColumns(t.rows.map((r) => cols.map((c) => c.value(r))), options.digits);
  const rows = t.rows.map((r, i) => [r.result.species.name, ...numbers[i], spreadOf(r) === undefined ? '—' : spreadText(spreadOf(r)!), r.status, ref(r.result.species.source)]);
  for (const u of t.uncomputed) rows.push([u.species.name, ...cols.map(() => '—'), '—', 'NOT COMPUTED', ref(u.species.source)]);
  const sourceLines = sources.map((src, i) => `[${i + 1}] ${src}`);
  const warnings = warningsOf(t);
  if (format === 'markdown') {
    const e = markdownEscape;
    const line = (cells: string[]) => `| ${cells.map(e).join(' | ')} |`;
    return [
      ...headerLines(t, options.units).map((l) => `- ${e(l)}`),
      '',
      line(header),
      `| ${header.map((_, i) => (i === 0 ? '---' : '---:')).join(' | ')} |`,
      ...rows.map(line),
      '',
      ...sourceLines.map((l) => `- ${e(l)}`),
      ...(warnings.length ? ['', ...warnings.map((w) => `- warning: ${e(w.text)} — ${e(w.species.join(', '))}`)] : []),
    ].join('\n') + '\n';
  }
  return [
    ...headerLines(t, options.units),
    '',
    textTable(header, rows),
    '',
    'sources:',
    ...sourceLines.map((l) => `  ${l}`),
    'status: ok = the routes agree; unchecked = only one route could run; UNTRUSTED = a route did not converge or the routes disagree; NOT COMPUTED = no route can handle the species',
    ...warnings.map((w) => `warning: ${w.text} (${w.species.join(', ')})`),
  ].join('\n') + '\n';
}
