import { describe, expect, it } from 'vitest';
import { DEFAULTS, minimizeBounded, type ParameterRange } from '../../src/engine/minimize.ts';

const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

// Energy of exp(-a x^2) for H = -1/2 d^2/dx^2 + x^2/2: <T> = a/2, <V> = 1/(8a); minimum 1/2 at a = 1/2
// (Griffiths, Introduction to Quantum Mechanics, 2nd ed., Example 7.1; from memory).
const harmonic = (x: Float64Array) => x[0] / 2 + 1 / (8 * x[0]);
// Energy of exp(-a x^2) for H = -d^2/dx^2 + x^4: <p^2> = a, <x^4> = 3/(16 a^2); dE/da = 0 gives
// a^3 = 3/8 and then E = 3a/2 (closed form derived here).
const quartic = (x: Float64Array) => x[0] + 3 / (16 * x[0] * x[0]);
// Rosenbrock, Comput. J. 3, 175 (1960): minimum 0 at (1, 1); its Hessian there is [[802, -400], [-400, 200]]
// (differentiating 100(y - x^2)^2 + (1 - x)^2 twice by hand).
const rosenbrock = (x: Float64Array) => 100 * (x[1] - x[0] ** 2) ** 2 + (1 - x[0]) ** 2;

// 1/2 (x-c)^T A (x-c) + offset has its minimum `offset` at c and Hessian A everywhere (common practice).
function quadratic(a: number[][], c: number[], offset: number) {
  return (x: Float64Array) => {
    let sum = 0;
    for (let i = 0; i < c.length; i++) {
      for (let j = 0; j < c.length; j++) sum += 0.5 * (x[i] - c[i]) * a[i][j] * (x[j] - c[j]);
    }
    return sum + offset;
  };
}

