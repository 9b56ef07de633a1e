/**
 * The finite-Z exact solution of a QDO in its multipole-expanded image potential: the curve tends to the
 * asymptotic coefficients of the routes (closed forms derived here, symbolic-surface.ts), the basis loop converges,
 * and a basis that would reach the escape barrier is flagged.
 */
import { describe, expect, test } from 'vitest';
import { surfaceExactCurve } from '../../src/engines/surface/exact-surface.js';
import { fitInverseSeries } from '../../src/engines/exact/asymptotic-fit.js';
import { drude } from '../../src/model/drude.js';
import { expectClose } from '../helpers/tolerance.js';

const q = 1.1, m = 0.38, w = 0.72;
const qdo = drude({ q, m, w }, 'Quelon');

describe('QDO in front of a conductor at finite Z', () => {
  test('Z^4 mu_z and Z^3 E fitted in 1/Z give D4 = 3q³/(8m²w³) and C3 = q²/(8mw) (closed forms derived here)', () => {
    const Z = [10, 12, 14, 17, 20, 24, 29, 35];
    const curve = surfaceExactCurve(qdo, Z, { order: 4, maxQuanta: 16 });
    for (const p of curve.points) expect(p.trusted, p.reasons.join('; ')).toBe(true);
    // mu: W3 at first order (Z^-4), W2·W3 (Z^-7), W3·W4 (Z^-9), W2²·W3 (Z^-10); E: W2 (Z^-3), W4 (Z^-5), W2² (Z^-6), W3², W2·W4 (Z^-8), W2³ (Z^-9), W4², W2²·W4 (Z^-10)
    const mu = fitInverseSeries(Z, curve.points.map((p) => p.muNormal), [4, 7, 9, 10]);
    const E = fitInverseSeries(Z, curve.points.map((p) => p.energy), [3, 5, 6, 8, 9, 10]);
    expectClose(mu.coefficients[0], (3 * q ** 3) / (8 * m * m * w ** 3), 1e-6, 0, 'D4');
    expectClose(-E.coefficients[0], (q * q) / (8 * m * w), 1e-7, 0, 'C3');
    expectClose(-E.coefficients[1], (3 * q * q) / (16 * m * m * w * w), 1e-3, 0, 'C5');
  });
  test('close to the surface the expanded potential has a low escape barrier: the point is flagged, not trusted', () => {
    const [p] = surfaceExactCurve(qdo, [1.2], { order: 4, maxQuanta: 16 }).points;
    expect(p.trusted).toBe(false);
    expect(p.reasons.join(' ')).toMatch(/escape barrier/);
  });
});
