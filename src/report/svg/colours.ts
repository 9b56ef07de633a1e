/**
 * Colour helpers of the plots: the diverging map of the house style (src/report/svg/house-style.ts) for signed
 * quantities, interpolated linearly in sRGB between its anchors, and `#rrggbb` text.
 */
import { DIVERGING_ANCHORS, DIVERGING_STEPS, SERIES_COLOURS } from './house-style.js';

export { SERIES_COLOURS };

/** RGB of t ∈ [−1, 1] on the diverging map (clamped): −1 strongest loss, 0 none, +1 strongest gain. */
export function divergingRgb(t: number): [number, number, number] {
  const u = (Math.max(-1, Math.min(1, Number.isFinite(t) ? t : 0)) + 1) * 2; // 0 … 4
  const k = Math.min(3, Math.floor(u));
  const f = u - k;
  const a = DIVERGING_ANCHORS[k], b = DIVERGING_ANCHORS[k + 1];
  return [0, 1, 2].map((i) => Math.round(a[i] + (b[i] - a[i]) * f)) as [number, number, number];
}

/**
 * The band of t on the stepped map: round(t · DIVERGING_STEPS), from −DIVERGING_STEPS to DIVERGING_STEPS; band k
 * holds |t| within ½/DIVERGING_STEPS of k/DIVERGING_STEPS, so the band edges (the contour levels of the density
 * figure) are at (k − ½)/DIVERGING_STEPS and band 0 (|t| below the first edge) is the paper tone.
 */
export function divergingBand(t: number): number {
  const v = Math.max(-1, Math.min(1, Number.isFinite(t) ? t : 0));
  return Math.sign(v) * Math.min(DIVERGING_STEPS, Math.round(Math.abs(v) * DIVERGING_STEPS));
}

/** Colour of a band: the map at k/DIVERGING_STEPS. */
export const bandRgb = (band: number): [number, number, number] => divergingRgb(band / DIVERGING_STEPS);

/** `#rrggbb` of an RGB triple. */
export const hex = ([r, g, b]: readonly number[]): string => '#' + [r, g, b].map((v) => v.toString(16).padStart(2, '0')).join('');
