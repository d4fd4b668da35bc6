import { describe, expect, it } from 'vitest';
import { gridLevels, type GridLevels, type GridProblem } from '../../src/engine/grid-levels.ts';

/** Required agreement with the published values: 1e-8 relative; the grid reaches far better, so check tighter. */
const tight = 1e-10;

function relativeError(value: number, exact: number): number {
  return Math.abs(value - exact) / Math.abs(exact);
}

function expectLevels(result: GridLevels, exact: number[], tolerance = tight): void {
  expect(result.message).toBeNull();
  expect(result.converged).toBe(true);
  expect(result.levels).toHaveLength(exact.length);
  exact.forEach((e, i) => expect(relativeError(result.levels[i], e)).toBeLessThan(tolerance));
}

function normOf(values: Float64Array, weights: Float64Array): number {
  return values.reduce((s, v, i) => s + weights[i] * v * v, 0);
}

/** Root of f on [a, b] by bisection; f(a) and f(b) must differ in sign. */
function bisectRoot(f: (z: number) => number, a: number, b: number): number {
  let [lo, hi] = f(a) < 0 ? [a, b] : [b, a];
  for (let i = 0; i < 200; i++) {
    const mid = 0.5 * (lo + hi);
    if (f(mid) < 0) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * All bound levels of a finite square well of depth V0 and half-width a: with z = k a and z0 = a sqrt(2 m V0), even
 * states solve k tan(k a) = kappa and odd states -k cot(k a) = kappa (Griffiths, Introduction to Quantum Mechanics,
 * §2.6), written as z sin z - sqrt(z0^2 - z^2) cos z = 0 and -z cos z - sqrt(z0^2 - z^2) sin z = 0 to avoid the
 * poles; the j-th root lies in [j pi/2, (j+1) pi/2] below z0, even and odd states alternating.
 */
function squareWellLevels(depth: number, halfWidth: number, mass: number): number[] {
  const z0 = halfWidth * Math.sqrt(2 * mass * depth);
  const outside = (z: number) => Math.sqrt(Math.max(z0 * z0 - z * z, 0));
  const energy = (z: number) => (z * z) / (2 * mass * halfWidth * halfWidth) - depth;
  const even = (z: number) => z * Math.sin(z) - outside(z) * Math.cos(z);
  const odd = (z: number) => -z * Math.cos(z) - outside(z) * Math.sin(z);
  const levels: number[] = [];
  for (let j = 0; (j * Math.PI) / 2 < z0; j++) {
    levels.push(energy(bisectRoot(j % 2 === 0 ? even : odd, (j * Math.PI) / 2, Math.min(((j + 1) * Math.PI) / 2, z0))));
  }
  return levels;
}

describe('gridLevels: hydrogen (radial, V = -1/r)', () => {
  const coulomb = (r: number) => -1 / r;

  it('gives the 1s and 2s levels -1/2 and -1/8 (E_n = -1/(2 n^2), any QM textbook)', () => {
    const result = gridLevels({ space: 'radial', mass: 1, potential: coulomb });
    expectLevels(result, [-0.5, -0.125]);
    expect(Math.abs(result.threshold)).toBeLessThan(1e-12); // V -> 0 at infinity
  });

  it('gives 2p and 3p for l = 1: -1/8 and -1/18 (E_n = -1/(2 n^2), any QM textbook)', () => {
    const result = gridLevels({ space: 'radial', mass: 1, potential: coulomb, angularMomentum: 1 });
    expectLevels(result, [-0.125, -1 / 18]);
  });

  it('returns chi = r R_10 = 2 r exp(-r) at the nodes (any QM textbook)', () => {
    const result = gridLevels({ space: 'radial', mass: 1, potential: coulomb });
    expect(normOf(result.ground, result.weights)).toBeCloseTo(1, 12);
    result.nodes.forEach((r, i) => expect(Math.abs(result.ground[i] - 2 * r * Math.exp(-r))).toBeLessThan(1e-7));
  });

  it('3-D oscillator V = r^2/2 in the radial space: E = 2 n_r + l + 3/2 for l = 0 and l = 3 (any QM textbook)', () => {
    expectLevels(gridLevels({ space: 'radial', mass: 1, potential: (r) => (r * r) / 2 }), [1.5, 3.5]);
    expectLevels(gridLevels({ space: 'radial', mass: 1, potential: (r) => (r * r) / 2, angularMomentum: 3 }), [4.5, 6.5]);
  });

  it('does not depend on the hint beyond the tolerance (exact -1/2, -1/8)', () => {
    const hints = [{ center: 0.1, width: 0.05 }, { center: 1.5, width: 0.9 }, { center: 20, width: 10 }];
    for (const hint of hints) expectLevels(gridLevels({ space: 'radial', mass: 1, potential: coulomb, hint }), [-0.5, -0.125]);
  });
});

describe('gridLevels: harmonic oscillator (line)', () => {
  it('gives 1/2 and 3/2 for V = x^2/2, m = 1 (E_n = omega (n + 1/2), any QM textbook)', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (x * x) / 2 });
    expectLevels(result, [0.5, 1.5]);
    expect(result.threshold).toBe(Infinity);
  });

  it('gives omega (n + 1/2) with omega = sqrt(k/m) = 2 for V = x^2 (k = 2), m = 1/2 (any QM textbook)', () => {
    const result = gridLevels({ space: 'line', mass: 0.5, potential: (x) => x * x });
    expectLevels(result, [1, 3]);
  });

  it('returns the ground state pi^(-1/4) exp(-x^2/2) and the first excited state at the nodes (any QM textbook)', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (x * x) / 2 });
    expect(normOf(result.ground, result.weights)).toBeCloseTo(1, 12);
    const excited = result.excited;
    expect(excited).not.toBeNull();
    expect(normOf(excited!, result.weights)).toBeCloseTo(1, 12);
    result.nodes.forEach((x, i) => {
      expect(Math.abs(result.ground[i] - Math.PI ** -0.25 * Math.exp((-x * x) / 2))).toBeLessThan(1e-7);
      expect(Math.abs(excited![i] - Math.PI ** -0.25 * Math.SQRT2 * x * Math.exp((-x * x) / 2))).toBeLessThan(1e-7);
    });
  });

  it('does not depend on the hint beyond the tolerance (exact 1/2, 3/2)', () => {
    const hints = [{ center: 3, width: 0.2 }, { center: -5, width: 10 }];
    for (const hint of hints) expectLevels(gridLevels({ space: 'line', mass: 1, potential: (x) => (x * x) / 2, hint }), [0.5, 1.5]);
  });

  it('reports its diagnostics with the levels', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (x * x) / 2 });
    expect(result.refinements).toBeGreaterThanOrEqual(3);
    expect(result.size).toBe(result.nodes.length);
    expect(result.weights).toHaveLength(result.size);
    expect(result.size).toBe(result.elements * (result.elementOrder - 1) - 1); // bridge nodes shared, two wall nodes dropped (Rescigno & McCurdy 2000)
    expect(result.eigenIterations).toBeGreaterThan(0);
    expect(result.potentialEvaluations).toBeGreaterThanOrEqual(result.size);
    expect(result.errorEstimate).toHaveLength(2);
    result.errorEstimate.forEach((e, i) => expect(e).toBeLessThanOrEqual(1e-10 * Math.max(1, result.levels[i]))); // default relTol
    // WKB: beyond the turning point sqrt(3) of E1 = 3/2 the exponent int sqrt(x^2 - 3) dx reaches 20 only past x = 5 (common practice).
    expect(result.domain[0]).toBeLessThan(-5);
    expect(result.domain[1]).toBeGreaterThan(5);
  });
});

