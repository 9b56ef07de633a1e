/**
 * The pair's induced-dipole function mu(R) (e·a0, along +z: A at the origin, B at +R on z; positive mu points
 * from A towards B), with its derivative:
 *   mu(R) = mu0 e^(−(R − R0)/rho) + g e^(−((R − R0)/sigma)²) + f7(bR) D7/R^7 + f9(bR) D9/R^9,
 * the overlap term (optionally with a Gaussian correction g) given by the user, D7 (and D9 when the pair's
 * routes provide it) the long-range dispersion dipole, damped by the Tang–Toennies functions f_n of damping.ts
 * (K. T. Tang, J. P. Toennies, J. Chem. Phys. 80, 3726 (1984)) with range b (the potential's, unless given);
 * or a table (R, mu) interpolated by a natural cubic spline.
 */
import { InputError } from '../../model/errors.js';
import { cubicSpline, evaluateSpline } from './cubic-spline.js';
import { tangToenniesDamping } from './damping.js';

export type DipoleSpec =
  | {
      kind: 'overlap';
      mu0: number;
      R0: number;
      rho: number;
      /** Gaussian correction amplitude (e·a0) and width (bohr). */
      gauss?: { amplitude: number; sigma: number };
      /** Override of the dispersion coefficients (e·a0^8, e·a0^10). */
      D7?: number;
      D9?: number;
      /** Tang–Toennies damping range (1/bohr), or 'none' for undamped tails; default: the potential's b. */
      damping?: number | 'none';
    }
  | { kind: 'table'; file: string; R: readonly number[]; mu: readonly number[] };

export interface DipoleFunction {
  spec: DipoleSpec;
  label: string;
  basis: string;
  /** mu(R) and mu'(R). */
  evaluate(R: number): [number, number];
  /** Range where mu is defined ([0, ∞) for the analytic form, the table's range otherwise). */
  domain: [number, number];
  /** The dispersion coefficients used (analytic form). */
  D7?: number;
  D9?: number;
}

/** Inputs from the pair: its D7 (and D9), where they come from, and the potential's damping range. */
export interface DipoleContext {
  D7?: number;
  D9?: number;
  dispersionSource: string;
  dampingRate?: number;
}

/** Build and validate the dipole function. Throws InputError naming `field`. */
export function buildDipole(spec: DipoleSpec, ctx: DipoleContext, field = '--dipole'): DipoleFunction {
  if (spec.kind === 'table') {
    const { R, mu, file } = spec;
    if (R.length < 4) throw new InputError(file, `a dipole table needs at least 4 points, got ${R.length}`);
    for (let i = 0; i < R.length; i++) {
      if (!(R[i] > 0) || !Number.isFinite(R[i]) || !Number.isFinite(mu[i])) throw new InputError(`${file}:${i + 1}`, `R must be > 0 and R, mu finite, got R = ${R[i]}, mu = ${mu[i]}`);
      if (i > 0 && !(R[i] > R[i - 1])) throw new InputError(`${file}:${i + 1}`, `the R grid must increase strictly, got ${R[i]} after ${R[i - 1]}`);
    }
    const s = cubicSpline(R, mu);
    return {
      spec,
      label: `table ${file} (${R.length} points, ${R[0]}–${R[R.length - 1]} bohr)`,
      basis: `user table ${file}, natural cubic spline`,
      evaluate: (r) => {
        const [v, d] = evaluateSpline(s, Math.min(Math.max(r, R[0]), R[R.length - 1]));
        return [v, d];
      },
      domain: [R[0], R[R.length - 1]],
    };
  }
  const finite = (k: string, x: number) => {
    if (!Number.isFinite(x)) throw new InputError(`${field}.${k}`, `must be a finite number, got ${x}`);
  };
  finite('mu0', spec.mu0);
  finite('R0', spec.R0);
  if (!(spec.rho > 0) || !Number.isFinite(spec.rho)) throw new InputError(`${field}.rho`, `must be a finite number > 0 (bohr), got ${spec.rho}`);
  if (spec.gauss) {
    finite('gauss', spec.gauss.amplitude);
    if (!(spec.gauss.sigma > 0) || !Number.isFinite(spec.gauss.sigma)) throw new InputError(`${field}.sigma`, `must be a finite number > 0 (bohr), got ${spec.gauss.sigma}`);
  }
  const D7 = spec.D7 ?? ctx.D7 ?? 0;
  const D9 = spec.D9 ?? ctx.D9 ?? 0;
  finite('D7', D7);
  finite('D9', D9);
  const b = spec.damping === 'none' ? undefined : (spec.damping ?? ctx.dampingRate);
  if (b === undefined && spec.damping !== 'none' && (D7 !== 0 || D9 !== 0)) {
    throw new InputError(`${field}.damp`, 'the potential has no Tang–Toennies range b: give damp=<1/bohr> or damp=none');
  }
  if (b !== undefined && (!(b > 0) || !Number.isFinite(b))) throw new InputError(`${field}.damp`, `must be a finite number > 0 (1/bohr) or none, got ${b}`);
  const { mu0, R0, rho, gauss } = spec;
  const tail = (n: number, D: number, R: number): [number, number] => {
    if (D === 0) return [0, 0];
    const p = D / R ** n;
    const p1 = (-n * p) / R;
    if (b === undefined) return [p, p1];
    const [f, f1] = tangToenniesDamping(n, b * R);
    return [f * p, b * f1 * p + f * p1];
  };
  const evaluate = (R: number): [number, number] => {
    const e = mu0 * Math.exp(-(R - R0) / rho);
    let v = e, d = -e / rho;
    if (gauss) {
      const z = (R - R0) / gauss.sigma;
      const gz = gauss.amplitude * Math.exp(-z * z);
      v += gz;
      d += (-2 * z * gz) / gauss.sigma;
    }
    const [t7, t7d] = tail(7, D7, R);
    const [t9, t9d] = tail(9, D9, R);
    return [v + t7 + t9, d + t7d + t9d];
  };
  const dampText = b === undefined ? 'undamped' : `damped by the Tang–Toennies f7${D9 !== 0 ? ', f9' : ''} with b = ${b} 1/bohr`;
  const dSource = spec.D7 !== undefined ? 'D7 given by the user' : `D7 ${ctx.dispersionSource}`;
  return {
    spec,
    label:
      `mu0 = ${mu0} e·a0, R0 = ${R0} bohr, rho = ${rho} bohr` +
      (gauss ? `, Gaussian ${gauss.amplitude} e·a0 width ${gauss.sigma} bohr` : '') +
      `; D7 = ${D7}` + (D9 !== 0 ? `, D9 = ${D9}` : '') + ` (${dampText})`,
    basis: `model: overlap term given by the user; ${dSource}${D9 !== 0 ? (spec.D9 !== undefined ? '; D9 given by the user' : '; D9 from the same route') : '; no D9 term (the next term R^-9 is left out)'}`,
    evaluate,
    domain: [0, Infinity],
    D7,
    ...(D9 !== 0 ? { D9 } : {}),
  };
}
