/** Reports of a pair computation: the JSON object of the CLI contract and the human table. */
import type { PairResult } from '../engines/pair.js';
import type { RouteResult } from '../engines/route.js';
import { describeSpecies, sourceInBrief } from '../model/species.js';
import { dipoleCoefficientAuToDebyeAngstrom, dipoleCoefficientAuToSI, dispersionAuToSI } from '../model/units.js';
import { VERSION } from '../version.js';
import { csvField, DEFAULT_DIGITS, formatColumns, oneLine, sigDigits, spreadText, textTable } from './format.js';
import { speciesToJson } from './species-json.js';
import { accuracyLines, accuracyToJson, crossCheckLine } from './accuracy-report.js';

export type UnitSystem = 'atomic' | 'si';

/** Coefficients converted to SI (C_n in J·m^n, D7 in C·m^8 and debye·Å^7). */
export function coefficientsToSI(c: { C6: number; C8?: number; C10?: number; D7: { a: number; b: number; total: number } }) {
  const d = (x: number) => ({ Cm8: dipoleCoefficientAuToSI(x, 7), debyeAngstrom7: dipoleCoefficientAuToDebyeAngstrom(x, 7) });
  return {
    C6: dispersionAuToSI(c.C6, 6),
    ...(c.C8 !== undefined ? { C8: dispersionAuToSI(c.C8, 8) } : {}),
    ...(c.C10 !== undefined ? { C10: dispersionAuToSI(c.C10, 10) } : {}),
    D7: { a: d(c.D7.a), b: d(c.D7.b), total: d(c.D7.total) },
  };
}

function routeJson(r: RouteResult) {
  return {
    name: r.name,
    C6: r.C6,
    ...(r.C8 !== undefined ? { C8: r.C8 } : {}),
    ...(r.C10 !== undefined ? { C10: r.C10 } : {}),
    D7: r.D7,
    ...(r.D7vectors ? { D7vectors: r.D7vectors } : {}),
    ...(r.D9 ? { D9: r.D9 } : {}),
    ...(r.error ? { error: r.error } : {}),
    ...(r.permanent ? { permanent: r.permanent } : {}),
    converged: r.converged,
    notes: r.notes,
  };
}

/** The `dispole pair --json` object (atomic units; an `si` block when asked). */
export function pairToJson(p: PairResult, units: UnitSystem = 'atomic'): Record<string, unknown> {
  return {
    units: 'atomic',
    geometry: 'A at the origin, B at +R on z; D7.x = lim R^7 mu_x,z; E = -C6/R^6 - C8/R^8 - C10/R^10',
    species: { a: speciesToJson(p.a), b: speciesToJson(p.b) },
    coefficients: p.coefficients,
    // every route asked for: those that ran, then those that could not handle the pair, marked skipped with the reason
    routes: [...p.routes.map(routeJson), ...p.skipped.map((sk) => ({ name: sk.name, skipped: true, reason: sk.reason }))],
    spread: p.spread,
    trusted: p.trusted,
    accuracy: accuracyToJson(p.accuracy),
    warnings: p.warnings,
    ...(units === 'si'
      ? { si: { units: 'C6 J·m^6, C8 J·m^8, C10 J·m^10, D7 C·m^8 and debye·Å^7', ...coefficientsToSI(p.coefficients) } }
      : {}),
    dispole: { version: VERSION, reference: p.routes[0].name },
  };
}

/** Why a pair has no D9 (undefined when a route gave it): the response route has no D9 formula yet. */
export function missingD9Note(p: PairResult): string | undefined {
  if (p.coefficients.D9) return undefined;
  const names = p.routes.map((r) => r.name);
  return names.every((n) => n === 'response')
    ? 'D9: not available from the response route (no response formula yet)'
    : `D9: not given by the route(s) that ran (${names.join(', ')})`;
}

/** The warning computePair adds for a single route; the report's closing line says it already. */
const SINGLE_ROUTE_WARNING = 'only one route could run: no cross-check';

