/**
 * The image factor Δ(iu) = (eps(iu) − 1)/(eps(iu) + 1) of a surface at imaginary frequency iu (hartree):
 * the charge of each frequency component's image in units of −e (A. D. McLachlan, Mol. Phys. 6, 423 (1963);
 * Δ = 1 for a perfect conductor). Written without cancellation for metals, whose eps(0) is infinite:
 *   Drude–Lorentz: eps − 1 = S(u) = Σ wp²/(w0² + u² + gamma u), Δ = S/(2 + S) = 1/(1 + 2/S).
 * Tables are interpolated in Δ (bounded in [0, 1], falling with u) by a monotone cubic in x = asinh(u/h) (h the
 * first non-zero grid frequency: linear near 0, logarithmic beyond), which cannot overshoot; beyond the last point
 * Δ ∝ 1/u², the free-electron tail of eps − 1 (common practice); below a first point u_0 > 0, Δ is held at Δ(u_0).
 */
import type { SurfaceSpec } from '../../model/surface-spec.js';
import { monotoneCubic } from './monotone-interpolation.js';
import { sig } from '../../model/number-text.js';

export interface ImageFactor {
  /** Δ(iu) ∈ [0, 1]. */
  delta(u: number): number;
  /** True when Δ does not depend on u (conductor, constant eps): the image Hamiltonian is then instantaneous. */
  instantaneous: boolean;
  /** A frequency near where Δ changes, hartree (quadrature map); undefined when Δ is constant. */
  scale?: number;
  /** What was assumed (interpolation, tails), for route notes. */
  notes: string[];
}

/** The image factor of a surface. */
export function imageFactor(s: SurfaceSpec): ImageFactor {
  switch (s.kind) {
    case 'conductor':
      return { delta: () => 1, instantaneous: true, notes: [] };
    case 'constant': {
      const d = (s.eps - 1) / (s.eps + 1);
      return { delta: () => d, instantaneous: true, notes: [] };
    }
    case 'drude-lorentz': {
      const terms = s.terms.map((t) => ({ wp2: t.wp * t.wp, w02: t.w0 * t.w0, g: t.gamma }));
      const delta = (u: number) => {
        let S = 0; // eps(iu) − 1
        for (const t of terms) {
          const den = t.w02 + u * u + t.g * u;
          if (den === 0) return 1; // a Drude term at u = 0: S = ∞
          S += t.wp2 / den;
        }
        return 1 / (1 + 2 / S); // = S/(2 + S), and 1 (not NaN) if S overflows
      };
      const scale = Math.max(...s.terms.map((t) => Math.max(t.wp, t.w0))) / Math.SQRT2;
      return { delta, instantaneous: false, scale, notes: [] };
    }
    case 'table':
      return tableFactor(s);
  }
}

function tableFactor(s: Extract<SurfaceSpec, { kind: 'table' }>): ImageFactor {
  const { u, eps } = s;
  const n = u.length;
  const d = eps.map((e) => (e - 1) / (e + 1));
  const h = u[0] > 0 ? u[0] : u[1];
  const x = (v: number) => Math.asinh(v / h);
  const interp = monotoneCubic(u.map(x), d);
  const last = n - 1;
  const tail = d[last] * u[last] * u[last];
  const delta = (v: number) => (v > u[last] ? tail / (v * v) : interp(x(v)));
  const scale = u[Math.floor(n / 2)] || u[last];
  const notes = [
    `surface table ${s.name}: Δ(iu) = (eps−1)/(eps+1) interpolated (monotone cubic in asinh(u/${sig(h, 3)} Eh)) on ${n} points; Δ ∝ 1/u² beyond u = ${sig(u[last], 6)} Eh${u[0] > 0 ? `; Δ held at Δ(${sig(u[0], 6)} Eh) below the first point` : ''}`,
  ];
  return { delta, instantaneous: false, scale, notes };
}
