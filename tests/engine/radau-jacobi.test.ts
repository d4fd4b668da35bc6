import { describe, expect, it } from 'vitest';
import { radauRule } from '../../src/engine/radau-jacobi.ts';

/** int_{-1}^{1} t^k (1 + t)^b dt = sum_i C(b, i) 2/(k+i+1) over even k + i, by the binomial theorem (elementary); every term is positive. */
function moment(k: number, b: number): number {
  let sum = 0;
  let binomial = 1;
  for (let i = 0; i <= b; i++) {
    if ((k + i) % 2 === 0) sum += (binomial * 2) / (k + i + 1);
    binomial = (binomial * (b - i)) / (i + 1);
  }
  return sum;
}

describe('radauRule', () => {
  it('is the 2-point Radau rule for weight 1: nodes -1/3 and 1, weights 3/2 and 1/2 (Abramowitz & Stegun 25.4.31, with t -> -t)', () => {
    const rule = radauRule(2, 0);
    expect(rule.nodes[0]).toBeCloseTo(-1 / 3, 14);
    expect(rule.nodes[1]).toBe(1);
    expect(rule.weights[0]).toBeCloseTo(1.5, 14);
    expect(rule.weights[1]).toBeCloseTo(0.5, 14);
  });

  it('integrates t^k (1 + t)^b exactly for k <= 2n - 2 (degree of precision of a Radau rule with one fixed node; Gautschi 2004, §3.1.1)', () => {
    for (const [n, b] of [[4, 1], [8, 1], [12, 3], [20, 5], [17, 1]]) {
      const rule = radauRule(n, b);
      for (let k = 0; k <= 2 * n - 2; k++) {
        const sum = rule.weights.reduce((s, w, i) => s + w * rule.nodes[i] ** k, 0);
        expect(Math.abs(sum - moment(k, b)), `n=${n} b=${b} k=${k}`).toBeLessThan(1e-13 * moment(0, b));
      }
    }
  });

  it('differentiates polynomials of degree n - 1 exactly at its nodes (elementary)', () => {
    const rule = radauRule(9, 3);
    const n = 9;
    for (let i = 0; i < n; i++) {
      let d = 0;
      for (let j = 0; j < n; j++) d += rule.derivative[i * n + j] * rule.nodes[j] ** 8;
      expect(d).toBeCloseTo(8 * rule.nodes[i] ** 7, 11);
    }
  });
});
