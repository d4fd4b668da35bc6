import { eckartOverlapFloor, templeBound, weinsteinInterval } from './bounds.ts';
import { findBreakpoints } from './breakpoints.ts';
import { domainOf, type Domain } from './domain.ts';
import { expectation, type Expectation } from './expectation.ts';
import { g } from './format.ts';
import { gridLevels, type GridLevels } from './grid-levels.ts';
import { minimizeBounded, type MinimizeResult } from './minimize.ts';
import type { VariationalProblem } from './problem.ts';
import { probeTrial } from './trial-probe.ts';
import { gradedCheck, statusOf, type GradedCheck, type Status } from './status.ts';
import { energyVariance, type VarianceResult } from './variance.ts';
import { virialRatio, type Virial } from './virial.ts';

export interface EngineResult {
  status: Status;
  message: string | null;
  energy: number | null;
  energyError: number | null;
  parameters: Array<{ name: string; value: number }>;
  components: { kinetic: number; potential: number; norm: number } | null;
  variance: VarianceResult | null;
  grid: GridLevels | null;
  gridError: string | null;
  bounds: { upper: number | null; lower: number | null; weinstein: [number, number] | null; nextLevel: number | null };
  overlap: number | null;
  virial: Virial | null;
  optimiser: MinimizeResult | null;
  checks: GradedCheck[];
  counts: { energyEvaluations: number; trialEvaluations: number };
  /** Wall-clock split between the variational part and the grid reference. */
  timings: { variationalMs: number; referenceMs: number };
  /** Where the trial lives at the optimum, for plots and the grid's hint. */
  trialCenter: number | null;
  trialScale: number | null;
  splits: number[];
}

/** A trial counts as vanishing at a wall when |psi(wall)| is below this fraction of its peak. */
export const WALL_TOLERANCE = 1e-8;
/** Energies whose quadrature error estimate exceeds this (relative) are not trusted. */
export const ENERGY_RELATIVE_ERROR_LIMIT = 1e-9;
/** Floor of the tolerance in comparisons between energies, relative to their size. */
const COMPARISON_FLOOR = 1e-11;

/**
 * Evaluates one variational problem: checks the trial, minimises <H> over the varied parameters,
 * then measures the optimum against an independent grid solution, bounds and the author's claim.
 */
