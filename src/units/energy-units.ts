import { ENERGY, sameDimension } from './dimension.ts';
import { readQuantity } from './read-quantity.ts';

/**
 * Units in which a quantity-mode block may state and report energies. Spectroscopic "energies"
 * go through their defining relations: E = h c / lambda (cm^-1), E = k_B T (K), E = h f (THz).
 * The hartree is the atomic unit itself and the Rydberg energy half of it (CODATA: R_inf h c = E_h / 2).
 */
const DEFINITIONS: Readonly<Record<string, { quantity: string } | { hartrees: number; relation: string }>> = {
  meV: { quantity: 'elementaryCharge * 1 mV' },
  eV: { quantity: 'elementaryCharge * 1 V' },
  hartree: { hartrees: 1, relation: 'E_h, the atomic unit of energy' },
  rydberg: { hartrees: 0.5, relation: 'E_h / 2' },
  'cm^-1': { quantity: 'planckConstant * speedOfLight * 1 cm^-1' },
  K: { quantity: 'boltzmann * 1 K' },
  THz: { quantity: 'planckConstant * 1 THz' },
};

export const ENERGY_UNIT_NAMES = Object.keys(DEFINITIONS);

export interface EnergyUnit {
  name: string;
  /** The size of one unit in hartree (atomic units of energy). */
  hartrees: number;
  /** What one unit is: the quantity it is computed from, or its relation to the hartree. */
  definition: string;
  /** The physical constants its size rests on besides those of the atomic scale. */
  constants: string[];
}

export function energyUnit(name: string): EnergyUnit | null {
  const definition = DEFINITIONS[name];
  if (definition === undefined) return null;
  if ('hartrees' in definition) return { name, hartrees: definition.hartrees, definition: definition.relation, constants: [] };
  const reading = readQuantity(definition.quantity);
  if (!reading.ok || reading.quantity.dimension === 'any' || !sameDimension(reading.quantity.dimension, ENERGY)) {
    throw new Error(`the definition of ${name} (${definition.quantity}) is not an energy`);
  }
  const { atomic, physical } = reading.quantity;
  return { name, hartrees: atomic, definition: definition.quantity, constants: [...new Set([...physical.values()].flatMap((p) => p.relies))] };
}
