// Bounded minimisation of a variational energy over a few trial-function parameters.
// The energy comes from quadrature good to ~1e-12 relative, so the search stops where f can no
// longer tell points apart, and a Newton polish then uses finite differences with steps large
// enough that quadrature noise does not swamp them.

export interface ParameterRange {
  start: number;
  min: number;
  max: number;
}

export interface MinimizeOptions {
  xTol?: number;
  fTol?: number;
  /** Relative spread at which Nelder–Mead hands over to the Newton polish (n >= 2); at most fTol makes the simplex go all the way. */
  searchFTol?: number;
  maxEvaluations?: number;
  /**
   * The start is known to lie in the lowest basin (a warm start from the optimum of a nearby problem): the local
   * search alone, without the multistart that guards an author's start.
   */
  local?: boolean;
}

export interface MinimizeResult {
  x: Float64Array;
  value: number;
  evaluations: number;
  iterations: number;
  polishSteps: number;          // accepted Newton steps
  resumed: boolean;              // the polish could not certify the coarse search's point, so the simplex went on to fTol
  starts: number;                // local searches run: 1, or 2 when a quasi-random point far from the first optimum started a second
  converged: boolean;            // the search met its tolerances and the curvature is available
  method: 'brent' | 'nelder-mead';
  activeLimits: Array<'min' | 'max' | null>;
  hessian: number[][];
  gradient: number[];
  rejectedEvaluations: number;  // calls that returned NaN, -Infinity or +Infinity, all treated as +Infinity
  message: string | null;
}

export const DEFAULTS = {
  // Absolute part of the parameter tolerance, as a fraction of each parameter's range.
  xTol: 1e-10,
  // Relative resolution of f. Near a minimum f - f* ~ (dx)^2, so parameters are sought to
  // sqrt(fTol) relative: finer than that the search would be steering by noise.
  fTol: 1e-12,
  // Cap on the search (Brent or Nelder–Mead with restarts). Its last iteration may overshoot by
  // n + 1; the bound snap, the curvature and the polish add at most 1 + 2n^2 + polishIterations (2n^2 + 1)
  // (2n more per curvature, 2n^2 + 2n in all, after a coarse simplex, whose polish may start just below the cap).
  maxEvaluations: 10000,
  // Finite-difference step relative to the parameter's scale: about fTol^(1/4), which balances
  // truncation error against noise in a second difference.
  differenceStep: 1e-3,
  // A parameter's scale is |x|, but never below this fraction of its range, so a parameter
  // near zero still gets a usable step.
  scaleFloor: 1e-2,
  // Initial Nelder–Mead simplex edge, relative to each parameter's size, but never below
  // simplexFloor of its range: a parameter started at zero still gets an edge that can find its scale.
  simplexStep: 0.1,
  simplexFloor: 0.05,
  // Nelder–Mead first runs only until its simplex spread in f is below this (relative): from there
  // the Newton polish converges in a step or two, where the simplex would need dozens of evaluations
  // to shrink by the remaining factor. Where the polish cannot certify a minimum, Nelder–Mead resumes
  // down to fTol.
  searchFTol: 1e-7,
  // Restarts from the best vertex catch a simplex that has collapsed without reaching a minimum.
  restarts: 3,
  // Quasi-random points tried after the first local search of several parameters, to find a lower basin;
  // only points at least this far (fraction of a range) from the first optimum along some parameter count.
  multistartPoints: 12,
  multistartSeparation: 0.1,
  // The second search only has to tell whether its basin is lower, within a small budget; it is finished
  // properly only if so.
  scoutFTol: 1e-5,
  scoutEvaluations: 30,
  polishIterations: 8,
  // A parameter this close to a bound (fraction of its range) is tried exactly at the bound.
  snapFraction: 1e-4,
  // A parameter this close to a bound (fraction of its range) counts as on it.
  activeFraction: 1e-12,
} as const;

// Standard Nelder–Mead coefficients: reflection, expansion, contraction, shrink.
const REFLECT = 1;
const EXPAND = 2;
const CONTRACT = 0.5;
const SHRINK = 0.5;
const GOLDEN = (3 - Math.sqrt(5)) / 2;

interface Settings {
  xTol: number;
  fTol: number;
  searchFTol: number;
  maxEvaluations: number;
}

