/**
 * The linear variational method: the best combination of fixed basis functions, and with it upper bounds
 * to the lowest several levels at once (Hylleraas & Undheim, Z. Phys. 65, 759 (1930); MacDonald, Phys. Rev.
 * 43, 830 (1933)).
 */
import { ATOMIC_DISPLAY, type ValueDisplay } from './format.ts';
import { WALL_TOLERANCE } from './tolerances.ts';
import { EXPECTATION_DEFAULTS } from './expectation.ts';
import { GENERALIZED_DEFAULTS, solveGeneralized } from './generalized-eigen.ts';
import { minimizeBounded, type MinimizeOptions, type MinimizeResult } from './minimize.ts';
import type { BasisFunction, LinearBasis, ParameterSpec, ProblemBase } from './problem.ts';
import { integrateVector, type IntegrationResult, type IntegrationStatus } from './quadrature.ts';
import { spaceOf } from './spaces/space-of.ts';
import { splitPoints, type CoordinateSpace, type Domain } from './spaces/space.ts';
import { probeTrial } from './trial-probe.ts';

export interface LinearBasisProblem extends Pick<ProblemBase, 'space' | 'box' | 'angularMomentum' | 'mass' | 'massProfile' | 'potential' | 'display'> {
  basis: LinearBasis;
  /** Interior quadrature split points: kinks or steps of the potential and of the basis functions. */
  breakpoints: number[];
  /** How many of the lowest levels to return. */
  states: number;
}

export interface LinearBasisOptions {
  /** Overlap eigenvalues at or below this fraction of the largest (or below the errors of S) are dropped. */
  overlapThreshold?: number;
  /** A condition number of the unit-diagonal overlap matrix above this raises a warning. */
  conditionWarning?: number;
  /** A basis function counts as vanishing at a hard wall when |phi(wall)| is below this fraction of the basis's peak. */
  wallTolerance?: number;
  relTol?: number;
  maxIntervals?: number;
}

export const LINEAR_BASIS_DEFAULTS = {
  overlapThreshold: GENERALIZED_DEFAULTS.relativeThreshold,
  // Past 1e10 a matrix element good to 1e-14 may move a level in its fourth digit in the worst case.
  conditionWarning: 1e10,
  wallTolerance: WALL_TOLERANCE,
  relTol: EXPECTATION_DEFAULTS.relTol,
  maxIntervals: EXPECTATION_DEFAULTS.maxIntervals,
  // An unconverged matrix element whose error estimate exceeds this fraction of its absolute integral diverges.
  divergence: 1e-6,
} as const;

export interface LinearLevel {
  energy: number;
  /** First-order propagation of the matrix elements' quadrature errors: sum |c_i c_j| (dH_ij + |E| dS_ij). */
  errorEstimate: number;
  /** <T> and <V> of the level (radial: <T> includes the centrifugal term); they add up to the energy. */
  kinetic: number;
  potential: number;
  /** Coefficients of the basis functions, normalised to c^T S c = 1, largest normalised component positive. */
  coefficients: number[];
}

export type LinearBasisFailure = 'non-finite' | 'hard-wall' | 'integral-diverges' | 'zero-function' | 'eigen-solver';

export interface LinearBasisResult {
  /** The lowest min(states, kept) levels, ascending; empty on failure. */
  levels: LinearLevel[];
  failure: LinearBasisFailure | null;
  failureDetail: string | null;
  /** Poor conditioning, dropped directions, fewer levels than asked for, a quadrature that stopped short. */
  warning: string | null;
  /** The stages below are null when the solve failed before reaching them. */
  overlap: {
    /** Largest over smallest eigenvalue of S scaled to unit diagonal; Infinity when S is singular to rounding. */
    conditionNumber: number;
    /** The same over the kept directions only: always finite once a direction is kept. */
    keptConditionNumber: number;
    dropped: number;
    kept: number;
    /** The conditioning in one phrase, for panels, tables and check details. */
    summary: string;
    /** Eigenvalues of the unit-diagonal S at or below this were dropped: overlapThreshold * largest or the noise floor. */
    cutoff: number;
    /** How far the quadrature errors of S can move those eigenvalues (Weyl bound). */
    noiseFloor: number;
    /** Eigenvalues of the unit-diagonal S, ascending. */
    eigenvalues: number[];
  } | null;
  /** Overlap S_ij, and H_ij = (1/2m) <phi_i'|phi_j'> (+ centrifugal) + <phi_i|V|phi_j>. */
  matrices: { overlap: number[][]; hamiltonian: number[][] } | null;
  quadrature: {
    status: IntegrationStatus;
    message: string | null;
    /** Largest error estimate over the elements of S and of H (null when the integrals did not converge). */
    overlapError: number | null;
    hamiltonianError: number | null;
    intervals: number;
  } | null;
  eigen: { sweeps: number; converged: boolean } | null;
  /** Where the basis lives (from the probe of sqrt(sum phi_i^2)) and the quadrature split points used. */
  center: number;
  scale: number;
  splits: number[];
  /** Points at which every basis function (and at quadrature points V) was evaluated, probe included. */
  evaluations: number;
}

