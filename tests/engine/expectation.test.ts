import { describe, expect, it } from 'vitest';
import { spaceOf } from '../../src/engine/spaces/space-of.ts';
import { EXPECTATION_DEFAULTS, expectation, searchExpectation } from '../../src/engine/expectation.ts';
import type { VariationalProblem } from '../../src/engine/problem.ts';

const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);

/** exp(-a x^2) (radial: exp(-a r^2)) as plain functions, with its first two derivatives. */
function gaussianProblem(space: 'line' | 'radial', potential: (x: number) => number, mass: number): VariationalProblem {
  let a = 1;
  return {
    space, box: null, angularMomentum: 0, mass, potential, potentialSwitches: [],
    parameters: [{ name: 'a', start: 1, min: 1e-6, max: 1e6 }],
    reference: { solve: false, published: null }, claim: null, plots: [],
    trial: {
      setParameters: (values) => { a = values[0]; },
      value: (x) => Math.exp(-a * x * x),
      d1: (x) => -2 * a * x * Math.exp(-a * x * x),
      d2: (x) => (4 * a * a * x * x - 2 * a) * Math.exp(-a * x * x),
      switches: [],
    },
  };
}

// Oscillator V = x^2/2, m = 1, with exp(-a x^2): E(a) = a/2 + 1/(8a) (Griffiths, Introduction to
// Quantum Mechanics, 2nd ed., Example 7.1; from memory).
const oscillator = gaussianProblem('line', (x) => (x * x) / 2, 1);
const oscillatorEnergy = (a: number) => a / 2 + 1 / (8 * a);
// Hydrogen, V = -1/r, with exp(-a r^2): E(a) = 3a/2 - 2 sqrt(2a/pi) (Griffiths, problem 7.2; from memory),
// least at a = 8/(9 pi) with -4/(3 pi).
const hydrogen = gaussianProblem('radial', (r) => -1 / r, 1);
const hydrogenEnergy = (a: number) => 1.5 * a - 2 * Math.sqrt((2 * a) / Math.PI);

describe('searchExpectation', () => {
  it('gives the energies of a search to the tolerance of fresh evaluations, for fewer trial evaluations', () => {
    for (const [problem, energy, path] of [
      [oscillator, oscillatorEnergy, [1, 0.9, 0.62, 0.5, 0.5000001, 0.4999999]],
      [hydrogen, hydrogenEnergy, [1, 0.6, 0.35, 0.283, 8 / (9 * Math.PI)]],
    ] as const) {
      const domain = spaceOf(problem);
      const atPoint = searchExpectation(problem, domain, [], expectation(problem, domain, [], [path[0]]));
      let searched = 0;
      let fresh = 0;
      for (const a of path) {
        const point = atPoint([a]);
        const alone = expectation(problem, domain, [], [a]);
        searched += point.evaluations;
        fresh += alone.evaluations;
        expect(relativeError(point.energy, energy(a)), `${problem.space} a = ${a}`).toBeLessThan(10 * EXPECTATION_DEFAULTS.relTol);
        expect(Math.abs(point.energy - alone.energy)).toBeLessThanOrEqual(2 * alone.errorEstimate);
      }
      expect(searched).toBeLessThan(fresh);
    }
    expect(relativeError(hydrogenEnergy(8 / (9 * Math.PI)), -4 / (3 * Math.PI))).toBeLessThan(1e-15);
  });

  it('stays right when the trial jumps to widths far from where the quadrature was placed', () => {
    const domain = spaceOf(oscillator);
    const atPoint = searchExpectation(oscillator, domain, [], expectation(oscillator, domain, [], [1]));
    for (const a of [1, 1e-4, 1e4, 3e-3, 0.5, 200]) {
      expect(relativeError(atPoint([a]).energy, oscillatorEnergy(a)), `a = ${a}`).toBeLessThan(10 * EXPECTATION_DEFAULTS.relTol);
    }
  });

  it('reports a point where the trial cannot be normalised as +Infinity, and goes on', () => {
    // exp(+x^2) (a = -1) overflows: no finite norm (elementary)
    const domain = spaceOf(oscillator);
    const atPoint = searchExpectation(oscillator, domain, [], expectation(oscillator, domain, [], [1]));
    expect(atPoint([-1]).energy).toBe(Infinity);
    expect(relativeError(atPoint([0.7]).energy, oscillatorEnergy(0.7))).toBeLessThan(10 * EXPECTATION_DEFAULTS.relTol);
  });
});
