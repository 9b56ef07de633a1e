/**
 * The shape in which first-principles response functions of an atom or ion are stored and shipped
 * (src/data/), so the species built from them need no self-consistent field at run time. Atomic units.
 *
 * B follows Buckingham's convention (the energy in a field F and field gradient F' contains
 * −(1/6) B_{ab,cd} F_a F_b F'_cd); for a spherical atom B = B_zz,zz, and B(iu) below is B(0; iu, −iu).
 */
export interface FirstPrinciplesResponse {
  /** Element symbol, e.g. "Ar". */
  symbol: string;
  /** Nuclear charge. */
  Z: number;
  /** Net charge (0 for atoms, +1 for Na+ …). */
  charge: number;
  /** Electron number Z − charge. */
  electrons: number;
  /** Level of theory in words, e.g. "time-dependent (coupled) Hartree–Fock". */
  level: string;
  /** The basis in words (kind, size, exponents or knots), as the report states it. */
  basis: string;
  /** Hartree–Fock total energy of the ground state, Eh. */
  energy: number;
  /** Imaginary frequencies u, Eh, strictly increasing from 0. */
  u: number[];
  /** Dipole polarisability alpha_1(iu), a0³. */
  alpha1: number[];
  /** Quadrupole polarisability alpha_2(iu), a0⁵. */
  alpha2: number[];
  /** Octupole polarisability alpha_3(iu), a0⁷. */
  alpha3: number[];
  /** Dipole–dipole–quadrupole hyperpolarisability B(0; iu, −iu), e³a0⁴/Eh² (atomic units). */
  B: number[];
  /** Convergence record: how the numbers were checked (basis sequence, residuals), in words. */
  convergence: string;
}
