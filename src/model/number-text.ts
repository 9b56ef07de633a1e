/** Numbers as text, for reports, notes and descriptions alike (deterministic: the same number, the same bytes). */

/** `x` to `digits` significant digits; exponent form outside 1e-4 … 1e9; "0" for zero, "NaN"/"∞" spelled out. */
export function sig(x: number, digits = 10): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '-∞';
  if (x === 0) return '0';
  const ax = Math.abs(x);
  if (ax >= 1e-4 && ax < 1e9) return Number(x.toPrecision(digits)).toString();
  const [m, e] = x.toExponential(digits - 1).split('e');
  return `${Number(m).toString()}e${e.replace('+', '')}`;
}

/** How a column of numbers is written: plain decimals, or mantissa × power of ten (`1.250e-05`). */
export type Notation = 'fixed' | 'exponent';

/** Decimal exponent of |x| after rounding to `digits` significant digits (so 9.9996 → 1, not 0). */
function roundedExponent(x: number, digits: number): number {
  const [, e] = Math.abs(x).toExponential(digits - 1).split('e');
  return Number(e);
}

/**
 * The notation in which every value of a column shows `digits` significant digits and nothing more: fixed when
 * each non-zero value has a decimal exponent from −3 to digits − 1 (so no integer needs padding zeros that would
 * look significant), exponent otherwise. Zeros, non-finite values and missing values do not vote.
 */
export function columnNotation(values: ReadonlyArray<number | undefined>, digits: number): Notation {
  for (const x of values) {
    if (x === undefined || x === 0 || !Number.isFinite(x)) continue;
    const e = roundedExponent(x, digits);
    if (e < -3 || e >= digits) return 'exponent';
  }
  return 'fixed';
}

/**
 * `x` with exactly `digits` significant digits, trailing zeros kept (`52.000`, `-34.450`), in the given notation
 * (default: the one {@link columnNotation} picks for `x` alone). Exponents carry a sign and at least two digits
 * (`1.3e+00`, `2.1e-16`), as C's printf `%e` writes them (common practice). Zero is `0`; NaN and ∞ spelled out.
 */
export function sigDigits(x: number, digits: number, notation: Notation = columnNotation([x], digits)): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '-∞';
  if (x === 0) return '0';
  if (notation === 'fixed') {
    const e = roundedExponent(x, digits);
    return x.toFixed(Math.max(0, digits - 1 - e));
  }
  const [m, e] = x.toExponential(digits - 1).split('e');
  const n = Number(e);
  return `${m}e${n < 0 ? '-' : '+'}${String(Math.abs(n)).padStart(2, '0')}`;
}

/** A column of numbers as text: one notation for the whole column, `digits` significant digits each; "—" for a gap. */
export function sigColumn(values: ReadonlyArray<number | undefined>, digits: number): string[] {
  const notation = columnNotation(values, digits);
  return values.map((x) => (x === undefined ? '—' : sigDigits(x, digits, notation)));
}
