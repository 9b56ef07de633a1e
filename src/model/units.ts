/**
 * Unit conversions. Everything inside dispole is in atomic units (hbar = e = m_e = 4πε0 = 1);
 * conversion happens only here and at the CLI edge.
 *
 * Constants: CODATA 2018 recommended values (E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor,
 * Rev. Mod. Phys. 93, 025010 (2021)). The debye is defined as 1e-21/c C·m (common practice).
 */

/** Speed of light in vacuum, m/s (exact). */
export const SPEED_OF_LIGHT = 299_792_458;
/** Elementary charge, C (exact since 2019). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;
/** Bohr radius a0, m (CODATA 2018). */
export const BOHR_IN_METRE = 0.529177210903e-10;
/** Hartree energy Eh, J (CODATA 2018). */
export const HARTREE_IN_JOULE = 4.3597447222071e-18;
/** Hartree energy in eV (CODATA 2018). */
export const HARTREE_IN_EV = 27.211386245988;
/** Hartree energy in cm^-1 (CODATA 2018: 2 R∞ = 219474.6313632 cm^-1). */
export const HARTREE_IN_WAVENUMBER = 219474.6313632;
/** Ångström, m (exact). */
export const ANGSTROM_IN_METRE = 1e-10;
/** Bohr radius in ångström. */
export const BOHR_IN_ANGSTROM = BOHR_IN_METRE / ANGSTROM_IN_METRE;
/** Atomic unit of electric dipole moment e·a0, C·m (CODATA 2018: 8.478 353 6255e-30). */
export const DIPOLE_AU_IN_COULOMB_METRE = ELEMENTARY_CHARGE * BOHR_IN_METRE;
/** Debye, C·m: 1e-21 / c (common practice). */
export const DEBYE_IN_COULOMB_METRE = 1e-21 / SPEED_OF_LIGHT;
/** Atomic unit of dipole moment in debye (≈ 2.541746). */
export const DIPOLE_AU_IN_DEBYE = DIPOLE_AU_IN_COULOMB_METRE / DEBYE_IN_COULOMB_METRE;

/** Boltzmann constant, J/K (exact since 2019). */
export const BOLTZMANN_IN_JOULE_PER_KELVIN = 1.380649e-23;
/** Boltzmann constant in Eh/K (k_B / Eh ≈ 3.166 811 563e-6, CODATA 2018). */
export const BOLTZMANN_IN_HARTREE_PER_KELVIN = BOLTZMANN_IN_JOULE_PER_KELVIN / HARTREE_IN_JOULE;
/** Atomic mass constant u in electron masses (CODATA 2018: m_u/m_e = 1822.888 486 209). */
export const DALTON_IN_ELECTRON_MASS = 1822.888486209;
/** Inverse fine-structure constant 1/alpha = c in atomic units (CODATA 2018: 137.035 999 084). */
export const SPEED_OF_LIGHT_AU = 137.035999084;
/** Loschmidt constant n0 at 273.15 K and 101.325 kPa, m^-3 (CODATA 2018: 2.686 780 111e25): one amagat. */
export const AMAGAT_PER_CUBIC_METRE = 2.686780111e25;
/** One amagat in bohr^-3. */
export const AMAGAT_IN_PER_BOHR3 = AMAGAT_PER_CUBIC_METRE * BOHR_IN_METRE ** 3;
/** Bohr radius in cm. */
export const BOHR_IN_CENTIMETRE = BOHR_IN_METRE * 100;

/** Length: bohr → ångström. */
export const bohrToAngstrom = (r: number): number => r * BOHR_IN_ANGSTROM;
/** Length: ångström → bohr. */
export const angstromToBohr = (r: number): number => r / BOHR_IN_ANGSTROM;
/** Dipole: e·a0 → debye. */
export const dipoleAuToDebye = (mu: number): number => mu * DIPOLE_AU_IN_DEBYE;

/**
 * C_n in Eh·a0^n → J·m^n.
 * @param n the power of 1/R (6, 8, 10 …)
 */
export function dispersionAuToSI(value: number, n: number): number {
  return value * HARTREE_IN_JOULE * BOHR_IN_METRE ** n;
}

/**
 * Dipole coefficient D_n in e·a0·a0^n (so that mu = D_n / R^n) → C·m·m^n.
 * @param n the power of 1/R (7 for the dispersion dipole)
 */
export function dipoleCoefficientAuToSI(value: number, n: number): number {
  return value * DIPOLE_AU_IN_COULOMB_METRE * BOHR_IN_METRE ** n;
}

/** Dipole coefficient D_n in e·a0^(n+1) → debye·Å^n. */
export function dipoleCoefficientAuToDebyeAngstrom(value: number, n: number): number {
  return value * DIPOLE_AU_IN_DEBYE * BOHR_IN_ANGSTROM ** n;
}

/** Hartree energy in kelvin, Eh/k_B (CODATA 2018: 3.1577502480407e5 K). */
export const HARTREE_IN_KELVIN = 1 / BOLTZMANN_IN_HARTREE_PER_KELVIN;
/** Hartree energy in kJ/mol, Eh·N_A (CODATA 2018: 2625.4996394799 kJ/mol). */
export const HARTREE_IN_KJ_PER_MOL = 2625.4996394799;

/** Energy units a spectroscopist reads, for SI output (`--energy-unit`). */
export const ENERGY_UNITS = ['cm-1', 'K', 'meV', 'kJ/mol'] as const;
export type EnergyUnit = (typeof ENERGY_UNITS)[number];

/** Energy: hartree → `unit` (CODATA 2018 factors above). */
export function energyFromHartree(value: number, unit: EnergyUnit): number {
  const factor = { 'cm-1': HARTREE_IN_WAVENUMBER, K: HARTREE_IN_KELVIN, meV: 1000 * HARTREE_IN_EV, 'kJ/mol': HARTREE_IN_KJ_PER_MOL }[unit];
  return value * factor;
}

/** Printed name of an energy unit (`cm^-1` …). */
export const energyUnitText = (unit: EnergyUnit): string => (unit === 'cm-1' ? 'cm^-1' : unit);
