/** Reports of an atom in front of a surface: the JSON object of the CLI contract and the human table. */
import type { SurfaceResult } from '../engines/surface/surface.js';
import type { SurfaceRouteResult } from '../engines/surface/surface-route.js';
import type { SurfaceExactCurve } from '../engines/surface/exact-surface.js';
import type { LengthUnit } from './curve-report.js';
import { SURFACE_QUANTITY_MEANING, type DerivedSurfaceQuantity } from '../engines/symbolic/symbolic-surface.js';
import { describeSpecies, sourceInBrief } from '../model/species.js';
import { describeSurface } from '../model/surface-spec.js';
import { BOHR_IN_ANGSTROM, HARTREE_IN_EV, bohrToAngstrom, dipoleCoefficientAuToDebyeAngstrom, dipoleCoefficientAuToSI, dispersionAuToSI } from '../model/units.js';
import { VERSION } from '../version.js';
import { sig, spreadText, textTable } from './format.js';
import { LATEX_NAME } from './latex-names.js';
import type { UnitSystem } from './pair-report.js';
import { speciesToJson } from './species-json.js';

/** The geometry and sign convention, said the same way in every output. */
export const SURFACE_GEOMETRY =
  'surface plane z = 0, atom at +Z along the normal (z from the surface to the atom); E(Z) = -C3/Z^3 - C5/Z^5, mu(Z) = D4/Z^4 along z (D4 > 0: dipole pointing away from the surface)';

/** Coefficients in SI (C3 J·m³ and eV·Å³, C5 J·m⁵, D4 C·m⁵ and debye·Å⁴); CODATA 2018 via units.ts. */
export function surfaceCoefficientsToSI(c: { C3: number; C5?: number; D4: number }) {
  return {
    C3: { Jm3: dispersionAuToSI(c.C3, 3), eVAngstrom3: c.C3 * HARTREE_IN_EV * BOHR_IN_ANGSTROM ** 3 },
    ...(c.C5 !== undefined ? { C5: { Jm5: dispersionAuToSI(c.C5, 5) } } : {}),
    D4: { Cm5: dipoleCoefficientAuToSI(c.D4, 4), debyeAngstrom4: dipoleCoefficientAuToDebyeAngstrom(c.D4, 4) },
  };
}

function routeJson(r: SurfaceRouteResult) {
  return {
    name: r.name,
    C3: r.C3,
    ...(r.C5 !== undefined ? { C5: r.C5 } : {}),
    D4: r.D4,
    D4vector: r.D4vector,
    ...(r.error ? { error: r.error } : {}),
    converged: r.converged,
    notes: r.notes,
  };
}

/** The `dispole surface --json` object (atomic units; an `si` block when asked). */
export function surfaceToJson(p: SurfaceResult, units: UnitSystem = 'atomic'): Record<string, unknown> {
  const { kind: _kind, ...surfaceFields } = p.surface;
  return {
    units: 'atomic',
    geometry: SURFACE_GEOMETRY,
    species: speciesToJson(p.species),
    surface: { kind: p.surface.kind, ...surfaceFields, description: describeSurface(p.surface) },
    normal: p.normal,
    coefficients: p.coefficients,
    routes: p.routes.map(routeJson),
    skipped: p.skipped,
    spread: { ...p.spread, C5: p.spread.C5 ?? null },
    accuracy: p.accuracy,
    trusted: p.trusted,
    warnings: p.warnings,
    ...(units === 'si' ? { si: { units: 'C3 J·m^3 and eV·Å^3, C5 J·m^5, D4 C·m^5 and debye·Å^4 (CODATA 2018)', ...surfaceCoefficientsToSI(p.coefficients) } } : {}),
    dispole: { version: VERSION, reference: p.routes[0].name },
  };
}