// Counts calls and maps anything that is not a finite number to +Infinity ("cannot evaluate").
class Objective {
  evaluations = 0;
  rejected = 0;
  constructor(private readonly f: (x: Float64Array) => number, private readonly limit: number) {}
  get exhausted(): boolean {
    return this.evaluations >= this.limit;
  }
  /** The same function with a budget of its own, for a search that may give up early; counted back by `absorb`. */
  limited(evaluations: number): Objective {
    return new Objective(this.f, evaluations);
  }
  absorb(child: Objective): void {
    this.evaluations += child.evaluations;
    this.rejected += child.rejected;
  }
  at(x: ArrayLike<number>): number {
    this.evaluations++;
    const value = this.f(Float64Array.from(x));
    if (Number.isFinite(value)) return value;
    this.rejected++;
    return Infinity;
  }
}

interface SearchOutcome {
  x: Float64Array;
  value: number;
  iterations: number;
  converged: boolean;
  message: string | null;
}

function scaleOf(value: number, range: ParameterRange): number {
  const width = range.max - range.min;
  return Math.min(width, Math.max(Math.abs(value), DEFAULTS.scaleFloor * width));
}

/** Brent's localmin: golden section with parabolic interpolation (Brent, Algorithms for Minimization without Derivatives, 1973, ch. 5), started at range.start. */
function brent(objective: Objective, range: ParameterRange, settings: Settings): SearchOutcome {
  // Brent requires the relative tolerance to be at least sqrt(machine epsilon).
  const relative = Math.max(Math.sqrt(settings.fTol), Math.sqrt(Number.EPSILON));
  const absolute = settings.xTol * (range.max - range.min);
  let a = range.min;
  let b = range.max;
  let x = range.start;
  let w = x;
  let v = x;
  let fx = objective.at([x]);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let iterations = 0;
  for (;;) {
    const middle = 0.5 * (a + b);
    const tol = relative * Math.abs(x) + absolute / 3;
    const tol2 = 2 * tol;
    if (Math.abs(x - middle) <= tol2 - 0.5 * (b - a)) {
      return { x: Float64Array.of(x), value: fx, iterations, converged: true, message: null };
    }
    if (objective.exhausted) {
      return {
        x: Float64Array.of(x), value: fx, iterations, converged: false,
        message: `evaluation limit ${objective.evaluations} reached with the bracket [${a}, ${b}] still wider than the tolerance`,
      };
    }
    iterations++;
    let p = 0;
    let q = 0;
    let r = 0;
    if (Math.abs(e) > tol) {
      r = (x - w) * (fx - fv);
      q = (x - v) * (fx - fw);
      p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
    }
    // Infinite values make p and q NaN; every comparison then fails and a golden step is taken.
    if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
      d = p / q;
      const u = x + d;
      if (u - a < tol2 || b - u < tol2) d = x < middle ? tol : -tol;
    } else {
      e = (x < middle ? b : a) - x;
      d = GOLDEN * e;
    }
    const u = x + (Math.abs(d) >= tol ? d : d > 0 ? tol : -tol);
    const fu = objective.at([u]);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w; fv = fw;
      w = x; fw = fx;
      x = u; fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w; fv = fw;
        w = u; fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u; fv = fu;
      }
    }
  }
}

function clampInto(point: Float64Array, ranges: ParameterRange[]): Float64Array {
  for (let i = 0; i < point.length; i++) point[i] = Math.min(ranges[i].max, Math.max(ranges[i].min, point[i]));
  return point;
}

