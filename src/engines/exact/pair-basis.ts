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
  /**
   * The reduced basis's lookup as arrays (for hot loops): the function of (iA, iB) with m(iA) + m(iB) = 0 is
   * table[block[iA] + rank[iB]] (−1 when none).
   */
  compact?: { block: Int32Array; rank: Int32Array; table: Int32Array };
}

/** Number of product states of two 3D oscillators with at most N quanta in total: C(N + 6, 6). */
export function fullProductDimension(N: number): number {
  let r = 1;
  for (let k = 1; k <= 6; k++) r = (r * (N + k)) / k;
  return Math.round(r);
}

/**
 * Build the pair basis with at most `maxQuanta` quanta in total. The functions come out in their final order
 * directly: shell by shell of total quanta, and within a shell by (iA, iB) (local states are enumerated by total
 * quanta, so the states of one shell are a contiguous index range). The reduced basis looks product states up in
 * a compact table: a state jA meets only partners of magnetic number −m(jA), so each jA gets one block indexed by
 * the partner's rank among the states of its m.
 */
export function pairBasis(maxQuanta: number, reduced: boolean): PairBasis {
  const local = localStates(maxQuanta);
  const L = local.count;
  const shellStart = new Int32Array(maxQuanta + 2);
  for (let i = 0; i < L; i++) shellStart[local.quanta[i] + 1] = i + 1;
  const repAList: number[] = [], repBList: number[] = [], quantaList: number[] = [], pairedList: number[] = [];
  for (let q = 0; q <= maxQuanta; q++)
    for (let iA = 0; iA < shellStart[q + 1]; iA++) {
      const rest = q - local.quanta[iA];
      for (let iB = shellStart[rest]; iB < shellStart[rest + 1]; iB++) {
        if (!reduced) {
          repAList.push(iA);
          repBList.push(iB);
          quantaList.push(q);
          pairedList.push(0);
          continue;
        }
        if (local.m[iA] + local.m[iB] !== 0) continue;
        const mA = local.mirror[iA], mB = local.mirror[iB];
        if (mA < iA || (mA === iA && mB < iB)) continue; // the representative is the smaller (iA, iB)
        repAList.push(iA);
        repBList.push(iB);
        quantaList.push(q);
        pairedList.push(mA === iA && mB === iB ? 0 : 1);
      }
    }
  const size = repAList.length;
  const repA = Int32Array.from(repAList), repB = Int32Array.from(repBList), quanta = Int32Array.from(quantaList);
  const paired = Uint8Array.from(pairedList);
  const prefixSize = new Int32Array(maxQuanta + 1);
  for (const q of quanta) prefixSize[q]++;
  for (let n = 1; n <= maxQuanta; n++) prefixSize[n] += prefixSize[n - 1];
  let lookup: (iA: number, iB: number) => number;
  let compact: PairBasis['compact'];
  const setAll = (set: (iA: number, iB: number, k: number) => void) => {
    for (let k = 0; k < size; k++) {
      set(repA[k], repB[k], k);
      if (paired[k]) set(local.mirror[repA[k]], local.mirror[repB[k]], k);
    }
  };
  if (reduced) {
    // rank of each state among the states of its m, and the block of each jA (partners of m = −m(jA))
    const offsetM = maxQuanta; // m runs over −maxQuanta … maxQuanta
    const classSize = new Int32Array(2 * maxQuanta + 1);
    const rank = new Int32Array(L);
    for (let i = 0; i < L; i++) rank[i] = classSize[local.m[i] + offsetM]++;
    const block = new Int32Array(L);
    let total = 0;
    for (let i = 0; i < L; i++) {
      block[i] = total;
      total += classSize[offsetM - local.m[i]];
    }
    const table = new Int32Array(total).fill(-1);
    setAll((a, b, k) => (table[block[a] + rank[b]] = k));
    lookup = (iA, iB) => (local.m[iA] + local.m[iB] === 0 ? table[block[iA] + rank[iB]] : -1);
    compact = { block, rank, table };
  } else if (L * L <= 2 ** 24) {
    const dense = new Int32Array(L * L).fill(-1);
    setAll((a, b, k) => (dense[a * L + b] = k));
    lookup = (iA, iB) => dense[iA * L + iB];
  } else {
    const sparse = new Map<number, number>();
    setAll((a, b, k) => sparse.set(a * L + b, k));
    lookup = (iA, iB) => sparse.get(iA * L + iB) ?? -1;
  }
  return { local, maxQuanta, reduced, size, repA, repB, paired, quanta, prefixSize, lookup, ...(compact ? { compact } : {}) };
}
