// Integrals over a product of 2 or 3 coordinate ranges (a rectangle or box, ends possibly infinite),
// several integrands at once: the norm, kinetic and potential integrals of a trial share its values.
import { splitPoints } from '../spaces/space.ts';
import { integrateVector, type IntegrationOptions, type IntegrationResult, type IntegrationStatus, type Partition, type VectorIntegrand } from '../quadrature.ts';

export type ProductIntegrand = (point: Float64Array, out: Float64Array) => void;

/** One coordinate of the product: its range, where to split it, and where and how wide the integrand lives along it. */
export interface CubatureAxis {
  lo: number;
  hi: number;
  /** Interior split points: nuclei, kinks, walls inside the range; those outside (lo, hi) are ignored. */
  breakpoints: number[];
  /** Where the integrand is centred; a split point when strictly inside the range. */
  center: number;
  /** Length scale of the map of an infinite end onto a finite parameter range. */
  scale: number;
}

export interface CubatureOptions {
  relTol?: number;
  absTol?: number;
  /** Panel limit of each one-dimensional run. */
  maxIntervals?: number;
  /**
   * Which axis is integrated outermost, then next (default the axes' order). The point handed to the
   * integrand keeps the axes' order whatever this is.
   */
  order?: number[];
  /** Where to start from: a previous result's `partition`, at nearby parameters of the same integrand. */
  start?: CubaturePartition;
}

/**
 * The panels one run settled on and, at each of its nodes (sorted), those the run of the next
 * coordinate inside settled on; empty at the innermost coordinate.
 */
export interface NestedPartition {
  panels: Partition;
  nodes: Float64Array;
  inner: NestedPartition[];
}

/**
 * The panels a run settled on at every level, so that a run at nearby parameters evaluates the
 * leaves at once instead of passing through the coarser panels an adaptive run from whole segments
 * needs; each inner run starts from the panels of the previous run's nearest node.
 */
export interface CubaturePartition {
  tree: NestedPartition;
  /** Panels of the inner runs, summed, at the run that started from whole segments. */
  placedPanels: number;
}

export interface CubatureResult {
  values: Float64Array;
  /** Outer quadrature error plus the integrated error estimates of the inner integrals. */
  errorEstimates: Float64Array;
  /** Integrand calls. */
  evaluations: number;
  converged: boolean;
  /** The first failure met at any level, or 'converged'. */
  status: IntegrationStatus;
  message: string | null;
  /** The panels to start a nearby run from, or null when they have grown too fine to be worth carrying. */
  partition: CubaturePartition | null;
}

export const CUBATURE_DEFAULTS = { relTol: 1e-10, absTol: 0, maxIntervals: 2000 } as const;

/** A run that needed more than this many times the inner panels of the run it was started from starts the next one afresh (as in the 1-D search). */
const CARRY_LIMIT = 4;

/** How bad a failure is, to report the worst one met among many runs. */
export const STATUS_RANK: Record<IntegrationStatus, number> = { converged: 0, roundoff: 1, 'interval-limit': 2, 'non-finite': 3 };

/**
 * Iterated adaptive Gauss–Kronrod integration over a product region (QUADPACK's globally adaptive QAG/QAGI
 * in each coordinate, Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983; nesting
 * as in Davis & Rabinowitz, Methods of Numerical Integration, 1984, §5.6). Each inner integral is
 * itself adaptive, so a point singularity on a split line (a nucleus at z = z0 on the axis rho = 0) is
 * refined only where it is; every inner run's error estimate is integrated along by the outer run and
 * added to the outer estimate. Each of the D levels gets 1/(D+1) of the tolerance and the far tails,
 * where inner runs meet an absolute tolerance, the last share; the estimate is the sum actually met.
 * Singularities inside the region, off the split lines, are not this routine's to place: the axial
 * half-plane goes through integrateAxial, which puts each nucleus at the origin of polar coordinates.
 */
