/**
 * The house style of the figures (src/report/svg/house-style.ts) checked for colour-vision deficiency and for
 * greyscale print.
 *
 * Colour-vision deficiency is simulated with the severity-1.0 matrices of G. M. Machado, M. M. Oliveira,
 * L. A. F. Fernandes, IEEE Trans. Vis. Comput. Graph. 15, 1291 (2009) (applied to linear RGB; values quoted from
 * memory). Colours are compared in CIELAB (CIE 15:2004, D65 white; sRGB per IEC 61966-2-1) by the CIE76 distance
 * ΔE*ab; greyscale is the CIE L* lightness. Thresholds: ΔE ≥ 20 between series colours, ΔL* ≥ 10 in grey — our
 * own choice (a ΔE of about 2.3 is a just-noticeable difference: Sharma, Digital Color Imaging Handbook, 2003).
 */
import { describe, expect, test } from 'vitest';
import { divergingRgb } from '../../src/report/svg/colours.js';
import { DIVERGING_STEPS, INK, SERIES_COLOURS, SERIES_MARKERS } from '../../src/report/svg/house-style.js';

type Matrix = readonly [readonly number[], readonly number[], readonly number[]];
const CVD: Record<string, Matrix> = {
  protanopia: [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]],
  deuteranopia: [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]],
  tritanopia: [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]],
};

const toLinear = (c: number) => ((c /= 255) <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
const rgbOf = (h: string) => [1, 3, 5].map((i) => parseInt(h.slice(i, i + 2), 16));

/** CIELAB of linear RGB (sRGB primaries, D65). */
function lab(linear: readonly number[]): [number, number, number] {
  const [r, g, b] = linear.map((v) => Math.min(1, Math.max(0, v)));
  const X = 0.4124 * r + 0.3576 * g + 0.1805 * b, Y = 0.2126 * r + 0.7152 * g + 0.0722 * b, Z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const fx = f(X / 0.95047), fy = f(Y), fz = f(Z / 1.08883);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}
const seen = (rgb: readonly number[], m?: Matrix) => {
  const l = rgb.map(toLinear);
  return lab(m ? m.map((row) => row[0] * l[0] + row[1] * l[1] + row[2] * l[2]) : l);
};
const dE = (a: readonly number[], b: readonly number[]) => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);

describe('series palette', () => {
  const colours = SERIES_COLOURS.map(rgbOf);
  test.each([['normal vision', undefined], ...Object.entries(CVD)] as Array<[string, Matrix | undefined]>)('every two series colours stay apart (ΔE ≥ 20) for %s', (_, m) => {
    for (let i = 0; i < colours.length; i++)
      for (let j = i + 1; j < colours.length; j++) expect(dE(seen(colours[i], m), seen(colours[j], m)), `${SERIES_COLOURS[i]} vs ${SERIES_COLOURS[j]}`).toBeGreaterThanOrEqual(20);
  });
  test('in greyscale every two series differ in lightness (ΔL* ≥ 10), and each has its own marker shape', () => {
    const L = colours.map((c) => seen(c)[0]);
    for (let i = 0; i < L.length; i++) for (let j = i + 1; j < L.length; j++) expect(Math.abs(L[i] - L[j])).toBeGreaterThanOrEqual(10);
    expect(new Set(SERIES_MARKERS).size).toBe(SERIES_COLOURS.length);
    expect(SERIES_COLOURS).toContain(INK);
  });
});

describe('diverging map', () => {
  test('lightness rises monotonically towards zero on both sides (magnitude readable in grey)', () => {
    for (const sign of [1, -1]) {
      let last = -Infinity;
      for (let k = DIVERGING_STEPS; k >= 0; k--) {
        const L = seen(divergingRgb((sign * k) / DIVERGING_STEPS))[0];
        expect(L).toBeGreaterThan(last);
        last = L;
      }
    }
  });
  test.each([['normal vision', undefined], ...Object.entries(CVD)] as Array<[string, Matrix | undefined]>)('gain and loss of equal size look different (ΔE ≥ 20) for %s', (_, m) => {
    for (const t of [0.4, 0.6, 0.8, 1]) expect(dE(seen(divergingRgb(t), m), seen(divergingRgb(-t), m))).toBeGreaterThanOrEqual(20);
  });
});
