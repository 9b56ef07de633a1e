/**
 * The syntax pre-check of `check` (src/engines/symbolic/formula-syntax.ts) reports exactly what the mathjs parser
 * reports (message and character position) for every formula where it reports anything, and never calls a formula
 * mathjs reads wrong. Reference: the mathjs 15 parser itself (mathjs.parse), on seeded random formulas built from
 * the tokens of the pre-check's language plus a few outside it, and on hand-picked cases.
 */
import { describe, expect, test } from 'vitest';
import { formulaSyntaxError } from '../../src/engines/symbolic/formula-syntax.js';
import { mathjsModule } from '../../src/lazy-modules.js';
import { seededRandom } from '../helpers/random.js';

/** What mathjs says of a formula: undefined when it parses, else its message and position. */
function mathjsVerdict(source: string): { message: string; char: number } | undefined {
  try {
    mathjsModule().parse(source);
    return undefined;
  } catch (e) {
    const err = e as Error & { char?: number };
    return { message: err.message, char: err.char as number };
  }
}

const TOKENS = ['qa', 'wb', 'x', 'sqrt', '2', '3.5', '1e3', '10', '+', '-', '*', '/', '^', '(', ')', ',', ' ', '  ', '(', ')', 'mb', '4'];

describe('formula syntax pre-check agrees with mathjs', () => {
  test('hand-picked formulas (the syntax errors users make)', () => {
    const cases = ['x+', '-9*qa^3/(ma', 'qa*(wb+', 'qa**2', '*qa', 'qa)', '()', 'qa,wb', '2 3', 'sqrt(qa', 'sqrt(qa,)', 'qa^', '-', 'qa wb', '2/3 qa', '2 qa', '(qa)(wb)', 'qa(wb)(x)', '1/2/3 x', '-2/3(qa+1)', 'qa^-2', '+-+qa', ''];
    let reported = 0;
    for (const source of cases) {
      const ours = formulaSyntaxError(source);
      const theirs = mathjsVerdict(source);
      if (ours) {
        reported++;
        expect(ours, source).toEqual(theirs);
      }
    }
    expect(reported).toBeGreaterThan(10);
  });

  test('seeded random formulas: every reported error is mathjs’s, every mathjs error in the language is found', () => {
    const rand = seededRandom(1616);
    let reported = 0, missed = 0;
    for (let k = 0; k < 4000; k++) {
      const length = 1 + Math.floor(rand() * 9);
      let source = '';
      for (let j = 0; j < length; j++) source += TOKENS[Math.floor(rand() * TOKENS.length)];
      const ours = formulaSyntaxError(source);
      const theirs = mathjsVerdict(source);
      if (ours) {
        reported++;
        expect(ours, JSON.stringify(source)).toEqual(theirs);
      } else if (theirs) missed++;
    }
    expect(reported).toBeGreaterThan(1000);
    // what is left to mathjs: glued tokens such as "2qa" or "1e3x" (the pre-check defers on them) and calls of calls
    expect(missed).toBeLessThan(reported / 2);
  });
});
