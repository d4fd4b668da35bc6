/**
 * Independent grid reference for the variational estimates: the lowest bound levels (two unless asked for more) and
 * their vectors of H = p^2/(2m) + V (hbar = 1) by the finite-element discrete variable representation.
 */
import { lowestEigenpairs } from './banded-eigen.ts';
import { buildGrid, type Assembly, type Grid, type Outcome } from './fe-dvr.ts';
import { ATOMIC_DISPLAY, type ValueDisplay } from './format.ts';

export type GridSpace = 'line' | 'half-line' | 'radial' | 'box' | 'plane';

/** A mass that depends on the coordinate, with its slope (zero on either side of a step). */
export interface GridMassProfile {
  value(x: number): number;
  d1(x: number): number;
}

export interface GridProblem {
  space: GridSpace;
  /** The constant mass; ignored when massProfile is given. */
  mass: number;
  /**
   * A mass that depends on the coordinate: the kinetic matrix takes 1/m at the quadrature nodes (BenDaniel–Duke form
   * (1/2) int chi_i' chi_j' / m), and its steps must be among `breakpoints`, so that they fall on element edges.
   */
  massProfile?: GridMassProfile | null;
  potential: (x: number) => number;
  angularMomentum?: number;
  box?: [number, number];
  breakpoints?: number[];
  hint?: { center: number; width: number };
  /**
   * How many of the lowest bound levels to settle (a positive integer, default GRID_DEFAULTS.levels). When this is
   * given and fewer bound levels exist, the ones that exist are returned and `message` says so; the default asks
   * for at most two without comment, since a single bound level is ordinary for the callers of the default.
   */
  levels?: number;
  relTol?: number;
  /** How messages state energies and positions (default: atomic units). */
  display?: ValueDisplay;
  maxNodes?: number;
}

export interface GridLevels {
  levels: number[];
  threshold: number;
  nodes: Float64Array;
  weights: Float64Array;
  ground: Float64Array;
  excited: Float64Array | null;
  /** Function values at the nodes of every returned level, in the order of `levels` (states[0] is `ground`). */
  states: Float64Array[];
  domain: [number, number];
  converged: boolean;
  errorEstimate: number[];
  refinements: number;
  size: number;
  elementOrder: number;
  elements: number;
  eigenIterations: number;
  potentialEvaluations: number;
  message: string | null;
  /** A product grid (several coordinates) summarised here: each axis's domain and elements; absent on one coordinate. */
  axes?: Array<{ name: string; domain: [number, number]; elements: number; order: number }>;
}

/** WKB decay exponent at which a tail is cut: amplitude e^-20, so the energy error is of order e^-40. */
const tailDepth = 20;
/** The confirming run pushes each open end out to this depth; the levels must not move. */
const confirmDepth = 40;
const startOrder = 8;
const maxOrder = 20;
const orderStep = 3;
/** Target WKB phase (radians of local wavenumber) spanned by one element on the first grids. */
const startPhase = 3;
const phaseShrink = 1.6;
const maxSizingRounds = 10;
/** How many times the domain is widened fourfold when nothing bound shows up before giving up. */
const maxWidenings = 3;
const maxConfirmRounds = 3;
/** The mesh density follows |V - E| only up to this multiple of the energy spread, so singularities stay finite. */
const densityCap = 64;
const samplesPerSegment = 256;
const thresholdDecades = 12;

interface Resolution {
  order: number;
  phase: number;
}

/** What the previous grid says about the wanted states; it steers the mesh, the domain and the settling test. */
interface StateEstimate {
  /** The highest wanted bound level found so far. */
  energy: number;
  /** Energy range the mesh must resolve: from the ground level up to `energy` (or the threshold). */
  spread: number;
  /**
   * Energy scale below which a level's change is judged absolutely rather than relative to the level (levels near
   * the energy zero): the spread of the lowest two levels, so asking for more levels never loosens the lowest ones.
   */
  settleScale: number;
  center: number;
  width: number;
}

