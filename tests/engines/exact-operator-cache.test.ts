/**
 * The fast build of the finite-R pair operators against straightforward references: the cached monomial tables
 * against the ladder-operator action, the lower-triangle coupling operator against a dense element-by-element
 * evaluation on seeded random QDO pairs (spherical and axial), a model grown shell by shell against a fresh one,
 * the lower-triangle products against the complete rows, and the polish that stops once the dipoles have settled
 * against the one that runs its full course.
 */
import { describe, expect, test } from 'vitest';
import { circularCouplingTerms } from '../../src/engines/exact/circular-coupling.js';
import { ladderMonomialAction, ladderScale, localStates, monomialActionTable, type CircularMonomial } from '../../src/engines/exact/circular-states.js';
import { davidsonLowest, polishEigenvector } from '../../src/engines/exact/davidson.js';
import { prefixOperator, solveInBasis } from '../../src/engines/exact/ground-state.js';
import { pairBasis, type PairBasis } from '../../src/engines/exact/pair-basis.js';
import { exactModel, growExactModel, hamiltonianAt, type ExactModel } from '../../src/engines/exact/pair-hamiltonian.js';
import { denseGroup, expectationPrefix, fullFromLower, multiplyPrefix, type SparseOperator } from '../../src/engines/exact/sparse-operator.js';
import { drudeAnisotropic, type DrudeSpecies } from '../../src/model/drude.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { randomDrude } from '../helpers/random-species.js';
import { relDiff } from '../helpers/tolerance.js';

const TOL = 1e-13;

/** A random QDO that is axially symmetric about the bond axis (wx = wy), as the exact engine needs. */
function randomAxial(rand: () => number, name: string): DrudeSpecies {
  const s = randomDrude(rand, name, false);
  return drudeAnisotropic({ q: s.q, m: s.m, wx: s.w[0], wy: s.w[0], wz: s.w[2] }, name);
}

/** s⊥^(p+q) s_z^r with s = 1/sqrt(2 m w): the length factor of ρ+^p ρ−^q z^r on one centre (derived in pair-hamiltonian.ts). */
const lengths = (s: DrudeSpecies, [p, q, r]: CircularMonomial) =>
  (1 / Math.sqrt(2 * s.m * s.w[0])) ** (p + q) * (1 / Math.sqrt(2 * s.m * s.w[2])) ** r;

/**
 * Reference: the order-n coupling as a dense matrix on the basis, element by element from the ladder actions of
 * both centres, <S|O|T> = g_S g_T Σ_{s∈S, t∈T} <s|O|t> (g = 1/√2 for a mirror pair; common practice for a
 * symmetry-adapted basis), weight qA qB c 2^((pA+qA+pB+qB)/2) lengths (pair-hamiltonian.ts, derived there).
 */
function referenceCoupling(A: DrudeSpecies, B: DrudeSpecies, order: number, basis: PairBasis): Float64Array {
  const n = basis.size;
  const local = basis.local;
  const out = new Float64Array(n * n);
  const members = (k: number): Array<[number, number]> =>
    basis.paired[k]
      ? [
          [basis.repA[k], basis.repB[k]],
          [local.mirror[basis.repA[k]], local.mirror[basis.repB[k]]],
        ]
      : [[basis.repA[k], basis.repB[k]]];
  const g = (k: number) => (basis.paired[k] ? Math.SQRT1_2 : 1);
  for (let T = 0; T < n; T++)
    for (const [iA, iB] of members(T))
      for (const t of circularCouplingTerms(order)) {
        const planar = t.a[0] + t.a[1] + t.b[0] + t.b[1];
        const w = t.exact.valueOf() * 2 ** (planar / 2) * A.q * B.q * lengths(A, t.a) * lengths(B, t.b);
        const ea = ladderMonomialAction(local, t.a, iA), eb = ladderMonomialAction(local, t.b, iB);
        for (let j = 0; j < ea.targets.length; j++)
          for (let k = 0; k < eb.targets.length; k++) {
            const S = basis.lookup(ea.targets[j], eb.targets[k]);
            if (S >= 0) out[S * n + T] += g(S) * g(T) * w * ea.amps[j] * eb.amps[k];
          }
      }
  return out;
}

/** The dense matrix of one group of a (full or lower) operator. */
function denseOf(op: SparseOperator, group: number): Float64Array {
  const full = fullFromLower(op);
  const n = full.size, values = denseGroup(full, group);
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let k = full.rowPtr[i]; k < full.rowPtr[i + 1]; k++) out[i * n + full.col[k]] = values[k];
  return out;
}

