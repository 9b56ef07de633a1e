/**
 * The figure of `dispole density --svg`: for each centre, a colour map of the change of its Drude-particle
 * density Δρ(x, z) in the plane y = 0 (interacting minus isolated ground state), the bond axis horizontal.
 * Diverging colours (red gain, blue loss, white none) on a symmetric scale per panel with its colour bar,
 * contour lines at ±20, 40, 60, 80 % of the largest |Δρ| (solid gain, dashed loss), the core marked with a cross,
 * the half-maximum contour of the isolated density dotted, and an arrow towards the partner.
 */
import { contourSegments } from './contours.js';
import { divergingRgb, hex } from './colours.js';
import { encodePng, pngDataUri } from './png-image.js';
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

function panel(p: DensityPanel, box: { x: number; y: number; size: number }, spec: DensityFigureSpec, id: string): string {
  const nx = p.x.length, nz = p.z.length;
  let max = 0;
  for (let k = 0; k < p.change.length; k++) max = Math.max(max, Math.abs(p.change[k]));
  const scale = max > 0 ? max : 1;
  // image rows top → bottom = x descending; columns = z ascending
  const rgb = new Uint8Array(nx * nz * 3);
  const image = new Float64Array(nx * nz);
  for (let r = 0; r < nx; r++)
    for (let j = 0; j < nz; j++) {
      const v = p.change[(nx - 1 - r) * nz + j] / scale;
      image[r * nz + j] = v;
      rgb.set(divergingRgb(v), (r * nz + j) * 3);
    }
  const { x: X, y: Y, size: S } = box;
  const zMin = p.z[0], zMax = p.z[nz - 1], xMin = p.x[0], xMax = p.x[nx - 1];
  const sz = makeScale('linear', [zMin, zMax], [X, X + S]);
  const sx = makeScale('linear', [xMin, xMax], [Y + S, Y]);
  const parts: string[] = [];
  parts.push(el('defs', {}, el('clipPath', { id: `${id}-clip` }, el('rect', { x: X, y: Y, width: S, height: S }))));
  parts.push(el('image', { x: X, y: Y, width: S, height: S, preserveAspectRatio: 'none', href: pngDataUri(encodePng(nz, nx, rgb)) }));

  const lines: string[] = [];
  for (const level of [0.2, 0.4, 0.6, 0.8])
    for (const sign of [1, -1]) {
      const segs = contourSegments(image, nx, nz, sign * level);
      if (segs.length === 0) continue;
      const d = segs.map(([c1, r1, c2, r2]) => `M${px(X + (c1 / (nz - 1)) * S)} ${px(Y + (r1 / (nx - 1)) * S)}L${px(X + (c2 / (nz - 1)) * S)} ${px(Y + (r2 / (nx - 1)) * S)}`).join('');
      lines.push(el('path', { d, fill: 'none', stroke: '#1a1a1a', 'stroke-opacity': 0.55, 'stroke-width': 0.8, 'stroke-dasharray': sign < 0 ? '3 2' : undefined }));
    }
  // half-maximum contour of the isolated density: exp(−r²/2s²) = ½ → r = s sqrt(2 ln 2)
  const k = Math.sqrt(2 * Math.LN2);
  lines.push(el('ellipse', { cx: sz.map(0), cy: sx.map(0), rx: (sz.map(k * p.width.z) - sz.map(0)), ry: (sx.map(0) - sx.map(k * p.width.perp)), fill: 'none', stroke: '#555555', 'stroke-width': 0.9, 'stroke-dasharray': '1 2.5' }));
  // the core
  const cx = sz.map(0), cy = sx.map(0);
  lines.push(el('path', { d: `M${px(cx - 6)} ${px(cy)}h12M${px(cx)} ${px(cy - 6)}v12`, stroke: '#000000', 'stroke-width': 1.6 }));
  parts.push(el('g', { 'clip-path': `url(#${id}-clip)` }, lines));

  // frame and ticks
  parts.push(el('rect', { x: X, y: Y, width: S, height: S, fill: 'none', stroke: '#000', 'stroke-width': 1.1 }));
  for (const t of sz.ticks()) {
    const q = sz.map(t.value);
    parts.push(el('path', { d: `M${px(q)} ${px(Y + S)}v-5M${px(q)} ${px(Y)}v5`, stroke: '#000', 'stroke-width': 0.9 }));
    parts.push(text(q, Y + S + FONT + 5, t.label, { 'text-anchor': 'middle' }));
  }
  for (const t of sx.ticks()) {
    const q = sx.map(t.value);
    parts.push(el('path', { d: `M${px(X)} ${px(q)}h5M${px(X + S)} ${px(q)}h-5`, stroke: '#000', 'stroke-width': 0.9 }));
    parts.push(text(X - 6, q + FONT * 0.35, t.label, { 'text-anchor': 'end' }));
  }
  const sub = p.label === 'A' ? 'A' : 'B';
  parts.push(text(X + S / 2, Y + S + 2 * FONT + 14, `z − z_{${sub}} (${spec.lengthUnit}), along the bond axis`, { 'text-anchor': 'middle', 'font-size': FONT + 1 }));
  parts.push(text(X - 44, Y + S / 2, `x (${spec.lengthUnit})`, { 'text-anchor': 'middle', 'font-size': FONT + 1, transform: `rotate(-90 ${px(X - 44)} ${px(Y + S / 2)})` }));
  parts.push(text(X, Y - 10, `${p.label} = ${p.name}`, { 'font-weight': 'bold', 'font-size': FONT + 1 }));
  // partner arrow above the frame
  const other = p.label === 'A' ? 'B' : 'A';
  const ay = Y - 10;
  const arrowText = `${other} at ${spec.separation}`;
  if (p.partnerSide > 0) {
    const x1 = X + S, x0 = x1 - 34;
    parts.push(el('path', { d: `M${px(x0)} ${px(ay - 4)}H${px(x1)}m-7 -4l7 4l-7 4`, stroke: '#000', fill: 'none', 'stroke-width': 1.2 }));
    parts.push(text(x0 - 6, ay, arrowText, { 'text-anchor': 'end', 'font-size': FONT - 1 }));
  } else {
    const x0 = X + S - 150, x1 = x0 + 34;
    parts.push(el('path', { d: `M${px(x1)} ${px(ay - 4)}H${px(x0)}m7 -4l-7 4l7 4`, stroke: '#000', fill: 'none', 'stroke-width': 1.2 }));
    parts.push(text(x1 + 6, ay, arrowText, { 'font-size': FONT - 1 }));
  }

  // colour bar
  const bx = X + S + 16, bw = 14;
  const stops = Array.from({ length: 21 }, (_, i) => {
    const t = 1 - i / 10; // top = +1
    return el('stop', { offset: `${(i / 20) * 100}%`, 'stop-color': hex(divergingRgb(t)) });
  });
  parts.push(el('defs', {}, el('linearGradient', { id: `${id}-bar`, x1: 0, y1: 0, x2: 0, y2: 1 }, stops)));
  parts.push(el('rect', { x: bx, y: Y, width: bw, height: S, fill: `url(#${id}-bar)`, stroke: '#000', 'stroke-width': 0.8 }));
  const exponent = max > 0 ? Math.floor(Math.log10(max)) : 0;
  const unitScale = 10 ** exponent;
  for (const f of [1, 0.5, 0, -0.5, -1]) {
    const q = Y + ((1 - f) / 2) * S;
    const v = (f * max) / unitScale;
    parts.push(el('path', { d: `M${px(bx + bw)} ${px(q)}h4`, stroke: '#000', 'stroke-width': 0.9 }));
    parts.push(text(bx + bw + 7, q + FONT * 0.35, v === 0 ? '0' : v.toFixed(2).replace('-', '−'), { 'font-size': FONT - 1 }));
  }
  const tx = bx + bw + 60;
  parts.push(text(tx, Y + S / 2, `Δρ (10^{${exponent}} ${spec.densityUnit})`, { 'text-anchor': 'middle', 'font-size': FONT, transform: `rotate(-90 ${px(tx)} ${px(Y + S / 2)})` }));
  parts.push(text(bx + bw / 2, Y - 7, 'gain', { 'text-anchor': 'middle', 'font-size': FONT - 3, fill: '#8c161e' }));
  parts.push(text(bx + bw / 2, Y + S + 15, 'loss', { 'text-anchor': 'middle', 'font-size': FONT - 3, fill: '#183a78' }));
  return el('g', {}, parts);
}

/** The whole SVG document. */
export function densityFigure(spec: DensityFigureSpec): string {
  const W = 1000, S = 330, top = 78;
  const H = top + S + 70 + 18 * spec.footer.length;
  const body = [
    text(W / 2, 28, spec.title, { 'text-anchor': 'middle', 'font-size': 15 }),
    panel(spec.panels[0], { x: 85, y: top, size: S }, spec, 'densA'),
    panel(spec.panels[1], { x: 575, y: top, size: S }, spec, 'densB'),
    ...spec.footer.map((line, i) => text(40, top + S + 62 + 18 * i, line, { 'font-size': 12, fill: line.includes('UNTRUSTED') ? '#a01010' : '#333333' })),
  ];
  return svgDocument(W, H, body, spec.title);
}
