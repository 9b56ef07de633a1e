/**
 * Seeded random parameter points with exact rational coordinates, for numeric identity tests of formulas:
 * q in [1/2, 5/2], m in [1/4, 3], w in [1/4, 2], R in [4, 16], each a multiple of 1/64 (so every value is exact
 * in binary and in fraction.js); alpha = q²/(m w²) follows from them. Generator: xorshift32 (G. Marsaglia,
 * J. Stat. Softw. 8(14), 2003), fixed by the seed so a check can be repeated exactly.
 */
import Fraction from 'fraction.js';
import type { SymbolRole, SymbolTable } from './symbols.js';

const RANGES: Partial<Record<SymbolRole, readonly [number, number]>> = {
  q: [0.5, 2.5],
  m: [0.25, 3],
  w: [0.25, 2],
  R: [4, 16],
};
const STEP = 64;

/** A uniform generator on [0, 1) from a 32-bit seed. */
export function xorshift32(seed: number): () => number {
  let x = seed >>> 0 || 0x9e3779b9;
  return () => {
    x ^= x << 13;
    x >>>= 0;
    x ^= x >>> 17;
    x ^= x << 5;
    x >>>= 0;
    return x / 2 ** 32;
  };
}

/** One point: a value for every symbol (alpha derived from q, m, w; internal ladder lengths set to 1). */
export type SamplePoint = Fraction[];

/** A random point from a generator. */
export function randomPoint(table: SymbolTable, rand: () => number): SamplePoint {
  const values = table.symbols.map((s) => {
    const range = RANGES[s.role];
    if (!range) return new Fraction(1);
    const lo = Math.round(range[0] * STEP);
    const hi = Math.round(range[1] * STEP);
    return new Fraction(lo + Math.floor(rand() * (hi - lo + 1)), STEP);
  });
  return withDerived(table, values);
}

/** Recompute alpha = q²/(m w²) after changing q, m or w. */
export function withDerived(table: SymbolTable, values: SamplePoint): SamplePoint {
  const out = [...values];
  if (!table.layout.anisotropic) {
    for (const c of ['a', 'b'] as const) {
      out[table.alpha[c]] = out[table.q[c]].pow(2).div(out[table.m[c]].mul(out[table.w[c][0]].pow(2)));
    }
  }
  return out;
}

/** The point as name → number (for floating-point evaluation and reports). */
export function pointByName(table: SymbolTable, p: SamplePoint): Map<string, number> {
  return new Map(table.symbols.map((s, i) => [s.name, p[i].valueOf()] as const).filter(([name]) => !name.startsWith('@')));
}
