/**
 * The `tdhf` species kind: inline specs, validation (open shells, unknown elements, Z ≤ 0, basis range) with errors
 * naming the field, the pair command through the response route on shipped data, and the tabulated u grid
 * (the interpolated table reproduces the pseudo-spectrum's own C6).
 */
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { parseInlineSpecies } from '../../src/model/species-kinds.js';
import { InputError } from '../../src/model/errors.js';
import { DEFAULT_TDHF_BASIS } from '../../src/model/closed-shell.js';
import { TDHF_ATOMS } from '../../src/data/tdhf-atoms.js';
import { computeTdhfAtom } from '../../src/engines/atoms/hartree-fock/atom-response.js';
import { tdhfResponse } from '../../src/engines/atoms/hartree-fock/tdhf-species.js';
import { isotropicResponseCoefficients } from '../../src/engines/response/isotropic-kernel.js';
import { expectClose } from '../helpers/tolerance.js';

async function run(argv: string[]) {
  const io = memoryIO();
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err };
}

function inputError(spec: string): InputError {
  try {
    parseInlineSpecies(spec);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error(`${spec} was accepted`);
}

describe('inline specs', () => {
  test('tdhf:He, tdhf:Z=18, tdhf:Z=11,charge=1 and a basis option', () => {
    expect(parseInlineSpecies('tdhf:He')).toMatchObject({ kind: 'tdhf', symbol: 'He', Z: 2, charge: 0, basis: DEFAULT_TDHF_BASIS });
    expect(parseInlineSpecies('tdhf:Z=18')).toMatchObject({ symbol: 'Ar', Z: 18, charge: 0 });
    expect(parseInlineSpecies('tdhf:Z=11,charge=1')).toMatchObject({ symbol: 'Na', Z: 11, charge: 1 });
    expect(parseInlineSpecies('tdhf:Ar,basis=16')).toMatchObject({ symbol: 'Ar', basis: 16 });
  });
  test.each([
    ['tdhf:Na', 'tdhf:Na.element', /11 electrons, an open shell/],
    ['tdhf:Z=7', 'tdhf:Z=7.Z', /open shell/],
    ['tdhf:Z=11,charge=2', 'tdhf:Z=11,charge=2.charge', /9 electrons, an open shell/],
    ['tdhf:Qq', 'tdhf:Qq.element', /unknown element "Qq"/],
    ['tdhf:Z=0', 'tdhf:Z=0.Z', /integer from 1 to 86/],
    ['tdhf:Z=-3', 'tdhf:Z=-3.Z', /integer from 1 to 86/],
    ['tdhf:He,basis=6', 'tdhf:He,basis=6.basis', /integer from 12 to 32/],
    ['tdhf:', 'tdhf:.element', /is missing/],
    ['tdhf:He,Z=3', 'tdhf:He,Z=3.Z', /contradicts element He/],
  ])('%s → InputError on %s', (spec, field, problem) => {
    const e = inputError(spec);
    expect(e.field).toBe(field);
    expect(e.problem).toMatch(problem);
  });
});

describe('on the command line', () => {
  test('pair tdhf:He tdhf:Ar runs the response route on the shipped data and says what the numbers rest on', async () => {
    const { code, out } = await run(['pair', 'tdhf:He', 'tdhf:Ar', '--json']);
    expect(code).toBe(0);
    const j = JSON.stringify(JSON.parse(out));
    expect(j).toContain('FIRST-PRINCIPLES');
    expect(j).toContain('shipped data (src/data/tdhf-atoms.ts)');
  });
  test('an open-shell atom stops with exit code 2, empty stdout and a message naming the field', async () => {
    const { code, out, err } = await run(['pair', 'tdhf:Z=7', 'tdhf:He']);
    expect(code).toBe(2);
    expect(out).toBe('');
    expect(err).toContain('tdhf:Z=7.Z');
  });
});

describe('untrusted numbers', () => {
  test('He²⁻ (tdhf:Z=2,charge=-2): the Hartree–Fock state is unstable, so the pair stops with exit code 3 and says why', async () => {
    const { code, out, err } = await run(['pair', 'tdhf:Z=2,charge=-2', 'tdhf:He']);
    expect(code).toBe(3);
    expect(out).toBe('');
    expect(err).toMatch(/tdhf:Z=2,charge=-2: time-dependent Hartree–Fock response of an unstable Hartree–Fock state \(rank-1 response unstable/);
  });
});

describe('the tabulated grid', () => {
  test('He–He C6 from the interpolated shipped table equals the pseudo-spectrum sum to 1e-6 (derived here)', () => {
    const he = computeTdhfAtom(2, 0, DEFAULT_TDHF_BASIS, { withB: false });
    const r = he.ranks[0];
    let s = 0;
    for (let i = 0; i < r.n; i++) for (let k = 0; k < r.n; k++) s += (r.f[i] * r.f[k]) / (r.omega[i] * r.omega[k] * (r.omega[i] + r.omega[k]));
    const table = tdhfResponse(parseInlineSpecies('tdhf:He') as Parameters<typeof tdhfResponse>[0]);
    expectClose(isotropicResponseCoefficients(table, table).C6, 1.5 * s, 1e-6, 0, 'C6 table vs lines');
    expect(TDHF_ATOMS.He.u.length).toBe(he.response.u.length);
  });
});
