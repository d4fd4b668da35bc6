import type { ValueDisplay } from './format.ts';
import type { FieldSpace } from './spaces/field-space.ts';

/** What the engine evaluates: plain numbers and compiled functions, no text, no units. */

export type EngineSpace = 'line' | 'half-line' | 'radial' | 'plane';

/** A trial family; parameters are set once per point of the search, then the functions are called many times. */
export interface TrialFamily {
  setParameters(values: ArrayLike<number>): void;
  value(x: number): number;
  d1(x: number): number;
  d2(x: number): number;
  /** Functions whose sign changes mark kinks or steps of the trial at the current parameters. */
  switches: Array<(x: number) => number>;
}

export interface ParameterSpec {
  name: string;
  start: number;
  min: number;
  max: number;
}

export interface ToleratedValue {
  value: number;
  tolerance: number;
}

/**
 * A mass that depends on the coordinate (a heterostructure): the kinetic energy takes the BenDaniel–Duke form
 * -(hbar^2/2) d/dx (1/m(x)) d/dx. `d1` is the symbolic slope, zero on either side of a step.
 */
export interface MassProfile {
  value(x: number): number;
  d1(x: number): number;
  /** Functions whose sign changes mark the steps or kinks of the mass: element edges and quadrature splits. */
  switches: Array<(x: number) => number>;
}

/** What every block states besides its trial or basis. */
export interface ProblemBase {
  space: EngineSpace;
  box: [number, number] | null;
  angularMomentum: number;
  /** The mass when it is constant; NaN when `massProfile` gives it as a function of the coordinate. */
  mass: number;
  /** Set when the mass depends on the coordinate; absent or null for a constant mass (the fast path). */
  massProfile?: MassProfile | null;
  potential: (x: number) => number;
  potentialSwitches: Array<(x: number) => number>;
  parameters: ParameterSpec[];
  /** `toleranceBasis` says where the published value's tolerance comes from, for the check details. */
  reference: { solve: boolean; published: (ToleratedValue & { source: string; toleranceBasis?: string }) | null };
  claim: { energy: ToleratedValue | null; parameters: Record<string, ToleratedValue> } | null;
  /** Which plot data to sample at the optimum. */
  plots: ReadonlyArray<'scan' | 'density'>;
  /** How check details state values (default: atomic units). */
  display?: ValueDisplay;
  /** The level a single trial approximates, when the block declares it (`symmetry`, `level`); default the ground level. */
  level?: { symmetry: 'even' | 'odd' | null; index: number };
  /** Set for a re-optimisation warm-started at a nearby optimum (sensitivities): the local search only. */
  localSearch?: boolean;
}

/** A single trial function with parameters: the variational method proper. */
export interface VariationalProblem extends ProblemBase {
  trial: TrialFamily;
}

/** One basis function (radial: a radial factor R(r), weight r^2) and its first derivative. */
export interface BasisFunction {
  value(x: number): number;
  d1(x: number): number;
}

/** The basis; nonlinear parameters shared by its functions are set once per solve, like TrialFamily's. */
export interface LinearBasis {
  functions: BasisFunction[];
  setParameters?(values: ArrayLike<number>): void;
}

/** Basis functions with (optionally) shared nonlinear parameters: the linear variational method. */
export interface BasisProblem extends ProblemBase {
  basis: Required<LinearBasis> & {
    /** Functions whose sign changes mark kinks or steps of any basis function. */
    switches: Array<(x: number) => number>;
  };
  /** How many of the lowest levels to report. */
  states: number;
}

/** A function of a point of a space with several coordinates (axial: [rho, z]; a product: the coordinates in order). */
export type PointFunction = (point: Float64Array) => number;

/** A kink or step of an expression along one coordinate: where `at` changes sign there, whatever the other coordinates. */
export interface AxisSwitch {
  axis: number;
  at: (coordinate: number) => number;
}

/** A trial of several coordinates; parameters are set once per point of the search, as for TrialFamily. */
export interface FieldTrial {
  setParameters(values: ArrayLike<number>): void;
  value: PointFunction;
  /** d psi / d q_k, one per coordinate in point order. */
  gradient: PointFunction[];
  /**
   * The Laplacian the space's H psi needs, without its angular term: axial d2_rho + d_rho/rho + d2_z (m^2/rho^2 is
   * the space's), a product space sum_k d2_k psi / m_k (the masses folded in).
   */
  laplacian: PointFunction;
  /** Kinks or steps of the trial along one coordinate, at the current parameters. */
  switches: AxisSwitch[];
}

/** A trial problem on a space of several coordinates (axial, a Cartesian product). */
export interface FieldProblem extends Pick<ProblemBase, 'parameters' | 'reference' | 'claim' | 'plots' | 'display' | 'localSearch'> {
  space: FieldSpace;
  potential: PointFunction;
  potentialSwitches: AxisSwitch[];
  trial: FieldTrial;
}
