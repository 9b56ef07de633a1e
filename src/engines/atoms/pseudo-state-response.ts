/**
 * Response functions of a one-electron atom (spherical ground state 1s) from its radial pseudo-spectrum, as sums
 * over pseudo-states with radial integrals R^(k)_{n'l',nl} = <n'l'|r^k|nl> and the Legendre factors
 * c(l', L, l) = <l'0|P_L(cos θ)|l0>. Only m = 0 states enter (every operator below is axial). Atomic units.
 *
 * Multipole polarisabilities (2^l-pole convention of response-model.ts, Q_l0 = −r^l P_l):
 *   alpha_l(iu) = (2/(2l+1)) Σ_n ω_n (R^(l)_{nl,1s})² / (ω_n² + u²)        (common practice)
 *
 * Dipole–dipole–quadrupole response with the static dipole as output (derived here). With χ_PQ(iu) the linear
 * response of <P> to H' = −f Q at frequency iu, and a static field F along z (H → H − F M_z),
 *   B(0; iu, −iu) = ∂χ_{M_z, Q_20}(iu)/∂F |_{F=0},
 * which is Buckingham's B at u = 0 (the field-gradient coupling is −½ g Q_20 for an axial gradient g) and
 * equals B w²/(w² + u²) for a QDO (checked in the tests). Differentiating
 * χ_PQ = <0|P R(iu) Q|0> + <0|Q R(−iu) P|0>, R(z) = Q0 (H − E0 + z)^-1 Q0, at F = 0 for a centrosymmetric
 * ground state (no permanent dipole, no permanent quadrupole) gives, with ω's the excitation energies,
 *   B(0; iu, −iu) = 2 Re[T1 + T2 + T3](iu),
 *   T1(z) = Σ_{k∈p, n∈d} (μ_0k/ω_k) μ_kn Q_n0 / (ω_n + z)          (first-order ground state on the left)
 *   T2(z) = Σ_{n∈p, k∈p} μ_0n Q_nk (μ_k0/ω_k) / (ω_n + z)          (first-order ground state on the right)
 *   T3(z) = Σ_{n∈p, k∈d} μ_0n μ_nk Q_k0 / ((ω_n + z)(ω_k + z))     (field acting between the two excitations)
 * with μ = M_z = −r cos θ, Q = Q_20, p/d the l = 1/l = 2 pseudo-states. No energy differences ω_n − ω_k appear,
 * so near-degenerate pseudo-states are harmless.
 *
 * Static hyperpolarisabilities by Rayleigh–Schrödinger perturbation theory in the field, V = z (H = H0 + F z):
 *   ψ1 = −R0 V|0>,  E2 = <0|V|ψ1>,  E4 = −<ψ1|V R0 V|ψ1> − E2 <ψ1|ψ1>,  gamma = −24 E4
 * (E = E0 − alpha F²/2 − gamma F⁴/24; Wigner's 2n+1 rule, e.g. Hirschfelder, Brown & Epstein, Adv. Quantum Chem. 1,
 * 255 (1964)).
 */
import type { IsotropicResponse } from '../response/response-model.js';
import { legendreCoupling } from './angular.js';
import type { RadialPseudoSpectrum } from './sturmian-spectrum.js';

/** Oscillator lines of one response function: alpha(iu) = Σ_i g_i / (ω_i² + u²). */
export interface OscillatorLines {
  omega: Float64Array;
  /** Strengths g_i (for the dipole, g_i = f_i, the oscillator strengths). */
  g: Float64Array;
}

/** Lines of the 2^l-pole polarisability of the ground state. */
export function multipoleLines(s: RadialPseudoSpectrum, l: number): OscillatorLines {
  const { size } = s;
  const R = s.radial(l, 0, l);
  const e0 = s.energies[0][0];
  const omega = new Float64Array(size), g = new Float64Array(size);
  for (let n = 0; n < size; n++) {
    omega[n] = s.energies[l][n] - e0;
    const r = R[n * size];
    g[n] = (2 / (2 * l + 1)) * omega[n] * r * r;
  }
  return { omega, g };
}

/** Σ_i g_i / (ω_i² + u²). */
export function evaluateLines(lines: OscillatorLines, u: number): number {
  const u2 = u * u;
  let s = 0;
  for (let i = 0; i < lines.omega.length; i++) s += lines.g[i] / (lines.omega[i] * lines.omega[i] + u2);
  return s;
}

/** ∫_0^∞ a(iu) b(iu) du in closed form: Σ_ij g_i g'_j π / (2 ω_i ω_j (ω_i + ω_j)). */
export function linesProductIntegral(a: OscillatorLines, b: OscillatorLines): number {
  let s = 0;
  for (let i = 0; i < a.omega.length; i++)
    for (let j = 0; j < b.omega.length; j++) {
      const wi = a.omega[i], wj = b.omega[j];
      s += (a.g[i] * b.g[j]) / (wi * wj * (wi + wj));
    }
  return (Math.PI / 2) * s;
}

