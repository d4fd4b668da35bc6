import { describe, expect, it } from 'vitest';
import { jacobiEigen, solveGeneralized } from '../../src/engine/generalized-eigen.ts';
import {
  optimiseLinearBasis,
  solveLinearBasis,
  type LinearBasisProblem,
  type LinearBasisResult,
} from '../../src/engine/linear-basis.ts';
import type { BasisFunction, LinearBasis } from '../../src/engine/problem.ts';

const relativeError = (value: number, exact: number) => Math.abs(value - exact) / Math.abs(exact);
const EPS = Number.EPSILON;

function expectSolved(result: LinearBasisResult): void {
  expect(result.failure, result.failureDetail ?? '').toBeNull();
  expect(result.eigen?.converged).toBe(true);
  expect(result.quadrature?.status).toBe('converged');
}

describe('jacobiEigen', () => {
  it('gives the eigenvalues 2 - 2 cos(k pi/(n+1)) of tridiag(-1, 2, -1) with orthonormal vectors', () => {
    // Eigenvalues of the second-difference matrix (Strang, Linear Algebra and Its Applications, §1.7; from memory).
    const n = 10;
    const a = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 2;
      if (i > 0) a[i * n + i - 1] = a[(i - 1) * n + i] = -1;
    }
    const result = jacobiEigen(a, n);
    expect(result.converged).toBe(true);
    for (let k = 0; k < n; k++) {
      expect(Math.abs(result.values[k] - (2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))))).toBeLessThan(32 * EPS);
    }
    // V^T V = I: the defining property of the eigenvector matrix of a symmetric matrix (common practice).
    for (let p = 0; p < n; p++) {
      for (let q = 0; q < n; q++) {
        let dot = 0;
        for (let r = 0; r < n; r++) dot += result.vectors[r * n + p] * result.vectors[r * n + q];
        expect(Math.abs(dot - (p === q ? 1 : 0))).toBeLessThan(32 * EPS);
      }
    }
  });

  it('resolves the smallest eigenvalue of the 8x8 Hilbert matrix to 1e-6 relative despite a condition number of 1.5e10', () => {
    // lambda_min(H_8) = 1.1115389664e-10, lambda_max = 1.6959389969 (Gregory & Karney, A Collection of Matrices for
    // Testing Computational Algorithms, 1969, from memory; confirmed to these digits with mpmath's eighe). Rounding
    // the entries 1/(i+j+1) to double already moves lambda_min by about 5e-8 relative.
    const n = 8;
    const h = Float64Array.from({ length: n * n }, (_, k) => 1 / (Math.floor(k / n) + (k % n) + 1));
    const result = jacobiEigen(h, n);
    expect(result.converged).toBe(true);
    expect(relativeError(result.values[0], 1.1115389664e-10)).toBeLessThan(1e-6);
    expect(relativeError(result.values[n - 1], 1.6959389969)).toBeLessThan(1e-9);
  });
});

describe('solveGeneralized', () => {
  it('reproduces the linear finite-element eigenvalues (6/h^2)(1 - cos t)/(2 + cos t) of -u" = E u on [0, 1]', () => {
    // Stiffness (1/h) tridiag(-1, 2, -1), mass (h/6) tridiag(1, 4, 1), t = k pi h (Strang & Fix, An Analysis of the
    // Finite Element Method, 1973, ch. 6; from memory, and checked by substituting v_j = sin(j t)).
    const n = 12;
    const h = 1 / (n + 1);
    const stiffness = new Float64Array(n * n);
    const mass = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      stiffness[i * n + i] = 2 / h;
      mass[i * n + i] = (4 * h) / 6;
      if (i > 0) {
        stiffness[i * n + i - 1] = stiffness[(i - 1) * n + i] = -1 / h;
        mass[i * n + i - 1] = mass[(i - 1) * n + i] = h / 6;
      }
    }
    const result = solveGeneralized(stiffness, mass, n);
    expect(result.message).toBeNull();
    expect(result.dropped).toBe(0);
    for (let k = 0; k < n; k++) {
      const t = (k + 1) * Math.PI * h;
      const exact = ((6 / (h * h)) * (1 - Math.cos(t))) / (2 + Math.cos(t));
      expect(relativeError(result.values[k], exact)).toBeLessThan(1e-13);
      // c^T M c = 1 is the normalisation the result promises.
      const c = result.vectors[k];
      let norm = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) norm += c[i] * mass[i * n + j] * c[j];
      expect(Math.abs(norm - 1)).toBeLessThan(1e-13);
    }
  });
});

