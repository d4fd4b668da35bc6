import { templeBound, weinsteinInterval } from './bounds.ts';
import { findBreakpoints } from './breakpoints.ts';
import { boundChecks, claimChecks, integralsCheck, optimiserChecks, referenceChecks } from './checks.ts';
import { COMPARISON_FLOOR, WALL_TOLERANCE } from './tolerances.ts';
import { expectation, placedExpectation, searchExpectation, type Expectation } from './expectation.ts';
import { ATOMIC_DISPLAY, g, type ValueDisplay } from './format.ts';
import type { GridLevels } from './grid-levels.ts';
import { GROUND_LEVEL, resolveTarget, type TargetLevel } from './parity.ts';
import { gridReference } from './grid-reference.ts';
import { hamiltonianSwitches, massPositiveCheck } from './mass-profile.ts';
import { minimizeBounded, type MinimizeResult } from './minimize.ts';
import { plotData, type PlotData } from './plot-data.ts';
import type { VariationalProblem } from './problem.ts';
import { spaceOf } from './spaces/space-of.ts';
import type { CoordinateSpace } from './spaces/space.ts';
import { findNonFiniteFactor, probeTrial } from './trial-probe.ts';
import { gradedCheck, measured, statusOf, type GradedCheck, type Status } from './status.ts';
import { energyVariance, type VarianceResult } from './variance.ts';
import { virialReport, type Virial } from './virial.ts';

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
  /** Why no virial ratio is given for a power-law potential (hard walls away from the origin, a mass m(x)); else null. */
  virialNote: string | null;
  optimiser: MinimizeResult | null;
  checks: GradedCheck[];
  counts: { energyEvaluations: number; trialEvaluations: number };
  /** Wall-clock split between the variational part and the grid reference. */
  timings: { variationalMs: number; referenceMs: number };
  /** Samples behind the scan and density plots (not counted in the evaluations or timings above). */
  plots: PlotData | null;
  /** Every level reported, lowest first, each with the grid level of the same index (one state for a single trial). */
  states: Array<{ energy: number; errorEstimate: number; reference: number | null }>;
  /** The linear method's overlap diagnostics; null for a single trial. */
  basis: BasisDiagnostics | null;
  /**
   * Where the reference defines a threshold of binding (two-electron: the one-electron ion's ground level), whether the
   * variational energy lies below it, which shows the system bound; absent elsewhere.
   */
  binding?: { threshold: number; below: boolean } | null;
  /** The grid level the energy is compared with (declared by the block, read off an odd trial, or the ground level). */
  level: TargetLevel;
}

export interface BasisDiagnostics {
  functions: number;
  kept: number;
  dropped: number;
  /** Of the unit-diagonal overlap matrix; null when it is singular to rounding (then directions were dropped). */
  conditionNumber: number | null;
  /** The same over the kept directions, the subspace the levels were solved in. */
  keptConditionNumber: number;
  /** The conditioning in one phrase: "condition number 12.3", or "numerically singular: 1 of 3 directions dropped ...". */
  conditioning: string;
  warning: string | null;
}


/**
 * Evaluates one variational problem: checks the trial, minimises <H> over the varied parameters,
 * then measures the optimum against an independent grid solution, bounds and the author's claim.
 */
