/**
 * The atom library as a text table: published alpha, C6, C8, C10 and B per atom with numbered sources, beside
 * the hyperpolarisability B implied by the QDO fitted to (alpha, C6, C8), so users see how good the model is.
 */
import { ATOM_LIBRARY, HYDROGEN_EXACT, type SourcedValue } from '../data/atom-library.js';
import { drudeFromTargets, drudeHyperpolarisabilityB, isotropicParameters } from '../model/drude.js';
import { sig, textTable } from './format.js';
import { factorsText } from '../engines/atoms/recommended-atom.js';
import { recommendedAtomBySymbol } from '../engines/atoms/recommended-atoms.js';

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
    'Atom library (published values; H-qdo, He-qdo … Xe-qdo are QDOs fitted to alpha, C6, C8; H itself is computed exactly; He … Xe are the recommended models below):',
    table,
    ...sources.map((s, i) => `  [${i + 1}] ${s}`),
  ].join('\n');
}

/**
 * The recommended atoms He … Xe: per atom its level, what alpha/C6/C8, C10 and B(0) rest on, B(0) of the three
 * models (recommended, unscaled first-principles, fitted QDO) side by side, and the rescaling factors.
 */
export function recommendedAtomsText(): string {
  const rows: string[][] = [];
  const notes: string[] = [];
  for (const a of ATOM_LIBRARY) {
    const qdoB = sig(fittedB(a.alpha.value, a.C6.value, a.C8.value), 4);
    const rec = recommendedAtomBySymbol(a.symbol);
    if (!rec) {
      rows.push([a.symbol, 'model', 'fitted QDO (exact for the like pair)', 'QDO', `${qdoB} (QDO)`, '—', qdoB, 'fitted QDO: no first-principles data shipped yet (MODEL warning)']);
      continue;
    }
    const f = rec.factors;
    rows.push([
      a.symbol,
      'rescaled',
      'published (rescaled)',
      f.s3From === 'C10' ? 'published (rescaled)' : 'rescaled, s3 = s2',
      `${sig(rec.species.hyperB![0], 4)} (${f.sBFrom === 'published B' ? 'published' : 'estimate'})`,
      sig(f.unscaled.B, 4),
      qdoB,
      `time-dependent Hartree–Fock, ${rec.data.basis}`,
    ]);
    notes.push(`  ${a.symbol}: ${factorsText(f)}`);
  }
  const table = textTable(['name', 'level', 'alpha, C6, C8', 'C10', 'B(0) used', 'B(0) first-principles', 'B(0) fitted QDO', 'rests on'], rows, 'left');
  return [
    'Recommended atoms (the names He … Xe; the fitted QDOs stay available as He-qdo … Xe-qdo):',
    table,
    'Rule: alpha_l(iu) = s_l·alpha_l^TDHF(iu/λ), B(iu) = sB·B^TDHF(iu/λ); s1 and λ fix alpha(0) and C6, s2 fixes C8, s3 C10 (if that is ill-posed, s3 = s2),',
    '  sB the published static B (without one, the estimate sB = s1·(s2/λ)^(1/2)); D7 uncertainty: spread against the unscaled and the QDO model.',
    ...notes,
  ].join('\n');
}
