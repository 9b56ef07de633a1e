/**
 * Reports of `dispole cia`: text, JSON and CSV of the CIA moments (classical, Wigner–Kirkwood, quantum), the
 * band integrals γ1, α1 and the absorption spectrum. Pure: strings out. Units are stated in every output.
 */
import { BAND_INTEGRAL_DEFINITIONS } from '../engines/cia/absorption.js';
import type { CiaResult } from '../engines/cia/cia.js';
import { csvField, formatColumns, labelToDigits, oneLine, sig, spreadText, textTable } from './format.js';

/** Units of every number of the report (also the JSON `unitsDetail`). */
export const CIA_UNITS = {
  R: 'bohr',
  V: 'hartree',
  mu: 'e a0',
  M0: 'e^2 a0^5',
  M1: 'e^2 a0^5 Eh/hbar',
  M2: 'e^2 a0^5 (Eh/hbar)^2',
  gamma1: 'cm^-1 amagat^-2',
  alpha1: 'cm^-2 amagat^-2',
  temperature: 'K',
  wavenumber: 'cm^-1',
  absorption: 'cm^-1 amagat^-2',
  S: 'e^2 a0^5 per (Eh/hbar)',
} as const;

const WHAT_THE_NUMBERS_REST_ON =
  'model: the moments and the spectrum are exact (classical: the R integral; quantum: the Slater sum and golden-rule line shape, numerically converged) for the given V(R) and mu(R); their accuracy is that of V and mu';

/** The JSON document. */
export function ciaToJson(r: CiaResult): Record<string, unknown> {
  const temperatures = r.temperatures.map((t) => ({
    T: t.T,
    M0: t.M0,
    M1: t.M1,
    M2: t.M2,
    gamma1: t.gamma1,
    alpha1: t.alpha1,
    classical: t.classical,
    wignerKirkwood: t.wignerKirkwood,
    quantum: t.quantum,
    difference: t.difference,
  }));
  const spectra = r.temperatures.filter((t) => t.spectrum).map((t) => ({ T: t.T, ...t.spectrum! }));
  return {
    units: 'atomic',
    unitsDetail: CIA_UNITS,
    pair: r.pair,
    potential: r.potential,
    dipole: r.dipole,
    definitions: {
      M0: '4π ∫ mu² g R² dR (per n1 n2)',
      M1: '(ħ/2m) 4π ∫ (mu′² + 2mu²/R²) g R² dR (first-moment sum rule)',
      M2: '(kT/m) 4π ∫ (mu′² + 2mu²/R²) g R² dR (classical)',
      topLevel: 'M0, M1 are the quantum values, M2 the classical one; gamma1, alpha1 from the quantum M0, M1',
      ...BAND_INTEGRAL_DEFINITIONS,
      difference: '(value − quantum)/quantum',
    },
    temperatures,
    ...(spectra.length ? { spectrum: spectra } : {}),
    grid: r.grid,
    basis: WHAT_THE_NUMBERS_REST_ON,
    trusted: r.trusted,
    warnings: r.warnings,
  };
}

/** CSV: the spectrum (one row per wavenumber and temperature) when computed, else the moments per temperature. */
export function ciaToCsv(r: CiaResult): string {
  const head = [
    `# dispole cia ${r.pair.A}-${r.pair.B}; ${r.dipole.convention}`,
    `# potential: ${oneLine(r.potential.label)} [${oneLine(r.potential.basis)}]`,
    `# dipole: ${oneLine(r.dipole.label)} [${oneLine(r.dipole.basis)}]`,
    `# ${WHAT_THE_NUMBERS_REST_ON}`,
  ].map((l) => l.replace(/\n/g, ' '));
  const lines: string[] = [...head];
  if (r.temperatures.some((t) => t.spectrum)) {
    lines.push('T_K,wavenumber_cm-1,absorption_cm-1_amagat-2,S_e2a0^5_per_Eh,free_free,bound_free,bound_bound');
    for (const t of r.temperatures) {
      const s = t.spectrum;
      if (!s) continue;
      s.wavenumber.forEach((w, i) => lines.push([t.T, w, s.absorption[i], s.S[i], s.freeFree[i], s.boundFree[i], s.boundBound[i]].map(String).join(',')));
    }
  } else {
    lines.push('T_K,M0_quantum_e2a0^5,M1_quantum_e2a0^5Eh,M2_classical,gamma1_cm-1_amagat-2,alpha1_cm-2_amagat-2,M0_classical,M1_classical,M0_wigner_kirkwood,M1_wigner_kirkwood,partial_waves,status');
    for (const t of r.temperatures) {
      lines.push([t.T, t.M0, t.M1, t.M2, t.gamma1, t.alpha1, t.classical.M0, t.classical.M1, t.wignerKirkwood.M0, t.wignerKirkwood.M1, t.quantum.partialWaves].map(String).join(',') + ',' + csvField(t.quantum.converged ? 'ok' : 'UNCONVERGED'));
    }
  }
  return lines.join('\n') + '\n';
}