/** Nelder–Mead simplex search (Nelder & Mead, Comput. J. 7, 308, 1965) in the ordering of Lagarias, Reeds, Wright & Wright, SIAM J. Optim. 9, 112 (1998), with trial points clamped into the box. */
function nelderMeadRun(
  objective: Objective,
  ranges: ParameterRange[],
  settings: Settings,
  start: Float64Array,
  startValue: number,
): SearchOutcome {
  const n = ranges.length;
  const vertices: Float64Array[] = [start];
  const values: number[] = [startValue];
  for (let i = 0; i < n; i++) {
    const vertex = Float64Array.from(start);
    const width = ranges[i].max - ranges[i].min;
    const step = DEFAULTS.simplexStep * Math.min(width, Math.max(Math.abs(start[i]), DEFAULTS.simplexFloor * width));
    // Step away from the nearer bound so that clamping cannot flatten the simplex at the outset.
    const upward = ranges[i].max - start[i] >= start[i] - ranges[i].min;
    vertex[i] += upward ? step : -step;
    clampInto(vertex, ranges);
    vertices.push(vertex);
    values.push(objective.at(vertex));
  }
  const order = Array.from({ length: n + 1 }, (_, i) => i);
  const centroid = new Float64Array(n);
  const along = (from: Float64Array, to: Float64Array, factor: number): Float64Array => {
    const point = new Float64Array(n);
    for (let j = 0; j < n; j++) point[j] = from[j] + factor * (to[j] - from[j]);
    return clampInto(point, ranges);
  };
  let iterations = 0;
  for (;;) {
    order.sort((i, j) => values[i] - values[j] || i - j);
    const best = order[0];
    const worst = order[n];
    const secondWorst = order[n - 1];
    const spread = values[worst] - values[best];
    let diameter = 0;
    for (const index of order) {
      for (let j = 0; j < n; j++) {
        diameter = Math.max(diameter, Math.abs(vertices[index][j] - vertices[best][j]) / (ranges[j].max - ranges[j].min));
      }
    }
    const done = (converged: boolean, message: string | null): SearchOutcome => ({
      x: Float64Array.from(vertices[best]), value: values[best], iterations, converged, message,
    });
    if (Number.isFinite(values[best]) && (spread <= settings.fTol * Math.abs(values[best]) || diameter <= settings.xTol)) {
      return done(true, null);
    }
    if (diameter <= settings.xTol) {
      return done(false, 'the simplex shrank to a point without finding a finite value of f');
    }
    if (objective.exhausted) {
      return done(false, `evaluation limit ${objective.evaluations} reached with the simplex spread ${spread} in f and ${diameter} of the range in x`);
    }
    iterations++;
    centroid.fill(0);
    for (let k = 0; k < n; k++) {
      for (let j = 0; j < n; j++) centroid[j] += vertices[order[k]][j] / n;
    }
    const reflected = along(centroid, vertices[worst], -REFLECT);
    const fReflected = objective.at(reflected);
    let replacement: Float64Array | null = null;
    let fReplacement = Infinity;
    if (fReflected < values[best]) {
      const expanded = along(centroid, reflected, EXPAND);
      const fExpanded = objective.at(expanded);
      [replacement, fReplacement] = fExpanded < fReflected ? [expanded, fExpanded] : [reflected, fReflected];
    } else if (fReflected < values[secondWorst]) {
      [replacement, fReplacement] = [reflected, fReflected];
    } else if (fReflected < values[worst]) {
      const outside = along(centroid, reflected, CONTRACT);
      const fOutside = objective.at(outside);
      if (fOutside <= fReflected) [replacement, fReplacement] = [outside, fOutside];
    } else {
      const inside = along(centroid, vertices[worst], CONTRACT);
      const fInside = objective.at(inside);
      if (fInside < values[worst]) [replacement, fReplacement] = [inside, fInside];
    }
    if (replacement) {
      vertices[worst] = replacement;
      values[worst] = fReplacement;
    } else {
      for (const index of order.slice(1)) {
        vertices[index] = along(vertices[best], vertices[index], SHRINK);
        values[index] = objective.at(vertices[index]);
      }
    }
  }
}

/** Nelder–Mead restarted from its best vertex until a restart no longer improves f (O'Neill, Appl. Stat. 20, 338 (1971), algorithm AS 47). */
function nelderMead(objective: Objective, ranges: ParameterRange[], settings: Settings, start: Float64Array, startValue: number, restarts: number): SearchOutcome {
  let outcome = nelderMeadRun(objective, ranges, settings, start, startValue);
  let iterations = outcome.iterations;
  for (let restart = 0; restart < restarts && outcome.converged; restart++) {
    const next = nelderMeadRun(objective, ranges, settings, outcome.x, outcome.value);
    iterations += next.iterations;
    // A run keeps its starting vertex unless it finds better, so the restart never loses ground.
    const improvement = outcome.value - next.value;
    outcome = next;
    if (!(improvement > settings.fTol * Math.abs(next.value))) break;
  }
  return { ...outcome, iterations };
}

