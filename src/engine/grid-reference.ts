import type { GridLevels } from './grid-levels.ts';
import type { ProblemBase } from './problem.ts';
import type { CoordinateSpace } from './spaces/space.ts';

export interface GridReference {
  grid: GridLevels | null;
  /** Why the grid could not be built at all (it throws only on a broken potential). */
  gridError: string | null;
  referenceMs: number;
}

/** The independent grid solution of a block's Hamiltonian on its space, unless the block turned it off (`reference.solve: false`). */
export function gridReference(problem: ProblemBase, space: CoordinateSpace, breakpoints: number[], hint: { center: number; width: number }, levels?: number): GridReference {
  const started = performance.now();
  if (!problem.reference.solve) return { grid: null, gridError: null, referenceMs: 0 };
  try {
    const grid = space.gridLevels({ mass: problem.mass, massProfile: problem.massProfile ?? null, potential: problem.potential, breakpoints, hint, levels, display: problem.display });
    return { grid, gridError: null, referenceMs: performance.now() - started };
  } catch (error) {
    return { grid: null, gridError: error instanceof Error ? error.message : String(error), referenceMs: performance.now() - started };
  }
}