/** x^k (L - x), k = 1..count: polynomials vanishing at both walls of [0, L]. */
function boxPolynomials(length: number, count: number): BasisFunction[] {
  return Array.from({ length: count }, (_, i) => {
    const k = i + 1;
    return {
      value: (x: number) => x ** k * (length - x),
      d1: (x: number) => k * x ** (k - 1) * (length - x) - x ** k,
    };
  });
}

describe('solveLinearBasis: particle in a box with the basis x^k (L - x)', () => {
  const length = 3;
  const mass = 2;
  // E_n = n^2 pi^2 / (2 m L^2) with hbar = 1 (Griffiths, Introduction to Quantum Mechanics, 2nd ed., §2.2, eq. 2.27).
  const exact = (n: number) => (n * n * Math.PI ** 2) / (2 * mass * length * length);
  const solve = (count: number, states = 4) =>
    solveLinearBasis({
      space: 'line', box: [0, length], angularMomentum: 0, mass, potential: () => 0,
      basis: { functions: boxPolynomials(length, count) }, breakpoints: [], states,
    });

  it('gets the ground level to 1e-8 with six functions and to 1e-11 with seven or eight', () => {
    const measured = [6, 7, 8].map((count) => {
      const result = solve(count);
      expectSolved(result);
      expect(result.overlap!.dropped).toBe(0);
      return relativeError(result.levels[0].energy, exact(1));
    });
    expect(measured[0]).toBeLessThan(1e-8);
    expect(measured[1]).toBeLessThan(1e-11);
    expect(measured[2]).toBeLessThan(1e-11);
  });

  it('integrates the polynomial matrix elements on one 21-point Kronrod panel', () => {
    // The products have degree <= 2N + 2 = 18, within the degree 31 the 10/21-point Gauss–Kronrod pair integrates
    // exactly (Kronrod 1965; Piessens et al., QUADPACK, 1983), so the first panel meets the tolerance.
    const result = solve(8);
    expect(result.quadrature!.intervals).toBe(1);
    const largest = Math.max(...result.matrices!.overlap.map((row, i) => row[i]));
    expect(result.quadrature!.overlapError).toBeLessThan(1e-13 * largest);
  });

  it('gives upper bounds to every level that never rise as functions are added', () => {
    // Hylleraas & Undheim, Z. Phys. 65, 759 (1930); MacDonald, Phys. Rev. 43, 830 (1933): the k-th eigenvalue of a
    // nested sequence of bases is an upper bound to E_k and is non-increasing in the basis size. Both hold up to
    // each level's propagated quadrature error (the overlap's condition number reaches 1e10 at eight functions).
    let previous: LinearBasisResult['levels'] = [];
    for (let count = 2; count <= 8; count++) {
      const result = solve(count, count);
      expectSolved(result);
      result.levels.forEach((level, k) => {
        expect(level.energy).toBeGreaterThanOrEqual(exact(k + 1) - level.errorEstimate);
        if (k < previous.length) expect(level.energy).toBeLessThanOrEqual(previous[k].energy + level.errorEstimate + previous[k].errorEstimate);
      });
      previous = result.levels;
    }
  });

  it('reports <T> and <V> that add up to each level, with <V> = 0 in an empty box', () => {
    // E = <T> + <V> for an eigenvector of the projected H (definition); V = 0 inside the box (Griffiths §2.2).
    const result = solve(6);
    for (const level of result.levels) {
      expect(level.potential).toBe(0);
      expect(relativeError(level.kinetic, level.energy)).toBeLessThan(1e-12);
    }
  });
});