interface Settings {
  overlapThreshold: number;
  conditionWarning: number;
  wallTolerance: number;
  relTol: number;
  maxIntervals: number;
}

function settingsOf(options: LinearBasisOptions): Settings {
  return {
    overlapThreshold: options.overlapThreshold ?? LINEAR_BASIS_DEFAULTS.overlapThreshold,
    conditionWarning: options.conditionWarning ?? LINEAR_BASIS_DEFAULTS.conditionWarning,
    wallTolerance: options.wallTolerance ?? LINEAR_BASIS_DEFAULTS.wallTolerance,
    relTol: options.relTol ?? LINEAR_BASIS_DEFAULTS.relTol,
    maxIntervals: options.maxIntervals ?? LINEAR_BASIS_DEFAULTS.maxIntervals,
  };
}

function validate(problem: LinearBasisProblem): void {
  const { basis, states, mass, angularMomentum } = problem;
  if (basis.functions.length === 0) throw new RangeError('solveLinearBasis: the basis is empty');
  if (!Number.isInteger(states) || states < 1) throw new RangeError(`solveLinearBasis: states must be a positive integer, got ${states}`);
  if (!problem.massProfile && (!(mass > 0) || !Number.isFinite(mass))) throw new RangeError(`solveLinearBasis: mass must be positive and finite, got ${mass}`);
  if (!Number.isInteger(angularMomentum) || (angularMomentum < 0 && problem.space !== 'plane')) {
    throw new RangeError(`solveLinearBasis: angularMomentum must be a non-negative integer, got ${angularMomentum}`);
  }
}

const square = (n: number) => Array.from({ length: n }, () => new Array<number>(n).fill(0));

/**
 * Lowest levels of H = p^2/(2m) + V (hbar = 1) in the span of the basis: S and H by one adaptive vector
 * Gauss–Kronrod quadrature (kinetic part in the symmetric form (1/2m) <phi_i'|phi_j'>, which needs no second
 * derivative and is exact for functions vanishing at the walls), then H c = E S c by canonical
 * orthogonalisation (Löwdin 1956). By the Hylleraas–Undheim–MacDonald theorem the k-th level is an upper
 * bound to the k-th exact level and does not rise when a function is added.
 */