const worstDifference = (a: Float64Array, b: Float64Array): number => {
  let scale = 0, worst = 0;
  for (let k = 0; k < a.length; k++) {
    scale = Math.max(scale, Math.abs(b[k]));
    worst = Math.max(worst, Math.abs(a[k] - b[k]));
  }
  return scale > 0 ? worst / scale : worst;
};

describe('monomial tables', () => {
  test('integer coefficients × scales reproduce the ladder action of every monomial up to degree 6 (common practice: ladder algebra)', () => {
    const maxQuanta = 7;
    for (let p = 0; p <= 6; p++)
      for (let q = 0; p + q <= 6; q++)
        for (let r = 0; p + q + r <= 6; r++) {
          const mono: CircularMonomial = [p, q, r];
          const table = monomialActionTable(mono, maxQuanta);
          const reach = localStates(maxQuanta + p + q + r);
          for (let i = 0; i < localStates(maxQuanta).count; i++) {
            const ref = ladderMonomialAction(reach, mono, i);
            const got = new Map<number, number>();
            for (let k = table.start[i]; k < table.start[i + 1]; k++) {
              expect(Number.isInteger(table.coefficients[k])).toBe(true);
              if (k > table.start[i]) expect(table.targets[k]).toBeGreaterThan(table.targets[k - 1]);
              got.set(table.targets[k], table.coefficients[k] * ladderScale(reach, i, table.targets[k]));
            }
            expect(got.size).toBe(ref.targets.length);
            ref.targets.forEach((t, k) => expect(relDiff(got.get(t) ?? 0, ref.amps[k])).toBeLessThan(TOL));
          }
        }
  });
});

describe('coupling operator against the element-by-element reference (seeded random QDO pairs)', () => {
  const rand = seededRandom(2026_12_02);
  const cases: Array<[DrudeSpecies, DrudeSpecies, number, number, boolean]> = [
    [randomDrude(rand, 'A1', true), randomDrude(rand, 'B1', true), 6, 6, true],
    [randomAxial(rand, 'A2'), randomAxial(rand, 'B2'), 7, 5, true],
    [randomDrude(rand, 'A3', true), randomAxial(rand, 'B3'), 5, 6, true],
    [randomAxial(rand, 'A4'), randomDrude(rand, 'B4', true), 4, 4, false],
  ];
  test.each(cases)('%#: every order of the coupling to 1e-13, and symmetric', (A, B, order, N, reduced) => {
    const model = exactModel(A, B, { order, maxQuanta: N, reduced });
    for (let n = 2; n <= order; n++) {
      const got = denseOf(model.lower, n - 2);
      expect(worstDifference(got, referenceCoupling(A, B, n, model.basis))).toBeLessThan(TOL);
      const size = model.basis.size;
      for (let i = 0; i < size; i++) for (let j = 0; j < i; j++) expect(got[i * size + j]).toBe(got[j * size + i]);
    }
  });

  test('a spherical centre in its ground state on both sides carries no permanent multipole: those elements are exactly 0', () => {
    // the ground state of an isotropic oscillator is spherical, so its permanent multipole moments (rank ≥ 1)
    // vanish (common practice; e.g. A. J. Stone, The Theory of Intermolecular Forces, 2nd ed., OUP 2013 — quoted
    // from memory); here the cancellation between the Cartesian terms must be exact, not a rounding residue
    const A = randomDrude(rand, 'A5', true), B = randomDrude(rand, 'B5', true);
    const model = exactModel(A, B, { order: 6, maxQuanta: 7 });
    const { lower, basis } = model;
    let checked = 0;
    for (let T = 0; T < basis.size; T++)
      for (let k = lower.rowPtr[T]; k < lower.rowPtr[T + 1]; k++) {
        const S = lower.col[k];
        const aGround = basis.repA[S] === 0 && basis.repA[T] === 0, bGround = basis.repB[S] === 0 && basis.repB[T] === 0;
        if (!aGround && !bGround) continue;
        checked++;
        lower.groups.forEach((_, g) => expect(denseGroup(lower, g)[k]).toBe(0));
      }
    // the exact zeros are not even stored
    expect(checked).toBe(0);
    const reference = referenceCoupling(A, B, 5, basis);
    const n = basis.size;
    let referenceResidue = 0;
    for (let S = 0; S < n; S++)
      for (let T = 0; T < n; T++) if (basis.repA[S] === 0 && basis.repA[T] === 0) referenceResidue = Math.max(referenceResidue, Math.abs(reference[S * n + T]));
    expect(referenceResidue).toBeLessThan(1e-12); // the plain sum cancels only to rounding
  });
});

