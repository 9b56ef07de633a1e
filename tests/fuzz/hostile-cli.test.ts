/**
 * Hostile and careless command lines, run in-process (runCli with memoryIO). For each: the exit code, a message
 * naming the field or option, an empty stdout on error, no file written on error, and never a non-finite number
 * (or a JSON null standing for one) in a result marked trusted. Every reproduction of the fuzzing pass is here.
 * Exit codes: 0 ok, 1 check differs, 2 bad input, 3 untrusted (README "Exit codes"; common practice for CLIs).
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { memoryIO } from '../../src/cli/io.js';
import { runCli } from '../../src/cli/program.js';
import { computePair } from '../../src/engines/pair.js';
import type { DrudeSpecies } from '../../src/model/drude.js';

const LONDON = '3*qa^2*qb^2/(2*ma*mb*wa*wb*(wa + wb))';
const EXISTING = 'existing.txt';

/** An XYZ text of n Quelon centres on a 10 bohr square grid. */
function grid(n: number): string {
  const lines = [String(n), 'invented grid'];
  for (let k = 0; k < n; k++) lines.push(`Quelon ${10 * (k % 150)} ${10 * Math.floor(k / 150)} 0`);
  return lines.join('\n') + '\n';
}

const FILES: Record<string, string> = {
  [EXISTING]: 'precious\n',
  'big.csv': ['B = -1', 'u [Eh], alpha [a0^3]', ...Array.from({ length: 130_000 }, (_, k) => `${k / 100}, ${1 / (1 + (k / 100) ** 2)}`)].join('\n'),
  'many.xyz': grid(20_000),
  'far.xyz': '2\ntwo Quelon 1e5 angstrom apart (invented)\nQuelon 0 0 0\nQuelon 0 0 100000\n',
  'ext.xyz': '2\nextended XYZ with a charge column\nQuelon 0 0 0 0.0\nQuelon 0 0 4 0.0\n',
  'proto.yaml': 'species:\n  __proto__:\n    kind: drude\n    q: 1\n    m: 1\n    w: 1e-200\n',
};

async function run(argv: string[]) {
  const io = memoryIO(FILES);
  const code = await runCli(argv, io);
  return { code, out: io.out, err: io.err, files: io.files };
}

/** Every number in a parsed JSON value is finite (JSON writes ∞ and NaN as null: a null number is refused too). */
function finiteNumbers(v: unknown, path = '$'): string[] {
  if (typeof v === 'number') return Number.isFinite(v) ? [] : [path];
  if (Array.isArray(v)) return v.flatMap((x, i) => finiteNumbers(x, `${path}[${i}]`));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => finiteNumbers(x, `${path}.${k}`));
  return [];
}

type Case = [label: string, argv: string[], code: number, message: RegExp];