describe('minimizeBounded, one parameter (Brent)', () => {
  const range: ParameterRange = { start: 1, min: 0.01, max: 100 };

  it('finds the harmonic-oscillator Gaussian optimum to 1e-12 in f with under 60 evaluations', () => {
    const result = minimizeBounded(harmonic, [range]);
    expect(result.method).toBe('brent');
    expect(result.converged).toBe(true);
    expect(result.message).toBeNull();
    expect(relativeError(result.value, 0.5)).toBeLessThan(1e-12);
    expect(relativeError(result.x[0], 0.5)).toBeLessThan(1e-6);
    expect(result.evaluations).toBeLessThan(60);
    expect(result.activeLimits).toEqual([null]);
    // E''(a) = 1/(4 a^3) = 2 at a = 1/2 (closed form)
    expect(relativeError(result.hessian[0][0], 2)).toBeLessThan(1e-4);
    expect(Math.abs(result.gradient[0])).toBeLessThan(1e-5);
  });

  it('finds the quartic-oscillator Gaussian optimum a = (3/8)^(1/3), E = 3a/2', () => {
    const a = Math.cbrt(3 / 8);
    const result = minimizeBounded(quartic, [{ start: 2, min: 0.05, max: 10 }]);
    expect(result.converged).toBe(true);
    expect(relativeError(result.value, 1.5 * a)).toBeLessThan(1e-12);
    expect(relativeError(result.x[0], a)).toBeLessThan(1e-6);
    expect(result.evaluations).toBeLessThan(60);
    // E''(a) = 9/(8 a^4) at the optimum (closed form)
    expect(relativeError(result.hessian[0][0], 9 / (8 * a ** 4))).toBeLessThan(1e-4);
  });

  it('starts where asked, including at either bound', () => {
    for (const start of [range.min, range.max]) {
      const result = minimizeBounded(harmonic, [{ ...range, start }]);
      expect(result.converged).toBe(true);
      expect(relativeError(result.value, 0.5)).toBeLessThan(1e-12);
      expect(result.evaluations).toBeLessThan(60);
    }
    // Started at the optimum, every other point is worse, so it stays there.
    const atOptimum = minimizeBounded(harmonic, [{ ...range, start: 0.5 }]);
    expect(atOptimum.x[0]).toBe(0.5);
    expect(atOptimum.value).toBe(0.5);
  });

  it('does not chase noise at the 1e-13 level', () => {
    // Same energy with deterministic relative noise of 1e-13, below the quadrature's 1e-12 tolerance.
    const noisy = (x: Float64Array) => harmonic(x) * (1 + 1e-13 * Math.sin(1e9 * x[0]));
    const result = minimizeBounded(noisy, [range]);
    expect(result.converged).toBe(true);
    expect(relativeError(result.value, 0.5)).toBeLessThan(1e-12);
    expect(relativeError(result.x[0], 0.5)).toBeLessThan(1e-5);
    expect(result.evaluations).toBeLessThan(60);
  });

  it('reports the active limit on the correct side when the minimum lies outside the range', () => {
    // (x-3)^2 on [0, 2] is least at 2; (x+3)^2 on [0, 2] at 0 (elementary)
    const upper = minimizeBounded((x) => (x[0] - 3) ** 2, [{ start: 1, min: 0, max: 2 }]);
    expect(upper.x[0]).toBe(2);
    expect(upper.value).toBe(1);
    expect(upper.activeLimits).toEqual(['max']);
    expect(upper.gradient[0]).toBeLessThan(0);
    // Brent closes on a bound by golden sections alone, so a bound costs more than an interior minimum.
    expect(upper.evaluations).toBeLessThan(80);
    const lower = minimizeBounded((x) => (x[0] + 3) ** 2, [{ start: 1, min: 0, max: 2 }]);
    expect(lower.x[0]).toBe(0);
    expect(lower.activeLimits).toEqual(['min']);
    expect(lower.gradient[0]).toBeGreaterThan(0);
    expect(lower.evaluations).toBeLessThan(80);
  });

  it('treats +Infinity as worse than anything and still finds the minimum', () => {
    const result = minimizeBounded((x) => (x[0] < 2 ? (x[0] - 1) ** 2 : Infinity), [{ start: 0.5, min: 0, max: 3 }]);
    expect(result.converged).toBe(true);
    expect(Math.abs(result.x[0] - 1)).toBeLessThan(1e-6);
    expect(result.value).toBeLessThan(1e-12);
    expect(result.rejectedEvaluations).toBeGreaterThan(0);
    expect(result.evaluations).toBeLessThan(60);
  });

  it('lands exactly on the bound where negative curvature rules out a Newton step', () => {
    // -x^2 on [0, 2] is least at 2, with f' = -4 and f'' = -2 there (elementary)
    const result = minimizeBounded((x) => -x[0] * x[0], [{ start: 0.5, min: 0, max: 2 }]);
    expect(result.converged).toBe(true);
    expect(result.x[0]).toBe(2);
    expect(result.value).toBe(-4);
    expect(result.activeLimits).toEqual(['max']);
    expect(result.gradient[0]).toBeCloseTo(-4, 8);
    expect(result.hessian[0][0]).toBeCloseTo(-2, 6);
    expect(result.polishSteps).toBe(0);
    expect(result.evaluations).toBeLessThan(60);
  });

  it('rejects a Newton step that would raise f', () => {
    // sqrt(1 + x^2): the Newton step from x is to -x^3 (elementary), from 2 to -8, where f is higher.
    // One evaluation stops the search at the start, so only the polish could move x.
    const result = minimizeBounded((x) => Math.sqrt(1 + x[0] * x[0]), [{ start: 2, min: -10, max: 10 }], { maxEvaluations: 1 });
    expect(result.converged).toBe(false);
    expect(result.x[0]).toBe(2);
    expect(result.polishSteps).toBe(0);
  });

  it('reports an evaluation limit instead of stopping silently', () => {
    const result = minimizeBounded(harmonic, [range], { maxEvaluations: 5 });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/evaluation limit/);
  });
});

