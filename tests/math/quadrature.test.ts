import { describe, expect, test } from 'vitest';
import { gaussLegendre } from '../../src/math/gauss-legendre.js';
import { integrateSemiInfinite } from '../../src/math/semi-infinite-quadrature.js';
import { expectClose } from '../helpers/tolerance.js';

describe('Gauss–Legendre rule', () => {
  test('integrates x^(2n−1) exactly and its weights sum to 2 (defining property; common practice)', () => {
    for (const n of [5, 20]) {
      const { nodes, weights } = gaussLegendre(n);
      expectClose(weights.reduce((a, b) => a + b, 0), 2, 1e-14);
      const k = 2 * n - 2;
      let s = 0;
      nodes.forEach((x, i) => (s += weights[i] * x ** k));
      expectClose(s, 2 / (k + 1), 1e-13);
    }
  });
});

describe('semi-infinite adaptive quadrature', () => {
  test('∫0^∞ du/((a²+u²)(b²+u²)) = π/(2ab(a+b)) (standard integral)', () => {
    const a = 0.3, b = 2.7;
    const r = integrateSemiInfinite((u) => Float64Array.of(1 / ((a * a + u * u) * (b * b + u * u))), 1, { scale: 1 });
    expect(r.converged).toBe(true);
    expectClose(r.value[0], Math.PI / (2 * a * b * (a + b)), 1e-13);
    expect(r.error[0]).toBeLessThan(1e-12 * r.value[0]);
  });
  test('a vector integrand meets the tolerance in every component', () => {
    const r = integrateSemiInfinite((u) => Float64Array.of(Math.exp(-u), 1 / (1 + u * u), 1 / (1 + u) ** 4), 3, { scale: 1, relTol: 1e-12 });
    expectClose(r.value[0], 1, 1e-12);
    expectClose(r.value[1], Math.PI / 2, 1e-12);
    expectClose(r.value[2], 1 / 3, 1e-12);
  });
  test('reports non-convergence instead of pretending (panel budget exhausted)', () => {
    const r = integrateSemiInfinite((u) => Float64Array.of(Math.abs(Math.sin(40 * u)) / (1 + u * u)), 1, { scale: 1, maxPanels: 4 });
    expect(r.converged).toBe(false);
    expect(r.error[0]).toBeGreaterThan(1e-13 * Math.abs(r.value[0]));
  });
  test('a non-finite integrand is an error, not a number', () => {
    expect(() => integrateSemiInfinite(() => Float64Array.of(NaN), 1, { scale: 1 })).toThrow(/quadrature \(integrand not finite\) did not converge/);
  });
});
