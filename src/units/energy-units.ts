import { ENERGY, dimensionName, sameDimension, type Dimension } from './dimension.ts';
import { readQuantity } from './read-quantity.ts';
import { writtenUnit } from './written-unit.ts';

/**
 * Units in which a quantity-mode block may state and report energies: any mathjs energy unit, and
 * the spectroscopic "energies" through their defining relations, E = h f (a frequency),
 * E = k_B T (a temperature), E = h c / lambda (a wavenumber), each with any SI prefix mathjs takes.
 * The hartree is the atomic unit itself and the Rydberg energy half of it (CODATA: R_inf h c = E_h / 2).
 */
const NAMED: Readonly<Record<string, { hartrees: number; relation: string }>> = {
  hartree: { hartrees: 1, relation: 'E_h, the atomic unit of energy' },
  rydberg: { hartrees: 0.5, relation: 'E_h / 2' },
};

const FREQUENCY: Dimension = [0, 0, -1, 0, 0];
const TEMPERATURE: Dimension = [0, 0, 0, 0, 1];
const WAVENUMBER: Dimension = [0, -1, 0, 0, 0];

/** The relation that makes one unit of each kind an energy, as a quantity mathjs can evaluate. */
const RELATIONS: ReadonlyArray<{ dimension: Dimension; quantity: (unit: string) => string }> = [
  // eV is sized as e times 1 V (physical-names.ts), so the definition says so.
  { dimension: ENERGY, quantity: (unit) => (/^[a-zA-Z]?eV$/.test(unit) ? `elementaryCharge * 1 ${unit.slice(0, -2)}V` : `1 ${unit}`) },
  { dimension: FREQUENCY, quantity: (unit) => `planckConstant * 1 ${unit}` },
  { dimension: TEMPERATURE, quantity: (unit) => `boltzmann * 1 ${unit}` },
  { dimension: WAVENUMBER, quantity: (unit) => `planckConstant * speedOfLight * 1 ${unit}` },
];

/** Some of the names energyUnit takes, for messages and docs; SI prefixes on the mathjs ones work too. */
export const ENERGY_UNIT_EXAMPLES = ['meV', 'eV', 'neV', 'ueV', 'J', 'hartree', 'rydberg', 'cm^-1', 'K', 'mK', 'uK', 'Hz', 'kHz', 'MHz', 'GHz', 'THz'] as const;

/** What an energy field or `units.energy` takes, for a refusal. */
export const ENERGY_UNIT_HELP =
  'write an energy unit (meV, eV, neV, J, hartree, rydberg), a frequency (Hz, kHz, MHz, GHz, THz: E = h f), a temperature (K, mK, uK: E = k_B T) or a wavenumber (cm^-1: E = h c / lambda)';

export interface EnergyUnit {
  name: string;
  /** The size of one unit in hartree (atomic units of energy). */
  hartrees: number;
  /** What one unit is: the quantity it is computed from, or its relation to the hartree. */
  definition: string;
  /** The physical constants its size rests on besides those of the atomic scale. */
  constants: string[];
}

export type EnergyUnitReading = { ok: true; unit: EnergyUnit } | { ok: false; message: string };

const cache = new Map<string, EnergyUnitReading>();

/** One unit sized in hartree, or why it is not a unit an energy can be stated in. */
export function readEnergyUnit(name: string): EnergyUnitReading {
  let reading = cache.get(name);
  if (reading === undefined) {
    reading = sizeEnergyUnit(name);
    cache.set(name, reading);
  }
  return reading;
}

export function energyUnit(name: string): EnergyUnit | null {
  const reading = readEnergyUnit(name);
  return reading.ok ? reading.unit : null;
}

function sizeEnergyUnit(name: string): EnergyUnitReading {
  const named = NAMED[name];
  if (named !== undefined) return { ok: true, unit: { name, hartrees: named.hartrees, definition: named.relation, constants: [] } };
  const refused = (why: string): EnergyUnitReading => ({ ok: false, message: `${name} ${why}; ${ENERGY_UNIT_HELP}` });
  const alone = readQuantity(`1 ${name}`);
  if (!alone.ok) return refused('is not a unit quantity mode knows');
  const { tree, physical, dimension, atomic } = alone.quantity;
  // Only units: a constant, a number (pi meV) or an expression has no single size to call a unit.
  const unit = writtenUnit(tree, physical);
  if (unit === null || Math.abs(unit.atomic - atomic) > 1e-12 * Math.abs(atomic) || [...physical.values()].some((p) => p.kind !== 'unit')) return refused('is not a single unit');
  if (dimension === 'any') return refused('has no dimension');
  const relation = RELATIONS.find((r) => sameDimension(r.dimension, dimension));
  if (!relation) return refused(`is a unit of ${dimensionName(dimension)}, not of energy`);
  const definition = relation.quantity(name);
  const sized = readQuantity(definition);
  if (!sized.ok || sized.quantity.dimension === 'any' || !sameDimension(sized.quantity.dimension, ENERGY)) {
    throw new Error(`the definition of ${name} (${definition}) is not an energy`);
  }
  const constants = [...new Set([...sized.quantity.physical.values()].flatMap((p) => p.relies))];
  return { ok: true, unit: { name, hartrees: sized.quantity.atomic, definition, constants } };
}
