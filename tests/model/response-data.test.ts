/** Parsing user response data: the text format, units, and errors that name the line and column. */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/tolerance.js';
import { inputErrorOf as errorOf } from '../helpers/input-error.js';
import { oscillatorSpectrum, parseResponseData, responseDataFromText } from '../../src/model/response-data.js';
import { parseSpeciesFile } from '../../src/model/species-file.js';
import { describeSpecies } from '../../src/model/species.js';
import { BOHR_IN_ANGSTROM, HARTREE_IN_EV } from '../../src/model/units.js';

/** An invented table (demo numbers only): a one-pole alpha(iu) = 4/(1 + u²) and B(iu) = −10/(1 + u²). */
const rows = [0, 0.2, 0.5, 1, 2, 4, 8].map((u) => `${u}, ${4 / (1 + u * u)}, ${-10 / (1 + u * u)}`);
const table = ['# invented demo data', 'name = Mistral', 'electrons = 4', 'u [Eh], alpha [a0^3], B [au]', ...rows].join('\n');

describe('response tables', () => {
  test('a table with settings, header and rows', () => {
    const s = parseResponseData(table, 'm.csv');
    expect(s.kind).toBe('response-table');
    if (s.kind !== 'response-table') return;
    expect(s.name).toBe('Mistral');
    expect(s.electrons).toBe(4);
    expect(s.u).toEqual([0, 0.2, 0.5, 1, 2, 4, 8]);
    expectClose(s.alpha[1], 4 / 1.04, 1e-15);
    expectClose(s.hyperB![3], -5, 1e-15);
    expect(describeSpecies(s)).toMatch(/response table: 7 points u=0…8 Eh, alpha\(0\)=4, B\(0;iu,-iu\) tabulated, tail alpha→4\/u²/);
  });
  test('units: eV and ångström³ are converted to atomic units (CODATA 2018, units.ts)', () => {
    const text = ['energy [eV], strength', `${HARTREE_IN_EV}, 1`].join('\n');
    const s = parseResponseData(['B = -3', text].join('\n'), 'x.csv');
    expect(s.kind === 'oscillator-spectrum' && s.energies[0]).toBeCloseTo(1, 14);
    const t = parseResponseData(
      ['B = -1', 'u [Eh], alpha [A^3]', ...[0, 1, 2, 3, 4, 5].map((u) => `${u}, ${BOHR_IN_ANGSTROM ** 3 / (1 + u)}`)].join('\n'),
      'y.csv',
    );
    expect(t.kind === 'response-table' && t.alpha[0]).toBeCloseTo(1, 13);
    expect(t.name).toBe('y'); // the file's base name
  });
  test('trailing comments after blanks are ignored (the README example)', () => {
    const text = ['name = Zephyrine          # optional settings', 'electrons = 8   # N', 'u [Eh], alpha [a0^3], B [au]  # header', ...rows].join('\n');
    const s = parseResponseData(text, 'r.csv');
    expect(s).toMatchObject({ name: 'Zephyrine', electrons: 8 });
  });
  test('a static B instead of a B column is accepted and marked approximate in the description', () => {
    const s = parseResponseData(['B = -7.5', 'u [Eh], alpha [a0^3]', ...[0, 1, 2, 3, 4, 5].map((u) => `${u}, ${1 / (1 + u)}`)].join('\n'), 'z.csv');
    expect(describeSpecies(s)).toContain('static B=-7.5 (D7 approximate)');
  });
});