/** The human report of `dispole pair`: numbers with `digits` significant digits, one notation per column. */
export function pairToText(p: PairResult, options: { digits?: number; units?: UnitSystem } = {}): string {
  const digits = options.digits ?? DEFAULT_DIGITS;
  const f = (x: number | undefined) => (x === undefined ? '—' : sigDigits(x, digits));
  const lines: string[] = [];
  const unitWords = options.units === 'si' ? 'table in atomic units, SI values (CODATA 2018) below' : 'atomic units';
  lines.push(`Pair ${p.a.name} – ${p.b.name}: A at the origin, B at +R on z; ${unitWords}`);
  for (const [label, s] of [['A', p.a], ['B', p.b]] as const) {
    lines.push(`  ${label}  ${s.name}: ${describeSpecies(s)}${sourceInBrief(s) ? `  [${sourceInBrief(s)}]` : ''}`);
  }
  lines.push('');
  // D9 columns when some route gives it (perturbation, exact); '—' for routes without it
  const withD9 = p.routes.some((r) => r.D9);
  const header = [
    'route', 'C6 (Eh a0^6)', 'C8 (Eh a0^8)', 'C10 (Eh a0^10)', 'D7.a (e a0^8)', 'D7.b (e a0^8)', 'D7.total (e a0^8)',
    ...(withD9 ? ['D9.a (e a0^10)', 'D9.b (e a0^10)', 'D9.total (e a0^10)'] : []),
  ];
  const rows = formatColumns(
    p.routes.map((r) => [
      r.converged ? r.name : `${r.name} (UNCONVERGED)`, r.C6, r.C8, r.C10, r.D7.a, r.D7.b, r.D7.total,
      ...(withD9 ? [r.D9?.a, r.D9?.b, r.D9?.total] : []),
    ]),
    digits,
  );
  if (p.routes.length > 1) {
    const s = p.spread;
    const sp = (x: number | undefined) => (x === undefined ? '—' : spreadText(x));
    rows.push(['spread (rel.)', sp(s.C6), sp(s.C8), sp(s.C10), sp(s.D7a), sp(s.D7b), sp(s.D7total), ...(withD9 ? [sp(s.D9a), sp(s.D9b), sp(s.D9total)] : [])]);
  }
  lines.push(textTable(header, rows));
  lines.push('');
  const d9 = p.coefficients.D9 ? ' + D9.a/R^9' : '';
  lines.push(`E(R) ≈ −C6/R^6 − C8/R^8 − C10/R^10;  mu_A,z(R) ≈ D7.a/R^7${d9},  mu_B,z(R) ≈ D7.b/R^7${d9 ? ' + D9.b/R^9' : ''}  (reference: ${p.routes[0].name})`);
  const noD9 = missingD9Note(p);
  if (noD9) lines.push(noD9);
  const perm = p.routes[0].permanent;
  if (perm) {
    const pair = (name: string, t: { a: number; b: number } | undefined, unit: string) => (t ? `,  ${name}.a = ${f(t.a)}, ${name}.b = ${f(t.b)} ${unit}` : '');
    lines.push(
      `first-order terms: E5 = ${f(perm.E5)} Eh a0^5${perm.E7 !== undefined ? `, E7 = ${f(perm.E7)} Eh a0^7` : ''} (E ∋ E5/R^5 + E7/R^7)${pair('D4', perm.D4, 'e a0^5')}${pair('D6', perm.D6, 'e a0^7')}${pair('D8', perm.D8, 'e a0^9')} (mu ∋ D4/R^4 + D6/R^6 + D8/R^8)`,
    );
    if (perm.E7 !== undefined && perm.D8)
      lines.push('  complete: every first-order term through E R^-8 and mu R^-9 (E9, D10 and beyond are not computed)');
  }
  if (options.units === 'si') {
    const si = coefficientsToSI(p.coefficients);
    lines.push('');
    lines.push(`SI units (CODATA 2018), reference route ${p.routes[0].name}:`);
    lines.push(`  C6 = ${f(si.C6)} J m^6${si.C8 !== undefined ? `   C8 = ${f(si.C8)} J m^8` : ''}${si.C10 !== undefined ? `   C10 = ${f(si.C10)} J m^10` : ''}`);
    for (const k of ['a', 'b', 'total'] as const) {
      lines.push(`  D7.${k} = ${f(si.D7[k].Cm8)} C m^8 = ${f(si.D7[k].debyeAngstrom7)} D Å^7`);
    }
  }
  lines.push('');
  lines.push('Route notes:');
  const byNote = new Map<string, string[]>(); // a note shared by several routes is printed once
  for (const r of p.routes) for (const note of r.notes) byNote.set(note, [...(byNote.get(note) ?? []), r.name]);
  for (const [note, names] of byNote) lines.push(`  ${names.join(', ')}: ${note}`);
  for (const sk of p.skipped) lines.push(`  ${sk.name}: skipped (${sk.reason})`);
  lines.push('');
  lines.push(crossCheckLine(p));
  lines.push(...accuracyLines(p));
  for (const w of p.warnings) if (p.routes.length > 1 || w !== SINGLE_ROUTE_WARNING) lines.push(`warning: ${w}`);
  return lines.join('\n') + '\n';
}