const CASES: Case[] = [
  // 1. check: names inherited from JavaScript objects
  ['hasOwnProperty is not a function of formulas', ['check', `hasOwnProperty(qa)*1000 + ${LONDON}`, '--for', 'C6'], 2, /expression: unknown function hasOwnProperty/],
  ['isPrototypeOf', ['check', `isPrototypeOf(qa)*1000 + ${LONDON}`, '--for', 'C6'], 2, /expression: unknown function isPrototypeOf/],
  ['propertyIsEnumerable', ['check', `propertyIsEnumerable(qa)*1000 + ${LONDON}`, '--for', 'C6'], 2, /expression: unknown function propertyIsEnumerable/],
  ['__proto__(qa)', ['check', '__proto__(qa)', '--for', 'C6'], 2, /expression: unknown function __proto__/],
  ['__defineGetter__(qa)', ['check', '__defineGetter__(qa)', '--for', 'C6'], 2, /expression: unknown function __defineGetter__/],
  ['constructor', ['check', 'constructor', '--for', 'C6'], 2, /expression: unknown variable name constructor/],
  ['toString', ['check', 'toString(qa)', '--for', 'C6'], 2, /expression: unknown function toString/],
  ['valueOf', ['check', 'valueOf', '--for', 'C6'], 2, /expression: unknown variable name valueOf/],
  // 2. non-finite numbers: refused up front with the species and parameter named
  ['w = 1e-200, perturbation route', ['pair', 'Quelon', 'drude:q=1,m=1,w=1e-200', '--routes', 'perturbation'], 2, /drude:q=1,m=1,w=1e-200\.w: gives alpha1 = q²\/\(m w²\) ≈ 1e400 .*choose w larger/],
  ['w = 1e-200, default routes', ['pair', 'Quelon', 'drude:q=1,m=1,w=1e-200', '--json'], 2, /drude:q=1,m=1,w=1e-200\.w: gives alpha1/],
  ['q = 1e308 in a table', ['table', 'Quelon', 'drude:q=1e308,m=1,w=1', '--routes', 'perturbation'], 2, /drude:q=1e308,m=1,w=1\.q: gives alpha1 .* ≈ 1e616 .*choose q smaller/],
  ['q = 1e308 in a table, default routes, to a file', ['table', 'Quelon', 'drude:q=1e308,m=1,w=1', '--out', 't.csv'], 2, /\.q: gives alpha1/],
  ['m = 1e-60 anisotropic', ['pair', 'Quelon', 'drude:q=1,m=1e-60,wx=1,wy=1,wz=1'], 2, /\.m: gives alpha2 .* choose m larger/],
  ['wz = 1e200 anisotropic', ['pair', 'Quelon', 'drude:q=1,m=1,wx=1,wy=1,wz=1e200'], 2, /\.wz: gives .* choose wz smaller/],
  ['a species file entry named __proto__', ['pair', 'Quelon', '__proto__', '--species', 'proto.yaml'], 2, /proto\.yaml: species\.__proto__\.w: gives alpha1/],
  // 3. formula size and cost
  ['a 25 000-factor product', ['check', 'qa*'.repeat(25_000) + 'qa', '--for', 'C6'], 2, /expression: is 75002 characters long; the limit is 20000/],
  ['parentheses 300 deep', ['check', '('.repeat(300) + 'qa' + ')'.repeat(300), '--for', 'C6'], 2, /expression: nests parentheses more than 200 deep/],
  ['1e309', ['check', '1e309', '--for', 'C6'], 2, /expression: contains a number beyond the double-precision range/],
  ['a 12 KB sum is read and differs', ['check', 'qa+'.repeat(4000) + 'qa', '--for', 'C6'], 1, /^$/],
  ['(qa+qb+ma+mb+wa+wb)^64: numeric verdict in seconds', ['check', '(qa+qb+ma+mb+wa+wb)^64', '--for', 'C6'], 1, /^$/],
  // 4. files: never clobbered without --force
  ['--out onto an existing file', ['table', 'Quelon', 'Virid', '--out', EXISTING], 2, /existing\.txt: exists already; pass --force/],
  // 6. size limits
  ['a 130 000-row response table', ['pair', 'big', 'Quelon', '--species', 'big.csv'], 2, /big\.csv:2003: has more than 2000 data rows/],
  ['20 000 centres', ['cluster', 'many.xyz'], 2, /many\.xyz:1: announces 20000 centres; at most \d{4} can be handled: the normal-mode solution needs two \(3N\)×\(3N\)/],
  // 8. messages
  ['an unknown option on check', ['check', LONDON, '--for', 'C6', '--bogus'], 2, /--bogus: is not an option of check; its options: --for/],
  ['two formulas on check', ['check', 'qa', 'qb', '--for', 'C6'], 2, /formula: give one formula, quoted as one argument/],
  ['--routes "" on pair', ['pair', 'Quelon', 'Virid', '--routes', ''], 2, /routes: the list is empty; name at least one route.*known: perturbation/],
  ['--routes "," on table', ['table', 'Quelon', 'Virid', '--routes', ','], 2, /routes: the list is empty/],
  ['--out "" on table', ['table', 'Quelon', 'Virid', '--out', ''], 2, /--out: is empty; give a file name/],
  ['an empty species name', ['pair', '', 'Virid'], 2, /species: is empty; use a built-in name/],
  ['an inline field __proto__', ['pair', 'drude:__proto__=1,q=1,m=1,w=1', 'Virid'], 2, /\.__proto__: is not a field of kind drude/],
  // 7. far pairs and extended XYZ are fine
  ['two Quelon 1e5 Å apart', ['cluster', 'far.xyz', '--json'], 0, /^$/],
  ['an extended XYZ file', ['cluster', 'ext.xyz', '--json'], 0, /^$/],
];

