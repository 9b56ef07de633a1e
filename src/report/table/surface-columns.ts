/**
 * The surface column set of `dispole table --surface`: one row per species with C3, C5, D4 (atomic units, or SI via
 * surfaceCoefficientsToSI), the route spread, the status and the species' source, as text, CSV, JSON, Markdown or
 * LaTeX (the booktabs float of latex.ts, names from latex-names.ts). Pure: the same table gives the same bytes.
 */
import type { SurfaceTable, SurfaceTableRow } from '../../engines/surface/surface-table.js';
import { describeSurface } from '../../model/surface-spec.js';
import { VERSION } from '../../version.js';
import { csvField, formatColumns, oneLine, sig, spreadText, textTable } from '../format.js';
import { levelCounts } from './levels.js';
import { NOT_COMPUTED } from './columns.js';
import type { UnitSystem } from '../pair-report.js';
import { SURFACE_GEOMETRY, surfaceCoefficientsToSI, surfaceToJson } from '../surface-report.js';
import { markdownEscape } from './markdown.js';
import { LATEX_NAME } from '../latex-names.js';
import { booktabsFloat, LATEX_STATUS_MARK, latexEscape, latexNumber, statusNotes } from './latex.js';

interface SurfaceColumn {
  name: 'C3' | 'C5' | 'D4';
  unit: string;
  /** LaTeX math unit, e.g. "E_\\mathrm{h}\\,a_0^{3}". */
  latexUnit: string;
  /** Shown in the LaTeX table (in SI only one unit per quantity, to fit a page: eV·Å^3, J·m^5, debye·Å^4). */
  latex: boolean;
  value(row: SurfaceTableRow): number | undefined;
}

/** The quantity columns of the surface set in the chosen units. */
export function surfaceQuantityColumns(units: UnitSystem): SurfaceColumn[] {
  const c = (r: SurfaceTableRow) => r.result.coefficients;
  if (units === 'atomic') {
    return [
      { name: 'C3', unit: 'Eh a0^3', latexUnit: 'E_\\mathrm{h}\\,a_0^{3}', latex: true, value: (r) => c(r).C3 },
      { name: 'C5', unit: 'Eh a0^5', latexUnit: 'E_\\mathrm{h}\\,a_0^{5}', latex: true, value: (r) => c(r).C5 },
      { name: 'D4', unit: 'e a0^5', latexUnit: 'e\\,a_0^{5}', latex: true, value: (r) => c(r).D4 },
    ];
  }
  const si = (r: SurfaceTableRow) => surfaceCoefficientsToSI(c(r));
  return [
    { name: 'C3', unit: 'J m^3', latexUnit: '\\mathrm{J\\,m^{3}}', latex: false, value: (r) => si(r).C3.Jm3 },
    { name: 'C3', unit: 'eV Å^3', latexUnit: '\\mathrm{eV}\\,\\mathring{\\mathrm{A}}^{3}', latex: true, value: (r) => si(r).C3.eVAngstrom3 },
    { name: 'C5', unit: 'J m^5', latexUnit: '\\mathrm{J\\,m^{5}}', latex: true, value: (r) => si(r).C5?.Jm5 },
    { name: 'D4', unit: 'C m^5', latexUnit: '\\mathrm{C\\,m^{5}}', latex: false, value: (r) => si(r).D4.Cm5 },
    { name: 'D4', unit: 'D Å^4', latexUnit: '\\mathrm{D}\\,\\mathring{\\mathrm{A}}^{4}', latex: true, value: (r) => si(r).D4.debyeAngstrom4 },
  ];
}

const spreadOf = (r: SurfaceTableRow) => (r.result.routes.length < 2 ? undefined : r.result.spread.max);

function warningsOf(t: SurfaceTable): Array<{ text: string; species: string[] }> {
  const by = new Map<string, string[]>();
  for (const r of t.rows) for (const w of r.result.warnings) by.set(w, [...(by.get(w) ?? []), r.result.species.name]);
  for (const u of t.uncomputed) by.set(`not computed, no route can handle the species: ${u.reason}`, [...(by.get(`not computed, no route can handle the species: ${u.reason}`) ?? []), u.species.name]);
  return [...by].map(([text, species]) => ({ text, species }));
}

/**
 * What the numbers rest on (src/engines/surface/surface.ts surfaceAccuracy): the levels of the C3/C5 and D4 columns
 * over the rows, then each species' C3/C5 and D4 level; the surface model is in the Surface line.
 */
export function surfaceLevelsSentence(t: SurfaceTable): string {
  const q = t.rows.map((r) => r.result.accuracy.quantities);
  const species = t.rows.map((r) => {
    const a = r.result.accuracy.quantities;
    return `${oneLine(r.result.species.name)} ${a.C3 === a.D4 ? a.C3 : `C3, C5 ${a.C3}, D4 ${a.D4}`}`;
  });
  return (
    `C3, C5: ${levelCounts(q.map((x) => x.C3))}; D4: ${levelCounts(q.map((x) => x.D4))}; species: ${species.join(', ')} ` +
    '(C3, C5 rest on the atom’s linear response, D4 on its dipole hyperpolarisability B; exact: no approximation beyond converged numerics; first-principles: no empirical input; rescaled: first-principles response rescaled to published values; model: a stand-in)'
  );
}

