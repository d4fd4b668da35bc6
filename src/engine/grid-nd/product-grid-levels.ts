/**
 * Independent grid reference in 2 and 3 dimensions: the lowest levels of H = sum_k p_k^2/(2 m_k) + V on a product of
 * FE-DVR axes (Cartesian line / half-line / interval axes, or the cylinder radius rho with magnetic number m), solved
 * matrix-free by LOBPCG and refined in order, grading and domain until the levels settle.
 */
import { buildAxis, type AxisDvr, type AxisKind } from './axis-dvr.ts';
import { axisElements, tailCount, type AxisLayout } from './axis-mesh.ts';
import { transferValues } from './grid-transfer.ts';
import { lobpcg } from './lobpcg.ts';
import { productOperator } from './product-hamiltonian.ts';

export interface GridAxis {
  name: string;
  kind: AxisKind;
  /** Walls of an 'interval' axis. */
  lo?: number;
  hi?: number;
  mass: number;
  /** Element edges that must exist: nuclei on the axis (graded toward) and kinks or steps of V. */
  breakpoints: number[];
  hint?: { center: number; width: number };
}

export interface ProductGridProblem {
  axes: GridAxis[];
  /** V at a point, coordinates in the order of `axes`; the buffer is reused, so copy it to keep it. */
  potential: (point: Float64Array) => number;
  /** Magnetic quantum number m, with a 'rho' axis: adds m^2 / (2 M rho^2). */
  angularMomentum?: number;
  levels?: number;
  relTol?: number;
  maxPoints?: number;
}

export interface ProductGridAxis {
  name: string;
  nodes: Float64Array;
  /** Quadrature weights; on a 'rho' axis they include 2 pi rho, so sum w psi^2 is the norm over the whole space. */
  weights: Float64Array;
  domain: [number, number];
  elements: number;
  order: number;
}

export interface ProductGridLevels {
  levels: number[];
  errorEstimate: number[];
  converged: boolean;
  message: string | null;
  /** Number of grids solved. */
  refinements: number;
  size: number;
  shape: number[];
  axes: ProductGridAxis[];
  /** Wave-function values at the grid points (row-major, last axis fastest), normalised: sum W psi^2 = 1. */
  states: Float64Array[];
  /** LOBPCG residual norms ||H psi - E psi|| of the reported levels on the final grid. */
  residuals: number[];
  eigenIterations: number;
  potentialEvaluations: number;
  threshold: number;
}

export const PRODUCT_GRID_DEFAULTS = { levels: 2, relTol: 1e-9, maxPoints: 250000 };

/** Extra block vectors beyond the wanted levels, so that degenerate or near-degenerate levels converge together. */
const guardVectors = 2;
const maxEigenIterations = 400;
const startOrder = 8;
const maxOrder = 16;
const startLayers = 5;
const maxLayers = 8;
/** Initial reach of the open tails beyond the core, in widths of the state. */
const startReach = 4;
const gradedReach = 6;
const tailStep = 1;
const maxSizingRounds = 8;
const maxConfirmRounds = 3;

interface Context {
  problem: ProductGridProblem;
  m: number;
  wanted: number;
  relTol: number;
  maxPoints: number;
  threshold: number;
  counters: { grids: number; eigenIterations: number; evaluations: number };
}

interface Plan {
  layouts: AxisLayout[];
  /** Core element size of each axis. */
  h: number[];
  /** Where the ground state is centred, for the 1-D cuts of V that the preconditioner uses. */
  center: number[];
}

interface Solution {
  plan: Plan;
  resolution: number;
  axes: AxisDvr[];
  weights: Float64Array;
  /** All block eigenvalues (guards included), ascending. */
  values: number[];
  /** Node values of every block vector. */
  states: Float64Array[];
  residuals: number[];
  eigenConverged: boolean;
  kinetic: number;
}

type Outcome<T> = { ok: true; value: T } | { ok: false; message: string; tooLarge?: boolean };