/** Normalised Hermite functions psi_k(xi) for k = 0..kmax by their three-term recurrence (DLMF 18.9.1, 18.5.5). */
function hermiteFunctions(kmax: number, xi: number, out: Float64Array): void {
  out[0] = Math.PI ** -0.25 * Math.exp(-0.5 * xi * xi);
  if (kmax > 0) out[1] = Math.SQRT2 * xi * out[0];
  for (let k = 2; k <= kmax; k++) out[k] = Math.sqrt(2 / k) * xi * out[k - 1] - Math.sqrt((k - 1) / k) * out[k - 2];
}

/**
 * Harmonic-oscillator eigenfunctions of width 1/b about x0 (any QM textbook, e.g. Griffiths §2.3.2), with
 * psi_k' = b (sqrt(k/2) psi_{k-1} - sqrt((k+1)/2) psi_{k+1}) (ladder-operator identity); b is the shared
 * nonlinear parameter, set through setParameters.
 */
function oscillatorBasis(count: number, b0: number, x0: number): LinearBasis {
  let b = b0;
  const work = new Float64Array(count + 1);
  return {
    setParameters: (p) => {
      b = p[0];
    },
    functions: Array.from({ length: count }, (_, k) => ({
      value: (x: number) => {
        hermiteFunctions(k, b * (x - x0), work);
        return Math.sqrt(b) * work[k];
      },
      d1: (x: number) => {
        hermiteFunctions(k + 1, b * (x - x0), work);
        return b * Math.sqrt(b) * ((k > 0 ? Math.sqrt(k / 2) * work[k - 1] : 0) - Math.sqrt((k + 1) / 2) * work[k + 1]);
      },
    })),
  };
}

describe('solveLinearBasis: the Morse well of benchmark P7 in an oscillator basis', () => {
  // P7: V = D (1 - exp(-alpha x))^2, D = 10, alpha = 0.5, m = 1; E_n = w (n + 1/2) - w^2 (n + 1/2)^2 / (4 D) with
  // w = alpha sqrt(2 D / m) (Morse, Phys. Rev. 34, 57 (1929)); E_0 = 1.0867839887 as the record quotes.
  const depth = 10;
  const alpha = 0.5;
  const mass = 1;
  const w = alpha * Math.sqrt((2 * depth) / mass);
  const exact = (n: number) => w * (n + 0.5) - (w * (n + 0.5)) ** 2 / (4 * depth);
  const potential = (x: number) => depth * (1 - Math.exp(-alpha * x)) ** 2;
  const problem = (basis: LinearBasis): LinearBasisProblem => ({
    space: 'line', box: null, angularMomentum: 0, mass, potential, basis, breakpoints: [], states: 3,
  });
  // The oscillator is centred on the well's softer side, where the Morse states lean (a choice, not a fit).
  const b = Math.sqrt(mass * 0.8 * w);
  const x0 = 0.5;

  it('quotes the published ground level', () => {
    expect(relativeError(exact(0), 1.0867839887)).toBeLessThan(1e-10);
  });

  it('converges to the lowest three levels from above, to 1e-6 relative with 20 functions', () => {
    const errors = [5, 10, 15, 20].map((count) => {
      const result = solveLinearBasis(problem(oscillatorBasis(count, b, x0)));
      expectSolved(result);
      // An orthonormal basis: S = 1, so the condition number is 1 (Griffiths §2.3.2).
      expect(result.overlap!.conditionNumber).toBeLessThan(1 + 1e-10);
      expect(result.warning).toBeNull();
      return result.levels.map((level, n) => {
        expect(level.energy).toBeGreaterThan(exact(n)); // Hylleraas–Undheim–MacDonald upper bound
        return relativeError(level.energy, exact(n));
      });
    });
    for (let n = 0; n < 3; n++) {
      for (let step = 1; step < errors.length; step++) expect(errors[step][n]).toBeLessThan(errors[step - 1][n] / 5);
      expect(errors[3][n]).toBeLessThan(1e-6);
    }
  });

  it('lowers the ground level by optimising the oscillator width, staying above the exact value', () => {
    const basis = oscillatorBasis(8, b, x0);
    const atStart = solveLinearBasis(problem(basis), [b]);
    const best = optimiseLinearBasis(problem(basis), [{ name: 'b', start: b, min: 0.3, max: 3 }]);
    expect(best.optimiser.converged, best.optimiser.message ?? '').toBe(true);
    expectSolved(best.solution);
    const energy = best.solution.levels[0].energy;
    expect(energy).toBeLessThan(atStart.levels[0].energy);
    expect(energy).toBeGreaterThan(exact(0)); // variational bound (Morse 1929)
    expect(best.optimiser.value).toBe(energy);
    expect(best.solves).toBe(best.optimiser.evaluations + 1);
  });
});

