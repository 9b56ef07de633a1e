/**
 * `dispole species --csv`: one row per species a command accepts by name (RFC 4180; line breaks of YAML names and
 * sources become spaces), with its kind, accuracy level, definition in atomic units and source; the provenance and
 * the meaning of the levels on leading "#" lines, as in every CSV of dispole.
 */
import { VERSION } from '../version.js';
import { csvField, oneLine } from './format.js';

export interface SpeciesCsvRow {
  name: string;
  kind: string;
  /** exact, first-principles, rescaled or model (src/engines/accuracy.ts). */
  level: string;
  /** The definition in atomic units, as `describeSpecies` prints it (kind and parameters). */
  definition: string;
  source?: string;
}

export const SPECIES_CSV_HEADER = ['name', 'kind', 'level', 'definition_atomic_units', 'source'] as const;

export function speciesToCsv(rows: readonly SpeciesCsvRow[], levels: string): string {
  const lines = [
    `# dispole ${VERSION}: the species every command accepts by name (files given with --species first), parameters in atomic units`,
    `# levels: ${oneLine(levels)}`,
    SPECIES_CSV_HEADER.join(','),
    ...rows.map((r) => [r.name, r.kind, r.level, r.definition, r.source ?? ''].map((c) => csvField(oneLine(c))).join(',')),
  ];
  return lines.join('\n') + '\n';
}