interface Context extends Assembly {
  space: GridSpace;
  /** Hard walls of a box problem; null for the open spaces. */
  box: [number, number] | null;
  threshold: number;
  /** Bound levels wanted; each grid solves for this many eigenpairs. */
  wanted: number;
  /** Whether the caller named `levels`, so that a shortfall is worth a message. */
  wantedExplicitly: boolean;
  relTol: number;
  maxNodes: number;
  counters: { grids: number; eigenIterations: number; evaluations: number };
}

interface Solution {
  grid: Grid;
  domain: [number, number];
  resolution: Resolution;
  /** The wanted number of lowest eigenvalues of the grid, bound or not: starting brackets for the next grid. */
  eigenvalues: number[];
  /** Eigenvalues below the continuum threshold, ascending. */
  bound: number[];
  /** Function values (c_i / sqrt(W_i)) of the eigenvectors of the bound levels. */
  states: Float64Array[];
  eigenConverged: boolean;
  eigenMessage: string | null;
}

function countingPotential(problem: GridProblem, counters: Context['counters']): (x: number) => number {
  // The plane's grid solves for f = R / r^|m| in its weighted form, which has no centrifugal term.
  const l = problem.space === 'radial' ? (problem.angularMomentum ?? 0) : 0;
  const profile = problem.massProfile;
  if (profile) {
    // With u = r R, <T> = (1/2) int (r^2 |R'|^2 + l(l+1) |R|^2) / m dr = (1/2) int |u'|^2 / m dr + (1/2) int u^2 (1/m)' / r dr:
    // the smooth part of (1/m)' / (2r) joins the effective potential (steps are added on the grid's edge nodes).
    const radial = problem.space === 'radial';
    return (x: number) => {
      counters.evaluations++;
      const v = problem.potential(x);
      if (!radial) return v;
      const m = profile.value(x);
      return v + (l * (l + 1)) / (2 * m * x * x) - profile.d1(x) / (2 * x * m * m);
    };
  }
  const centrifugal = (l * (l + 1)) / (2 * problem.mass);
  return (x: number) => {
    counters.evaluations++;
    const v = problem.potential(x);
    return centrifugal === 0 ? v : v + centrifugal / (x * x);
  };
}

/**
 * Limit of V along an open end from samples a decade apart, accelerated by Aitken's delta-squared process
 * (Aitken, Proc. R. Soc. Edinburgh 46, 289 (1926)); +-Infinity when the samples keep growing instead of settling.
 */
function openEndLimit(veff: (x: number) => number, origin: number, direction: number, scale: number): number {
  const samples: number[] = [];
  for (let k = 0; k <= thresholdDecades; k++) samples.push(veff(origin + direction * scale * 10 ** k));
  if (samples.some(Number.isNaN)) return NaN;
  const [a, b, c] = samples.slice(-3);
  if (!Number.isFinite(c)) return c;
  const d1 = b - a;
  const d2 = c - b;
  const spread = Math.max(...samples.map((v) => (Number.isFinite(v) ? Math.abs(v - c) : 0)));
  const settled = d2 === 0 || (Math.abs(d2) <= 0.5 * Math.abs(d1) && Math.abs(d2) <= 1e-4 * spread);
  if (!settled) return d2 > 0 ? Infinity : -Infinity;
  return d1 * d2 > 0 ? c - (d2 * d2) / (d2 - d1) : c;
}

function continuumThreshold(ctx: Context, estimate: StateEstimate): number {
  switch (ctx.space) {
    case 'box':
      return Infinity;
    case 'line':
      return Math.min(
        openEndLimit(ctx.veff, estimate.center, -1, estimate.width),
        openEndLimit(ctx.veff, estimate.center, 1, estimate.width),
      );
    default:
      return openEndLimit(ctx.veff, 0, 1, estimate.width);
  }
}

function initialEstimate(problem: GridProblem, box: [number, number] | null, veff: (x: number) => number, massAt: (x: number) => number): StateEstimate {
  const center = problem.hint?.center ?? (box ? 0.5 * (box[0] + box[1]) : problem.space === 'line' ? 0 : 1);
  const width = problem.hint?.width ?? (box ? 0.25 * (box[1] - box[0]) : 1);
  const kinetic = 1 / (2 * massAt(center) * width * width);
  const v = veff(center);
  return { energy: Number.isFinite(v) ? v + kinetic : kinetic, spread: kinetic, settleScale: kinetic, center, width };
}