/** The pieces of B(0; iu, −iu) as sums over l = 1 (p) and l = 2 (d) pseudo-states. */
interface HyperBTerms {
  wp: Float64Array;
  wd: Float64Array;
  /** coefficient of ω_n/(ω_n² + u²) for n ∈ d (from T1) */
  a1: Float64Array;
  /** coefficient of ω_n/(ω_n² + u²) for n ∈ p (from T2) */
  a2: Float64Array;
  /** c[n·size + k], n ∈ p, k ∈ d (from T3) */
  c3: Float64Array;
  /** Scratch for 1/(ω_dk² + u²) (one evaluation at a time; JavaScript runs them one after another). */
  dd: Float64Array;
}

function hyperBTerms(s: RadialPseudoSpectrum): HyperBTerms {
  const { size } = s;
  const e0 = s.energies[0][0];
  const wp = Float64Array.from(s.energies[1], (e) => e - e0);
  const wd = Float64Array.from(s.energies[2], (e) => e - e0);
  const R10 = s.radial(1, 0, 1), R12 = s.radial(1, 2, 1), R20 = s.radial(2, 0, 2), R11 = s.radial(1, 1, 2);
  const c110 = legendreCoupling(1, 1, 0), c112 = legendreCoupling(1, 1, 2), c220 = legendreCoupling(2, 2, 0), c121 = legendreCoupling(1, 2, 1);
  // matrix elements of μ = −r cos θ and Q = −r² P2 between m = 0 states
  const mu0p = Float64Array.from({ length: size }, (_, k) => -R10[k * size] * c110); // <k p|μ|1s>
  const mupd = (k: number, n: number) => -R12[k * size + n] * c112; // <k p|μ|n d>
  const Qd0 = Float64Array.from({ length: size }, (_, n) => -R20[n * size] * c220); // <n d|Q|1s>
  const Qpp = (n: number, k: number) => -R11[n * size + k] * c121; // <n p|Q|k p>
  const a1 = new Float64Array(size), a2 = new Float64Array(size), c3 = new Float64Array(size * size);
  for (let n = 0; n < size; n++) {
    let s1 = 0;
    for (let k = 0; k < size; k++) s1 += (mu0p[k] / wp[k]) * mupd(k, n);
    a1[n] = s1 * Qd0[n];
    let s2 = 0;
    for (let k = 0; k < size; k++) s2 += Qpp(n, k) * (mu0p[k] / wp[k]);
    a2[n] = mu0p[n] * s2;
    for (let k = 0; k < size; k++) c3[n * size + k] = mu0p[n] * mupd(n, k) * Qd0[k];
  }
  return { wp, wd, a1, a2, c3, dd: new Float64Array(size) };
}

/** B(0; iu, −iu) from its terms: 2 Re[T1 + T2 + T3](iu). */
function evaluateHyperB(t: HyperBTerms, u: number): number {
  const u2 = u * u;
  const size = t.wp.length;
  const dd = t.dd;
  for (let k = 0; k < size; k++) dd[k] = 1 / (t.wd[k] * t.wd[k] + u2);
  let s = 0;
  for (let n = 0; n < size; n++) {
    s += (t.a1[n] * t.wd[n]) * dd[n];
    const pn = 1 / (t.wp[n] * t.wp[n] + u2);
    s += t.a2[n] * t.wp[n] * pn;
    let row = 0;
    for (let k = 0; k < size; k++) row += t.c3[n * size + k] * (t.wp[n] * t.wd[k] - u2) * dd[k];
    s += row * pn;
  }
  return 2 * s;
}

/**
 * ∫_0^∞ B(0; iu, −iu) alpha(iu) du in closed form, for B from these terms and alpha = Σ_i g_i/(ω_i² + u²) (derived
 * here): with ∫_0^∞ du/((a² + u²)(c² + u²)) = π/(2ac(a + c)) and ∫_0^∞ (ab − u²) du/((a² + u²)(b² + u²)(c² + u²)) =
 * π/(2c(a + c)(b + c)) (partial fractions),
 *   ∫ B alpha du = π Σ_i (g_i/ω_i) [Σ_n a1_n/(ω_dn + ω_i) + Σ_n a2_n/(ω_pn + ω_i) + Σ_nk c3_nk/((ω_pn + ω_i)(ω_dk + ω_i))].
 */
function hyperBLinesIntegral(t: HyperBTerms, lines: OscillatorLines): number {
  const size = t.wp.length;
  let total = 0;
  for (let i = 0; i < lines.omega.length; i++) {
    const w = lines.omega[i];
    let s = 0;
    for (let n = 0; n < size; n++) {
      s += t.a1[n] / (t.wd[n] + w) + t.a2[n] / (t.wp[n] + w);
      let row = 0;
      for (let k = 0; k < size; k++) row += t.c3[n * size + k] / (t.wd[k] + w);
      s += row / (t.wp[n] + w);
    }
    total += (lines.g[i] / w) * s;
  }
  return Math.PI * total;
}

