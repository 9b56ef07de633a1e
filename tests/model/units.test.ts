import { describe, expect, test } from 'vitest';
import {
  BOHR_IN_ANGSTROM,
  DEBYE_IN_COULOMB_METRE,
  DIPOLE_AU_IN_COULOMB_METRE,
  DIPOLE_AU_IN_DEBYE,
  HARTREE_IN_EV,
  HARTREE_IN_JOULE,
  angstromToBohr,
  bohrToAngstrom,
  dipoleCoefficientAuToDebyeAngstrom,
  dipoleCoefficientAuToSI,
  dispersionAuToSI,
} from '../../src/model/units.js';
import { expectClose } from '../helpers/tolerance.js';

// Reference values: CODATA 2018 recommended values, E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor,
// Rev. Mod. Phys. 93, 025010 (2021) (NIST Reference on Constants).
describe('CODATA 2018 conversions', () => {
  test('bohr radius is 0.529177210903 Å', () => {
    expectClose(BOHR_IN_ANGSTROM, 0.529177210903, 1e-15);
  });
  test('hartree is 4.3597447222071e-18 J and 27.211386245988 eV', () => {
    expectClose(HARTREE_IN_JOULE, 4.3597447222071e-18, 1e-15);
    expectClose(HARTREE_IN_EV, 27.211386245988, 1e-15);
    // consistency with the exact elementary charge: Eh/e in volts
    expectClose(HARTREE_IN_JOULE / 1.602176634e-19, 27.211386245988, 1e-12);
  });
  test('atomic unit of electric dipole moment is 8.4783536255e-30 C m', () => {
    expectClose(DIPOLE_AU_IN_COULOMB_METRE, 8.4783536255e-30, 1e-10);
  });
  test('e a0 is 2.541746473 debye (debye = 1e-21/c C m, common practice)', () => {
    expectClose(DEBYE_IN_COULOMB_METRE, 3.33564095198152e-30, 1e-13);
    expectClose(DIPOLE_AU_IN_DEBYE, 2.541746473, 1e-9);
  });
  test('length conversions are inverse to each other', () => {
    expectClose(angstromToBohr(bohrToAngstrom(3.7)), 3.7, 1e-15);
    expectClose(angstromToBohr(1), 1.8897261246257702, 1e-12);
  });
  test('coefficient conversions carry the right powers of length', () => {
    // C6 of 1 Eh a0^6 in J m^6 = Eh * a0^6
    expectClose(dispersionAuToSI(1, 6), 4.3597447222071e-18 * 0.529177210903e-10 ** 6, 1e-14);
    expectClose(dipoleCoefficientAuToSI(1, 7), 8.4783536255e-30 * 0.529177210903e-10 ** 7, 1e-9);
    expectClose(dipoleCoefficientAuToDebyeAngstrom(1, 7), 2.541746473 * 0.529177210903 ** 7, 1e-9);
    expect(dispersionAuToSI(-2, 8)).toBeLessThan(0);
  });
});
