/**
 * The truncated product basis of a pair: |iA> ⊗ |iB> with at most N quanta in total (both centres together),
 * optionally reduced by the pair's symmetries when both centres are axially symmetric about the bond axis:
 *  - L_z of the pair is conserved, so only m_A + m_B = 0 (the sector of the ground state |0 0>) is kept;
 *  - the joint mirror y → −y commutes with H, so only its even combinations (|s> + |σs>)/√2 are kept
 *    (a state that is its own mirror image enters alone).
 * Functions are ordered by total quanta, so the basis for N quanta is a prefix of the basis for N + 1:
 * nested bases, whose lowest eigenvalues can only decrease (Cauchy interlacing; common practice).
 */
import { localStates, type LocalStates } from './circular-states.js';

export interface PairBasis {
  local: LocalStates;
  maxQuanta: number;
  /** True for the symmetry-reduced basis (L_z = 0, mirror-even). */
  reduced: boolean;
  size: number;
  /** Representative product state of each basis function. */
  repA: Int32Array;
  repB: Int32Array;
  /** 1 when the function is (|s> + |σs>)/√2 with σs ≠ s. */
  paired: Uint8Array;
  quanta: Int32Array;
  /** prefixSize[N] = number of functions with at most N quanta, N = 0 … maxQuanta. */
  prefixSize: Int32Array;
  /** Basis function containing the product state (iA, iB), or −1. */
  lookup(iA: number, iB: number): number;
}

/** Number of product states of two 3D oscillators with at most N quanta in total: C(N + 6, 6). */
export function fullProductDimension(N: number): number {
  let r = 1;
  for (let k = 1; k <= 6; k++) r = (r * (N + k)) / k;
  return Math.round(r);
}

/** Build the pair basis with at most `maxQuanta` quanta in total. */
export function pairBasis(maxQuanta: number, reduced: boolean): PairBasis {
  const local = localStates(maxQuanta);
  const L = local.count;
  const entries: Array<{ key: number; quanta: number; paired: boolean }> = [];
  for (let iA = 0; iA < L; iA++)
    for (let iB = 0; iB < L; iB++) {
      const quanta = local.quanta[iA] + local.quanta[iB];
      if (quanta > maxQuanta) continue;
      if (!reduced) {
        entries.push({ key: iA * L + iB, quanta, paired: false });
        continue;
      }
      if (local.m[iA] + local.m[iB] !== 0) continue;
      const key = iA * L + iB;
      const mirrorKey = local.mirror[iA] * L + local.mirror[iB];
      if (mirrorKey < key) continue; // the representative is the smaller key
      entries.push({ key, quanta, paired: mirrorKey !== key });
    }
  entries.sort((u, v) => u.quanta - v.quanta || u.key - v.key);
  const size = entries.length;
  const repA = new Int32Array(size), repB = new Int32Array(size), quanta = new Int32Array(size);
  const paired = new Uint8Array(size);
  // product state → basis function: a dense table while it is small, else a hash map
  const dense = L * L <= 2 ** 24 ? new Int32Array(L * L).fill(-1) : undefined;
  const sparse = dense ? undefined : new Map<number, number>();
  const setIndex = (key: number, k: number) => (dense ? (dense[key] = k) : sparse!.set(key, k));
  entries.forEach((e, k) => {
    repA[k] = Math.floor(e.key / L);
    repB[k] = e.key % L;
    quanta[k] = e.quanta;
    paired[k] = e.paired ? 1 : 0;
    setIndex(e.key, k);
    if (e.paired) setIndex(local.mirror[repA[k]] * L + local.mirror[repB[k]], k);
  });
  const prefixSize = new Int32Array(maxQuanta + 1);
  for (const q of quanta) prefixSize[q]++;
  for (let n = 1; n <= maxQuanta; n++) prefixSize[n] += prefixSize[n - 1];
  return {
    local,
    maxQuanta,
    reduced,
    size,
    repA,
    repB,
    paired,
    quanta,
    prefixSize,
    lookup: dense ? (iA, iB) => dense[iA * L + iB] : (iA, iB) => sparse!.get(iA * L + iB) ?? -1,
  };
}