describe('gridLevels: other exactly solvable wells (line and half-line)', () => {
  it('Pöschl–Teller V = -lambda(lambda+1)/2 sech^2 x, lambda = 3: E_n = -(lambda - n)^2/2 (Landau & Lifshitz, QM §23, problem 4; from memory)', () => {
    const lambda = 3;
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (-lambda * (lambda + 1)) / 2 / Math.cosh(x) ** 2 });
    expectLevels(result, [-4.5, -2]);
    expect(Math.abs(result.threshold)).toBe(0); // sech^2 -> 0
  });

  it('Morse V = D (1 - exp(-alpha x))^2, D = 10, alpha = 1/2: E_n = w(n+1/2) - w^2 (n+1/2)^2/(4D) (Morse, Phys. Rev. 34, 57 (1929))', () => {
    const [depth, alpha] = [10, 0.5];
    const w = alpha * Math.sqrt(2 * depth);
    const morse = (n: number) => w * (n + 0.5) - (w * w * (n + 0.5) ** 2) / (4 * depth);
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => depth * (1 - Math.exp(-alpha * x)) ** 2 });
    expect(morse(0)).toBeCloseTo(1.0867839887, 10);
    expectLevels(result, [morse(0), morse(1)]);
    expect(result.threshold).toBeCloseTo(depth, 12); // V -> D as x -> +infinity
  });

  it('linear potential on the half-line, H = p^2 + x: E_n = |a_n| (Abramowitz & Stegun Table 10.13; DLMF 9.9)', () => {
    const result = gridLevels({ space: 'half-line', mass: 0.5, potential: (x) => x });
    expectLevels(result, [2.338107410459767, 4.08794944413097], 1e-12);
    expect(normOf(result.ground, result.weights)).toBeCloseTo(1, 12);
  });

  it("V = |x| with its kink at a breakpoint, H = p^2 + |x|: E0 = |a'_1|, E1 = |a_1| (Abramowitz & Stegun Table 10.13)", () => {
    const result = gridLevels({ space: 'line', mass: 0.5, potential: (x) => Math.abs(x), breakpoints: [0] });
    expectLevels(result, [1.018792971647471, 2.338107410459767], 1e-12);
  });

  it('pure quartic H = p^2 + x^4: E0 = 1.0603620904, E1 = 3.7996730298 (Hioe & Montroll, J. Math. Phys. 16, 1945 (1975); from memory)', () => {
    const result = gridLevels({ space: 'line', mass: 0.5, potential: (x) => x ** 4 });
    expectLevels(result, [1.0603620904, 3.7996730298], 2e-10);
  });
});

