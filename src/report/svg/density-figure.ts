/**
 * The figure of `dispole density --svg`, in the house style (house-style.ts): for each centre, a map of the change
 * of its Drude-particle density Δρ(x, z) in the plane y = 0 (interacting minus isolated ground state), the bond
 * axis horizontal. Both panels share ONE symmetric colour scale (the largest |Δρ| of the two), so they compare
 * directly; one colour bar serves both. The map is vector: the house diverging colours in discrete bands
 * (violet loss, olive-gold gain, paper at zero), each grid row drawn as runs of equal band, with contour lines at
 * the band edges (solid gain, dashed loss), the core marked with a cross, the half-maximum contour of the isolated
 * density dotted, and an arrow towards the partner.
 */
import { contourSegments } from './contours.js';
import { bandRgb, divergingBand, hex } from './colours.js';
import { ALERT, DIVERGING_STEPS, INK, MUTED_INK } from './house-style.js';
import { el, px, svgDocument, text } from './svg-markup.js';
import { makeScale } from './scales.js';

export interface DensityPanel {
  /** "A" or "B" and the species name. */
  label: string;
  name: string;
  /** Grid across (x) and along (z) the axis, in the plotted length unit, relative to the centre. */
  x: ArrayLike<number>;
  z: ArrayLike<number>;
  /** Δρ at index i * z.length + j (any density unit; the figure states `densityUnit`). */
  change: ArrayLike<number>;
  /** +1 when the partner lies towards +z (centre A), −1 otherwise. */
  partnerSide: 1 | -1;
  /** rms widths of the isolated density across and along the axis (plotted unit), for the reference contour. */
  width: { perp: number; z: number };
}

export interface DensityFigureSpec {
  title: string;
  panels: [DensityPanel, DensityPanel];
  /** Length unit label, e.g. "bohr". */
  lengthUnit: string;
  /** Density unit as rich text, e.g. "a_{0}^{-3}". */
  densityUnit: string;
  /** Text of the partner arrow, e.g. "R = 6 bohr". */
  separation: string;
  /** Lines printed under the panels (e.g. basis, dipoles, UNTRUSTED notes). */
  footer: readonly string[];
}

const FONT = 13;

/** Largest |Δρ| of a panel. */
function largest(p: DensityPanel): number {
  let max = 0;
  for (let k = 0; k < p.change.length; k++) max = Math.max(max, Math.abs(p.change[k]));
  return max;
}

/**
 * The banded map as vector rectangles: image row r (top → bottom = x descending) is cut into runs of equal band;
 * each run is one rect spanning its cells (cell centres on the grid points).
 */
function bandRects(image: Float64Array, nx: number, nz: number, X: number, Y: number, S: number): string[] {
  const cw = S / nz, ch = S / nx;
  const out: string[] = [];
  for (let r = 0; r < nx; r++) {
    let j = 0;
    while (j < nz) {
      const band = divergingBand(image[r * nz + j]);
      let k = j + 1;
      while (k < nz && divergingBand(image[r * nz + k]) === band) k++;
      if (band !== 0) out.push(el('rect', { x: X + j * cw, y: Y + r * ch, width: (k - j) * cw + 0.35, height: ch + 0.35, fill: hex(bandRgb(band)) }));
      j = k;
    }
  }
  return out;
}

