/** A species as plain JSON for reports (parameters in atomic units, with its source). */
import type { Species } from '../model/species.js';
import { describeSpecies } from '../model/species.js';

export function speciesToJson(s: Species): Record<string, unknown> {
  const { name, ...rest } = s;
  return { name, ...rest, description: describeSpecies(s) };
}
