/**
 * The pair potential V(R) of a CIA computation (atomic units: R in bohr, V in Eh), with its first two
 * derivatives (needed by the Wigner–Kirkwood correction). Three forms:
 * - Tang–Toennies: V = A e^(−bR) − Σ_{n=3,4,5} f_{2n}(bR) C_{2n}/R^{2n}
 *   (K. T. Tang, J. P. Toennies, J. Chem. Phys. 80, 3726 (1984)), f_n the damping functions of damping.ts;
 * - HFD with a published parameter set (hfd-parameters.ts);
 * - a table (R, V) interpolated by a natural cubic spline; beyond the last point V continues as
 *   V_last (R_last/R)^6 (a dispersion-like tail; stated in reports).
 */
import { InputError } from '../../model/errors.js';
import { BOHR_IN_ANGSTROM, BOLTZMANN_IN_HARTREE_PER_KELVIN } from '../../model/units.js';
import { cubicSpline, evaluateSpline } from './cubic-spline.js';
import { tangToenniesDamping } from './damping.js';
import { HFD_SETS, type HfdParameters } from './hfd-parameters.js';

export type PotentialSpec =
  | { kind: 'tang-toennies'; A: number; b: number; C6: number; C8: number; C10: number; dispersionSource: string }
  | { kind: 'hfd'; set: string }
  | { kind: 'table'; file: string; R: readonly number[]; V: readonly number[] }
  /** V = 0 (free motion): library use only, for the closed-form checks. */
  | { kind: 'zero' };

export interface PairPotential {
  spec: PotentialSpec;
  /** One-line description with the parameters. */
  label: string;
  /** What the potential rests on. */
  basis: string;
  /** V, dV/dR, d²V/dR² at R (bohr). */
  derivatives(R: number): [number, number, number];
  /** Smallest R where V is defined (0, or a table's first point). */
  minR: number;
  /** Position (bohr) and depth (Eh, > 0) of the well; undefined for the zero potential. */
  well?: { R: number; depth: number };
  /** The Tang–Toennies range parameter b (1/bohr), the default damping of the dispersion dipole. */
  dampingRate?: number;
}

/** Tang–Toennies V and derivatives. */
function tangToennies(A: number, b: number, C: readonly [number, number, number]) {
  return (R: number): [number, number, number] => {
    const e = A * Math.exp(-b * R);
    let v = e, d1 = -b * e, d2 = b * b * e;
    for (let j = 0; j < 3; j++) {
      const n = 6 + 2 * j;
      if (C[j] === 0) continue;
      const [f, f1, f2] = tangToenniesDamping(n, b * R);
      const p = C[j] / R ** n; // C/R^n, derivatives −n p/R, n(n+1) p/R²
      const p1 = (-n * p) / R;
      const p2 = (n * (n + 1) * p) / (R * R);
      v -= f * p;
      d1 -= b * f1 * p + f * p1;
      d2 -= b * b * f2 * p + 2 * b * f1 * p1 + f * p2;
    }
    return [v, d1, d2];
  };
}

/** HFD V and derivatives in atomic units. */
function hfd(p: HfdParameters) {
  const eps = p.epsilonK * BOLTZMANN_IN_HARTREE_PER_KELVIN;
  const rm = p.rmAngstrom / BOHR_IN_ANGSTROM;
  return (R: number): [number, number, number] => {
    const x = R / rm;
    const rep = p.Astar * Math.exp(-p.alphaStar * x + p.betaStar * x * x);
    const g1 = -p.alphaStar + 2 * p.betaStar * x;
    let v = rep, d1 = rep * g1, d2 = rep * (g1 * g1 + 2 * p.betaStar);
    // dispersion sum S = Σ c/x^n and damping F
    let S = 0, S1 = 0, S2 = 0;
    for (const [c, n] of [[p.c6, 6], [p.c8, 8], [p.c10, 10]] as const) {
      const t = c / x ** n;
      S += t;
      S1 += (-n * t) / x;
      S2 += (n * (n + 1) * t) / (x * x);
    }
    let F = 1, F1 = 0, F2 = 0;
    if (x < p.D) {
      const u = p.D / x - 1;
      const du = -p.D / (x * x);
      const ddu = (2 * p.D) / (x * x * x);
      F = Math.exp(-u * u);
      F1 = -2 * u * du * F;
      F2 = -2 * (du * du + u * ddu) * F - 2 * u * du * F1;
    }
    v -= F * S;
    d1 -= F1 * S + F * S1;
    d2 -= F2 * S + 2 * F1 * S1 + F * S2;
    return [eps * v, (eps * d1) / rm, (eps * d2) / (rm * rm)];
  };
}

/** Find the well: minimum of V on a scan, refined by golden section. Undefined when V has no negative minimum. */
export function findWell(V: (R: number) => number, from: number, to: number): { R: number; depth: number } | undefined {
  const n = 2000;
  let best = 0, bestV = Infinity;
  for (let i = 0; i <= n; i++) {
    const R = from * (to / from) ** (i / n);
    const v = V(R);
    if (v < bestV) (bestV = v), (best = i);
  }
  if (!(bestV < 0) || best === 0 || best === n) return undefined;
  let a = from * (to / from) ** ((best - 1) / n);
  let c = from * (to / from) ** ((best + 1) / n);
  const g = (Math.sqrt(5) - 1) / 2;
  for (let it = 0; it < 100 && c - a > 1e-12 * c; it++) {
    const x1 = c - g * (c - a), x2 = a + g * (c - a);
    if (V(x1) < V(x2)) c = x2;
    else a = x1;
  }
  const R = (a + c) / 2;
  return { R, depth: -V(R) };
}