interface Derivatives {
  gradient: number[];
  hessian: number[][];
  finite: boolean;
}

/**
 * Central (one-sided at a bound) finite-difference gradient and Hessian (Nocedal & Wright, Numerical Optimization, 2006, §8.1);
 * with `fourthOrder`, the gradient from the five-point central stencil where it fits (Abramowitz & Stegun 25.3.6).
 */
function differentiate(objective: Objective, ranges: ParameterRange[], x: Float64Array, fx: number, fourthOrder = false): Derivatives {
  const n = x.length;
  // Each coordinate gets slope, first- and second-derivative stencils as (offset, weight) pairs;
  // one-sided ones keep every evaluation inside the box. The first-derivative stencils also make
  // the mixed second derivatives, so they stay at three points.
  const slope: Array<Array<[number, number]>> = [];
  const first: Array<Array<[number, number]>> = [];
  const second: Array<Array<[number, number]>> = [];
  for (let i = 0; i < n; i++) {
    const { min, max } = ranges[i];
    const h = Math.min(DEFAULTS.differenceStep * scaleOf(x[i], ranges[i]), (max - min) / 4);
    if (x[i] - h >= min && x[i] + h <= max) {
      first.push([[-h, -0.5 / h], [h, 0.5 / h]]);
      second.push([[-h, 1 / (h * h)], [0, -2 / (h * h)], [h, 1 / (h * h)]]);
    } else {
      const s = x[i] + 2 * h <= max ? h : -h;
      first.push([[0, -1.5 / s], [s, 2 / s], [2 * s, -0.5 / s]]);
      second.push([[0, 1 / (h * h)], [s, -2 / (h * h)], [2 * s, 1 / (h * h)]]);
    }
    const wide = x[i] - 2 * h >= min && x[i] + 2 * h <= max;
    slope.push(fourthOrder && wide ? [[-2 * h, 1 / (12 * h)], [-h, -8 / (12 * h)], [h, 8 / (12 * h)], [2 * h, -1 / (12 * h)]] : first[i]);
  }
  const cache = new Map<string, number>([['', fx]]);
  const at = (shifts: Array<[number, number]>): number => {
    const moved = shifts.filter(([, offset]) => offset !== 0);
    const key = moved.map(([i, offset]) => `${i}:${offset}`).join(',');
    const known = cache.get(key);
    if (known !== undefined) return known;
    const point = Float64Array.from(x);
    for (const [i, offset] of moved) point[i] += offset;
    const value = objective.at(point);
    cache.set(key, value);
    return value;
  };
  const gradient = slope.map((stencil, i) => stencil.reduce((sum, [offset, weight]) => sum + weight * at([[i, offset]]), 0));
  const hessian = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    hessian[i][i] = second[i].reduce((sum, [offset, weight]) => sum + weight * at([[i, offset]]), 0);
    for (let j = 0; j < i; j++) {
      let sum = 0;
      for (const [oi, wi] of first[i]) for (const [oj, wj] of first[j]) sum += wi * wj * at([[i, oi], [j, oj]]);
      hessian[i][j] = hessian[j][i] = sum;
    }
  }
  const finite = gradient.every(Number.isFinite) && hessian.every((row) => row.every(Number.isFinite));
  return { gradient, hessian, finite };
}

function activeLimitsOf(x: Float64Array, ranges: ParameterRange[], gradient: number[]): Array<'min' | 'max' | null> {
  return ranges.map((range, i) => {
    const near = DEFAULTS.activeFraction * (range.max - range.min);
    if (x[i] - range.min <= near && gradient[i] > 0) return 'min';
    if (range.max - x[i] <= near && gradient[i] < 0) return 'max';
    return null;
  });
}

