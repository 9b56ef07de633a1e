/**
 * A LaTeX table for a paper: a `table` float with a booktabs `tabular` (\toprule, \midrule, \bottomrule; needs
 * \usepackage{booktabs}), quantity names and units in a two-line header, numbers in math mode with `--digits`
 * significant digits and ×10^n exponents. Untrusted rows carry a dagger (†) explained under the table, rows with
 * a single route a double dagger (‡). The provenance and the warnings are LaTeX comments above the float.
 */
import type { CoefficientTable } from '../../engines/table.js';
import { collectWarnings, humanTable, quantityColumns, untrustedSummary, type HumanTableOptions } from './columns.js';
import { provenanceLines, provenanceOf } from './provenance.js';

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
  return `$${sign}${mantissa}${exponent === undefined ? '' : `\\times10^{${Number(exponent)}}`}$`;
}

const MARK = { UNTRUSTED: '$^{\\dagger}$', unchecked: '$^{\\ddagger}$', ok: '' } as const;

export function tableToLatex(table: CoefficientTable, options: HumanTableOptions): string {
  const p = provenanceOf(table, options.units);
  const cols = quantityColumns(options.units);
  const { rows, sources: list } = humanTable(table, options);
  const withSources = list.sources.length > 0;
  const out: string[] = [];
  out.push(...provenanceLines(p).map((l) => `% ${l}`));
  out.push(`% ${untrustedSummary(table)}`);
  for (const w of collectWarnings(table)) out.push(`% warning: ${w.text} — ${w.pairs.join(', ')}`);
  out.push('% requires \\usepackage{booktabs}');

  const spec = `l${'r'.repeat(cols.length)}r${withSources ? 'c' : ''}`;
  const names = ['Pair', ...cols.map((c) => `$${c.latexName}$`), 'Spread', ...(withSources ? ['Sources'] : [])];
  const units = ['', ...cols.map((c) => `($${c.latexUnit}$)`), '(rel.)', ...(withSources ? [''] : [])];
  const row = (cells: string[]) => `    ${cells.join(' & ')} \\\\`;
  const unitWords = options.units === 'atomic' ? 'atomic units' : 'SI units (CODATA 2018)';
  out.push(
    '\\begin{table}',
    '  \\centering',
    '  \\small',
    `  \\caption{Dispersion coefficients $C_6$, $C_8$ and dispersion-induced dipole coefficients $D_7$ in ${unitWords}` +
      ` (A at the origin, B at $+R\\hat{z}$, $\\mu_{A,z} \\approx D_{7,A}/R^7$, $E \\approx -C_6/R^6 - C_8/R^8$),` +
      ` by the routes ${latexEscape(table.settings.routes.join(', '))}; spread: largest relative difference between the routes.}`,
    '  \\label{tab:dispole-coefficients}',
    `  \\begin{tabular}{${spec}}`,
    '    \\toprule',
    row(names),
    row(units),
    '    \\midrule',
  );
  rows.forEach((cells, i) => {
    const numbers = cells.slice(1, cols.length + 2); // the quantities and the spread
    const refs = withSources ? [latexEscape(cells[cols.length + 2])] : [];
    out.push(row([latexEscape(cells[0]) + MARK[table.rows[i].status], ...numbers.map(latexNumber), ...refs]));
  });
  out.push('    \\bottomrule', '  \\end{tabular}');
  const notes: string[] = list.sources.map((src, i) => `${latexEscape(`[${i + 1}]`)}~${latexEscape(src)}`);
  if (table.rows.some((r) => r.status === 'UNTRUSTED')) {
    notes.push(`${MARK.UNTRUSTED}\\,UNTRUSTED: a route did not converge or the routes disagree (see the warnings in the comments above the table).`);
  }
  if (table.rows.some((r) => r.status === 'unchecked')) notes.push(`${MARK.unchecked}\\,Only one route could run: no cross-check.`);
  if (notes.length) {
    out.push('  \\par\\smallskip', '  {\\footnotesize\\raggedright');
    out.push(...notes.map((n) => `  ${n}\\par`));
    out.push('  }');
  }
  out.push('\\end{table}');
  return out.join('\n') + '\n';
}
