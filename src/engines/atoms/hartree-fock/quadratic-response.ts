/**
 * Dipole–dipole–quadrupole hyperpolarisability B(0; iu, −iu) at the time-dependent Hartree–Fock level, by
 * analytic quadratic response with Wigner's 2n+1 rule: only first-order densities and Fock operators enter.
 *
 * Why analytic: a finite difference of the dipole–quadrupole cross response in a static field needs the
 * Hartree–Fock state of the atom in a field (axial, not spherical) and its linear response in an uncoupled
 * excitation space several times larger than the coupled spherical one used here, for several fields — too slow
 * for Xe. That route is kept as the independent check (finite-field-response.ts, for s-shell atoms; it agrees with
 * this code to ~2e-6 for He), with the finite-field energies (finite-field.ts) for the static values.
 *
 * Derivation (derived here; TDHF in the density-matrix form i dP/dt = [F, P], F = h + V(t) + G(P), P² = P; cf.
 * H. Sekino, R. J. Bartlett, J. Chem. Phys. 85, 976 (1986); S. P. Karna, M. Dupuis, J. Comput. Chem. 12, 487
 * (1991)). For perturbations ε_b X_b e^(−iω_b t), ε_c X_c e^(−iω_c t), the second-order density P^bc has
 * diagonal blocks fixed by idempotency, P^bc_oo = −S_oo, P^bc_vv = S_vv with S = P^b P^c + P^c P^b, and off-diagonal
 * blocks that are the linear response at ω_σ = ω_b + ω_c to an effective perturbation built from
 * R = [W^b, P^c] + [W^c, P^b] and G(S̃), S̃ = −S_oo + S_vv (W = X + G(P¹) the first-order Fock operators). The
 * symmetry of the linear-response matrix turns s Tr(A P^bc) into
 *   ⟨⟨A; X_b, X_c⟩⟩ = s { Tr(S̃ W^A) + Σ_ai [R_ai P^A_ia − R_ia P^A_ai] },
 * with P^A, W^A the first-order quantities of A at −ω_σ. Here A = M_z (static), X_b = Q_20 at +iu, X_c = M_z at −iu:
 *   B(0; iu, −iu) = ⟨⟨M_z; Q_20(iu), M_z(−iu)⟩⟩
 * (the project's definition B = ∂χ_{M_z,Q_20}(iu)/∂F, with χ the response to −f Q and the field entering as −F M_z,
 * and the permutation symmetry of quadratic response functions). For one electron (s = 1) TDHF is exact, which
 * the tests check against hydrogen's B = −213/2.
 *
 * The m-dependence of every rank-K quantity is γ^K(m) (angular-coupling.ts), so the traces are evaluated per
 * m = −lMax … lMax with ordinary matrix products over the orbitals of channels l ≥ |m|.
 */
import { pairFactor } from './angular-coupling.js';
import { multipoleOperator, twoElectronResponse, type ReducedOperator } from './first-order-fock.js';
import { firstOrderDensity, type RankResponse } from './linear-response.js';
import type { OrbitalPotentials } from './orbital-potentials.js';
import type { HartreeFockAtom } from './scf.js';

/** A complex matrix as real and imaginary parts (rows × cols, row-major). */
interface CMat {
  re: Float64Array;
  im: Float64Array;
  rows: number;
  cols: number;
}

const cmat = (rows: number, cols: number): CMat => ({ re: new Float64Array(rows * cols), im: new Float64Array(rows * cols), rows, cols });

/** A·B (complex), with optional transposes of A or B. */
function cmul(A: CMat, B: CMat, tA = false, tB = false): CMat {
  const n = tA ? A.cols : A.rows, k = tA ? A.rows : A.cols, m = tB ? B.rows : B.cols;
  const C = cmat(n, m);
  for (let i = 0; i < n; i++)
    for (let p = 0; p < k; p++) {
      const ai = tA ? p * A.cols + i : i * A.cols + p;
      const ar = A.re[ai], aim = A.im[ai];
      if (ar === 0 && aim === 0) continue;
      for (let j = 0; j < m; j++) {
        const bi = tB ? j * B.cols + p : p * B.cols + j;
        const br = B.re[bi], bim = B.im[bi];
        C.re[i * m + j] += ar * br - aim * bim;
        C.im[i * m + j] += ar * bim + aim * br;
      }
    }
  return C;
}

/** Σ_ij A_ij B_ij (complex, no conjugation), real part and imaginary part. */
function cdot(A: CMat, B: CMat): [number, number] {
  let re = 0, im = 0;
  for (let t = 0; t < A.re.length; t++) {
    re += A.re[t] * B.re[t] - A.im[t] * B.im[t];
    im += A.re[t] * B.im[t] + A.im[t] * B.re[t];
  }
  return [re, im];
}