describe('errors name the line and column', () => {
  test('non-monotonic grid', () => {
    const bad = table.replace('\n1, ', '\n0.4, ');
    const e = errorOf(() => parseResponseData(bad, 'd.csv'));
    expect(e.field).toBe('d.csv:8:1');
    expect(e.problem).toBe('the u grid must increase strictly: 0.4 follows 0.5');
  });
  test('negative alpha', () => {
    const bad = table.replace(`\n2, ${4 / 5}`, '\n2, -0.8');
    const e = errorOf(() => parseResponseData(bad, 'd.csv'));
    expect(e.message).toBe('d.csv:9:2: alpha must be > 0 (a polarisability at imaginary frequency is positive), got -0.8');
  });
  test('missing column (alpha) and missing B', () => {
    const e = errorOf(() => parseResponseData('u [Eh], B [au]\n0, 1', 'd.csv'));
    expect(e.message).toBe('d.csv:1:3: missing column alpha (the header needs at least: u [Eh], alpha [a0^3])');
    const noB = ['u [Eh], alpha [a0^3]', ...[0, 1, 2, 3, 4, 5].map((u) => `${u}, 1`)].join('\n');
    expect(errorOf(() => parseResponseData(noB, 'd.csv')).message).toMatch(/^d\.csv:1:3: missing column B: give B\(0; iu, −iu\) as a column "B \[au\]"/);
  });
  test('unknown column, missing unit, wrong cell count, not a number, grid not starting at 0', () => {
    expect(errorOf(() => parseResponseData('u [Eh], alpha [a0^3], beta [au]\n', 'd.csv')).message).toBe(
      'd.csv:1:3: unknown column "beta"; allowed columns: u, alpha, alpha2, alpha3, B',
    );
    expect(errorOf(() => parseResponseData('u, alpha [a0^3]\n', 'd.csv')).message).toBe(
      'd.csv:1:1: column u needs a unit in brackets, one of: Eh, hartree, eV; got ""',
    );
    expect(errorOf(() => parseResponseData(table.replace('\n0.5, ', '\n0.5, 3.2, '), 'd.csv')).field).toBe('d.csv:7:4');
    expect(errorOf(() => parseResponseData(table.replace('\n0.2, ', '\n0.2x, '), 'd.csv')).message).toBe('d.csv:6:1: u must be a finite number, got "0.2x"');
    expect(errorOf(() => parseResponseData(table.replace('\n0, ', '\n0.1, '), 'd.csv')).message).toBe(
      'd.csv:5:1: the grid must start at u = 0 (the static limit), got 0.1',
    );
  });
  test('settings: unknown key, bad electron number, B twice', () => {
    expect(errorOf(() => parseResponseData('colour = blue\n' + table, 'd.csv')).message).toBe(
      'd.csv:1:1: unknown setting "colour"; allowed settings: name, electrons, B, source',
    );
    expect(errorOf(() => parseResponseData(table.replace('electrons = 4', 'electrons = -2'), 'd.csv')).message).toBe(
      'd.csv:3:1: setting electrons must be a finite number > 0, got "-2"',
    );
    expect(errorOf(() => parseResponseData('B = 2\n' + table, 'd.csv')).field).toBe('d.csv:1:1');
  });
  test('a pseudo-spectrum needs a static B and positive lines', () => {
    expect(errorOf(() => parseResponseData('energy [Eh], strength\n0.5, 1', 's.csv')).message).toMatch(/^s\.csv:1: a pseudo-spectrum needs the static hyperpolarisability/);
    expect(errorOf(() => parseResponseData('B = -1\nenergy [Eh], strength\n0.5, 1\n0.7, 0', 's.csv')).message).toBe('s.csv:4:2: strength must be > 0, got 0');
  });
});

describe('species files', () => {
  test('kind spectrum (lists) and kind table (inline text) in a YAML species file', () => {
    const yaml = [
      'species:',
      '  Brisk:            # invented',
      '    kind: spectrum',
      '    energies: [0.6, 1.2]',
      '    strengths: [0.8, 1.2]',
      '    B: -20',
      '    electrons: 2',
      '  Mistral:',
      '    kind: table',
      '    data: |',
      ...table.split('\n').map((l) => '      ' + l),
    ].join('\n');
    const m = parseSpeciesFile(yaml, 'f.yaml');
    expect(m.get('Brisk')).toMatchObject({ kind: 'oscillator-spectrum', energies: [0.6, 1.2], staticB: -20, electrons: 2 });
    expect(m.get('Mistral')).toMatchObject({ kind: 'response-table', name: 'Mistral' });
  });
  test('errors from inline data name the entry, line and column', () => {
    const bad = table.replace(`\n2, ${4 / 5}`, '\n2, -0.8');
    expect(errorOf(() => responseDataFromText(bad, 'Mistral')).field).toBe('Mistral.data:9:2');
    expect(errorOf(() => oscillatorSpectrum({ energies: [0.5, -1], strengths: [1, 1], B: 1 }, 'Brisk')).message).toBe(
      'Brisk.energies[1]: must be a finite number > 0, got -1',
    );
  });
});