function resolutionOf(r: number): { order: number; layers: number; shrink: number } {
  const steps = (maxOrder - startOrder) / 2;
  return {
    order: Math.min(maxOrder, startOrder + 2 * r),
    layers: Math.min(maxLayers, startLayers + r),
    shrink: r > steps ? 0.7 ** (r - steps) : 1,
  };
}

function fixedEnds(axis: GridAxis): [number | null, number | null] {
  if (axis.kind === 'interval') return [axis.lo as number, axis.hi as number];
  if (axis.kind === 'line') return [null, null];
  return [0, null];
}

function layoutFor(axis: GridAxis, center: number, width: number): { layout: AxisLayout; h: number } {
  const [lo, hi] = fixedEnds(axis);
  const breakpoints = axis.breakpoints.filter((b) => (lo === null || b > lo) && (hi === null || b < hi));
  const coreLo = lo ?? Math.min(center - width, ...breakpoints.map((b) => b - width));
  const coreHi = hi ?? Math.max((lo ?? -Infinity) + width, center + width, ...breakpoints.map((b) => b + width));
  const singular = axis.kind === 'half-line' || axis.kind === 'rho' ? [0, ...breakpoints] : breakpoints;
  // On a smooth axis elements of two widths suffice (the order, not the element count, resolves a smooth state); a
  // graded axis keeps one width, and its longer tails, since its states fall off slowly (Coulomb).
  const graded = singular.length > 0;
  const h = Math.min((graded ? 1 : 2) * width, coreHi - coreLo);
  const tail = tailCount(h, (graded ? gradedReach : startReach) * width);
  return { layout: { lo, hi, coreLo, coreHi, tailLo: tail, tailHi: tail, singular, breakpoints }, h };
}

function initialPlan(problem: ProductGridProblem): Plan {
  const made = problem.axes.map((axis) => {
    const [lo, hi] = fixedEnds(axis);
    const center = axis.hint?.center ?? (lo !== null && hi !== null ? 0.5 * (lo + hi) : lo !== null ? lo : mean(axis.breakpoints));
    const width = axis.hint?.width ?? (lo !== null && hi !== null ? 0.25 * (hi - lo) : 1);
    return { ...layoutFor(axis, center, width), center: lo !== null && hi === null && center <= lo ? lo + width : center };
  });
  return { layouts: made.map((m) => m.layout), h: made.map((m) => m.h), center: made.map((m) => m.center) };
}

function mean(values: number[]): number {
  return values.length ? values.reduce((s, v) => s + v, 0) / values.length : 0;
}

function grownPlan(plan: Plan): Plan {
  return { h: plan.h, center: plan.center, layouts: plan.layouts.map((l) => ({ ...l, tailLo: l.tailLo + tailStep, tailHi: l.tailHi + tailStep })) };
}

function productWeights(axes: AxisDvr[]): Float64Array {
  let weights = Float64Array.of(1);
  for (const axis of axes) {
    const next = new Float64Array(weights.length * axis.size);
    for (let p = 0; p < weights.length; p++) for (let i = 0; i < axis.size; i++) next[p * axis.size + i] = weights[p] * axis.weights[i];
    weights = next;
  }
  return weights;
}

/** V at every grid point, one reused coordinate buffer. */
function gridPotential(ctx: Context, axes: AxisDvr[], size: number): Outcome<Float64Array> {
  const d = axes.length;
  const point = new Float64Array(d);
  const index = new Int32Array(d);
  const values = new Float64Array(size);
  for (let a = 0; a < d; a++) point[a] = axes[a].nodes[0];
  for (let p = 0; p < size; p++) {
    const v = ctx.problem.potential(point);
    if (!Number.isFinite(v)) {
      return { ok: false, message: `the potential is not finite at (${Array.from(point).join(', ')}) (V = ${v})` };
    }
    values[p] = v;
    for (let a = d - 1; a >= 0; a--) {
      if (++index[a] < axes[a].size) {
        point[a] = axes[a].nodes[index[a]];
        break;
      }
      index[a] = 0;
      point[a] = axes[a].nodes[0];
    }
  }
  ctx.counters.evaluations += size;
  return { ok: true, value: values };
}