const gaussian = (a: number): BasisFunction => ({
  value: (r) => Math.exp(-a * r * r),
  d1: (r) => -2 * a * r * Math.exp(-a * r * r),
});

describe('solveLinearBasis: hydrogen, radial', () => {
  const coulomb = (r: number) => -1 / r;
  const hydrogen = (basis: LinearBasis, states: number, angularMomentum = 0): LinearBasisProblem => ({
    space: 'radial', box: null, angularMomentum, mass: 1, potential: coulomb, basis, breakpoints: [], states,
  });

  it('gives upper bounds to 1s and 2s that fall as even-tempered Gaussians are added', () => {
    // E_n = -1/(2 n^2) hartree (any QM textbook, e.g. Griffiths §4.2); Hylleraas–Undheim–MacDonald for the 2s bound.
    let previous = [0, 0];
    for (let count = 2; count <= 8; count++) {
      const exponents = Array.from({ length: count }, (_, k) => 0.02 * 3 ** k);
      const result = solveLinearBasis(hydrogen({ functions: exponents.map(gaussian) }, 2));
      expectSolved(result);
      const [ground, excited] = result.levels.map((l) => l.energy);
      expect(ground).toBeGreaterThan(-0.5);
      expect(excited).toBeGreaterThan(-0.125);
      expect(ground).toBeLessThan(previous[0]);
      expect(excited).toBeLessThan(previous[1] + 1e-13);
      // The virial theorem for a Coulomb potential holds only at the exact state; <T> + <V> = E always (definition).
      expect(Math.abs(result.levels[0].kinetic + result.levels[0].potential - ground)).toBeLessThan(1e-12);
      previous = [ground, excited];
    }
    expect(previous[0] + 0.5).toBeLessThan(1e-4);
  });

  it('finds the best single Gaussian: a = 8/(9 pi), E = -4/(3 pi)', () => {
    // Griffiths, Introduction to Quantum Mechanics, 2nd ed., Problem 7.2 (closed form, from memory).
    let a = 1;
    const basis: LinearBasis = { functions: [{ value: (r) => Math.exp(-a * r * r), d1: (r) => -2 * a * r * Math.exp(-a * r * r) }], setParameters: (p) => { a = p[0]; } };
    const best = optimiseLinearBasis(hydrogen(basis, 1), [{ name: 'a', start: 1, min: 0.01, max: 10 }]);
    expect(best.optimiser.converged).toBe(true);
    expect(relativeError(best.solution.levels[0].energy, -4 / (3 * Math.PI))).toBeLessThan(1e-12);
    expect(relativeError(best.parameters[0], 8 / (9 * Math.PI))).toBeLessThan(1e-5);
  });

  it('finds the best pair of Gaussians: E = -0.485813', () => {
    // Energy-optimised two-Gaussian expansion of 1s: E = -0.485813, exponents 1.332 and 0.2015 (Huzinaga,
    // J. Chem. Phys. 42, 1293 (1965); Szabo & Ostlund, Modern Quantum Chemistry, §3.6; from memory).
    const exponents = [1, 0.1];
    const basis: LinearBasis = {
      functions: [0, 1].map((i) => ({
        value: (r: number) => Math.exp(-exponents[i] * r * r),
        d1: (r: number) => -2 * exponents[i] * r * Math.exp(-exponents[i] * r * r),
      })),
      setParameters: (p) => { exponents[0] = p[0]; exponents[1] = p[1]; },
    };
    const best = optimiseLinearBasis(hydrogen(basis, 1), [
      { name: 'a1', start: 1, min: 0.01, max: 10 },
      { name: 'a2', start: 0.1, min: 0.01, max: 10 },
    ]);
    expect(best.optimiser.converged).toBe(true);
    expect(Math.abs(best.solution.levels[0].energy + 0.485813)).toBeLessThan(1e-6);
    expect(relativeError(best.parameters[0], 1.332)).toBeLessThan(1e-3);
    expect(relativeError(best.parameters[1], 0.2015)).toBeLessThan(1e-3);
  });

  it('gets 2p exactly for l = 1 when r exp(-r/2) is in the basis, with 3p bounded from above', () => {
    // R_21 is proportional to r exp(-r/2): E(2p) = -1/8, E(3p) = -1/18 (Griffiths §4.2, Table 4.7).
    const slater = (power: number): BasisFunction => ({
      value: (r) => r ** power * Math.exp(-r / 2),
      d1: (r) => (power * r ** (power - 1) - 0.5 * r ** power) * Math.exp(-r / 2),
    });
    const result = solveLinearBasis(hydrogen({ functions: [slater(1), slater(2)] }, 2, 1));
    expectSolved(result);
    expect(relativeError(result.levels[0].energy, -1 / 8)).toBeLessThan(1e-12);
    expect(result.levels[1].energy).toBeGreaterThan(-1 / 18);
  });
});

