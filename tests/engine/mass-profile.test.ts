import { describe, expect, it } from 'vitest';
import { evaluateProblem } from '../../src/engine/evaluate-problem.ts';
import { gridLevels } from '../../src/engine/grid-levels.ts';
import type { MassProfile, ProblemBase, TrialFamily } from '../../src/engine/problem.ts';

/**
 * A finite square well whose mass differs inside (m_in, |x| < a) and outside (m_out): V = 0 inside, V0 outside.
 * With k = sqrt(2 m_in E) and kappa = sqrt(2 m_out (V0 - E)), continuity of psi and of psi'/m at x = a
 * (BenDaniel & Duke, Phys. Rev. 152, 683 (1966); Bastard, Wave Mechanics Applied to Semiconductor
 * Heterostructures (1988), ch. III) gives for even states (k/m_in) tan(k a) = kappa/m_out and for odd states
 * -(k/m_in) cot(k a) = kappa/m_out. Derivation: psi = cos(kx) inside, C e^{-kappa x} outside; psi continuous gives
 * C e^{-kappa a} = cos(ka), psi'/m continuous gives -k sin(ka)/m_in = -kappa C e^{-kappa a}/m_out; divide.
 * Written without poles: (k/m_in) sin(ka) - (kappa/m_out) cos(ka) = 0 (even), (k/m_in) cos(ka) + (kappa/m_out) sin(ka) = 0 (odd).
 */
const a = 1.2;
const depth = 4;
const mIn = 0.6;
const mOut = 1.7;

function bisectRoot(f: (z: number) => number, lo: number, hi: number): number {
  let [neg, pos] = f(lo) < 0 ? [lo, hi] : [hi, lo];
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (neg + pos);
    if (f(mid) < 0) neg = mid;
    else pos = mid;
  }
  return 0.5 * (neg + pos);
}

/** The j-th level (j = 0 even, 1 odd, ...): z = k a lies in [j pi/2, (j+1) pi/2]. */
function wellLevel(j: number): number {
  const energy = (z: number) => (z * z) / (2 * mIn * a * a);
  const kappa = (z: number) => Math.sqrt(2 * mOut * Math.max(depth - energy(z), 0));
  const even = j % 2 === 0;
  const f = (z: number) => (even ? ((z / a) / mIn) * Math.sin(z) - (kappa(z) / mOut) * Math.cos(z) : ((z / a) / mIn) * Math.cos(z) + (kappa(z) / mOut) * Math.sin(z));
  const zMax = Math.min(((j + 1) * Math.PI) / 2, a * Math.sqrt(2 * mIn * depth));
  return energy(bisectRoot(f, (j * Math.PI) / 2 + 1e-12, zMax - 1e-12));
}

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
