import type { Domain } from './domain.ts';
import type { Expectation } from './expectation.ts';
import { ATOMIC_DISPLAY } from './format.ts';
import type { VariationalProblem } from './problem.ts';
import { integrateVector } from './quadrature.ts';

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
const VARIANCE_FLOOR = 1e-14;

/**
 * The energy variance as ||(H - E) psi||^2 / ||psi||^2, which avoids the cancellation of
 * <H^2> - <H>^2 when the trial is nearly exact; H psi comes from the symbolic second derivative.
 * `at` is the expectation at the parameters currently set.
 */
export function energyVariance(problem: VariationalProblem, domain: Domain, at: Expectation): VarianceResult {
  const { splits, partition, norm, energy } = at;
  const { scale, peakAmplitude } = at.probe;
  const { trial, potential, mass } = problem;
  // A kink of the trial puts a delta function into H psi: the variance is then infinite.
  for (const x of splits) {
    if (!Number.isFinite(x) || x === domain.lo || x === domain.hi) continue;
    const h = 1e-7 * Math.max(scale, Math.abs(x));
    const jump = Math.abs(trial.d1(x + h) - trial.d1(x - h));
    if (jump > CUSP_TOLERANCE * (peakAmplitude / scale)) {
      return { value: null, errorEstimate: 0, note: `the trial's slope jumps at ${(problem.display ?? ATOMIC_DISPLAY).length(x, 6)}, so H psi holds a delta function and the variance is infinite`, evaluations: 2 };
    }
  }
  const l2 = problem.angularMomentum * (problem.angularMomentum + 1);
  const integrand = domain.radial
    ? (r: number, out: Float64Array) => {
        const R = trial.value(r);
        if (R === 0) {
          out[0] = 0;
          return;
        }
        const hR = -(trial.d2(r) + (2 * trial.d1(r)) / r) / (2 * mass) + (l2 / (2 * mass * r * r) + potential(r) - energy) * R;
        out[0] = r * r * hR * hR;
      }
    : (x: number, out: Float64Array) => {
        const psi = trial.value(x);
        if (psi === 0) {
          out[0] = 0;
          return;
        }
        const hPsi = -trial.d2(x) / (2 * mass) + (potential(x) - energy) * psi;
        out[0] = hPsi * hPsi;
      };
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
