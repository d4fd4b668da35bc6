import { findBreakpoints } from './breakpoints.ts';
import { ATOMIC_DISPLAY, g, type ValueDisplay } from './format.ts';
import type { VariationalProblem } from './problem.ts';
import { integrateVector, type IntegrationResult, type Partition } from './quadrature.ts';
import { splitPoints, type CoordinateSpace } from './spaces/space.ts';
import { probeTrial, type TrialProbe } from './trial-probe.ts';

/** <H> of the trial at one parameter point, with the pieces it is made of and their error. */
export interface Expectation {
  energy: number;
  kinetic: number;
  potential: number;
  norm: number;
  /** Error estimate of the energy propagated from the quadrature's estimates. */
  errorEstimate: number;
  /** Which integral failed, if one did: the point cannot be used. */
  failure: 'non-finite' | 'not-normalisable' | 'kinetic-diverges' | 'potential-diverges' | null;
  failureDetail: string | null;
  probe: TrialProbe;
  /** Quadrature split points used (domain ends, kinks of potential and trial, the trial's centre). */
  splits: number[];
  /** The quadrature panels the energy integrals settled on. */
  partition: Partition;
  evaluations: number;
}

export const EXPECTATION_DEFAULTS = { relTol: 1e-12, maxIntervals: 2000 };

/**
 * N = <psi|psi>, <T> = (hbar^2/2m) <psi'|psi'> (plus the space's angular part, with its volume element; a mass m(x)
 * that depends on the coordinate goes inside the integral, BenDaniel & Duke, Phys. Rev. 152, 683 (1966)) and <V>,
 * in one vector quadrature over the space; the |psi'|^2 form needs no second derivative and is exact for
 * trials that vanish at the walls.
 */
export function expectation(problem: VariationalProblem, domain: CoordinateSpace, potentialBreaks: number[], parameters: ArrayLike<number>): Expectation {
  problem.trial.setParameters(parameters);
  const probe = probeTrial(problem.trial.value, domain);
  const result = placedExpectation(problem, domain, potentialBreaks, probe);
  return { ...result, evaluations: probe.evaluations + result.evaluations };
}

/** The expectation at the parameters already set, with the quadrature placed by `probe` (whose evaluations are not counted here) and started from `start`. */
export function placedExpectation(problem: VariationalProblem, domain: CoordinateSpace, potentialBreaks: number[], probe: TrialProbe, start?: Partition): Expectation {
  const { trial, potential, mass } = problem;
  const trialBreaks = findBreakpoints(trial.switches, domain.lo, domain.hi, probe.center, probe.scale);
  const centre = Number.isFinite(domain.lo) ? [] : [probe.center];
  const splits = splitPoints(domain, [...potentialBreaks, ...trialBreaks.points, ...centre]);
  const profile = problem.massProfile ?? null;
  const integrand = domain.energyIntegrand(trial, potential, profile, probe);
  const result = integrateVector(integrand, 3, { breakpoints: splits, scale: probe.scale, start, ...EXPECTATION_DEFAULTS });
  const evaluations = trialBreaks.evaluations + result.evaluations;
  const [n, tk, v] = result.values;
  const norm = n;
  // With a position-dependent mass, 1/m(x) sits inside the kinetic integral already.
  const twoMass = profile ? 2 : 2 * mass;
  const kinetic = tk / twoMass / norm;
  const potentialEnergy = v / norm;
  const energy = kinetic + potentialEnergy;
  const [en, et, ev] = result.errorEstimates;
  const errorEstimate = (et / twoMass + ev + Math.abs(energy) * en) / Math.abs(norm);
  const failure = classifyFailure(result, probe, problem.display ?? ATOMIC_DISPLAY);
  return {
    energy: failure ? Infinity : energy,
    kinetic,
    potential: potentialEnergy,
    norm,
    errorEstimate,
    failure: failure?.kind ?? null,
    failureDetail: failure?.detail ?? null,
    probe,
    splits,
    partition: result.partition,
    evaluations,
  };
}

/** What a search needs of one point: the energy (+Infinity where the trial is unusable) and the work it took. */
export interface SearchPoint {
  energy: number;
  evaluations: number;
}

/** A point that needed more than this many times the panels of the point the quadrature was placed at starts the next one afresh. */
const CARRY_LIMIT = 4;

/**
 * <H> at the points of one search, started from the expectation at the start values. Nearby points
 * need nearly the same panels, so each run starts from the partition the previous one settled on
 * and bisects only where that is no longer good enough: the leaves alone are evaluated, not the
 * coarser panels an adaptive run from whole segments passes through. The trial is not probed at
 * every point: where it lived when the quadrature was placed only positions the panels (which ones
 * are needed is the error estimate's business); its kinks, which move with the parameters, are
 * sought at every point. When a point needs more than CARRY_LIMIT times the panels of the placement,
 * the trial has moved or changed width too much for it, and the next point is probed and integrated
 * afresh. Every value meets the same tolerance by the same error estimate as a fresh evaluation.
 */
export function searchExpectation(problem: VariationalProblem, domain: CoordinateSpace, potentialBreaks: number[], atStart: Expectation): (parameters: ArrayLike<number>) => SearchPoint {
  let placement = atStart.probe;
  let placedPanels = panelCount(atStart.partition);
  let partition: Partition | undefined = atStart.partition;
  return (parameters) => {
    problem.trial.setParameters(parameters);
    let probed = 0;
    if (!partition) {
      placement = probeTrial(problem.trial.value, domain);
      probed = placement.evaluations;
    }
    const result = placedExpectation(problem, domain, potentialBreaks, placement, partition);
    if (result.failure === null) {
      const panels = panelCount(result.partition);
      if (!partition) placedPanels = panels;
      partition = panels <= CARRY_LIMIT * placedPanels ? result.partition : undefined;
    }
    return { energy: result.energy, evaluations: probed + result.evaluations };
  };
}

const panelCount = (partition: Partition) => partition.panels.length / 3;

function classifyFailure(result: IntegrationResult, probe: TrialProbe, show: ValueDisplay): { kind: NonNullable<Expectation['failure']>; detail: string } | null {
  if (probe.nonFiniteAt !== null) return { kind: 'non-finite', detail: `the trial is not a finite number at ${show.length(probe.nonFiniteAt)} (a trial that overflows far out is not square-integrable)` };
  if (result.status === 'non-finite') return { kind: 'non-finite', detail: result.message ?? 'an integrand is not a finite number' };
  if (result.converged && result.values[0] > 0) return null;
  // Attribute the failure to the first integral whose own error estimate is out of bounds.
  const names = ['not-normalisable', 'kinetic-diverges', 'potential-diverges'] as const;
  const words = ['the norm integral of |psi|^2', 'the kinetic integral of |psi\'|^2', 'the potential integral of V |psi|^2'];
  for (let k = 0; k < 3; k++) {
    const bad = !Number.isFinite(result.values[k]) || result.errorEstimates[k] > 1e-6 * Math.abs(result.absValues[k]);
    // Relative, so the detail reads the same in any units (the three integrals have different dimensions).
    const size = Number.isFinite(result.values[k]) ? `relative error estimate ${g(result.errorEstimates[k] / Math.abs(result.values[k]), 2)}` : `estimate ${result.values[k]}`;
    if (bad) return { kind: names[k], detail: `${words[k]} does not converge (${size})` };
  }
  if (!(result.values[0] > 0)) return { kind: 'not-normalisable', detail: 'the trial is zero everywhere' };
  return null;
}
