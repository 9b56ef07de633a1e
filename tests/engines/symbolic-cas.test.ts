/**
 * The derived closed forms checked by an independent computer-algebra system (nerdamer): each printed expression
 * minus its reference form simplifies to zero. References: London's C6 (F. London, Z. Phys. Chem. B 11, 222
 * (1930)); C8 from the Casimir–Polder-type integral with QDO multipole polarisabilities (derived here, see
 * README); D7.a = −(qA/kA)·6·C6 (force balance, derived here, tests/engines/force-balance.test.ts).
 */
import nerdamer from 'nerdamer';
import 'nerdamer/Algebra.js';
import { describe, expect, test } from 'vitest';
import { deriveQuantities } from '../../src/engines/symbolic/derive.js';

const unlike = { identical: false, anisotropic: false };
const derived = new Map(deriveQuantities(unlike, ['C6', 'C8', 'D7.a', 'D7.b', 'D7.total']).map((d) => [d.name, d.display.text]));

const alpha = (c: 'a' | 'b') => `(q${c}^2/(m${c}*w${c}^2))`;
const alpha2 = (c: 'a' | 'b') => `(3/4*q${c}^2/(m${c}^2*w${c}^3))`;
const C6 = `(3/2*${alpha('a')}*${alpha('b')}*wa*wb/(wa+wb))`;
const references: Record<string, string> = {
  C6,
  C8: `(15/2*(${alpha('a')}*${alpha2('b')}*wa*wb/(wa+2*wb) + ${alpha2('a')}*${alpha('b')}*wa*wb/(2*wa+wb)))`,
  'D7.a': `(-6*${C6}*qa/(ma*wa^2))`,
  'D7.b': `(6*${C6}*qb/(mb*wb^2))`,
  'D7.total': `(6*${C6}*(qb/(mb*wb^2) - qa/(ma*wa^2)))`,
};

describe('closed forms against an independent computer-algebra system', () => {
  test.each(Object.keys(references))('%s: derived − reference simplifies to 0 in nerdamer', (name) => {
    const text = derived.get(name as never)!;
    expect(text).toBeTruthy();
    // expand first: nerdamer's simplify alone stumbles on the nested fractions of C8
    expect(nerdamer(`simplify(expand((${text}) - ${references[name]}))`).toString()).toBe('0');
  });
  test('the check can fail: a factor-2 error does not simplify to 0', () => {
    expect(nerdamer(`simplify(expand((${derived.get('D7.a')}) - 2*${references['D7.a']}))`).toString()).not.toBe('0');
  });
});
