/**
 * Reports of induced-dipole and energy curves from the finite-R exact solution, beside their asymptotic forms
 * from the perturbation coefficients: a text table, CSV and the JSON object of `dispole curve`.
 * Dipoles in e·a0, energies in hartree; R in bohr or ångström (CODATA 2018, src/model/units.ts).
 */
import type { ExactCurve } from '../engines/exact/curve.js';
import type { ExactPoint } from '../engines/exact/exact-solver.js';
import type { D7Triple } from '../engines/route.js';
import { isSpherical, pairSpeciesWarnings } from '../engines/capabilities.js';
import { pairAccuracy, type PairAccuracy } from '../engines/accuracy.js';
import { accuracyStatementLine, accuracyToJson } from './accuracy-report.js';
import { orderCompleteness, type OrderCompleteness } from '../engines/exact/series-terms.js';
import { describeSpecies, sourceInBrief, type Species } from '../model/species.js';
import { bohrToAngstrom, dipoleAuToDebye, energyFromHartree, energyUnitText, type EnergyUnit } from '../model/units.js';
import { VERSION } from '../version.js';
import { csvField, DEFAULT_DIGITS, formatColumns, sig, sigDigits, textTable } from './format.js';
import { speciesToJson } from './species-json.js';

export type LengthUnit = 'bohr' | 'angstrom';

/** The asymptotic coefficients the curves are compared with (atomic units). */
export interface CurveCoefficients {
  C6: number;
  C8?: number;
  D7: D7Triple;
  /** mu ∋ D9/R^9 (second order, V2·V5 + V3·V4). */
  D9?: D7Triple;
  /** mu ∋ D10/R^10 (third order, V2·V2·V3; the whole R^-10 term of spherical pairs only, so given for them only). */
  D10?: D7Triple;
  /** First-order terms of axially anisotropic centres: E ∋ E5/R^5 + E7/R^7, mu ∋ D4/R^4 + D6/R^6 + D8/R^8. */
  E5?: number;
  E7?: number;
  D4?: D7Triple;
  D6?: D7Triple;
  D8?: D7Triple;
}

/** A point is "in the series" when the exact dipoles and energy are within this relative distance of the series. */
export const SERIES_RANGE = 0.1;

/** One point of the curve: the exact solution at R (bohr) and the asymptotic forms there. */
export interface CurveRow extends Omit<ExactPoint, 'localisation'> {
  asymptotic: { muA: number; muB: number; muTotal: number; energy: number };
  /** exact ÷ asymptotic series − 1 (the residual of the series; falls as R^-2 beyond the last term kept, or faster). */
  seriesResidual: { muA: number; muB: number; energy: number };
  /** All three residuals within {@link SERIES_RANGE}: the series describes the point. */
  inSeries: boolean;
}

export interface CurveData {
  a: Species;
  b: Species;
  order: number;
  tolerance: number;
  lengthUnit: LengthUnit;
  coefficients: CurveCoefficients;
  /** Which printed series terms the Hamiltonian order gets right; the exact columns it misses are flagged. */
  completeness: OrderCompleteness;
  rows: CurveRow[];
  /** True when every row is trusted. */
  trusted: boolean;
  /** What the numbers rest on (as in `pair`): levels, statement and MODEL warnings of the fitted QDOs. */
  accuracy: PairAccuracy;
  warnings: string[];
}

/**
 * The asymptotic series (R in bohr): mu(R) ≈ D4/R^4 + D6/R^6 + D7/R^7 + D8/R^8 + D9/R^9 (through R^-9; spherical
 * pairs also + D10/R^10) and
 * ΔE(R) ≈ E5/R^5 − C6/R^6 + E7/R^7 − C8/R^8 (through R^-8); absent coefficients count as zero.
 */
export function asymptoticForms(c: CurveCoefficients, R: number) {
  const term = (t: D7Triple | undefined, k: 'a' | 'b' | 'total', p: number) => (t ? t[k] / R ** p : 0);
  const mu = (k: 'a' | 'b' | 'total') => term(c.D4, k, 4) + term(c.D6, k, 6) + c.D7[k] / R ** 7 + term(c.D8, k, 8) + term(c.D9, k, 9) + term(c.D10, k, 10);
  const energy = (c.E5 ?? 0) / R ** 5 - c.C6 / R ** 6 + (c.E7 ?? 0) / R ** 7 - (c.C8 ?? 0) / R ** 8;
  return { muA: mu('a'), muB: mu('b'), muTotal: mu('total'), energy };
}

