/**
 * Colours of the plots: a small qualitative palette for curves (distinguishable in colour and when printed in
 * grey) and a diverging map for signed quantities, white at zero, blue for negative (loss) and red for
 * positive (gain). The diverging anchors are our own choice, interpolated linearly in sRGB.
 */

/** Curve colours, in order of use. */
export const SERIES_COLOURS = ['#1f5a96', '#c2461f', '#222222', '#4f8a3a', '#7a4f9a'] as const;

/** Anchors of the diverging map at t = −1, −0.5, 0, 0.5, 1 (RGB, 0…255). */
const DIVERGING: ReadonlyArray<readonly [number, number, number]> = [
  [24, 58, 120],
  [110, 160, 210],
  [250, 250, 250],
  [232, 130, 96],
  [140, 22, 30],
];

/** RGB of t ∈ [−1, 1] on the diverging map (clamped). */
export function divergingRgb(t: number): [number, number, number] {
  const u = (Math.max(-1, Math.min(1, Number.isFinite(t) ? t : 0)) + 1) * 2; // 0 … 4
  const k = Math.min(3, Math.floor(u));
  const f = u - k;
  const a = DIVERGING[k], b = DIVERGING[k + 1];
  return [0, 1, 2].map((i) => Math.round(a[i] + (b[i] - a[i]) * f)) as [number, number, number];
}

/** `#rrggbb` of an RGB triple. */
export const hex = ([r, g, b]: readonly number[]): string => '#' + [r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('');