function initialDomain(problem: GridProblem, box: [number, number] | null, estimate: StateEstimate): [number, number] {
  if (box) return box;
  const reach = 8 * estimate.width;
  const breaks = problem.breakpoints ?? [];
  const right = Math.max(estimate.center + reach, ...breaks.map((b) => b + estimate.width));
  if (problem.space !== 'line') return [0, right];
  return [Math.min(estimate.center - reach, ...breaks.map((b) => b - estimate.width)), right];
}

/** Local resolution demand: WKB wavenumber sqrt(2m|V - E|), capped at singularities, plus a floor for flat regions. */
function meshDensity(ctx: Context, estimate: StateEstimate): (x: number) => number {
  const cap = densityCap * estimate.spread;
  return (x: number) => {
    const gap = Math.abs(ctx.veff(x) - estimate.energy);
    const mass = ctx.massAt(x);
    return Math.sqrt(2 * mass * (gap < cap ? gap : cap)) + 0.5 * Math.sqrt(2 * mass * estimate.spread);
  };
}

/**
 * Element boundaries that put an equal share of the integrated density in each element of every segment between
 * breakpoints (equidistribution, Pereyra & Sewell, Numer. Math. 23, 261 (1975), cited from memory).
 */
function elementBoundaries(domain: [number, number], breakpoints: number[], density: (x: number) => number, phase: number): number[] {
  const length = domain[1] - domain[0];
  const inside = breakpoints.filter((b) => b > domain[0] + 1e-9 * length && b < domain[1] - 1e-9 * length);
  const cuts = [domain[0], ...[...new Set(inside)].sort((p, q) => p - q), domain[1]];
  const boundaries = [domain[0]];
  for (let s = 0; s + 1 < cuts.length; s++) {
    const [a, b] = [cuts[s], cuts[s + 1]];
    const h = (b - a) / samplesPerSegment;
    const cumulative = new Float64Array(samplesPerSegment + 1);
    for (let k = 0; k < samplesPerSegment; k++) cumulative[k + 1] = cumulative[k] + h * density(a + (k + 0.5) * h);
    const total = cumulative[samplesPerSegment];
    const count = Math.max(1, Math.ceil(total / phase));
    let k = 0;
    for (let e = 1; e < count; e++) {
      const target = (total * e) / count;
      while (cumulative[k + 1] < target) k++;
      const fraction = (target - cumulative[k]) / (cumulative[k + 1] - cumulative[k]);
      boundaries.push(a + (k + fraction) * h);
    }
    boundaries.push(b);
  }
  return boundaries;
}

function solve(
  ctx: Context,
  domain: [number, number],
  resolution: Resolution,
  estimate: StateEstimate,
  guesses: number[],
): Outcome<Solution> {
  const boundaries = elementBoundaries(domain, ctx.breakpoints, meshDensity(ctx, estimate), resolution.phase);
  const size = (boundaries.length - 1) * (resolution.order - 1) - 1;
  if (size > ctx.maxNodes) {
    return { ok: false, tooLarge: true, message: `the next grid needs ${size} nodes, more than maxNodes = ${ctx.maxNodes}` };
  }
  const built = buildGrid(ctx, boundaries, resolution.order);
  if (!built.ok) return built;
  const grid = built.value;
  const eigen = lowestEigenpairs(grid.band, Math.min(ctx.wanted, grid.band.size), { guesses });
  ctx.counters.grids++;
  ctx.counters.eigenIterations += eigen.bisectionSteps + eigen.inverseIterations;
  if (eigen.values.length === 0) return { ok: false, message: eigen.message ?? 'the eigen-solver returned nothing' };
  const bound = eigen.values.filter((e) => e < ctx.threshold);
  const states = eigen.vectors.slice(0, bound.length).map((c) => functionValues(c, grid.weights));
  return {
    ok: true,
    value: { grid, domain, resolution, eigenvalues: eigen.values, bound, states, eigenConverged: eigen.converged, eigenMessage: eigen.message },
  };
}

