import { energyFromIntegrals, varianceAbsTol } from './cubature/energy-integrands.ts';
import type { FieldPlacement } from './field-probe.ts';
import { probeField } from './field-probe.ts';
import type { SearchPoint } from './expectation.ts';
import type { FieldProblem } from './problem.ts';
import type { FieldCubatureResult } from './spaces/field-space.ts';
import type { VarianceResult } from './variance.ts';

/** <H> of a trial of several coordinates at one parameter point, its parts and their error. */
export interface FieldExpectation {
  energy: number;
  kinetic: number;
  potential: number;
  norm: number;
  errorEstimate: number;
  failure: 'non-finite' | 'not-normalisable' | 'integrals-diverge' | null;
  failureDetail: string | null;
  placement: FieldPlacement;
  /** The cubature's panels, to start a nearby point from (the space's own kind). */
  partition: unknown;
  evaluations: number;
}

/** Tighter than the 1-D 1e-12 would cost a product run dearly; the energy still meets ENERGY_RELATIVE_ERROR_LIMIT by far. */
export const FIELD_EXPECTATION_DEFAULTS = { relTol: 1e-11 };

/**
 * The variance enters only the lower bounds and their slack, where a relative 1e-5 is far below what matters; a
 * Coulomb cusp a trial does not match leaves |(H - E) psi|^2 ~ 1/r^2 at a nucleus, whose iterated integral needs many
 * panels for every further digit.
 */
export const FIELD_VARIANCE_REL_TOL = 1e-5;

/** Probes the trial at the parameters already set and places the cubature there. */
export function placeField(problem: FieldProblem): FieldPlacement {
  return probeField(problem.trial.value, problem.potential, problem.space, [...problem.potentialSwitches, ...problem.trial.switches]);
}

/** N, <T>, <V> by product cubature over the space at the parameters already set, placed by `placement`. */
export function fieldExpectation(problem: FieldProblem, placement: FieldPlacement, start?: unknown): FieldExpectation {
  const { space } = problem;
  const integrand = space.energyIntegrand(problem.trial, problem.potential);
  const result = space.integrate(integrand, 3, placement.axes, { relTol: FIELD_EXPECTATION_DEFAULTS.relTol, start });
  const parts = energyFromIntegrals(result);
  const failure = classify(result, placement);
  return {
    ...parts,
    energy: failure ? Infinity : parts.energy,
    failure: failure?.kind ?? null,
    failureDetail: failure?.detail ?? null,
    placement,
    partition: result.partition,
    evaluations: result.evaluations,
  };
}

/**
 * <H> along a search: each point starts from the panels the previous one settled on (the cubature carries them while
 * they stay useful); the trial is probed again only when the panels were dropped, as in the one-coordinate search.
 */
export function searchFieldExpectation(problem: FieldProblem, atStart: FieldExpectation): (parameters: ArrayLike<number>) => SearchPoint {
  let placement = atStart.placement;
  let partition: unknown = atStart.partition;
  return (parameters) => {
    problem.trial.setParameters(parameters);
    let probed = 0;
    if (!partition) {
      placement = placeField(problem);
      probed = placement.evaluations;
    }
    const result = fieldExpectation(problem, placement, partition ?? undefined);
    if (result.failure === null) partition = result.partition;
    else partition = null;
    return { energy: result.energy, evaluations: probed + result.evaluations };
  };
}

/** ||(H - E) psi||^2 / ||psi||^2 with H psi from the symbolic Laplacian, on the panels of the energy's placement. */
export function fieldVariance(problem: FieldProblem, at: FieldExpectation): VarianceResult {
  const { space } = problem;
  const integrand = space.varianceIntegrand(problem.trial, problem.potential, at.energy);
  const result = space.integrate(integrand, 1, at.placement.axes, { relTol: FIELD_VARIANCE_REL_TOL, absTol: varianceAbsTol(at) });
  if (!result.converged || !Number.isFinite(result.values[0])) {
    return {
      value: null,
      errorEstimate: 0,
      note: `the integral of |(H - E) psi|^2 does not converge (${result.status}): the trial's kinks, tails or singularities leave the variance infinite`,
      evaluations: result.evaluations,
    };
  }
  return { value: result.values[0] / at.norm, errorEstimate: result.errorEstimates[0] / at.norm, note: null, evaluations: result.evaluations };
}

function classify(result: FieldCubatureResult, placement: FieldPlacement): { kind: NonNullable<FieldExpectation['failure']>; detail: string } | null {
  if (placement.nonFiniteAt !== null) return { kind: 'non-finite', detail: `the trial is not a finite number at (${Array.from(placement.nonFiniteAt, (v) => v.toPrecision(6)).join(', ')}) (a trial that overflows far out is not square-integrable)` };
  if (result.status === 'non-finite') return { kind: 'non-finite', detail: result.message ?? 'an integrand is not a finite number' };
  if (result.converged && result.values[0] > 0) return null;
  if (!(result.values[0] > 0) && result.converged) return { kind: 'not-normalisable', detail: 'the trial is zero everywhere' };
  const names = ['the norm integral of |psi|^2', 'the kinetic integral', 'the potential integral of V |psi|^2'];
  const k = [0, 1, 2].find((i) => !Number.isFinite(result.values[i]) || result.errorEstimates[i] > 1e-6 * Math.abs(result.values[i])) ?? 0;
  return {
    kind: k === 0 ? 'not-normalisable' : 'integrals-diverge',
    detail: `${names[k]} does not converge (estimate ${result.values[k].toPrecision(6)} +/- ${result.errorEstimates[k].toPrecision(2)}; ${result.message ?? result.status})`,
  };
}