/**
 * U_k(x) = max(0, V(c with coordinate k set to x) - V(c)) along each axis through the state's centre c: a separable,
 * non-negative stand-in for V in the preconditioner; 0 where V(c) is not finite.
 */
function potentialCuts(ctx: Context, axes: AxisDvr[], center: number[]): Float64Array[] {
  const point = Float64Array.from(center);
  const atCenter = ctx.problem.potential(point);
  return axes.map((axis, a) => {
    const cut = new Float64Array(axis.size);
    if (!Number.isFinite(atCenter)) return cut;
    for (let i = 0; i < axis.size; i++) {
      point.set(center);
      point[a] = axis.nodes[i];
      const v = ctx.problem.potential(point) - atCenter;
      cut[i] = v > 0 && Number.isFinite(v) ? v : 0;
    }
    ctx.counters.evaluations += axis.size;
    return cut;
  });
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

/** Node values c_p / sqrt(W_p) of an orthonormal DVR vector; the sign makes the largest value positive. */
function nodeValues(coefficients: Float64Array, weights: Float64Array): Float64Array {
  const psi = new Float64Array(coefficients.length);
  let largest = 0;
  for (let p = 0; p < psi.length; p++) {
    psi[p] = coefficients[p] / Math.sqrt(weights[p]);
    if (Math.abs(psi[p]) > Math.abs(psi[largest])) largest = p;
  }
  if (psi[largest] < 0) for (let p = 0; p < psi.length; p++) psi[p] = -psi[p];
  return psi;
}

function solve(ctx: Context, plan: Plan, resolution: number, previous: Solution | null): Outcome<Solution> {
  const { order, layers, shrink } = resolutionOf(resolution);
  const axes = ctx.problem.axes.map((axis, a) => {
    const { edges, orders } = axisElements(plan.layouts[a], plan.h[a] * shrink, layers, order);
    return buildAxis({ kind: axis.kind, mass: axis.mass, boundaries: edges, orders, angularMomentum: axis.kind === 'rho' ? ctx.m : 0 });
  });
  const size = axes.reduce((s, a) => s * a.size, 1);
  if (size > ctx.maxPoints) return { ok: false, tooLarge: true, message: `the next grid needs ${size} points, more than maxPoints = ${ctx.maxPoints}` };
  const potential = gridPotential(ctx, axes, size);
  if (!potential.ok) return potential;
  const op = productOperator(axes, potential.value, potentialCuts(ctx, axes, plan.center));
  const weights = productWeights(axes);
  const start = previous
    ? previous.states.map((psi) => {
        const moved = transferValues(previous.axes, axes, psi);
        for (let p = 0; p < size; p++) moved[p] *= Math.sqrt(weights[p]);
        return moved;
      })
    : [];
  const scratch = new Float64Array(size);
  const kineticEnergy = (x: Float64Array): number => {
    op.applyKinetic(x, scratch);
    return dot(x, scratch) / dot(x, x);
  };
  const scale = previous ? Math.max(previous.kinetic, Math.abs(previous.values[0])) : Math.min(...ctx.problem.axes.map((axis, a) => 1 / (2 * axis.mass * plan.h[a] * plan.h[a])));
  const eigen = lobpcg(
    { size, apply: op.apply, precondition: op.precondition, kineticEnergy },
    {
      wanted: ctx.wanted,
      start,
      blockSize: ctx.wanted + guardVectors,
      tolerance: 0.05 * Math.sqrt(ctx.relTol) * scale,
      maxIterations: maxEigenIterations,
    },
  );
  ctx.counters.grids++;
  ctx.counters.eigenIterations += eigen.iterations;
  const states = eigen.vectors.map((c) => nodeValues(c, weights));
  return {
    ok: true,
    value: {
      plan,
      resolution,
      axes,
      weights,
      values: eigen.values,
      states,
      residuals: eigen.residuals,
      eigenConverged: eigen.converged,
      kinetic: kineticEnergy(eigen.vectors[0]),
    },
  };
}

function bound(ctx: Context, solution: Solution): number[] {
  return solution.values.slice(0, ctx.wanted).filter((e) => !(e >= ctx.threshold));
}

/** Scale below which level changes are judged absolutely: the spread of the wanted levels or the ground kinetic energy. */
function settleScale(ctx: Context, solution: Solution): number {
  const levels = solution.values.slice(0, ctx.wanted);
  return Math.max(levels[levels.length - 1] - levels[0], solution.kinetic);
}

function changes(ctx: Context, a: Solution, b: Solution): number[] {
  return b.values.slice(0, ctx.wanted).map((e, i) => Math.abs(e - a.values[i]));
}

function settled(ctx: Context, solution: Solution, change: number[]): boolean {
  const scale = settleScale(ctx, solution);
  return change.every((d, i) => d <= ctx.relTol * Math.max(Math.abs(solution.values[i]), scale));
}

/** Mean and spread of the ground state along every axis: where the state lives, for sizing the mesh. */
function replan(ctx: Context, solution: Solution): Plan {
  const { axes, states, weights } = solution;
  const ground = states[0];
  const shape = axes.map((a) => a.size);
  const made = ctx.problem.axes.map((axis, a) => {
    let inner = 1;
    for (let b = a + 1; b < shape.length; b++) inner *= shape[b];
    const n = shape[a];
    let first = 0;
    let second = 0;
    for (let p = 0; p < ground.length; p++) {
      const x = axes[a].nodes[Math.floor(p / inner) % n];
      const density = weights[p] * ground[p] * ground[p];
      first += density * x;
      second += density * x * x;
    }
    const spread = Math.sqrt(Math.max(second - first * first, 0));
    const [lo, hi] = fixedEnds(axis);
    const width = lo !== null && hi !== null ? Math.min(spread, 0.25 * (hi - lo)) : spread;
    return { ...layoutFor(axis, lo !== null && hi === null ? lo : first, width > 0 ? width : 1), center: first };
  });
  return { layouts: made.map((m) => m.layout), h: made.map((m) => m.h), center: made.map((m) => m.center) };
}

/**
 * The continuum threshold: the limit of V far out along each open coordinate direction from the centre of the core,
 * the smallest of them; -Infinity where V falls without bound (a field), Infinity with no open direction.
 */
function continuumThreshold(problem: ProductGridProblem, plan: Plan): number {
  const centre = Float64Array.from(plan.layouts, (l) => 0.5 * (l.coreLo + l.coreHi));
  let threshold = Infinity;
  plan.layouts.forEach((layout, a) => {
    const directions = [layout.lo === null ? -1 : 0, layout.hi === null ? 1 : 0].filter((s) => s !== 0);
    for (const direction of directions) {
      const samples = [6, 7, 8].map((k) => {
        const point = Float64Array.from(centre);
        point[a] += direction * 10 ** k;
        return problem.potential(point);
      });
      const [u, v, w] = samples;
      const still = Math.abs(w - v) <= 0.2 * Math.abs(v - u) + 1e-12 * Math.max(1, Math.abs(w));
      const limit = still ? w : w < v ? -Infinity : Infinity;
      threshold = Math.min(threshold, Number.isNaN(limit) ? threshold : limit);
    }
  });
  return threshold;
}

function validate(problem: ProductGridProblem): string | null {
  const d = problem.axes.length;
  if (d < 1 || d > 3) return `a product grid needs 1 to 3 axes, got ${d}`;
  const rho = problem.axes.filter((a) => a.kind === 'rho').length;
  if (rho > 1) return 'at most one axis can be rho';
  for (const axis of problem.axes) {
    if (!(axis.mass > 0) || !Number.isFinite(axis.mass)) return `axis ${axis.name}: mass must be positive and finite, got ${axis.mass}`;
    if (axis.kind === 'interval' && !(Number.isFinite(axis.lo) && Number.isFinite(axis.hi) && (axis.hi as number) > (axis.lo as number))) {
      return `axis ${axis.name}: an interval needs finite lo < hi`;
    }
    if (axis.hint && !(axis.hint.width > 0 && Number.isFinite(axis.hint.center))) return `axis ${axis.name}: hint needs a finite center and a positive width`;
    if (!axis.breakpoints.every(Number.isFinite)) return `axis ${axis.name}: breakpoints must be finite`;
  }
  const m = problem.angularMomentum ?? 0;
  if (!Number.isInteger(m)) return `angularMomentum must be an integer, got ${m}`;
  if (m !== 0 && rho === 0) return 'angularMomentum needs a rho axis';
  const levels = problem.levels ?? PRODUCT_GRID_DEFAULTS.levels;
  if (!Number.isInteger(levels) || levels < 1) return `levels must be a positive integer, got ${levels}`;
  return null;
}

function failure(ctx: Context, message: string): ProductGridLevels {
  return {
    levels: [],
    errorEstimate: [],
    converged: false,
    message,
    refinements: ctx.counters.grids,
    size: 0,
    shape: [],
    axes: [],
    states: [],
    residuals: [],
    eigenIterations: ctx.counters.eigenIterations,
    potentialEvaluations: ctx.counters.evaluations,
    threshold: ctx.threshold,
  };
}

function report(ctx: Context, solution: Solution, errorEstimate: number[], converged: boolean, note: string | null): ProductGridLevels {
  const levels = bound(ctx, solution);
  const notes = [note];
  if (!solution.eigenConverged) notes.push(`LOBPCG stopped after ${maxEigenIterations} iterations with residuals ${solution.residuals.slice(0, ctx.wanted).join(', ')}`);
  if (levels.length < ctx.wanted && ctx.problem.levels !== undefined) {
    notes.push(`only ${levels.length} level${levels.length === 1 ? '' : 's'} below the continuum threshold ${ctx.threshold}, ${ctx.wanted} asked for`);
  }
  if (ctx.threshold === -Infinity) notes.push('V falls without bound along an open direction: the levels are those of the finite domain (long-lived resonances)');
  const message = notes.filter((n): n is string => n !== null).join('; ');
  return {
    levels,
    errorEstimate: errorEstimate.slice(0, levels.length),
    converged: converged && solution.eigenConverged && levels.length > 0,
    message: message === '' ? null : message,
    refinements: ctx.counters.grids,
    size: solution.weights.length,
    shape: solution.axes.map((a) => a.size),
    axes: solution.axes.map((a, i) => ({
      name: ctx.problem.axes[i].name,
      nodes: a.nodes,
      weights: a.weights,
      domain: [a.mesh.boundaries[0], a.mesh.boundaries[a.mesh.boundaries.length - 1]] as [number, number],
      elements: a.mesh.boundaries.length - 1,
      order: Math.max(...a.mesh.orders),
    })),
    states: solution.states.slice(0, levels.length),
    residuals: solution.residuals.slice(0, levels.length),
    eigenIterations: ctx.counters.eigenIterations,
    potentialEvaluations: ctx.counters.evaluations,
    threshold: ctx.threshold,
  };
}

/** Open tails grow until the levels stop moving at the current resolution. */
function sizeDomain(ctx: Context, start: Solution): Outcome<Solution> {
  let current = start;
  if (current.plan.layouts.every((l) => l.lo !== null && l.hi !== null)) return { ok: true, value: current };
  for (let round = 0; round < maxSizingRounds; round++) {
    const next = solve(ctx, grownPlan(current.plan), current.resolution, current);
    if (!next.ok) return next.tooLarge ? { ok: true, value: current } : next;
    const moved = changes(ctx, current, next.value);
    current = next.value;
    if (settled(ctx, current, moved)) break;
  }
  return { ok: true, value: current };
}

interface Refined {
  solution: Solution;
  change: number[];
  converged: boolean;
  message: string | null;
}

/** Higher order, more grading layers, then smaller elements, until two successive grids agree to relTol. */
function refine(ctx: Context, start: Solution): Outcome<Refined> {
  let current = start;
  let change = current.values.slice(0, ctx.wanted).map(() => Infinity);
  for (;;) {
    const next = solve(ctx, current.plan, current.resolution + 1, current);
    if (!next.ok && next.tooLarge) return { ok: true, value: { solution: current, change, converged: false, message: `${next.message}, before the levels settled to relTol = ${ctx.relTol}` } };
    if (!next.ok) return next;
    change = changes(ctx, current, next.value);
    current = next.value;
    if (settled(ctx, current, change)) return { ok: true, value: { solution: current, change, converged: true, message: null } };
  }
}

/**
 * Lowest levels of a 2-D or 3-D product-grid Hamiltonian: the mesh is fitted to the ground state, the open tails
 * grown until the levels stop moving, the resolution refined until they settle, and a run on a longer domain confirms.
 */
export function productGridLevels(problem: ProductGridProblem): ProductGridLevels {
  const ctx: Context = {
    problem,
    m: Math.abs(problem.angularMomentum ?? 0),
    wanted: problem.levels ?? PRODUCT_GRID_DEFAULTS.levels,
    relTol: problem.relTol ?? PRODUCT_GRID_DEFAULTS.relTol,
    maxPoints: problem.maxPoints ?? PRODUCT_GRID_DEFAULTS.maxPoints,
    threshold: NaN,
    counters: { grids: 0, eigenIterations: 0, evaluations: 0 },
  };
  const invalid = validate(problem);
  if (invalid) return failure(ctx, invalid);
  let plan = initialPlan(problem);
  ctx.threshold = continuumThreshold(problem, plan);
  const first = solve(ctx, plan, 0, null);
  if (!first.ok) return failure(ctx, first.message);
  // The mesh is re-fitted once to where the ground state actually lives, then the tails are sized.
  plan = replan(ctx, first.value);
  const fitted = solve(ctx, plan, 0, first.value);
  if (!fitted.ok) return failure(ctx, fitted.message);
  const sized = sizeDomain(ctx, fitted.value);
  if (!sized.ok) return failure(ctx, sized.message);
  let current = sized.value;
  for (let round = 0; ; round++) {
    const refined = refine(ctx, current);
    if (!refined.ok) return failure(ctx, refined.message);
    const { solution, change } = refined.value;
    if (!refined.value.converged) return report(ctx, solution, change, false, refined.value.message);
    if (solution.plan.layouts.every((l) => l.lo !== null && l.hi !== null)) return report(ctx, solution, change, true, null);
    const longer = solve(ctx, grownPlan(solution.plan), solution.resolution, solution);
    if (!longer.ok && longer.tooLarge) return report(ctx, solution, change, false, `${longer.message}, for the run that confirms the domain`);
    if (!longer.ok) return failure(ctx, longer.message);
    const moved = changes(ctx, solution, longer.value);
    const errorEstimate = change.map((d, i) => Math.max(d, moved[i]));
    if (settled(ctx, longer.value, moved)) return report(ctx, longer.value, errorEstimate, true, null);
    if (round + 1 >= maxConfirmRounds) {
      return report(ctx, longer.value, errorEstimate, false, `the levels still move when the open tails are extended (by ${moved.map((d) => d.toExponential(2)).join(', ')})`);
    }
    current = longer.value;
  }
}
