/** Reports of a cluster computation: the JSON object of the CLI contract, CSV rows and the human table (pure). */
import { DIPOLE_TOLERANCE, type ClusterResult } from '../engines/cluster/cluster.js';
import type { Vec3 } from '../model/types.js';
import { dipoleAuToDebye, energyFromHartree, energyUnitText, type EnergyUnit } from '../model/units.js';
import { VERSION } from '../version.js';
import { csvField, DEFAULT_DIGITS, formatColumns, oneLine, sigDigits, textTable } from './format.js';

const debye = (v: Vec3): Vec3 => v.map(dipoleAuToDebye) as Vec3;
const length = (v: Vec3) => Math.hypot(v[0], v[1], v[2]);

/** What the report says about where the geometry came from. */
export interface ClusterSource {
  file: string;
  comment: string;
  unit: 'angstrom' | 'bohr';
}

/**
 * Per-centre names of our own: "in cluster" (screened by every other centre) and "isolated" (the centre alone).
 * The same words in the text, CSV and JSON.
 */
export const CENTRE_FIELDS = {
  alphaInCluster: 'screened static polarisability in the cluster: the centre\'s dipole per uniform field on the whole cluster, 1/3 of the trace (a0^3)',
  alphaIsolated: 'static polarisability of the centre alone (a0^3)',
  C6InCluster: 'screened like-pair coefficient (3/π)∫ alpha(iu)² du of the centre in the cluster (Eh a0^6)',
  C6Isolated: 'like-pair coefficient of the centre alone (Eh a0^6)',
} as const;

/** What a dipole's error estimate covers, in the same words in the text, CSV and JSON. */
const DIPOLE_ERROR_TEXT = 'estimated error of the dipole (e a0): rounding of the normal-mode covariance and the far-pair approximation (leading-order bounds)';

/** How the cluster report prints: digits, and energies/dipoles in SI beside atomic units when asked. */
export interface ClusterReportOptions {
  digits?: number;
  units?: 'atomic' | 'si';
  energyUnit?: EnergyUnit;
}

/** The `dispole cluster --json` object: atomic units (positions bohr, dipoles e·a0, energies hartree), plus debye. */
export function clusterToJson(r: ClusterResult, source: ClusterSource, options: ClusterReportOptions = {}): Record<string, unknown> {
  const eu = options.energyUnit ?? 'cm-1';
  return {
    units: 'atomic',
    geometry: { file: source.file, comment: source.comment, inputUnit: source.unit, centres: r.centres.length },
    energy: r.energy,
    ...(options.units === 'si'
      ? { energySI: { unit: eu, manyBody: energyFromHartree(r.energy.manyBody, eu), pairwise: energyFromHartree(r.energy.pairwise, eu), nonAdditive: energyFromHartree(r.energy.nonAdditive, eu) } }
      : {}),
    dipole: r.dipole,
    dipoleDebye: debye(r.dipole),
    dipoleError: r.dipoleError,
    dipoleFlagged: r.dipoleFlagged,
    alpha: r.alpha,
    centres: r.centres.map((c) => ({
      label: c.label,
      species: c.species,
      position: c.position,
      dipole: c.dipole,
      dipoleDebye: debye(c.dipole),
      dipoleError: c.dipoleError,
      dipoleFlagged: c.dipoleFlagged,
      alphaInCluster: c.alpha,
      alphaIsolated: c.alphaFree,
      C6InCluster: c.C6,
      C6Isolated: c.C6Free,
    })),
    modes: r.modes,
    quadrature: r.quadrature,
    farPairs: r.farPairs,
    notes: r.notes,
    converged: r.converged,
    definitions: {
      energy: 'zero-point energy change of the dipole-coupled oscillators (manyBody), its sum over pairs (pairwise), manyBody − pairwise (nonAdditive)',
      alpha: 'screened static polarisability of the whole cluster (a0^3)',
      ...CENTRE_FIELDS,
      dipole: 'dispersion-induced dipole by force balance with the dipole–quadrupole interaction',
      dipoleError: DIPOLE_ERROR_TEXT,
      dipoleFlagged: `true when dipoleError exceeds ${DIPOLE_TOLERANCE} of the larger of |mu| and the size of the centre's pair terms |D7|/R^7: the dipole is untrusted`,
    },
    dispole: { version: VERSION },
  };
}

/**
 * CSV: "#" lines with the source and the cluster totals (energies, total dipole, polarisability), then a header
 * and one row per centre (atomic units, plus |mu| in debye; full precision).
 */
