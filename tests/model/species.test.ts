import { describe, expect, test } from 'vitest';
import { closestName } from '../../src/model/closest-name.js';
import { drude, drudeAnisotropic, drudeFromTargets, drudeMultipolePolarisability, drudePolarisability } from '../../src/model/drude.js';
import { InputError } from '../../src/model/errors.js';
import { parseInlineSpecies } from '../../src/model/species-kinds.js';
import { parseSpeciesFile } from '../../src/model/species-file.js';
import { resolveSpecies, demoSpecies } from '../../src/model/builtin-species.js';
import { computePair } from '../../src/engines/pair.js';
import { expectClose } from '../helpers/tolerance.js';

const messageOf = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as Error).message;
  }
  throw new Error('expected an InputError');
};

describe('QDO species', () => {
  test('static polarisability is q²/(m w²) (QDO definition; Jones et al., Phys. Rev. B 87, 144103 (2013))', () => {
    const s = drude({ q: 1.3, m: 0.5, w: 0.7 });
    expectClose(drudePolarisability(s)[0], 1.69 / (0.5 * 0.49), 1e-15);
  });
  test('quadrupole polarisability is (3/4) q²/(m² w³)', () => {
    expectClose(drudeMultipolePolarisability({ q: 1.3, m: 0.5, w: 0.7 }, 2), 0.75 * 1.69 / (0.25 * 0.343), 1e-15);
  });
  test.each([
    ['q', { q: -1, m: 1, w: 1 }, 'X.q: must be a finite number > 0, got -1'],
    ['m', { q: 1, m: 0, w: 1 }, 'X.m: must be a finite number > 0, got 0'],
    ['w', { q: 1, m: 1, w: NaN }, 'X.w: must be a finite number > 0, got NaN'],
    ['w', { q: 1, m: 1, w: Infinity }, 'X.w: must be a finite number > 0, got Infinity'],
  ])('invalid %s is rejected with a message naming the field', (_f, params, msg) => {
    expect(messageOf(() => drude(params, 'X'))).toBe(msg);
  });
  test('anisotropic frequencies are validated one by one', () => {
    expect(messageOf(() => drudeAnisotropic({ q: 1, m: 1, wx: 1, wy: -2, wz: 1 }, 'Y'))).toBe('Y.wy: must be a finite number > 0, got -2');
  });
});

describe('QDO fitted to alpha, C6, C8 (three-parameter mapping, Jones et al. 2013)', () => {
  // He: alpha = 1.383192174455, C6 = 1.460977837725 (values quoted in the project's issue tracker from the
  // high-precision literature); C8 = 14.11785737 (J.-Y. Zhang, Z.-C. Yan et al.; quoted from memory). Any positive
  // targets must be reproduced, so the check does not depend on these being exact.
  test('the fitted oscillator reproduces its targets through both routes', () => {
    const targets = { alpha: 1.383192174455, C6: 1.460977837725, C8: 14.11785737 };
    const s = drudeFromTargets(targets, 'He-like');
    expectClose(drudePolarisability(s)[2], targets.alpha, 1e-14);
    const p = computePair(s, s, { maxEnergyPower: 8 });
    for (const r of p.routes) {
      expectClose(r.C6, targets.C6, 1e-12, 0, `${r.name} C6`);
      expectClose(r.C8!, targets.C8, 1e-12, 0, `${r.name} C8`);
    }
  });
  test('bad targets name the field', () => {
    expect(messageOf(() => drudeFromTargets({ alpha: 1, C6: -1, C8: 2 }, 'Z'))).toBe('Z.C6: must be a finite number > 0, got -1');
  });
});

