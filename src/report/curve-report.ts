/**
 * Reports of induced-dipole and energy curves from the finite-R exact solution, beside their asymptotic forms
 * from the perturbation coefficients: a text table, CSV and the JSON object of `dispole curve`.
 * Dipoles in e·a0, energies in hartree; R in bohr or ångström (CODATA 2018, src/model/units.ts).
 */
import type { ExactCurve } from '../engines/exact/curve.js';
import type { ExactPoint } from '../engines/exact/exact-solver.js';
import type { D7Triple } from '../engines/route.js';
import { describeSpecies, type Species } from '../model/species.js';
import { bohrToAngstrom } from '../model/units.js';
import { VERSION } from '../version.js';
import { sig, textTable } from './format.js';
import { speciesToJson } from './species-json.js';
import { csvField } from './table/csv.js';

export type LengthUnit = 'bohr' | 'angstrom';

/** The asymptotic coefficients the curves are compared with (atomic units). */
export interface CurveCoefficients {
  C6: number;
  C8?: number;
  D7: D7Triple;
  /** First-order terms of axially anisotropic centres: E ∋ E5/R^5, mu ∋ D4/R^4. */
  E5?: number;
  D4?: D7Triple;
}

/** One point of the curve: the exact solution at R (bohr) and the asymptotic forms there. */
export interface CurveRow extends Omit<ExactPoint, 'localisation'> {
  asymptotic: { muA: number; muB: number; muTotal: number; energy: number };
}

export interface CurveData {
  a: Species;
  b: Species;
  order: number;
  tolerance: number;
  lengthUnit: LengthUnit;
  coefficients: CurveCoefficients;
  rows: CurveRow[];
  /** True when every row is trusted. */
  trusted: boolean;
  warnings: string[];
}

/** mu(R) ≈ D4/R^4 + D7/R^7 and ΔE(R) ≈ E5/R^5 − C6/R^6 − C8/R^8 (R in bohr). */
export function asymptoticForms(c: CurveCoefficients, R: number) {
  const mu = (k: 'a' | 'b' | 'total') => (c.D4 ? c.D4[k] / R ** 4 : 0) + c.D7[k] / R ** 7;
  return { muA: mu('a'), muB: mu('b'), muTotal: mu('total'), energy: (c.E5 ?? 0) / R ** 5 - c.C6 / R ** 6 - (c.C8 ?? 0) / R ** 8 };
}

/** Combine the exact curve with the asymptotic coefficients. */
export function curveData(
  a: Species,
  b: Species,
  curve: ExactCurve,
  coefficients: CurveCoefficients,
  options: { tolerance: number; lengthUnit: LengthUnit },
): CurveData {
  const rows: CurveRow[] = curve.points.map(({ localisation: _l, ...p }) => ({ ...p, asymptotic: asymptoticForms(coefficients, p.R) }));
  const warnings: string[] = [];
  const untrusted = rows.filter((r) => !r.trusted);
  if (untrusted.length > 0) {
    warnings.push(`${untrusted.length} of ${rows.length} points are UNTRUSTED (marked in the table):`);
    const seen = new Set<string>();
    for (const r of untrusted)
      for (const why of r.reasons) {
        const key = why.replace(/\d[\d.e+-]*/g, '#'); // the same reason at another R or basis size
        if (!seen.has(key)) {
          seen.add(key);
          warnings.push(`  at R = ${sig(toUnit(r.R, options.lengthUnit), 6)} ${unitName(options.lengthUnit)} (and similar): ${why}`);
        }
      }
  }
  if (curve.order < 4 && coefficients.C8 !== undefined)
    warnings.push(
      `the Hamiltonian stops at multipole order ${curve.order}: its R^-8 energy lacks the quadrupole–quadrupole and dipole–octupole part of C8, so the energy approaches −C6/R^6 − C8/R^8 only to leading order (use --order 4)`,
    );
  return { a, b, order: curve.order, tolerance: options.tolerance, lengthUnit: options.lengthUnit, coefficients, rows, trusted: untrusted.length === 0, warnings };
}

export const toUnit = (R: number, unit: LengthUnit): number => (unit === 'bohr' ? R : bohrToAngstrom(R));
export const unitName = (unit: LengthUnit): string => (unit === 'bohr' ? 'bohr' : 'Å');