describe('models grown shell by shell', () => {
  test('a model grown 5 → 8 → 11 quanta (through a reallocation of its rows) equals a fresh one bit for bit', () => {
    const rand = seededRandom(77);
    const A = randomDrude(rand, 'A', true), B = randomAxial(rand, 'B');
    let grown: ExactModel = exactModel(A, B, { order: 6, maxQuanta: 5 });
    const small = grown;
    const smallValues = small.lower.groups.map((g) => Float64Array.from(g.value));
    for (const N of [8, 11]) grown = growExactModel(grown, N);
    const fresh = exactModel(A, B, { order: 6, maxQuanta: 11 });
    for (const key of ['lower', 'dipoleA', 'dipoleB'] as const) {
      const a = grown[key], b = fresh[key];
      expect(Array.from(a.rowPtr)).toEqual(Array.from(b.rowPtr));
      expect(Array.from(a.col)).toEqual(Array.from(b.col));
      a.groups.forEach((g, k) => {
        expect(Array.from(g.entry)).toEqual(Array.from(b.groups[k].entry));
        expect(Array.from(g.value)).toEqual(Array.from(b.groups[k].value));
      });
    }
    expect(grown.lower.store).not.toBe(small.lower.store); // the rows outgrew the first store
    // the smaller model is untouched
    small.lower.groups.forEach((g, k) => expect(Array.from(g.value)).toEqual(Array.from(smallValues[k])));
  });
});

describe('lower-triangle products', () => {
  test('(H + diag) x and <x|M|x> on nested prefixes agree with the complete rows to 1e-13', () => {
    const rand = seededRandom(4242);
    const A = randomAxial(rand, 'A'), B = randomDrude(rand, 'B', true);
    const model = exactModel(A, B, { order: 7, maxQuanta: 8 });
    const R = uniform(rand, 9, 14);
    const lowerH = hamiltonianAt(model, R, model.basis.size, undefined, 'lower');
    const fullH = hamiltonianAt(model, R);
    for (const N of [5, 8]) {
      const dim = model.basis.prefixSize[N];
      const x = Float64Array.from({ length: dim }, () => uniform(rand, -1, 1));
      const y1 = new Float64Array(dim), y2 = new Float64Array(dim);
      multiplyPrefix(model.lower, lowerH.values, lowerH.diagonal, x, y1, dim);
      multiplyPrefix(model.coupling, fullH.values, fullH.diagonal, x, y2, dim);
      expect(worstDifference(y1, y2)).toBeLessThan(TOL);
      const full = fullFromLower(model.dipoleA);
      expect(
        relDiff(expectationPrefix(model.dipoleA, denseGroup(model.dipoleA, 0), x, dim), expectationPrefix(full, denseGroup(full, 0), x, dim)),
      ).toBeLessThan(TOL);
    }
  });
});

describe('polish that stops once the dipoles have settled', () => {
  test('gives the dipoles and energy of the full-length polish to 1e-13 in fewer sweeps', () => {
    const rand = seededRandom(909);
    for (let trial = 0; trial < 3; trial++) {
      const A = randomDrude(rand, 'A', true), B = randomDrude(rand, 'B', true);
      const model = exactModel(A, B, { order: 6, maxQuanta: 9 });
      const R = uniform(rand, 12, 30);
      const H = hamiltonianAt(model, R, model.basis.size, undefined, 'lower');
      const dim = model.basis.prefixSize[9];
      const solved = solveInBasis(model, H, 9, 1e-10); // watched polish
      const op = prefixOperator(model, H, dim);
      const coarse = davidsonLowest(op, { tolerance: 1e-10 });
      const long = polishEigenvector(op, coarse, 1e-10); // runs its full course
      const mu = (v: Float64Array) => expectationPrefix(model.dipoleA, denseGroup(model.dipoleA, 0), v, dim);
      expect(relDiff(solved.energy, long.value)).toBeLessThan(TOL);
      expect(relDiff(solved.muA, mu(long.vector))).toBeLessThan(TOL);
      expect(solved.residual).toBeLessThan(1e-15);
    }
  });
});
