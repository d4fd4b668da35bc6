import { describe, expect, it } from 'vitest';
import { evaluateProblem } from '../../src/engine/evaluate-problem.ts';
import { gridLevels } from '../../src/engine/grid-levels.ts';
import type { MassProfile, ProblemBase, TrialFamily } from '../../src/engine/problem.ts';

import { bisectRoot, steppedWellLevel } from './bdd-square-well.ts';

// The stepped-mass square well of bdd-square-well.ts (BenDaniel & Duke matching).
const a = 1.2;
const depth = 4;
const mIn = 0.6;
const mOut = 1.7;
const wellLevel = (j: number) => steppedWellLevel({ halfWidth: a, depth, massIn: mIn, massOut: mOut }, j);

const inside = (x: number) => Math.abs(x) < a;
const profile: MassProfile = { value: (x) => (inside(x) ? mIn : mOut), d1: () => 0, switches: [(x) => x - a, (x) => x + a] };
const potential = (x: number) => (inside(x) ? 0 : depth);

function base(overrides: Partial<ProblemBase> = {}): ProblemBase {
  return {
    space: 'line',
    box: null,
    angularMomentum: 0,
    mass: Number.NaN,
    massProfile: profile,
    potential,
    potentialSwitches: [(x) => x - a, (x) => x + a],
    parameters: [],
    reference: { solve: true, published: null },
    claim: null,
    plots: [],
    ...overrides,
  };
}

describe('position-dependent mass: grid reference', () => {
  it('matches the BenDaniel–Duke square-well levels to 1e-8 relative', () => {
    const exact = [wellLevel(0), wellLevel(1)];
    // The two levels are below the depth, so both are bound (checked, else the test would compare nothing).
    expect(exact[1]).toBeLessThan(depth);
    const grid = gridLevels({ space: 'line', mass: Number.NaN, massProfile: profile, potential, breakpoints: [-a, a] });
    expect(grid.converged).toBe(true);
    expect(grid.levels).toHaveLength(2);
    exact.forEach((e, i) => expect(Math.abs(grid.levels[i] - e) / e).toBeLessThan(1e-8));
  });

  it('differs from either constant-mass well (the profile is used)', () => {
    const grid = gridLevels({ space: 'line', mass: Number.NaN, massProfile: profile, potential, breakpoints: [-a, a] });
    const uniform = gridLevels({ space: 'line', mass: mIn, potential, breakpoints: [-a, a] });
    expect(Math.abs(grid.levels[0] - uniform.levels[0])).toBeGreaterThan(1e-3);
  });
});

/** psi = cos(q x) inside and cos(q a) e^{-p (|x| - a)} outside, p = (m_out/m_in) q tan(q a): psi and psi'/m continuous at |x| = a. */
function matchedTrial(): TrialFamily {
  let q = 1;
  let p = 1;
  return {
    setParameters(values) {
      q = values[0];
      p = (mOut / mIn) * q * Math.tan(q * a);
    },
    value: (x) => (inside(x) ? Math.cos(q * x) : Math.cos(q * a) * Math.exp(-p * (Math.abs(x) - a))),
    d1: (x) => (inside(x) ? -q * Math.sin(q * x) : -Math.sign(x) * p * Math.cos(q * a) * Math.exp(-p * (Math.abs(x) - a))),
    d2: (x) => (inside(x) ? -q * q * Math.cos(q * x) : p * p * Math.cos(q * a) * Math.exp(-p * (Math.abs(x) - a))),
    switches: [(x) => x - a, (x) => x + a],
  };
}

function gaussian(): TrialFamily {
  let b = 1;
  return {
    setParameters(values) {
      b = values[0];
    },
    value: (x) => Math.exp(-b * x * x),
    d1: (x) => -2 * b * x * Math.exp(-b * x * x),
    d2: (x) => (4 * b * b * x * x - 2 * b) * Math.exp(-b * x * x),
    switches: [],
  };
}

