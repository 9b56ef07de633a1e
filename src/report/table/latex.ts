/**
 * A LaTeX table for a paper: a `table` float with a booktabs `tabular` (\toprule, \midrule, \bottomrule; needs
 * \usepackage{booktabs}), quantity names and units in a two-line header, numbers in math mode with `--digits`
 * significant digits and ×10^n exponents. Untrusted rows carry a dagger (†) explained under the table, rows with
 * a single route a double dagger (‡). The provenance and the warnings are LaTeX comments above the float.
 */
import type { CoefficientTable } from '../../engines/table.js';
import { oneLine } from '../format.js';
import { LATEX_NAME } from '../latex-names.js';
import { collectWarnings, humanTable, NOT_COMPUTED, untrustedSummary, type HumanTableOptions } from './columns.js';
import { provenanceLines, provenanceOf } from './provenance.js';
import { allExact, levelsSentence } from './levels.js';

/** Characters outside ASCII that plain pdfLaTeX may not know, spelled as LaTeX (others pass through). */
const UNICODE_TO_LATEX: Record<string, string> = {
  '–': '--', '—': '---', '·': '\\textperiodcentered{}', 'Å': '\\AA{}', '×': '\\ensuremath{\\times}', '±': '\\ensuremath{\\pm}',
  '≈': '\\ensuremath{\\approx}', '∞': '\\ensuremath{\\infty}', '²': '\\textsuperscript{2}', '³': '\\textsuperscript{3}',
  'α': '\\ensuremath{\\alpha}', 'β': '\\ensuremath{\\beta}', 'γ': '\\ensuremath{\\gamma}', 'ε': '\\ensuremath{\\varepsilon}',
  'μ': '\\ensuremath{\\mu}', 'µ': '\\ensuremath{\\mu}', 'π': '\\ensuremath{\\pi}', 'ω': '\\ensuremath{\\omega}', '−': '\\ensuremath{-}',
};

/**
 * Escape text for LaTeX: the ten special characters, | < > (wrong glyphs in OT1 text), brackets (so a cell never
 * starts an optional argument of \\\\), and a few Unicode signs.
 */
export function latexEscape(s: string): string {
  return s.replace(/[\\{}&%$#_~^[\]|<>]|[^\x00-\x7f]/g, (c) => {
    switch (c) {
      case '|':
        return '\\textbar{}';
      case '<':
        return '\\textless{}';
      case '>':
        return '\\textgreater{}';
      case '\\':
        return '\\textbackslash{}';
      case '~':
        return '\\textasciitilde{}';
      case '^':
        return '\\textasciicircum{}';
      case '[':
      case ']':
        return `{${c}}`;
      default:
        return '{}&%$#_'.includes(c) ? `\\${c}` : (UNICODE_TO_LATEX[c] ?? c);
    }
  });
}

/** A formatted number (from sig or spreadText) as LaTeX math: "-1.5e-7" → "$-1.5\times10^{-7}$"; "—" → "---". */
export function latexNumber(text: string): string {
  if (text === '—') return '---';
  if (text === '∞' || text === '-∞') return `$${text.startsWith('-') ? '-' : ''}\\infty$`;
  const m = /^(-?)(\d+(?:\.\d+)?)(?:e([+-]?\d+))?$/.exec(text);
  if (!m) return latexEscape(text);
  const [, sign, mantissa, exponent] = m;
  return `$${sign}${mantissa}${exponent === undefined || Number(exponent) === 0 ? '' : `\\times10^{${Number(exponent)}}`}$`;
}

/** Marks after the row label: dagger UNTRUSTED, double dagger single route, section sign model, pilcrow not computed. */
export const LATEX_STATUS_MARK: Record<string, string> = { UNTRUSTED: '$^{\\dagger}$', unchecked: '$^{\\ddagger}$', model: '$^{\\S}$', [NOT_COMPUTED]: '$^{\\P}$' };
const MARK = LATEX_STATUS_MARK;

/** The parts of one booktabs table float (every LaTeX table of dispole is written by {@link booktabsFloat}). */
export interface BooktabsFloat {
  /** Lines above the float, written as LaTeX comments (provenance, warnings). */
  comments: string[];
  /** Caption and label (LaTeX). */
  caption: string;
  label: string;
  /** Column specification, e.g. "lrrc". */
  spec: string;
  /** Header rows and body rows, cells already LaTeX. */
  header: string[][];
  rows: string[][];
  /** Notes under the table (LaTeX), one paragraph each. */
  notes: string[];
}

