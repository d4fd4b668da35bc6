import { boltzmann, electricConstant, electronMass, elementaryCharge, reducedPlanckConstant, type Unit } from 'mathjs';
import type { Dimension } from './dimension.ts';

/**
 * Hartree atomic units (hbar = electron mass = e = 4 pi eps0 = 1), the scale the engine computes in,
 * built from mathjs's physical constants. mathjs 15 carries the CODATA 2018 adjustment (the tests
 * check its figures against NIST's CODATA 2018 table).
 */
export const CONSTANT_SOURCE = 'CODATA 2018 (via mathjs 15)';

/** The constants that define the atomic scale; every quantity-mode block relies on them. */
export const DEFINING_CONSTANTS = ['electronMass', 'elementaryCharge', 'reducedPlanckConstant', 'electricConstant'] as const;

const si = (u: Unit) => u.value;
const mE = si(electronMass);
const charge = si(elementaryCharge);
const hbar = si(reducedPlanckConstant);
const fourPiEps0 = 4 * Math.PI * si(electricConstant);

/** Bohr radius a0 = 4 pi eps0 hbar^2 / (m_e e^2) and hartree energy E_h = hbar^2 / (m_e a0^2), in SI. */
export const BOHR_METRES = (fourPiEps0 * hbar * hbar) / (mE * charge * charge);
export const HARTREE_JOULES = (hbar * hbar) / (mE * BOHR_METRES * BOHR_METRES);
const timeSeconds = hbar / HARTREE_JOULES;

/** The SI size of the atomic unit of each base dimension; temperature uses E_h = k_B T. */
const ATOMIC_UNIT_SI: Dimension = [mE, BOHR_METRES, timeSeconds, charge / timeSeconds, HARTREE_JOULES / si(boltzmann)];

/** Converts an SI value of the given dimension into atomic units. */
export function toAtomic(siValue: number, dimension: Dimension): number {
  let scale = 1;
  for (let i = 0; i < dimension.length; i++) if (dimension[i] !== 0) scale *= ATOMIC_UNIT_SI[i] ** dimension[i];
  return siValue / scale;
}

/** The constants a quantity of this dimension needs to be put on the atomic scale. */
export function scaleConstants(dimension: Dimension): string[] {
  return dimension[4] !== 0 ? ['boltzmann'] : [];
}
