import type { Claimed, SpecProblem } from '../spec/types.ts';
import { writtenPrecision } from '../spec/written-precision.ts';
import { DEFINING_CONSTANTS } from './atomic-scale.ts';
import { ANY, DIMENSIONLESS, ENERGY, describeDimension, sameDimension, type Dimension, type DimensionOrAny } from './dimension.ts';
import { energyUnit, type EnergyUnit } from './energy-units.ts';
import type { PhysicalName } from './physical-names.ts';
import { readQuantity } from './read-quantity.ts';
import { writtenUnit, type WrittenUnit } from './written-unit.ts';

/** A number or quantity as written in the block (the YAML scalar's source text), with its line. */
export interface QuantitySource {
  text: string;
  line: number;
}

/** A field's value in atomic units, with the unit it was written in (null for a pure number). */
export interface Reading {
  atomic: number;
  dimension: DimensionOrAny;
  unit: WrittenUnit | null;
}

/** A number, a sign, then whatever follows it: "-5.48 meV" -> "-5.48", "meV". */
const NUMERAL = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/;

/**
 * Reads the quantity fields of one block, collecting the problems (with file, line, block and
 * field) and the physical constants the values rest on, instead of stopping at the first.
 */
export class FieldReader {
  readonly problems: SpecProblem[] = [];
  readonly relied = new Set<string>(DEFINING_CONSTANTS);

  constructor(private readonly file: string, private readonly block: string) {}

  complain(field: string, line: number, message: string): void {
    this.problems.push({ file: this.file, line, block: this.block, field, message });
  }

  rely(physical: Iterable<PhysicalName>): void {
    for (const p of physical) p.relies.forEach((name) => this.relied.add(name));
  }

  /** A quantity that must have `expect` (unless null); a bare number is taken in `plain`, or as a pure number. */
  quantity(field: string, source: QuantitySource, expect: Dimension | null, plain: WrittenUnit | null): Reading | null {
    const numeral = NUMERAL.exec(source.text);
    if (plain && numeral && numeral[2] === '') return { atomic: Number(numeral[1]) * plain.atomic, dimension: expect ?? DIMENSIONLESS, unit: plain };
    const reading = readQuantity(source.text);
    if (!reading.ok) {
      this.complain(field, source.line, reading.message);
      return null;
    }
    const q = reading.quantity;
    if (expect && q.dimension !== ANY && !sameDimension(q.dimension, expect)) {
      this.complain(field, source.line, `${field} must be ${describeDimension(expect)}, but ${source.text} is ${describeDimension(q.dimension)}`);
      return null;
    }
    this.rely(q.physical.values());
    return { atomic: q.atomic, dimension: q.dimension, unit: writtenUnit(q.tree, q.physical) };
  }

  /**
   * An energy: "-5.48 meV", "44 cm^-1", "3 K" through the energy units (so spectroscopic units
   * count as energies), a bare number in the block's energy unit, anything else as a quantity.
   */
  energy(field: string, source: QuantitySource, blockUnit: EnergyUnit | null): Reading | null {
    const numeral = NUMERAL.exec(source.text);
    const named = numeral && numeral[2] !== '' ? energyUnit(numeral[2]) : null;
    const unit = named ?? (numeral && numeral[2] === '' ? blockUnit : null);
    if (numeral && unit) {
      unit.constants.forEach((name) => this.relied.add(name));
      return { atomic: Number(numeral[1]) * unit.hartrees, dimension: ENERGY, unit: { text: unit.name, atomic: unit.hartrees } };
    }
    // A bare number without a block energy unit: that unit's own problem is reported already.
    if (numeral && numeral[2] === '') return null;
    return this.quantity(field, source, ENERGY, null);
  }

  /** A value with its tolerance: the one given, or the one its written digits imply (spec/written-precision.ts). */
  claimed(
    field: string,
    source: QuantitySource,
    tolerance: { field: string; source: QuantitySource } | null,
    read: (field: string, source: QuantitySource) => Reading | null,
    unitFraction: 0.5 | 1,
  ): Claimed | null {
    const value = read(field, source);
    if (!value) return null;
    if (!tolerance) return { value: value.atomic, tolerance: impliedTolerance(source.text, value, unitFraction) };
    const t = read(tolerance.field, tolerance.source);
    if (!t) return null;
    if (!(t.atomic > 0)) {
      this.complain(tolerance.field, tolerance.source.line, `tolerance must be positive, not ${tolerance.source.text}`);
      return null;
    }
    return { value: value.atomic, tolerance: t.atomic };
  }
}

/** Half (or a whole) unit of the last written digit, times the unit written after the number when the text is just that. */
function impliedTolerance(text: string, value: Reading, unitFraction: 0.5 | 1): number {
  const numeral = NUMERAL.exec(text);
  const size = value.unit?.atomic ?? 1;
  if (numeral && Math.abs(Number(numeral[1]) * size - value.atomic) <= 1e-12 * Math.abs(value.atomic)) {
    return writtenPrecision(numeral[1], Number(numeral[1]), unitFraction) * Math.abs(size);
  }
  return writtenPrecision(text, value.atomic, unitFraction);
}
