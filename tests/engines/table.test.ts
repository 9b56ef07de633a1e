import { describe, expect, test } from 'vitest';
import { computePair } from '../../src/engines/pair.js';
import { allPairs, computeTable, requireDistinctSpecies, rowStatus, selectPairs, untrustedCount } from '../../src/engines/table.js';
import { drude, drudeFromTargets, drudeMultipolePolarisability } from '../../src/model/drude.js';
import { demoSpecies, resolveSpecies } from '../../src/model/builtin-species.js';
import type { Species } from '../../src/model/species.js';
import { seededRandom, uniform } from '../helpers/random.js';
import { expectClose } from '../helpers/tolerance.js';

const rand = seededRandom(20240611);
/** Eight seeded random isotropic QDOs (invented test data). */
const randomSpecies: Species[] = Array.from({ length: 8 }, (_, i) =>
  drude({ q: uniform(rand, 0.7, 1.9), m: uniform(rand, 0.25, 0.8), w: uniform(rand, 0.4, 1.2) }, `R${i}`),
);
const OPTIONS = { routes: ['perturbation', 'response'], agreement: 1e-8 };
const iso = (s: Species) => ({ q: s.q, m: s.m, w: s.w[0] });

describe('allPairs(species) lists every unordered pair once, like pairs included, in list order', () => {
  test('n species give n(n+1)/2 pairs with A before B in the list', () => {
    const pairs = allPairs(randomSpecies);
    expect(pairs).toHaveLength((8 * 9) / 2);
    expect(pairs.slice(0, 3).map(([a, b]) => `${a.name}-${b.name}`)).toEqual(['R0-R0', 'R0-R1', 'R0-R2']);
    expect(pairs.at(-1)!.map((s) => s.name)).toEqual(['R7', 'R7']);
    expect(new Set(pairs.map(([a, b]) => [a.name, b.name].sort().join('|'))).size).toBe(pairs.length);
  });
  test('a species listed twice is rejected, naming it', () => {
    const q = resolveSpecies('Quelon');
    expect(() => requireDistinctSpecies([q, resolveSpecies('virid'), resolveSpecies('quelon')])).toThrow(
      'species: "Quelon" is listed twice; list each species once',
    );
    expect(() => requireDistinctSpecies([q])).not.toThrow();
  });
});

describe('computeTable(pairs): each row is the computePair result of its pair', () => {
  const table = computeTable(allPairs(randomSpecies), OPTIONS);

  test('rows equal individual computePair results, in order', () => {
    expect(table.rows).toHaveLength(36);
    allPairs(randomSpecies).forEach(([a, b], i) => {
      expect(table.rows[i].result).toEqual(computePair(a, b, OPTIONS));
      expect(table.rows[i].status).toBe('ok');
    });
    expect(table.species.map((s) => s.name)).toEqual(randomSpecies.map((s) => s.name));
    expect(table.settings).toEqual({ routes: ['perturbation', 'response'], routesRun: ['perturbation', 'response'], agreement: 1e-8 });
  });

  test('like pairs: D7.total = 0 and D7.a = −D7.b < 0 (mirror symmetry of the pair; derived here)', () => {
    for (const row of table.rows.filter((r) => r.result.a === r.result.b)) {
      const d = row.result.coefficients.D7;
      expect(d.a).toBeLessThan(0);
      expectClose(d.b, -d.a, 1e-13);
      expect(Math.abs(d.total)).toBeLessThanOrEqual(1e-13 * Math.abs(d.a));
    }
  });

  test('C6 of every row follows London: C6 = (3/2) αA αB wA wB/(wA + wB) (F. London, Z. Phys. Chem. B 11, 222 (1930))', () => {
    for (const { result: r } of table.rows) {
      const A = iso(r.a), B = iso(r.b);
      const aA = A.q ** 2 / (A.m * A.w ** 2), aB = B.q ** 2 / (B.m * B.w ** 2);
      expectClose(r.coefficients.C6, (1.5 * aA * aB * A.w * B.w) / (A.w + B.w), 1e-12, 0, `${r.a.name}-${r.b.name}`);
    }
  });

  test('C8 of every row follows the Casimir–Polder form C8 = (15/2π)∫(α1A α2B + α2A α1B) du with QDO α_l(iu)', () => {
    // (15/2π)∫ α1(iu) α2(iu) du for α_l(iu) = α_l (lw)²/((lw)² + u²) gives
    // C8 = (15/2) wA wB [α1A α2B/(wA + 2wB) + α2A α1B/(2wA + wB)] (derived here; the integral form as in
    // A. Dalgarno, Adv. Chem. Phys. 12, 143 (1967), quoted from memory; α_l of a QDO from A. P. Jones et al.,
    // Phys. Rev. B 87, 144103 (2013), quoted from memory)
    for (const { result: r } of table.rows) {
      const A = iso(r.a), B = iso(r.b);
      const [a1, a2, b1, b2] = [drudeMultipolePolarisability(A, 1), drudeMultipolePolarisability(A, 2), drudeMultipolePolarisability(B, 1), drudeMultipolePolarisability(B, 2)];
      const expected = 7.5 * A.w * B.w * ((a1 * b2) / (A.w + 2 * B.w) + (a2 * b1) / (2 * A.w + B.w));
      expectClose(r.coefficients.C8!, expected, 1e-12, 0, `${r.a.name}-${r.b.name}`);
    }
  });

  test('D7.a of every row equals −9 qA³ qB² / (mA² wA³ mB wB (wA + wB)) (derived here, README "Route response")', () => {
    for (const { result: r } of table.rows) {
      const A = iso(r.a), B = iso(r.b);
      const expected = (-9 * A.q ** 3 * B.q ** 2) / (A.m ** 2 * A.w ** 3 * B.m * B.w * (A.w + B.w));
      expectClose(r.coefficients.D7.a, expected, 1e-12, 0, `${r.a.name}-${r.b.name}`);
    }
  });

  test('a fitted species reproduces its like-pair targets in the table (mapping of Jones et al., Phys. Rev. B 87, 144103 (2013))', () => {
    const fitted = drudeFromTargets({ alpha: 11.08, C6: 64.3, C8: 1623 }, 'F');
    const t = computeTable([[fitted, fitted]], OPTIONS);
    expectClose(t.rows[0].result.coefficients.C6, 64.3, 1e-12);
    expectClose(t.rows[0].result.coefficients.C8!, 1623, 1e-12);
  });

  test('onProgress is called once per pair with (done, total)', () => {
    const calls: Array<[number, number]> = [];
    computeTable(allPairs(randomSpecies.slice(0, 3)), { ...OPTIONS, onProgress: (d, t) => calls.push([d, t]) });
    expect(calls).toEqual([[1, 6], [2, 6], [3, 6], [4, 6], [5, 6], [6, 6]]);
  });
});