export function solveLinearBasis(
  problem: LinearBasisProblem,
  parameters: ArrayLike<number> = [],
  options: LinearBasisOptions = {},
): LinearBasisResult {
  validate(problem);
  const settings = settingsOf(options);
  const { basis, potential, mass } = problem;
  if (parameters.length > 0) {
    if (!basis.setParameters) throw new RangeError('solveLinearBasis: parameters were given but the basis has no setParameters');
    basis.setParameters(parameters);
  }
  const domain = spaceOf(problem);
  const functions = basis.functions;
  const n = functions.length;
  const envelope = (x: number) => {
    let sum = 0;
    for (const f of functions) sum += f.value(x) ** 2;
    return Math.sqrt(sum);
  };
  const probe = probeTrial(envelope, domain);
  const centre = Number.isFinite(domain.lo) ? [] : [probe.center];
  const splits = splitPoints(domain, [...problem.breakpoints, ...centre]);
  const empty = emptyResult(probe.center, probe.scale, splits, probe.evaluations);
  const failed = (failure: LinearBasisFailure, detail: string, extra: Partial<LinearBasisResult> = {}): LinearBasisResult =>
    ({ ...empty, ...extra, failure, failureDetail: detail });

  if (probe.nonFiniteAt !== null) {
    const x = probe.nonFiniteAt;
    const index = functions.findIndex((f) => !Number.isFinite(f.value(x)));
    return failed('non-finite', `basis[${index}] is not a finite number at ${(problem.display ?? ATOMIC_DISPLAY).length(x)} (a function that overflows far out is not square-integrable)`);
  }
  const wall = wallViolation(functions, domain, probe.peakAmplitude, settings.wallTolerance, problem.display ?? ATOMIC_DISPLAY);
  if (wall) return failed('hard-wall', wall);

  const context: QuadratureContext = {
    potential, inverseMass: problem.massProfile ? inverseOf(problem.massProfile.value) : null, space: domain,
    splits, scale: probe.scale, relTol: settings.relTol, maxIntervals: settings.maxIntervals,
  };
  const integrals = integrateMatrixElements(functions, context);
  let evaluations = probe.evaluations + integrals.evaluations;
  const quadrature = { status: integrals.status, message: integrals.message, intervals: integrals.intervals, overlapError: null, hamiltonianError: null };
  if (integrals.status === 'non-finite') {
    return failed('non-finite', integrals.message ?? 'an integrand is not a finite number', { evaluations, quadrature });
  }
  if (outOfBounds(integrals) !== null) {
    const diagnosis = diagnoseDivergence(functions, context, integrals);
    evaluations += diagnosis.evaluations;
    return failed('integral-diverges', diagnosis.detail, { evaluations, quadrature });
  }
  const pairs = (n * (n + 1)) / 2;
  const { values: val, errorEstimates: err } = integrals;
  // With a position-dependent mass, 1/m(x) sits inside the kinetic integrals already.
  const twoMass = problem.massProfile ? 2 : 2 * mass;
  const s = square(n);
  const k = square(n);
  const vm = square(n);
  const h = square(n);
  const sError = square(n);
  const hError = square(n);
  let index = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      s[i][j] = s[j][i] = val[index];
      k[i][j] = k[j][i] = val[pairs + index] / twoMass;
      vm[i][j] = vm[j][i] = val[2 * pairs + index];
      h[i][j] = h[j][i] = k[i][j] + vm[i][j];
      sError[i][j] = sError[j][i] = err[index];
      hError[i][j] = hError[j][i] = err[pairs + index] / twoMass + err[2 * pairs + index];
      index++;
    }
  }
  const matrices = { overlap: s, hamiltonian: h };
  const quadratureReport = {
    ...quadrature,
    overlapError: Math.max(...sError.flat()),
    hamiltonianError: Math.max(...hError.flat()),
  };
  const zero = s.findIndex((row, i) => !(row[i] > 0));
  if (zero >= 0) return failed('zero-function', `basis[${zero}] is zero everywhere (its norm integral is ${s[zero][zero]})`, { evaluations, matrices, quadrature: quadratureReport });

  const eigen = solveGeneralized(h.flat(), s.flat(), n, settings.overlapThreshold, sError.flat());
  const overlapReport = {
    conditionNumber: eigen.conditionNumber,
    keptConditionNumber: eigen.keptConditionNumber,
    dropped: eigen.dropped,
    kept: n - eigen.dropped,
    summary: describeConditioning(eigen.conditionNumber, eigen.keptConditionNumber, eigen.dropped, n),
    cutoff: eigen.cutoff,
    noiseFloor: eigen.noiseFloor,
    eigenvalues: Array.from(eigen.overlapEigenvalues),
  };
  const common = { evaluations, matrices, quadrature: quadratureReport, overlap: overlapReport, eigen: { sweeps: eigen.sweeps, converged: eigen.converged } };
  if (!eigen.converged) return failed('eigen-solver', eigen.message ?? 'the eigen-solver failed', common);

  const count = Math.min(problem.states, eigen.values.length);
  const levels: LinearLevel[] = [];
  for (let level = 0; level < count; level++) {
    const c = eigen.vectors[level];
    const energy = eigen.values[level];
    levels.push({
      energy,
      errorEstimate: quadraticForm(c, hError, true) + Math.abs(energy) * quadraticForm(c, sError, true),
      kinetic: quadraticForm(c, k),
      potential: quadraticForm(c, vm),
      coefficients: Array.from(c),
    });
  }
  const warnings: string[] = [];
  if (!Number.isFinite(eigen.conditionNumber)) {
    warnings.push('the overlap matrix is numerically singular (its smallest eigenvalue is zero to rounding): some basis functions are linear combinations of the others');
  } else if (eigen.conditionNumber > settings.conditionWarning) {
    warnings.push(`the overlap matrix is poorly conditioned (condition number ${eigen.conditionNumber.toPrecision(3)} above ${settings.conditionWarning.toPrecision(3)}): the basis is nearly linearly dependent`);
  }
  if (eigen.dropped > 0) {
    warnings.push(`${eigen.dropped} of ${n} overlap eigenvectors dropped (eigenvalue at or below ${eigen.cutoff.toPrecision(3)} on the unit-diagonal scale, which the basis cannot resolve)`);
  }
  if (count < problem.states) warnings.push(`${problem.states} states asked for, but the basis spans only ${count} independent functions`);
  if (!integrals.converged) warnings.push(`quadrature stopped short (${integrals.message}); its error estimates are included in each level's`);
  return { ...empty, ...common, levels, warning: warnings.length > 0 ? warnings.join('; ') : null };
}

