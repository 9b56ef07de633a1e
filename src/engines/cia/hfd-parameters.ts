/**
 * Published HFD ("Hartree–Fock dispersion") potentials in the reduced form of R. A. Aziz and co-workers,
 *   V(R) = ε V*(x),  x = R / rm,
 *   V*(x) = A* exp(−α* x + β* x²) − F(x) Σ_{j=3,4,5} c_{2j} / x^{2j},
 *   F(x) = exp(−(D/x − 1)²) for x < D, else 1.
 * Each set names its source. The reduced parameters of both sets were compared with independent public
 * copies of the published tables; the papers themselves were not re-read here.
 */
export interface HfdParameters {
  /** Pair label, e.g. "He-He". */
  pair: string;
  /** Well depth ε in kelvin. */
  epsilonK: number;
  /** Position of the minimum rm in ångström. */
  rmAngstrom: number;
  Astar: number;
  alphaStar: number;
  betaStar: number;
  c6: number;
  c8: number;
  c10: number;
  D: number;
  source: string;
}

/** The built-in sets, by name (the name used in --potential hfd:NAME). */
export const HFD_SETS: Readonly<Record<string, HfdParameters>> = {
  'He-He': {
    pair: 'He-He',
    epsilonK: 10.948,
    rmAngstrom: 2.963,
    Astar: 1.8443101e5,
    alphaStar: 10.43329537,
    betaStar: -2.27965105,
    c6: 1.36745214,
    c8: 0.42123807,
    c10: 0.17473318,
    D: 1.4826,
    source: 'HFD-B(He): R. A. Aziz, F. R. W. McCourt, C. C. K. Wong, Mol. Phys. 61, 1487 (1987)',
  },
  'Ar-Ar': {
    pair: 'Ar-Ar',
    epsilonK: 143.25,
    rmAngstrom: 3.761,
    Astar: 1.13211845e5,
    alphaStar: 9.00053441,
    betaStar: -2.60270226,
    c6: 1.09971113,
    c8: 0.54511632,
    c10: 0.39278653,
    D: 1.04,
    source:
      'HFD-B type Ar-Ar potential, R. A. Aziz, J. Chem. Phys. 92, 1030 (1990) (ε/k = 143.25 K, rm = 3.761 Å; reduced parameters of the HFD-B2 form of R. A. Aziz, M. J. Slaman, Mol. Phys. 58, 679 (1986); as carried by public copies)',
  },
};