/** The readable report. */
export function ciaToText(r: CiaResult, digits: number): string {
  const out: string[] = [];
  const [mA, mB] = r.pair.masses;
  out.push(`Collision-induced absorption, ${r.pair.A}–${r.pair.B} (translational band, per n1 n2)`);
  out.push(`  masses ${sig(mA)} u, ${sig(mB)} u (${r.pair.massSource}); reduced mass ${sig(r.pair.reducedMass, digits)} u`);
  out.push(`  potential: ${labelToDigits(r.potential.label, digits)}`);
  out.push(`    ${r.potential.basis}`);
  if (r.potential.well) out.push(`    well: ${sig(r.potential.well.depth, digits)} Eh (${sig(r.potential.well.depthK, 5)} K) at R = ${sig(r.potential.well.R, digits)} bohr`);
  out.push(`  dipole: ${labelToDigits(r.dipole.label, digits)}`);
  out.push(`    ${r.dipole.basis}`);
  out.push(`    sign convention: ${r.dipole.convention}`);
  out.push(`  numbers rest on: ${WHAT_THE_NUMBERS_REST_ON}`);
  out.push('');
  out.push('Units: M0 e²·a0^5, M1 e²·a0^5·Eh/ħ, M2 e²·a0^5·(Eh/ħ)² (atomic units); γ1 cm^-1 amagat^-2, α1 cm^-2 amagat^-2.');
  out.push(`  ${BAND_INTEGRAL_DEFINITIONS.gamma1};  ${BAND_INTEGRAL_DEFINITIONS.alpha1}`);
  out.push('');
  const rows = r.temperatures.map((t) => [
    String(t.T),
    t.quantum.M0,
    t.classical.M0,
    t.wignerKirkwood.M0,
    spreadText(t.difference.classicalM0),
    spreadText(t.difference.wignerKirkwoodM0),
    t.quantum.M1,
    t.classical.M1,
    t.wignerKirkwood.M1,
    t.classical.M2,
    t.gamma1,
    t.alpha1,
    String(t.quantum.partialWaves),
    t.quantum.converged ? 'ok' : 'UNCONVERGED',
  ]);
  out.push(
    textTable(
      ['T (K)', 'M0 quantum', 'M0 classical', 'M0 W–K', 'Δ cl', 'Δ W–K', 'M1 quantum', 'M1 classical', 'M1 W–K', 'M2 classical', 'γ1', 'α1', 'l waves', 'status'],
      formatColumns(rows, digits),
    ),
  );
  out.push('Δ = (value − quantum)/quantum. Classical: g = exp(−V/kT); W–K: with the Wigner–Kirkwood ħ² correction; quantum: two-body Slater sum (bound states included).');
  const spectra = r.temperatures.filter((t) => t.spectrum);
  if (spectra.length > 0) {
    out.push('');
    out.push('Absorption spectrum α(ν̃)/(n1 n2) (cm^-1 amagat^-2), quantum line shape (free–free, bound–free, bound–bound):');
    for (const t of spectra) {
      const s = t.spectrum!;
      out.push(`  T = ${t.T} K: ∫S dω = ${sig(s.M0, digits)} (residual ${spreadText(s.residualM0)} against M0), ∫ωS dω = ${sig(s.M1, digits)} (residual ${spreadText(s.residualM1)} against M1); from the spectrum γ1 = ${sig(s.gamma1, digits)}, α1 = ${sig(s.alpha1, digits)}`);
    }
    const grid = spectra[0].spectrum!.wavenumber;
    const srows = grid.map((w, i) => [w, ...spectra.map((t) => t.spectrum!.absorption[i])]);
    out.push(textTable(['ν̃ (cm^-1)', ...spectra.map((t) => `α/n² at ${t.T} K`)], formatColumns(srows, digits)));
  }
  out.push('');
  out.push(`Radial grid: ${r.grid.points} points, step ${sig(r.grid.step, 4)} bohr, ${sig(r.grid.from, 5)}–${sig(r.grid.to, 5)} bohr (dipole to ${sig(r.grid.dipoleEnd, 4)}, matching at ${sig(r.grid.match, 4)}); ${r.grid.boundLevels.length} bound levels.`);
  for (const w of r.warnings) out.push(`WARNING: ${w}`);
  out.push(r.trusted ? 'All numbers converged.' : 'UNTRUSTED: see the warnings above.');
  return out.join('\n') + '\n';
}
