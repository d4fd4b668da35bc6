import type { GridLevels } from './grid-levels.ts';
import { productGridLevels, type ProductGridLevels } from './grid-nd/product-grid-levels.ts';
import type { FieldPlacement } from './field-probe.ts';
import type { FieldProblem, PointFunction } from './problem.ts';

export interface FieldGridReference {
  /** The product grid summarised as the result's grid (levels, convergence, size, the first axis's domain). */
  grid: GridLevels | null;
  gridError: string | null;
  referenceMs: number;
  /** The product grid itself: its axes and states, for the overlap. */
  product: ProductGridLevels | null;
}

/**
 * Levels of a product grid are settled to this relative change: a product grid costs the cube or more of a line's
 * points, and 1e-7 is what the grid reference of a space of several coordinates is asked for (common practice).
 */
export const FIELD_GRID_REL_TOL = 1e-7;

/** The independent product-grid solution of the block's Hamiltonian on its space, placed where the trial lives, unless turned off. */
export function fieldGridReference(problem: FieldProblem, placement: FieldPlacement, levels?: number): FieldGridReference {
  const started = performance.now();
  if (!problem.reference.solve) return { grid: null, gridError: null, referenceMs: 0, product: null };
  try {
    const product = productGridLevels({ ...problem.space.gridProblem(problem.potential, placement.axes), levels, relTol: FIELD_GRID_REL_TOL });
    return { grid: summary(product), gridError: null, referenceMs: performance.now() - started, product };
  } catch (error) {
    return { grid: null, gridError: error instanceof Error ? error.message : String(error), referenceMs: performance.now() - started, product: null };
  }
}

/** |<psi|psi0>|^2 / <psi|psi> with the product grid's quadrature weights (which hold the volume element). */
export function productOverlap(value: PointFunction, grid: ProductGridLevels, norm: number): number {
  const ground = grid.states[0];
  if (!ground) return NaN;
  const d = grid.axes.length;
  const point = new Float64Array(d);
  const index = new Array<number>(d).fill(0);
  let sum = 0;
  for (let i = 0; i < ground.length; i++) {
    let w = 1;
    for (let k = 0; k < d; k++) {
      point[k] = grid.axes[k].nodes[index[k]];
      w *= grid.axes[k].weights[index[k]];
    }
    sum += w * value(point) * ground[i];
    // Row-major, the last axis fastest.
    for (let k = d - 1; k >= 0; k--) {
      if (++index[k] < grid.axes[k].nodes.length) break;
      index[k] = 0;
    }
  }
  return (sum * sum) / norm;
}

function summary(product: ProductGridLevels): GridLevels {
  const none = new Float64Array(0);
  return {
    levels: product.levels,
    threshold: product.threshold,
    nodes: none,
    weights: none,
    ground: none,
    excited: null,
    states: [],
    domain: product.axes[0]?.domain ?? [NaN, NaN],
    converged: product.converged,
    errorEstimate: product.errorEstimate,
    refinements: product.refinements,
    size: product.size,
    elementOrder: Math.max(0, ...product.axes.map((a) => a.order)),
    elements: product.axes.reduce((sum, a) => sum + a.elements, 0),
    eigenIterations: product.eigenIterations,
    potentialEvaluations: product.potentialEvaluations,
    message: product.message,
    axes: product.axes.map((a) => ({ name: a.name, domain: a.domain, elements: a.elements, order: a.order })),
  };
}
