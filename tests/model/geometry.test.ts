/**
 * XYZ geometry parsing. The format (count line, comment line, `label x y z` in ångström) is the open de facto
 * standard (common practice); the ångström → bohr factor is checked against CODATA 2018
 * (a0 = 0.529177210903 Å; Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)).
 */
import { describe, expect, test } from 'vitest';
import { parseXyz } from '../../src/model/geometry.js';
import { BOHR_IN_ANGSTROM } from '../../src/model/units.js';
import { expectClose } from '../helpers/tolerance.js';
import { inputErrorOf } from '../helpers/input-error.js';

/** The input error thrown by f (its field carries file:line). */
const errorOf = inputErrorOf;

describe('parseXyz', () => {
  test('reads count, comment and labelled centres; ångström by default, bohr on request', () => {
    const text = '2\n an invented pair \nQuelon 0 0 0\nVirid 0.0 0.0 4.5\n\n';
    const g = parseXyz(text, { fileName: 'pair.xyz' });
    expect(g.comment).toBe('an invented pair');
    expect(g.centres.map((c) => [c.label, c.line])).toEqual([['Quelon', 3], ['Virid', 4]]);
    expectClose(g.centres[1].position[2], 4.5 / BOHR_IN_ANGSTROM, 1e-15);
    expectClose(g.centres[1].position[2], 4.5 / 0.529177210903, 1e-12); // CODATA 2018
    expect(parseXyz(text, { unit: 'bohr' }).centres[1].position).toEqual([0, 0, 4.5]);
  });
  test('accepts tabs, CRLF, exponents and Fortran D exponents', () => {
    const g = parseXyz('1\r\n\r\nX\t1e-1  -2.5D0 .5\r\n', { unit: 'bohr' });
    expect(g.centres[0].position).toEqual([0.1, -2.5, 0.5]);
  });
  const cases: Array<[string, string, RegExp]> = [
    ['', 'g.xyz:1', /number of centres.*empty line/],
    ['two\nc\nX 0 0 0\n', 'g.xyz:1', /number of centres.*"two"/],
    ['2\nc\nX 0 0 0\n', 'g.xyz:4', /centre 2 of 2.*end of the file/],
    ['2\nc\nX 0 0 0\n\nY 1 1 1\n', 'g.xyz:4', /centre 2 of 2.*empty line/],
    ['1\nc\nX 0 0\n', 'g.xyz:3', /4 fields\), got 3/],
    ['1\nc\nX 0 zero 0\n', 'g.xyz:3', /y coordinate "zero" is not a number/],
    ['1\nc\n1.0 0 0 0\n', 'g.xyz:3', /expected a label first/],
    ['1\nc\nX 0 0 0\nY 1 1 1\n', 'g.xyz:4', /unexpected content after the 1 centres/],
    ['3\nc\nX 0 0 0\nY 0 0 3\nZ 0 0 0.0000001\n', 'g.xyz:5', /coincides with centre X on line 3/],
  ];
  test.each(cases)('bad geometry %j fails at %s', (text, where, message) => {
    const e = errorOf(() => parseXyz(text, { fileName: 'g.xyz' }));
    expect(e.field).toBe(where);
    expect(e.problem).toMatch(message);
  });
});

describe('parseXyz at scale and with extended XYZ lines', () => {
  test('a fifth column (extended XYZ files carry one) is accepted and ignored', () => {
    const g = parseXyz('2\nc\nX 0 0 0 0.5\nY 0 0 3 -0.5\n', { fileName: 'g.xyz', unit: 'bohr' });
    expect(g.centres.map((c) => c.position)).toEqual([[0, 0, 0], [0, 0, 3]]);
  });

  test('the coincidence check finds a close pair among 50 000 centres (grid scan, not all pairs)', () => {
    // a 50 000-centre lattice with spacing 2 bohr and one centre moved onto its neighbour (0.0005 bohr away)
    const N = 50_000;
    const lines = ['' + N, 'lattice'];
    for (let k = 0; k < N; k++) lines.push(`X ${2 * (k % 100)} ${2 * (Math.floor(k / 100) % 100)} ${2 * Math.floor(k / 10_000)}`);
    const clean = parseXyz(lines.join('\n'), { unit: 'bohr' });
    expect(clean.centres).toHaveLength(N);
    lines[2 + N - 1] = 'X 2.0005 0 0';
    const e = errorOf(() => parseXyz(lines.join('\n'), { fileName: 'g.xyz', unit: 'bohr' }));
    expect(e.field).toBe(`g.xyz:${N + 2}`);
    expect(e.problem).toMatch(/coincides with centre X on line 4 \(5\.00e-4 bohr apart\)/);
  });
});
