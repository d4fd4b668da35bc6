import { samplingMesh } from './breakpoints.ts';
import type { Domain } from './spaces/space.ts';
import { g } from './format.ts';
import type { ProblemBase } from './problem.ts';
import { gradedCheck, type GradedCheck } from './status.ts';

/** The functions whose sign changes mark kinks or steps of the Hamiltonian's coefficients: the potential's and a position-dependent mass's. */
export function hamiltonianSwitches(problem: ProblemBase): Array<(x: number) => number> {
  return problem.massProfile ? [...problem.potentialSwitches, ...problem.massProfile.switches] : problem.potentialSwitches;
}

/**
 * A position-dependent mass must be a positive finite number wherever the state lives: checked on the mesh the
 * breakpoint search samples (2^-20 to 2^20 times the state's scale about its centre, eight points an octave).
 * Null for a constant mass (the spec layer has checked it) or when every sample is positive.
 */
export function massPositiveCheck(problem: ProblemBase, domain: Domain, center: number, scale: number): GradedCheck | null {
  const profile = problem.massProfile;
  if (!profile) return null;
  for (const x of samplingMesh(domain.lo, domain.hi, center, scale)) {
    const m = profile.value(x);
    if (!(m > 0) || !Number.isFinite(m)) {
      return gradedCheck('mass-positive', false, `the mass is ${g(m)} electron masses at ${g(x)} bohr, where the state lives; it must be positive (and finite) everywhere`, 'invalid', 'mass');
    }
  }
  return null;
}
