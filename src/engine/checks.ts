import { eckartOverlapFloor } from './bounds.ts';
import { ATOMIC_DISPLAY, g, type ValueDisplay } from './format.ts';
import type { GridLevels } from './grid-levels.ts';
import type { MinimizeResult } from './minimize.ts';
import { describeLevel, GROUND_LEVEL, type TargetLevel } from './parity.ts';
import type { ProblemBase } from './problem.ts';
import { gradedCheck, measured, type GradedCheck } from './status.ts';

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

/** How check details name the grid level compared with: E0(grid) for the ground level. */
export function gridLevelName(target: TargetLevel): string {
  return target.symmetry === null && target.index === 0 ? 'E0(grid)' : `E(grid, ${describeLevel(target)})`;
}

/**
 * The variational energy against the grid level the block targets (the ground level by default) and the published
 * value; the grid against the published value.
 */
export function referenceChecks(problem: CheckedProblem, energy: number, tolerance: number, grid: GridLevels | null, gridError: string | null, target: TargetLevel = GROUND_LEVEL): GradedCheck[] {
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
            ? `grid levels settled on ${grid.size} points after ${grid.refinements} refinements (change ${grid.errorEstimate.map((e) => g(e, 2)).join(', ')})`
            : `grid solution did not settle: ${grid.message ?? 'no reason given'}`
          : `grid solution failed: ${gridError}`,
        'unsettled',
      ),
    );
    const name = gridLevelName(target);
    if (grid && grid.levels.length > 0 && grid.levels.length <= target.gridIndex) {
      checks.push(
        gradedCheck('grid-level-bound', false, `the grid finds no bound ${describeLevel(target)}: ${grid.levels.length} bound level${grid.levels.length === 1 ? '' : 's'} below the continuum threshold ${show.energy(grid.threshold)}`, 'unsettled'),
      );
    }
    if (grid && grid.levels.length > target.gridIndex) {
      const e0 = grid.levels[target.gridIndex];
      const slack = tolerance + 10 * (grid.errorEstimate[target.gridIndex] ?? 0);
      checks.push(
        measured(
          gradedCheck('above-grid-reference', energy >= e0 - slack, `E - ${name} = ${show.energy(energy - e0, 4)} (must be >= -${show.energy(slack, 2)})`, 'below-reference'),
          { value: energy - e0, limit: -slack, relation: '>=', quantity: 'energy' },
        ),
      );
      if (published) {
        const gap = Math.abs(e0 - published.value);
        const allowed = published.tolerance + slack;
        checks.push(
          measured(
            gradedCheck('grid-matches-published', gap <= allowed, `|${name} - published| = ${show.energy(gap, 3)} (allowed ${show.energy(allowed, 3)}: the published value's precision plus the grid's)${toleranceNote(published, show)}`, 'unsettled'),
            { value: gap, limit: allowed, relation: '<=', quantity: 'energy' },
          ),
        );
      }
    }
  }
  if (published) {
    const slack = published.tolerance + tolerance;
    checks.push(
      measured(
        gradedCheck('above-published-reference', energy >= published.value - slack, `E - E(published) = ${show.energy(energy - published.value, 4)} (must be >= -${show.energy(slack, 2)}; ${published.source})${toleranceNote(published, show)}`, 'below-reference'),
        { value: energy - published.value, limit: -slack, relation: '>=', quantity: 'energy' },
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
      measured(
        gradedCheck('claim-energy', off <= claim.energy.tolerance, `claimed ${show.energy(claim.energy.value)} +/- ${show.energy(claim.energy.tolerance, 3)}, recomputed ${show.energy(energy)} (off by ${show.energy(off, 3)})`, 'disputed'),
        { value: off, limit: claim.energy.tolerance, relation: '<=', quantity: 'energy' },
      ),
    );
  }
  for (const [name, claimed] of Object.entries(claim.parameters)) {
    const index = problem.parameters.findIndex((p) => p.name === name);
    const value = best[index];
    const off = Math.abs(value - claimed.value);
    checks.push(
      measured(
        gradedCheck(`claim-parameter-${name}`, off <= claimed.tolerance, `claimed ${name} = ${show.parameter(name, claimed.value)} +/- ${show.parameter(name, claimed.tolerance, 3)}, optimum ${show.parameter(name, value)} (off by ${show.parameter(name, off, 3)})`, 'disputed'),
        { value: off, limit: claimed.tolerance, relation: '<=', quantity: { parameter: name } },
      ),
    );
  }
  return checks;
}

/** Which tolerance the published value was given and why, for the details of the checks that use it. */
function toleranceNote(published: NonNullable<ProblemBase['reference']['published']>, show: typeof ATOMIC_DISPLAY): string {
  return published.toleranceBasis ? `; published value taken to +/- ${show.energy(published.tolerance, 3)}, ${published.toleranceBasis}` : '';
}

/**
 * Temple's bound against the targeted grid level e0, and Eckart's overlap floor. Restricted to the states of one parity,
 * Temple's bound holds for the level below the next one of that parity, and Eckart's for the lowest level of that parity
 * with E1 the next; above the lowest level Eckart's criterion says nothing, so it is left out.
 */
export function boundChecks(energy: number, lower: number | null, overlap: number | null, e0: number, target: TargetLevel, nextLevel: number | null, tolerance: number, show: ValueDisplay): GradedCheck[] {
  const checks: GradedCheck[] = [];
  if (lower !== null) {
    checks.push(
      gradedCheck(
        'temple-below-grid',
        lower <= e0 + tolerance,
        `Temple's lower bound ${show.energy(lower)} against ${gridLevelName(target)} ${show.energy(e0)} (with E1 = ${show.energy(nextLevel ?? NaN)})`,
        'unsettled',
      ),
    );
  }
  const floor = target.index === 0 ? eckartOverlapFloor(energy, e0, nextLevel) : null;
  if (overlap !== null && floor !== null) {
    const state = target.symmetry === null ? 'ground state' : `state of the ${describeLevel(target)}`;
    checks.push(
      gradedCheck(
        'eckart-overlap',
        overlap >= floor - 1e-6,
        `overlap with the grid ${state} ${g(overlap, 8)} (Eckart's floor ${g(floor, 8)})`,
        'unsettled',
      ),
    );
  }
  return checks;
}