export function integrateProduct(integrand: ProductIntegrand, components: number, axes: CubatureAxis[], options: CubatureOptions = {}): CubatureResult {
  const dims = axes.length;
  if (dims < 2 || dims > 3) throw new RangeError('integrateProduct: 2 or 3 axes are needed');
  if (!Number.isInteger(components) || components < 1) throw new RangeError('integrateProduct: components must be a positive integer');
  // One share of the tolerance per level and one for the far tails' absolute tolerance (TAIL_SHARE).
  const relTol = (options.relTol ?? CUBATURE_DEFAULTS.relTol) / (dims + 1);
  const absTol = (options.absTol ?? CUBATURE_DEFAULTS.absTol) / (dims + 1);
  const maxIntervals = options.maxIntervals ?? CUBATURE_DEFAULTS.maxIntervals;
  const order = options.order ?? Array.from(axes.keys());
  if (order.length !== dims || new Set(order).size !== dims || !order.every((i) => Number.isInteger(i) && i >= 0 && i < dims)) {
    throw new RangeError('integrateProduct: order must list each axis once');
  }
  const levels: Level[] = order.map((i) => {
    const axis = axes[i];
    if (!(axis.lo < axis.hi)) throw new RangeError(`integrateProduct: axis ${i} needs lo < hi`);
    if (!(axis.scale > 0)) throw new RangeError(`integrateProduct: axis ${i} needs a positive scale`);
    const interior = Number.isFinite(axis.center) ? [...axis.breakpoints, axis.center] : axis.breakpoints;
    return { axis: i, scale: axis.scale, splits: splitPoints({ lo: axis.lo, hi: axis.hi, walls: [] }, interior), width: effectiveWidth(axis) };
  });
  const setting = { integrand, components, levels, relTol, absTol, maxIntervals, start: options.start };
  const result = nest(setting, TAIL_SHARE);
  // Should the tails' share of the error have added up to more than the tolerance, the tails are redone at full relative accuracy.
  const requested = options.relTol ?? CUBATURE_DEFAULTS.relTol;
  const within = result.errorEstimates.every((error, k) => error <= Math.max((dims + 1) * absTol, requested * result.absValues[k]));
  if (!result.converged || within) return result.outcome;
  const again = nest(setting, 0);
  return { ...again.outcome, evaluations: result.outcome.evaluations + again.outcome.evaluations };
}

interface Level {
  axis: number;
  scale: number;
  splits: number[];
  width: number;
}

interface Setting {
  integrand: ProductIntegrand;
  components: number;
  levels: Level[];
  relTol: number;
  absTol: number;
  maxIntervals: number;
  start: CubaturePartition | undefined;
}

/**
 * An inner run whose integral is small beside the largest one met at its level so far is asked for
 * an absolute error of TAIL_SHARE times the relative tolerance of that largest one rather than for
 * a relative one of its own: the far tails of a trial then take one panel per segment instead of as
 * many as its middle. The errors actually estimated are what is summed.
 */
const TAIL_SHARE = 0.1;

