/**
 * The curve and density figures rendered to pixels with resvg (no browser): not blank, axes and curves drawn,
 * the colour map showing gain and loss.
 */
import { Resvg } from '@resvg/resvg-js';
import { describe, expect, test } from 'vitest';
import { asymptoticCoefficients } from '../../src/cli/commands/curve.js';
import { exactCurve, separationGrid } from '../../src/engines/exact/curve.js';
import { densityChange } from '../../src/engines/exact/density.js';
import { exactSolver } from '../../src/engines/exact/exact-solver.js';
import { drude } from '../../src/model/drude.js';
import { curveData } from '../../src/report/curve-report.js';
import { curveFigure } from '../../src/report/svg/curve-figure.js';
import { densityFigure } from '../../src/report/svg/density-figure.js';
import { bandRgb, hex } from '../../src/report/svg/colours.js';
import { ALERT, DIVERGING_STEPS, FONT_FAMILY, GUIDE, INK, MUTED_INK, PAPER, SERIES_COLOURS } from '../../src/report/svg/house-style.js';

// invented demo species (src/model/builtin-species.ts)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/** Render at the SVG's own pixel size (1 user unit = 1 pixel); returns an RGBA reader. */
function render(svg: string) {
  const img = new Resvg(svg, { font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Serif' } }).render();
  const pixels = img.pixels; // a copy per access: read once
  const px = (x: number, y: number) => Array.from(pixels.subarray((y * img.width + x) * 4, (y * img.width + x) * 4 + 3));
  return { width: img.width, height: img.height, px };
}
const near = (p: number[], q: readonly number[], tol: number) => p.every((v, i) => Math.abs(v - q[i]) <= tol);
const dark = (p: number[]) => p.every((v) => v < 140);
const white = (p: number[]) => p.every((v) => v > 245);

describe('curve figure (house style)', () => {
  const R = separationGrid(6, 30, 8, 'log');
  const data = curveData(quelon, virid, exactCurve(quelon, virid, R, { order: 3 }), asymptoticCoefficients(quelon, virid), { tolerance: 1e-10, lengthUnit: 'bohr' });
  const svg = curveFigure(data);
  const img = render(svg);
  test('is not blank, on paper', () => {
    expect(img.width).toBe(1000);
    let ink = 0;
    for (let y = 0; y < img.height; y += 2) for (let x = 0; x < img.width; x += 2) if (!white(img.px(x, y))) ink++;
    expect(ink / ((img.width * img.height) / 4)).toBeGreaterThan(0.02);
    expect(white(img.px(5, 5))).toBe(true);
  });
  test('the curves are drawn in the palette of the style module, and nothing else colourful', () => {
    const counts = SERIES_COLOURS.map(() => 0);
    for (let y = 0; y < img.height; y++)
      for (let x = 0; x < img.width; x++) {
        const p = img.px(x, y);
        const k = SERIES_COLOURS.findIndex((c) => near(p, rgbOf(c), 30));
        if (k >= 0) counts[k]++;
      }
    expect(counts[0]).toBeGreaterThan(300); // teal: centre A
    expect(counts[1]).toBeGreaterThan(300); // amber: centre B
    // every colour in the markup is one of the style module's
    const allowed = new Set<string>([...SERIES_COLOURS, INK, MUTED_INK, GUIDE, PAPER, ALERT]);
    const used = new Set([...svg.matchAll(/(?:fill|stroke)="(#[0-9a-f]{6})"/g)].map((m) => m[1]));
    expect([...used].filter((c) => !allowed.has(c))).toEqual([]);
    expect(svg).toContain(`font-family="${FONT_FAMILY}"`);
    expect(svg).not.toContain('font-weight="bold"');
    expect(svg).toContain('R (bohr)');
    expect(svg).toMatch(/\|μ<tspan[^>]*>z<\/tspan>/);
  });
  test('open axes: no frame on the right of panel a, ticks outward', () => {
    expect(svg).not.toMatch(/<rect [^>]*fill="none" stroke="#000"/);
  });
  test('asymptotic forms are drawn above the data; untrusted points are not joined to the line', () => {
    const far = curveData(quelon, virid, exactCurve(quelon, virid, separationGrid(3.5, 12, 5, 'log'), { order: 3 }), asymptoticCoefficients(quelon, virid), { tolerance: 1e-10, lengthUnit: 'bohr' });
    expect(far.trusted).toBe(false);
    const fig = curveFigure(far);
    const panelA = fig.slice(fig.indexOf('clip-path="url(#dipole-clip)"'));
    const group = panelA.slice(0, panelA.indexOf('</g>'));
    // first path of the group: the exact line of centre A, solid; the dashed (model) paths come after every solid one
    const paths = [...group.matchAll(/<path [^>]*>/g)].map((m) => m[0]);
    const firstDashed = paths.findIndex((p) => p.includes('stroke-dasharray'));
    expect(firstDashed).toBeGreaterThan(0);
    expect(paths.slice(firstDashed).every((p) => p.includes('stroke-dasharray'))).toBe(true);
    // the first point is untrusted: the line of centre A starts at the first trusted point (one M, fewer L than points)
    const line = /d="([^"]*)"/.exec(paths[0])![1];
    expect((line.match(/L/g) ?? []).length).toBeLessThan(far.rows.length - 1);
  });
});