describe('gridLevels: finite square well (steps at the breakpoints)', () => {
  it('matches the even and odd roots of the matching conditions for V0 = 10, a = 1 (Griffiths §2.6)', () => {
    const [depth, a] = [10, 1];
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (Math.abs(x) < a ? -depth : 0), breakpoints: [-a, a] });
    expectLevels(result, squareWellLevels(depth, a, 1).slice(0, 2));
    expect(result.threshold).toBe(0);
  });

  it('keeps only the single bound state of a shallow well, V0 = 1, a = 1/2, m = 1 (Griffiths §2.6: z0 < pi/2)', () => {
    const [depth, a] = [1, 0.5];
    const exact = squareWellLevels(depth, a, 1);
    expect(exact).toHaveLength(1);
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (Math.abs(x) < a ? -depth : 0), breakpoints: [-a, a] });
    expectLevels(result, exact);
    expect(result.threshold).toBe(0);
    expect(result.excited).toBeNull();
  });

  it('handles a heavier particle in a shifted well, V0 = 2.5, a = 0.7, m = 3 (Griffiths §2.6)', () => {
    const [depth, a, mass, shift] = [2.5, 0.7, 3, 1.25];
    const result = gridLevels({
      space: 'line',
      mass,
      potential: (x) => (Math.abs(x - shift) < a ? -depth : 0),
      breakpoints: [shift - a, shift + a],
    });
    expectLevels(result, squareWellLevels(depth, a, mass).slice(0, 2));
  });
});

describe('gridLevels: box (hard walls)', () => {
  const boxLevel = (n: number, length: number, mass: number) => (n * n * Math.PI ** 2) / (2 * mass * length * length);
  const cases: Array<[string, [number, number], number]> = [
    ['[0, 1], m = 1', [0, 1], 1],
    ['[0, 2.5], m = 2', [0, 2.5], 2],
    ['[-1.3, 0.7], m = 1', [-1.3, 0.7], 1],
  ];
  for (const [name, box, mass] of cases) {
    it(`gives n^2 pi^2/(2 m L^2) for ${name} (any QM textbook)`, () => {
      const result = gridLevels({ space: 'box', mass, potential: () => 0, box });
      const length = box[1] - box[0];
      expectLevels(result, [boxLevel(1, length, mass), boxLevel(2, length, mass)]);
      expect(result.domain).toEqual(box);
      expect(result.threshold).toBe(Infinity);
      result.nodes.forEach((x, i) => {
        const exact = Math.sqrt(2 / length) * Math.sin((Math.PI * (x - box[0])) / length);
        expect(Math.abs(result.ground[i] - exact)).toBeLessThan(1e-7);
      });
    });
  }
});