function cadd(A: CMat, B: CMat, f = 1): CMat {
  const C = cmat(A.rows, A.cols);
  for (let t = 0; t < A.re.length; t++) {
    C.re[t] = A.re[t] + f * B.re[t];
    C.im[t] = A.im[t] + f * B.im[t];
  }
  return C;
}

/** First-order quantities of one perturbation, complex: W (reduced, real part symmetric, imaginary antisymmetric) and x, y. */
interface FirstOrder {
  K: number;
  r: RankResponse;
  Wre: ReducedOperator;
  Wim: ReducedOperator;
  xre: Float64Array;
  xim: Float64Array;
  yre: Float64Array;
  yim: Float64Array;
}

/** First-order density and Fock operator of Q_K0 at ω = sign·iu. */
function firstOrder(atom: HartreeFockAtom, pots: OrbitalPotentials, r: RankResponse, X: ReducedOperator, u: number, sign: 1 | -1, lMax: number): FirstOrder {
  const { p, qi } = firstOrderDensity(r, r.g, u);
  const half = Float64Array.from(p, (v) => v / 2);
  const Gs = twoElectronResponse(atom, pots, r.K, r.blocks, half, half, lMax, true);
  const Wre: ReducedOperator = new Map();
  for (const [key, M] of Gs) {
    const Xm = X.get(key)!;
    Wre.set(key, Float64Array.from(M, (v, t) => v + Xm[t]));
  }
  const xim = Float64Array.from(qi, (v) => (sign * v) / 2);
  const yim = Float64Array.from(xim, (v) => -v);
  const Wim: ReducedOperator = u === 0 ? new Map() : twoElectronResponse(atom, pots, r.K, r.blocks, xim, yim, lMax, true);
  return { K: r.K, r, Wre, Wim, xre: half, xim, yre: half, yim };
}

/** A run of orbitals of one channel inside a per-m orbital list: channel l, orbitals first … first+count−1 at rows start …. */
interface Segment {
  l: number;
  first: number;
  count: number;
  start: number;
}

/** The orbitals of one m, as channel segments: occupied and virtual. */
interface MBasis {
  occ: Segment[];
  vir: Segment[];
  nOcc: number;
  nVir: number;
}

function mBasis(atom: HartreeFockAtom, m: number, lMax: number): MBasis {
  const occ: Segment[] = [], vir: Segment[] = [];
  let no = 0, nv = 0;
  for (let l = Math.abs(m); l <= lMax; l++) {
    const c = atom.channels[l];
    if (c.nOcc > 0) occ.push({ l, first: 0, count: c.nOcc, start: no });
    no += c.nOcc;
    if (c.m > c.nOcc) vir.push({ l, first: c.nOcc, count: c.m - c.nOcc, start: nv });
    nv += c.m - c.nOcc;
  }
  return { occ, vir, nOcc: no, nVir: nv };
}

/** Per-m block (rows × cols segments) of a reduced operator: W_red[p,q] γ^K_{lp lq}(m), complex. */
function operatorBlock(K: number, Wre: ReducedOperator, Wim: ReducedOperator, m: number, rows: Segment[], nr: number, cols: Segment[], nc: number, atom: HartreeFockAtom): CMat {
  const M = cmat(nr, nc);
  for (const R of rows)
    for (const C of cols) {
      const gm = pairFactor(R.l, K, C.l, m);
      if (gm === 0) continue;
      const mr = atom.channels[R.l].m, mc = atom.channels[C.l].m;
      const lower = R.l > C.l;
      const key = lower ? `${C.l},${R.l}` : `${R.l},${C.l}`;
      const re = Wre.get(key), im = Wim.get(key);
      for (let i = 0; i < R.count; i++)
        for (let j = 0; j < C.count; j++) {
          const p = R.first + i, q = C.first + j;
          const idx = lower ? q * mr + p : p * mc + q;
          const t = (R.start + i) * nc + C.start + j;
          if (re) M.re[t] = gm * re[idx];
          if (im) M.im[t] = gm * (lower ? -im[idx] : im[idx]);
        }
    }
  return M;
}

/** Per-m particle–hole amplitudes (virtual rows × occupied cols) of x or y. */
function amplitudeBlock(f: FirstOrder, re: Float64Array, im: Float64Array, m: number, b: MBasis): CMat {
  const M = cmat(b.nVir, b.nOcc);
  for (const blk of f.r.blocks) {
    const oseg = b.occ.find((sg) => sg.l === blk.li);
    const vseg = b.vir.find((sg) => sg.l === blk.la);
    if (!oseg || !vseg) continue;
    const gm = pairFactor(blk.la, f.K, blk.li, m);
    if (gm === 0) continue;
    const col = oseg.start + blk.i;
    for (let t = 0; t < blk.count; t++) {
      const row = vseg.start + t;
      M.re[row * M.cols + col] = gm * re[blk.offset + t];
      M.im[row * M.cols + col] = gm * im[blk.offset + t];
    }
  }
  return M;
}

