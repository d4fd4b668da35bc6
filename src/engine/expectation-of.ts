import { findBreakpoints } from './breakpoints.ts';
import { placedExpectation } from './expectation.ts';
import { fieldExpectation, placeField } from './field-expectation.ts';
import { hamiltonianSwitches } from './mass-profile.ts';
import type { AxisSwitch, FieldProblem, PointFunction, VariationalProblem } from './problem.ts';
import { spaceOf } from './spaces/space-of.ts';
import { probeTrial } from './trial-probe.ts';

/** <psi|f|psi>/<psi|psi> for an extra function f, with its quadrature error estimate and the integrand evaluations spent. */
export interface ExtraExpectation {
  value: number;
  errorEstimate: number;
  evaluations: number;
}

/**
 * <f> over the trial's density at the given parameters, by the space's own energy integrator with f in the
 * potential's place (its <V> part is <f>): the expectation the Hellmann–Feynman theorem needs, dE/dc = <dH/dc>
 * (Feynman, Phys. Rev. 56, 340 (1939)), with no integration code of its own on any space.
 */
export function lineExpectationOf(problem: VariationalProblem, f: (x: number) => number, parameters: ArrayLike<number>): ExtraExpectation {
  const domain = spaceOf(problem);
  problem.trial.setParameters(parameters);
  const probe = probeTrial(problem.trial.value, domain);
  // The kinks of the potential (f is its derivative) and steps of the mass stay split points.
  const breaks = findBreakpoints(hamiltonianSwitches(problem), domain.lo, domain.hi, probe.center, probe.scale);
  const at = placedExpectation({ ...problem, potential: f }, domain, breaks.points, probe);
  return { value: at.potential, errorEstimate: at.errorEstimate, evaluations: probe.evaluations + breaks.evaluations + at.evaluations };
}

/** The same on a space of several coordinates, by its product cubature. */
export function fieldExpectationOf(problem: FieldProblem, f: PointFunction, parameters: ArrayLike<number>, switches: AxisSwitch[] = problem.potentialSwitches): ExtraExpectation {
  problem.trial.setParameters(parameters);
  // Placed by the block's own potential, as at the optimum; only the integrand changes.
  const placement = placeField(problem);
  const at = fieldExpectation({ ...problem, potential: f, potentialSwitches: switches }, placement);
  return { value: at.potential, errorEstimate: at.errorEstimate, evaluations: at.evaluations };
}