const inverseOf = (mass: (x: number) => number) => (x: number) => 1 / mass(x);

/**
 * The overlap matrix's conditioning in words: its condition number when finite, else "numerically singular", and
 * with dropped directions the condition number of the kept ones, which is what the levels were solved with.
 */
export function describeConditioning(conditionNumber: number, keptConditionNumber: number, dropped: number, functions: number): string {
  const g = (value: number) => value.toPrecision(3);
  const whole = Number.isFinite(conditionNumber) ? `condition number ${g(conditionNumber)}` : 'numerically singular';
  if (dropped === 0) return whole;
  const directions = `${dropped} of ${functions} direction${functions > 1 ? 's' : ''} dropped as near-dependent`;
  return `${whole}: ${directions}; condition number ${g(keptConditionNumber)} over the ${functions - dropped} kept`;
}

/** sum_ij c_i c_j M_ij, or when `absolute` sum_ij |c_i c_j M_ij|. */
function quadraticForm(c: Float64Array, m: number[][], absolute = false): number {
  let sum = 0;
  for (let i = 0; i < c.length; i++) {
    for (let j = 0; j < c.length; j++) {
      const term = c[i] * c[j] * m[i][j];
      sum += absolute ? Math.abs(term) : term;
    }
  }
  return sum;
}

function wallViolation(functions: BasisFunction[], domain: Domain, peak: number, tolerance: number, show: ValueDisplay): string | null {
  for (const wall of domain.walls) {
    for (let i = 0; i < functions.length; i++) {
      const phi = functions[i].value(wall);
      const ratio = Math.abs(phi) / peak;
      if (!(ratio <= tolerance)) {
        return `basis[${i}] is ${phi.toPrecision(4)} at the wall ${show.length(wall)} (${ratio.toPrecision(3)} of the basis's peak; every function must vanish there)`;
      }
    }
  }
  return null;
}

interface QuadratureContext {
  potential: (x: number) => number;
  /** 1/m(x) for a position-dependent mass (BenDaniel–Duke kinetic density phi_i' phi_j' / m), null for a constant one. */
  inverseMass: ((x: number) => number) | null;
  space: CoordinateSpace;
  splits: number[];
  scale: number;
  relTol: number;
  maxIntervals: number;
}

/**
 * One vector quadrature for every pair i <= j: components are S_ij, then <phi_i'|phi_j'> (with the space's weight, plus
 * its centrifugal part times phi_i phi_j), then <phi_i|V|phi_j>, each block in the order (0,0), (0,1), ..., (1,1), ...
 */