describe('solveLinearBasis: nearly linearly dependent basis', () => {
  const oscillator = (x: number) => 0.5 * x * x;
  const gaussianPower = (a: number, power: number): BasisFunction => ({
    value: (x) => x ** power * Math.exp(-a * x * x),
    d1: (x) => ((power > 0 ? power * x ** (power - 1) : 0) - 2 * a * x ** (power + 1)) * Math.exp(-a * x * x),
  });
  // The oscillator's ground and first excited states exp(-x^2/2) and x exp(-x^2/2) lie in every basis below, so
  // the exact levels 1/2 and 3/2 (E_n = n + 1/2, Griffiths §2.3) must come out to rounding.
  const solve = (delta: number) =>
    solveLinearBasis({
      space: 'line', box: null, angularMomentum: 0, mass: 1, potential: oscillator, breakpoints: [], states: 2,
      basis: { functions: [gaussianPower(0.5, 0), gaussianPower(0.5 * (1 + delta), 0), gaussianPower(0.5, 1), gaussianPower(0.3, 0)] },
    });

  it('drops the duplicated direction and still gets 1/2 and 3/2, with a warning', () => {
    const result = solve(1e-9);
    expectSolved(result);
    expect(result.overlap!.dropped).toBe(1);
    expect(result.overlap!.kept).toBe(3);
    expect(result.overlap!.conditionNumber).toBeGreaterThan(1e10);
    // At 1e-9 the overlap matrix is singular to rounding (its smallest eigenvalue comes out <= 0), which the warning names.
    expect(result.warning).toMatch(/poorly conditioned|numerically singular/);
    expect(result.warning).toMatch(/1 of 4 overlap eigenvectors dropped/);
    expect(Math.abs(result.levels[0].energy - 0.5)).toBeLessThan(1e-12);
    expect(Math.abs(result.levels[1].energy - 1.5)).toBeLessThan(1e-12);
    for (const level of result.levels) for (const c of level.coefficients) expect(Number.isFinite(c)).toBe(true);
  });

  it('keeps a resolvable near-dependence (condition 1e11), warns, and stays exact', () => {
    const result = solve(1e-4);
    expectSolved(result);
    expect(result.overlap!.dropped).toBe(0);
    expect(result.overlap!.conditionNumber).toBeGreaterThan(1e10);
    expect(result.warning).toMatch(/poorly conditioned/);
    expect(Math.abs(result.levels[0].energy - 0.5)).toBeLessThan(1e-12);
    expect(Math.abs(result.levels[1].energy - 1.5)).toBeLessThan(1e-12);
  });
});