/** Eigenvector coefficients of the normalised DVR functions are sqrt(W_i) psi(x_i); sign fixed by the largest value. */
function functionValues(coefficients: Float64Array, weights: Float64Array): Float64Array {
  const psi = coefficients.map((c, i) => c / Math.sqrt(weights[i]));
  let largest = 0;
  for (let i = 1; i < psi.length; i++) if (Math.abs(psi[i]) > Math.abs(psi[largest])) largest = i;
  return psi[largest] < 0 ? psi.map((v) => -v) : psi;
}

function estimateFrom(ctx: Context, solution: Solution, fallback: StateEstimate): StateEstimate {
  if (solution.bound.length === 0) return fallback;
  const { nodes, weights } = solution.grid;
  const ground = solution.states[0];
  let center = 0;
  for (let i = 0; i < nodes.length; i++) center += weights[i] * nodes[i] * ground[i] * ground[i];
  let variance = 0;
  for (let i = 0; i < nodes.length; i++) variance += weights[i] * (nodes[i] - center) ** 2 * ground[i] * ground[i];
  const width = Math.sqrt(variance);
  let meanPotential = 0;
  for (let i = 0; i < nodes.length; i++) meanPotential += weights[i] * solution.grid.potential[i] * ground[i] * ground[i];
  const e0 = solution.bound[0];
  const energy = solution.bound[solution.bound.length - 1];
  // The ground state's kinetic energy <T> = E0 - <V> is the local energy scale even where levels are nearly degenerate.
  const spreadUpTo = (top: number) => {
    const spread = Math.max(top - e0, Number.isFinite(ctx.threshold) ? ctx.threshold - e0 : 0, e0 - meanPotential);
    return spread > 0 ? spread : 1 / (2 * ctx.massAt(center) * width * width);
  };
  const second = solution.bound[Math.min(1, solution.bound.length - 1)];
  return { energy, spread: spreadUpTo(energy), settleScale: spreadUpTo(second), center, width };
}

/**
 * Where an exponential tail has decayed by e^-depth: march outward from the state, accumulating the WKB exponent
 * int sqrt(2m(V - E)) dx and restarting it wherever the motion is classically allowed again (Landau & Lifshitz,
 * Quantum Mechanics, §46).
 */
function tailEnd(ctx: Context, estimate: StateEstimate, direction: number, depth: number): Outcome<number> {
  const { energy, center, width } = estimate;
  let x = center;
  let exponent = 0;
  for (let steps = 0; exponent < depth; steps++) {
    const v = ctx.veff(x);
    if (Number.isNaN(v)) return { ok: false, message: `the potential is NaN at x = ${ctx.show.length(x)}` };
    if (v === Infinity) return { ok: true, value: x };
    const kappa2 = 2 * ctx.massAt(x) * (v - energy);
    const distance = Math.abs(x - center);
    if (steps > 100000 || distance > 1e9 * width) {
      return { ok: false, message: `the tail of the level ${ctx.show.energy(energy)} does not decay within ${ctx.show.length(distance)} of x = ${ctx.show.length(center)}` };
    }
    // Steps follow the local decay length, or grow with the distance where V - E is nearly zero; an attractive
    // singularity (V = -Infinity) is simply stepped over.
    const wavenumber = Number.isFinite(kappa2) ? Math.sqrt(Math.abs(kappa2)) : 0;
    const h = 0.1 / (wavenumber + 1 / (distance + width));
    exponent = kappa2 > 0 ? exponent + h * Math.sqrt(kappa2) : 0;
    x += direction * h;
  }
  return { ok: true, value: x };
}

function wkbDomain(ctx: Context, estimate: StateEstimate, depth: number): Outcome<[number, number]> {
  const right = tailEnd(ctx, estimate, 1, depth);
  if (!right.ok) return right;
  if (ctx.space !== 'line') return { ok: true, value: [0, right.value] };
  const left = tailEnd(ctx, estimate, -1, depth);
  if (!left.ok) return left;
  return { ok: true, value: [left.value, right.value] };
}

