import { eckartOverlapFloor } from './bounds.ts';
import { ATOMIC_DISPLAY, g, type ValueDisplay } from './format.ts';
import type { GridLevels } from './grid-levels.ts';
import type { MinimizeResult } from './minimize.ts';
import type { ProblemBase } from './problem.ts';
import { gradedCheck, type GradedCheck } from './status.ts';

/** What the checks read of a grid solution, one coordinate or several. */
export type ReferenceGrid = Pick<GridLevels, 'levels' | 'converged' | 'size' | 'refinements' | 'errorEstimate' | 'message' | 'correlated'>;

/** What the checks shared by the trial and the basis evaluations read from a problem. */
export type CheckedProblem = Pick<ProblemBase, 'parameters' | 'reference' | 'claim' | 'display'>;

/** Converged, and not pressed against a parameter limit. */
export function optimiserChecks(problem: CheckedProblem, optimiser: MinimizeResult): GradedCheck[] {
  const show = problem.display ?? ATOMIC_DISPLAY;
  const active = problem.parameters.flatMap((p, i) => {
    const side = optimiser.activeLimits[i];
    return side ? [`${p.name} sits on its ${side} ${show.parameter(p.name, side === 'min' ? p.min : p.max)}`] : [];
  });
  return [
    gradedCheck(
      'optimiser-converged',
      optimiser.converged,
      optimiser.converged
        ? `${optimiser.method} converged in ${optimiser.iterations} iterations, ${optimiser.evaluations} energy evaluations${optimiser.starts > 1 ? ' (a second search from a multistart point)' : ''}`
        : `${optimiser.method} did not converge: ${optimiser.message ?? 'no reason given'}`,
      'unsettled',
    ),
    gradedCheck(
      'optimum-interior',
      active.length === 0,
      active.length === 0 ? 'no parameter limit is active at the optimum' : `the optimum is on a limit: ${active.join(', ')}; widen the range`,
      'unsettled',
    ),
  ];
}

/** The variational energy against the grid's ground level and the published value; the grid against the published value. */
export function referenceChecks(problem: CheckedProblem, energy: number, tolerance: number, grid: ReferenceGrid | null, gridError: string | null): GradedCheck[] {
  const show = problem.display ?? ATOMIC_DISPLAY;
  const checks: GradedCheck[] = [];
  const published = problem.reference.published;
  if (problem.reference.solve) {
    const converged = grid !== null && grid.converged;
    checks.push(
      gradedCheck(
        'grid-converged',
        converged,
        grid
          ? grid.converged
            ? grid.correlated
              ? `correlated-basis levels settled at ${grid.size} functions after ${grid.refinements} enlargements (change ${grid.errorEstimate.map((e) => g(e, 2)).join(', ')})`
              : `grid levels settled on ${grid.size} points after ${grid.refinements} refinements (change ${grid.errorEstimate.map((e) => g(e, 2)).join(', ')})`
            : `grid solution did not settle: ${grid.message ?? 'no reason given'}`
          : `grid solution failed: ${gridError}`,
        'unsettled',
      ),
    );
    if (grid && grid.levels.length > 0) {
      const e0 = grid.levels[0];
      const slack = tolerance + 10 * (grid.errorEstimate[0] ?? 0);
      checks.push(
        gradedCheck(
          'above-grid-reference',
          energy >= e0 - slack,
          `E - E0(grid) = ${show.energy(energy - e0, 4)} (must be >= -${show.energy(slack, 2)})`,
          'below-reference',
        ),
      );
      if (published) {
        const gap = Math.abs(e0 - published.value);
        const allowed = published.tolerance + slack;
        checks.push(
          gradedCheck(
            'grid-matches-published',
            gap <= allowed,
            `|E0(grid) - published| = ${show.energy(gap, 3)} (allowed ${show.energy(allowed, 3)}: the published value's precision plus the grid's)`,
            'unsettled',
          ),
        );
      }
    }
  }
  if (published) {
    const slack = published.tolerance + tolerance;
    checks.push(
      gradedCheck(
        'above-published-reference',
        energy >= published.value - slack,
        `E - E(published) = ${show.energy(energy - published.value, 4)} (must be >= -${show.energy(slack, 2)}; ${published.source})`,
        'below-reference',
      ),
    );
  }
  return checks;
}

/** The author's claimed energy and parameters against the recomputation. */
export function claimChecks(problem: CheckedProblem, energy: number, best: number[]): GradedCheck[] {
  const show = problem.display ?? ATOMIC_DISPLAY;
  const claim = problem.claim!;
  const checks: GradedCheck[] = [];
  if (claim.energy) {
    const off = Math.abs(energy - claim.energy.value);
    checks.push(
      gradedCheck(
        'claim-energy',
        off <= claim.energy.tolerance,
        `claimed ${show.energy(claim.energy.value)} +/- ${show.energy(claim.energy.tolerance, 3)}, recomputed ${show.energy(energy)} (off by ${show.energy(off, 3)})`,
        'disputed',
      ),
    );
  }
  for (const [name, claimed] of Object.entries(claim.parameters)) {
    const index = problem.parameters.findIndex((p) => p.name === name);
    const value = best[index];
    const off = Math.abs(value - claimed.value);
    checks.push(
      gradedCheck(
        `claim-parameter-${name}`,
        off <= claimed.tolerance,
        `claimed ${name} = ${show.parameter(name, claimed.value)} +/- ${show.parameter(name, claimed.tolerance, 3)}, optimum ${show.parameter(name, value)} (off by ${show.parameter(name, off, 3)})`,
        'disputed',
      ),
    );
  }
  return checks;
}

/** Temple's lower bound against the grid's ground level, and the overlap with the grid state against Eckart's floor. */
export function boundChecks(energy: number, lower: number | null, overlap: number | null, grid: ReferenceGrid, nextLevel: number | null, tolerance: number, show: ValueDisplay): GradedCheck[] {
  const checks: GradedCheck[] = [];
  const e0 = grid.levels[0];
  if (lower !== null) {
    checks.push(
      gradedCheck(
        'temple-below-grid',
        lower <= e0 + tolerance,
        `Temple's lower bound ${show.energy(lower)} against E0(grid) ${show.energy(e0)} (with E1 = ${show.energy(nextLevel ?? NaN)})`,
        'unsettled',
      ),
    );
  }
  const floor = eckartOverlapFloor(energy, e0, nextLevel);
  if (overlap !== null && floor !== null) {
    checks.push(
      gradedCheck(
        'eckart-overlap',
        overlap >= floor - 1e-6,
        `overlap with the grid ground state ${g(overlap, 8)} (Eckart's floor ${g(floor, 8)})`,
        'unsettled',
      ),
    );
  }
  return checks;
}
