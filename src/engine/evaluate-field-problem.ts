import { templeBound } from './bounds.ts';
import { boundChecks, claimChecks, integralsCheck, optimiserChecks, referenceChecks } from './checks.ts';
import { invalidResult, trialResult, type EngineResult } from './evaluate-problem.ts';
import { fieldExpectation, fieldVariance, placeField, searchFieldExpectation, type FieldExpectation } from './field-expectation.ts';
import { fieldGridReference, productOverlap } from './field-grid-reference.ts';
import { fieldPlotData } from './field-plot-data.ts';
import { ATOMIC_DISPLAY, g } from './format.ts';
import { minimizeBounded, type MinimizeResult } from './minimize.ts';
import { GROUND_LEVEL } from './parity.ts';
import type { FieldProblem } from './problem.ts';
import { gradedCheck, type GradedCheck } from './status.ts';
import { COMPARISON_FLOOR, WALL_TOLERANCE } from './tolerances.ts';

/**
 * Evaluates a trial on a space of several coordinates (axial, a Cartesian product) with the same steps, checks and
 * statuses as on one coordinate: the trial checked at the start values, <H> minimised over the varied parameters by
 * product cubature, the optimum measured against the product-grid reference, the bounds and the author's claim.
 */
export function evaluateFieldProblem(problem: FieldProblem): EngineResult {
  const started = performance.now();
  const start = problem.parameters.map((p) => p.start);
  const counts = { energyEvaluations: 0, trialEvaluations: 0 };
  const show = problem.display ?? ATOMIC_DISPLAY;
  const counted = (result: { evaluations: number }) => {
    counts.energyEvaluations++;
    counts.trialEvaluations += result.evaluations;
  };
  // The trial placed, integrated and checked at one parameter point (the start values, then the optimum).
  const settle = (parameters: number[], where: string) => {
    problem.trial.setParameters(parameters);
    const placement = placeField(problem);
    counts.trialEvaluations += placement.evaluations;
    const at = fieldExpectation(problem, placement);
    counted(at);
    return { placement, at, checks: trialChecks(problem, at, where) };
  };
  const { at: atStart, checks: startChecks } = settle(start, 'the start values');
  if (startChecks.some((c) => !c.pass)) return invalidResult(startChecks, counts, started);

  let optimiser: MinimizeResult | null = null;
  let best = start;
  if (problem.parameters.length > 0) {
    const atPoint = searchFieldExpectation(problem, atStart);
    optimiser = minimizeBounded((p) => {
      const point = atPoint(p);
      counted(point);
      return point.energy;
    }, problem.parameters, { local: problem.localSearch });
    best = Array.from(optimiser.x);
  }
  const { placement, at: optimum, checks: optimumChecks } = settle(best, 'the optimum');
  if (optimumChecks.some((c) => !c.pass)) return invalidResult(optimumChecks, counts, started);

  const checks: GradedCheck[] = [...optimumChecks];
  const energy = optimum.energy;
  checks.push(integralsCheck(optimum.errorEstimate, energy, optimum.kinetic, 'energy cubature error estimate', show));
  if (optimiser) checks.push(...optimiserChecks(problem, optimiser));
  const variance = fieldVariance(problem, optimum);

  const { grid, gridError, referenceMs, product, bindingThreshold } = problem.space.reference ? problem.space.reference(problem) : fieldGridReference(problem, placement);
  const tolerance = 10 * optimum.errorEstimate + COMPARISON_FLOOR * Math.max(1, Math.abs(energy));
  checks.push(...referenceChecks(problem, energy, tolerance, grid, gridError));
  const nextLevel = grid ? (grid.levels.length > 1 ? grid.levels[1] : grid.threshold) : null;
  const lower = templeBound(energy, variance.value, nextLevel);
  const overlap = product ? productOverlap(problem.trial.value, product, optimum.norm) : null;
  if (grid && grid.converged) checks.push(...boundChecks(energy, lower, overlap, grid.levels[0], GROUND_LEVEL, nextLevel, tolerance + 10 * (grid.errorEstimate[0] ?? 0), show));
  if (problem.claim) checks.push(...claimChecks(problem, energy, best));

  const timings = { variationalMs: performance.now() - started - referenceMs, referenceMs };
  const scanAt = searchFieldExpectation(problem, optimum);
  const plots = fieldPlotData(
    { problem, optimum: best, energyAt: (p) => scanAt(p).energy, kinetic: optimum.kinetic, curvature: optimiser?.hessian ?? null, norm: optimum.norm, placement, grid: product },
    problem.plots,
  );
  const result = trialResult({
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
    reference: grid?.levels[0] ?? null,
    virial: null,
    virialNote: null,
    optimiser,
    counts,
    timings,
    plots,
    level: GROUND_LEVEL,
  });
  if (bindingThreshold === undefined) return result;
  return { ...result, binding: bindingThreshold === null ? null : { threshold: bindingThreshold, below: energy < bindingThreshold } };
}

/** Square-integrable, finite energy integrals, and zero on every face that is a hard wall (sampled across the face). */
function trialChecks(problem: FieldProblem, at: FieldExpectation, where: string): GradedCheck[] {
  const checks = [
    gradedCheck(
      at.failure === 'non-finite' ? 'finite-integrands' : 'normalisable',
      at.failure === null,
      at.failure === null ? `norm integral ${g(at.norm)} at ${where}` : `at ${where}: ${at.failureDetail}`,
      'invalid',
    ),
  ];
  const { space } = problem;
  if (at.failure === null && space.trialChecks) checks.push(...space.trialChecks(problem, at.placement, where));
  const { peakAmplitude } = at.placement;
  const point = new Float64Array(space.axes.length);
  space.axes.forEach((axis, k) => {
    for (const wall of axis.walls) {
      let worst = { ratio: 0, psi: 0, at: point.slice() };
      for (const sample of faceSamples(problem, k, at)) {
        point.set(sample);
        point[k] = wall;
        const psi = problem.trial.value(point);
        const ratio = psi === 0 ? 0 : Math.abs(psi) / peakAmplitude;
        if (!(ratio <= worst.ratio)) worst = { ratio, psi, at: point.slice() };
      }
      const named = space.coordinates.map((c, i) => `${c} = ${g(worst.at[i], 4)}`).join(', ');
      checks.push(
        gradedCheck(
          'hard-wall',
          Number.isFinite(worst.ratio) && worst.ratio <= WALL_TOLERANCE,
          `on the face ${space.coordinates[k]} = ${g(wall)} the trial reaches ${g(worst.psi, 4)} (${g(worst.ratio, 3)} of its peak; must vanish) at ${named}, at ${where}`,
          'invalid',
        ),
      );
    }
  });
  return checks;
}

/** Points spread over a face: each other coordinate at its centre and at fractions of its scale on either side, inside its range. */
function faceSamples(problem: FieldProblem, face: number, at: FieldExpectation): Float64Array[] {
  const offsets = [0, 0.25, -0.25, 0.5, -0.5, 1, -1, 2, -2];
  const along = problem.space.axes.map((axis, k) => {
    if (k === face) return [0];
    const { center, scale } = at.placement.axes[k];
    return offsets.map((o) => center + o * scale).filter((x) => x >= axis.lo && x <= axis.hi);
  });
  let points: number[][] = [[]];
  for (const values of along) points = points.flatMap((p) => values.map((v) => [...p, v]));
  return points.map((p) => Float64Array.from(p));
}
