import { describe, expect, it } from 'vitest';
import { gridLevels } from '../../../src/engine/grid-levels.ts';
import { productGridLevels, type GridAxis, type ProductGridLevels } from '../../../src/engine/grid-nd/product-grid-levels.ts';

function relativeError(value: number, exact: number): number {
  return Math.abs(value - exact) / Math.abs(exact);
}

function expectLevels(result: ProductGridLevels, exact: number[], tolerance: number, estimateBound = 1e-6): void {
  expect(result.message).toBeNull();
  expect(result.converged).toBe(true);
  expect(result.levels).toHaveLength(exact.length);
  exact.forEach((e, i) => expect(relativeError(result.levels[i], e)).toBeLessThan(tolerance));
  result.errorEstimate.forEach((d) => expect(d).toBeLessThan(estimateBound));
}

/** sum W psi^2 over the grid, W the product of the axis weights. */
function norm(result: ProductGridLevels, state: Float64Array): number {
  let weights = Float64Array.of(1);
  for (const axis of result.axes) {
    const next = new Float64Array(weights.length * axis.weights.length);
    for (let p = 0; p < weights.length; p++) for (let i = 0; i < axis.weights.length; i++) next[p * axis.weights.length + i] = weights[p] * axis.weights[i];
    weights = next;
  }
  return state.reduce((s, v, p) => s + weights[p] * v * v, 0);
}

const line = (name: string, mass = 1, breakpoints: number[] = []): GridAxis => ({ name, kind: 'line', mass, breakpoints });
const interval = (name: string, lo: number, hi: number, mass = 1): GridAxis => ({ name, kind: 'interval', lo, hi, mass, breakpoints: [] });

describe('productGridLevels, Cartesian products', () => {
  it('anisotropic 2-D oscillator with a mass per axis: sum (n_k + 1/2) omega_k (separation of variables, closed form)', () => {
    // x: m = 1, omega = 1; y: m = 2, V = 9 y^2 = m omega^2 y^2 / 2 with omega = 3. Levels 0.5 + 1.5, 1.5 + 1.5.
    const result = productGridLevels({ axes: [line('x'), line('y', 2)], potential: (p) => 0.5 * p[0] * p[0] + 9 * p[1] * p[1], relTol: 1e-10 });
    expectLevels(result, [2, 3], 1e-8);
    expect(norm(result, result.states[0])).toBeCloseTo(1, 10);
  }, 600000);

  it('anisotropic 3-D oscillator, omega = 1, 2, 3: levels 3 and 4 (closed form)', () => {
    // relTol 1e-6 keeps the grid near 3e5 points: the settled grid is far better than the settling test demands.
    const result = productGridLevels({
      axes: [line('x'), line('y'), line('z')],
      potential: (p) => 0.5 * (p[0] * p[0] + 4 * p[1] * p[1] + 9 * p[2] * p[2]),
      relTol: 1e-6,
      maxPoints: 400000,
    });
    expectLevels(result, [3, 4], 1e-8, 1e-5);
  }, 600000);

  it('3-D box x box x line with a mass per axis (closed forms of the factors)', () => {
    const result = productGridLevels({
      axes: [interval('x', 0, 1), interval('y', 0, 2, 2), line('z')],
      potential: (p) => 2 * p[2] * p[2],
    });
    const box = (n: number, m: number, length: number) => (Math.PI ** 2 * n * n) / (2 * m * length * length);
    // z: omega = 2, so (k + 1/2) omega = 1, 3, ...
    expectLevels(result, [box(1, 1, 1) + box(1, 2, 2) + 1, box(1, 1, 1) + box(2, 2, 2) + 1], 1e-8);
  }, 600000);

  it('2-D box with a mass per axis: sum pi^2 n_k^2 / (2 m_k L_k^2) (particle in a box, closed form)', () => {
    const result = productGridLevels({ axes: [interval('x', 0, 1), interval('y', -1, 1, 0.5)], potential: () => 0, relTol: 1e-10 });
    const level = (nx: number, ny: number) => (Math.PI ** 2 * nx * nx) / 2 + (Math.PI ** 2 * ny * ny) / (2 * 0.5 * 4);
    expectLevels(result, [level(1, 1), level(1, 2)], 1e-8);
  }, 600000);

  it('box times line: pi^2 n^2 / (2 L^2) + (k + 1/2) (closed forms of both factors)', () => {
    const result = productGridLevels({ axes: [interval('x', 0, 2), line('y')], potential: (p) => 0.5 * p[1] * p[1], relTol: 1e-10 });
    const box = Math.PI ** 2 / 8;
    expectLevels(result, [box + 0.5, box + 1.5], 1e-8);
  }, 600000);

  it('two particles in a trap with a soft interaction agree with the separated 1-D problem (independent route: gridLevels)', () => {
    // Centre of mass X = (x1 + x2)/sqrt 2 and relative x = (x1 - x2)/sqrt 2 keep the kinetic energy diagonal with unit
    // masses: H = [ -X''/2 + X^2/2 ] + [ -x''/2 + x^2/2 + g / sqrt(2 x^2 + 1) ]; the first has levels 1/2, 3/2, ...
    const g = 1;
    const relative = gridLevels({ space: 'line', mass: 1, potential: (x) => 0.5 * x * x + g / Math.sqrt(2 * x * x + 1), levels: 2, relTol: 1e-12 });
    expect(relative.converged).toBe(true);
    const separated = [0.5 + relative.levels[0], 0.5 + relative.levels[1], 1.5 + relative.levels[0]].sort((a, b) => a - b).slice(0, 2);
    const result = productGridLevels({
      axes: [line('x1'), line('x2')],
      potential: (p) => 0.5 * (p[0] * p[0] + p[1] * p[1]) + g / Math.sqrt((p[0] - p[1]) ** 2 + 1),
      relTol: 1e-10,
    });
    expectLevels(result, separated, 1e-8);
  }, 600000);
});

