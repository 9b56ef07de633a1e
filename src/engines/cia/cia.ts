/**
 * Collision-induced absorption of an unlike pair: spectral moments by the classical (with Wigner–Kirkwood
 * correction) and the quantum (Slater sum) routes, and the quantum line shape with the absorption coefficient.
 * Pure function on plain data; atomic units inside, kelvin and cm^-1 only at this edge.
 */
import { InputError } from '../../model/errors.js';
import { BOLTZMANN_IN_HARTREE_PER_KELVIN, DALTON_IN_ELECTRON_MASS, HARTREE_IN_WAVENUMBER } from '../../model/units.js';
import { absorptionPerAmagat2, alpha1FromM1, gamma1FromM0 } from './absorption.js';
import { classicalMoments, type ClassicalMoments } from './classical-moments.js';
import { buildDipole, type DipoleContext, type DipoleFunction, type DipoleSpec } from './dipole.js';
import { lineShape } from './line-shape.js';
import { buildPotential, wallPoint, type PairPotential, type PotentialSpec } from './potential.js';
import { radialGrid, type RadialGrid } from './radial-solver.js';
import { dipoleOnGrid, slaterSumMoments } from './slater-sum.js';

/** The sign convention stated in every output. */
export const CIA_DIPOLE_CONVENTION = 'mu(R) along +z with A at the origin and B at +R on z (positive: pointing from A to B)';

/** Numerical settings; the defaults aim at ~1e-6 relative in the moments. */
export interface CiaNumerics {
  /** Numerov step × the largest local wavenumber. Default 0.1. */
  stepFactor: number;
  /** Continuum energies up to this many kT (moments). Default 40. */
  energyCutKT: number;
  /** Partial-wave stopping threshold. Default 1e-7. */
  pwTol: number;
  /** Relative error target per partial-wave energy integral (scaled by the running totals; the Numerov normalisation noise is ~1e-7). Default 1e-5. */
  relTol: number;
  /**
   * Continuum matching radius: where |V| falls below this × the lowest kT. Matching to free waves where V is
   * still felt misnormalises the slow continuum waves by O(V/E); 1e-4 leaves ~1e-4 relative in the quantum M0
   * of deep wells (1e-6: ~2e-5, at twice the grid). Default 1e-4.
   */
  matchPotentialKT: number;
  /** Largest partial wave; reaching it flags the result unconverged. Default 4000. */
  maxPartialWaves: number;
  /** Line shape: energy-integral panels × Gauss–Legendre nodes, and energy cut in kT. */
  spectrumPanels: number;
  spectrumNodes: number;
  spectrumEnergyCutKT: number;
}

export const DEFAULT_CIA_NUMERICS: CiaNumerics = {
  stepFactor: 0.1,
  energyCutKT: 40,
  pwTol: 1e-7,
  relTol: 1e-5,
  matchPotentialKT: 1e-4,
  maxPartialWaves: 4000,
  spectrumPanels: 4,
  spectrumNodes: 5,
  spectrumEnergyCutKT: 24,
};

export interface CiaInput {
  names: [string, string];
  /** Atomic masses in u, and where they come from. */
  masses: [number, number];
  massSource: string;
  potential: PotentialSpec;
  dipole: DipoleSpec;
  dipoleContext: DipoleContext;
  /** Temperatures in kelvin. */
  temperatures: readonly number[];
  /** Wavenumber grid of the spectrum, cm^-1 (from ≥ 0). */
  spectrum?: { from: number; to: number; step: number };
  numerics?: Partial<CiaNumerics>;
  onProgress?: (done: number, total: number) => void;
}

export interface CiaSpectrum {
  /** Wavenumbers (cm^-1). */
  wavenumber: number[];
  /** S(ω) per n1 n2 in e²·a0^5 per (Eh/ħ); its parts. */
  S: number[];
  freeFree: number[];
  boundFree: number[];
  boundBound: number[];
  /** α(ν̃)/(n1 n2) in cm^-1 amagat^-2. */
  absorption: number[];
  /** ∫ S dω and ∫ ω S dω over all ω (negative side by detailed balance), trapezoid over the grid. */
  M0: number;
  M1: number;
  /** Relative residuals against the quantum moments: (spectrum − moment)/moment. */
  residualM0: number;
  residualM1: number;
  /** γ1 from the spectrum's M0; α1 integrated from the computed absorption coefficient over ν̃. */
  gamma1: number;
  alpha1: number;
}