describe('density figure (house style)', () => {
  test('a vector map on one shared scale: gain (olive-gold) and loss (violet) around both centres, one colour bar', () => {
    const state = exactSolver(quelon, virid, { order: 3 }).solve(6);
    const axis = Float64Array.from({ length: 61 }, (_, k) => -5 + k / 6);
    const panels = (['a', 'b'] as const).map((c, k) => {
      const m = densityChange(state, c, axis, axis);
      const s = k === 0 ? quelon : virid;
      return { label: k === 0 ? 'A' : 'B', name: s.name, x: m.x, z: m.z, change: m.change, partnerSide: (k === 0 ? 1 : -1) as 1 | -1, width: { perp: 1.3, z: 1.3 } };
    }) as Parameters<typeof densityFigure>[0]['panels'];
    const svg = densityFigure({ title: 'test', panels, lengthUnit: 'bohr', densityUnit: 'a_{0}^{-3}', separation: 'R = 6 bohr', footer: ['basis'] });
    expect(svg).not.toMatch(/<image /); // vector, not raster
    const img = render(svg);
    const side = (sign: number) => Array.from({ length: DIVERGING_STEPS }, (_, k) => rgbOf(hex(bandRgb(sign * (k + 1)))));
    let gain = 0, loss = 0;
    for (let y = 80; y < 405; y += 2)
      for (let x = 90; x < 850; x += 2) {
        const p = img.px(x, y);
        if (side(1).some((c) => near(p, c, 6))) gain++;
        if (side(-1).some((c) => near(p, c, 6))) loss++;
      }
    expect(gain).toBeGreaterThan(100);
    expect(loss).toBeGreaterThan(100);
    // every fill of the map is a band colour of the style module
    const bandColours = new Set(Array.from({ length: 2 * DIVERGING_STEPS + 1 }, (_, i) => hex(bandRgb(i - DIVERGING_STEPS))));
    const fills = [...svg.matchAll(/<rect [^>]*fill="(#[0-9a-f]{6})"/g)].map((m) => m[1]).filter((f) => f !== '#ffffff');
    expect(fills.length).toBeGreaterThan(50);
    expect(fills.every((f) => bandColours.has(f))).toBe(true);
    expect(svg).toContain('gain');
    // shared scale: the panel with the smaller |Δρ| reaches the strongest band nowhere
    const maxOf = (p: (typeof panels)[0]) => Math.max(...Array.from(p.change, Math.abs));
    expect(maxOf(panels[0])).not.toBe(maxOf(panels[1]));
  });
});

const rgbOf = (h: string): number[] => [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16));