describe('hostile command lines, in-process', () => {
  test.each(CASES)('%s', async (_, argv, code, message) => {
    const r = await run(argv);
    expect(r.code, r.err).toBe(code);
    if (code === 2) {
      expect(r.out).toBe('');
      expect(r.err).toMatch(/^dispole: error: /);
      expect(r.err).toMatch(message);
      expect(Object.keys(r.files).sort()).toEqual(Object.keys(FILES).sort());
      expect(r.files[EXISTING]).toBe('precious\n');
    } else {
      expect(r.out.length).toBeGreaterThan(0);
      if (argv.includes('--json')) expect(finiteNumbers(JSON.parse(r.out))).toEqual([]);
    }
  });

  test('far apart like centres (1e5 Å): opposite dipoles of the D7/R^7 sign, a total reported as exactly 0', async () => {
    const r = await run(['cluster', 'far.xyz', '--json']);
    const json = JSON.parse(r.out) as { dipole: number[]; centres: Array<{ dipole: number[] }> };
    expect(json.dipole).toEqual([0, 0, 0]);
    // D7.a < 0 for like QDOs (A's dipole points away from B along −z; derived here, see cluster-limits.test.ts)
    expect(json.centres[0].dipole[2]).toBeLessThan(0);
    const [a, b] = json.centres.map((c) => c.dipole[2]);
    expect(Math.abs(a + b)).toBeLessThanOrEqual(1e-14 * Math.abs(a)); // equal and opposite to rounding
  });
});

describe('a route result with a non-finite number is never trusted', () => {
  // plain data that bypasses the species builders (which refuse such parameters up front)
  const extreme: DrudeSpecies = { kind: 'drude', name: 'extreme', q: 1, m: 1, w: [1e-200, 1e-200, 1e-200] };
  const quelon: DrudeSpecies = { kind: 'drude', name: 'Quelon', q: 1.1, m: 0.38, w: [0.72, 0.72, 0.72] };

  test('the perturbation route on w = 1e-200: untrusted, with the quantities, species and parameter named', () => {
    const r = computePair(quelon, extreme, { routes: ['perturbation'] });
    expect(r.trusted).toBe(false);
    const w = r.warnings.find((x) => x.startsWith('route perturbation:'));
    expect(w).toMatch(/not finite \(overflow or underflow in double precision\); untrusted — check the parameters of A = Quelon .* and B = extreme \(most extreme parameter w=1e-200\)/);
  });

  test('in-process CLI: a pair whose numbers overflow is exit 3 or 2, never a trusted infinity', async () => {
    const r = await run(['pair', 'drude:q=1e20,m=1e-10,w=1', 'drude:q=1e20,m=1e-10,w=1', '--json']);
    expect([2, 3]).toContain(r.code);
    if (r.code === 3) expect(JSON.parse(r.out).trusted).toBe(false);
  });
});

describe('random command lines from hostile tokens (fast-check, fixed seed)', () => {
  const TOKENS = [
    'Quelon', 'Virid', '', '-', '--', '--json', '--force', '--out', EXISTING, 'new.txt', '--routes', '', ',', 'perturbation',
    '--species', 'proto.yaml', 'big.csv', 'missing.yaml', '--for', 'C6', 'constructor', '__proto__', 'qa*qb', '1e309',
    'drude:q=1,m=1,w=1e-200', 'drude:q=1,m=1,w=1', 'fit:alpha=1,C6=1,C8=1e300', '--digits', '99', '-1', 'NaN', '--bogus', 'far.xyz',
  ];
  const COMMANDS = ['pair', 'table', 'check', 'species', 'cluster', 'derive'];

  test('exit 0–3; on exit 2 stdout is empty, stderr says what is wrong, and no file is written; JSON of exit 0 is finite', async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...COMMANDS), fc.array(fc.constantFrom(...TOKENS), { maxLength: 5 }), async (command, rest) => {
        const argv = [command, ...rest];
        if (command === 'pair' || command === 'table') argv.push('--routes', 'perturbation'); // keep each run short
        const r = await run(argv);
        expect([0, 1, 2, 3]).toContain(r.code);
        if (r.code === 2) {
          expect(r.out).toBe('');
          expect(r.err).toMatch(/error/);
          expect(Object.keys(r.files).sort()).toEqual(Object.keys(FILES).sort());
          expect(r.files[EXISTING]).toBe('precious\n');
        }
        if (r.code === 0 && argv.includes('--json') && r.out.trim().startsWith('{')) expect(finiteNumbers(JSON.parse(r.out))).toEqual([]);
      }),
      { numRuns: 40, seed: 20261202 },
    );
  });
});
