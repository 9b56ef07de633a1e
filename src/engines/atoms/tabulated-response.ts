/**
 * Isotropic response functions from user data (src/model/response-data.ts). Atomic units.
 *
 * Tables: each function f(iu) on the grid is interpolated in the mapped variable v = s²/(s² + u²) ∈ (0, 1]
 * (v = 1 at u = 0, v → 0 as u → ∞; s = the u where alpha falls to alpha(0)/2), as y(v) = f / v = f (1 + u²/s²),
 * which tends to a constant as u → ∞. When the electron number N is given, the point v = 0 closes the alpha
 * table with y(0) = N/s², so alpha ~ N/u² (the Thomas–Reiche–Kuhn limit); otherwise (and for B, alpha2,
 * alpha3) the rational interpolant extrapolates from the last grid point to v = 0, still ∝ 1/u², and the notes
 * give the N it implies. A Stieltjes function Σ g/(ω² + u²) is a rational function of v with real poles outside
 * [0, 1], so the AAA rational interpolant reproduces it to many digits; noisy data get a smoother rational fit
 * (larger AAA tolerance); only if every rational fit fails the pole checks is a low-order Floater–Hormann
 * interpolant (d = 1) used, and the notes say so.
 *
 * Pseudo-spectra: alpha(iu) = Σ f_i/(ω_i² + u²) exactly.
 *
 * Without B(0; iu, −iu) data, B(0; iu, −iu) ≈ B alpha(iu)/alpha(0) (the frequency dependence of a QDO, where
 * it is exact up to the replacement of w²/(w² + u²) by alpha(iu)/alpha(0)); D7 is then approximate.
 */
import type { OscillatorSpectrumSpecies, ResponseTableSpecies } from '../../model/response-data.js';
import type { IsotropicResponse } from '../response/response-model.js';
import { aaa, type Barycentric, evaluateBarycentric, floaterHormann, maxAbs, poleFree } from './rational-interpolation.js';
import { sig } from '../../model/number-text.js';

/** Response of a data species, with what was assumed and how far the data reach. */
export interface DataResponse extends IsotropicResponse {
  /** Highest dispersion power the data support: 6 (alpha only), 8 (with alpha2), 10 (with alpha2, alpha3). */
  maxEnergyPower: 6 | 8 | 10;
  /** True when D7 uses B(0; iu, −iu) ≈ B alpha(iu)/alpha(0). */
  approximateB: boolean;
  /** What was assumed (tails, interpolation, approximations), for route notes. */
  notes: string[];
}

interface MappedInterpolant {
  f: (u: number) => number;
  /** The interpolant's limit of f·u² as u → ∞ (s² y(0)). */
  tail: number;
  method: string;
}

/**
 * AAA tolerances (relative to the largest |y|) tried in turn: interpolation to rounding first, then ever
 * smoother rational fits with fewer support points, which noisy data need (a fit that chases the noise grows
 * spurious pole–zero pairs and fails the pole checks).
 */
const AAA_TOLERANCES = [1e-13, 1e-11, 1e-9, 1e-7, 1e-6, 1e-5, 1e-4];

/**
 * Interpolate f(u_k) in v = s²/(s² + u²) as y = f/v. With `tail` (the known limit of f·u²), the point v = 0
 * closes the table; without it the rational interpolant extrapolates from the last grid point to v = 0.
 */
function interpolateMapped(u: readonly number[], f: readonly number[], s: number, positive: boolean, tail?: number): MappedInterpolant {
  const n = u.length;
  const offset = tail === undefined ? 0 : 1;
  // nodes in increasing v: (v = 0 when the tail is known,) then the grid from u_max down to u = 0 (v = 1)
  const v = new Float64Array(n + offset), y = new Float64Array(n + offset);
  if (tail !== undefined) y[0] = tail / (s * s);
  for (let k = 0; k < n; k++) {
    const uk = u[n - 1 - k];
    v[k + offset] = (s * s) / (s * s + uk * uk);
    y[k + offset] = f[n - 1 - k] / v[k + offset];
  }
  const bound = 10 * maxAbs(y);
  const acceptable = (b: Barycentric) => poleFree(b, 0, 1, bound) && (!positive || samplesPositive(b));
  let b: Barycentric | undefined;
  let method = '';
  for (const tol of AAA_TOLERANCES) {
    const a = aaa(v, y, [0, v.length - 1], tol);
    if (a.residual <= tol && acceptable(a)) {
      b = a;
      const kind = a.residual > 1e-9 ? 'rational (AAA) smoothing fit' : 'rational (AAA) interpolation';
      method = `${kind}, ${a.x.length} support points, data reproduced to ${a.residual.toExponential(1)} relative`;
      break;
    }
  }
  if (!b) {
    b = floaterHormann(v, y, 1);
    method = 'LOW-ORDER Floater–Hormann (d = 1) interpolation: no rational fit passed the pole checks (expect ~1e-4 accuracy)';
  }
  const fit = b;
  return {
    f: (uu: number) => {
      const vv = (s * s) / (s * s + uu * uu);
      return vv * evaluateBarycentric(fit, vv);
    },
    tail: s * s * evaluateBarycentric(fit, 0),
    method,
  };
}

