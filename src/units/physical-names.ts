import * as mathjs from 'mathjs';
import type { Unit } from 'mathjs';
import { CONSTANT_SOURCE, scaleConstants, toAtomic } from './atomic-scale.ts';
import { DIMENSIONLESS, ENERGY, LENGTH, fromMathjs, type Dimension } from './dimension.ts';

/**
 * The mathjs physical constants a record may name in quantity mode: those of the CODATA 2018
 * adjustment whose dimensions a Hamiltonian can have. Left out: `coulomb` (deprecated alias of
 * coulombConstant that shadows the unit C), the per-mole constants (amount of substance), and
 * the ones that are not CODATA figures or are defined through mathjs's older eV (fermiCoupling,
 * efimovFactor, sackurTetrode, gravity).
 */
const NAMES = [
  'speedOfLight', 'gravitationConstant', 'planckConstant', 'reducedPlanckConstant', 'magneticConstant',
  'electricConstant', 'vacuumImpedance', 'coulombConstant', 'elementaryCharge', 'bohrMagneton',
  'conductanceQuantum', 'inverseConductanceQuantum', 'magneticFluxQuantum', 'nuclearMagneton', 'klitzing',
  'bohrRadius', 'classicalElectronRadius', 'electronMass', 'fineStructure', 'hartreeEnergy', 'protonMass',
  'deuteronMass', 'neutronMass', 'quantumOfCirculation', 'rydberg', 'thomsonCrossSection', 'weakMixingAngle',
  'atomicMass', 'boltzmann', 'firstRadiation', 'loschmidt', 'secondRadiation', 'stefanBoltzmann',
  'wienDisplacement', 'planckLength', 'planckMass', 'planckTime', 'planckCharge', 'planckTemperature',
] as const;

/** The physical constants a quantity-mode expression may name. */
export const PHYSICAL_CONSTANT_NAMES: readonly string[] = NAMES;

// Not every constant is in mathjs's static typings (coulombConstant is missing), so look them up by name.
const mathjsByName = mathjs as unknown as Readonly<Record<string, Unit | number | undefined>>;
const PHYSICAL_CONSTANTS: ReadonlyMap<string, Unit | number> = new Map(
  NAMES.map((name) => {
    const value = mathjsByName[name];
    if (value === undefined) throw new Error(`mathjs has no physical constant ${name}`);
    return [name, value];
  }),
);

/**
 * mathjs defines its electronvolt units with the CODATA 2010 figure 1.602176565e-19 J while its
 * elementaryCharge is the exact 1.602176634e-19 C of the 2019 SI; we size eV as e times 1 V so
 * that units and constants agree (NIST: 1 eV = 1.602176634e-19 J exactly).
 */
const ELECTRONVOLT_NAMES = new Set(['eV', 'electronvolt', 'electronvolts']);

/** A unit or physical constant of mathjs, sized in atomic units. */
export interface PhysicalName {
  kind: 'unit' | 'constant';
  name: string;
  dimension: Dimension;
  atomic: number;
  /** Physical constants its size rests on besides the ones that define the atomic scale. */
  relies: string[];
}

/**
 * The atomic units of length and energy, which mathjs does not name: a block may write `length: bohr`,
 * `10 bohr` or `0.5 hartree`. (`rydberg` stays mathjs's Rydberg constant R_inf in expressions; as an
 * energy unit, in `units.energy` or an energy field, it is the Rydberg energy, energy-units.ts.)
 */
const ATOMIC_UNITS: ReadonlyMap<string, Dimension> = new Map([
  ['bohr', LENGTH],
  ['hartree', ENERGY],
]);

type Resolution = { ok: true; name: PhysicalName } | { ok: false; message: string } | null;

/** What a name means to mathjs in quantity mode: a constant, a unit, one we refuse (and why), or nothing. */
export function resolvePhysicalName(name: string): Resolution {
  const constant = PHYSICAL_CONSTANTS.get(name);
  if (constant !== undefined) {
    if (typeof constant === 'number') return { ok: true, name: { kind: 'constant', name, dimension: DIMENSIONLESS, atomic: constant, relies: [name] } };
    const dimension = fromMathjs(constant.dimensions);
    if (!dimension.ok) return { ok: false, message: `${name} measures ${dimension.measures}, which has no place in a quantity-mode block` };
    return { ok: true, name: { kind: 'constant', name, dimension: dimension.dimension, atomic: toAtomic(constant.value, dimension.dimension), relies: [name, ...scaleConstants(dimension.dimension)] } };
  }
  const atomicUnit = ATOMIC_UNITS.get(name);
  if (atomicUnit !== undefined) return { ok: true, name: { kind: 'unit', name, dimension: atomicUnit, atomic: 1, relies: [] } };
  if (!mathjs.Unit.isValuelessUnit(name)) return null;
  const one = mathjs.unit(1, name);
  const component = one.units[0].unit;
  if (component.offset !== 0) return { ok: false, message: `${name} is a temperature scale with an offset, not a size; write temperatures in K` };
  const dimension = fromMathjs(one.dimensions);
  if (!dimension.ok) return { ok: false, message: `the unit ${name} measures ${dimension.measures}, which has no place in a quantity-mode block` };
  const electronvolt = ELECTRONVOLT_NAMES.has(component.name);
  const siValue = electronvolt ? (one.value / component.value) * mathjs.elementaryCharge.value : one.value;
  const relies = [...(electronvolt ? ['elementaryCharge'] : []), ...scaleConstants(dimension.dimension)];
  return { ok: true, name: { kind: 'unit', name, dimension: dimension.dimension, atomic: toAtomic(siValue, dimension.dimension), relies } };
}

/** An entry of a block's audit trail: a constant as mathjs holds it, and where the figure comes from. */
export interface ConstantUse {
  name: string;
  value: number;
  unit: string;
  source: string;
}

export function constantUse(name: string): ConstantUse {
  const constant = PHYSICAL_CONSTANTS.get(name);
  if (constant === undefined) throw new Error(`${name} is not one of the physical constants quantity mode knows`);
  if (typeof constant === 'number') return { name, value: constant, unit: '', source: CONSTANT_SOURCE };
  const unit = constant.formatUnits();
  return { name, value: constant.toNumber(unit), unit, source: CONSTANT_SOURCE };
}
