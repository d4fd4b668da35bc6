import { describe, expect, it } from 'vitest';
import { integrateVector } from '../../../src/engine/quadrature.ts';
import { integrateProduct, type CubatureAxis, type CubaturePartition, type ProductIntegrand } from '../../../src/engine/cubature/integrate-product.ts';

const TWO_PI = 2 * Math.PI;
const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);
const finite = (lo: number, hi: number, breakpoints: number[] = []): CubatureAxis => ({ lo, hi, breakpoints, center: NaN, scale: 1 });
const line = (breakpoints: number[] = [], scale = 1): CubatureAxis => ({ lo: -Infinity, hi: Infinity, breakpoints, center: 0, scale });
const halfLine = (scale = 1): CubatureAxis => ({ lo: 0, hi: Infinity, breakpoints: [], center: 0, scale });

/** Checks the value against the exact one to `tolerance` and that the error estimate covers the true error. */
function expectHonest(value: number, estimate: number, exact: number, tolerance: number): void {
  expect(relativeError(value, exact)).toBeLessThan(tolerance);
  expect(Math.abs(value - exact)).toBeLessThanOrEqual(estimate);
}

describe('integrateProduct', () => {
  it('is exact for monomials up to degree 31 per coordinate on a rectangle', () => {
    // The 21-point Kronrod extension of 10-point Gauss is exact to degree 3n+1 = 31 (Kronrod 1965;
    // Piessens et al., QUADPACK, 1983); the product of the rules to degree 31 in each coordinate.
    // Exact values: int_a^b x^i dx = (b^(i+1) - a^(i+1))/(i+1) (closed form).
    const moment = (i: number, a: number, b: number) => (b ** (i + 1) - a ** (i + 1)) / (i + 1);
    for (const [i, j] of [[0, 0], [1, 2], [7, 19], [19, 31], [31, 31]]) {
      const result = integrateProduct((p, out) => { out[0] = p[0] ** i * p[1] ** j; }, 1, [finite(-1, 1.5), finite(0, 1.25)], { relTol: 1e-13 });
      const exact = moment(i, -1, 1.5) * moment(j, 0, 1.25);
      expect(result.converged).toBe(true);
      expect(relativeError(result.values[0], exact)).toBeLessThan(1e-13);
    }
  });

  it('integrates e^{-r} over all space, written in (z, rho), to 8 pi with an honest estimate', () => {
    // int e^{-r} d^3r = 4 pi int_0^inf r^2 e^{-r} dr = 8 pi (closed form, Gamma(3) = 2).
    const result = integrateProduct((p, out) => {
      out[0] = TWO_PI * p[1] * Math.exp(-Math.hypot(p[0], p[1]));
    }, 1, [line([0]), halfLine()], { relTol: 1e-10 });
    expect(result.converged).toBe(true);
    expectHonest(result.values[0], result.errorEstimates[0], 8 * Math.PI, 1e-10);
  });

  it('integrates a Coulomb singularity on the axis away from the centre of the density', () => {
    // int e^{-2 r_a} / r_b d^3r = pi (1/R - (1 + 1/R) e^{-2R}) for nuclei a, b a distance R apart: the
    // two-centre Coulomb integral of a normalised 1s density (Slater, Quantum Theory of Molecules and
    // Solids vol. 1, 1963, App. 6; Pauling & Wilson, Introduction to Quantum Mechanics, 1935, §42).
    const R = 1.7;
    const result = integrateProduct((p, out) => {
      const rho = p[1];
      const ra = Math.hypot(p[0] + R / 2, rho);
      const rb = Math.hypot(p[0] - R / 2, rho);
      out[0] = TWO_PI * rho * Math.exp(-2 * ra) / rb;
      out[1] = TWO_PI * rho * Math.exp(-2 * ra) / ra; // one-centre: 4 pi int r e^{-2r} dr = pi
    }, 2, [line([-R / 2, R / 2]), halfLine()], { relTol: 1e-10 });
    expect(result.converged).toBe(true);
    expectHonest(result.values[0], result.errorEstimates[0], Math.PI * (1 / R - (1 + 1 / R) * Math.exp(-2 * R)), 1e-9);
    expectHonest(result.values[1], result.errorEstimates[1], Math.PI, 1e-9);
  });

  it('keeps a converged estimate within the tolerance where the tails would add up past it', () => {
    // int e^{-r^2/5} / r^2 d^3r = 4 pi int_0^inf e^{-r^2/5} dr = 2 pi sqrt(5 pi) (Gaussian integral, closed form),
    // written in (z, rho) without the 2 pi: a 1/r^2 point singularity whose inner runs' tails exceed the
    // tails' share of the tolerance, so the run is redone with relative tolerances throughout.
    const result = integrateProduct((p, out) => {
      const r2 = p[0] * p[0] + p[1] * p[1];
      out[0] = (p[1] * Math.exp(-0.2 * r2)) / r2;
    }, 1, [line([0]), halfLine()], { relTol: 1e-6 });
    expect(result.converged).toBe(true);
    expectHonest(result.values[0], result.errorEstimates[0], Math.sqrt(5 * Math.PI), 1e-6);
    expect(result.errorEstimates[0]).toBeLessThanOrEqual(1e-6 * result.values[0]);
  });

  it('integrates anisotropic Gaussians over 3 lines and a box face', () => {
    // int exp(-(x^2 + 2 y^2 + 3 z^2)) d^3x = pi^(3/2) / sqrt(6) (Gaussian integral, closed form);
    // int_0^pi sin x dx * int exp(-y^2) dy * int_0^inf z e^{-z} dz = 2 sqrt(pi) (closed forms).
    const gaussian = integrateProduct((p, out) => {
      out[0] = Math.exp(-(p[0] ** 2 + 2 * p[1] ** 2 + 3 * p[2] ** 2));
    }, 1, [line(), line([], 0.7), line([], 0.6)], { relTol: 1e-10 });
    expect(gaussian.converged).toBe(true);
    expectHonest(gaussian.values[0], gaussian.errorEstimates[0], Math.PI ** 1.5 / Math.sqrt(6), 1e-10);
    const mixed = integrateProduct((p, out) => {
      out[0] = Math.sin(p[0]) * Math.exp(-p[1] * p[1]) * p[2] * Math.exp(-p[2]);
    }, 1, [finite(0, Math.PI), line(), halfLine()], { relTol: 1e-10 });
    expectHonest(mixed.values[0], mixed.errorEstimates[0], 2 * Math.sqrt(Math.PI), 1e-10);
  }, 60_000); // three-dimensional nesting: a million integrand calls

  it('gives the same values started from a previous run at nearby parameters, with fewer evaluations', () => {
    // int e^{-a r} d^3r = 8 pi / a^3 (closed form).
    let a = 1;
    const integrand: ProductIntegrand = (p, out) => { out[0] = TWO_PI * p[1] * Math.exp(-a * Math.hypot(p[0], p[1])); };
    const axes = [line([0]), halfLine()];
    const first = integrateProduct(integrand, 1, axes);
    a = 1.05;
    const cold = integrateProduct(integrand, 1, axes);
    const warm = integrateProduct(integrand, 1, axes, { start: first.partition as CubaturePartition });
    expect(warm.converged).toBe(true);
    expectHonest(warm.values[0], warm.errorEstimates[0], (8 * Math.PI) / a ** 3, 1e-10);
    expect(Math.abs(warm.values[0] - cold.values[0])).toBeLessThan(1e-10 * cold.values[0]);
    expect(warm.evaluations).toBeLessThan(cold.evaluations);
  });

  it('reports a divergent integral as not converged, naming the axis', () => {
    // int_0^1 int_0^1 1/(x y) diverges (closed form).
    const result = integrateProduct((p, out) => { out[0] = 1 / (p[0] * p[1]); }, 1, [finite(0, 1), finite(0, 1)], { maxIntervals: 40 });
    expect(result.converged).toBe(false);
    expect(result.status).not.toBe('converged');
    expect(result.message).toMatch(/axis [01]/);
  });

  it('reports a non-finite integrand with the point where it happened', () => {
    // Common practice: a NaN from the integrand is a failure, not a number.
    const result = integrateProduct((p, out) => { out[0] = p[1] > 0.5 ? NaN : 1; }, 1, [finite(0, 1), finite(0, 1)]);
    expect(result.status).toBe('non-finite');
    expect(result.message).toMatch(/x0 = .*axis 1/);
    expect(result.partition).toBeNull();
  });
});

