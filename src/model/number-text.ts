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
