import { gridLevels, type GridLevels } from './grid-levels.ts';
import type { ProblemBase } from './problem.ts';

export interface GridReference {
  grid: GridLevels | null;
  /** Why the grid could not be built at all (it throws only on a broken potential). */
  gridError: string | null;
  referenceMs: number;
}

/** The independent grid solution of a block's Hamiltonian, unless the block turned it off (`reference.solve: false`). */
export function gridReference(problem: ProblemBase, breakpoints: number[], hint: { center: number; width: number }, levels?: number): GridReference {
  const started = performance.now();
  if (!problem.reference.solve) return { grid: null, gridError: null, referenceMs: 0 };
  try {
    const grid = gridLevels({
      space: problem.box ? 'box' : problem.space,
      mass: problem.mass,
      massProfile: problem.massProfile,
      potential: problem.potential,
      angularMomentum: problem.angularMomentum,
      box: problem.box ?? undefined,
      breakpoints,
      hint,
      levels,
      display: problem.display,
    });
    return { grid, gridError: null, referenceMs: performance.now() - started };
  } catch (error) {
    return { grid: null, gridError: error instanceof Error ? error.message : String(error), referenceMs: performance.now() - started };
  }
}