function panel(p: DensityPanel, box: { x: number; y: number; size: number }, spec: DensityFigureSpec, id: string, scale: number): string {
  const nx = p.x.length, nz = p.z.length;
  // image rows top → bottom = x descending; columns = z ascending
  const image = new Float64Array(nx * nz);
  for (let r = 0; r < nx; r++) for (let j = 0; j < nz; j++) image[r * nz + j] = p.change[(nx - 1 - r) * nz + j] / scale;
  const { x: X, y: Y, size: S } = box;
  const zMin = p.z[0], zMax = p.z[nz - 1], xMin = p.x[0], xMax = p.x[nx - 1];
  const sz = makeScale('linear', [zMin, zMax], [X, X + S]);
  const sx = makeScale('linear', [xMin, xMax], [Y + S, Y]);
  const parts: string[] = [];
  parts.push(el('defs', {}, el('clipPath', { id: `${id}-clip` }, el('rect', { x: X, y: Y, width: S, height: S }))));
  parts.push(el('rect', { x: X, y: Y, width: S, height: S, fill: hex(bandRgb(0)) }));
  parts.push(el('g', { 'clip-path': `url(#${id}-clip)` }, bandRects(image, nx, nz, X, Y, S)));

  const lines: string[] = [];
  for (let k = 1; k <= DIVERGING_STEPS; k++) {
    const level = (k - 0.5) / DIVERGING_STEPS; // the band edges
    for (const sign of [1, -1]) {
      const segs = contourSegments(image, nx, nz, sign * level);
      if (segs.length === 0) continue;
      const d = segs.map(([c1, r1, c2, r2]) => `M${px(X + (c1 / (nz - 1)) * S)} ${px(Y + (r1 / (nx - 1)) * S)}L${px(X + (c2 / (nz - 1)) * S)} ${px(Y + (r2 / (nx - 1)) * S)}`).join('');
      lines.push(el('path', { d, fill: 'none', stroke: INK, 'stroke-opacity': 0.6, 'stroke-width': 0.8, 'stroke-dasharray': sign < 0 ? '3 2' : undefined }));
    }
  }
  // half-maximum contour of the isolated density: exp(−r²/2s²) = ½ → r = s sqrt(2 ln 2)
  const k = Math.sqrt(2 * Math.LN2);
  lines.push(el('ellipse', { cx: sz.map(0), cy: sx.map(0), rx: (sz.map(k * p.width.z) - sz.map(0)), ry: (sx.map(0) - sx.map(k * p.width.perp)), fill: 'none', stroke: '#555555', 'stroke-width': 0.9, 'stroke-dasharray': '1 2.5' }));
  // the core
  const cx = sz.map(0), cy = sx.map(0);
  lines.push(el('path', { d: `M${px(cx - 6)} ${px(cy)}h12M${px(cx)} ${px(cy - 6)}v12`, stroke: '#000000', 'stroke-width': 1.6 }));
  parts.push(el('g', { 'clip-path': `url(#${id}-clip)` }, lines));

  // open axes, outward ticks
  parts.push(el('path', { d: `M${px(X)} ${px(Y)}V${px(Y + S)}H${px(X + S)}`, fill: 'none', stroke: INK, 'stroke-width': 1 }));
  for (const t of sz.ticks()) {
    const q = sz.map(t.value);
    parts.push(el('path', { d: `M${px(q)} ${px(Y + S)}v5`, stroke: INK, 'stroke-width': 1 }));
    parts.push(text(q, Y + S + FONT + 7, t.label, { 'text-anchor': 'middle' }));
  }
  for (const t of sx.ticks()) {
    const q = sx.map(t.value);
    parts.push(el('path', { d: `M${px(X)} ${px(q)}h-5`, stroke: INK, 'stroke-width': 1 }));
    parts.push(text(X - 8, q + FONT * 0.35, t.label, { 'text-anchor': 'end' }));
  }
  const sub = p.label === 'A' ? 'A' : 'B';
  parts.push(text(X + S / 2, Y + S + 2 * FONT + 14, `z − z_{${sub}} (${spec.lengthUnit}), along the bond axis`, { 'text-anchor': 'middle', 'font-size': FONT + 1 }));
  parts.push(text(X - 44, Y + S / 2, `x (${spec.lengthUnit})`, { 'text-anchor': 'middle', 'font-size': FONT + 1, transform: `rotate(-90 ${px(X - 44)} ${px(Y + S / 2)})` }));
  parts.push(text(X - 44, Y - 10, `${p.label.toLowerCase()}`, { 'font-size': FONT + 2 }));
  parts.push(text(X - 28, Y - 10, `centre ${p.label} = ${p.name}`, { fill: MUTED_INK }));
  // partner arrow above the frame
  const other = p.label === 'A' ? 'B' : 'A';
  const ay = Y - 10;
  const arrowText = `${other} at ${spec.separation}`;
  if (p.partnerSide > 0) {
    const x1 = X + S, x0 = x1 - 34;
    parts.push(el('path', { d: `M${px(x0)} ${px(ay - 4)}H${px(x1)}m-7 -4l7 4l-7 4`, stroke: INK, fill: 'none', 'stroke-width': 1.2 }));
    parts.push(text(x0 - 6, ay, arrowText, { 'text-anchor': 'end', 'font-size': FONT - 1 }));
  } else {
    const x0 = X + S - 150, x1 = x0 + 34;
    parts.push(el('path', { d: `M${px(x1)} ${px(ay - 4)}H${px(x0)}m7 -4l-7 4l7 4`, stroke: INK, fill: 'none', 'stroke-width': 1.2 }));
    parts.push(text(x1 + 6, ay, arrowText, { 'font-size': FONT - 1 }));
  }

  return el('g', {}, parts);
}

