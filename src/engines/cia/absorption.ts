/**
 * From the line shape S(ω) (per n1 n2) to the absorption coefficient and the integrated band strengths.
 * Absorption coefficient of the pairs (golden rule for the dipole autocorrelation; Gaussian-type atomic units):
 *   α(ω) = (4π²/3ħc) n1 n2 ω (1 − e^(−βħω)) S(ω)
 * (L. Frommhold, Collision-induced Absorption in Gases, Cambridge University Press (1993), ch. 2 and 5; derived
 * here in this normalisation of S, ∫ S dω = M0). With ν̃ = ω/(2πc) the wavenumber, the band integrals are
 *   γ1 = (1/n1n2) ∫_0^∞ α(ν̃) / [ν̃ tanh(hcν̃/2kT)] dν̃ = (4π²/3ħc) M0
 *   α1 = (1/n1n2) ∫_0^∞ α(ν̃) dν̃                      = (2π/3ħc²) M1
 * (derived here: detailed balance S(−ω) = e^(−βħω) S(ω) turns (1 − e^(−x))/tanh(x/2) = 1 + e^(−x) on ω > 0 into
 * ∫ S over all ω, and ω(1 − e^(−x)) into ∫ ω S; these are the zeroth (tanh-weighted) and first moments of the
 * spectral-moment analyses of J. D. Poll, J. Van Kranendonk, Can. J. Phys. 39, 189 (1961) and Frommhold (1993);
 * the definitions are stated in every output).
 * Units: α in cm^-1, n in amagat (Loschmidt constant, CODATA 2018), so γ1 in cm^-1 amagat^-2 and α1 in
 * cm^-2 amagat^-2.
 */
import { AMAGAT_IN_PER_BOHR3, BOHR_IN_CENTIMETRE, SPEED_OF_LIGHT_AU } from '../../model/units.js';

const C = SPEED_OF_LIGHT_AU;
const N0 = AMAGAT_IN_PER_BOHR3;

/** The definitions, quoted in reports. */
export const BAND_INTEGRAL_DEFINITIONS = {
  gamma1: 'γ1 = (1/n1n2) ∫ α(ν̃)/[ν̃ tanh(hcν̃/2kT)] dν̃ = (4π²/3ħc) M0',
  alpha1: 'α1 = (1/n1n2) ∫ α(ν̃) dν̃ = (2π/3ħc²) M1',
} as const;

/** α(ω)/(n1 n2) in cm^-1 amagat^-2 from S(ω) (e²·a0^5 per Eh/ħ) at ω (Eh/ħ) and kT (Eh). */
export function absorptionPerAmagat2(omega: number, S: number, kT: number): number {
  const au = ((4 * Math.PI * Math.PI) / (3 * C)) * omega * -Math.expm1(-omega / kT) * S; // a0^5
  return (au * N0 * N0) / BOHR_IN_CENTIMETRE;
}

/** α1 (cm^-2 amagat^-2) from M1 (e²·a0^5·Eh/ħ). */
export function alpha1FromM1(M1: number): number {
  const au = ((2 * Math.PI) / (3 * C * C)) * M1; // a0^4
  return (au * N0 * N0) / (BOHR_IN_CENTIMETRE * BOHR_IN_CENTIMETRE);
}

/** γ1 (cm^-1 amagat^-2) from M0 (e²·a0^5). */
export function gamma1FromM0(M0: number): number {
  return (((4 * Math.PI * Math.PI) / (3 * C)) * M0 * N0 * N0) / BOHR_IN_CENTIMETRE;
}
