/**
 * The one LaTeX notation of every LaTeX output (`derive --latex`, `derive --surface --latex`, `table --latex` and
 * `table --surface --latex`): D_7^{(a)} is the dipole coefficient of centre A (mu_{a,z} ≈ D_7^{(a)}/R^7), D_7 their
 * sum; in front of a surface E(Z) ≈ −C_3/Z^3 − C_5/Z^5 and mu_z ≈ D_{4}/Z^4 (z from the surface to the atom).
 */
export const LATEX_NAME = {
  C3: 'C_3',
  C5: 'C_5',
  D4: 'D_{4}',
  C6: 'C_6',
  C8: 'C_8',
  C10: 'C_{10}',
  'D7.a': 'D_{7}^{(a)}',
  'D7.b': 'D_{7}^{(b)}',
  'D7.total': 'D_{7}',
  'D9.a': 'D_{9}^{(a)}',
  'D9.b': 'D_{9}^{(b)}',
  'D9.total': 'D_{9}',
  'mu.a': '\\mu_{a,z}(R)',
  'mu.b': '\\mu_{b,z}(R)',
  'mu.total': '\\mu_{z}(R)',
} as const;