describe('integrateVector with components carried along', () => {
  it('lets only the tested components decide the panels, integrating the rest on them', () => {
    // int_0^1 e^x dx = e - 1 and int_0^1 x^(-1/2) dx = 2 (closed forms); the second, singular at 0,
    // needs many bisections to meet the tolerance when tested and none when it is only carried.
    const integrand = (x: number, out: Float64Array) => { out[0] = Math.exp(x); out[1] = 1 / Math.sqrt(x); };
    const carried = integrateVector(integrand, 2, { breakpoints: [0, 1], relTol: 1e-12, tested: 1 });
    const both = integrateVector(integrand, 2, { breakpoints: [0, 1], relTol: 1e-12 });
    expect(carried.converged).toBe(true);
    expect(carried.intervals).toBe(1);
    expect(relativeError(carried.values[0], Math.E - 1)).toBeLessThan(1e-14);
    expect(both.intervals).toBeGreaterThan(10);
    expect(relativeError(both.values[1], 2)).toBeLessThan(1e-11);
    expect(Math.abs(carried.values[1] - 2)).toBeGreaterThan(1e-6); // one panel cannot resolve x^(-1/2)
    expect(() => integrateVector(integrand, 2, { breakpoints: [0, 1], tested: 3 })).toThrow(RangeError);
  });
});