function samplesPositive(b: Barycentric): boolean {
  for (let i = 0; i <= 4000; i++) if (!(evaluateBarycentric(b, i / 4000) > 0)) return false;
  return true;
}

const fmt = (x: number): string => sig(x, 6);

const tableCache = new WeakMap<ResponseTableSpecies, DataResponse>();

/** Interpolated response functions of a tabulated species. */
export function responseTableResponse(s: ResponseTableSpecies): DataResponse {
  const hit = tableCache.get(s);
  if (hit) return hit;
  const { u, alpha } = s;
  const last = u.length - 1;
  const a0 = alpha[0];
  // scale: where alpha falls to half its static value (linear interpolation in the table), else the grid's end
  let scale = u[last];
  for (let k = 1; k <= last; k++)
    if (alpha[k] <= a0 / 2) {
      scale = u[k - 1] + ((a0 / 2 - alpha[k - 1]) * (u[k] - u[k - 1])) / (alpha[k] - alpha[k - 1]);
      break;
    }
  const notes: string[] = [];
  const a1 = interpolateMapped(u, alpha, scale, true, s.electrons);
  if (s.electrons !== undefined) {
    notes.push(`${s.name}: alpha beyond the grid (u > ${fmt(u[last])}) follows N/u² with N = ${fmt(s.electrons)} (given)`);
    const trk = alpha[last] * u[last] * u[last];
    if (trk > s.electrons) notes.push(`${s.name}: WARNING u²·alpha = ${fmt(trk)} at the last grid point exceeds N = ${fmt(s.electrons)} (the sum rule bound)`);
  } else {
    notes.push(`${s.name}: alpha beyond the grid (u > ${fmt(u[last])}) follows N/u² with N ≈ ${fmt(a1.tail)} extrapolated from the table (no electron number given)`);
  }
  notes.push(`${s.name}: alpha(iu) by ${a1.method} in v = s²/(s² + u²), s = ${fmt(scale)} Eh`);
  const a2 = s.alpha2 ? interpolateMapped(u, s.alpha2, scale, true) : undefined;
  const a3 = s.alpha3 ? interpolateMapped(u, s.alpha3, scale, true) : undefined;
  for (const [name, a] of [['alpha2', a2], ['alpha3', a3]] as const) if (a) notes.push(`${s.name}: ${name}(iu) by ${a.method}`);
  let hyperB: (u: number) => number;
  let approximateB = false;
  if (s.hyperB) {
    const b = interpolateMapped(u, s.hyperB, scale, false);
    hyperB = b.f;
    notes.push(`${s.name}: B(0; iu, −iu) by ${b.method}; beyond the grid ∝ 1/u² (extrapolated)`);
  } else {
    const B = s.staticB ?? 0;
    hyperB = (uu) => (B * a1.f(uu)) / a0;
    approximateB = true;
    notes.push(approximateNote(s.name, B));
  }
  const power: 6 | 8 | 10 = a2 && a3 ? 10 : a2 ? 8 : 6;
  if (power < 10) notes.push(`${s.name}: no ${a2 ? 'alpha3' : 'alpha2'} column: C${power + 2} and above are not computed`);
  const r: DataResponse = {
    alpha: (l, uu) => (l === 1 ? a1.f(uu) : l === 2 ? (a2 ? a2.f(uu) : 0) : a3 ? a3.f(uu) : 0),
    hyperB,
    scale,
    maxEnergyPower: power,
    approximateB,
    notes,
  };
  tableCache.set(s, r);
  return r;
}

/** The note (and warning) for D7 from a static B only. */
function approximateNote(name: string, B: number): string {
  return `${name}: APPROXIMATE D7: B(0; iu, −iu) ≈ B·alpha(iu)/alpha(0) from the static B = ${fmt(B)} (no B(0; iu, −iu) data)`;
}

const spectrumCache = new WeakMap<OscillatorSpectrumSpecies, DataResponse>();

/** Response functions of a dipole pseudo-spectrum species. */
export function oscillatorSpectrumResponse(s: OscillatorSpectrumSpecies): DataResponse {
  const hit = spectrumCache.get(s);
  if (hit) return hit;
  const w2 = s.energies.map((w) => w * w);
  const alpha = (u: number) => {
    let sum = 0;
    for (let i = 0; i < w2.length; i++) sum += s.strengths[i] / (w2[i] + u * u);
    return sum;
  };
  const a0 = alpha(0);
  const fSum = s.strengths.reduce((p, q) => p + q, 0);
  const notes = [
    `${s.name}: alpha(iu) = Σ f/(ω² + u²) over ${s.energies.length} lines (Σ f = ${fmt(fSum)}${s.electrons !== undefined ? `, electron number N = ${fmt(s.electrons)}` : ''})`,
    approximateNote(s.name, s.staticB),
    `${s.name}: a dipole pseudo-spectrum only: C8 and above are not computed`,
  ];
  const r: DataResponse = {
    alpha: (l, u) => (l === 1 ? alpha(u) : 0),
    hyperB: (u) => (s.staticB * alpha(u)) / a0,
    scale: Math.sqrt(fSum / a0),
    maxEnergyPower: 6,
    approximateB: true,
    notes,
  };
  spectrumCache.set(s, r);
  return r;
}