/** Newton step on the free parameters by Cholesky factorisation (Golub & Van Loan, Matrix Computations, 1996, Alg. 4.2.1); null unless the free Hessian is positive definite. */
function newtonStep(derivatives: Derivatives, free: number[]): number[] | null {
  const m = free.length;
  const lower = Array.from({ length: m }, () => new Array<number>(m).fill(0));
  for (let i = 0; i < m; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = derivatives.hessian[free[i]][free[j]];
      for (let k = 0; k < j; k++) sum -= lower[i][k] * lower[j][k];
      if (i === j) {
        if (!(sum > 0)) return null;
        lower[i][i] = Math.sqrt(sum);
      } else {
        lower[i][j] = sum / lower[j][j];
      }
    }
  }
  const y = new Array<number>(m).fill(0);
  for (let i = 0; i < m; i++) {
    let sum = -derivatives.gradient[free[i]];
    for (let k = 0; k < i; k++) sum -= lower[i][k] * y[k];
    y[i] = sum / lower[i][i];
  }
  const step = new Array<number>(m).fill(0);
  for (let i = m - 1; i >= 0; i--) {
    let sum = y[i];
    for (let k = i + 1; k < m; k++) sum -= lower[k][i] * step[k];
    step[i] = sum / lower[i][i];
  }
  return step;
}

function validate(ranges: ParameterRange[], options: MinimizeOptions): Settings {
  if (ranges.length === 0) throw new RangeError('minimizeBounded: at least one parameter is needed');
  ranges.forEach((range, i) => {
    if (!Number.isFinite(range.min) || !Number.isFinite(range.max) || !(range.min < range.max)) {
      throw new RangeError(`minimizeBounded: parameter ${i} needs finite min < max`);
    }
    if (!(range.start >= range.min && range.start <= range.max)) {
      throw new RangeError(`minimizeBounded: parameter ${i} starts at ${range.start}, outside [${range.min}, ${range.max}]`);
    }
  });
  const settings = {
    xTol: options.xTol ?? DEFAULTS.xTol,
    fTol: options.fTol ?? DEFAULTS.fTol,
    searchFTol: options.searchFTol ?? DEFAULTS.searchFTol,
    maxEvaluations: options.maxEvaluations ?? DEFAULTS.maxEvaluations,
  };
  if (!(settings.xTol > 0) || !(settings.fTol > 0) || !(settings.searchFTol > 0) || !(settings.maxEvaluations >= 1)) {
    throw new RangeError('minimizeBounded: xTol, fTol and searchFTol must be positive and maxEvaluations at least 1');
  }
  return settings;
}

/** The polish certifies a minimum only if its last step lowered f by between 1/4 and 4 times what its model predicted. */
const MODEL_AGREEMENT = 4;

interface Polished {
  x: Float64Array;
  value: number;
  derivatives: Derivatives;
  steps: number;
  /**
   * A minimum to within the resolution of f: the next step would lower f by less than fTol (or every
   * parameter sits on a limit), and the last step taken bore out the quadratic model that says so.
   */
  certified: boolean;
}

/** Newton iteration with finite-difference derivatives on the free parameters (Nocedal & Wright, Numerical Optimization, 2006, §3.3 and §8.1), each step accepted only if it lowers f; tries the bounds first. */
function polish(objective: Objective, ranges: ParameterRange[], settings: Settings, start: Float64Array, startValue: number, fourthOrder = false): Polished {
  let x = start;
  let value = startValue;
  // The search approaches a bound only to within its tolerance; the bound itself is tried directly.
  const snapped = Float64Array.from(x, (xi, i) => {
    const { min, max } = ranges[i];
    const near = DEFAULTS.snapFraction * (max - min);
    return xi - min <= near ? min : max - xi <= near ? max : xi;
  });
  if (snapped.some((xi, i) => xi !== x[i])) {
    const fSnapped = objective.at(snapped);
    if (fSnapped < value) [x, value] = [snapped, fSnapped];
  }

  let derivatives = differentiate(objective, ranges, x, value, fourthOrder);
  let steps = 0;
  // Actual over predicted decrease of the last accepted step (Nocedal & Wright §4.1): far from 1,
  // the quadratic model at the finite-difference scale does not describe f, and cannot certify it.
  let agreement = 1;
  for (;;) {
    if (!derivatives.finite) return { x, value, derivatives, steps, certified: false };
    const active = activeLimitsOf(x, ranges, derivatives.gradient);
    const free = ranges.map((_, i) => i).filter((i) => active[i] === null);
    if (free.length === 0) return { x, value, derivatives, steps, certified: true };
    const step = newtonStep(derivatives, free);
    if (!step) return { x, value, derivatives, steps, certified: false };
    // Below the resolution of f (or of x, where f vanishes at the minimum) a "lower" value is noise,
    // so the polish stops there.
    const predictedDecrease = -0.5 * step.reduce((sum, s, k) => sum + s * derivatives.gradient[free[k]], 0);
    const negligible = step.every((s, k) => Math.abs(s) <= settings.xTol * (ranges[free[k]].max - ranges[free[k]].min));
    if (negligible || !(predictedDecrease > settings.fTol * Math.abs(value))) {
      const modelHolds = agreement >= 1 / MODEL_AGREEMENT && agreement <= MODEL_AGREEMENT;
      return { x, value, derivatives, steps, certified: modelHolds };
    }
    if (steps >= DEFAULTS.polishIterations) return { x, value, derivatives, steps, certified: false };
    const trial = Float64Array.from(x);
    free.forEach((i, k) => { trial[i] += step[k]; });
    clampInto(trial, ranges);
    const fTrial = objective.at(trial);
    if (!(fTrial < value)) return { x, value, derivatives, steps, certified: false };
    agreement = (value - fTrial) / predictedDecrease;
    [x, value] = [trial, fTrial];
    derivatives = differentiate(objective, ranges, x, value, fourthOrder);
    steps++;
  }
}

