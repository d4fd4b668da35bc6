import type { GridLevels } from './grid-levels.ts';
import type { FieldPlacement } from './field-probe.ts';
import type { FieldProblem, PointFunction } from './problem.ts';

/** What the overlap reads of a product grid. */
export interface ProductGridLevels {
  axes: Array<{ nodes: Float64Array; weights: Float64Array }>;
  states: Float64Array[];
}

export interface FieldGridReference {
  /** The product grid summarised as the result's grid (levels, convergence, size, the first axis's domain). */
  grid: GridLevels | null;
  gridError: string | null;
  referenceMs: number;
  /** The product grid itself: its axes and states, for the overlap. */
  product: ProductGridLevels | null;
  /** Where the reference defines one, the energy below which the system is bound (two-electron: the one-electron ion's ground level). */
  bindingThreshold?: number | null;
}

/** The independent product-grid solution of the block's Hamiltonian; until the product grid is wired in, it says so. */
export function fieldGridReference(problem: FieldProblem, placement: FieldPlacement): FieldGridReference {
  void placement;
  if (!problem.reference.solve) return { grid: null, gridError: null, referenceMs: 0, product: null };
  return { grid: null, gridError: 'the product-grid reference for this space is not wired in yet', referenceMs: 0, product: null };
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