function sameDomain(a: [number, number], b: [number, number]): boolean {
  const tolerance = 0.1 * (a[1] - a[0]);
  return Math.abs(a[0] - b[0]) <= tolerance && Math.abs(a[1] - b[1]) <= tolerance;
}

/**
 * Pushes the open ends of a domain out by a factor around the estimated state: for when nothing bound was found, and
 * as the most one sizing round may grow the domain.
 */
function widenedDomain(ctx: Context, domain: [number, number], estimate: StateEstimate): [number, number] {
  const right = estimate.center + 4 * (domain[1] - estimate.center);
  return ctx.space === 'line' ? [estimate.center - 4 * (estimate.center - domain[0]), right] : [0, right];
}

interface Sized {
  solution: Solution;
  estimate: StateEstimate;
}

/**
 * Coarse grids until the WKB-sized domain of the highest wanted bound level stops moving; if it keeps moving, the
 * last domain goes on to refinement, where the confirming run on a longer domain still guards the tails.
 */
function sizeDomain(ctx: Context, start: [number, number], first: StateEstimate): Outcome<Sized> {
  let domain = start;
  let estimate = first;
  let guesses: number[] = [];
  let last: Sized | null = null;
  const resolution = { order: startOrder, phase: startPhase };
  let widenings = 0;
  for (let round = 0; round < maxSizingRounds; round++) {
    const solved = solve(ctx, domain, resolution, estimate, guesses);
    if (!solved.ok) return solved;
    const solution = solved.value;
    guesses = solution.eigenvalues;
    if (solution.bound.length === 0) {
      if (widenings++ === maxWidenings) break;
      domain = widenedDomain(ctx, domain, estimate);
      continue;
    }
    estimate = estimateFrom(ctx, solution, estimate);
    last = { solution, estimate };
    if (ctx.box) break;
    const needed = wkbDomain(ctx, estimate, tailDepth);
    if (!needed.ok) return needed;
    // A level squeezed by too short a domain sits too high, often just below the threshold, where its WKB tail is
    // far longer than the true level's; growing step by step lets it drop to its place before it sizes the domain.
    const limit = widenedDomain(ctx, domain, estimate);
    const next: [number, number] = [Math.max(needed.value[0], limit[0]), Math.min(needed.value[1], limit[1])];
    if (sameDomain(domain, next)) break;
    domain = next;
  }
  return last ? { ok: true, value: last } : { ok: false, message: `no bound level below the continuum threshold ${ctx.show.energy(ctx.threshold)} was found` };
}

function nextResolution(resolution: Resolution): Resolution {
  return resolution.order < maxOrder
    ? { order: Math.min(maxOrder, resolution.order + orderStep), phase: resolution.phase }
    : { order: resolution.order, phase: resolution.phase / phaseShrink };
}

/** |change| per level, or null when the number of bound levels differs between the two grids. */
function levelChanges(a: Solution, b: Solution): number[] | null {
  if (a.bound.length !== b.bound.length) return null;
  return a.bound.map((e, i) => Math.abs(e - b.bound[i]));
}

function withinTolerance(ctx: Context, solution: Solution, changes: number[], settleScale: number): boolean {
  return changes.every((d, i) => d <= ctx.relTol * Math.max(Math.abs(solution.bound[i]), settleScale));
}

interface Refined {
  solution: Solution;
  errorEstimate: number[];
  converged: boolean;
  message: string | null;
}

/** Higher order, then smaller elements, until two successive grids agree on every wanted bound level to relTol. */
function refine(ctx: Context, start: Solution, estimate: StateEstimate, startChanges: number[] | null): Outcome<Refined> {
  let current = start;
  let lastChanges = startChanges;
  for (;;) {
    const solved = solve(ctx, current.domain, nextResolution(current.resolution), estimate, current.eigenvalues);
    if (!solved.ok && solved.tooLarge) {
      const errorEstimate = lastChanges ?? current.bound.map(() => Infinity);
      const message = `${solved.message}, before the levels settled to relTol = ${ctx.relTol}`;
      return { ok: true, value: { solution: current, errorEstimate, converged: false, message } };
    }
    if (!solved.ok) return solved;
    lastChanges = levelChanges(current, solved.value);
    current = solved.value;
    if (lastChanges && withinTolerance(ctx, current, lastChanges, estimate.settleScale)) {
      return { ok: true, value: { solution: current, errorEstimate: lastChanges, converged: true, message: null } };
    }
  }
}

