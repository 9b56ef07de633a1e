/**
 * A LaTeX table for a paper: a `table` float with a booktabs `tabular` (\toprule, \midrule, \bottomrule; needs
 * \usepackage{booktabs}), quantity names and units in a two-line header, numbers in math mode with `--digits`
 * significant digits and ×10^n exponents. Untrusted rows carry a dagger (†) explained under the table, rows with
 * a single route a double dagger (‡). The provenance and the warnings are LaTeX comments above the float.
 */
import type { CoefficientTable } from '../../engines/table.js';
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

/** Marks after the pair label: dagger UNTRUSTED, double dagger single route, section sign model, pilcrow not computed. */
const MARK: Record<string, string> = { UNTRUSTED: '$^{\\dagger}$', unchecked: '$^{\\ddagger}$', model: '$^{\\S}$', [NOT_COMPUTED]: '$^{\\P}$' };

export function tableToLatex(table: CoefficientTable, options: HumanTableOptions): string {
  const p = provenanceOf(table, options.units);
  const { columns, rows, sources: list, statuses } = humanTable(table, options, 'latex');
  const out: string[] = [];
  out.push(...provenanceLines(p).map((l) => `% ${l}`));
  out.push(`% ${untrustedSummary(table)}`);
  for (const w of collectWarnings(table)) out.push(`% warning: ${w.text} — ${w.pairs.join(', ')}`);
  out.push('% requires \\usepackage{booktabs}');

  // the status is shown as a mark after the pair label, so it gets no column of its own
  const shown = columns.map((c, i) => ({ c, i })).filter(({ c }) => c.key !== 'status');
  const spec = `l${shown.map(({ c }) => (c.key === 'sources' ? 'c' : 'r')).join('')}`;
  const title = (key: string) => (key === 'spread' ? 'Spread' : key === 'sources' ? 'Sources' : key);
  const names = ['Pair', ...shown.map(({ c }) => (c.quantity ? `$${c.quantity.latexName}$` : title(c.key)))];
  const units = ['', ...shown.map(({ c }) => (c.quantity ? `($${c.quantity.latexUnit}$)` : c.key === 'spread' ? '(rel.)' : ''))];
  const row = (cells: string[]) => `    ${cells.join(' & ')} \\\\`;
  const unitWords = options.units === 'atomic' ? 'atomic units' : 'SI units (CODATA 2018)';
  out.push(
    '\\begin{table}',
    '  \\centering',
    '  \\small',
    `  \\caption{Dispersion coefficients $C_6$, $C_8$ and dispersion-induced dipole coefficients in ${unitWords}` +
      ` (A at the origin, B at $+R\\hat{z}$, $\\mu_{a,z} \\approx ${LATEX_NAME['D7.a']}/R^7$, $${LATEX_NAME['D7.total']} = ${LATEX_NAME['D7.a']} + ${LATEX_NAME['D7.b']}$, $E \\approx -C_6/R^6 - C_8/R^8$),` +
      ` by the routes ${latexEscape(table.settings.routes.join(', '))}; spread: largest relative difference between the routes.}`,
    '  \\label{tab:dispole-coefficients}',
    `  \\begin{tabular}{${spec}}`,
    '    \\toprule',
    row(names),
    row(units),
    '    \\midrule',
  );
  rows.forEach((cells, r) => {
    const body = shown.map(({ c, i }) => (c.key === 'sources' ? latexEscape(cells[i + 1]) : latexNumber(cells[i + 1])));
    out.push(row([latexEscape(cells[0]) + (MARK[statuses[r]] ?? ''), ...body]));
  });
  out.push('    \\bottomrule', '  \\end{tabular}');
  const notes: string[] = list.sources.map((src, i) => `${latexEscape(`[${i + 1}]`)}~${latexEscape(src)}`);
  const has = (status: string) => statuses.includes(status);
  if (has('UNTRUSTED')) notes.push(`${MARK.UNTRUSTED}\\,UNTRUSTED: a route did not converge or the routes disagree (see the warnings in the comments above the table).`);
  if (has('unchecked')) notes.push(`${MARK.unchecked}\\,Only one route could run: no cross-check.`);
  if (has('model')) notes.push(`${MARK.model}\\,$D_{7}$ rests on a model or an approximate input (see the warnings in the comments above the table).`);
  if (!allExact(table)) notes.push(`Levels: ${latexEscape(levelsSentence(table))}.`);
  if (has(NOT_COMPUTED)) notes.push(`${MARK[NOT_COMPUTED]}\\,Not computed: no route can handle the pair (reason in the comments above the table).`);
  if (notes.length) {
    out.push('  \\par\\smallskip', '  {\\footnotesize\\raggedright');
    out.push(...notes.map((n) => `  ${n}\\par`));
    out.push('  }');
  }
  out.push('\\end{table}');
  return out.join('\n') + '\n';
}