/**
 * Bounded minimisation: Brent's localmin (1973) for n = 1; for n >= 2 Nelder–Mead (1965) to a coarse
 * spread, resumed with restarts down to fTol only where the Newton polish cannot certify the point;
 * then the finite-difference curvature at the optimum.
 */
export function minimizeBounded(
  f: (x: Float64Array) => number,
  ranges: ParameterRange[],
  options: MinimizeOptions = {},
): MinimizeResult {
  const settings = validate(ranges, options);
  const objective = new Objective(f, settings.maxEvaluations);
  if (ranges.length === 1) {
    const search = brent(objective, ranges[0], settings);
    return finish(objective, ranges, 'brent', search, settings, false);
  }
  const start = Float64Array.from(ranges, (r) => r.start);
  const first = localNelderMead(objective, ranges, settings, start);
  if (!Number.isFinite(first.value) || objective.exhausted || options.local) return { ...first, starts: 1 };
  // Multistart (Rinnooy Kan & Timmer, Math. Program. 39, 27 (1987)): a local search from the author's start can stop in
  // a basin that is not the lowest. The best of a few quasi-random points away from the first optimum starts a coarse
  // second search; only if that ends lower is it polished and taken.
  const unit = (x: ArrayLike<number>) => Array.from(x, (v, d) => toUnit(v, ranges[d]));
  const home = unit(first.x);
  let seed: { x: Float64Array; value: number } | null = null;
  for (const x of haltonPoints(ranges, DEFAULTS.multistartPoints)) {
    if (objective.exhausted) break;
    const away = unit(x).some((u, d) => Math.abs(u - home[d]) > DEFAULTS.multistartSeparation);
    if (!away) continue;
    const value = objective.at(x);
    if (value < (seed?.value ?? Infinity)) seed = { x, value };
  }
  if (!seed || !Number.isFinite(seed.value) || objective.exhausted) return { ...first, evaluations: objective.evaluations, starts: 1 };
  const budget = objective.limited(DEFAULTS.scoutEvaluations);
  const scout = nelderMead(budget, ranges, { ...settings, fTol: DEFAULTS.scoutFTol }, seed.x, seed.value, 0);
  objective.absorb(budget);
  const margin = 10 * settings.fTol * Math.max(1, Math.abs(first.value));
  if (!(scout.value < first.value - margin) || objective.exhausted) return { ...first, evaluations: objective.evaluations, starts: 2 };
  // The scout is near its basin's bottom already: Newton's polish usually certifies it without more simplex work.
  const polished = polish(objective, ranges, settings, scout.x, scout.value, true);
  // A certified polish shows the minimum to fTol, whether or not the scout used up its budget on the way.
  const second = polished.certified
    ? result(objective, ranges, 'nelder-mead', { ...scout, converged: true, message: null }, polished, false)
    : localNelderMead(objective, ranges, settings, polished.x);
  const best = second.value < first.value ? second : first;
  return { ...best, evaluations: objective.evaluations, iterations: first.iterations + scout.iterations + second.iterations, starts: 2 };
}

