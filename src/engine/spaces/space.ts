import type { ValueDisplay } from '../format.ts';
import type { GridLevels } from '../grid-levels.ts';
import type { MassProfile, TrialFamily } from '../problem.ts';
import type { VectorIntegrand } from '../quadrature.ts';
import type { TrialProbe } from '../trial-probe.ts';

/** The coordinate range of a space of one coordinate and its hard walls. */
export interface Domain {
  lo: number;
  hi: number;
  /** Hard walls where the trial must vanish. */
  walls: number[];
}

/** What the grid reference of a space needs from a block, besides the space itself. */
export interface GridRequest {
  mass: number;
  /** A mass that depends on the coordinate (BenDaniel–Duke), or null. */
  massProfile: MassProfile | null;
  potential: (x: number) => number;
  breakpoints: number[];
  hint: { center: number; width: number };
  levels?: number;
  /** How the grid's messages state energies and positions. */
  display?: ValueDisplay;
}

/** The trial's functions an integrand reads (value and derivatives at one point). */
export type TrialFunctions = Pick<TrialFamily, 'value' | 'd1' | 'd2'>;

/**
 * A space of one coordinate: where the trial lives, its volume element and kinetic-energy form, its walls, the
 * integrands of the energy integrals over it, and its grid reference. The evaluation, optimiser, bounds, checks
 * and statuses read a block's space only through this.
 */
export interface CoordinateSpace extends Domain {
  name: 'line' | 'half-line' | 'box' | 'radial' | 'plane';
  /** The coordinate's name in expressions and messages. */
  coordinate: 'x' | 'r';
  /** The volume element up to a constant factor (radial: r^2, plane: r): the density in the coordinate is weight |psi|^2. */
  weight(x: number): number;
  /**
   * The three integrands of the energy at one parameter point: |psi|^2, the kinetic form 2m T (gradient form, no
   * second derivative; with a mass profile m(x) the form 2 T with 1/m(x) inside, BenDaniel & Duke, Phys. Rev. 152, 683
   * (1966)) and V |psi|^2, each times the volume element; 0 where the trial has decayed beyond its bulk (`probe`).
   */
  energyIntegrand(trial: TrialFunctions, potential: (x: number) => number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand;
  /**
   * |(H - E) psi|^2 times the volume element, H psi from the trial's symbolic second derivative (with a mass profile,
   * the BenDaniel–Duke operator -(1/2) div(grad psi / m)).
   */
  varianceIntegrand(trial: TrialFunctions, potential: (x: number) => number, mass: number, energy: number, profile: MassProfile | null, probe: TrialProbe): VectorIntegrand;
  /**
   * The kinetic integrand of a pair of basis functions, 2m times: weight phi_i' phi_j' + centrifugal(x) phi_i phi_j;
   * centrifugal is the angular part of the kinetic energy times the weight (0 without one).
   */
  centrifugal(x: number): number;
  /** The independent grid solution of H on this space (throws only on a broken potential). */
  gridLevels(request: GridRequest): GridLevels;
  /** The grid's function at a node from the trial's value there (radial: chi = r R). */
  gridFactor(x: number): number;
}

/** Interval ends and interior split points for quadrature, sorted and without repeats. */
export function splitPoints(domain: Domain, interior: number[]): number[] {
  const inside = interior.filter((x) => x > domain.lo && x < domain.hi);
  return [...new Set([domain.lo, ...inside, domain.hi])].sort((a, b) => a - b);
}
