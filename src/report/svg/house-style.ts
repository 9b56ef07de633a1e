/**
 * dispole's house style for figures, in one place: palette, typography, panel layout and legend placement.
 *
 * - Palette: ink-like colours chosen here — teal, amber, violet, near-black — far apart in CIELAB for normal
 *   vision and for simulated protanopia, deuteranopia and tritanopia, and at distinct lightness for greyscale print
 *   (tests/report/house-style.test.ts checks both); each series also has its own marker shape, so print in grey
 *   keeps them apart.
 * - Diverging map (signed densities): violet for loss, olive-gold for gain, a warm paper tone at zero; lightness
 *   rises monotonically towards zero on both sides, so the magnitude reads in grey too (the sign is carried by the
 *   contour style: solid gain, dashed loss). Shown in discrete steps, as vector bands.
 * - Typography: a serif face (Charter where installed, else DejaVu Serif), regular weight throughout; panel tags
 *   are lower-case letters followed by the panel's subject.
 * - Panels: open axes (left and bottom only), ticks pointing outward, faint horizontal guide lines at the labelled
 *   values; each panel carries its own legend, unframed, in a row above its plot area.
 * - Layering: data first, model curves (asymptotic forms) above the data, so the reference stays visible.
 */

/** Colours of ink and paper. */
export const INK = '#1c1c1c';
export const MUTED_INK = '#55524c';
export const GUIDE = '#e4dfd4';
export const PAPER = '#ffffff';
/** Colour of warnings drawn into a figure (UNTRUSTED notes). */
export const ALERT = '#8f2a1c';

/** Curve colours, in order of use (see the module comment for how they were checked). */
export const SERIES_COLOURS = ['#0f6b73', '#d9930d', '#4b3a8c', INK] as const;

/** Marker shape of each series position, so series stay apart in greyscale. */
export const SERIES_MARKERS = ['circle', 'square', 'triangle', 'diamond'] as const;
export type MarkerShape = (typeof SERIES_MARKERS)[number];

/** Dash patterns: model curves dashed, reference lines dotted. */
export const DASH = { model: '6 3', reference: '1.5 3' } as const;

/** Anchors of the diverging map at t = −1, −0.5, 0, 0.5, 1 (RGB, 0…255): violet loss, paper, olive-gold gain. */
export const DIVERGING_ANCHORS: ReadonlyArray<readonly [number, number, number]> = [
  [52, 36, 110],
  [150, 136, 200],
  [247, 243, 234],
  [214, 178, 84],
  [110, 80, 4],
];

/** Number of colour steps on each side of zero in the density map (the bands match the contour levels). */
export const DIVERGING_STEPS = 5;

/** Typography. */
export const FONT_FAMILY = 'Charter, Bitstream Charter, DejaVu Serif, Georgia, serif';
export const FONT_SIZE = 13;
/** Rough advance width of a character of the serif face, in units of the font size. */
export const CHAR_WIDTH = 0.58;

/** Panel geometry: tick length (outward), axis stroke, legend row height. */
export const PANEL = { tick: 5, minorTick: 3, axisWidth: 1, guideWidth: 0.7, legendRow: 18, lineWidth: 1.7, markerRadius: 3 } as const;
