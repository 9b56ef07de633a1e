/**
 * Minimal SVG markup helpers: elements as strings, XML escaping, compact coordinates, and a small rich-text
 * syntax for labels (`^{…}` superscript, `_{…}` subscript, e.g. `|μ_{A,z}| (e a_{0})`, `R^{-7}`), rendered with
 * `<tspan>` and relative `dy` shifts (supported by browsers and by resvg alike). SVG 1.1 (W3C).
 */

import { FONT_FAMILY, FONT_SIZE, INK, PAPER } from './house-style.js';

export type Attrs = Record<string, string | number | undefined>;

/** Escape the XML special characters of text and attribute values. */
export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A coordinate with at most two decimals (keeps files small; sub-pixel precision is invisible). */
export const px = (x: number): string => {
  const r = Math.round(x * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
};

function attrText(attrs: Attrs): string {
  let s = '';
  for (const [k, v] of Object.entries(attrs)) if (v !== undefined) s += ` ${k}="${escapeXml(typeof v === 'number' ? px(v) : v)}"`;
  return s;
}

/** `<name attrs>children</name>`, or self-closing without children. */
export function el(name: string, attrs: Attrs = {}, children?: string | readonly string[]): string {
  const inner = children === undefined ? undefined : typeof children === 'string' ? children : children.join('');
  return inner === undefined || inner === '' ? `<${name}${attrText(attrs)}/>` : `<${name}${attrText(attrs)}>${inner}</${name}>`;
}

/** A polyline path through the points (`M x y L x y …`); gaps (NaN) start a new piece. */
export function pathThrough(points: ReadonlyArray<readonly [number, number]>): string {
  let d = '';
  let pen = false;
  for (const [x, y] of points) {
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${px(x)} ${px(y)}`;
    pen = true;
  }
  return d;
}

/**
 * Label text with `^{…}` and `_{…}` turned into shifted, smaller tspans. `-` followed by a digit inside a
 * superscript becomes a real minus sign.
 */
export function richText(label: string): string {
  let out = '';
  let shift = 0; // baseline offset (em) left by the last sub- or superscript
  let i = 0;
  while (i < label.length) {
    const c = label[i];
    if ((c === '^' || c === '_') && label[i + 1] === '{') {
      const end = label.indexOf('}', i + 2);
      if (end < 0) break;
      let body = label.slice(i + 2, end);
      if (c === '^') body = body.replace(/-(?=\d)/g, '−');
      const dy = c === '^' ? -0.38 : 0.22;
      // dy of a tspan is in its own (72 %) em; `shift` is kept in the label's em
      out += `<tspan dy="${Math.round(((dy - shift) / 0.72) * 1000) / 1000}em" font-size="72%">${escapeXml(body)}</tspan>`;
      shift = dy;
      i = end + 1;
      continue;
    }
    const next = label.slice(i + 1).search(/[\^_]\{/);
    const stop = next < 0 ? label.length : i + 1 + next;
    const chunk = escapeXml(label.slice(i, stop));
    out += shift === 0 ? chunk : `<tspan dy="${-shift}em">${chunk}</tspan>`;
    shift = 0;
    i = stop;
  }
  return out;
}

/** A text element with rich label content. */
export function text(x: number, y: number, label: string, attrs: Attrs = {}): string {
  return el('text', { x, y, ...attrs }, richText(label));
}

/** A complete SVG document of the given pixel size. */
export function svgDocument(width: number, height: number, body: readonly string[], title?: string): string {
  return (
    `<?xml version="1.0" encoding="UTF-8"?>\n` +
    el(
      'svg',
      {
        xmlns: 'http://www.w3.org/2000/svg',
        'xmlns:xlink': 'http://www.w3.org/1999/xlink',
        width,
        height,
        viewBox: `0 0 ${px(width)} ${px(height)}`,
        'font-family': FONT_FAMILY,
        'font-size': FONT_SIZE,
        fill: INK,
      },
      [title ? el('title', {}, escapeXml(title)) : '', el('rect', { x: 0, y: 0, width, height, fill: PAPER }), ...body],
    ) +
    '\n'
  );
}