describe('position-dependent mass: variational part', () => {
  const exact = wellLevel(0);

  it('a Gaussian gives an upper bound above the exact level, confirmed; its variance is infinite at the mass step', () => {
    const result = evaluateProblem({ ...base({ parameters: [{ name: 'b', start: 0.5, min: 0.01, max: 10 }] }), trial: gaussian() });
    expect(result.status).toBe('confirmed');
    expect(result.energy!).toBeGreaterThan(exact);
    expect(Math.abs(result.grid!.levels[0] - exact) / exact).toBeLessThan(1e-8);
    // A Gaussian's slope is continuous, so psi'/m jumps where the mass steps: H psi holds a delta function.
    expect(result.variance!.value).toBeNull();
    expect(result.variance!.note).toMatch(/psi'\/m is not continuous/);
    expect(result.virial).toBeNull();
  });

  it('the BenDaniel–Duke matched trial reaches the exact level with a vanishing variance', () => {
    const kExact = Math.sqrt(2 * mIn * exact);
    const result = evaluateProblem({ ...base({ parameters: [{ name: 'q', start: 0.5 * kExact, min: 0.1, max: 0.99 * (Math.PI / 2) / a }] }), trial: matchedTrial() });
    expect(result.status).toBe('confirmed');
    expect(Math.abs(result.energy! - exact) / exact).toBeLessThan(1e-9);
    expect(Math.abs(result.parameters[0].value - kExact) / kExact).toBeLessThan(1e-4);
    expect(result.variance!.value).not.toBeNull();
    expect(result.variance!.value!).toBeLessThan(1e-6 * exact * exact);
  });

  it('a mass that is negative where the trial lives makes the block invalid, naming the mass', () => {
    const negative: MassProfile = { value: (x) => (x > 2 ? -1 : 1), d1: () => 0, switches: [(x) => x - 2] };
    const result = evaluateProblem({ ...base({ massProfile: negative, parameters: [{ name: 'b', start: 0.5, min: 0.01, max: 10 }] }), trial: gaussian() });
    expect(result.status).toBe('invalid');
    expect(result.checks[0]).toMatchObject({ name: 'mass-positive', pass: false, field: 'mass' });
    expect(result.checks[0].detail).toMatch(/mass is -1/);
  });
});

/**
 * A spherical well (V = 0 for r < b, V0 outside) with mass m_in inside and m_out outside, l = 0: R = sin(kr)/r
 * inside and C e^{-kappa r}/r outside. With H = -(1/2) div(grad/m) + V the radial flux R'/m is continuous at r = b
 * (BenDaniel & Duke, as on the line), so (k cot(kb) - 1/b)/m_in = -(kappa + 1/b)/m_out; times sin(kb) this has no
 * pole: (k cos z - sin(z)/b)/m_in + (kappa + 1/b) sin(z)/m_out = 0 with z = kb, whose lowest root lies in (0, pi).
 * On the grid's u = rR this step also puts (1/2) [1/m] u(b)^2 / b into <T>, which the test checks is there.
 */
describe('position-dependent mass: radial grid reference', () => {
  const b = 1.5;
  const v0 = 6;
  const inner = 0.5;
  const outer = 1.3;
  const sphere: MassProfile = { value: (r) => (r < b ? inner : outer), d1: () => 0, switches: [(r) => r - b] };
  const energy = (z: number) => (z * z) / (2 * inner * b * b);
  const f = (z: number) => {
    const k = z / b;
    const kappa = Math.sqrt(2 * outer * Math.max(v0 - energy(z), 0));
    return (k * Math.cos(z) - Math.sin(z) / b) / inner + ((kappa + 1 / b) * Math.sin(z)) / outer;
  };

  it('matches the matched spherical-well ground level to 1e-8 relative', () => {
    const exact = energy(bisectRoot(f, 1e-6, Math.PI - 1e-9));
    expect(exact).toBeLessThan(v0);
    const grid = gridLevels({ space: 'radial', mass: Number.NaN, massProfile: sphere, potential: (r) => (r < b ? 0 : v0), breakpoints: [b], angularMomentum: 0, levels: 1 });
    expect(grid.converged).toBe(true);
    expect(Math.abs(grid.levels[0] - exact) / exact).toBeLessThan(1e-8);
  });
});