const headerLines = (t: SurfaceTable, units: UnitSystem, digits: number) => [
  `Surface: ${describeSurface(t.surface, (x) => sig(x, digits))}`,
  `Geometry: ${SURFACE_GEOMETRY}`,
  `Units: ${units === 'atomic' ? 'atomic (C3 in Eh·a0^3, C5 in Eh·a0^5, D4 in e·a0^5)' : 'SI, CODATA 2018'}`,
  ...(t.rows.length ? [`levels: ${surfaceLevelsSentence(t)}`] : []),
];

/** Text, CSV, JSON, Markdown or LaTeX. */
export function renderSurfaceTable(t: SurfaceTable, format: 'text' | 'csv' | 'json' | 'markdown' | 'latex', options: { units: UnitSystem; digits: number }): string {
  if (format === 'latex') return surfaceTableToLatex(t, options);
  const cols = surfaceQuantityColumns(options.units);
  const header = ['species', ...cols.map((c) => `${c.name} (${c.unit})`), 'spread', 'status', 'source'];
  if (format === 'json') {
    return JSON.stringify({
      units: 'atomic',
      kind: 'surface-table',
      geometry: SURFACE_GEOMETRY,
      surface: describeSurface(t.surface),
      ...(t.rows.length ? { levels: surfaceLevelsSentence(t) } : {}),
      rows: t.rows.map((r) => ({ ...surfaceToJson(r.result, options.units), status: r.status })),
      uncomputed: t.uncomputed.map((u) => ({ species: u.species.name, reason: u.reason })),
      dispole: { version: VERSION },
    }) + '\n';
  }
  if (format === 'csv') {
    const lines = headerLines(t, options.units, options.digits).map((l) => `# ${l}`);
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
      ...headerLines(t, options.units, options.digits).map((l) => `- ${e(l)}`),
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
    ...headerLines(t, options.units, options.digits),
    '',
    textTable(header, rows),
    '',
    'sources:',
    ...sourceLines.map((l) => `  ${l}`),
    'status: ok = the routes agree; unchecked = only one route could run; UNTRUSTED = a route did not converge or the routes disagree; NOT COMPUTED = no route can handle the species',
    ...warnings.map((w) => `warning: ${w.text} (${w.species.join(', ')})`),
  ].join('\n') + '\n';
}

/**
 * The surface column set as a LaTeX booktabs float: species (status as a mark after the name, as in `table --latex`),
 * C3, C5, D4 in the chosen units with `digits` significant digits, the spread and the numbered sources; the surface,
 * geometry, units, version and warnings as comments above the float.
 */
export function surfaceTableToLatex(t: SurfaceTable, options: { units: UnitSystem; digits: number }): string {
  const cols = surfaceQuantityColumns(options.units).filter((c) => c.latex);
  const sources: string[] = [];
  const ref = (src: string | undefined) => {
    if (src === undefined) return '---';
    if (!sources.includes(src)) sources.push(src);
    return latexEscape(`[${sources.indexOf(src) + 1}]`);
  };
  const numbers = formatColumns(t.rows.map((r) => cols.map((c) => c.value(r))), options.digits);
  const rows = t.rows.map((r, i) => [
    latexEscape(r.result.species.name) + (LATEX_STATUS_MARK[r.status] ?? ''),
    ...numbers[i].map(latexNumber),
    spreadOf(r) === undefined ? '---' : latexNumber(spreadText(spreadOf(r)!)),
    ref(r.result.species.source),
  ]);
  for (const u of t.uncomputed) rows.push([latexEscape(u.species.name) + LATEX_STATUS_MARK[NOT_COMPUTED], ...cols.map(() => '---'), '---', ref(u.species.source)]);
  const statuses = [...t.rows.map((r) => r.status), ...t.uncomputed.map(() => NOT_COMPUTED)];
  const unitWords = options.units === 'atomic' ? 'atomic units' : 'SI units (CODATA 2018)';
  const routes = [...new Set(t.rows.flatMap((r) => r.result.routes.map((x) => x.name)))];
  return booktabsFloat({
    comments: [
      `dispole ${VERSION}: surface coefficients of ${t.rows.length + t.uncomputed.length} species`,
      ...headerLines(t, options.units, options.digits),
      ...warningsOf(t).map((w) => `warning: ${w.text} — ${w.species.join(', ')}`),
    ],
    caption:
      `Atom--surface coefficients in ${unitWords}; surface: ${latexEscape(describeSurface(t.surface, (x) => sig(x, options.digits)))}` +
      ` (atom at distance $Z$ along the normal, $z$ from the surface to the atom; $E(Z) \\approx -${LATEX_NAME.C3}/Z^3 - ${LATEX_NAME.C5}/Z^5$,` +
      ` $\\mu_z(Z) \\approx ${LATEX_NAME.D4}/Z^4$, $${LATEX_NAME.D4} > 0$: dipole pointing away from the surface),` +
      ` by the routes ${latexEscape(routes.join(', '))}; spread: largest relative difference between the routes.`,
    label: 'tab:dispole-surface',
    spec: `l${cols.map(() => 'r').join('')}rc`,
    header: [
      ['Species', ...cols.map((c) => `$${LATEX_NAME[c.name]}$`), 'Spread', 'Source'],
      ['', ...cols.map((c) => `($${c.latexUnit}$)`), '(rel.)', ''],
    ],
    rows,
    notes: [...sources.map((src, i) => `${latexEscape(`[${i + 1}]`)}~${latexEscape(src)}`), ...statusNotes(statuses, { item: 'species' })],
  });
}