function integrateMatrixElements(functions: BasisFunction[], context: QuadratureContext): IntegrationResult {
  const n = functions.length;
  const pairs = (n * (n + 1)) / 2;
  const values = new Float64Array(n);
  const slopes = new Float64Array(n);
  const { potential, inverseMass, space } = context;
  const integrand = (x: number, out: Float64Array) => {
    for (let i = 0; i < n; i++) {
      values[i] = functions[i].value(x);
      slopes[i] = functions[i].d1(x);
    }
    const w = space.weight(x);
    const centrifugal = space.centrifugal(x);
    const v = potential(x);
    const overMass = inverseMass ? inverseMass(x) : 1;
    let k = 0;
    for (let i = 0; i < n; i++) {
      for (let j = i; j < n; j++) {
        const product = values[i] * values[j];
        out[k] = w * product;
        out[pairs + k] = inverseMass ? (w * slopes[i] * slopes[j] + centrifugal * product) * overMass : w * slopes[i] * slopes[j] + centrifugal * product;
        // Far out the functions underflow to 0 where V may overflow (a Morse wall): the product is 0, not NaN.
        out[2 * pairs + k] = product === 0 ? 0 : w * v * product;
        k++;
      }
    }
  };
  return integrateVector(integrand, 3 * pairs, {
    breakpoints: context.splits, scale: context.scale, relTol: context.relTol, maxIntervals: context.maxIntervals,
  });
}

/** The first component (norms before kinetic before potential integrals) whose error estimate is out of bounds. */
function outOfBounds(result: IntegrationResult): number | null {
  if (result.converged) return null;
  const k = result.errorEstimates.findIndex((error, i) =>
    !Number.isFinite(result.values[i]) || error > LINEAR_BASIS_DEFAULTS.divergence * Math.abs(result.absValues[i]));
  return k >= 0 ? k : null;
}

const INTEGRAL_NAMES = ['norm integral', 'kinetic integral', 'potential integral'];

/**
 * Which function is at fault when the matrix does not converge: a divergent pair integral implies a divergent
 * diagonal one, and a function integrated alone gets the whole interval budget, so each is retried by itself.
 */
function diagnoseDivergence(functions: BasisFunction[], context: QuadratureContext, all: IntegrationResult): { detail: string; evaluations: number } {
  let evaluations = 0;
  for (let i = 0; i < functions.length; i++) {
    const alone = integrateMatrixElements([functions[i]], context);
    evaluations += alone.evaluations;
    const part = outOfBounds(alone);
    if (part !== null) {
      return {
        detail: `the ${INTEGRAL_NAMES[part]} of basis[${i}] does not converge (estimate ${alone.values[part].toPrecision(6)} +/- ${alone.errorEstimates[part].toPrecision(2)}): the function is not square-integrable or its energy is infinite`,
        evaluations,
      };
    }
  }
  return { detail: `the matrix elements do not converge together (${all.message}); each function's own integrals do`, evaluations };
}

function emptyResult(center: number, scale: number, splits: number[], evaluations: number): LinearBasisResult {
  return {
    levels: [],
    failure: null,
    failureDetail: null,
    warning: null,
    overlap: null,
    matrices: null,
    quadrature: null,
    eigen: null,
    center,
    scale,
    splits,
    evaluations,
  };
}

export interface LinearBasisOptimum {
  parameters: number[];
  /** The solution at the optimum. */
  solution: LinearBasisResult;
  optimiser: MinimizeResult;
  /** Solves made by the search, the final one included, and the points they evaluated the basis at. */
  solves: number;
  evaluations: number;
}

/**
 * The basis's shared nonlinear parameters that minimise the lowest level, by minimizeBounded (Brent for one
 * parameter, Nelder–Mead for more); a parameter point where the solve fails counts as +Infinity. The
 * lowest level stays an upper bound at every point, so the minimum is the best bound the family gives.
 */
export function optimiseLinearBasis(
  problem: LinearBasisProblem,
  parameters: ParameterSpec[],
  options: LinearBasisOptions & { minimize?: MinimizeOptions } = {},
): LinearBasisOptimum {
  let solves = 0;
  let evaluations = 0;
  const solve = (p: ArrayLike<number>) => {
    const result = solveLinearBasis(problem, p, options);
    solves++;
    evaluations += result.evaluations;
    return result;
  };
  const optimiser = minimizeBounded((p) => {
    const result = solve(p);
    return result.failure === null && result.levels.length > 0 ? result.levels[0].energy : Infinity;
  }, parameters, options.minimize);
  const best = Array.from(optimiser.x);
  const solution = solve(best);
  return { parameters: best, solution, optimiser, solves, evaluations };
}