export function evaluateProblem(problem: VariationalProblem): EngineResult {
  const started = performance.now();
  const domain = spaceOf(problem);
  const start = problem.parameters.map((p) => p.start);
  const counts = { energyEvaluations: 0, trialEvaluations: 0 };
  const show = problem.display ?? ATOMIC_DISPLAY;
  problem.trial.setParameters(start);

  // The potential's kinks are searched for around where the trial lives, once for the whole search.
  const startProbe = probeTrial(problem.trial.value, domain);
  counts.trialEvaluations += startProbe.evaluations;
  const massFault = massPositiveCheck(problem, domain, startProbe.center, startProbe.scale);
  if (massFault) return invalidResult([massFault], counts, started);
  // A step of the mass is a split point and a grid element edge, as a kink of the potential is.
  const potentialBreaks = findBreakpoints(hamiltonianSwitches(problem), domain.lo, domain.hi, startProbe.center, startProbe.scale).points;
  const atStart = counted(placedExpectation(problem, domain, potentialBreaks, startProbe), counts);
  const startChecks = [...trialChecks(problem, domain, atStart, 'the start values', show), ...targetOf(problem, domain, atStart, 'the start values').checks];
  if (startChecks.some((c) => !c.pass)) return invalidResult(startChecks, counts, started);

  let optimiser: MinimizeResult | null = null;
  let best = start;
  if (problem.parameters.length > 0) {
    const atPoint = searchExpectation(problem, domain, potentialBreaks, atStart);
    optimiser = minimizeBounded((p) => counted(atPoint(p), counts).energy, problem.parameters, { local: problem.localSearch });
    best = Array.from(optimiser.x);
  }
  const optimum = evaluate(problem, domain, potentialBreaks, best, counts);
  const { target, checks: targetChecks } = targetOf(problem, domain, optimum, 'the optimum');
  const optimumChecks = [...trialChecks(problem, domain, optimum, 'the optimum', show), ...targetChecks];
  if (optimumChecks.some((c) => !c.pass)) return invalidResult(optimumChecks, counts, started);

  const checks: GradedCheck[] = [...optimumChecks];
  const energy = optimum.energy;
  checks.push(integralsCheck(optimum.errorEstimate, energy, optimum.kinetic, 'energy quadrature error estimate', show));
  if (optimiser) checks.push(...optimiserChecks(problem, optimiser));

  problem.trial.setParameters(best);
  const variance = energyVariance(problem, domain, optimum);

  // A level above the ground level needs the grid to settle every level up to the next one of its parity.
  const levels = target.nextGridIndex > 1 ? target.nextGridIndex + 1 : undefined;
  const { grid, gridError, referenceMs } = gridReference(problem, domain, potentialBreaks, { center: optimum.probe.center, width: optimum.probe.scale }, levels);
  const tolerance = 10 * optimum.errorEstimate + COMPARISON_FLOOR * Math.max(1, Math.abs(energy));
  checks.push(...referenceChecks(problem, energy, tolerance, grid, gridError, target));

  const reference = grid?.levels[target.gridIndex] ?? null;
  const nextLevel = grid ? (grid.levels[target.nextGridIndex] ?? grid.threshold) : null;
  const lower = templeBound(energy, variance.value, nextLevel);
  const state = grid?.states[target.gridIndex];
  const overlap = grid && state ? groundOverlap(problem.trial.value, domain, grid, optimum.norm, state) : null;
  if (grid && grid.converged && reference !== null) {
    checks.push(...boundChecks(energy, lower, overlap, reference, target, nextLevel, tolerance + 10 * (grid.errorEstimate[target.gridIndex] ?? 0), show));
  }
  if (problem.claim) checks.push(...claimChecks(problem, energy, best));

  const timings = { variationalMs: performance.now() - started - referenceMs, referenceMs };
  const scanAt = searchExpectation(problem, domain, potentialBreaks, optimum);
  const plots = plotData(
    {
      problem,
      domain,
      optimum: best,
      energyAt: (p) => scanAt(p).energy,
      kinetic: optimum.kinetic,
      curvature: optimiser?.hessian ?? null,
      norm: optimum.norm,
      center: optimum.probe.center,
      scale: optimum.probe.scale,
      grid,
      gridLevel: target.gridIndex,
    },
    problem.plots,
  );
  return trialResult({
    checks,
    optimum,
    parameters: problem.parameters,
    best,
    variance,
    grid,
    gridError,
    lower,
    nextLevel,
    overlap,
    reference,
    ...virialReport(problem.potential, domain.walls, domain.lo === -Infinity, optimum.kinetic, optimum.potential, Boolean(problem.massProfile)),
    optimiser,
    counts,
    timings,
    plots,
    level: target,
  });
}

/** What a single-trial evaluation found at its optimum, in the space-agnostic terms of its result. */
export interface TrialOutcome extends Pick<EngineResult, 'variance' | 'grid' | 'gridError' | 'overlap' | 'virial' | 'virialNote' | 'optimiser' | 'checks' | 'counts' | 'timings' | 'plots' | 'level'> {
  optimum: Pick<Expectation, 'energy' | 'errorEstimate' | 'kinetic' | 'potential' | 'norm'>;
  parameters: ReadonlyArray<{ name: string }>;
  best: number[];
  lower: number | null;
  nextLevel: number | null;
  /** The grid level the energy is compared with. */
  reference: number | null;
  variance: VarianceResult;
}

