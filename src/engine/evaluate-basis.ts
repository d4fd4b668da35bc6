import { findBreakpoints } from './breakpoints.ts';
import { claimChecks, optimiserChecks, referenceChecks } from './checks.ts';
import { groundOverlap, invalidResult, type EngineResult } from './evaluate-problem.ts';
import { ATOMIC_DISPLAY, g } from './format.ts';
import { gridReference } from './grid-reference.ts';
import { optimiseLinearBasis, solveLinearBasis, type LinearBasisProblem, type LinearBasisResult } from './linear-basis.ts';
import { hamiltonianSwitches, massPositiveCheck } from './mass-profile.ts';
import type { MinimizeResult } from './minimize.ts';
import { plotData } from './plot-data.ts';
import type { BasisProblem } from './problem.ts';
import { spaceOf } from './spaces/space-of.ts';
import { gradedCheck, statusOf, type GradedCheck } from './status.ts';
import { COMPARISON_FLOOR, ENERGY_RELATIVE_ERROR_LIMIT } from './tolerances.ts';
import { probeTrial } from './trial-probe.ts';
import { GROUND_LEVEL } from './parity.ts';
import { virialReport } from './virial.ts';

/**
 * Evaluates a block on the linear variational method: the lowest levels of H in the span of the basis (optimising
 * shared nonlinear parameters for the lowest), each an upper bound to the exact level of the same index
 * (Hylleraas–Undheim–MacDonald), measured against the grid reference level by level.
 */
