/** The small SVG plotting library: rich-text labels, scales and ticks, the PNG encoder, contour lines. */
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, test } from 'vitest';
import { divergingRgb } from '../../src/report/svg/colours.js';
import { contourSegments } from '../../src/report/svg/contours.js';
import { crc32, encodePng, pngDataUri } from '../../src/report/svg/png-image.js';
import { makeScale, niceDomain } from '../../src/report/svg/scales.js';
import { el, escapeXml, richText, svgDocument } from '../../src/report/svg/svg-markup.js';
import { expectClose } from '../helpers/tolerance.js';

describe('markup', () => {
  test('escapes XML and turns ^{…} and _{…} into shifted tspans that return to the baseline', () => {
    expect(escapeXml('a<b & "c"')).toBe('a&lt;b &amp; &quot;c&quot;');
    const t = richText('R^{-7} and μ_{A,z}^{2} (e)');
    expect(t).toContain('>−7</tspan>'); // a real minus sign in exponents
    expect(t).toContain('>A,z</tspan>');
    // the dy shifts (in the label's em; sub/superscript tspans are at 72 %) return to the baseline for the plain text
    let sum = 0;
    for (const m of t.matchAll(/<tspan dy="([-\d.]+)em"( font-size="72%")?>/g)) sum += Number(m[1]) * (m[2] ? 0.72 : 1);
    expect(t.match(/<tspan/g)).toHaveLength(5);
    expect(Math.abs(sum)).toBeLessThan(1e-3);
    expect(el('rect', { x: 1.234567, fill: 'red' })).toBe('<rect x="1.23" fill="red"/>');
  });
  test('a document is well-formed SVG with a white background', () => {
    const doc = svgDocument(100, 50, [el('circle', { cx: 10, cy: 10, r: 5 })], 'a <title>');
    expect(doc).toMatch(/^<\?xml version="1.0" encoding="UTF-8"\?>\n<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(doc).toContain('<title>a &lt;title&gt;</title>');
    expect(doc.trim().endsWith('</svg>')).toBe(true);
  });
});

describe('scales', () => {
  test('log axis over many decades: labelled decade ticks 10^k; short axis: plain numbers', () => {
    const s = makeScale('log', [1e-10, 1e-2], [0, 400]);
    const labels = s.ticks().filter((t) => t.label).map((t) => t.label);
    expect(labels).toContain('10^{-10}');
    expect(labels).toContain('10^{-6}');
    expectClose(s.map(1e-6), 200, 1e-12);
    const r = makeScale('log', niceDomain('log', 4, 60), [0, 400]);
    const rl = r.ticks().filter((t) => t.label).map((t) => t.label);
    expect(rl).toEqual(expect.arrayContaining(['5', '10', '20', '50']));
  });
  test('linear ticks step by 1, 2 or 5 × 10^k', () => {
    const s = makeScale('linear', [0.8, 1.0], [0, 100]);
    expect(s.ticks().map((t) => t.label)).toEqual(['0.80', '0.85', '0.90', '0.95', '1.00']);
  });
});

describe('colour map', () => {
  test('diverging (house style): paper tone at zero, violet for loss, olive-gold for gain, clamped beyond ±1', () => {
    expect(divergingRgb(0)).toEqual([247, 243, 234]);
    const [r1, , b1] = divergingRgb(1), [r2, , b2] = divergingRgb(-1);
    expect(r1).toBeGreaterThan(b1); // gain: warm
    expect(b2).toBeGreaterThan(r2); // loss: cool
    expect(divergingRgb(5)).toEqual(divergingRgb(1));
  });
});

describe('PNG encoder', () => {
  test('CRC-32 of the IEND chunk type is AE 42 60 82 (PNG specification, W3C 2003)', () => {
    expect(crc32(new TextEncoder().encode('IEND')).toString(16)).toBe('ae426082');
  });
  test('an encoded image embedded in SVG renders back with its colours (resvg)', () => {
    const rgb = new Uint8Array(2 * 2 * 3);
    rgb.set([255, 0, 0, 0, 255, 0, 0, 0, 255, 255, 255, 0]);
    const png = encodePng(2, 2, rgb);
    expect(Array.from(png.subarray(0, 8))).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const svg = svgDocument(20, 20, [el('image', { x: 0, y: 0, width: 20, height: 20, href: pngDataUri(png), 'image-rendering': 'optimizeSpeed', preserveAspectRatio: 'none' })]);
    const img = new Resvg(svg).render();
    const pixels = img.pixels; // a copy per access: read once
    const at = (x: number, y: number) => Array.from(pixels.subarray((y * img.width + x) * 4, (y * img.width + x) * 4 + 3));
    expect(at(4, 4)).toEqual([255, 0, 0]);
    expect(at(15, 4)).toEqual([0, 255, 0]);
    expect(at(4, 15)).toEqual([0, 0, 255]);
    expect(at(15, 15)).toEqual([255, 255, 0]);
  });
});

describe('contours', () => {
  test('marching squares on x² + y² gives segments on the circle of the level', () => {
    const n = 41, h = 0.1;
    const f = new Float64Array(n * n);
    for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) f[r * n + c] = ((c - 20) * h) ** 2 + ((r - 20) * h) ** 2;
    const segs = contourSegments(f, n, n, 1.5 ** 2);
    expect(segs.length).toBeGreaterThan(40);
    for (const [x1, y1] of segs) expectClose(Math.hypot((x1 - 20) * h, (y1 - 20) * h), 1.5, 2e-3);
    expect(contourSegments(f, n, n, 100)).toHaveLength(0);
  });
});