function nest(setting: Setting, tailShare: number): { outcome: CubatureResult; converged: boolean; errorEstimates: Float64Array; absValues: Float64Array } {
  const { integrand, components, levels, relTol, absTol, maxIntervals, start } = setting;
  const dims = levels.length;
  const point = new Float64Array(dims);
  let evaluations = 0;
  // The worst failure met at any level.
  const failure: { status: IntegrationStatus; message: string | null } = { status: 'converged', message: null };
  const note = (result: IntegrationResult, level: number): void => {
    if (STATUS_RANK[result.status] <= STATUS_RANK[failure.status]) return;
    failure.status = result.status;
    const where = levels.slice(0, level).map(({ axis }) => `x${axis} = ${point[axis]}`).join(', ');
    failure.message = `${where ? `at ${where}, ` : ''}axis ${levels[level].axis}: ${result.message}`;
  };

  // Levels from the innermost out: the innermost hands out the integrand's components; every other
  // level hands out its inner run's values followed by that run's total error estimates.
  // Per level, the nodes met and the partitions of the runs inside them, and where to start those runs from.
  const collected = levels.map(() => ({ nodes: [] as number[], trees: [] as NestedPartition[] }));
  const context: (NestedPartition | undefined)[] = levels.map(() => undefined);
  context[0] = start?.tree;
  let innerPanels = 0;
  const innermostAxis = levels[dims - 1].axis;
  const innermost: VectorIntegrand = (x, out) => {
    point[innermostAxis] = x;
    evaluations++;
    integrand(point, out);
  };
  let inner = innermost;
  let innerComponents = components;
  // An inner run's absolute tolerance is per unit of the coordinates outside it.
  let outerWidth = levels.reduce((product, { width }) => product * width, 1) / levels[dims - 1].width;
  for (let level = dims - 2; level >= 0; level--) {
    const run = inner;
    const runComponents = innerComponents;
    const runLevel = level + 1;
    const baseAbsTol = absTol / outerWidth;
    const runOptions: IntegrationOptions = {
      breakpoints: levels[runLevel].splits, scale: levels[runLevel].scale, relTol, absTol: baseAbsTol, maxIntervals,
      tested: components, start: undefined,
    };
    outerWidth /= levels[level].width;
    const levelAxis = levels[level].axis;
    const peaks = new Float64Array(components);
    inner = (x, out) => {
      point[levelAxis] = x;
      const from = context[level];
      const child = from && from.nodes.length > 0 ? from.inner[nearest(from.nodes, x)] : undefined;
      runOptions.start = child?.panels;
      context[runLevel] = child;
      collected[runLevel].nodes.length = 0;
      collected[runLevel].trees.length = 0;
      let smallest = Infinity;
      for (let k = 0; k < components; k++) if (peaks[k] > 0) smallest = Math.min(smallest, peaks[k]);
      runOptions.absTol = smallest < Infinity ? Math.max(baseAbsTol, tailShare * relTol * smallest) : baseAbsTol;
      const result = integrateVector(run, runComponents, runOptions);
      for (let k = 0; k < components; k++) peaks[k] = Math.max(peaks[k], result.absValues[k]);
      collected[level].nodes.push(x);
      collected[level].trees.push(sortedTree(result.partition, collected[runLevel]));
      innerPanels += result.partition.panels.length / 3;
      if (result.status !== 'converged') note(result, runLevel);
      totalErrors(result, components, out);
    };
    innerComponents = 2 * components;
  }

  const outer = integrateVector(inner, innerComponents, {
    breakpoints: levels[0].splits, scale: levels[0].scale, relTol, absTol, maxIntervals, tested: components, start: start?.tree.panels,
  });
  if (outer.status !== 'converged') note(outer, 0);
  const values = outer.values.slice(0, components);
  const errorEstimates = new Float64Array(components);
  totalErrors(outer, components, errorEstimates, 0);
  const placedPanels = start ? start.placedPanels : innerPanels;
  const { status, message } = failure;
  const carried = status !== 'non-finite' && innerPanels <= CARRY_LIMIT * placedPanels;
  const partition = carried ? { tree: sortedTree(outer.partition, collected[0]), placedPanels } : null;
  const converged = status === 'converged';
  return { outcome: { values, errorEstimates, evaluations, converged, status, message, partition }, converged, errorEstimates, absValues: outer.absValues };
}

/**
 * The length over which an integrand along this axis matters: the range when finite, else the
 * 40 scales on each infinite side within which a function decaying at that scale lives (common practice).
 * It only shares an absolute tolerance out among inner runs: their actual errors are summed.
 */
function effectiveWidth(axis: CubatureAxis): number {
  const finiteLo = Number.isFinite(axis.lo);
  const finiteHi = Number.isFinite(axis.hi);
  if (finiteLo && finiteHi) return axis.hi - axis.lo;
  const end = finiteLo ? axis.lo : finiteHi ? axis.hi : axis.center;
  const reach = Number.isFinite(axis.center) ? Math.abs(axis.center - end) : 0;
  return reach + 40 * ((finiteLo ? 0 : 1) + (finiteHi ? 0 : 1)) * axis.scale;
}

function sortedTree(panels: Partition, { nodes, trees }: { nodes: number[]; trees: NestedPartition[] }): NestedPartition {
  const order = Array.from(nodes.keys()).sort((i, j) => nodes[i] - nodes[j]);
  return { panels, nodes: Float64Array.from(order, (i) => nodes[i]), inner: order.map((i) => trees[i]) };
}

/** Index of the entry of the sorted, non-empty `xs` nearest to x, by bisection. */
function nearest(xs: Float64Array, x: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  return Math.abs(xs[hi] - x) < Math.abs(x - xs[lo]) ? hi : lo;
}

/**
 * The values of a run and their total error: the run's own estimate plus, when its integrand carried
 * the error estimates of inner integrals in components C..2C-1, their integral and its estimate.
 * Written to out[0..C) and out[C..2C), or with `offset` 0 only the errors to out[0..C).
 */
function totalErrors(result: IntegrationResult, components: number, out: Float64Array, offset = components): void {
  const { values, errorEstimates } = result;
  const nested = values.length > components;
  for (let k = 0; k < components; k++) {
    if (offset > 0) out[k] = values[k];
    out[offset + k] = nested
      ? errorEstimates[k] + Math.abs(values[components + k]) + errorEstimates[components + k]
      : errorEstimates[k];
  }
}