/** The printed series in words, e.g. "D7/R^7 + D9/R^9 + D10/R^10", and the power it is complete through. */
export function seriesLaw(c: CurveCoefficients): { dipole: string; energy: string; dipoleThrough: number } {
  const dipole = [c.D4 && 'D4/R^4', c.D6 && 'D6/R^6', 'D7/R^7', c.D8 && 'D8/R^8', c.D9 && 'D9/R^9', c.D10 && 'D10/R^10'].filter(Boolean).join(' + ');
  const energy = [c.E5 !== undefined && 'E5/R^5', '−C6/R^6', c.E7 !== undefined && 'E7/R^7', c.C8 !== undefined && '−C8/R^8'].filter(Boolean).join(' + ').replace(/\+ \u2212/g, '− ');
  return { dipole, energy, dipoleThrough: c.D10 ? 10 : c.D9 ? 9 : 7 };
}

/** Combine the exact curve with the asymptotic coefficients. */
export function curveData(
  a: Species,
  b: Species,
  curve: ExactCurve,
  coefficients: CurveCoefficients,
  options: { tolerance: number; lengthUnit: LengthUnit },
): CurveData {
  const rows: CurveRow[] = curve.points.map(({ localisation: _l, ...p }) => {
    const asymptotic = asymptoticForms(coefficients, p.R);
    const seriesResidual = { muA: p.muA / asymptotic.muA - 1, muB: p.muB / asymptotic.muB - 1, energy: p.energy / asymptotic.energy - 1 };
    const inSeries = Object.values(seriesResidual).every((x) => Math.abs(x) <= SERIES_RANGE);
    return { ...p, asymptotic, seriesResidual, inSeries };
  });
  const completeness = orderCompleteness(curve.order, isSpherical(a) && isSpherical(b));
  const accuracy = pairAccuracy(a, b, coefficients.D7);
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
  warnings.push(...completeness.notes.map((n) => `${n} (columns marked *; the default order completes them)`));
  const outside = rows.filter((r) => r.trusted && !r.inSeries);
  if (outside.length > 0)
    warnings.push(
      `${outside.length} trusted point(s) lie more than ${SERIES_RANGE * 100}% from the asymptotic series (R too small for it: |÷ser−1| > ${SERIES_RANGE} in the table, "inSeries": false in --json; not joined in the figure's ratio panels)`,
    );
  // the species warnings `pair` prints (MODEL: D7 of a fitted QDO rests on the model's B)
  warnings.push(...pairSpeciesWarnings(a, b), ...accuracy.warnings);
  return { a, b, order: curve.order, tolerance: options.tolerance, lengthUnit: options.lengthUnit, coefficients, completeness, rows, trusted: untrusted.length === 0, accuracy, warnings };
}

export const toUnit = (R: number, unit: LengthUnit): number => (unit === 'bohr' ? R : bohrToAngstrom(R));
export const unitName = (unit: LengthUnit): string => (unit === 'bohr' ? 'bohr' : 'Å');

/** Units the curve is reported in: atomic (e·a0, hartree), or SI with dipoles in debye and energies in `energyUnit`. */
export interface CurveUnits {
  units?: 'atomic' | 'si';
  energyUnit?: EnergyUnit;
}

/** Dipole and energy in the report's units, with their printed and CSV unit names (also used by `dispole density`). */
export function reportUnits(o: CurveUnits) {
  if (o.units !== 'si') return { si: false, mu: (x: number) => x, e: (x: number) => x, muText: 'e a0', eText: 'Eh', muCsv: 'ea0', eCsv: 'hartree' };
  const eu = o.energyUnit ?? 'cm-1';
  return { si: true, mu: dipoleAuToDebye, e: (x: number) => energyFromHartree(x, eu), muText: 'D', eText: energyUnitText(eu), muCsv: 'debye', eCsv: eu.replace('/', '_per_') };
}