export interface CiaTemperature {
  T: number;
  /** Quantum M0 and M1; M2 classical. e²·a0^5, e²·a0^5·Eh/ħ, e²·a0^5·(Eh/ħ)². */
  M0: number;
  M1: number;
  M2: number;
  /** cm^-1 amagat^-2 and cm^-2 amagat^-2, from the quantum M0 and M1 (definitions in absorption.ts). */
  gamma1: number;
  alpha1: number;
  classical: ClassicalMoments;
  wignerKirkwood: { M0: number; M1: number };
  quantum: { M0: number; M1: number; M0bound: number; partialWaves: number; converged: boolean };
  /** Relative differences to the quantum values: (x − quantum)/quantum. */
  difference: { classicalM0: number; classicalM1: number; wignerKirkwoodM0: number; wignerKirkwoodM1: number };
  spectrum?: CiaSpectrum;
}

export interface CiaResult {
  pair: { A: string; B: string; masses: [number, number]; reducedMass: number; massSource: string };
  potential: { label: string; basis: string; well?: { R: number; depth: number; depthK: number } };
  dipole: { label: string; basis: string; convention: string; D7?: number; D9?: number };
  temperatures: CiaTemperature[];
  grid: { from: number; dipoleEnd: number; match: number; to: number; step: number; points: number; boundLevels: Array<{ l: number; E: number }> };
  /** Curves for figures: R (bohr), V (Eh), mu (e·a0). */
  curves: { R: number[]; V: number[]; mu: number[] };
  trusted: boolean;
  warnings: string[];
}

/** Find the R beyond which the dipole's contribution is negligible: 4π mu² R³ e^(−βV) < tol × scale. */
function dipoleEnd(pot: PairPotential, dip: DipoleFunction, kT: number, from: number, scale: number, tol: number): number {
  const start = Math.max(from, pot.well?.R ?? from);
  let R = start;
  for (; R < 400; R += 0.1) {
    const [mu, mu1] = dip.evaluate(R);
    const g = Math.exp(-pot.derivatives(R)[0] / kT);
    const w = 4 * Math.PI * g * R * R * R * (mu * mu + R * R * mu1 * mu1);
    if (w < tol * scale && R > start + 1) break;
    if (R + 0.1 > dip.domain[1]) break;
  }
  return Math.min(R, dip.domain[1]);
}

