/** Seeded random QDO species for the equivalence tests (parameters in a well-conditioned range, atomic units). */
import { drude, drudeAnisotropic, type DrudeSpecies } from '../../src/model/drude.js';
import { uniform } from './random.js';

/** An isotropic or anisotropic QDO with q in [0.5, 2), m in [0.2, 2), frequencies in [0.3, 1.5). */
export const randomDrude = (rand: () => number, name: string, isotropic: boolean): DrudeSpecies => {
  const q = uniform(rand, 0.5, 2), m = uniform(rand, 0.2, 2);
  return isotropic
    ? drude({ q, m, w: uniform(rand, 0.3, 1.5) }, name)
    : drudeAnisotropic({ q, m, wx: uniform(rand, 0.3, 1.5), wy: uniform(rand, 0.3, 1.5), wz: uniform(rand, 0.3, 1.5) }, name);
};