function header(d: CurveData, o: CurveUnits): string[] {
  const c = d.coefficients;
  const u = reportUnits(o);
  const lines = [
    `Pair ${d.a.name} – ${d.b.name}: A at the origin, B at +R on z; exact ground state of the multipole Hamiltonian through order ${d.order}`,
    `  units: R in ${unitName(d.lengthUnit)}, dipoles in ${u.muText}, energies in ${u.eText}${u.si ? ' (CODATA 2018)' : ''}; coefficients in atomic units`,
    `  A  ${d.a.name}: ${describeSpecies(d.a)}${sourceInBrief(d.a) ? `  [${sourceInBrief(d.a)}]` : ''}`,
    `  B  ${d.b.name}: ${describeSpecies(d.b)}${sourceInBrief(d.b) ? `  [${sourceInBrief(d.b)}]` : ''}`,
    `  asymptotic forms (perturbation route): D7.a = ${sig(c.D7.a)}, D7.b = ${sig(c.D7.b)} e a0^8${c.D9 ? `;  D9.a = ${sig(c.D9.a)}, D9.b = ${sig(c.D9.b)} e a0^10` : ''}${c.D10 ? `;  D10.a = ${sig(c.D10.a)}, D10.b = ${sig(c.D10.b)} e a0^11 (third order)` : ''};  C6 = ${sig(c.C6)} Eh a0^6${c.C8 !== undefined ? `, C8 = ${sig(c.C8)} Eh a0^8` : ''}`,
  ];
  if (c.D4 || c.E5 !== undefined) {
    const pair = (name: string, t: D7Triple | undefined, unit: string) => (t ? `, ${name}.a = ${sig(t.a)}, ${name}.b = ${sig(t.b)} ${unit}` : '');
    lines.push(
      `  first-order terms: E5 = ${sig(c.E5 ?? 0)} Eh a0^5${c.E7 !== undefined ? `, E7 = ${sig(c.E7)} Eh a0^7` : ''}${pair('D4', c.D4, 'e a0^5')}${pair('D6', c.D6, 'e a0^7')}${pair('D8', c.D8, 'e a0^9')}`,
    );
  }
  const law = seriesLaw(c);
  lines.push(`  series: mu ≈ ${law.dipole} (complete through R^-${law.dipoleThrough}), E ≈ ${law.energy} (complete through R^-8); "÷ser−1" = exact ÷ series − 1`);
  lines.push(`  basis converged to ${d.tolerance} (relative) per point (the ÷ser−1 columns show the digits above that); N = total quanta, dim = basis dimension after the L_z = 0 and mirror reduction (unreduced: C(N+6, 6), in --json and --csv)`);
  return lines;
}

/**
 * An "exact ÷ series − 1" cell to the digits it carries: the exact value is converged to `tolerance` (relative), so
 * the residual is known to about ±tolerance; at most `digits` significant digits, at least one, in exponent form
 * (JSON and CSV keep every digit).
 */
function residualCell(x: number, tolerance: number, digits: number): string {
  if (!Number.isFinite(x) || x === 0) return sigDigits(x, digits, 'exponent');
  const carried = Math.floor(Math.log10(Math.abs(x) / tolerance)) + 1;
  return sigDigits(x, Math.max(1, Math.min(digits, carried)), 'exponent');
}

/** The human table of `dispole curve`: `digits` significant digits, one notation per column. */
export function curveToText(d: CurveData, options: (CurveUnits & { digits?: number }) | number = {}): string {
  const o = typeof options === 'number' ? { digits: options } : options;
  const u = reportUnits(o);
  const len = unitName(d.lengthUnit);
  const muMark = d.completeness.dipoleVanishes || d.completeness.dipoleMissing.length > 0 ? '*' : '';
  const eMark = d.completeness.energyMissing.length > 0 ? '*' : '';
  const tbl = textTable(
    [`R (${len})`, `mu_A (${u.muText})${muMark}`, 'series A', `mu_B (${u.muText})${muMark}`, 'series B', `mu_total${muMark}`, 'series', `E_int (${u.eText})${eMark}`, 'series E', `A ÷ser−1${muMark}`, `B ÷ser−1${muMark}`, `E ÷ser−1${eMark}`, 'N', 'dim', 'status'],
    formatColumns(
      d.rows.map((r) => [
        toUnit(r.R, d.lengthUnit),
        u.mu(r.muA),
        u.mu(r.asymptotic.muA),
        u.mu(r.muB),
        u.mu(r.asymptotic.muB),
        u.mu(r.muTotal),
        u.mu(r.asymptotic.muTotal),
        u.e(r.energy),
        u.e(r.asymptotic.energy),
        residualCell(r.seriesResidual.muA, d.tolerance, o.digits ?? DEFAULT_DIGITS),
        residualCell(r.seriesResidual.muB, d.tolerance, o.digits ?? DEFAULT_DIGITS),
        residualCell(r.seriesResidual.energy, d.tolerance, o.digits ?? DEFAULT_DIGITS),
        String(r.quanta),
        String(r.dimension),
        r.trusted ? 'ok' : r.converged ? 'UNTRUSTED' : 'UNCONVERGED',
      ]),
      o.digits ?? DEFAULT_DIGITS,
    ),
  );
  const lines = [...header(d, o), '', tbl, ''];
  if (d.coefficients.D4 || d.coefficients.E5 !== undefined) lines.push('(series columns include the first-order terms D4, D6, D8 and E5, E7)');
  if (muMark || eMark) lines.push(`* not right to the order of the printed series at multipole order ${d.order}: see the warnings`);
  lines.push(d.trusted ? 'All points converged and trusted.' : 'UNTRUSTED points: see the warnings below.');
  lines.push(accuracyStatementLine(d.accuracy, d.a.name, d.b.name));
  for (const w of d.warnings) lines.push(w.startsWith('  ') ? w : `warning: ${w}`);
  return lines.join('\n') + '\n';
}