/** A parameter's place in its range on [0, 1]: logarithmic along a positive range of two decades or more. */
function toUnit(value: number, range: ParameterRange): number {
  return logScaled(range) ? Math.log(value / range.min) / Math.log(range.max / range.min) : (value - range.min) / (range.max - range.min);
}

function logScaled(range: ParameterRange): boolean {
  return range.min > 0 && range.max / range.min >= 100;
}

/** Nelder–Mead to the coarse tolerance, Newton's polish, and the full simplex again when the polish cannot certify. */
function localNelderMead(objective: Objective, ranges: ParameterRange[], settings: Settings, start: Float64Array): MinimizeResult {
  const method = 'nelder-mead';
  const coarse = settings.searchFTol > settings.fTol;
  let search = nelderMead(objective, ranges, coarse ? { ...settings, fTol: settings.searchFTol } : settings, start, objective.at(start), coarse ? 0 : DEFAULTS.restarts);
  let resumed = false;
  if (coarse && search.converged && Number.isFinite(search.value) && !objective.exhausted) {
    // Newton's end point is off the minimum by the gradient's error over the curvature, which a
    // flat valley magnifies; the five-point gradient keeps that below the resolution of f.
    const first = polish(objective, ranges, settings, search.x, search.value, true);
    if (first.certified) return result(objective, ranges, method, search, first, false);
    if (objective.exhausted) {
      const message = `evaluation limit ${objective.evaluations} reached before the point of the coarse search could be polished to a certified minimum`;
      return result(objective, ranges, method, { ...search, converged: false, message }, first, false);
    }
    const iterations = search.iterations;
    search = nelderMead(objective, ranges, settings, first.x, first.value, DEFAULTS.restarts);
    search = { ...search, iterations: iterations + search.iterations };
    resumed = true;
  }
  return finish(objective, ranges, method, search, settings, resumed);
}

/** The search's end point polished and measured, or reported as unusable when f was never finite. */
function finish(objective: Objective, ranges: ParameterRange[], method: MinimizeResult['method'], search: SearchOutcome, settings: Settings, resumed: boolean): MinimizeResult {
  if (!Number.isFinite(search.value)) {
    const unknown = () => ranges.map(() => NaN);
    const derivatives = { gradient: unknown(), hessian: ranges.map(unknown), finite: false };
    return result(objective, ranges, method, { ...search, message: search.message ?? 'f was not finite at any point tried' }, { x: search.x, value: search.value, derivatives, steps: 0, certified: false }, resumed);
  }
  return result(objective, ranges, method, search, polish(objective, ranges, settings, search.x, search.value), resumed);
}

/**
 * Halton points (bases 2, 3, 5, ...; Halton, Numer. Math. 2, 84 (1960)) over the box, on a log scale along a
 * positive range spanning two decades or more, where a width or rate parameter's basins are spread.
 */
function haltonPoints(ranges: ParameterRange[], count: number): Float64Array[] {
  const primes = [2, 3, 5, 7, 11, 13, 17, 19, 23, 29, 31, 37];
  const radical = (k: number, base: number) => {
    let value = 0;
    for (let f = 1 / base; k > 0; k = Math.floor(k / base), f /= base) value += f * (k % base);
    return value;
  };
  return Array.from({ length: count }, (_, k) =>
    Float64Array.from(ranges, (r, d) => {
      const u = radical(k + 1, primes[d % primes.length]);
      return logScaled(r) ? r.min * (r.max / r.min) ** u : r.min + u * (r.max - r.min);
    }),
  );
}

function result(objective: Objective, ranges: ParameterRange[], method: MinimizeResult['method'], search: SearchOutcome, polished: Polished, resumed: boolean): MinimizeResult {
  const { x, value, derivatives } = polished;
  const message = derivatives.finite ? null : 'f is not finite within a finite-difference step of the optimum, so the curvature is unavailable';
  return {
    x, value, evaluations: objective.evaluations, iterations: search.iterations, polishSteps: polished.steps, resumed, starts: 1,
    converged: search.converged && message === null, method,
    activeLimits: activeLimitsOf(x, ranges, derivatives.gradient),
    hessian: derivatives.hessian, gradient: derivatives.gradient, rejectedEvaluations: objective.rejected,
    message: search.message ?? message,
  };
}