/** One colour bar for both panels: the bands, labelled at the band edges in units of 10^k, gain on top. */
function colourBar(x: number, y: number, height: number, max: number, densityUnit: string): string {
  const bw = 14, n = 2 * DIVERGING_STEPS + 1;
  const parts: string[] = [];
  for (let i = 0; i < n; i++) {
    const band = DIVERGING_STEPS - i; // top: strongest gain
    parts.push(el('rect', { x, y: y + (i * height) / n, width: bw, height: height / n + 0.3, fill: hex(bandRgb(band)) }));
  }
  parts.push(el('rect', { x, y, width: bw, height, fill: 'none', stroke: INK, 'stroke-width': 0.8 }));
  const exponent = max > 0 ? Math.floor(Math.log10(max)) : 0;
  const unitScale = 10 ** exponent;
  for (const f of [1, 0, -1]) {
    const q = y + ((1 - f) / 2) * height;
    const v = (f * max) / unitScale;
    parts.push(el('path', { d: `M${px(x + bw)} ${px(q)}h4`, stroke: INK, 'stroke-width': 0.9 }));
    parts.push(text(x + bw + 7, q + FONT * 0.35, v === 0 ? '0' : v.toFixed(2).replace('-', '−'), { 'font-size': FONT - 1 }));
  }
  const tx = x + bw + 62;
  parts.push(text(tx, y + height / 2, `Δρ (10^{${exponent}} ${densityUnit})`, { 'text-anchor': 'middle', 'font-size': FONT, transform: `rotate(-90 ${px(tx)} ${px(y + height / 2)})` }));
  parts.push(text(x + bw / 2, y - 7, 'gain', { 'text-anchor': 'middle', 'font-size': FONT - 2, fill: MUTED_INK }));
  parts.push(text(x + bw / 2, y + height + 16, 'loss', { 'text-anchor': 'middle', 'font-size': FONT - 2, fill: MUTED_INK }));
  return el('g', {}, parts);
}

/** The whole SVG document. */
export function densityFigure(spec: DensityFigureSpec): string {
  const W = 1000, S = 330, top = 78;
  const H = top + S + 70 + 18 * spec.footer.length;
  // one scale for both panels, so equal colours mean equal Δρ
  const max = Math.max(largest(spec.panels[0]), largest(spec.panels[1]));
  const scale = max > 0 ? max : 1;
  const body = [
    text(40, 28, spec.title, { 'font-size': 15 }),
    panel(spec.panels[0], { x: 85, y: top, size: S }, spec, 'densA', scale),
    panel(spec.panels[1], { x: 520, y: top, size: S }, spec, 'densB', scale),
    colourBar(880, top, S, max, spec.densityUnit),
    ...spec.footer.map((line, i) => text(40, top + S + 62 + 18 * i, line, { 'font-size': 12, fill: line.includes('UNTRUSTED') ? ALERT : MUTED_INK })),
  ];
  return svgDocument(W, H, body, spec.title);
}