/** Compute everything. Throws InputError on bad input. */
export function computeCia(input: CiaInput): CiaResult {
  const num: CiaNumerics = { ...DEFAULT_CIA_NUMERICS, ...input.numerics };
  input.temperatures.forEach((T, i) => {
    if (!(T > 0) || !Number.isFinite(T)) throw new InputError('--temperature', `must be a finite temperature > 0 K, got ${T}${input.temperatures.length > 1 ? ` (entry ${i + 1})` : ''}`);
  });
  if (input.temperatures.length === 0) throw new InputError('--temperature', 'give at least one temperature (K)');
  input.masses.forEach((m, i) => {
    if (!(m > 0) || !Number.isFinite(m)) throw new InputError('--masses', `${i === 0 ? 'MA' : 'MB'} must be a finite mass > 0 (u), got ${m}`);
  });
  const pot = buildPotential(input.potential);
  const dip = buildDipole(input.dipole, { ...input.dipoleContext, dampingRate: input.dipoleContext.dampingRate ?? pot.dampingRate });
  const mass = ((input.masses[0] * input.masses[1]) / (input.masses[0] + input.masses[1])) * DALTON_IN_ELECTRON_MASS;
  const kT = input.temperatures.map((T) => T * BOLTZMANN_IN_HARTREE_PER_KELVIN);
  const kTmax = Math.max(...kT), kTmin = Math.min(...kT);
  const warnings: string[] = [];

  // spectrum range
  let omegaMax = 0;
  if (input.spectrum) {
    const { from, to, step } = input.spectrum;
    const limit = (60 * kTmax * HARTREE_IN_WAVENUMBER);
    if (!(step > 0) || !Number.isFinite(step)) throw new InputError('--spectrum', `the step must be a finite wavenumber > 0 (cm^-1), got ${step}`);
    if (!(from >= 0) || !(to > from) || !(to <= limit)) {
      throw new InputError('--spectrum', `the range must satisfy 0 ≤ FROM < TO ≤ ${limit.toPrecision(4)} cm^-1 (60 kT at the highest temperature: the range the computation resolves), got ${from}:${to}`);
    }
    if ((to - from) / step > 20000) throw new InputError('--spectrum', `at most 20000 frequencies, got ${Math.floor((to - from) / step) + 1}`);
    omegaMax = to / HARTREE_IN_WAVENUMBER;
  }

  // ranges: classical wall at V = 60 kTmax; quantum wall above the highest energy solved
  const Etop = Math.max(num.energyCutKT * kTmax, input.spectrum ? num.spectrumEnergyCutKT * kTmax + omegaMax : 0);
  const classicalFrom = wallPoint(pot, 60 * kTmax);
  const quantumFrom = wallPoint(pot, Etop + 60 * kTmax);
  if (pot.spec.kind === 'table' && pot.derivatives(quantumFrom)[0] < Etop + 60 * kTmax) {
    throw new InputError(pot.spec.file, `the table does not reach high enough on the repulsive wall: V(${pot.minR} bohr) = ${pot.derivatives(pot.minR)[0]} Eh, needed ≥ ${(Etop + 60 * kTmax).toPrecision(3)} Eh at ${Math.max(...input.temperatures)} K; add points at smaller R`);
  }
  if (dip.domain[0] > quantumFrom) {
    throw new InputError(input.dipole.kind === 'table' ? input.dipole.file : '--dipole', `the dipole table does not cover the range: it starts at ${dip.domain[0]} bohr, the computation needs ${quantumFrom.toPrecision(4)} bohr (repulsive wall at ${Math.max(...input.temperatures)} K)`);
  }
  // scale of M0 for the dipole cut-off: a coarse classical estimate
  const coarseEnd = Math.min(dip.domain[1], Math.max(3 * (pot.well?.R ?? 5), 30));
  const coarse = classicalMoments(pot, dip, mass, [kTmax], classicalFrom, coarseEnd)[0].classical;
  const scale = coarse.M0 + (coarse.M2 * mass) / kTmax; // M0 plus the gradient integral 4π∫(mu′² + 2mu²/R²) g R² dR
  const Rdip = dipoleEnd(pot, dip, kTmin, classicalFrom, scale, 1e-8); // beyond: the classical tail (g_quantum → g_classical there)
  if (input.dipole.kind === 'table') {
    const [muEnd] = dip.evaluate(dip.domain[1]);
    const R = dip.domain[1];
    if (4 * Math.PI * muEnd * muEnd * R * R * R > 1e-6 * scale) {
      throw new InputError(input.dipole.file, `the dipole table does not cover the range: mu has not decayed at its last point (mu(${R} bohr) = ${muEnd} e·a0); extend it to larger R`);
    }
  }
  // matching radius: V negligible against the lowest kT
  let Rmatch = Rdip;
  while (Rmatch < 200 && Math.abs(pot.derivatives(Rmatch)[0]) > num.matchPotentialKT * kTmin) Rmatch += 0.5;
  Rmatch = Math.max(Rmatch, Rdip + 1);
  const Rfar = Rmatch * 1.5;
  const depth = pot.well?.depth ?? 0;
  const h = num.stepFactor / Math.sqrt(2 * mass * (Math.min(Etop, 20 * kTmax + omegaMax) + depth));
  const grid: RadialGrid = radialGrid((R) => pot.derivatives(R)[0], mass, quantumFrom, h, Rdip, Rmatch, Rfar);
  const onGrid = dipoleOnGrid(grid, (R) => dip.evaluate(R));

  // classical moments over the full range, and the tail beyond the dipole end for the quantum route
  const classicalTo = Math.min(dip.domain[1], Math.max(4 * Rdip, Rdip + 40));
  const cl = classicalMoments(pot, dip, mass, kT, classicalFrom, classicalTo);
  const tailEnd = classicalMoments(pot, dip, mass, kT, grid.R[grid.dipoleEnd], classicalTo);
  const tails = tailEnd.map((t): [number, number] => [t.classical.M0, t.classical.M1 * 2 * mass]);
  const q = slaterSumMoments(grid, onGrid, kT, tails, { Ecut: num.energyCutKT * kTmax, maxL: num.maxPartialWaves, pwTol: num.pwTol, relTol: num.relTol });
  if (!q.converged) warnings.push(`quantum route UNCONVERGED: ${q.reason}`);
  if (!cl.every((c) => c.converged)) warnings.push('classical R integral did not reach its tolerance');
  // Deep wells: bound pairs and orbiting resonances (narrow peaks in the energy integral) carry much of M0, and
  // an adaptive quadrature may miss peaks. Then repeat the quantum sums with a 100× tighter energy tolerance and
  // flag the result unconverged when M0 or M1 moves by more than 1e-3. Below a 5% bound share the repeat moved
  // the sums by < 1e-6 in our checks (He–Ar-like pair at 50 K, 2%; Quelon–Virid example at 160 K, 1.5%).
  const boundShare = Math.max(...q.moments.map((qm) => qm.M0bound / qm.M0));
  if (q.converged && boundShare > 0.05) {
    const tight = slaterSumMoments(grid, onGrid, kT, tails, { Ecut: num.energyCutKT * kTmax, maxL: num.maxPartialWaves, pwTol: num.pwTol / 10, relTol: num.relTol / 100 });
    const change = Math.max(...tight.moments.flatMap((tm, t) => [Math.abs(tm.M0 / q.moments[t].M0 - 1), Math.abs(tm.M1 / q.moments[t].M1 - 1)]));
    if (change > 1e-3) {
      q.converged = false;
      q.reason = `bound pairs carry ${(100 * boundShare).toFixed(0)}% of M0 and the quantum sums change by ${change.toExponential(1)} with a 100× tighter energy tolerance (orbiting resonances not resolved)`;
      warnings.push(`quantum route UNCONVERGED: ${q.reason}`);
    } else warnings.push(`bound pairs carry ${(100 * boundShare).toFixed(0)}% of the quantum M0; the sums were repeated with a 100× tighter tolerance and moved by ${change.toExponential(1)}`);
  }

  const temps: CiaTemperature[] = input.temperatures.map((T, t) => {
    const qm = q.moments[t];
    const c = cl[t];
    const rel = (x: number, ref: number) => (ref === 0 ? 0 : (x - ref) / ref);
    const out: CiaTemperature = {
      T,
      M0: qm.M0,
      M1: qm.M1,
      M2: c.classical.M2,
      gamma1: gamma1FromM0(qm.M0),
      alpha1: alpha1FromM1(qm.M1),
      classical: c.classical,
      wignerKirkwood: c.wignerKirkwood,
      quantum: { M0: qm.M0, M1: qm.M1, M0bound: qm.M0bound, partialWaves: q.lMax + 1, converged: q.converged },
      difference: {
        classicalM0: rel(c.classical.M0, qm.M0),
        classicalM1: rel(c.classical.M1, qm.M1),
        wignerKirkwoodM0: rel(c.wignerKirkwood.M0, qm.M0),
        wignerKirkwoodM1: rel(c.wignerKirkwood.M1, qm.M1),
      },
    };
    return out;
  });
  // the ħ² (Wigner–Kirkwood) term is the first of a semiclassical series: once it is not small against the quantum
  // value the series no longer holds (deep wells at low T, where bound pairs dominate); say so rather than let a
  // negative or huge corrected moment stand beside the quantum one without comment
  for (const tp of temps) {
    const off = Math.max(Math.abs(tp.difference.wignerKirkwoodM0), Math.abs(tp.difference.wignerKirkwoodM1));
    if (off > 0.1) {
      warnings.push(
        `at ${tp.T} K the Wigner–Kirkwood moments differ from the quantum ones by ${(100 * off).toPrecision(2)}%: the semiclassical ħ² expansion does not hold there (use the quantum moments; the classical ones are a limit, not an estimate)`,
      );
    }
  }

  if (input.spectrum) {
    const { from, to, step } = input.spectrum;
    const n = Math.floor((to - from) / step + 1e-9) + 1;
    const wn = Array.from({ length: n }, (_, i) => from + i * step);
    const omega = Float64Array.from(wn, (x) => x / HARTREE_IN_WAVENUMBER);
    const total = input.temperatures.length * (q.lMax + 1);
    temps.forEach((tp, t) => {
      const ls = lineShape(grid, onGrid.mu, q.bound, kT[t], omega, {
        panels: num.spectrumPanels,
        nodes: num.spectrumNodes,
        Ecut: num.spectrumEnergyCutKT * kT[t],
        lMax: q.lMax,
        onProgress: input.onProgress ? (done) => input.onProgress!(t * (q.lMax + 1) + done, total) : undefined,
      });
      tp.spectrum = spectrumSummary(wn, omega, ls, kT[t], tp);
    });
  }

  // curves for figures
  const Rs: number[] = [], Vs: number[] = [], mus: number[] = [];
  const lo = classicalFrom, hi = Math.min(Rdip, dip.domain[1], 2.5 * (pot.well?.R ?? Rdip));
  for (let i = 0; i <= 200; i++) {
    const R = lo + ((hi - lo) * i) / 200;
    Rs.push(R);
    Vs.push(pot.derivatives(R)[0]);
    mus.push(dip.evaluate(R)[0]);
  }
  const trusted = q.converged && cl.every((c) => c.converged) && temps.every((t) => [t.M0, t.M1, t.M2, t.gamma1, t.alpha1].every(Number.isFinite));
  return {
    pair: { A: input.names[0], B: input.names[1], masses: input.masses, reducedMass: mass / DALTON_IN_ELECTRON_MASS, massSource: input.massSource },
    potential: { label: pot.label, basis: pot.basis, ...(pot.well ? { well: { R: pot.well.R, depth: pot.well.depth, depthK: pot.well.depth / BOLTZMANN_IN_HARTREE_PER_KELVIN } } : {}) },
    dipole: { label: dip.label, basis: dip.basis, convention: CIA_DIPOLE_CONVENTION, ...(dip.D7 !== undefined ? { D7: dip.D7 } : {}), ...(dip.D9 !== undefined ? { D9: dip.D9 } : {}) },
    temperatures: temps,
    grid: {
      from: grid.R[0],
      dipoleEnd: grid.R[grid.dipoleEnd],
      match: grid.R[grid.match],
      to: grid.R[grid.R.length - 1],
      step: grid.h,
      points: grid.R.length,
      boundLevels: q.bound.map((b) => ({ l: b.l, E: b.E })),
    },
    curves: { R: Rs, V: Vs, mu: mus },
    trusted,
    warnings,
  };
}