/**
 * `dispole pair --csv`: "#" lines with the pair, the geometry and the spread, then one row per route that ran
 * (full precision; atomic units, plus SI columns with `units` si) and one row per skipped route with its reason.
 */
export function pairToCsv(p: PairResult, units: UnitSystem = 'atomic'): string {
  const lines = [
    `# dispole ${VERSION}: pair ${oneLine(p.a.name)} – ${oneLine(p.b.name)}`,
    `# A ${oneLine(p.a.name)}: ${describeSpecies(p.a)}${p.a.source ? ` [${oneLine(p.a.source)}]` : ''}`,
    `# B ${oneLine(p.b.name)}: ${describeSpecies(p.b)}${p.b.source ? ` [${oneLine(p.b.source)}]` : ''}`,
    `# geometry: A at the origin, B at +R on z; mu_A,z(R) ≈ D7.a/R^7; E(R) ≈ −C6/R^6 − C8/R^8 − C10/R^10`,
    `# spread (largest relative difference between the routes): ${p.routes.length > 1 ? p.spread.max : 'none (one route)'}; trusted: ${p.trusted}`,
    `# accuracy (physical; levels A ${p.accuracy.level.a}, B ${p.accuracy.level.b}): ${oneLine(p.accuracy.statement)}` +
      (p.accuracy.uncertainty ? ` D7 uncertainty: a ${p.accuracy.uncertainty.D7.a}, b ${p.accuracy.uncertainty.D7.b}, total ${p.accuracy.uncertainty.D7.total}` : ''),
    ...(missingD9Note(p) ? [`# ${missingD9Note(p)}`] : []),
    ...p.warnings.map((w) => `# warning: ${oneLine(w)}`),
  ];
  // D9 columns when some route gives it (as in the text table); empty cells for routes without it
  const withD9 = p.routes.some((r) => r.D9);
  const d9Head = withD9 ? ['D9.a (e a0^10)', 'D9.b (e a0^10)', 'D9.total (e a0^10)'] : [];
  const siHead = units === 'si' ? ['C6 (J m^6)', 'C8 (J m^8)', 'C10 (J m^10)', 'D7.a (C m^8)', 'D7.b (C m^8)', 'D7.total (C m^8)', 'D7.a (D Å^7)', 'D7.b (D Å^7)', 'D7.total (D Å^7)'] : [];
  lines.push(['route', 'status', 'C6 (Eh a0^6)', 'C8 (Eh a0^8)', 'C10 (Eh a0^10)', 'D7.a (e a0^8)', 'D7.b (e a0^8)', 'D7.total (e a0^8)', ...d9Head, ...siHead, 'notes'].map(csvField).join(','));
  const num = (x: number | undefined) => (x === undefined ? '' : String(x));
  for (const r of p.routes) {
    const si = units === 'si' ? coefficientsToSI(r) : undefined;
    const siCells = si ? [si.C6, si.C8, si.C10, si.D7.a.Cm8, si.D7.b.Cm8, si.D7.total.Cm8, si.D7.a.debyeAngstrom7, si.D7.b.debyeAngstrom7, si.D7.total.debyeAngstrom7].map(num) : [];
    lines.push([r.name, r.converged ? 'converged' : 'UNCONVERGED', ...[r.C6, r.C8, r.C10, r.D7.a, r.D7.b, r.D7.total].map(num), ...(withD9 ? [r.D9?.a, r.D9?.b, r.D9?.total].map(num) : []), ...siCells, r.notes.join('; ')].map(csvField).join(','));
  }
  const blanks = Array(6 + d9Head.length + siHead.length).fill('');
  for (const sk of p.skipped) lines.push([sk.name, 'skipped', ...blanks, sk.reason].map(csvField).join(','));
  return lines.join('\n') + '\n';
}