describe('productGridLevels, cylindrical (rho, z)', () => {
  const rho: GridAxis = { name: 'rho', kind: 'rho', mass: 1, breakpoints: [] };

  it('3-D isotropic oscillator in (rho, z): 3/2 for m = 0 and 5/2 for m = 1 (closed form, (2 n_rho + |m| + n_z + 3/2))', () => {
    const potential = (p: Float64Array) => 0.5 * (p[0] * p[0] + p[1] * p[1]);
    const m0 = productGridLevels({ axes: [rho, line('z')], potential, levels: 1, relTol: 1e-9 });
    expectLevels(m0, [1.5], 1e-8);
    expect(norm(m0, m0.states[0])).toBeCloseTo(1, 10);
    const m1 = productGridLevels({ axes: [rho, line('z')], potential, angularMomentum: 1, levels: 1, relTol: 1e-9 });
    expectLevels(m1, [2.5], 1e-8);
  }, 600000);

  const coulomb = (p: Float64Array) => -1 / Math.hypot(p[0], p[1]);

  it('hydrogen ground state in (rho, z): -1/2 hartree to 1e-7 (Bohr levels -1/(2 n^2), closed form)', () => {
    const result = productGridLevels({ axes: [rho, line('z', 1, [0])], potential: coulomb, levels: 1, relTol: 1e-7 });
    expectLevels(result, [-0.5], 1e-7);
    expect(norm(result, result.states[0])).toBeCloseTo(1, 10);
  }, 600000);

  it('hydrogen with m = 1: the 2p level -1/8 hartree (Bohr levels, closed form)', () => {
    const result = productGridLevels({ axes: [rho, line('z', 1, [0])], potential: coulomb, angularMomentum: 1, levels: 1, relTol: 1e-7 });
    expectLevels(result, [-0.125], 1e-7);
  }, 600000);

  it('H2+ at R = 2 bohr: electronic energy -1.1026342144949 hartree to 1e-6 (Madsen & Peek, At. Data 2, 171 (1971), from memory)', () => {
    const result = productGridLevels({
      axes: [rho, line('z', 1, [-1, 1])],
      potential: (p) => -1 / Math.hypot(p[0], p[1] - 1) - 1 / Math.hypot(p[0], p[1] + 1),
      levels: 1,
      relTol: 1e-7,
    });
    expectLevels(result, [-1.1026342144949], 1e-6);
  }, 600000);
});
