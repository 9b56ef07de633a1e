/**
 * Standard atomic weights of the built-in atoms, in u: the conventional / abridged values of the IUPAC
 * Commission on Isotopic Abundances and Atomic Weights (CIAAW), "Standard atomic weights of the elements 2021",
 * Pure Appl. Chem. 94, 573 (2022) (values quoted from memory). Each is the natural-abundance mean; a pair of
 * particular isotopes needs --masses.
 */
export const STANDARD_ATOMIC_WEIGHTS: Readonly<Record<string, number>> = {
  H: 1.008,
  He: 4.002602,
  Ne: 20.1797,
  Ar: 39.95,
  Kr: 83.798,
  Xe: 131.293,
};

/** The source of {@link STANDARD_ATOMIC_WEIGHTS}, quoted in reports. */
export const ATOMIC_WEIGHTS_SOURCE = 'CIAAW standard atomic weights 2021, Pure Appl. Chem. 94, 573 (2022) (quoted from memory)';

/** The standard atomic weight (u) of a built-in atom by symbol (case-insensitive), or undefined. */
export function standardAtomicWeight(symbol: string): number | undefined {
  const key = Object.keys(STANDARD_ATOMIC_WEIGHTS).find((k) => k.toLowerCase() === symbol.toLowerCase());
  return key === undefined ? undefined : STANDARD_ATOMIC_WEIGHTS[key];
}
