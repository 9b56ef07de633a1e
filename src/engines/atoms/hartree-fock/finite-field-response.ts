/**
 * Independent route to B(0; iu, −iu), hence to D7: the time-dependent Hartree–Fock linear response of the atom
 * polarised by a static field F (finite-field.ts), in its own m = 0 orbitals (l-mixtures, no angular coupling), and
 *   B(0; iu, −iu) = ∂χ_{M_z,Q_20}(iu)/∂F |_{F=0}
 * by a central difference with Richardson extrapolation, χ_PQ(iu) = 2s g_Pᵀ [(A + B) + u²(A − B)⁻¹]⁻¹ g_Q the
 * response of ⟨P⟩ to H' = −f Q (the definition in response-model.ts). It shares only the radial basis and the
 * Slater–Condon rules with the quadratic-response code. For atoms whose occupied orbitals all have m = 0 (He, Be
 * and their isoelectronic ions), where M = 0 excitations stay in the m = 0 block. Atomic units.
 *
 * Two-electron integrals over m = 0 orbitals p = Σ_l P_p^l(r) Y_l0 (Slater–Condon, derived here):
 *   (pq|rs) = Σ_K ∫ D^K_pq V^K[D^K_rs] dr,   D^K_pq(r) = Σ_{l l'} c^K(l 0, l' 0) P_p^l(r) P_q^l'(r).
 * Difference error: O(F⁴) after Richardson (F and 2F); the fields used (1e-3, 2e-3) keep it below 1e-6 relative.
 */
import { CLOSED_SHELLS } from '../../../model/closed-shell.js';
import { gauntC } from './angular-coupling.js';
import { axialHartreeFock, type AxialOrbitals } from './finite-field.js';
import { spectralForm } from './linear-response.js';
import { basisOnGrid, type SlaterBasis } from './radial-basis.js';
import { ScreeningCache } from './scf.js';