/** Agreement of a returned state with an exact normalised function at the nodes, up to the overall sign. */
function expectState(state: Float64Array, result: GridLevels, exact: (x: number) => number): void {
  const overlap = result.nodes.reduce((s, x, i) => s + result.weights[i] * state[i] * exact(x), 0);
  const sign = Math.sign(overlap);
  result.nodes.forEach((x, i) => expect(Math.abs(sign * state[i] - exact(x))).toBeLessThan(1e-7));
}

/**
 * Normalised oscillator eigenfunctions psi_0 .. psi_{count-1} for V = x^2/2, m = 1, from the Hermite recurrence
 * H_{n+1} = 2x H_n - 2n H_{n-1} (DLMF 18.9.1) with psi_n = (2^n n! sqrt(pi))^(-1/2) H_n(x) exp(-x^2/2) (DLMF Table 18.3.1).
 */
function hermiteFunctions(count: number): Array<(x: number) => number> {
  const values = (x: number) => {
    const psi = [Math.PI ** -0.25 * Math.exp((-x * x) / 2)];
    psi.push(Math.SQRT2 * x * psi[0]);
    for (let n = 1; n + 1 < count; n++) psi.push(Math.sqrt(2 / (n + 1)) * x * psi[n] - Math.sqrt(n / (n + 1)) * psi[n - 1]);
    return psi;
  };
  return Array.from({ length: count }, (_, n) => (x: number) => values(x)[n]);
}