/**
 * Build a potential from its spec and validate it: a positive repulsion, and a well (V < 0 somewhere with
 * V → 0 from below at large R). Throws InputError naming `field` otherwise.
 */
export function buildPotential(spec: PotentialSpec, field = '--potential'): PairPotential {
  switch (spec.kind) {
    case 'zero':
      return { spec, label: 'V = 0 (free motion)', basis: 'no interaction (closed-form checks)', derivatives: () => [0, 0, 0], minR: 0 };
    case 'tang-toennies': {
      if (!(spec.A > 0) || !Number.isFinite(spec.A)) throw new InputError(`${field}.A`, `the Born–Mayer repulsion must be a finite number > 0 (Eh), got ${spec.A}`);
      if (!(spec.b > 0) || !Number.isFinite(spec.b)) throw new InputError(`${field}.b`, `the range parameter must be a finite number > 0 (1/bohr), got ${spec.b}`);
      for (const k of ['C6', 'C8', 'C10'] as const) {
        if (!(spec[k] >= 0) || !Number.isFinite(spec[k])) throw new InputError(`${field}.${k}`, `must be a finite number ≥ 0 (Eh·a0^n), got ${spec[k]}`);
      }
      if (!(spec.C6 > 0)) throw new InputError(`${field}.C6`, 'must be > 0: without attraction the potential has no well');
      const d = tangToennies(spec.A, spec.b, [spec.C6, spec.C8, spec.C10]);
      const well = findWell((R) => d(R)[0], 0.5, 60);
      if (!well) throw new InputError(field, `Tang–Toennies potential with A = ${spec.A} Eh, b = ${spec.b}/bohr has no well between 0.5 and 60 bohr`);
      return {
        spec,
        label: `Tang–Toennies: A = ${spec.A} Eh, b = ${spec.b} 1/bohr, C6 = ${spec.C6}, C8 = ${spec.C8}, C10 = ${spec.C10} (Eh·a0^n)`,
        basis: `model: Tang–Toennies form (K. T. Tang, J. P. Toennies, J. Chem. Phys. 80, 3726 (1984)); Born–Mayer A, b given by the user; C6, C8, C10 ${spec.dispersionSource}`,
        derivatives: d,
        minR: 0,
        well,
        dampingRate: spec.b,
      };
    }
    case 'hfd': {
      const p = HFD_SETS[spec.set];
      if (!p) throw new InputError(field, `unknown HFD parameter set ${JSON.stringify(spec.set)}; built-in: ${Object.keys(HFD_SETS).join(', ')}`);
      const d = hfd(p);
      const well = findWell((R) => d(R)[0], 2, 60);
      if (!well) throw new InputError(field, `HFD set ${spec.set} has no well`); // cannot happen for the built-ins
      return { spec, label: `HFD ${p.pair}: ε/k = ${p.epsilonK} K, rm = ${p.rmAngstrom} Å`, basis: `published potential: ${p.source}`, derivatives: d, minR: 0.5 * well.R, well };
    }
    case 'table': {
      const { R, V, file } = spec;
      if (R.length < 4) throw new InputError(file, `a potential table needs at least 4 points, got ${R.length}`);
      for (let i = 0; i < R.length; i++) {
        if (!(R[i] > 0) || !Number.isFinite(R[i]) || !Number.isFinite(V[i])) throw new InputError(`${file}:${i + 1}`, `R must be > 0 and R, V finite, got R = ${R[i]}, V = ${V[i]}`);
        if (i > 0 && !(R[i] > R[i - 1])) throw new InputError(`${file}:${i + 1}`, `the R grid must increase strictly, got ${R[i]} after ${R[i - 1]}`);
      }
      if (!(V[0] > 0)) throw new InputError(file, `the first point must be on the repulsive wall (V > 0), got V(${R[0]} bohr) = ${V[0]} Eh: negative or missing repulsion`);
      const s = cubicSpline(R, V);
      const last = R.length - 1;
      const d = (r: number): [number, number, number] => {
        if (r <= R[last]) return evaluateSpline(s, Math.max(r, R[0]));
        const t = V[last] * (R[last] / r) ** 6;
        return [t, (-6 * t) / r, (42 * t) / (r * r)];
      };
      const well = findWell((r) => d(r)[0], R[0], R[last]);
      if (!well) throw new InputError(file, 'the tabulated potential has no well (no negative minimum inside the table)');
      if (!(V[last] <= 0)) throw new InputError(`${file}:${R.length}`, `the last point must be in the attractive tail (V ≤ 0), got ${V[last]} Eh`);
      return { spec, label: `table ${file} (${R.length} points, ${R[0]}–${R[last]} bohr)`, basis: `user table ${file}, natural cubic spline; V_last·(R_last/R)^6 beyond the last point`, derivatives: d, minR: R[0], well };
    }
  }
}

/**
 * The inner edge of the thermally accessible range: the R on the repulsive wall (inside the well) where
 * V(R) = level (Eh), by bisection. For the zero potential, 0.
 */
export function wallPoint(p: PairPotential, level: number): number {
  if (!p.well) return 0;
  let lo = p.minR, hi = p.well.R;
  if (p.derivatives(lo)[0] < level) {
    // the table (or the form) does not reach this high: the caller decides whether that matters
    return lo;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-13 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (p.derivatives(mid)[0] > level) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
