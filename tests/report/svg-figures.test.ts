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

// invented demo species (src/model/builtin-species.ts)
const quelon = drude({ q: 1.1, m: 0.38, w: 0.72 }, 'Quelon');
const virid = drude({ q: 1.45, m: 0.52, w: 0.6 }, 'Virid');

/** Render at the SVG's own pixel size (1 user unit = 1 pixel); returns an RGBA reader. */
function render(svg: string) {
  const img = new Resvg(svg, { font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' } }).render();
  const pixels = img.pixels; // a copy per access: read once
  const px = (x: number, y: number) => Array.from(pixels.subarray((y * img.width + x) * 4, (y * img.width + x) * 4 + 3));
  return { width: img.width, height: img.height, px };
}
const near = (p: number[], q: readonly number[], tol: number) => p.every((v, i) => Math.abs(v - q[i]) <= tol);
const dark = (p: number[]) => p.every((v) => v < 140);
const white = (p: number[]) => p.every((v) => v > 245);

describe('curve figure', () => {
  const R = separationGrid(6, 30, 8, 'log');
  const data = curveData(quelon, virid, exactCurve(quelon, virid, R, { order: 3 }), asymptoticCoefficients(quelon, virid), { tolerance: 1e-10, lengthUnit: 'bohr' });
  const svg = curveFigure(data);
  const img = render(svg);
  test('has the expected size and is not blank', () => {
    expect(img.width).toBe(1000);
    expect(img.height).toBe(870);
    let ink = 0;
    for (let y = 0; y < img.height; y += 2) for (let x = 0; x < img.width; x += 2) if (!white(img.px(x, y))) ink++;
    expect(ink / ((img.width * img.height) / 4)).toBeGreaterThan(0.02);
    expect(white(img.px(5, 5))).toBe(true);
  });
  test('the frames of the panels are drawn (left and bottom edges of panel (a) at x = 100, y = 408)', () => {
    let left = 0, bottom = 0;
    // a 1.1 px line centred on a pixel boundary darkens the pixels on both sides
    for (let y = 100; y < 400; y++) if (dark(img.px(99, y)) || dark(img.px(100, y))) left++;
    for (let x = 110; x < 450; x++) if (dark(img.px(x, 407)) || dark(img.px(x, 408))) bottom++;
    expect(left).toBeGreaterThan(280);
    expect(bottom).toBeGreaterThan(320);
  });
  test('the dipole curves are drawn inside panel (a) in their colours, and axis labels are present', () => {
    let blue = 0, red = 0;
    for (let y = 90; y < 406; y++)
      for (let x = 102; x < 458; x++) {
        const p = img.px(x, y);
        if (near(p, [31, 90, 150], 40)) blue++;
        if (near(p, [194, 70, 31], 40)) red++;
      }
    expect(blue).toBeGreaterThan(200);
    expect(red).toBeGreaterThan(200);
    expect(svg).toContain('R (bohr)');
    expect(svg).toMatch(/\|μ<tspan[^>]*>z<\/tspan>/);
    expect(svg).toMatch(/e a(<\/tspan>)?<tspan[^>]*>0<\/tspan>/);
  });
});

describe('density figure', () => {
  test('shows gain (red) and loss (blue) around both centres, with the colour bars', () => {
    const state = exactSolver(quelon, virid, { order: 3 }).solve(6);
    const axis = Float64Array.from({ length: 61 }, (_, k) => -5 + k / 6);
    const panels = (['a', 'b'] as const).map((c, k) => {
      const m = densityChange(state, c, axis, axis);
      const s = k === 0 ? quelon : virid;
      return { label: k === 0 ? 'A' : 'B', name: s.name, x: m.x, z: m.z, change: m.change, partnerSide: (k === 0 ? 1 : -1) as 1 | -1, width: { perp: 1.3, z: 1.3 } };
    }) as Parameters<typeof densityFigure>[0]['panels'];
    const svg = densityFigure({ title: 'test', panels, lengthUnit: 'bohr', densityUnit: 'a_{0}^{-3}', separation: 'R = 6 bohr', footer: ['basis'] });
    const img = render(svg);
    let red = 0, blue = 0;
    for (let y = 80; y < 405; y += 2)
      for (let x = 90; x < 410; x += 2) {
        const [r, g, b] = img.px(x, y);
        if (r > b + 60 && r > g + 40) red++;
        if (b > r + 60) blue++;
      }
    expect(red).toBeGreaterThan(100);
    expect(blue).toBeGreaterThan(100);
    expect(svg.match(/<image /g)).toHaveLength(2);
    expect(svg.match(/<linearGradient /g)).toHaveLength(2);
    expect(svg).toContain('gain');
  });
});