/** The human report of `dispole surface`. */
export function surfaceToText(p: SurfaceResult, options: { digits?: number; units?: UnitSystem } = {}): string {
  const digits = options.digits ?? 10;
  const f = (x: number | undefined) => (x === undefined ? '—' : sig(x, digits));
  const lines: string[] = [];
  lines.push(`${p.species.name} in front of a surface; atomic units`);
  lines.push(`  atom     ${describeSpecies(p.species)}${sourceInBrief(p.species) ? `  [${sourceInBrief(p.species)}]` : ''}`);
  lines.push(`  surface  ${describeSurface(p.surface, (x) => sig(x, digits))}`);
  lines.push(`  rests on ${p.accuracy.statement} (C3, C5: ${p.accuracy.quantities.C3}; D4: ${p.accuracy.quantities.D4})`);
  if (p.normal[0] !== 0 || p.normal[1] !== 0) lines.push(`  normal   (${p.normal.map((x) => sig(x, digits)).join(', ')}) in the atom's axes`);
  lines.push('');
  const vector = p.coefficients.D4vector !== undefined;
  const header = ['route', 'C3 (Eh a0^3)', 'C5 (Eh a0^5)', 'D4 (e a0^5)', ...(vector ? ['D4 x', 'D4 y', 'D4 z (atom axes)'] : [])];
  const rows = p.routes.map((r) => [
    r.converged ? r.name : `${r.name} (UNCONVERGED)`,
    f(r.C3), f(r.C5), f(r.D4),
    ...(vector ? r.D4vector.map(f) : []),
  ]);
  if (p.routes.length > 1) {
    const s = p.spread;
    rows.push(['spread (rel.)', spreadText(s.C3), s.C5 === undefined ? '—' : spreadText(s.C5), spreadText(s.D4), ...(vector ? [spreadText(s.D4vector), '', ''] : [])]);
  }
  lines.push(textTable(header, rows));
  lines.push('');
  lines.push(`E(Z) ≈ −C3/Z^3 − C5/Z^5;  mu_z(Z) ≈ D4/Z^4 with z from the surface to the atom (D4 > 0: dipole points away from the surface)  (reference: ${p.routes[0].name})`);
  if (options.units === 'si') {
    const si = surfaceCoefficientsToSI(p.coefficients);
    lines.push('');
    lines.push('SI units (CODATA 2018):');
    lines.push(`  C3 = ${sig(si.C3.Jm3, digits)} J m^3 = ${sig(si.C3.eVAngstrom3, digits)} eV Å^3${si.C5 ? `   C5 = ${sig(si.C5.Jm5, digits)} J m^5` : ''}`);
    lines.push(`  D4 = ${sig(si.D4.Cm5, digits)} C m^5 = ${sig(si.D4.debyeAngstrom4, digits)} D Å^4`);
  }
  lines.push('');
  lines.push('Route notes:');
  const byNote = new Map<string, string[]>();
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

/** The finite-Z curve beside the asymptotic forms −C3/Z³ − C5/Z⁵ and D4/Z⁴ (Z in `length` units on output). */
export function surfaceCurveRows(curve: SurfaceExactCurve, c: { C3: number; C5?: number; D4: number }) {
  return curve.points.map((p) => ({
    ...p,
    asymptotic: { energy: -c.C3 / p.Z ** 3 - (c.C5 ?? 0) / p.Z ** 5, muNormal: c.D4 / p.Z ** 4 },
  }));
}

/** The curve as a text table. */
export function surfaceCurveText(curve: SurfaceExactCurve, c: { C3: number; C5?: number; D4: number }, digits: number, length: LengthUnit): string {
  const unit = length === 'bohr' ? 'a0' : 'Å';
  const rows = surfaceCurveRows(curve, c).map((r) => [
    sig(length === 'bohr' ? r.Z : bohrToAngstrom(r.Z), digits),
    sig(r.energy, digits),
    sig(r.asymptotic.energy, digits),
    sig(r.muNormal, digits),
    sig(r.asymptotic.muNormal, digits),
    String(r.quanta),
    r.trusted ? 'ok' : `UNTRUSTED: ${r.reasons.join('; ')}`,
  ]);
  const lines = [
    `Finite-Z exact solution (multipole order ${curve.order}, image factor ${sig(curve.delta, digits)}): energy shift and dipole along the normal`,
    textTable([`Z (${unit})`, 'E (Eh)', '−C3/Z^3 − C5/Z^5', 'mu_z (e a0)', 'D4/Z^4', 'quanta', 'status'], rows),
  ];
  return lines.join('\n') + '\n';
}

/** The curve as JSON (atomic units, Z in bohr). */
export function surfaceCurveJson(curve: SurfaceExactCurve, c: { C3: number; C5?: number; D4: number }): Record<string, unknown> {
  return { order: curve.order, imageFactor: curve.delta, lengthUnit: 'bohr', points: surfaceCurveRows(curve, c) };
}

/** `derive --surface` as text (`name = formula` lines, pasteable) or LaTeX. */
export function surfaceDerivedToText(derived: readonly DerivedSurfaceQuantity[], anisotropic: boolean, notation: 'text' | 'latex'): string {
  const comment = notation === 'latex' ? '%' : '#';
  const who = anisotropic ? 'q, m, wx, wy, wz (frequencies along its axes; normal along z)' : 'q, m, w';
  const lines = [
    `${comment} closed forms, atomic units: one quantum Drude oscillator (${who}) at distance Z in front of a perfect conductor`,
    `${comment} ${derived.map((d) => `${d.name} in ${SURFACE_QUANTITY_MEANING[d.name].units}`).join(', ')}; E(Z) = -C3/Z^3 - C5/Z^5, mu_z = D4/Z^4, z from the surface to the atom`,
  ];
  for (const d of derived) lines.push(notation === 'latex' ? `${LATEX_NAME[d.name]} = ${d.display.latex}` : `${d.name} = ${d.display.text}`);
  return lines.join('\n') + '\n';
}

/** `derive --surface --json`. */
export function surfaceDerivedToJson(derived: readonly DerivedSurfaceQuantity[], anisotropic: boolean): Record<string, unknown> {
  return {
    units: 'atomic',
    geometry: SURFACE_GEOMETRY,
    surface: 'conductor',
    layout: { species: 'one', frequencies: anisotropic ? 'anisotropic' : 'isotropic' },
    quantities: derived.map((d) => ({
      name: d.name,
      meaning: SURFACE_QUANTITY_MEANING[d.name].meaning,
      units: SURFACE_QUANTITY_MEANING[d.name].units,
      text: d.display.text,
      latex: d.display.latex,
    })),
    dispole: { version: VERSION },
  };
}
