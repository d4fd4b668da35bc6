import { describe, expect, it } from 'vitest';
import { countBelow, lowestEigenpairs, multiplyBand, type SymmetricBand } from '../../src/engine/banded-eigen.ts';

function band(size: number, bandwidth: number, entry: (i: number, k: number) => number): SymmetricBand {
  const upper = new Float64Array(size * (bandwidth + 1));
  for (let i = 0; i < size; i++) {
    for (let k = 0; k <= bandwidth && i + k < size; k++) upper[i * (bandwidth + 1) + k] = entry(i, k);
  }
  return { size, bandwidth, upper };
}

/** The second-difference matrix: 2 on the diagonal, -1 beside it. */
function secondDifference(size: number): SymmetricBand {
  return band(size, 1, (_i, k) => (k === 0 ? 2 : -1));
}

/** Its square, pentadiagonal: 6, -4, 1 inside, with 5 in the two corner diagonal slots. */
function secondDifferenceSquared(size: number): SymmetricBand {
  return band(size, 2, (i, k) => {
    if (k === 2) return 1;
    if (k === 1) return -4;
    return i === 0 || i === size - 1 ? 5 : 6;
  });
}

function residualNorm(a: SymmetricBand, value: number, vector: Float64Array): number {
  const av = new Float64Array(a.size);
  multiplyBand(a, vector, av);
  return Math.sqrt(av.reduce((s, x, i) => s + (x - value * vector[i]) ** 2, 0));
}

describe('lowestEigenpairs', () => {
  it('finds 2 - 2 cos(k pi/(N+1)) for the second-difference matrix (common practice)', () => {
    const n = 200;
    const result = lowestEigenpairs(secondDifference(n), 2);
    expect(result.converged).toBe(true);
    expect(result.message).toBeNull();
    for (let k = 1; k <= 2; k++) {
      const exact = 2 - 2 * Math.cos((k * Math.PI) / (n + 1));
      expect(Math.abs(result.values[k - 1] - exact) / exact).toBeLessThan(1e-10);
    }
    expect(result.bisectionSteps).toBeGreaterThan(0);
    expect(result.inverseIterations).toBeGreaterThanOrEqual(2);
  });

  it('returns the sine eigenvectors sin(j k pi/(N+1)) (common practice)', () => {
    const n = 50;
    const result = lowestEigenpairs(secondDifference(n), 2);
    for (let k = 1; k <= 2; k++) {
      const exact = Float64Array.from({ length: n }, (_, j) => Math.sin(((j + 1) * k * Math.PI) / (n + 1)));
      const norm = Math.sqrt(exact.reduce((s, x) => s + x * x, 0));
      const v = result.vectors[k - 1];
      const sign = Math.sign(v.reduce((s, x, j) => s + x * exact[j], 0));
      for (let j = 0; j < n; j++) expect(sign * v[j]).toBeCloseTo(exact[j] / norm, 12);
    }
  });

  it('handles bandwidth 2: the squared second difference has eigenvalues (2 - 2 cos(k pi/(N+1)))^2 (common practice)', () => {
    const n = 120;
    const result = lowestEigenpairs(secondDifferenceSquared(n), 2);
    expect(result.converged).toBe(true);
    for (let k = 1; k <= 2; k++) {
      const exact = (2 - 2 * Math.cos((k * Math.PI) / (n + 1))) ** 2;
      expect(Math.abs(result.values[k - 1] - exact) / exact).toBeLessThan(1e-8);
    }
  });

  it('separates an exactly degenerate pair into orthonormal eigenvectors (common practice)', () => {
    // Two uncoupled copies of the same block: every eigenvalue is double.
    const half = 40;
    const a = band(2 * half, 1, (i, k) => (k === 0 ? 2 : i === half - 1 ? 0 : -1));
    const result = lowestEigenpairs(a, 2);
    const exact = 2 - 2 * Math.cos(Math.PI / (half + 1));
    expect(result.values[0]).toBeCloseTo(exact, 12);
    expect(result.values[1]).toBeCloseTo(exact, 12);
    const [u, v] = result.vectors;
    expect(Math.abs(u.reduce((s, x, i) => s + x * v[i], 0))).toBeLessThan(1e-12);
    for (const [k, w] of result.vectors.entries()) expect(residualNorm(a, result.values[k], w)).toBeLessThan(1e-12);
  });

  it('counts eigenvalues below a shift by the inertia of A - sigma I (Sylvester)', () => {
    const n = 30;
    const a = secondDifference(n);
    const work = new Float64Array(n * 2);
    const third = 2 - 2 * Math.cos((3 * Math.PI) / (n + 1));
    const fourth = 2 - 2 * Math.cos((4 * Math.PI) / (n + 1));
    expect(countBelow(a, 0.5 * (third + fourth), 1e-15, work)).toBe(3);
    expect(countBelow(a, -1, 1e-15, work)).toBe(0);
    expect(countBelow(a, 4.1, 1e-15, work)).toBe(n);
  });

  it('reports a request for more pairs than the matrix has instead of returning NaN', () => {
    const result = lowestEigenpairs(secondDifference(1), 2);
    expect(result.converged).toBe(false);
    expect(result.values).toEqual([]);
    expect(result.message).toMatch(/2 eigenpairs/);
  });
});
