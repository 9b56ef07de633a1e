/**
 * The built-in atom library: published static dipole polarisabilities and like-pair dispersion coefficients,
 * each value with its source. Atomic units (alpha in a0³, C_n in Eh·a0^n, B in e³a0⁴/Eh²).
 * Values marked "quoted from memory" were not re-checked against the paper in this repository's history;
 * the others were checked against the paper's abstract or against an independent copy of its table.
 *
 * The library species (src/model/builtin-species.ts) are QDOs fitted to (alpha, C6, C8); hydrogen is also
 * computed exactly from first principles (kind "hydrogenic"), and its exact values here are the checks.
 */

/** A number with the publication it comes from. */
export interface SourcedValue {
  value: number;
  source: string;
}

/** One atom of the library. */
export interface AtomRecord {
  symbol: string;
  name: string;
  electrons: number;
  /** Static dipole polarisability alpha(0). */
  alpha: SourcedValue;
  /** Like-pair dispersion coefficients. */
  C6: SourcedValue;
  C8: SourcedValue;
  C10?: SourcedValue;
  /** Published static dipole–dipole–quadrupole hyperpolarisability B (Buckingham convention), if sourced. */
  B?: SourcedValue;
}

const YAN_1996 = 'Z.-C. Yan, J. F. Babb, A. Dalgarno, G. W. F. Drake, Phys. Rev. A 54, 2824 (1996)';
const TANG_TOENNIES_2003 = 'K. T. Tang, J. P. Toennies, J. Chem. Phys. 118, 4976 (2003), Table I';
const SCHWERDTFEGER_NAGLE_2019 = 'P. Schwerdtfeger, J. K. Nagle, Mol. Phys. 117, 1200 (2019), recommended value';

/**
 * Exact (non-relativistic, infinite nuclear mass) properties of the hydrogen atom: the checks of the
 * first-principles hydrogen computation.
 */
export const HYDROGEN_EXACT = {
  alpha1: { value: 9 / 2, source: 'P. S. Epstein, Phys. Rev. 28, 695 (1926) (second-order Stark effect, -9/4 F^2; quoted from memory)' },
  alpha2: { value: 15, source: `${YAN_1996} (quadrupole polarisability; quoted from memory)` },
  alpha3: { value: 131.25, source: `${YAN_1996} (octupole polarisability; quoted from memory)` },
  B: { value: -213 / 2, source: 'A. D. Buckingham, Adv. Chem. Phys. 12, 107 (1967) (quoted from memory)' },
  gamma: { value: 10665 / 8, source: 'fourth-order Stark coefficient -3555/64 F^4 of hydrogen, A. D. Buckingham, Adv. Chem. Phys. 12, 107 (1967) (quoted from memory)' },
  C6: { value: 6.4990267054, source: YAN_1996 },
  C8: { value: 124.3990835836, source: YAN_1996 },
  C10: { value: 3285.828415, source: YAN_1996 },
} as const satisfies Record<string, SourcedValue>;

/** The rare gases He … Xe. */
export const ATOM_LIBRARY: readonly AtomRecord[] = [
  {
    symbol: 'He',
    name: 'helium',
    electrons: 2,
    alpha: { value: 1.383192174455, source: `${YAN_1996} (non-relativistic, infinite nuclear mass; quoted from memory, the 1.38319217440 of later He2 potentials agrees to 11 digits)` },
    C6: { value: 1.460977837725, source: YAN_1996 },
    C8: { value: 14.11785737, source: `${YAN_1996} (10 digits as carried by later He2 potentials)` },
    C10: { value: 183.691075, source: `${YAN_1996} (as carried by later He2 potentials)` },
    B: { value: -7.327, source: 'D. M. Bishop, J. Pipin, J. Chem. Phys. 91, 3549 (1989), helium hyperpolarizabilities (the B entry quoted from memory)' },
  },
  {
    symbol: 'Ne',
    name: 'neon',
    electrons: 10,
    alpha: { value: 2.6608, source: 'M. Lesiuk, M. Przybytek, B. Jeziorski, arXiv:2006.15448 (2020): 2.66080(36)' },
    C6: { value: 6.383, source: TANG_TOENNIES_2003 },
    C8: { value: 90.34, source: TANG_TOENNIES_2003 },
    C10: { value: 1536, source: TANG_TOENNIES_2003 },
  },
  {
    symbol: 'Ar',
    name: 'argon',
    electrons: 18,
    alpha: { value: 11.0763, source: 'M. Lesiuk, B. Jeziorski, arXiv:2301.12502 (2023): 11.0763(19)' },
    C6: { value: 64.3, source: TANG_TOENNIES_2003 },
    C8: { value: 1623, source: TANG_TOENNIES_2003 },
    C10: { value: 49060, source: TANG_TOENNIES_2003 },
  },
  {
    symbol: 'Kr',
    name: 'krypton',
    electrons: 36,
    alpha: { value: 16.8, source: `${SCHWERDTFEGER_NAGLE_2019}, 16.8(0)` },
    C6: { value: 129.6, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
    C8: { value: 4187, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
    C10: { value: 155500, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
  },
  {
    symbol: 'Xe',
    name: 'xenon',
    electrons: 54,
    alpha: { value: 27.3, source: `${SCHWERDTFEGER_NAGLE_2019}, 27.3(2)` },
    C6: { value: 285.9, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
    C8: { value: 12810, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
    C10: { value: 619800, source: `${TANG_TOENNIES_2003} (quoted from memory)` },
  },
];