export function evaluateBasisProblem(problem: BasisProblem): EngineResult {
  const started = performance.now();
  const domain = spaceOf(problem);
  const start = problem.parameters.map((p) => p.start);
  const counts = { energyEvaluations: 0, trialEvaluations: 0 };
  const show = problem.display ?? ATOMIC_DISPLAY;
  const { functions, setParameters, switches } = problem.basis;

  // Kinks of the potential and of the basis are searched for where the basis lives at the start values.
  setParameters(start);
  const envelope = (x: number) => Math.sqrt(functions.reduce((sum, f) => sum + f.value(x) ** 2, 0));
  const probe = probeTrial(envelope, domain);
  const massFault = massPositiveCheck(problem, domain, probe.center, probe.scale);
  if (massFault) return invalidResult([massFault], { energyEvaluations: 0, trialEvaluations: probe.evaluations }, started);
  const breaks = [...new Set([...findBreakpoints(hamiltonianSwitches(problem), domain.lo, domain.hi, probe.center, probe.scale).points, ...findBreakpoints(switches, domain.lo, domain.hi, probe.center, probe.scale).points])].sort((a, b) => a - b);
  const linear: LinearBasisProblem = { ...problem, basis: { functions, setParameters }, breakpoints: breaks, states: problem.states };

  let optimiser: MinimizeResult | null = null;
  let best = start;
  let solution: LinearBasisResult;
  if (problem.parameters.length > 0) {
    const found = optimiseLinearBasis(linear, problem.parameters);
    ({ optimiser, solution } = found);
    best = found.parameters;
    counts.energyEvaluations = found.solves;
    counts.trialEvaluations = probe.evaluations + found.evaluations;
  } else {
    solution = solveLinearBasis(linear, []);
    counts.energyEvaluations = 1;
    counts.trialEvaluations = probe.evaluations + solution.evaluations;
  }
  if (solution.failure !== null || solution.levels.length === 0) {
    return invalidResult([gradedCheck('basis-usable', false, solution.failureDetail ?? 'no level could be computed from the basis', 'invalid')], counts, started);
  }
  const levels = solution.levels;
  const ground = levels[0];
  const energy = ground.energy;
  const overlapInfo = solution.overlap!;
  const checks: GradedCheck[] = [
    gradedCheck(
      'basis-usable',
      true,
      `${functions.length} functions, ${overlapInfo.kept} independent combinations kept (overlap matrix ${overlapInfo.summary})`,
      'invalid',
    ),
    gradedCheck(
      'states-available',
      levels.length >= problem.states,
      levels.length >= problem.states ? `${problem.states} levels asked, ${levels.length} computed` : `${problem.states} levels asked, but the basis spans only ${levels.length} independent combinations`,
      'unsettled',
    ),
  ];
  const relError = ground.errorEstimate / Math.max(Math.abs(energy), Number.MIN_VALUE);
  checks.push(
    gradedCheck(
      'integrals-converged',
      relError <= ENERGY_RELATIVE_ERROR_LIMIT,
      `lowest level's error estimate from the matrix elements ${show.energy(ground.errorEstimate, 3)} (${g(relError, 3)} relative; limit ${ENERGY_RELATIVE_ERROR_LIMIT})`,
      'unsettled',
    ),
  );
  if (optimiser) checks.push(...optimiserChecks(problem, optimiser));

  // The lowest combination at the optimum (normalised: c^T S c = 1): where it lives guides the grid, and it is
  // the state of the overlap and the density plot. The basis as a whole may reach much farther out.
  setParameters(best);
  const c = ground.coefficients;
  const value = (x: number) => functions.reduce((sum, f, i) => sum + c[i] * f.value(x), 0);
  const state = { value, setParameters };
  const groundProbe = probeTrial(value, domain);
  counts.trialEvaluations += groundProbe.evaluations * functions.length;

  const { grid, gridError, referenceMs } = gridReference(problem, domain, breaks, { center: groundProbe.center, width: groundProbe.scale }, Math.max(2, problem.states));
  const tolerance = (level: { energy: number; errorEstimate: number }) => 10 * level.errorEstimate + COMPARISON_FLOOR * Math.max(1, Math.abs(level.energy));
  checks.push(...referenceChecks(problem, energy, tolerance(ground), grid, gridError));
  if (grid && grid.converged) {
    for (let k = 1; k < levels.length; k++) {
      const exact = grid.levels[k];
      if (exact === undefined) continue;
      const slack = tolerance(levels[k]) + 10 * (grid.errorEstimate[k] ?? 0);
      checks.push(
        gradedCheck(
          `above-grid-level-${k}`,
          levels[k].energy >= exact - slack,
          `E${k} - E${k}(grid) = ${show.energy(levels[k].energy - exact, 4)} (must be >= -${show.energy(slack, 2)}: each level is an upper bound to the exact level of its index)`,
          'below-reference',
        ),
      );
    }
  }
  if (problem.claim) checks.push(...claimChecks(problem, energy, best));

  const overlap = grid ? groundOverlap(value, domain, grid, 1) : null;
  const { status, message } = statusOf(checks);
  const timings = { variationalMs: performance.now() - started - referenceMs, referenceMs };
  const plots = plotData(
    {
      problem: { ...problem, trial: state },
      domain,
      optimum: best,
      energyAt: (p) => solveLinearBasis(linear, p).levels[0]?.energy ?? NaN,
      kinetic: ground.kinetic,
      curvature: optimiser?.hessian ?? null,
      norm: 1,
      center: groundProbe.center,
      scale: groundProbe.scale,
      grid,
    },
    problem.plots,
  );
  setParameters(best);
  return {
    status,
    message: message ?? solution.warning,
    energy,
    energyError: ground.errorEstimate,
    parameters: problem.parameters.map((p, i) => ({ name: p.name, value: best[i] })),
    components: { kinetic: ground.kinetic, potential: ground.potential, norm: 1 },
    variance: null,
    grid,
    gridError,
    bounds: { upper: energy, lower: null, weinstein: null, nextLevel: levels[1]?.energy ?? null },
    overlap,
    ...virialReport(problem.potential, domain.walls, domain.lo === -Infinity, ground.kinetic, ground.potential, Boolean(problem.massProfile)),
    optimiser,
    checks,
    counts,
    timings,
    plots,
    states: levels.map((level, k) => ({ energy: level.energy, errorEstimate: level.errorEstimate, reference: grid?.levels[k] ?? null })),
    level: GROUND_LEVEL,
    basis: {
      functions: functions.length,
      kept: overlapInfo.kept,
      dropped: overlapInfo.dropped,
      conditionNumber: Number.isFinite(overlapInfo.conditionNumber) ? overlapInfo.conditionNumber : null,
      keptConditionNumber: overlapInfo.keptConditionNumber,
      conditioning: overlapInfo.summary,
      warning: solution.warning,
    },
  };
}