interface Confirmation {
  refined: Refined;
  /** The levels moved with the domain, so refining on the longer domain may still settle them. */
  retry: boolean;
}

/**
 * Re-solves on a domain whose tails reach e^-depth at the same resolution; the levels must not move, and the grid
 * with the longer tails is the one reported.
 */
function confirmDomain(ctx: Context, refined: Refined, estimate: StateEstimate, depth: number): Outcome<Confirmation> {
  const longer = wkbDomain(ctx, estimate, depth);
  if (!longer.ok) return longer;
  const solved = solve(ctx, longer.value, refined.solution.resolution, estimate, refined.solution.eigenvalues);
  if (!solved.ok && solved.tooLarge) {
    const message = `${solved.message}, for the run that confirms the domain`;
    return { ok: true, value: { refined: { ...refined, converged: false, message }, retry: false } };
  }
  if (!solved.ok) return solved;
  const changes = levelChanges(refined.solution, solved.value);
  const settled = changes !== null && withinTolerance(ctx, solved.value, changes, estimate.settleScale);
  const errorEstimate = changes
    ? changes.map((d, i) => Math.max(d, refined.errorEstimate[i]))
    : solved.value.bound.map(() => Infinity);
  const message = settled ? null : `the levels still move when the domain is extended to [${solved.value.domain.map((x) => ctx.show.length(x)).join(', ')}]`;
  return { ok: true, value: { refined: { solution: solved.value, errorEstimate, converged: settled, message }, retry: !settled } };
}

function failure(ctx: Context, message: string): GridLevels {
  return {
    levels: [],
    threshold: ctx.threshold,
    nodes: new Float64Array(0),
    weights: new Float64Array(0),
    ground: new Float64Array(0),
    excited: null,
    states: [],
    domain: [NaN, NaN],
    converged: false,
    errorEstimate: [],
    refinements: ctx.counters.grids,
    size: 0,
    elementOrder: 0,
    elements: 0,
    eigenIterations: ctx.counters.eigenIterations,
    potentialEvaluations: ctx.counters.evaluations,
    message,
  };
}

function report(ctx: Context, refined: Refined): GridLevels {
  const { solution } = refined;
  const eigenNote = solution.eigenConverged ? null : `eigen-solver: ${solution.eigenMessage}`;
  const found = solution.bound.length;
  const shortfall =
    ctx.wantedExplicitly && found < ctx.wanted
      ? `only ${found} bound level${found === 1 ? '' : 's'} below the continuum threshold ${ctx.show.energy(ctx.threshold)}, ${ctx.wanted} asked for`
      : null;
  const message = [shortfall, refined.message, eigenNote].filter((m) => m !== null).join('; ');
  return {
    levels: solution.bound,
    threshold: ctx.threshold,
    nodes: solution.grid.nodes,
    weights: solution.grid.weights,
    ground: solution.states[0],
    excited: solution.states[1] ?? null,
    states: solution.states,
    domain: solution.domain,
    converged: refined.converged && solution.eigenConverged,
    errorEstimate: refined.errorEstimate,
    refinements: ctx.counters.grids,
    size: solution.grid.band.size,
    elementOrder: solution.grid.order,
    elements: solution.grid.elements,
    eigenIterations: ctx.counters.eigenIterations,
    potentialEvaluations: ctx.counters.evaluations,
    message: message === '' ? null : message,
  };
}