/** A `table` float with a booktabs `tabular`, notes in a footnote-size paragraph below it. */
export function booktabsFloat(t: BooktabsFloat): string {
  const row = (cells: string[]) => `    ${cells.join(' & ')} \\\\`;
  const out = [
    ...t.comments.map((l) => `% ${oneLine(l)}`),
    '% requires \\usepackage{booktabs}',
    '\\begin{table}',
    '  \\centering',
    '  \\small',
    `  \\caption{${t.caption}}`,
    `  \\label{${t.label}}`,
    `  \\begin{tabular}{${t.spec}}`,
    '    \\toprule',
    ...t.header.map(row),
    '    \\midrule',
    ...t.rows.map(row),
    '    \\bottomrule',
    '  \\end{tabular}',
  ];
  if (t.notes.length) {
    out.push('  \\par\\smallskip', '  {\\footnotesize\\raggedright');
    out.push(...t.notes.map((n) => `  ${n}\\par`));
    out.push('  }');
  }
  out.push('\\end{table}');
  return out.join('\n') + '\n';
}

/** The notes of the status marks that occur in `statuses` (UNTRUSTED, single route, model, not computed). */
export function statusNotes(statuses: readonly string[], what: { item: string; levels?: string }): string[] {
  const notes: string[] = [];
  const has = (status: string) => statuses.includes(status);
  if (has('UNTRUSTED')) notes.push(`${MARK.UNTRUSTED}\\,UNTRUSTED: a route did not converge or the routes disagree (see the warnings in the comments above the table).`);
  if (has('unchecked')) notes.push(`${MARK.unchecked}\\,Only one route could run: no cross-check.`);
  if (has('model')) notes.push(`${MARK.model}\\,$${LATEX_NAME['D7.total']}$ rests on a model or an approximate input (see the warnings in the comments above the table).`);
  if (what.levels !== undefined) notes.push(`Levels: ${latexEscape(what.levels)}.`);
  if (has(NOT_COMPUTED)) notes.push(`${MARK[NOT_COMPUTED]}\\,Not computed: no route can handle the ${what.item} (reason in the comments above the table).`);
  return notes;
}

export function tableToLatex(table: CoefficientTable, options: HumanTableOptions): string {
  const p = provenanceOf(table, options.units);
  const { columns, rows, sources: list, statuses } = humanTable(table, options, 'latex');
  const comments = [...provenanceLines(p), untrustedSummary(table), ...collectWarnings(table).map((w) => `warning: ${w.text} — ${w.pairs.join(', ')}`)];

  // the status is shown as a mark after the pair label, so it gets no column of its own
  const shown = columns.map((c, i) => ({ c, i })).filter(({ c }) => c.key !== 'status');
  const title = (key: string) => (key === 'spread' ? 'Spread' : key === 'sources' ? 'Sources' : key);
  const names = ['Pair', ...shown.map(({ c }) => (c.quantity ? `$${c.quantity.latexName}$` : title(c.key)))];
  const units = ['', ...shown.map(({ c }) => (c.quantity ? `($${c.quantity.latexUnit}$)` : c.key === 'spread' ? '(rel.)' : ''))];
  const unitWords = options.units === 'atomic' ? 'atomic units' : 'SI units (CODATA 2018)';
  const body = rows.map((cells, r) => [
    latexEscape(cells[0]) + (MARK[statuses[r]] ?? ''),
    ...shown.map(({ c, i }) => (c.key === 'sources' ? latexEscape(cells[i + 1]) : latexNumber(cells[i + 1]))),
  ]);
  return booktabsFloat({
    comments,
    caption:
      `Dispersion coefficients $C_6$, $C_8$ and dispersion-induced dipole coefficients in ${unitWords}` +
      ` (A at the origin, B at $+R\\hat{z}$, $\\mu_{a,z} \\approx ${LATEX_NAME['D7.a']}/R^7$, $${LATEX_NAME['D7.total']} = ${LATEX_NAME['D7.a']} + ${LATEX_NAME['D7.b']}$, $E \\approx -C_6/R^6 - C_8/R^8$),` +
      ` by the routes ${latexEscape(table.settings.routes.join(', '))}; spread: largest relative difference between the routes.`,
    label: 'tab:dispole-coefficients',
    spec: `l${shown.map(({ c }) => (c.key === 'sources' ? 'c' : 'r')).join('')}`,
    header: [names, units],
    rows: body,
    notes: [
      ...list.sources.map((src, i) => `${latexEscape(`[${i + 1}]`)}~${latexEscape(src)}`),
      ...statusNotes(statuses, { item: 'pair', levels: allExact(table) ? undefined : levelsSentence(table) }),
    ],
  });
}