/** Integrals, residuals and band strengths of one computed spectrum. */
function spectrumSummary(wn: number[], omega: Float64Array, ls: ReturnType<typeof lineShape>, kT: number, tp: CiaTemperature): CiaSpectrum {
  const n = omega.length;
  let M0 = 0, M1 = 0, a1 = 0;
  const absorption = Array.from(ls.S, (s, i) => absorptionPerAmagat2(omega[i], s, kT));
  for (let i = 0; i + 1 < n; i++) {
    const dw = omega[i + 1] - omega[i];
    const f = (j: number) => [(1 + Math.exp(-omega[j] / kT)) * ls.S[j], omega[j] * -Math.expm1(-omega[j] / kT) * ls.S[j]];
    const [a, b] = f(i), [d, e] = f(i + 1);
    M0 += 0.5 * dw * (a + d);
    M1 += 0.5 * dw * (b + e);
    a1 += 0.5 * (wn[i + 1] - wn[i]) * (absorption[i] + absorption[i + 1]);
  }
  return {
    wavenumber: wn,
    S: Array.from(ls.S),
    freeFree: Array.from(ls.freeFree),
    boundFree: Array.from(ls.boundFree),
    boundBound: Array.from(ls.boundBound),
    absorption,
    M0,
    M1,
    residualM0: (M0 - tp.quantum.M0) / tp.quantum.M0,
    residualM1: (M1 - tp.quantum.M1) / tp.quantum.M1,
    gamma1: gamma1FromM0(M0),
    alpha1: a1,
  };
}
