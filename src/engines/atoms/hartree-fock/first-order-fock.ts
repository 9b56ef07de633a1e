/**
 * The first-order Fock operator W = X + G(P¹) of a rank-K perturbation X = ε Q_K0 in every block (occupied and
 * virtual orbitals alike), in reduced form per pair of channels (W[p, q] with the per-m factor γ^K(m) of
 * angular-coupling.ts). The first-order density P¹ is given by its coupled particle–hole amplitudes x (P_ai) and
 * y (P_ia) on the excitation blocks of linear-response.ts.
 *
 *   G(P)_pq = Σ_bj x_bj [s⟨pj|qb⟩ − ⟨pj|bq⟩] + y_bj [s⟨pb|qj⟩ − ⟨pb|jq⟩]
 * (closed-shell two-electron operator G(P) = s J(P) − K(P); derived here from the Slater–Condon rules).
 */
import { connects, coupledFactor, reducedLegendre } from './angular-coupling.js';
import type { ExcitationBlock } from './linear-response.js';
import type { OrbitalPotentials } from './orbital-potentials.js';
import type { HartreeFockAtom } from './scf.js';

/** Reduced blocks keyed "lp,lq" (m_lp × m_lq, row-major). */
export type ReducedOperator = Map<string, Float64Array>;

/** Channel pairs (lp ≤ lq ≤ lMax) a rank-K operator connects. */
export function channelPairs(K: number, lMax: number): [number, number][] {
  const out: [number, number][] = [];
  for (let lp = 0; lp <= lMax; lp++) for (let lq = lp; lq <= lMax; lq++) if (connects(lp, K, lq)) out.push([lp, lq]);
  return out;
}

/** Reduced matrix of Q_K0 = −r^K P_K(cos θ) between all orbitals of the channel pairs. */
export function multipoleOperator(atom: HartreeFockAtom, K: number, lMax: number): ReducedOperator {
  const { r, w } = atom.basis.grid;
  const G = r.length;
  const rk = Float64Array.from(r, (x, t) => x ** K * w[t]);
  const out: ReducedOperator = new Map();
  for (const [lp, lq] of channelPairs(K, lMax)) {
    const cp = atom.channels[lp], cq = atom.channels[lq];
    const ang = -reducedLegendre(lp, K, lq);
    const M = new Float64Array(cp.m * cq.m);
    for (let p = 0; p < cp.m; p++)
      for (let q = 0; q < cq.m; q++) {
        let s = 0;
        for (let g = 0; g < G; g++) s += cp.P[p * G + g] * cq.P[q * G + g] * rk[g];
        M[p * cq.m + q] = ang * s;
      }
    out.set(`${lp},${lq}`, M);
  }
  return out;
}

/**
 * G(P¹) in reduced form for the channel pairs lp ≤ lq ≤ lMax; for P¹ symmetric (x = y) G is symmetric, for P¹
 * antisymmetric (x = −y) antisymmetric, so the pairs lp > lq follow. With `diagonalBlocksOnly` only the
 * occupied–occupied and virtual–virtual elements are computed (the rest stay 0): all the quadratic response needs.
 */