describe('row status', () => {
  test('routes that disagree beyond the agreement make a row UNTRUSTED', () => {
    // a spread of ~1e-16 exceeds an agreement of 1e-300; an exact zero spread would not, so check it is nonzero
    const t = computeTable(allPairs(demoSpecies.slice(0, 2)), { ...OPTIONS, agreement: 1e-300 });
    for (const row of t.rows) {
      expect(row.result.spread.max).toBeGreaterThan(0);
      expect(row.status).toBe('UNTRUSTED');
    }
    expect(untrustedCount(t)).toBe(3);
  });
  test('a truncated perturbation basis (1 quantum per centre) is unconverged → UNTRUSTED', () => {
    const [a, b] = demoSpecies;
    expect(rowStatus(computePair(a, b, { ...OPTIONS, maxQuanta: 1 }))).toBe('UNTRUSTED');
  });
  test('a single route is "unchecked", not "ok"', () => {
    const [a, b] = demoSpecies;
    expect(rowStatus(computePair(a, b, { routes: ['perturbation'] }))).toBe('unchecked');
    expect(rowStatus(computePair(a, b, OPTIONS))).toBe('ok');
  });
  test('an empty pair list is bad input', () => {
    expect(() => computeTable([])).toThrow('species: none given: the table needs at least one pair');
  });
});

describe('selectPairs(--pairs entries)', () => {
  const [Quelon, Virid, Sorrel] = demoSpecies;
  const listed = [Quelon, Virid, Sorrel];
  const names = (pairs: ReturnType<typeof selectPairs>) => pairs.map(([a, b]) => `${a.name}/${b.name}`);

  test('names (any case), 1-based positions, commas and repeated options; order and orientation as given', () => {
    expect(names(selectPairs(['Quelon-Virid,sorrel-quelon', '3-3', '2-1'], listed))).toEqual([
      'Quelon/Virid', 'Sorrel/Quelon', 'Sorrel/Sorrel', 'Virid/Quelon',
    ]);
  });
  test('names outside the list go to the fallback (built-in names)', () => {
    expect(names(selectPairs(['Tarnet-Quelon'], [], (t) => resolveSpecies(t)))).toEqual(['Tarnet/Quelon']);
  });
  test('a name containing "-" is split where both sides are known', () => {
    const hy = drude({ q: 1, m: 1, w: 1 }, 'Ar-like');
    expect(names(selectPairs(['Ar-like-Quelon', 'Quelon-Ar-like'], [hy, Quelon]))).toEqual(['Ar-like/Quelon', 'Quelon/Ar-like']);
  });
  test.each([
    [['Quelon+Virid'], '--pairs entry "Quelon+Virid": must be two species joined by "-", e.g. Quelon-Virid'],
    [['Quelon-Nobody'], '--pairs entry "Quelon-Nobody": "Nobody" is not a species of this table; use a name (Quelon, Virid, Sorrel) or a position 1…3'],
    [['Quelon-4'], '--pairs entry "Quelon-4": "4" is not a species of this table'],
    [['Quelon-Virid,Quelon-Virid'], '--pairs entry "Quelon-Virid": repeats the pair Quelon–Virid; list each pair once'],
    [['Quelon-Virid,'], '--pairs: has an empty entry'],
    [['Quelon-'], '--pairs entry "Quelon-": "" is not a species of this table'],
  ])('%j is rejected: %s', (entries, message) => {
    expect(() => selectPairs(entries, listed)).toThrow(message);
  });
  test('an entry that splits two ways is ambiguous', () => {
    const a = drude({ q: 1, m: 1, w: 1 }, 'X'), b = drude({ q: 1, m: 1, w: 1.1 }, 'X-Y'), c = drude({ q: 1, m: 1, w: 1.2 }, 'Y-Z'), d = drude({ q: 1, m: 1, w: 1.3 }, 'Z');
    expect(() => selectPairs(['X-Y-Z'], [a, b, c, d])).toThrow('--pairs entry "X-Y-Z": is ambiguous: it splits into X and Y-Z, or X-Y and Z; refer to the species by position');
  });
});