describe('solveLinearBasis: bad bases are refused with the function named', () => {
  const base = (functions: BasisFunction[], box: [number, number] | null = null): LinearBasisProblem => ({
    space: 'line', box, angularMomentum: 0, mass: 1, potential: (x) => 0.5 * x * x, basis: { functions }, breakpoints: [], states: 1,
  });
  const ground = { value: (x: number) => Math.exp(-0.5 * x * x), d1: (x: number) => -x * Math.exp(-0.5 * x * x) };

  it('refuses a function that does not vanish at a hard wall', () => {
    // The |psi'|^2 form equals <psi|T|psi> only for functions that vanish at the walls (integration by parts).
    const result = solveLinearBasis(base([{ value: (x) => x * (1 - x), d1: (x) => 1 - 2 * x }, { value: () => 1, d1: () => 0 }], [0, 1]));
    expect(result.failure).toBe('hard-wall');
    expect(result.failureDetail).toMatch(/basis\[1\]/);
    expect(result.levels).toEqual([]);
  });

  it('refuses a function that is not square-integrable', () => {
    // (1 + x^2)^(-1/4) squared is 1/sqrt(1 + x^2), whose integral over the line diverges logarithmically (elementary).
    const result = solveLinearBasis(base([ground, { value: (x) => (1 + x * x) ** -0.25, d1: (x) => -0.5 * x * (1 + x * x) ** -1.25 }]));
    expect(result.failure).toBe('integral-diverges');
    expect(result.failureDetail).toMatch(/norm integral of basis\[1\]/);
  });

  it('refuses a function that overflows and one that is zero', () => {
    const growing = solveLinearBasis(base([ground, { value: (x) => Math.exp(x * x), d1: (x) => 2 * x * Math.exp(x * x) }]));
    expect(growing.failure).toBe('non-finite');
    expect(growing.failureDetail).toMatch(/basis\[1\]/);
    const zero = solveLinearBasis(base([ground, { value: () => 0, d1: () => 0 }]));
    expect(zero.failure).toBe('zero-function');
    expect(zero.failureDetail).toMatch(/basis\[1\]/);
  });
});

describe('solveGeneralized: conditioning of a singular overlap matrix', () => {
  // Unit-diagonal overlap of {f, f, g} with <f|g>^2 / (<f|f><g|g>) = 7/8 (f = x(1-x), g = x^2(1-x) on [0, 1]:
  // Beta integrals 1/30, 1/60, 1/105). Closed form: eigenvalues 0 and (3 +/- 2 sqrt 2)/2, so the kept pair has
  // condition number (3 + 2 sqrt 2)/(3 - 2 sqrt 2) = 17 + 12 sqrt 2.
  const rho = Math.sqrt(7 / 8);
  const s = [1, 1, rho, 1, 1, rho, rho, rho, 1];
  const h = [1, 1, 0.5, 1, 1, 0.5, 0.5, 0.5, 2];

  it('drops the dependent direction and gives the finite condition number of the kept ones', () => {
    const result = solveGeneralized(h, s, 3);
    expect(result.dropped).toBe(1);
    expect(relativeError(result.keptConditionNumber, 17 + 12 * Math.SQRT2)).toBeLessThan(1e-13);
  });

  it('says so in words: numerically singular, how many dropped, and the kept condition number', async () => {
    const { describeConditioning } = await import('../../src/engine/linear-basis.ts');
    const result = solveGeneralized(h, s, 3);
    const text = describeConditioning(result.conditionNumber, result.keptConditionNumber, result.dropped, 3);
    // Exact duplicates leave S singular to rounding, so its full condition number is not finite (or beyond 1/eps).
    if (Number.isFinite(result.conditionNumber)) expect(result.conditionNumber).toBeGreaterThan(1 / EPS);
    expect(text).toMatch(/: 1 of 3 directions dropped as near-dependent; condition number 34\.0 over the 2 kept$/);
    expect(text).not.toContain('Infinity');
  });
});
