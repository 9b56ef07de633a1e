/** Reports of a pair computation: the JSON object of the CLI contract and the human table. */
import type { PairResult } from '../engines/pair.js';
import type { RouteResult } from '../engines/route.js';
import { describeSpecies } from '../model/species.js';
import { dipoleCoefficientAuToDebyeAngstrom, dipoleCoefficientAuToSI, dispersionAuToSI } from '../model/units.js';
import { VERSION } from '../version.js';
import { sig, spreadText, textTable } from './format.js';
import { speciesToJson } from './species-json.js';

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
    routes: p.routes.map(routeJson),
    spread: p.spread,
    trusted: p.trusted,
    warnings: p.warnings,
    ...(units === 'si'
      ? { si: { units: 'C6 J·m^6, C8 J·m^8, C10 J·m^10, D7 C·m^8 and debye·Å^7', ...coefficientsToSI(p.coefficients) } }
      : {}),
    dispole: { version: VERSION, reference: p.routes[0].name },
  };
}

/** The human report of `dispole pair`. */
export function pairToText(p: PairResult, options: { digits?: number; units?: UnitSystem } = {}): string {
  const digits = options.digits ?? 10;
  const f = (x: number | undefined) => (x === undefined ? '—' : sig(x, digits));
  const lines: string[] = [];
  lines.push(`Pair ${p.a.name} – ${p.b.name}: A at the origin, B at +R on z; atomic units`);
  for (const [label, s] of [['A', p.a], ['B', p.b]] as const) {
    lines.push(`  ${label}  ${s.name}: ${describeSpecies(s)}${s.source ? `  [${s.source}]` : ''}`);
  }
  lines.push('');
  const header = ['route', 'C6 (Eh a0^6)', 'C8 (Eh a0^8)', 'C10 (Eh a0^10)', 'D7.a (e a0^8)', 'D7.b (e a0^8)', 'D7.total (e a0^8)'];
  const rows = p.routes.map((r) => [
    r.converged ? r.name : `${r.name} (UNCONVERGED)`,
    f(r.C6), f(r.C8), f(r.C10), f(r.D7.a), f(r.D7.b), f(r.D7.total),
  ]);
  if (p.routes.length > 1) {
    const s = p.spread;
    rows.push(['spread (rel.)', spreadText(s.C6), s.C8 === undefined ? '—' : spreadText(s.C8), s.C10 === undefined ? '—' : spreadText(s.C10), spreadText(s.D7a), spreadText(s.D7b), spreadText(s.D7total)]);
  }
  lines.push(textTable(header, rows));
  lines.push('');
  lines.push(`E(R) ≈ −C6/R^6 − C8/R^8 − C10/R^10;  mu_A,z(R) ≈ D7.a/R^7,  mu_B,z(R) ≈ D7.b/R^7  (reference: ${p.routes[0].name})`);
  const perm = p.routes[0].permanent;
  if (perm) lines.push(`first-order terms: E5 = ${f(perm.E5)} Eh a0^5 (E ∋ E5/R^5),  D4.a = ${f(perm.D4.a)}, D4.b = ${f(perm.D4.b)} e a0^5 (mu ∋ D4/R^4)`);
  if (options.units === 'si') {
    const si = coefficientsToSI(p.coefficients);
    lines.push('');
    lines.push('SI units (CODATA 2018):');
    lines.push(`  C6 = ${sig(si.C6, digits)} J m^6${si.C8 !== undefined ? `   C8 = ${sig(si.C8, digits)} J m^8` : ''}${si.C10 !== undefined ? `   C10 = ${sig(si.C10, digits)} J m^10` : ''}`);
    for (const k of ['a', 'b', 'total'] as const) {
      lines.push(`  D7.${k} = ${sig(si.D7[k].Cm8, digits)} C m^8 = ${sig(si.D7[k].debyeAngstrom7, digits)} D Å^7`);
    }
  }
  lines.push('');
  if (lines[lines.length - 1] !== '') lines.push('');
  lines.push('Route notes:');
  const byNote = new Map<string, string[]>(); // a note shared by several routes is printed once
  for (const r of p.routes) for (const note of r.notes) byNote.set(note, [...(byNote.get(note) ?? []), r.name]);
  for (const [note, names] of byNote) lines.push(`  ${names.join(', ')}: ${note}`);
  for (const sk of p.skipped) lines.push(`  ${sk.name}: skipped (${sk.reason})`);
  lines.push('');
  if (!p.trusted) lines.push('UNTRUSTED: see the warnings below.');
  else if (p.routes.length > 1) lines.push(`All routes agree (largest relative spread ${spreadText(p.spread.max)}).`);
  else lines.push(`Only the ${p.routes[0].name} route could run: no cross-check.`);
  for (const w of p.warnings) lines.push(`warning: ${w}`);
  return lines.join('\n') + '\n';
}