describe('inline specs and species files', () => {
  test('drude:q=..,m=..,w=.. builds an isotropic QDO', () => {
    const s = parseInlineSpecies('drude:q=1.2,m=0.4,w=0.9');
    expect(s).toMatchObject({ kind: 'drude', q: 1.2, m: 0.4, w: [0.9, 0.9, 0.9] });
  });
  test('drude with wx, wy, wz builds an anisotropic QDO', () => {
    expect(parseInlineSpecies('drude:q=1,m=1,wx=0.8,wy=0.9,wz=1.1')).toMatchObject({ w: [0.8, 0.9, 1.1] });
  });
  test.each([
    ['drude:q=1,m=1', 'drude:q=1,m=1.w: is missing (give w, or wx, wy and wz)'],
    ['drude:q=1,m=1,w=1,wx=2', 'drude:q=1,m=1,w=1,wx=2: give either w or all of wx, wy, wz, not both'],
    ['drude:q=1,m=1,w=1,k=3', 'drude:q=1,m=1,w=1,k=3.k: is not a field of kind drude; allowed: q, m, w, wx, wy, wz'],
    ['drude:q=abc,m=1,w=1', 'drude:q=abc,m=1,w=1.q: must be a finite number > 0, got "abc"'],
    ['drude:q', 'drude:q: expected key=value, got "q"'],
  ])('%s is rejected clearly', (spec, msg) => {
    expect(messageOf(() => parseInlineSpecies(spec))).toBe(msg);
  });
  test('an unknown kind lists the known kinds', () => {
    expect(messageOf(() => parseInlineSpecies('blob:q=1'))).toMatch(/^blob:q=1\.kind: unknown kind "blob"; known kinds: drude, fit(, |$)/);
  });
  test('a YAML species file gives named species with their source', () => {
    const m = parseSpeciesFile('species:\n  Brim:\n    kind: drude\n    q: 1.3\n    m: 0.5\n    w: 0.7\n    source: invented\n', 'f.yaml');
    expect(m.get('Brim')).toMatchObject({ name: 'Brim', q: 1.3, source: 'invented' });
  });
  test('a JSON species file works too', () => {
    const m = parseSpeciesFile('{"species":{"F":{"kind":"fit","alpha":2,"C6":3,"C8":30}}}', 'f.json');
    expect(m.get('F')?.kind).toBe('drude');
  });
  test('file errors name the file and entry', () => {
    expect(messageOf(() => parseSpeciesFile('species:\n  B:\n    kind: drude\n    q: 1\n    m: 0\n    w: 1\n', 'g.yaml'))).toBe(
      'g.yaml: species.B.m: must be a finite number > 0, got 0',
    );
    expect(messageOf(() => parseSpeciesFile('nothing: 1\n', 'h.yaml'))).toMatch(/^h\.yaml: species: is missing/);
    expect(messageOf(() => parseSpeciesFile('species: [\n', 'i.yaml'))).toMatch(/^i\.yaml: is not valid YAML or JSON/);
  });
  test('names resolve case-insensitively; unknown names list what exists', () => {
    expect(resolveSpecies('quelon').name).toBe('Quelon');
    expect(messageOf(() => resolveSpecies('Nope'))).toMatch(/^Nope: is not a known species; use a built-in name \(Quelon, /);
  });
  test('a near-miss name is suggested (one swap, one letter); nothing when no name is close or two are equally close', () => {
    expect(messageOf(() => resolveSpecies('Virdi'))).toMatch(/^Virdi: is not a known species \(did you mean Virid\?\); use a built-in name/);
    expect(messageOf(() => resolveSpecies('Qelon'))).toMatch(/\(did you mean Quelon\?\)/);
    expect(messageOf(() => resolveSpecies('Nope'))).not.toMatch(/did you mean/);
    expect(closestName('Ax', ['Ar', 'Xe', 'Kr'])).toBe('Ar');
    expect(closestName('Hx', ['He', 'H2'])).toBeUndefined(); // He and H2 are both one letter away
    expect(closestName('tarnett', ['Tarnet'])).toBe('Tarnet');
    expect(closestName('Spindle', ['Spindlet', 'Sorrel'])).toBe('Spindlet');
  });
  test('every demo species says it is invented', () => {
    for (const s of demoSpecies) expect(s.source).toMatch(/invented/);
  });
});
