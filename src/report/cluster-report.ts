/** Reports of a cluster computation: the JSON object of the CLI contract, CSV rows and the human table (pure). */
import type { ClusterResult } from '../engines/cluster/cluster.js';
import type { Vec3 } from '../model/types.js';
import { dipoleAuToDebye, HARTREE_IN_WAVENUMBER } from '../model/units.js';
import { VERSION } from '../version.js';
import { sig, textTable } from './format.js';

const debye = (v: Vec3): Vec3 => v.map(dipoleAuToDebye) as Vec3;
const length = (v: Vec3) => Math.hypot(v[0], v[1], v[2]);

/** What the report says about where the geometry came from. */
export interface ClusterSource {
  file: string;
  comment: string;
  unit: 'angstrom' | 'bohr';
}

/** The `dispole cluster --json` object: atomic units (positions bohr, dipoles e·a0, energies hartree), plus debye. */
export function clusterToJson(r: ClusterResult, source: ClusterSource): Record<string, unknown> {
  return {
    units: 'atomic',
    geometry: { file: source.file, comment: source.comment, inputUnit: source.unit, centres: r.centres.length },
    energy: r.energy,
    dipole: r.dipole,
    dipoleDebye: debye(r.dipole),
    alpha: r.alpha,
    centres: r.centres.map((c) => ({
      label: c.label,
      species: c.species,
      position: c.position,
      dipole: c.dipole,
      dipoleDebye: debye(c.dipole),
      C6: c.C6,
      C6Free: c.C6Free,
      alpha: c.alpha,
      alphaFree: c.alphaFree,
    })),
    modes: r.modes,
    quadrature: r.quadrature,
    converged: r.converged,
    definitions: {
      energy: 'zero-point energy change of the dipole-coupled oscillators (manyBody), its sum over pairs (pairwise), manyBody − pairwise (nonAdditive)',
      alpha: 'screened static polarisability: dipole of the centre per uniform field on the whole cluster, 1/3 of the trace',
      C6: 'screened like-pair coefficient (3/π)∫ alpha(iu)² du of the centre',
      dipole: 'dispersion-induced dipole by force balance with the dipole–quadrupole interaction',
    },
    dispole: { version: VERSION },
  };
}

/** CSV: a header and one row per centre (atomic units, plus |mu| in debye). */
export function clusterToCsv(r: ClusterResult): string {
  const rows = [
    'label,species,x_bohr,y_bohr,z_bohr,mu_x_ea0,mu_y_ea0,mu_z_ea0,mu_debye,alpha_a0^3,alpha_free_a0^3,C6_Eh_a0^6,C6_free_Eh_a0^6',
    ...r.centres.map((c) =>
      [csvField(c.label), csvField(c.species), ...c.position, ...c.dipole, dipoleAuToDebye(length(c.dipole)), c.alpha, c.alphaFree, c.C6, c.C6Free]
        .map(String)
        .join(','),
    ),
  ];
  return rows.join('\n') + '\n';
}

function csvField(s: string): string {
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** The human report of `dispole cluster`. */
export function clusterToText(r: ClusterResult, source: ClusterSource, digits = 8): string {
  const f = (x: number) => sig(x, digits);
  const lines: string[] = [];
  lines.push(`Cluster ${source.file}: ${r.centres.length} centres${source.comment ? ` (${source.comment})` : ''}; dipole-coupled QDOs, atomic units`);
  lines.push('');
  const e = r.energy;
  const cm = (x: number) => `${sig(x * HARTREE_IN_WAVENUMBER, 6)} cm^-1`;
  lines.push(`dispersion energy, all orders (many-body)  ${f(e.manyBody)} Eh  (${cm(e.manyBody)})`);
  lines.push(`sum over pairs (pairwise additive)         ${f(e.pairwise)} Eh  (${cm(e.pairwise)})`);
  lines.push(`non-additive part                          ${f(e.nonAdditive)} Eh  (${cm(e.nonAdditive)})`);
  lines.push(`total dispersion dipole                    [${r.dipole.map(f).join(', ')}] e a0  |mu| = ${f(dipoleAuToDebye(length(r.dipole)))} D`);
  lines.push(`screened polarisability of the cluster     ${f(r.alpha)} a0^3`);
  lines.push('');
  const header = ['label', 'x (a0)', 'y (a0)', 'z (a0)', 'mu_x (e a0)', 'mu_y (e a0)', 'mu_z (e a0)', '|mu| (D)', 'alpha', 'alpha free', 'C6', 'C6 free'];
  const rows = r.centres.map((c) => [
    c.label,
    ...c.position.map((x) => sig(x, 6)),
    ...c.dipole.map(f),
    f(dipoleAuToDebye(length(c.dipole))),
    f(c.alpha),
    f(c.alphaFree),
    f(c.C6),
    f(c.C6Free),
  ]);
  lines.push(textTable(header, rows));
  lines.push('');
  lines.push('alpha: screened static polarisability (a0^3), the centre\'s dipole per uniform field on the whole cluster;');
  lines.push('C6: screened like-pair coefficient (3/π)∫alpha(iu)² du (Eh a0^6); mu: dispersion-induced dipole by force balance.');
  if (!r.converged) lines.push(`UNCONVERGED: the C6 quadrature reached only ${r.quadrature.largestRelativeError.toExponential(1)} relative error`);
  return lines.join('\n') + '\n';
}
