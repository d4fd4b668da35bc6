import { describe, expect, it } from 'vitest';
import { RHO, Z } from '../../../src/engine/cubature/energy-integrands.ts';
import { integrateAxial } from '../../../src/engine/cubature/integrate-axial.ts';
import type { ProductIntegrand } from '../../../src/engine/cubature/integrate-product.ts';

const TWO_PI = 2 * Math.PI;
const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);
const distance = (p: Float64Array, z0: number) => Math.hypot(p[RHO], p[Z] - z0);

describe('integrateAxial', () => {
  it('adds the fuzzy-cell pieces of three centres up to the whole integral', () => {
    // int e^{-r} d^3r = 8 pi (closed form); Becke's weights sum to 1 at every point (Becke, J. Chem. Phys. 88, 2547, 1988).
    const result = integrateAxial((p, out) => { out[0] = TWO_PI * p[RHO] * Math.exp(-distance(p, 0.3)); }, 1, [-1, 0.5, 2], { scale: 1, relTol: 1e-10 });
    expect(result.converged).toBe(true);
    expect(relativeError(result.values[0], 8 * Math.PI)).toBeLessThan(1e-10);
    expect(Math.abs(result.values[0] - 8 * Math.PI)).toBeLessThanOrEqual(result.errorEstimates[0]);
  });

  it('integrates 1/r^2 singularities at two centres', () => {
    // int e^{-2r}/r^2 d^3r = 4 pi int_0^inf e^{-2r} dr = 2 pi per centre (closed form).
    const integrand: ProductIntegrand = (p, out) => {
      const [ra, rb] = [distance(p, -0.75), distance(p, 0.75)];
      out[0] = TWO_PI * p[RHO] * (Math.exp(-2 * ra) / (ra * ra) + Math.exp(-2 * rb) / (rb * rb));
    };
    const result = integrateAxial(integrand, 1, [-0.75, 0.75], { scale: 0.5, relTol: 1e-10 });
    expect(result.converged).toBe(true);
    expect(relativeError(result.values[0], 4 * Math.PI)).toBeLessThan(1e-10);
    expect(Math.abs(result.values[0] - 4 * Math.PI)).toBeLessThanOrEqual(result.errorEstimates[0]);
    expect(result.evaluations).toBeLessThan(200_000); // in (rho, z) the same costs millions (common practice: a budget, not a timing)
  });

  it('starts from the previous run at nearby parameters with the same values and fewer evaluations', () => {
    // int e^{-a r_a} d^3r = 8 pi / a^3 (closed form).
    let a = 1;
    const integrand: ProductIntegrand = (p, out) => { out[0] = TWO_PI * p[RHO] * Math.exp(-a * distance(p, -1)); };
    const first = integrateAxial(integrand, 1, [-1, 1], { scale: 1 });
    a = 1.05;
    const cold = integrateAxial(integrand, 1, [-1, 1], { scale: 1 });
    const warm = integrateAxial(integrand, 1, [-1, 1], { scale: 1, start: first.partition ?? undefined });
    expect(relativeError(warm.values[0], (8 * Math.PI) / a ** 3)).toBeLessThan(1e-10);
    expect(Math.abs(warm.values[0] - cold.values[0])).toBeLessThan(1e-10 * cold.values[0]);
    expect(warm.evaluations).toBeLessThan(cold.evaluations);
  });

  it('names the centre whose piece failed', () => {
    // Common practice: a NaN from the integrand is a failure, not a number.
    const result = integrateAxial((p, out) => { out[0] = p[Z] > 1.5 ? NaN : 0; }, 1, [0, 2], { scale: 1 });
    expect(result.status).toBe('non-finite');
    expect(result.message).toMatch(/centre at z = /);
    expect(result.partition).toBeNull();
  });
});