export function evaluateProblem(problem: VariationalProblem): EngineResult {
  const started = performance.now();
  const domain = domainOf(problem.space, problem.box);
  const start = problem.parameters.map((p) => p.start);
  const counts = { energyEvaluations: 0, trialEvaluations: 0 };
  problem.trial.setParameters(start);

  // The potential's kinks are searched for around where the trial lives, once for the whole search.
  const startProbe = probeTrial(problem.trial.value, domain);
  counts.trialEvaluations += startProbe.evaluations;
  const potentialBreaks = findBreakpoints(problem.potentialSwitches, domain.lo, domain.hi, startProbe.center, startProbe.scale).points;
  const atStart = evaluate(problem, domain, potentialBreaks, start, counts);
  const startChecks = trialChecks(problem, domain, atStart, 'the start values');
  if (startChecks.some((c) => !c.pass)) return invalidResult(startChecks, counts, started);

  let optimiser: MinimizeResult | null = null;
  let best = start;
  if (problem.parameters.length > 0) {
    optimiser = minimizeBounded((p) => evaluate(problem, domain, potentialBreaks, p, counts).energy, problem.parameters);
    best = Array.from(optimiser.x);
  }
  const optimum = evaluate(problem, domain, potentialBreaks, best, counts);
  const optimumChecks = trialChecks(problem, domain, optimum, 'the optimum');
  if (optimumChecks.some((c) => !c.pass)) return invalidResult(optimumChecks, counts, started);

  const checks: GradedCheck[] = [...optimumChecks];
  const energy = optimum.energy;
  const relError = optimum.errorEstimate / Math.max(Math.abs(energy), Number.MIN_VALUE);
  checks.push(
    gradedCheck(
      'integrals-converged',
      relError <= ENERGY_RELATIVE_ERROR_LIMIT,
      `energy quadrature error estimate ${g(optimum.errorEstimate, 3)} (${g(relError, 3)} relative; limit ${ENERGY_RELATIVE_ERROR_LIMIT})`,
      'unsettled',
    ),
  );
  if (optimiser) checks.push(...optimiserChecks(problem, optimiser));

  problem.trial.setParameters(best);
  const variance = energyVariance(problem, domain, optimum.splits, optimum.probe.scale, optimum.probe.peakAmplitude, energy, optimum.norm);

  const gridStarted = performance.now();
  let grid: GridLevels | null = null;
  let gridError: string | null = null;
  if (problem.reference.solve) {
    try {
      grid = gridLevels({
        space: problem.box ? 'box' : problem.space,
        mass: problem.mass,
        potential: problem.potential,
        angularMomentum: problem.angularMomentum,
        box: problem.box ?? undefined,
        breakpoints: potentialBreaks,
        hint: { center: optimum.probe.center, width: optimum.probe.scale },
      });
    } catch (error) {
      gridError = error instanceof Error ? error.message : String(error);
    }
  }
  const referenceMs = performance.now() - gridStarted;
  const tolerance = 10 * optimum.errorEstimate + COMPARISON_FLOOR * Math.max(1, Math.abs(energy));
  checks.push(...referenceChecks(problem, energy, tolerance, grid, gridError));

  const nextLevel = grid ? (grid.levels.length > 1 ? grid.levels[1] : grid.threshold) : null;
  const lower = templeBound(energy, variance.value, nextLevel);
  const overlap = grid ? groundOverlap(problem, domain, grid, optimum.norm) : null;
  if (grid && grid.converged) checks.push(...boundChecks(energy, lower, overlap, grid, nextLevel, tolerance + 10 * (grid.errorEstimate[0] ?? 0)));
  if (problem.claim) checks.push(...claimChecks(problem, energy, best));

  const { status, message } = statusOf(checks);
  return {
    status,
    message,
    energy,
    energyError: optimum.errorEstimate,
    parameters: problem.parameters.map((p, i) => ({ name: p.name, value: best[i] })),
    components: { kinetic: optimum.kinetic, potential: optimum.potential, norm: optimum.norm },
    variance,
    grid,
    gridError,
    bounds: { upper: energy, lower, weinstein: weinsteinInterval(energy, variance.value), nextLevel },
    overlap,
    virial: virialRatio(problem.potential, domain.lo === -Infinity, optimum.kinetic, optimum.potential),
    optimiser,
    checks,
    counts: { ...counts, trialEvaluations: counts.trialEvaluations + variance.evaluations },
    timings: { variationalMs: performance.now() - started - referenceMs, referenceMs },
    trialCenter: optimum.probe.center,
    trialScale: optimum.probe.scale,
    splits: optimum.splits,
  };
}

function evaluate(problem: VariationalProblem, domain: Domain, potentialBreaks: number[], p: ArrayLike<number>, counts: EngineResult['counts']): Expectation {
  const result = expectation(problem, domain, potentialBreaks, p);
  counts.energyEvaluations++;
  counts.trialEvaluations += result.evaluations;
  return result;
}

/** Square-integrable, finite energy integrals, and zero at every hard wall. */
function trialChecks(problem: VariationalProblem, domain: Domain, at: Expectation, where: string): GradedCheck[] {
  const checks = [
    gradedCheck(
      'normalisable',
      at.failure === null,
      at.failure === null ? `norm integral ${g(at.norm)} at ${where}` : `at ${where}: ${at.failureDetail}`,
      'invalid',
    ),
  ];
  for (const wall of domain.walls) {
    const psi = problem.trial.value(wall);
    const ratio = Math.abs(psi) / at.probe.peakAmplitude;
    checks.push(
      gradedCheck(
        'hard-wall',
        Number.isFinite(psi) && ratio <= WALL_TOLERANCE,
        `trial at the wall ${g(wall)} is ${g(psi, 4)} (${g(ratio, 3)} of its peak; must vanish) at ${where}`,
        'invalid',
      ),
    );
  }
  return checks;
}

