import { describe, expect, it } from 'vitest';
import { gllRule } from '../../src/engine/gll.ts';

describe('gllRule', () => {
  it('matches the 5-point Lobatto table (Abramowitz & Stegun 25.4.32)', () => {
    const rule = gllRule(5);
    expect(rule.converged).toBe(true);
    const inner = Math.sqrt(3 / 7); // 0.65465 36707 in the table
    const expectedNodes = [-1, -inner, 0, inner, 1];
    const expectedWeights = [0.1, 49 / 90, 32 / 45, 49 / 90, 0.1]; // 0.1, 0.54444 44444, 0.71111 11111
    for (let i = 0; i < 5; i++) {
      expect(rule.nodes[i]).toBeCloseTo(expectedNodes[i], 15);
      expect(rule.weights[i]).toBeCloseTo(expectedWeights[i], 15);
    }
  });

  it('integrates x^k exactly on [-1, 1] for k <= 2n - 3 (A&S 25.4.32, degree of precision 2n - 3)', () => {
    for (const n of [3, 6, 11, 16, 24]) {
      const rule = gllRule(n);
      expect(rule.converged).toBe(true);
      const integrate = (k: number) => rule.weights.reduce((s, w, i) => s + w * rule.nodes[i] ** k, 0);
      for (let k = 0; k <= 2 * n - 3; k++) {
        const exact = k % 2 === 0 ? 2 / (k + 1) : 0;
        expect(Math.abs(integrate(k) - exact)).toBeLessThan(1e-13);
      }
    }
  });

  it('misses degree 2n - 2: the rule gives 2/N for the integral of P_N^2, exact 2/(2N+1) (Canuto, Hussaini, Quarteroni & Zang, Spectral Methods in Fluid Dynamics, 1988, discrete Legendre norm; from memory)', () => {
    for (const n of [4, 9, 17]) {
      const rule = gllRule(n);
      const degree = n - 1;
      const legendreP = (x: number) => {
        let [previous, p] = [1, x];
        for (let k = 1; k < degree; k++) [previous, p] = [p, ((2 * k + 1) * x * p - k * previous) / (k + 1)];
        return p;
      };
      const quadrature = rule.weights.reduce((s, w, i) => s + w * legendreP(rule.nodes[i]) ** 2, 0);
      expect(quadrature).toBeCloseTo(2 / degree, 13);
      expect(Math.abs(quadrature - 2 / (2 * degree + 1))).toBeGreaterThan(0.1 / degree);
    }
  });

  it('differentiates polynomials of degree n - 1 exactly at the nodes (common practice)', () => {
    for (const n of [4, 9, 16, 21]) {
      const rule = gllRule(n);
      const degree = n - 1;
      const f = (x: number) => x ** degree - 0.3 * x ** 2 + x;
      const df = (x: number) => degree * x ** (degree - 1) - 0.6 * x + 1;
      for (let i = 0; i < n; i++) {
        let derivative = 0;
        for (let j = 0; j < n; j++) derivative += rule.derivative[i * n + j] * f(rule.nodes[j]);
        expect(Math.abs(derivative - df(rule.nodes[i]))).toBeLessThan(1e-11 * degree * degree);
      }
    }
  });

  it('has weights summing to 2 and endpoint weights 2/(n(n-1)) (A&S 25.4.32)', () => {
    for (const n of [2, 7, 30]) {
      const rule = gllRule(n);
      expect(rule.weights.reduce((s, w) => s + w, 0)).toBeCloseTo(2, 13);
      expect(rule.weights[0]).toBeCloseTo(2 / (n * (n - 1)), 15);
    }
  });

  it('rejects fewer than two points', () => {
    expect(() => gllRule(1)).toThrow(RangeError);
  });
});
