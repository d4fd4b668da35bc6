// Integrals over a product of 2 or 3 coordinate ranges (a rectangle or box, ends possibly infinite),
// several integrands at once: the norm, kinetic and potential integrals of a trial share its values.
import { splitPoints } from '../domain.ts';
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
  /** Where to start from: a previous result's `partition`, at nearby parameters of the same integrand. */
  start?: CubaturePartition;
}

/**
 * The panels a run settled on: the outermost run's, and the second coordinate's at each outermost
 * node (sorted by that node), so that a run at nearby parameters evaluates the leaves at once
 * instead of passing through the coarser panels an adaptive run from whole segments needs.
 */
export interface CubaturePartition {
  outer: Partition;
  nodes: Float64Array;
  inner: Partition[];
  /** Panels of the second coordinate summed over the nodes at the run that started from whole segments. */
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

const STATUS_RANK: Record<IntegrationStatus, number> = { converged: 0, roundoff: 1, 'interval-limit': 2, 'non-finite': 3 };

/**
 * Iterated adaptive Gauss–Kronrod integration over a product region (QUADPACK's globally adaptive QAG/QAGI
 * in each coordinate, Piessens, de Doncker-Kapenga, Überhuber & Kahaner, QUADPACK, Springer 1983; nesting
 * as in Davis & Rabinowitz, Methods of Numerical Integration, 1984, §5.6): axes[0] is the outermost
 * coordinate. Each inner integral is itself adaptive, so a point singularity on a split line (a nucleus
 * at z = z0 on the axis rho = 0) is refined only where it is; every inner run's error estimate is
 * integrated along by the outer run and added to the outer estimate, and each of the D levels gets
 * 1/D of the tolerance, so the reported estimate covers both.
 */
export function integrateProduct(integrand: ProductIntegrand, components: number, axes: CubatureAxis[], options: CubatureOptions = {}): CubatureResult {
  const dims = axes.length;
  if (dims < 2 || dims > 3) throw new RangeError('integrateProduct: 2 or 3 axes are needed');
  if (!Number.isInteger(components) || components < 1) throw new RangeError('integrateProduct: components must be a positive integer');
  const relTol = (options.relTol ?? CUBATURE_DEFAULTS.relTol) / dims;
  const absTol = (options.absTol ?? CUBATURE_DEFAULTS.absTol) / dims;
  const maxIntervals = options.maxIntervals ?? CUBATURE_DEFAULTS.maxIntervals;
  const splits = axes.map((axis, i) => {
    if (!(axis.lo < axis.hi)) throw new RangeError(`integrateProduct: axis ${i} needs lo < hi`);
    const interior = Number.isFinite(axis.center) ? [...axis.breakpoints, axis.center] : axis.breakpoints;
    return splitPoints({ lo: axis.lo, hi: axis.hi, walls: [], radial: false }, interior);
  });

  const point = new Float64Array(dims);
  let evaluations = 0;
  let status: IntegrationStatus = 'converged';
  let message: string | null = null;
  const note = (result: IntegrationResult, level: number): void => {
    if (STATUS_RANK[result.status] <= STATUS_RANK[status]) return;
    status = result.status;
    const where = Array.from(point.subarray(0, level), (x, i) => `x${i} = ${x}`).join(', ');
    message = `${where ? `at ${where}, ` : ''}axis ${level}: ${result.message}`;
  };

  // Levels from the innermost out: the innermost hands out the integrand's components; every other
  // level hands out its inner run's values followed by that run's total error estimates.
  const start = options.start;
  const nodes: number[] = [];
  const partitions: Partition[] = [];
  let innerPanels = 0;
  const innermost: VectorIntegrand = (x, out) => {
    point[dims - 1] = x;
    evaluations++;
    integrand(point, out);
  };
  let inner = innermost;
  let innerComponents = components;
  for (let level = dims - 2; level >= 0; level--) {
    const run = inner;
    const runComponents = innerComponents;
    const runLevel = level + 1;
    const runOptions: IntegrationOptions = {
      breakpoints: splits[runLevel], scale: axes[runLevel].scale, relTol, absTol: 0, maxIntervals,
      tested: components, start: undefined,
    };
    inner = (x, out) => {
      point[level] = x;
      if (level === 0 && start) runOptions.start = start.inner[nearest(start.nodes, x)];
      const result = integrateVector(run, runComponents, runOptions);
      if (level === 0) {
        nodes.push(x);
        partitions.push(result.partition);
        innerPanels += result.partition.panels.length / 3;
      }
      if (result.status !== 'converged') note(result, runLevel);
      totalErrors(result, components, out);
    };
    innerComponents = 2 * components;
  }

  const outer = integrateVector(inner, innerComponents, {
    breakpoints: splits[0], scale: axes[0].scale, relTol, absTol, maxIntervals, tested: components, start: start?.outer,
  });
  if (outer.status !== 'converged') note(outer, 0);
  const values = outer.values.slice(0, components);
  const errorEstimates = new Float64Array(components);
  totalErrors(outer, components, errorEstimates, 0);
  const placedPanels = start ? start.placedPanels : innerPanels;
  const carried = status !== 'non-finite' && innerPanels <= CARRY_LIMIT * placedPanels;
  const partition = carried ? sortedPartition(outer.partition, nodes, partitions, placedPanels) : null;
  return { values, errorEstimates, evaluations, converged: status === 'converged', status, message, partition };
}

function sortedPartition(outer: Partition, nodes: number[], partitions: Partition[], placedPanels: number): CubaturePartition {
  const order = Array.from(nodes.keys()).sort((i, j) => nodes[i] - nodes[j]);
  return { outer, nodes: Float64Array.from(order, (i) => nodes[i]), inner: order.map((i) => partitions[i]), placedPanels };
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