function validate(problem: GridProblem): string | null {
  if (!problem.massProfile && (!(problem.mass > 0) || !Number.isFinite(problem.mass))) return `mass must be positive and finite, got ${problem.mass}`;
  if (problem.massProfile && problem.space === 'plane') return 'a mass that depends on the coordinate is not available on the plane grid';
  if (problem.space === 'box') {
    const box = problem.box;
    if (!box || !(box[1] > box[0]) || !box.every(Number.isFinite)) return 'a box problem needs box = [a, b] with a < b';
  }
  const hint = problem.hint;
  if (hint && !(hint.width > 0 && Number.isFinite(hint.center))) return 'hint needs a finite center and a positive width';
  if (hint && problem.space !== 'line' && problem.space !== 'box' && hint.center < 0) {
    return `hint.center must lie on the half-line, got ${hint.center}`;
  }
  const l = problem.angularMomentum ?? 0;
  if (problem.space === 'plane') {
    if (!Number.isInteger(l) || Math.abs(l) > MAX_PLANE_M) return `angularMomentum m must be an integer with |m| <= ${MAX_PLANE_M} on the plane, got ${l}`;
  } else if (!Number.isInteger(l) || l < 0) return `angularMomentum must be a non-negative integer, got ${l}`;
  const levels = problem.levels ?? GRID_DEFAULTS.levels;
  if (!Number.isInteger(levels) || levels < 1) return `levels must be a positive integer, got ${levels}`;
  return null;
}

/**
 * Refinement stops when two successive grids agree on the bound levels to relTol; maxNodes caps the work; `levels`
 * is how many of the lowest bound levels are wanted.
 */
/** The plane's weight r^(2|m|+1) must stay finite on every grid: beyond this |m| it could overflow far out. */
const MAX_PLANE_M = 40;

export const GRID_DEFAULTS = { relTol: 1e-10, maxNodes: 4000, levels: 2 };

/**
 * Lowest bound levels of a 1-D (or radial, or plane) Schrödinger operator: a domain sized by WKB for the highest wanted level,
 * FE-DVR grids refined until every wanted level settles, and a confirming run on a longer domain.
 */
export function gridLevels(problem: GridProblem): GridLevels {
  const counters = { grids: 0, eigenIterations: 0, evaluations: 0 };
  const veff = countingPotential(problem, counters);
  const box = problem.space === 'box' && problem.box ? problem.box : null;
  const base: Context = {
    space: problem.space,
    box,
    massAt: problem.massProfile ? problem.massProfile.value : () => problem.mass,
    profile: problem.massProfile ?? null,
    veff,
    threshold: NaN,
    breakpoints: problem.breakpoints ?? [],
    wanted: problem.levels ?? GRID_DEFAULTS.levels,
    wantedExplicitly: problem.levels !== undefined,
    relTol: problem.relTol ?? GRID_DEFAULTS.relTol,
    maxNodes: problem.maxNodes ?? GRID_DEFAULTS.maxNodes,
    counters,
    power: problem.space === 'plane' ? 2 * Math.abs(problem.angularMomentum ?? 0) + 1 : null,
    radialMassSteps: problem.space === 'radial',
    show: problem.display ?? ATOMIC_DISPLAY,
  };
  const invalid = validate(problem);
  if (invalid) return failure(base, invalid);
  const first = initialEstimate(problem, box, veff, base.massAt);
  const ctx: Context = { ...base, threshold: continuumThreshold(base, first) };
  if (Number.isNaN(ctx.threshold)) return failure(ctx, 'the potential is NaN far out, so the continuum threshold is unknown');
  if (ctx.threshold === -Infinity) return failure(ctx, 'the potential is unbounded below at an open end: there are no bound states');

  const sized = sizeDomain(ctx, initialDomain(problem, box, first), first);
  if (!sized.ok) return failure(ctx, sized.message);
  let { solution, estimate } = sized.value;
  let changes: number[] | null = null;
  for (let round = 0; ; round++) {
    const refined = refine(ctx, solution, estimate, changes);
    if (!refined.ok) return failure(ctx, refined.message);
    if (ctx.box || !refined.value.converged) return report(ctx, refined.value);
    estimate = estimateFrom(ctx, refined.value.solution, estimate);
    const confirmed = confirmDomain(ctx, refined.value, estimate, confirmDepth + round * tailDepth);
    if (!confirmed.ok) return failure(ctx, confirmed.message);
    const { refined: result, retry } = confirmed.value;
    if (!retry || round + 1 >= maxConfirmRounds) return report(ctx, result);
    solution = result.solution;
    changes = result.errorEstimate;
  }
}