/** χ_{M_z,Q_20}(iu) of the field-polarised atom, in spectral form. */
export function crossResponse(Z: number, electrons: number, basis: SlaterBasis, F: number): (u: number) => number {
  const shells = CLOSED_SHELLS[electrons].shells;
  if (shells.length !== 1) throw new RangeError('the finite-field response treats atoms with s shells only (m = 0 orbitals)');
  const s = electrons === 1 ? 1 : 2;
  const ff = axialHartreeFock(Z, electrons, basis, F, 1e-12);
  const o = ff.m0;
  const G = basis.grid.r.length;
  const cache = new ScreeningCache(basis);
  const chi = basis.zeta.map((_, l) => basisOnGrid(basis, l));
  const nb = basis.zeta.map((z) => z.length);
  // radial components comp[p][a] of every orbital
  const comp = Array.from({ length: o.count }, (_, p) => o.ls.map((l, a) => component(o, p, a, chi[l], nb[l], G)));
  const kMax = 2 * Math.max(...o.ls);
  const D = (p: number, q: number, K: number): Float64Array => {
    const d = new Float64Array(G);
    o.ls.forEach((l1, a1) =>
      o.ls.forEach((l2, a2) => {
        const c = gauntC(K, l1, 0, l2, 0);
        if (c === 0) return;
        const x = comp[p][a1], y = comp[q][a2];
        for (let g = 0; g < G; g++) d[g] += c * x[g] * y[g];
      }),
    );
    return d;
  };
  const V = (p: number, q: number, K: number): Float64Array => {
    const v = new Float64Array(G);
    o.ls.forEach((l1, a1) =>
      o.ls.forEach((l2, a2) => {
        const c = gauntC(K, l1, 0, l2, 0);
        if (c === 0) return;
        const Y = cache.get(l1, l2, K);
        for (let t = 0; t < nb[l1]; t++) {
          const ct = c * o.C[(o.offsets[a1] + t) * o.count + p];
          if (ct === 0) continue;
          for (let u = 0; u < nb[l2]; u++) {
            const cu = ct * o.C[(o.offsets[a2] + u) * o.count + q];
            const base = (t * nb[l2] + u) * G;
            for (let g = 0; g < G; g++) v[g] += cu * Y[base + g];
          }
        }
      }),
    );
    return v;
  };
  const dot = (x: Float64Array, y: Float64Array) => {
    let t = 0;
    for (let g = 0; g < G; g++) t += x[g] * y[g];
    return t;
  };
  const nOcc = o.nOcc, nVir = o.count - o.nOcc, n = nOcc * nVir;
  const idx = (a: number, i: number) => i * nVir + (a - nOcc);
  // potentials of every particle–hole and hole–hole density, all ranks
  const Vph = new Map<string, Float64Array>();
  for (let K = 0; K <= kMax; K++)
    for (let i = 0; i < nOcc; i++) {
      for (let a = nOcc; a < o.count; a++) Vph.set(`${K},${a},${i}`, V(a, i, K));
      for (let j = 0; j < nOcc; j++) Vph.set(`${K},${j},${i}`, V(j, i, K));
    }
  const A = new Float64Array(n * n), B = new Float64Array(n * n);
  for (let K = 0; K <= kMax; K++)
    for (let i = 0; i < nOcc; i++)
      for (let j = 0; j < nOcc; j++) {
        const Vij = Vph.get(`${K},${i},${j}`)!;
        for (let a = nOcc; a < o.count; a++) {
          const Dai = D(a, i, K);
          for (let b = nOcc; b < o.count; b++) {
            const aibj = dot(Dai, Vph.get(`${K},${b},${j}`)!); // (ai|bj)
            const abij = dot(D(a, b, K), Vij); // (ab|ij)
            const ajbi = dot(D(a, j, K), Vph.get(`${K},${b},${i}`)!); // (aj|bi)
            A[idx(a, i) * n + idx(b, j)] += s * aibj - abij;
            B[idx(a, i) * n + idx(b, j)] += s * aibj - ajbi;
          }
        }
      }
  for (let i = 0; i < nOcc; i++) for (let a = nOcc; a < o.count; a++) A[idx(a, i) * (n + 1)] += o.eps[a] - o.eps[i];
  const { W, w2 } = spectralForm(A, B, n);
  const { r, w } = basis.grid;
  const gradient = (K: number) => {
    const g = new Float64Array(n);
    const rk = Float64Array.from(r, (x, t) => x ** K * w[t]);
    for (let i = 0; i < nOcc; i++) for (let a = nOcc; a < o.count; a++) g[idx(a, i)] = -dot(D(a, i, K), rk);
    return g;
  };
  const gMu = gradient(1), gQ = gradient(2);
  const tMu = new Float64Array(n), tQ = new Float64Array(n);
  for (let k = 0; k < n; k++)
    for (let t = 0; t < n; t++) {
      tMu[k] += gMu[t] * W[t * n + k];
      tQ[k] += gQ[t] * W[t * n + k];
    }
  return (u: number) => {
    let x = 0;
    for (let k = 0; k < n; k++) x += (tMu[k] * tQ[k]) / (w2[k] + u * u);
    return 2 * s * x;
  };
}

function component(o: AxialOrbitals, p: number, a: number, chi: Float64Array, n: number, G: number): Float64Array {
  const P = new Float64Array(G);
  for (let t = 0; t < n; t++) {
    const c = o.C[(o.offsets[a] + t) * o.count + p];
    if (c !== 0) for (let g = 0; g < G; g++) P[g] += c * chi[t * G + g];
  }
  return P;
}

/** B(0; iu, −iu) by the finite-field difference (Richardson over F and 2F). */
export function finiteFieldHyperB(Z: number, electrons: number, basis: SlaterBasis, field = 1e-3): (u: number) => number {
  const c = [field, -field, 2 * field, -2 * field].map((F) => crossResponse(Z, electrons, basis, F));
  return (u) => (8 * (c[0](u) - c[1](u)) - (c[2](u) - c[3](u))) / (12 * field);
}
