import type { Expectation } from './expectation.ts';
import { ATOMIC_DISPLAY, g } from './format.ts';
import type { VariationalProblem } from './problem.ts';
import { integrateVector } from './quadrature.ts';
import type { CoordinateSpace } from './spaces/space.ts';

export interface VarianceResult {
  /** <H^2> - <H>^2, or null when it is infinite or could not be computed (see note). */
  value: number | null;
  errorEstimate: number;
  note: string | null;
  evaluations: number;
}

/** A slope jump above this fraction of (peak amplitude / length scale) is a cusp; a smooth slope changes ~1e-7 of it over the probe step. */
const CUSP_TOLERANCE = 1e-4;
/** Variances below this fraction of E^2 are rounding noise: they are resolved only to that level. */
export const VARIANCE_FLOOR = 1e-14;

/**
 * The energy variance as ||(H - E) psi||^2 / ||psi||^2, which avoids the cancellation of
 * <H^2> - <H>^2 when the trial is nearly exact; H psi comes from the symbolic second derivative.
 * `at` is the expectation at the parameters currently set.
 */
export function energyVariance(problem: VariationalProblem, domain: CoordinateSpace, at: Expectation): VarianceResult {
  const { splits, partition, norm, energy } = at;
  const { scale, peakAmplitude } = at.probe;
  const { trial, potential, mass } = problem;
  const profile = problem.massProfile ?? null;
  // A kink of the trial puts a delta function into H psi: the variance is then infinite. With a mass m(x) the
  // flux psi'/m is what must be continuous (BenDaniel & Duke, Phys. Rev. 152, 683 (1966)), also across a mass step.
  for (const x of splits) {
    if (!Number.isFinite(x) || x === domain.lo || x === domain.hi) continue;
    const h = 1e-7 * Math.max(scale, Math.abs(x));
    if (!profile) {
      const jump = Math.abs(trial.d1(x + h) - trial.d1(x - h));
      if (jump > CUSP_TOLERANCE * (peakAmplitude / scale)) {
        return { value: null, errorEstimate: 0, note: `the trial's slope jumps at ${(problem.display ?? ATOMIC_DISPLAY).length(x, 6)}, so H psi holds a delta function and the variance is infinite`, evaluations: 2 };
      }
      continue;
    }
    const [mLeft, mRight] = [profile.value(x - h), profile.value(x + h)];
    const jump = Math.abs(trial.d1(x + h) / mRight - trial.d1(x - h) / mLeft);
    if (jump > (CUSP_TOLERANCE * (peakAmplitude / scale)) / Math.max(mLeft, mRight)) {
      const where = mLeft === mRight ? "the trial's slope jumps" : `the mass steps from ${g(mLeft, 6)} to ${g(mRight, 6)} and the trial's psi'/m is not continuous (BenDaniel–Duke)`;
      return { value: null, errorEstimate: 0, note: `at ${(problem.display ?? ATOMIC_DISPLAY).length(x, 6)} ${where}, so H psi holds a delta function and the variance is infinite`, evaluations: 2 };
    }
  }
  const integrand = domain.varianceIntegrand(trial, potential, mass, energy, profile, at.probe);
  // A nearly exact trial has a variance at rounding level, which no relative tolerance can resolve.
  const absTol = VARIANCE_FLOOR * Math.max(energy * energy, 1e-300) * norm;
  // The energy integrals' panels, on the same split points and scale, are a good start for H psi too.
  const result = integrateVector(integrand, 1, { breakpoints: splits, scale, relTol: 1e-10, absTol, maxIntervals: 2000, start: partition });
  if (!result.converged || !Number.isFinite(result.values[0])) {
    return {
      value: null,
      errorEstimate: 0,
      note: `the integral of |(H - E) psi|^2 does not converge (${result.status}): the trial's tails or singularities leave the variance infinite`,
      evaluations: result.evaluations,
    };
  }
  return { value: result.values[0] / norm, errorEstimate: result.errorEstimates[0] / norm, note: null, evaluations: result.evaluations };
}