/** Precomputed u-independent pieces: the two rank responses, multipole operators and the static dipole's first order. */
export interface QuadraticSetup {
  atom: HartreeFockAtom;
  pots: OrbitalPotentials;
  dipole: RankResponse;
  quadrupole: RankResponse;
  /** Highest channel the quadratic response uses. */
  lMax: number;
  X1: ReducedOperator;
  X2: ReducedOperator;
  staticDipole: FirstOrder;
}

export function quadraticSetup(atom: HartreeFockAtom, pots: OrbitalPotentials, dipole: RankResponse, quadrupole: RankResponse, lMax: number): QuadraticSetup {
  const X1 = multipoleOperator(atom, 1, lMax), X2 = multipoleOperator(atom, 2, lMax);
  return { atom, pots, dipole, quadrupole, lMax, X1, X2, staticDipole: firstOrder(atom, pots, dipole, X1, 0, 1, lMax) };
}

/** B(0; iu, −iu) (atomic units, Buckingham convention) and the imaginary part left by rounding (a check). */
export function hyperpolarisabilityB(q: QuadraticSetup, u: number): { B: number; imaginary: number } {
  const { atom, pots, lMax } = q;
  const fb = firstOrder(atom, pots, q.quadrupole, q.X2, u, 1, lMax);
  const fc = firstOrder(atom, pots, q.dipole, q.X1, u, -1, lMax);
  const fa = q.staticDipole;
  let re = 0, im = 0;
  for (let m = -lMax; m <= lMax; m++) {
    const b = mBasis(atom, m, lMax);
    if (b.nOcc === 0 || b.nVir === 0) continue;
    const xb = amplitudeBlock(fb, fb.xre, fb.xim, m, b), yb = amplitudeBlock(fb, fb.yre, fb.yim, m, b);
    const xc = amplitudeBlock(fc, fc.xre, fc.xim, m, b), yc = amplitudeBlock(fc, fc.yre, fc.yim, m, b);
    const pA = amplitudeBlock(fa, fa.xre, fa.xim, m, b); // x^A = y^A = p^A/2 (static)
    const WAoo = operatorBlock(1, fa.Wre, fa.Wim, m, b.occ, b.nOcc, b.occ, b.nOcc, atom), WAvv = operatorBlock(1, fa.Wre, fa.Wim, m, b.vir, b.nVir, b.vir, b.nVir, atom);
    const Wboo = operatorBlock(2, fb.Wre, fb.Wim, m, b.occ, b.nOcc, b.occ, b.nOcc, atom), Wbvv = operatorBlock(2, fb.Wre, fb.Wim, m, b.vir, b.nVir, b.vir, b.nVir, atom);
    const Wcoo = operatorBlock(1, fc.Wre, fc.Wim, m, b.occ, b.nOcc, b.occ, b.nOcc, atom), Wcvv = operatorBlock(1, fc.Wre, fc.Wim, m, b.vir, b.nVir, b.vir, b.nVir, atom);
    // S_vv = x^b y^cᵀ + x^c y^bᵀ (as [a, a']);  S_oo = y^bᵀ x^c + y^cᵀ x^b (as [i, j])
    const Svv = cadd(cmul(xb, yc, false, true), cmul(xc, yb, false, true));
    const Soo = cadd(cmul(yb, xc, true, false), cmul(yc, xb, true, false));
    // Tr(S̃ W^A) = −Σ S_oo[i,j] W_oo[j,i] + Σ S_vv[a,a'] W_vv[a',a]  (W^A real symmetric)
    const [t1o, t1oi] = cdot(Soo, WAoo), [t1v, t1vi] = cdot(Svv, WAvv);
    // R_ai = W^b_vv x^c − x^c W^b_oo + (b↔c);  R_ia (as [a,i]) = y^c W^b_ooᵀ − W^b_vvᵀ y^c + (b↔c)
    const Rai = cadd(
      cadd(cmul(Wbvv, xc), cmul(xc, Wboo), -1),
      cadd(cmul(Wcvv, xb), cmul(xb, Wcoo), -1),
    );
    const Ria = cadd(
      cadd(cmul(yc, Wboo, false, true), cmul(Wbvv, yc, true, false), -1),
      cadd(cmul(yb, Wcoo, false, true), cmul(Wcvv, yb, true, false), -1),
    );
    const [t2, t2i] = cdot(cadd(Rai, Ria, -1), pA);
    re += -t1o + t1v + t2;
    im += -t1oi + t1vi + t2i;
  }
  return { B: atom.s * re, imaginary: atom.s * im };
}
