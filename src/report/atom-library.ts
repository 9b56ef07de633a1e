/**
 * The atom library as a text table: published alpha, C6, C8, C10 and B per atom with numbered sources, beside
 * the hyperpolarisability B implied by the QDO fitted to (alpha, C6, C8), so users see how good the model is.
 */
import { ATOM_LIBRARY, HYDROGEN_EXACT, type SourcedValue } from '../data/atom-library.js';
import { drudeFromTargets, drudeHyperpolarisabilityB, isotropicParameters } from '../model/drude.js';
import { sig, textTable } from './format.js';

/** B = −2q³/(m²w⁴) of the QDO fitted to (alpha, C6, C8). */
function fittedB(alpha: number, C6: number, C8: number): number {
  return drudeHyperpolarisabilityB(isotropicParameters(drudeFromTargets({ alpha, C6, C8 })));
}

/** The library table with a numbered source list. */
export function atomLibraryText(): string {
  const sources: string[] = [];
  const cite = (v: SourcedValue | undefined): string => {
    if (!v) return '—';
    let i = sources.indexOf(v.source);
    if (i < 0) i = sources.push(v.source) - 1;
    return `${sig(v.value, 13)} [${i + 1}]`;
  };
  const H = HYDROGEN_EXACT;
  const rows = [
    ['H', cite(H.alpha1), cite(H.C6), cite(H.C8), cite(H.C10), cite(H.B), sig(fittedB(H.alpha1.value, H.C6.value, H.C8.value), 4)],
    ...ATOM_LIBRARY.map((a) => [a.symbol, cite(a.alpha), cite(a.C6), cite(a.C8), cite(a.C10), cite(a.B), sig(fittedB(a.alpha.value, a.C6.value, a.C8.value), 4)]),
  ];
  const table = textTable(['atom', 'alpha (a0^3)', 'C6 (Eh a0^6)', 'C8 (Eh a0^8)', 'C10 (Eh a0^10)', 'B published (au)', 'B of the fitted QDO'], rows, 'left');
  return [
    'Atom library (published values; the built-in He … Xe and H-qdo are QDOs fitted to alpha, C6, C8; H itself is computed exactly):',
    table,
    ...sources.map((s, i) => `  [${i + 1}] ${s}`),
  ].join('\n');
}