/** Static second hyperpolarisability gamma (Wigner 2n+1 chain, see the module comment), e⁴a0⁴/Eh³. */
function secondHyperpolarisability(s: RadialPseudoSpectrum): number {
  const { size } = s;
  const e0 = s.energies[0][0];
  const c110 = legendreCoupling(1, 1, 0), c011 = legendreCoupling(0, 1, 1), c211 = legendreCoupling(2, 1, 1);
  const R10 = s.radial(1, 0, 1), R01 = s.radial(0, 1, 1), R21 = s.radial(2, 1, 1);
  const psi1 = Float64Array.from({ length: size }, (_, k) => -(R10[k * size] * c110) / (s.energies[1][k] - e0));
  let E2 = 0, norm = 0;
  for (let k = 0; k < size; k++) {
    E2 += R10[k * size] * c110 * psi1[k];
    norm += psi1[k] * psi1[k];
  }
  let vr0v = 0;
  for (const [lp, R, c] of [[0, R01, c011], [2, R21, c211]] as const)
    for (let n = 0; n < size; n++) {
      if (lp === 0 && n === 0) continue; // R0 removes the ground state
      let v = 0;
      for (let k = 0; k < size; k++) v += R[n * size + k] * c * psi1[k];
      vr0v += (v * v) / (s.energies[lp][n] - e0);
    }
  const E4 = -vr0v - E2 * norm;
  return -24 * E4;
}

/** Static response properties of the pseudo-spectrum atom (atomic units). */
export interface StaticAtomProperties {
  /** Dipole, quadrupole, octupole polarisabilities alpha_1, alpha_2, alpha_3. */
  alpha: [number, number, number];
  /** Buckingham B = B_zz,zz. */
  B: number;
  /** Second hyperpolarisability gamma = gamma_zzzz. */
  gamma: number;
}

const responseCache = new WeakMap<RadialPseudoSpectrum, IsotropicResponse & { statics: StaticAtomProperties; lines: OscillatorLines[] }>();
const termsOf = new WeakMap<IsotropicResponse, HyperBTerms>();

/**
 * D7.a of the like pair of a pseudo-state response ({@link pseudoStateResponse}), (9/π) ∫ B(0; iu, −iu) alpha_1(iu) du
 * (the response route's formula, isotropic-kernel.ts), as the closed-form sum of hyperBLinesIntegral: no quadrature.
 */
export function likePairD7a(r: IsotropicResponse & { lines: OscillatorLines[] }): number {
  const terms = termsOf.get(r);
  if (!terms) throw new Error('likePairD7a needs a response made by pseudoStateResponse');
  return (9 / Math.PI) * hyperBLinesIntegral(terms, r.lines[0]);
}

/** The isotropic response functions of a one-electron atom (lMax ≥ 3 needed for alpha_3). */
export function pseudoStateResponse(s: RadialPseudoSpectrum): IsotropicResponse & { statics: StaticAtomProperties; lines: OscillatorLines[] } {
  const hit = responseCache.get(s);
  if (hit) return hit;
  if (s.lMax < 3) throw new RangeError('pseudo-state response needs lMax ≥ 3 (octupole polarisability)');
  const lines = [1, 2, 3].map((l) => multipoleLines(s, l));
  const terms = hyperBTerms(s);
  let statics: StaticAtomProperties | undefined;
  // the last frequency's values are kept: a like pair's quadrature asks for each one twice (once per centre)
  const lastU = [NaN, NaN, NaN, NaN], lastValue = [0, 0, 0, 0];
  const remembered = (slot: number, u: number, evaluate: () => number): number => {
    if (lastU[slot] !== u) {
      lastValue[slot] = evaluate();
      lastU[slot] = u;
    }
    return lastValue[slot];
  };
  const r = {
    alpha: (l: 1 | 2 | 3, u: number) => (l === 1 || l === 2 || l === 3 ? remembered(l, u, () => evaluateLines(lines[l - 1], u)) : evaluateLines(lines[l - 1], u)),
    hyperB: (u: number) => remembered(0, u, () => evaluateHyperB(terms, u)),
    scale: lines[0].omega[0],
    lines,
    /** Computed on first use (no route needs them). */
    get statics(): StaticAtomProperties {
      return (statics ??= {
        alpha: lines.map((L) => evaluateLines(L, 0)) as [number, number, number],
        B: evaluateHyperB(terms, 0),
        gamma: secondHyperpolarisability(s),
      });
    },
  };
  responseCache.set(s, r);
  termsOf.set(r, terms);
  return r;
}