describe('gridLevels: the lowest n levels (levels option)', () => {
  const oscillator = (x: number) => (x * x) / 2;

  it('gives omega (n + 1/2) for n = 0..5 of V = x^2/2, m = 1, and their Hermite functions (any QM textbook; DLMF 18.9.1)', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: oscillator, levels: 6 });
    expectLevels(result, [0.5, 1.5, 2.5, 3.5, 4.5, 5.5]);
    expect(result.errorEstimate).toHaveLength(6);
    expect(result.states).toHaveLength(6);
    expect(result.states[0]).toBe(result.ground);
    expect(result.states[1]).toBe(result.excited);
    hermiteFunctions(6).forEach((psi, n) => expectState(result.states[n], result, psi));
    // WKB: beyond the turning point sqrt(11) of E5 = 11/2 the exponent int sqrt(x^2 - 11) dx < (x^2 - 11)/2 reaches 20
    // only past x = sqrt(51) (common practice), farther out than the two-level domain needs.
    expect(result.domain[0]).toBeLessThan(-Math.sqrt(51));
    expect(result.domain[1]).toBeGreaterThan(Math.sqrt(51));
  });

  it('keeps the default of two levels, with both states in `states` (E_n = n + 1/2, any QM textbook)', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: oscillator });
    expectLevels(result, [0.5, 1.5]);
    expect(result.states).toEqual([result.ground, result.excited]);
  });

  it('returns the ground level alone for levels = 1 (E_0 = 1/2, any QM textbook)', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: oscillator, levels: 1 });
    expectLevels(result, [0.5]);
    expect(result.excited).toBeNull();
    expect(result.states).toHaveLength(1);
  });

  it('gives the Morse levels n = 0..5 for the benchmark p7 well D = 10, alpha = 1/2, m = 1 (Morse, Phys. Rev. 34, 57 (1929))', () => {
    // E_n = w (n + 1/2) - w^2 (n + 1/2)^2 / (4 D) with w = alpha sqrt(2 D / m), hbar = 1.
    const [depth, alpha, mass] = [10, 0.5, 1];
    const w = alpha * Math.sqrt((2 * depth) / mass);
    const morse = (n: number) => w * (n + 0.5) - (w * w * (n + 0.5) ** 2) / (4 * depth);
    const result = gridLevels({ space: 'line', mass, potential: (x) => depth * (1 - Math.exp(-alpha * x)) ** 2, levels: 6 });
    expectLevels(result, [0, 1, 2, 3, 4, 5].map(morse));
  });

  it('returns all nine Morse levels of p7 and says so when twelve are asked for (Morse 1929: bound while n + 1/2 < 2D/w)', () => {
    const [depth, alpha, mass] = [10, 0.5, 1];
    const w = alpha * Math.sqrt((2 * depth) / mass);
    const morse = (n: number) => w * (n + 0.5) - (w * w * (n + 0.5) ** 2) / (4 * depth);
    const count = Math.ceil((2 * depth) / w - 0.5); // 2D/w = 8.94, so n = 0..8
    expect(count).toBe(9);
    const result = gridLevels({ space: 'line', mass, potential: (x) => depth * (1 - Math.exp(-alpha * x)) ** 2, levels: 12 });
    expect(result.converged).toBe(true);
    expect(result.levels).toHaveLength(count);
    expect(result.states).toHaveLength(count);
    result.levels.forEach((e, n) => expect(relativeError(e, morse(n))).toBeLessThan(tight));
    expect(result.message).toMatch(/only 9 bound levels below the continuum threshold 10, 12 asked for/);
  });

  it('gives the hydrogen s levels -1/(2 n^2) for n = 1..4 on a domain grown for the 4s tail (any QM textbook)', () => {
    const coulomb = (r: number) => -1 / r;
    const result = gridLevels({ space: 'radial', mass: 1, potential: coulomb, levels: 4 });
    expectLevels(result, [1, 2, 3, 4].map((n) => -1 / (2 * n * n)));
    // The 4s turning point is r = 2 n^2 = 32; beyond it sqrt(2 (V - E)) < sqrt(-2 E) = 1/4, so a WKB exponent of 20
    // needs more than 80 further (common practice).
    expect(result.domain[1]).toBeGreaterThan(32 + 80);
    expect(result.domain[1]).toBeGreaterThan(gridLevels({ space: 'radial', mass: 1, potential: coulomb }).domain[1]);
    const far = gridLevels({ space: 'radial', mass: 1, potential: coulomb, levels: 4, hint: { center: 0.1, width: 0.05 } });
    expectLevels(far, [1, 2, 3, 4].map((n) => -1 / (2 * n * n)));
  });

  it('gives n = 1..8 of hydrogen from the default start, the domain growing step by step (E_n = -1/(2 n^2), any QM textbook)', () => {
    const result = gridLevels({ space: 'radial', mass: 1, potential: (r) => -1 / r, levels: 8 });
    expectLevels(result, [1, 2, 3, 4, 5, 6, 7, 8].map((n) => -1 / (2 * n * n)));
    expect(result.domain[1]).toBeGreaterThan(2 * 8 * 8 + 20 * 8); // turning point 2 n^2, then 20 decay lengths 1/sqrt(-2E) (common practice)
  });

  it('gives the Airy levels |a_1| .. |a_5| for H = p^2 + x on the half-line (Abramowitz & Stegun Table 10.13; from memory)', () => {
    const result = gridLevels({ space: 'half-line', mass: 0.5, potential: (x) => x, levels: 5 });
    expectLevels(result, [2.338107410459767, 4.08794944413097, 5.520559828095551, 6.786708090071759, 7.944133587120853]);
  });

  const boxLevel = (n: number, length: number, mass: number) => (n * n * Math.PI ** 2) / (2 * mass * length * length);
  const boxes: Array<[string, [number, number], number]> = [
    ['[0, 1], m = 1', [0, 1], 1],
    ['[-1.3, 0.7], m = 2', [-1.3, 0.7], 2],
  ];
  for (const [name, box, mass] of boxes) {
    it(`gives the box levels n^2 pi^2/(2 m L^2) and states for n = 1..6, ${name} (any QM textbook)`, () => {
      const result = gridLevels({ space: 'box', mass, potential: () => 0, box, levels: 6 });
      const length = box[1] - box[0];
      expectLevels(result, [1, 2, 3, 4, 5, 6].map((n) => boxLevel(n, length, mass)));
      result.states.forEach((state, k) =>
        expectState(state, result, (x) => Math.sqrt(2 / length) * Math.sin(((k + 1) * Math.PI * (x - box[0])) / length)),
      );
    });
  }

  it('returns both Pöschl–Teller levels -2 and -1/2 of lambda = 2 and says so when four are asked for', () => {
    // V = -lambda(lambda+1)/2 sech^2 x binds E_n = -(lambda - n)^2/2 for n < lambda only (Landau & Lifshitz, QM §23,
    // problem 4; Flügge, Practical Quantum Mechanics, problem 39; from memory).
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => -3 / Math.cosh(x) ** 2, levels: 4 });
    expect(result.converged).toBe(true);
    expect(result.levels).toHaveLength(2);
    [-2, -0.5].forEach((e, i) => expect(relativeError(result.levels[i], e)).toBeLessThan(tight));
    expect(result.states).toHaveLength(2);
    expect(result.message).toMatch(/only 2 bound levels below the continuum threshold 0, 4 asked for/);
  });

  it('returns all three levels of a finite well V0 = 10, a = 1 when five are asked for (Griffiths §2.6)', () => {
    const exact = squareWellLevels(10, 1, 1);
    expect(exact).toHaveLength(3); // z0 = sqrt(20) lies between pi and 3 pi/2
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (Math.abs(x) < 1 ? -10 : 0), breakpoints: [-1, 1], levels: 5 });
    expect(result.converged).toBe(true);
    expect(result.levels).toHaveLength(3);
    exact.forEach((e, i) => expect(relativeError(result.levels[i], e)).toBeLessThan(tight));
    expect(result.message).toMatch(/only 3 bound levels/);
  });

  it('returns the single level of a shallow well V0 = 1, a = 1/2 when three are asked for (Griffiths §2.6: z0 < pi/2)', () => {
    const exact = squareWellLevels(1, 0.5, 1);
    expect(exact).toHaveLength(1);
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (Math.abs(x) < 0.5 ? -1 : 0), breakpoints: [-0.5, 0.5], levels: 3 });
    expect(result.converged).toBe(true);
    expect(result.levels).toHaveLength(1);
    expect(relativeError(result.levels[0], exact[0])).toBeLessThan(tight);
    expect(result.excited).toBeNull();
    expect(result.message).toMatch(/only 1 bound level below the continuum threshold 0, 3 asked for/);
  });
});