/** The result of a single-trial evaluation, the same for every space; the status comes from its checks. */
export function trialResult(o: TrialOutcome): EngineResult {
  const { status, message } = statusOf(o.checks);
  const { energy, errorEstimate, kinetic, potential, norm } = o.optimum;
  return {
    status,
    message,
    energy,
    energyError: errorEstimate,
    parameters: o.parameters.map((p, i) => ({ name: p.name, value: o.best[i] })),
    components: { kinetic, potential, norm },
    variance: o.variance,
    grid: o.grid,
    gridError: o.gridError,
    bounds: { upper: energy, lower: o.lower, weinstein: weinsteinInterval(energy, o.variance.value), nextLevel: o.nextLevel },
    overlap: o.overlap,
    virial: o.virial,
    virialNote: o.virialNote,
    optimiser: o.optimiser,
    checks: o.checks,
    counts: { ...o.counts, trialEvaluations: o.counts.trialEvaluations + o.variance.evaluations },
    timings: o.timings,
    plots: o.plots,
    states: [{ energy, errorEstimate, reference: o.reference }],
    basis: null,
    level: o.level,
  };
}

/** The level the trial at `at` is compared with, and the checks of a declared symmetry. */
function targetOf(problem: VariationalProblem, domain: CoordinateSpace, at: Expectation, where: string): ReturnType<typeof resolveTarget> {
  return resolveTarget(problem.level, problem.potential, problem.trial.value, domain, at.probe.peakAmplitude, where);
}

function evaluate(problem: VariationalProblem, domain: CoordinateSpace, potentialBreaks: number[], p: ArrayLike<number>, counts: EngineResult['counts']): Expectation {
  return counted(expectation(problem, domain, potentialBreaks, p), counts);
}

function counted<T extends { evaluations: number }>(result: T, counts: EngineResult['counts']): T {
  counts.energyEvaluations++;
  counts.trialEvaluations += result.evaluations;
  return result;
}

/** Square-integrable, finite energy integrals, and zero at every hard wall. */
function trialChecks(problem: VariationalProblem, domain: CoordinateSpace, at: Expectation, where: string, show: ValueDisplay): GradedCheck[] {
  // A NaN or an overflow met by the quadrature is traced to the input that produced it.
  const nonFinite = at.failure === 'non-finite' ? findNonFiniteFactor(problem.potential, problem.trial, domain, at.probe, show) : null;
  const checks = [
    nonFinite
      ? gradedCheck('finite-integrands', false, `at ${where}: ${nonFinite.detail}`, 'invalid', nonFinite.culprit === 'potential' ? 'potential' : undefined)
      : gradedCheck(
          'normalisable',
          at.failure === null,
          at.failure === null ? `norm integral ${show.norm(at.norm)} at ${where}` : `at ${where}: ${at.failureDetail}`,
          'invalid',
        ),
  ];
  for (const wall of domain.walls) {
    const psi = problem.trial.value(wall);
    // A trial that is zero everywhere has no peak; its zero at the wall is not the failure to report.
    const ratio = psi === 0 ? 0 : Math.abs(psi) / at.probe.peakAmplitude;
    checks.push(
      measured(
        gradedCheck('hard-wall', Number.isFinite(psi) && ratio <= WALL_TOLERANCE, `trial at the wall ${show.length(wall)} is ${g(psi, 4)} (${g(ratio, 3)} of its peak; must vanish) at ${where}`, 'invalid'),
        { value: ratio, limit: WALL_TOLERANCE, relation: '<=', quantity: 'ratio' },
      ),
    );
  }
  return checks;
}

/** |<psi|psi_n>|^2 with the grid's lumped quadrature (on the grid's own function, radial: chi = r R), against the grid ground state unless another is given. */
export function groundOverlap(value: (x: number) => number, domain: CoordinateSpace, grid: GridLevels, norm: number, state: Float64Array = grid.ground): number {
  let sum = 0;
  for (let i = 0; i < grid.nodes.length; i++) {
    const x = grid.nodes[i];
    const trial = value(x) * domain.gridFactor(x);
    sum += grid.weights[i] * trial * state[i];
  }
  return (sum * sum) / norm;
}

export function invalidResult(checks: GradedCheck[], counts: EngineResult['counts'], started: number): EngineResult {
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
    virialNote: null,
    optimiser: null,
    checks,
    counts,
    timings: { variationalMs: performance.now() - started, referenceMs: 0 },
    plots: null,
    states: [],
    basis: null,
    level: GROUND_LEVEL,
  };
}