export function clusterToCsv(r: ClusterResult, source: ClusterSource, options: ClusterReportOptions = {}): string {
  const eu = options.energyUnit ?? 'cm-1';
  const e = (x: number) => (options.units === 'si' ? `${x} Eh = ${energyFromHartree(x, eu)} ${energyUnitText(eu)}` : `${x} Eh`);
  const rows = [
    `# dispole ${VERSION}: cluster ${oneLine(source.file)}, ${r.centres.length} centres${source.comment ? ` (${oneLine(source.comment)})` : ''}; dipole-coupled QDOs, atomic units`,
    `# energy.manyBody: ${e(r.energy.manyBody)}`,
    `# energy.pairwise: ${e(r.energy.pairwise)}`,
    `# energy.nonAdditive: ${e(r.energy.nonAdditive)}`,
    `# dipole (e a0): ${r.dipole.join(' ')}; |mu| = ${dipoleAuToDebye(length(r.dipole))} D; estimated error ${r.dipoleError} e a0${r.dipoleFlagged ? ' (FLAGGED: untrusted)' : ''}`,
    `# mu_error_ea0: ${DIPOLE_ERROR_TEXT}; mu_flagged: true when it exceeds ${DIPOLE_TOLERANCE} of the larger of |mu| and the size of the centre's pair terms`,
    `# alpha of the cluster (a0^3): ${r.alpha}`,
    `# converged: ${r.converged}`,
    'label,species,x_bohr,y_bohr,z_bohr,mu_x_ea0,mu_y_ea0,mu_z_ea0,mu_debye,alpha_in_cluster_a0^3,alpha_isolated_a0^3,C6_in_cluster_Eh_a0^6,C6_isolated_Eh_a0^6,mu_error_ea0,mu_flagged',
    ...r.centres.map((c) =>
      [csvField(c.label), csvField(c.species), ...[...c.position, ...c.dipole, dipoleAuToDebye(length(c.dipole)), c.alpha, c.alphaFree, c.C6, c.C6Free, c.dipoleError, c.dipoleFlagged].map(String)].join(','),
    ),
  ];
  return rows.join('\n') + '\n';
}

/** The human report of `dispole cluster`: `digits` significant digits, one notation per column. */
export function clusterToText(r: ClusterResult, source: ClusterSource, options: ClusterReportOptions | number = {}): string {
  const o: ClusterReportOptions = typeof options === 'number' ? { digits: options } : options;
  const digits = o.digits ?? DEFAULT_DIGITS;
  const eu = o.energyUnit ?? 'cm-1';
  const f = (x: number) => sigDigits(x, digits);
  const lines: string[] = [];
  lines.push(`Cluster ${source.file}: ${r.centres.length} centres${source.comment ? ` (${source.comment})` : ''}; dipole-coupled QDOs, atomic units${o.units === 'si' ? ` with SI values (energies in ${energyUnitText(eu)}, dipoles in D)` : ''}`);
  lines.push('');
  const e = r.energy;
  const si = (x: number) => (o.units === 'si' ? `  (${f(energyFromHartree(x, eu))} ${energyUnitText(eu)})` : '');
  lines.push(`dispersion energy, all orders (many-body)  ${f(e.manyBody)} Eh${si(e.manyBody)}`);
  lines.push(`sum over pairs (pairwise additive)         ${f(e.pairwise)} Eh${si(e.pairwise)}`);
  lines.push(`non-additive part                          ${f(e.nonAdditive)} Eh${si(e.nonAdditive)}`);
  lines.push(
    `total dispersion dipole                    [${r.dipole.map(f).join(', ')}] e a0  |mu| = ${f(dipoleAuToDebye(length(r.dipole)))} D  ± ${sigDigits(r.dipoleError, 2, 'exponent')} e a0${r.dipoleFlagged ? '  FLAGGED' : ''}`,
  );
  lines.push(`screened polarisability of the cluster     ${f(r.alpha)} a0^3`);
  lines.push('');
  const header = ['label', 'x (a0)', 'y (a0)', 'z (a0)', 'mu_x (e a0)', 'mu_y (e a0)', 'mu_z (e a0)', '|mu| (D)', 'mu error (e a0)', 'alpha in cluster', 'alpha isolated', 'C6 in cluster', 'C6 isolated'];
  const rows = formatColumns(
    r.centres.map((c) => [c.label, ...c.position, ...c.dipole, dipoleAuToDebye(length(c.dipole)), c.dipoleError, c.alpha, c.alphaFree, c.C6, c.C6Free]),
    digits,
  );
  r.centres.forEach((c, i) => {
    if (c.dipoleFlagged) rows[i][0] += ' FLAGGED';
  });
  lines.push(textTable(header, rows));
  lines.push('');
  lines.push('alpha in cluster: screened static polarisability (a0^3), the centre\'s dipole per uniform field on the whole cluster; isolated: the centre alone;');
  lines.push('C6 in cluster: screened like-pair coefficient (3/π)∫alpha(iu)² du (Eh a0^6); mu: dispersion-induced dipole by force balance.');
  lines.push(`mu error: ${DIPOLE_ERROR_TEXT}; FLAGGED: above ${DIPOLE_TOLERANCE} of the larger of |mu| and the size of the centre's pair terms (untrusted).`);
  for (const note of r.notes) lines.push(`note: ${note}`);
  if (!r.quadrature.converged) lines.push(`UNCONVERGED: the C6 quadrature reached only ${sigDigits(r.quadrature.largestRelativeError, 2, 'exponent')} relative error`);
  return lines.join('\n') + '\n';
}