function optimiserChecks(problem: VariationalProblem, optimiser: MinimizeResult): GradedCheck[] {
  const active = problem.parameters.flatMap((p, i) => {
    const side = optimiser.activeLimits[i];
    return side ? [`${p.name} sits on its ${side} ${g(side === 'min' ? p.min : p.max)}`] : [];
  });
  return [
    gradedCheck(
      'optimiser-converged',
      optimiser.converged,
      optimiser.converged
        ? `${optimiser.method} converged in ${optimiser.iterations} iterations, ${optimiser.evaluations} energy evaluations`
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

function referenceChecks(problem: VariationalProblem, energy: number, tolerance: number, grid: GridLevels | null, gridError: string | null): GradedCheck[] {
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
    if (grid && grid.levels.length > 0) {
      const e0 = grid.levels[0];
      const slack = tolerance + 10 * (grid.errorEstimate[0] ?? 0);
      checks.push(
        gradedCheck(
          'above-grid-reference',
          energy >= e0 - slack,
          `E - E0(grid) = ${g(energy - e0, 4)} (must be >= -${g(slack, 2)})`,
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
            `|E0(grid) - published| = ${g(gap, 3)} (allowed ${g(allowed, 3)}: the published value's precision plus the grid's)`,
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
        `E - E(published) = ${g(energy - published.value, 4)} (must be >= -${g(slack, 2)}; ${published.source})`,
        'below-reference',
      ),
    );
  }
  return checks;
}

function boundChecks(energy: number, lower: number | null, overlap: number | null, grid: GridLevels, nextLevel: number | null, tolerance: number): GradedCheck[] {
  const checks: GradedCheck[] = [];
  const e0 = grid.levels[0];
  if (lower !== null) {
    checks.push(
      gradedCheck(
        'temple-below-grid',
        lower <= e0 + tolerance,
        `Temple's lower bound ${g(lower)} against E0(grid) ${g(e0)} (with E1 = ${g(nextLevel ?? NaN)})`,
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

function claimChecks(problem: VariationalProblem, energy: number, best: number[]): GradedCheck[] {
  const claim = problem.claim!;
  const checks: GradedCheck[] = [];
  if (claim.energy) {
    const off = Math.abs(energy - claim.energy.value);
    checks.push(
      gradedCheck(
        'claim-energy',
        off <= claim.energy.tolerance,
        `claimed ${g(claim.energy.value)} +/- ${g(claim.energy.tolerance, 3)}, recomputed ${g(energy)} (off by ${g(off, 3)})`,
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
        `claimed ${name} = ${g(claimed.value)} +/- ${g(claimed.tolerance, 3)}, optimum ${g(value)} (off by ${g(off, 3)})`,
        'disputed',
      ),
    );
  }
  return checks;
}

/** |<psi|psi0>|^2 with the grid's lumped quadrature (radial: on chi = r R). */
function groundOverlap(problem: VariationalProblem, domain: Domain, grid: GridLevels, norm: number): number {
  let sum = 0;
  for (let i = 0; i < grid.nodes.length; i++) {
    const x = grid.nodes[i];
    const trial = problem.trial.value(x) * (domain.radial ? x : 1);
    sum += grid.weights[i] * trial * grid.ground[i];
  }
  return (sum * sum) / norm;
}

function invalidResult(checks: GradedCheck[], counts: EngineResult['counts'], started: number): EngineResult {
  const { message } = statusOf(checks);
  return {
    status: 'invalid',
    message,
    energy: null,
    energyError: null,
    parameters: [],
    components: null,
    variance: null,
    grid: null,
    gridError: null,
    bounds: { upper: null, lower: null, weinstein: null, nextLevel: null },
    overlap: null,
    virial: null,
    optimiser: null,
    checks,
    counts,
    timings: { variationalMs: performance.now() - started, referenceMs: 0 },
    trialCenter: null,
    trialScale: null,
    splits: [],
  };
}