describe('minimizeBounded, several parameters (Nelder–Mead)', () => {
  it('minimises the Rosenbrock function inside a box', () => {
    const result = minimizeBounded(rosenbrock, [{ start: -1.2, min: -2, max: 2 }, { start: 1, min: -1, max: 3 }]);
    expect(result.method).toBe('nelder-mead');
    expect(result.converged).toBe(true);
    expect(result.value).toBeLessThan(1e-12);
    expect(Math.abs(result.x[0] - 1)).toBeLessThan(1e-6);
    expect(Math.abs(result.x[1] - 1)).toBeLessThan(1e-6);
    expect(result.activeLimits).toEqual([null, null]);
    const exact = [[802, -400], [-400, 200]];
    exact.forEach((row, i) => row.forEach((value, j) => expect(relativeError(result.hessian[i][j], value)).toBeLessThan(1e-5)));
    expect(result.evaluations).toBeLessThan(1000);
  });

  it('reports active limits on the correct sides for a quadratic centred outside the box', () => {
    // (x-3)^2 + 2(y+1)^2 + (x-3)(y+1)/2 on [0,2]^2: at (2, 0), df/dx = -3/2 < 0 and df/dy = 7/2 > 0,
    // so both limits bind (elementary); the value there is 1 + 2 - 1/2 = 5/2.
    const f = (x: Float64Array) => (x[0] - 3) ** 2 + 2 * (x[1] + 1) ** 2 + 0.5 * (x[0] - 3) * (x[1] + 1);
    const result = minimizeBounded(f, [{ start: 1, min: 0, max: 2 }, { start: 1, min: 0, max: 2 }]);
    expect(result.converged).toBe(true);
    expect(Array.from(result.x)).toEqual([2, 0]);
    expect(result.value).toBe(2.5);
    expect(result.activeLimits).toEqual(['max', 'min']);
    expect(result.gradient[0]).toBeCloseTo(-1.5, 5);
    expect(result.gradient[1]).toBeCloseTo(3.5, 5);
  });

  it('leaves a parameter free when only the other limit binds', () => {
    // (x-3)^2 + 2(y-1/2)^2 + (x-3)(y-1/2)/2 on [0,2]^2: x binds at 2, then df/dy = 0 gives y = 5/8 (elementary)
    const f = (x: Float64Array) => (x[0] - 3) ** 2 + 2 * (x[1] - 0.5) ** 2 + 0.5 * (x[0] - 3) * (x[1] - 0.5);
    const result = minimizeBounded(f, [{ start: 1, min: 0, max: 2 }, { start: 1, min: 0, max: 2 }]);
    expect(result.converged).toBe(true);
    expect(result.x[0]).toBe(2);
    expect(Math.abs(result.x[1] - 0.625)).toBeLessThan(1e-6);
    expect(relativeError(result.value, 0.96875)).toBeLessThan(1e-12);
    expect(result.activeLimits).toEqual(['max', null]);
  });

  it('treats +Infinity as worse than anything in several dimensions', () => {
    // Minimum 0 at (1.4, 1.4) inside the finite region x + y < 3, close enough to its edge that the
    // simplex steps across it (elementary)
    const f = (x: Float64Array) => (x[0] + x[1] < 3 ? (x[0] - 1.4) ** 2 + (x[1] - 1.4) ** 2 : Infinity);
    const result = minimizeBounded(f, [{ start: 0, min: -2, max: 4 }, { start: 0, min: -2, max: 4 }]);
    expect(result.converged).toBe(true);
    expect(result.value).toBeLessThan(1e-12);
    expect(result.rejectedEvaluations).toBeGreaterThan(0);
    expect(result.evaluations).toBeLessThan(600);
  });

  it('reports failure when f is infinite everywhere', () => {
    const result = minimizeBounded(() => Infinity, [{ start: 0, min: -1, max: 1 }, { start: 0, min: -1, max: 1 }]);
    expect(result.converged).toBe(false);
    expect(result.value).toBe(Infinity);
    expect(result.message).not.toBeNull();
  });

  it('finds a 3-parameter quadratic minimum and returns its Hessian to 1e-5', () => {
    const a = [[4, 1, 0.5], [1, 3, 0.25], [0.5, 0.25, 2]];
    const c = [0.7, -0.3, 1.5];
    const result = minimizeBounded(quadratic(a, c, 2), [
      { start: 0, min: -2, max: 2 }, { start: 0, min: -2, max: 2 }, { start: 1, min: 0.1, max: 5 },
    ]);
    expect(result.converged).toBe(true);
    expect(relativeError(result.value, 2)).toBeLessThan(1e-12);
    c.forEach((ci, i) => expect(Math.abs(result.x[i] - ci)).toBeLessThan(1e-5));
    a.forEach((row, i) => row.forEach((value, j) => expect(relativeError(result.hessian[i][j], value)).toBeLessThan(1e-5)));
    expect(result.activeLimits).toEqual([null, null, null]);
    expect(result.evaluations).toBeLessThan(700);
  });

  it('finds a 4-parameter quadratic minimum and returns its Hessian to 1e-5', () => {
    const a = [[5, 1, 0.5, 0.2], [1, 4, 0.3, 0.1], [0.5, 0.3, 3, 0.4], [0.2, 0.1, 0.4, 2]];
    const c = [1.2, 0.4, -0.8, 2.5];
    const result = minimizeBounded(quadratic(a, c, -1), [
      { start: 0, min: -3, max: 3 }, { start: 0, min: -3, max: 3 }, { start: 0, min: -3, max: 3 }, { start: 1, min: 0.5, max: 5 },
    ]);
    expect(result.converged).toBe(true);
    expect(relativeError(result.value, -1)).toBeLessThan(1e-12);
    c.forEach((ci, i) => expect(Math.abs(result.x[i] - ci)).toBeLessThan(1e-5));
    a.forEach((row, i) => row.forEach((value, j) => expect(relativeError(result.hessian[i][j], value)).toBeLessThan(1e-5)));
    expect(result.evaluations).toBeLessThan(1200);
  });

  it('reports an evaluation limit instead of stopping silently', () => {
    const maxEvaluations = 50;
    const result = minimizeBounded(rosenbrock, [{ start: -1.2, min: -2, max: 2 }, { start: 1, min: -1, max: 3 }], { maxEvaluations });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/evaluation limit/);
    // The search stops at the cap; its last iteration, the snap, the polish and the curvature add a bounded number.
    const n = 2;
    const extra = n + 1 + 1 + 2 * n * n + DEFAULTS.polishIterations * (2 * n * n + 1);
    expect(result.evaluations).toBeLessThanOrEqual(maxEvaluations + extra);
  });

  it('lets the Newton polish finish a search cut short', () => {
    // A quadratic's Newton step lands on its minimum (common practice), so the polish reaches the
    // exact optimum even though the simplex search stopped early and says so.
    const a = [[3, 1], [1, 2]];
    const c = [0.4, -0.6];
    const result = minimizeBounded(quadratic(a, c, 1), [{ start: 1.5, min: -2, max: 2 }, { start: 1.5, min: -2, max: 2 }], { maxEvaluations: 10 });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/evaluation limit/);
    expect(result.polishSteps).toBeGreaterThanOrEqual(1);
    expect(relativeError(result.value, 1)).toBeLessThan(1e-14);
    c.forEach((ci, i) => expect(Math.abs(result.x[i] - ci)).toBeLessThan(1e-6));
  });

  it('hands the coarse simplex to the Newton polish, which lands on the minimum of a flat valley', () => {
    // 1/2 (x-c)^T A (x-c) + 1/2 with an ill-conditioned A (eigenvalues about 2.3 and 0.045): minimum 1/2 at c (common practice)
    const a = [[1.664, -1.0342], [-1.0342, 0.70679]];
    const c = [0.8, 0.27];
    const ranges = [{ start: 5, min: 0.01, max: 10 }, { start: 0.9, min: -1, max: 1 }];
    const result = minimizeBounded(quadratic(a, c, 0.5), ranges);
    expect(result.converged).toBe(true);
    expect(result.resumed).toBe(false);
    expect(result.polishSteps).toBeGreaterThanOrEqual(1);
    expect(relativeError(result.value, 0.5)).toBeLessThan(1e-14);
    c.forEach((ci, i) => expect(Math.abs(result.x[i] - ci)).toBeLessThan(1e-7));
    // The simplex driven all the way down costs more evaluations and gets no closer.
    const simplexOnly = minimizeBounded(quadratic(a, c, 0.5), ranges, { searchFTol: DEFAULTS.fTol });
    expect(simplexOnly.converged).toBe(true);
    expect(result.evaluations).toBeLessThan(simplexOnly.evaluations);
  });

  it('resumes the simplex down to fTol where Newton cannot certify the minimum', () => {
    // 1 + |x - 0.3|^1.5 + |y + 0.2|^1.5: minimum 1 at (0.3, -0.2) (elementary). Its curvature is
    // infinite there, so a quadratic model at the finite-difference scale mispredicts what a Newton
    // step gains, and only the simplex, which compares values, can settle the point to fTol.
    const f = (x: Float64Array) => 1 + Math.abs(x[0] - 0.3) ** 1.5 + Math.abs(x[1] + 0.2) ** 1.5;
    const result = minimizeBounded(f, [{ start: 1, min: -2, max: 2 }, { start: 1, min: -2, max: 2 }]);
    expect(result.resumed).toBe(true);
    expect(result.converged).toBe(true);
    expect(result.value - 1).toBeLessThan(1e-12);
  });

  it('rejects malformed ranges', () => {
    expect(() => minimizeBounded(harmonic, [])).toThrow(RangeError);
    expect(() => minimizeBounded(harmonic, [{ start: 0, min: 1, max: 0 }])).toThrow(RangeError);
    expect(() => minimizeBounded(harmonic, [{ start: 5, min: 0, max: 1 }])).toThrow(RangeError);
    expect(() => minimizeBounded(harmonic, [{ start: 0, min: 0, max: Infinity }])).toThrow(RangeError);
    expect(() => minimizeBounded(harmonic, [{ start: 1, min: 0.01, max: 100 }], { searchFTol: 0 })).toThrow(RangeError);
  });

  it('leaves a higher basin it started in for a lower one found by multistart', () => {
    // A tilted double well along x with a valley y = x: minima near (+1, +1) and (-1, -1), the second lower by about
    // 0.2 from the tilt 0.1 x (common practice: a two-basin test of a multistart method, Rinnooy Kan & Timmer,
    // Math. Program. 39, 27 (1987)). The start sits in the bottom of the higher basin.
    const f = (p: Float64Array) => (p[0] * p[0] - 1) ** 2 + (p[1] - p[0]) ** 2 + 0.1 * p[0];
    const ranges = [{ start: 1, min: -2, max: 2 }, { start: 1, min: -2, max: 2 }];
    const result = minimizeBounded(f, ranges);
    expect(result.starts).toBe(2);
    expect(result.converged).toBe(true);
    // At the minimum y = x and x solves 4x^3 - 4x + 0.1 = 0 at its lowest root (bisection below gives it to 1e-12).
    let lo = -1.2;
    let hi = -0.9;
    for (let i = 0; i < 100; i++) {
      const mid = (lo + hi) / 2;
      if (4 * mid ** 3 - 4 * mid + 0.1 > 0) hi = mid;
      else lo = mid;
    }
    expect(result.x[0]).toBeCloseTo(lo, 5);
    expect(result.x[1]).toBeCloseTo(lo, 5);
  });
});
