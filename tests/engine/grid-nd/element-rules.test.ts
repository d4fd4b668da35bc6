import { describe, expect, it } from 'vitest';
import { axisRadauElement } from '../../../src/engine/grid-nd/element-rules.ts';

describe('axisRadauElement', () => {
  it('integrates (1 + x) x^k exactly for k <= 2n - 2 (Gauss–Radau degree of precision, Gautschi 2004 §3.1.1)', () => {
    for (const n of [3, 6, 10, 14]) {
      const rule = axisRadauElement(n);
      expect(rule.nodes[n - 1]).toBe(1);
      expect(rule.nodes[0]).toBeGreaterThan(-1);
      for (let k = 0; k <= 2 * n - 2; k++) {
        // int_{-1}^{1} (1 + x) x^k dx = 2/(k + 1) for even k, 2/(k + 2) for odd k (closed form).
        const exact = k % 2 === 0 ? 2 / (k + 1) : 2 / (k + 2);
        const sum = rule.nodes.reduce((s, x, i) => s + rule.weights[i] * x ** k, 0);
        expect(Math.abs(sum - exact)).toBeLessThan(1e-13);
      }
    }
  });

  it('differentiates polynomials of its degree exactly (Berrut & Trefethen 2004, barycentric differentiation)', () => {
    const rule = axisRadauElement(8);
    const n = 8;
    for (let i = 0; i < n; i++) {
      const derivative = rule.nodes.reduce((s, x, j) => s + rule.derivative[i * n + j] * x ** 7, 0);
      expect(derivative).toBeCloseTo(7 * rule.nodes[i] ** 6, 11);
    }
  });
});