function header(d: CurveData): string[] {
  const c = d.coefficients;
  const lines = [
    `Pair ${d.a.name} – ${d.b.name}: A at the origin, B at +R on z; exact ground state of the multipole Hamiltonian through order ${d.order}`,
    `  A  ${d.a.name}: ${describeSpecies(d.a)}${d.a.source ? `  [${d.a.source}]` : ''}`,
    `  B  ${d.b.name}: ${describeSpecies(d.b)}${d.b.source ? `  [${d.b.source}]` : ''}`,
    `  asymptotic forms (perturbation route): D7.a = ${sig(c.D7.a)}, D7.b = ${sig(c.D7.b)} e a0^8;  C6 = ${sig(c.C6)} Eh a0^6${c.C8 !== undefined ? `, C8 = ${sig(c.C8)} Eh a0^8` : ''}`,
  ];
  if (c.D4 || c.E5 !== undefined) lines.push(`  first-order terms: D4.a = ${sig(c.D4?.a ?? 0)}, D4.b = ${sig(c.D4?.b ?? 0)} e a0^5;  E5 = ${sig(c.E5 ?? 0)} Eh a0^5`);
  lines.push(`  basis converged to ${d.tolerance} (relative) per point; N = total quanta, dim = basis dimension after the L_z = 0 and mirror reduction (unreduced: C(N+6, 6), in --json and --csv)`);
  return lines;
}

/** The human table of `dispole curve`. */
export function curveToText(d: CurveData, digits = 7): string {
  const f = (x: number) => sig(x, digits);
  const u = unitName(d.lengthUnit);
  const tbl = textTable(
    [`R (${u})`, 'mu_A (e a0)', 'D7.a/R^7', 'mu_B (e a0)', 'D7.b/R^7', 'mu_total', 'D7/R^7', 'E_int (Eh)', '-C6/R^6-C8/R^8', 'N', 'dim', 'status'],
    d.rows.map((r) => [
      sig(toUnit(r.R, d.lengthUnit), 6),
      f(r.muA),
      f(r.asymptotic.muA),
      f(r.muB),
      f(r.asymptotic.muB),
      f(r.muTotal),
      f(r.asymptotic.muTotal),
      f(r.energy),
      f(r.asymptotic.energy),
      String(r.quanta),
      String(r.dimension),
      r.trusted ? 'ok' : r.converged ? 'UNTRUSTED' : 'UNCONVERGED',
    ]),
  );
  const lines = [...header(d), '', tbl, ''];
  if (d.coefficients.D4 || d.coefficients.E5 !== undefined) lines.push('(asymptotic columns include the first-order D4/R^4 and E5/R^5 terms)');
  lines.push(d.trusted ? 'All points converged and trusted.' : 'UNTRUSTED points: see the warnings below.');
  for (const w of d.warnings) lines.push(w.startsWith('  ') ? w : `warning: ${w}`);
  return lines.join('\n') + '\n';
}

/** CSV of `dispole curve --csv`: one header row with units, one row per R, full precision. */
export function curveToCsv(d: CurveData): string {
  const u = d.lengthUnit === 'bohr' ? 'bohr' : 'angstrom';
  const head = [`R_${u}`, 'R_bohr', 'mu_A_ea0', 'mu_B_ea0', 'mu_total_ea0', 'E_int_hartree', 'asym_mu_A_ea0', 'asym_mu_B_ea0', 'asym_mu_total_ea0', 'asym_E_hartree', 'quanta', 'dimension', 'dimension_unreduced', 'residual_hartree', 'converged', 'trusted', 'reasons'];
  const lines = [head.join(',')];
  for (const r of d.rows)
    lines.push(
      [toUnit(r.R, d.lengthUnit), r.R, r.muA, r.muB, r.muTotal, r.energy, r.asymptotic.muA, r.asymptotic.muB, r.asymptotic.muTotal, r.asymptotic.energy, r.quanta, r.dimension, r.fullDimension, r.residual, r.converged, r.trusted]
        .map(String)
        .concat(csvField(r.reasons.join('; ')))
        .join(','),
    );
  return lines.join('\n') + '\n';
}

/** The `dispole curve --json` object. */
export function curveToJson(d: CurveData): Record<string, unknown> {
  return {
    units: { R: d.lengthUnit, dipole: 'e a0', energy: 'hartree', coefficients: 'atomic' },
    geometry: 'A at the origin, B at +R on z; mu along z; E_int = E - E_A - E_B',
    species: { a: speciesToJson(d.a), b: speciesToJson(d.b) },
    hamiltonian: { multipoleOrder: d.order },
    tolerance: d.tolerance,
    coefficients: d.coefficients,
    points: d.rows.map((r) => ({
      R: toUnit(r.R, d.lengthUnit),
      R_bohr: r.R,
      muA: r.muA,
      muB: r.muB,
      muTotal: r.muTotal,
      energy: r.energy,
      asymptotic: r.asymptotic,
      basis: { quanta: r.quanta, dimension: r.dimension, dimensionUnreduced: r.fullDimension, residual: r.residual },
      converged: r.converged,
      trusted: r.trusted,
      reasons: r.reasons,
      record: r.record,
    })),
    trusted: d.trusted,
    warnings: d.warnings,
    dispole: { version: VERSION },
  };
}