export function twoElectronResponse(
  atom: HartreeFockAtom,
  pots: OrbitalPotentials,
  K: number,
  blocks: readonly ExcitationBlock[],
  x: Float64Array,
  y: Float64Array,
  lMax: number,
  diagonalBlocksOnly = false,
): ReducedOperator {
  const G = pots.G, s = atom.s, ch = atom.channels;
  const out: ReducedOperator = new Map();
  // perturbed orbitals δx_j = Σ_b x_bj P_b and δy_j per block
  const dx = new Map<ExcitationBlock, Float64Array>(), dy = new Map<ExcitationBlock, Float64Array>();
  for (const Y of blocks) {
    const cb = ch[Y.la];
    const fx = new Float64Array(G), fy = new Float64Array(G);
    for (let t = 0; t < Y.count; t++) {
      const xb = x[Y.offset + t], yb = y[Y.offset + t];
      const o = (cb.nOcc + t) * G;
      for (let g = 0; g < G; g++) {
        fx[g] += xb * cb.P[o + g];
        fy[g] += yb * cb.P[o + g];
      }
    }
    dx.set(Y, fx);
    dy.set(Y, fy);
  }
  const byOccupied = new Map<string, { lj: number; j: number; blocks: ExcitationBlock[] }>();
  for (const Y of blocks) {
    const key = `${Y.li},${Y.i}`;
    if (!byOccupied.has(key)) byOccupied.set(key, { lj: Y.li, j: Y.i, blocks: [] });
    byOccupied.get(key)!.blocks.push(Y);
  }
  const row = new Float64Array(G);
  for (const [lp, lq] of channelPairs(K, lMax)) {
    const cp = ch[lp], cq = ch[lq];
    const M = new Float64Array(cp.m * cq.m);
    // direct: s Σ_b (f1 x_b + f3 y_b) ∫ P_p P_q V^K[P_j P_b]
    const v = new Float64Array(G);
    for (const Y of blocks) {
      const f1 = coupledFactor(lp, lq, Y.la, Y.li, K, K, [1, 2, 3, 4]);
      const f3 = coupledFactor(lp, lq, Y.la, Y.li, K, K, [1, 2, 4, 3]);
      if (f1 === 0 && f3 === 0) continue;
      const V = pots.potentials(Y.li, Y.i, Y.la, K);
      const cb = ch[Y.la];
      for (let t = 0; t < Y.count; t++) {
        const c = s * (f1 * x[Y.offset + t] + f3 * y[Y.offset + t]);
        if (c === 0) continue;
        const o = (cb.nOcc + t) * G;
        for (let g = 0; g < G; g++) v[g] += c * V[o + g];
      }
    }
    const qRange = (p: number): [number, number] => (!diagonalBlocksOnly ? [0, cq.m] : p < cp.nOcc ? [0, cq.nOcc] : [cq.nOcc, cq.m]);
    const pRange = (q: number): [number, number] => (!diagonalBlocksOnly ? [0, cp.m] : q < cq.nOcc ? [0, cp.nOcc] : [cp.nOcc, cp.m]);
    for (let p = 0; p < cp.m; p++) {
      for (let g = 0; g < G; g++) row[g] = cp.P[p * G + g] * v[g];
      const [q0, q1] = qRange(p);
      for (let q = q0; q < q1; q++) {
        let t = 0;
        const o = q * G;
        for (let g = 0; g < G; g++) t += row[g] * cq.P[o + g];
        M[p * cq.m + q] += t;
      }
    }
    // exchange, per occupied orbital j and rank k: the perturbed orbitals of all its blocks, weighted by their
    // angular factors, are summed first (one contraction per j and k instead of one per block)
    for (const group of byOccupied.values()) {
      const { lj, j } = group;
      const kMax = Math.max(lp, lq) + Math.max(lj, ...group.blocks.map((Y) => Y.la));
      for (let k = 0; k <= kMax; k++) {
        // −Σ_b f2 ∫ P_p δx_j V^k[P_j P_q]
        let dxk: Float64Array | undefined;
        let dyk: Float64Array | undefined;
        for (const Y of group.blocks) {
          const lb = Y.la;
          if (connects(lp, k, lb) && connects(lq, k, lj)) {
            const f2 = coupledFactor(lp, lq, lb, lj, K, k, [1, 3, 2, 4]);
            if (f2 !== 0) {
              dxk ??= new Float64Array(G);
              const d = dx.get(Y)!;
              for (let g = 0; g < G; g++) dxk[g] += f2 * d[g];
            }
          }
          if (connects(lp, k, lj) && connects(lq, k, lb)) {
            const f4 = coupledFactor(lp, lq, lb, lj, K, k, [1, 4, 2, 3]);
            if (f4 !== 0) {
              dyk ??= new Float64Array(G);
              const d = dy.get(Y)!;
              for (let g = 0; g < G; g++) dyk[g] += f4 * d[g];
            }
          }
        }
        if (dxk) {
          const V = pots.potentials(lj, j, lq, k);
          for (let p = 0; p < cp.m; p++) {
            for (let g = 0; g < G; g++) row[g] = cp.P[p * G + g] * dxk[g];
            const [q0, q1] = qRange(p);
            for (let q = q0; q < q1; q++) {
              let t = 0;
              const o = q * G;
              for (let g = 0; g < G; g++) t += row[g] * V[o + g];
              M[p * cq.m + q] -= t;
            }
          }
        }
        if (dyk) {
          const V = pots.potentials(lj, j, lp, k);
          for (let q = 0; q < cq.m; q++) {
            for (let g = 0; g < G; g++) row[g] = cq.P[q * G + g] * dyk[g];
            const [p0, p1] = pRange(q);
            for (let p = p0; p < p1; p++) {
              let t = 0;
              const o = p * G;
              for (let g = 0; g < G; g++) t += row[g] * V[o + g];
              M[p * cq.m + q] -= t;
            }
          }
        }
      }
    }
    out.set(`${lp},${lq}`, M);
  }
  return out;
}

/** Element (p, q) of a reduced operator given for lp ≤ lq, with the (anti)symmetry `sign` for lp > lq. */
export function reducedElement(op: ReducedOperator, lp: number, p: number, lq: number, q: number, mq: number, mp: number, sign: number): number {
  if (lp <= lq) {
    const M = op.get(`${lp},${lq}`);
    return M ? M[p * mq + q] : 0;
  }
  const M = op.get(`${lq},${lp}`);
  return M ? sign * M[q * mp + p] : 0;
}