describe('gridLevels: failures are reported, never NaN', () => {
  it('rejects a number of levels that is not a positive integer', () => {
    for (const levels of [0, 2.5, -1]) {
      const result = gridLevels({ space: 'line', mass: 1, potential: (x) => x * x, levels });
      expect(result.converged).toBe(false);
      expect(result.levels).toEqual([]);
      expect(result.message).toBe(`levels must be a positive integer, got ${levels}`);
    }
  });

  it('names the node where V is not finite', () => {
    const problem: GridProblem = { space: 'line', mass: 1, potential: (x) => (x > 1 && x < 1.3 ? NaN : x * x) };
    const result = gridLevels(problem);
    expect(result.converged).toBe(false);
    expect(result.levels).toEqual([]);
    expect(result.message).toMatch(/not finite at x = 1\.[0-2]/);
  });

  it('says there are no bound states when V is unbounded below at an open end', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => x });
    expect(result.threshold).toBe(-Infinity);
    expect(result.levels).toEqual([]);
    expect(result.message).toMatch(/unbounded below/);
  });

  it('says so when nothing lies below the threshold (a well too shallow to bind in the half-line, z0 < pi/2)', () => {
    const result = gridLevels({ space: 'half-line', mass: 1, potential: (x) => (x < 1 ? -0.3 : 0), breakpoints: [1] });
    expect(result.converged).toBe(false);
    expect(result.levels).toEqual([]);
    expect(result.message).toMatch(/no bound level/);
  });

  it('stops at maxNodes with converged = false, the levels so far and their error estimate', () => {
    const result = gridLevels({ space: 'line', mass: 1, potential: (x) => (x * x) / 2, maxNodes: 250 });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/maxNodes = 250/);
    expect(result.size).toBeLessThanOrEqual(250);
    expect(result.levels).toHaveLength(2);
    expect(result.errorEstimate.every((e) => Number.isFinite(e) && e > 1e-10)).toBe(true);
    expect(relativeError(result.levels[0], 0.5)).toBeLessThan(1e-6); // E0 = 1/2, any QM textbook
  });

  it('rejects a box problem without a box', () => {
    const result = gridLevels({ space: 'box', mass: 1, potential: () => 0 });
    expect(result.converged).toBe(false);
    expect(result.message).toMatch(/box/);
  });
});