/**
 * CSV of `dispole curve --csv`: one header row with units, one row per R, full precision. R in the length unit
 * (and again in bohr when that unit is not bohr); dipoles and energies in atomic units, plus SI columns with
 * `units` si.
 */
export function curveToCsv(d: CurveData, options: CurveUnits = {}): string {
  const u = reportUnits(options);
  const lengthCols = d.lengthUnit === 'bohr' ? ['R_bohr'] : ['R_angstrom', 'R_bohr'];
  const siCols = u.si ? [`mu_A_${u.muCsv}`, `mu_B_${u.muCsv}`, `mu_total_${u.muCsv}`, `E_int_${u.eCsv}`] : [];
  const head = [...lengthCols, 'mu_A_ea0', 'mu_B_ea0', 'mu_total_ea0', 'E_int_hartree', ...siCols, 'asym_mu_A_ea0', 'asym_mu_B_ea0', 'asym_mu_total_ea0', 'asym_E_hartree', 'quanta', 'dimension', 'dimension_unreduced', 'residual_hartree', 'converged', 'trusted', 'reasons', 'series_residual_mu_A', 'series_residual_mu_B', 'series_residual_E', 'in_series'];
  const lines = [head.join(',')];
  for (const r of d.rows) {
    const R = d.lengthUnit === 'bohr' ? [r.R] : [toUnit(r.R, d.lengthUnit), r.R];
    const si = u.si ? [u.mu(r.muA), u.mu(r.muB), u.mu(r.muTotal), u.e(r.energy)] : [];
    lines.push(
      [...R, r.muA, r.muB, r.muTotal, r.energy, ...si, r.asymptotic.muA, r.asymptotic.muB, r.asymptotic.muTotal, r.asymptotic.energy, r.quanta, r.dimension, r.fullDimension, r.residual, r.converged, r.trusted]
        .map(String)
        .concat(csvField(r.reasons.join('; ')), String(r.seriesResidual.muA), String(r.seriesResidual.muB), String(r.seriesResidual.energy), String(r.inSeries))
        .join(','),
    );
  }
  return lines.join('\n') + '\n';
}

/** The `dispole curve --json` object (atomic units; with `units` si each point gains an `si` block). */
export function curveToJson(d: CurveData, options: CurveUnits = {}): Record<string, unknown> {
  const u = reportUnits(options);
  return {
    units: { R: d.lengthUnit, dipole: 'e a0', energy: 'hartree', coefficients: 'atomic' },
    ...(u.si ? { siUnits: { dipole: 'debye', energy: options.energyUnit ?? 'cm-1', constants: 'CODATA 2018' } } : {}),
    geometry: 'A at the origin, B at +R on z; mu along z; E_int = E - E_A - E_B',
    species: { a: speciesToJson(d.a), b: speciesToJson(d.b) },
    hamiltonian: {
      multipoleOrder: d.order,
      // the exact columns this order does not get right to the order of the printed series (flagged)
      incomplete: {
        dipole: d.completeness.dipoleVanishes || d.completeness.dipoleMissing.length > 0,
        energy: d.completeness.energyMissing.length > 0,
        dipoleVanishesBySymmetry: d.completeness.dipoleVanishes,
        missingTerms: { dipole: d.completeness.dipoleMissing, energy: d.completeness.energyMissing },
        notes: d.completeness.notes,
      },
    },
    series: { dipole: seriesLaw(d.coefficients).dipole, energy: seriesLaw(d.coefficients).energy, inSeriesWithin: SERIES_RANGE },
    tolerance: d.tolerance,
    coefficients: d.coefficients,
    points: d.rows.map((r) => ({
      R: toUnit(r.R, d.lengthUnit),
      R_bohr: r.R,
      muA: r.muA,
      muB: r.muB,
      muTotal: r.muTotal,
      energy: r.energy,
      ...(u.si ? { si: { muA: u.mu(r.muA), muB: u.mu(r.muB), muTotal: u.mu(r.muTotal), energy: u.e(r.energy) } } : {}),
      asymptotic: r.asymptotic,
      seriesResidual: r.seriesResidual,
      inSeries: r.inSeries,
      basis: { quanta: r.quanta, dimension: r.dimension, dimensionUnreduced: r.fullDimension, residual: r.residual },
      converged: r.converged,
      trusted: r.trusted,
      reasons: r.reasons,
      record: r.record,
    })),
    trusted: d.trusted,
    accuracy: accuracyToJson(d.accuracy),
    warnings: d.warnings,
    dispole: { version: VERSION },
  };
}
