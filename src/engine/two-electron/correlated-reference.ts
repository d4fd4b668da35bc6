import { solveGeneralized } from '../generalized-eigen.ts';
import { correlatedMatrices, correlatedTerms, type ExchangeSign, type ExponentSet } from './correlated-basis.ts';

/** H = -(1/(2 mass)) (laplacian_1 + laplacian_2) - charge/r1 - charge/r2 + coupling/r12 (atomic units). */
export interface TwoElectronHamiltonian {
  mass: number;
  charge: number;
  coupling: number;
}

export interface CorrelatedStep {
  omega: number;
  size: number;
  /** The lowest two levels (hartree) in this basis; the second is null when there is none. */
  levels: [number, number | null];
  dropped: number;
}

export interface CorrelatedReference {
  /** The lowest two levels of the declared exchange symmetry (hartree); a second level at or above the threshold is a discretised continuum state. */
  levels: number[];
  /** The bottom of the continuum: the one-electron ion's ground level, -mass charge^2 / 2. */
  threshold: number;
  /** The exponent sets of the final basis, in atomic units of length^-1. */
  sets: ExponentSet[];
  size: number;
  /** Basis directions dropped as linearly dependent at the final size. */
  dropped: number;
  /** Change of each level over the last enlargement (hartree); the second is 0 when it lies in the continuum. */
  errorEstimate: number[];
  steps: CorrelatedStep[];
  converged: boolean;
  message: string | null;
  /** Settled relative to |E| by this. */
  relTol: number;
}

export const CORRELATED_DEFAULTS = {
  // The change of a level falls by a factor of 3 to 5 per step of omega, so what is left when two successive sizes agree
  // to this is below the last change: the ground levels the tests check end within 3e-9 relative of the published limit.
  relTol: 1e-8,
  startOmega: 2,
  maxOmega: 8,
  // The levels of a helium-like ion in units of its hydrogenic scale: a core pair near the bare-nucleus exponent, a
  // compact pair for the short-range correlation (the double basis of Drake, in Springer Handbook of Atomic, Molecular
  // and Optical Physics, 2006, §11.2), and for each of the two levels an inner-outer pair whose outer exponent is the
  // asymptotic decay sqrt(2 (threshold - E)) of the level found one size smaller.
  core: 0.9,
  compact: 1.8,
  firstOuter: [0.5, 0.25],
  minOuter: 0.1,
} as const;

/**
 * The lowest two S levels of a two-electron ion of the declared exchange symmetry by the linear variational method in
 * a correlated basis r1^i r2^j r12^k exp(-alpha r1 - beta r2) symmetrised under r1 <-> r2 (Hylleraas, Z. Phys. 54, 347
 * (1929); with several exponent sets as in Drake, Springer Handbook of AMO Physics, 2006, §11.2), matrix elements in
 * closed form, solved by canonical orthogonalisation, and enlarged (i + j + k <= omega, omega = 2, 3, ...) until both
 * levels change by less than relTol relative over a step; a second level in the continuum only has to stay there.
 */
export function correlatedReference(hamiltonian: TwoElectronHamiltonian, sign: ExchangeSign, relTol: number = CORRELATED_DEFAULTS.relTol): CorrelatedReference {
  const { mass, charge, coupling } = hamiltonian;
  if (!(mass > 0 && charge > 0 && coupling >= 0)) throw new RangeError(`correlatedReference: need mass > 0, charge > 0, coupling >= 0; got ${mass}, ${charge}, ${coupling}`);
  // In units of length 1/(mass charge) and energy mass charge^2 the Hamiltonian is the helium-like one with 1/Z = lambda.
  const energyUnit = mass * charge * charge;
  const lengthInverse = mass * charge;
  const lambda = coupling / charge;
  const steps: CorrelatedStep[] = [];
  let outer: number[] = [...CORRELATED_DEFAULTS.firstOuter];
  let previous: [number, number | null] | null = null;
  let sets: ExponentSet[] = [];
  let errorEstimate = [Infinity, Infinity];
  let message: string | null = null;
  for (let omega = CORRELATED_DEFAULTS.startOmega; omega <= CORRELATED_DEFAULTS.maxOmega; omega++) {
    sets = [
      { alpha: CORRELATED_DEFAULTS.core, beta: CORRELATED_DEFAULTS.core, omega },
      { alpha: CORRELATED_DEFAULTS.compact, beta: CORRELATED_DEFAULTS.compact, omega },
      ...outer.map((beta) => ({ alpha: 1, beta, omega: Math.max(omega - 2, 0) })),
    ];
    const terms = correlatedTerms(sets, sign);
    const { hamiltonian: h, overlap, size } = correlatedMatrices(terms, sign, lambda);
    const solved = solveGeneralized(h, overlap, size);
    if (solved.values.length === 0) {
      message = `the correlated basis at omega = ${omega} could not be solved: ${solved.message}`;
      break;
    }
    const levels: [number, number | null] = [solved.values[0], solved.values.length > 1 ? solved.values[1] : null];
    steps.push({ omega, size, levels: [levels[0] * energyUnit, levels[1] === null ? null : levels[1] * energyUnit], dropped: solved.dropped });
    // Bound levels lie below the scaled threshold -1/2; one above it is a continuum state of this basis.
    const bound = levels.map((e) => e !== null && e < -0.5);
    outer = levels.map((e, n) => (e !== null && e < -0.5 ? Math.max(Math.sqrt(-2 * (e + 0.5)), CORRELATED_DEFAULTS.minOuter) : CORRELATED_DEFAULTS.firstOuter[n]));
    if (previous) {
      errorEstimate = levels.map((e, n) => (n > 0 && !bound[n] && (previous![n] === null || previous![n]! >= -0.5) ? 0 : Math.abs((e ?? NaN) - (previous![n] ?? NaN))));
      if (errorEstimate.every((d, n) => d <= relTol * Math.abs(levels[n] ?? 1))) {
        return finish(true);
      }
    }
    previous = levels;
  }
  return finish(false);

  function finish(converged: boolean): CorrelatedReference {
    const last = steps[steps.length - 1];
    return {
      levels: last ? last.levels.filter((e): e is number => e !== null) : [],
      threshold: -energyUnit / 2,
      sets: sets.map((s) => ({ alpha: s.alpha * lengthInverse, beta: s.beta * lengthInverse, omega: s.omega })),
      size: last?.size ?? 0,
      dropped: last?.dropped ?? 0,
      errorEstimate: errorEstimate.map((e) => e * energyUnit),
      steps,
      converged,
      message: converged ? null : (message ?? `the levels had not settled to ${relTol} relative at omega = ${CORRELATED_DEFAULTS.maxOmega}`),
      relTol,
    };
  }
}
