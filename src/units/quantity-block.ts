import { coordinatesOf, type BlockSpec, type Claimed, type SourceText, type Space, type SpecProblem, type StatedUnit } from '../spec/types.ts';
import { parse } from 'mathjs';
import { dependsOn } from '../expr/differentiate.ts';
import type { DimensionScope } from './check-dimensions.ts';
import { ANY, DIMENSIONLESS, ENERGY, LENGTH, MASS, describeDimension, isDimensionless, multiply, power, sameDimension, unify, type Dimension, type DimensionOrAny } from './dimension.ts';
import { ENERGY_UNIT_HELP, readEnergyUnit as sizeEnergyUnit, type EnergyUnit } from './energy-units.ts';
import { FieldReader, type QuantitySource, type Reading } from './field-reader.ts';
import { constantUse, resolvePhysicalName, type ConstantUse } from './physical-names.ts';
import { analyseExpression } from './quantity-expression.ts';
import { QUANTITY_SCOPE } from './read-quantity.ts';
import { siUnit, type WrittenUnit } from './written-unit.ts';

export type { QuantitySource } from './field-reader.ts';

/** A quantity-mode block as the spec layer hands it on: numbers still as written text, each with its line. */
export interface QuantityBlockSource {
  id: string;
  caption: string | null;
  system?: string;
  line: number;
  /** The `units` map as written ({ length: nm, energy: meV }), and the line of the field. */
  units: { entries: Record<string, QuantitySource>; line: number };
  space: Space;
  box: [QuantitySource, QuantitySource] | null;
  angularMomentum: number;
  mass: QuantitySource | null;
  constants: Record<string, QuantitySource>;
  potential: SourceText;
  /** Exactly one of trial and basis is given, as in atomic units. */
  trial: SourceText | null;
  basis: SourceText[] | null;
  states: number;
  level?: BlockSpec['level'];
  varied: Array<{ name: string; start: QuantitySource; min: QuantitySource; max: QuantitySource; line: number }>;
  fixed: Record<string, QuantitySource>;
  reference: { solve: boolean; energy: QuantitySource | null; tolerance: QuantitySource | null; source: string | null };
  claim: {
    energy: QuantitySource | null;
    tolerance: QuantitySource | null;
    parameters: Record<string, { value: QuantitySource; tolerance: QuantitySource | null }>;
  } | null;
  report: { energyUnit: QuantitySource | null; plots: BlockSpec['report']['plots'] };
}

/** How to state the engine's atomic-unit numbers in the block's units: value in unit = atomic value * factor. */
export interface UnitsBack {
  energy: { unit: string; perHartree: number; definition: string };
  length: { unit: string; perBohr: number };
  parameters: Record<string, StatedUnit>;
  /** Declared constants, in the unit each was written in (else the coherent SI unit). */
  constants: Record<string, StatedUnit>;
  /** The norm integral: |trial|^2 times length (times length^2 on the half-line, r^2 dr). */
  norm: StatedUnit;
}


export type QuantityConversion =
  | {
      ok: true;
      /** The same block in atomic units, ready for compileBlock and the engine. */
      spec: BlockSpec;
      back: UnitsBack;
      /** mathjs units and constants the potential and trial name, bound in spec.constants to their atomic-unit values. */
      bound: Record<string, number>;
      /** The audit trail: every physical constant the conversion rests on, with its source. */
      constantsUsed: ConstantUse[];
    }
  | { ok: false; problems: SpecProblem[] };

const ELECTRON_MASS: WrittenUnit = { text: 'electronMass', atomic: 1 };
const PURE_NUMBER: WrittenUnit = { text: '', atomic: 1 };

/**
 * Converts a quantity-mode block to atomic units after checking every dimension once: each
 * number becomes a plain atomic-unit number, the coordinate is in bohr, and the mathjs units and
 * constants in the expressions are bound to their atomic-unit values, so the existing compiler
 * and engine run on plain numbers. Returns every problem found, each naming its field and line.
 */
export function convertQuantityBlock(file: string, block: QuantityBlockSource): QuantityConversion {
  const reader = new FieldReader(file, block.id);

  for (const [key, source] of Object.entries(block.units.entries)) {
    if (key !== 'length' && key !== 'energy') reader.complain(`units.${key}`, source.line, `units takes length and energy; ${key} is not one of them`);
  }
  const lengthUnit = readLengthUnit(reader, block.units.entries.length, block.units.line);
  const blockEnergy = readEnergyUnit(reader, 'units.energy', block.units.entries.energy, block.units.line);
  const reportEnergy = block.report.energyUnit ? readEnergyUnit(reader, 'report.energy-unit', block.report.energyUnit, block.report.energyUnit.line) : blockEnergy;
  // The block's own energy unit counts once a bare energy is read in it (FieldReader.energy).
  reportEnergy?.constants.forEach((name) => reader.relied.add(name));

  // A bare mass counts electron masses, as in atomic units.
  let mass: BlockSpec['mass'] = 1;
  const coordinate = coordinatesOf(block.space)[0];
  const massProfile = block.mass && dependsOnCoordinate(block.mass.text, coordinate) ? block.mass : null;
  if (block.mass && !massProfile) {
    const m = reader.quantity('mass', block.mass, MASS, ELECTRON_MASS);
    if (m && !(m.atomic > 0)) reader.complain('mass', block.mass.line, `mass must be positive, not ${block.mass.text}`);
    else if (m) mass = m.atomic;
  }

  const scope: { variables: Record<string, DimensionOrAny>; constants: Record<string, { dimension: DimensionOrAny; atomic: number }> } = {
    variables: Object.fromEntries(coordinatesOf(block.space).map((c) => [c, LENGTH])),
    constants: { ...QUANTITY_SCOPE.constants, ...(massProfile || typeof mass !== 'number' ? {} : { mass: { dimension: MASS, atomic: mass } }) },
  };
  const declared: Record<string, number> = {};
  const fixed: Record<string, number> = {};
  const parameterUnits: UnitsBack['parameters'] = {};
  const constantUnits: UnitsBack['constants'] = {};
  for (const [group, entries, into] of [['constants', block.constants, declared], ['parameters', block.fixed, fixed]] as const) {
    for (const [name, source] of Object.entries(entries)) {
      const q = reader.quantity(`${group}.${name}`, source, null, null);
      // An unreadable name still counts as declared, so the expressions are not refused for it too.
      scope.constants[name] = q ? { dimension: q.dimension, atomic: q.atomic } : { dimension: ANY, atomic: Number.NaN };
      if (!q) continue;
      into[name] = q.atomic;
      (group === 'parameters' ? parameterUnits : constantUnits)[name] = displayUnit(q.dimension, [q]);
    }
  }
  const varied: BlockSpec['varied'] = [];
  for (const p of block.varied) {
    const field = `parameters.${p.name}`;
    const ends = (['start', 'min', 'max'] as const).map((end) => reader.quantity(`${field}.${end}`, p[end], null, null));
    scope.variables[p.name] = ANY;
    const [start, min, max] = ends;
    if (!start || !min || !max) continue;
    const startMin = unify(start.dimension, min.dimension);
    const dimension = startMin === null ? null : unify(startMin, max.dimension);
    if (dimension === null) {
      reader.complain(field, p.line, `start (${p.start.text}), min (${p.min.text}) and max (${p.max.text}) must have the same dimension`);
      continue;
    }
    scope.variables[p.name] = dimension;
    parameterUnits[p.name] = displayUnit(dimension, ends);
    if (!(min.atomic < max.atomic)) reader.complain(`${field}.max`, p.max.line, `max (${p.max.text}) must be larger than min (${p.min.text})`);
    else if (start.atomic < min.atomic || start.atomic > max.atomic) reader.complain(`${field}.start`, p.start.line, `start (${p.start.text}) must lie within [${p.min.text}, ${p.max.text}]`);
    else varied.push({ name: p.name, start: start.atomic, min: min.atomic, max: max.atomic, line: p.line });
  }

  // A bare wall position is in the block's length unit.
  let box: [number, number] | null = null;
  if (block.box) {
    const [left, right] = block.box.map((wall, i) => (lengthUnit ? reader.quantity(`box.${i}`, wall, LENGTH, lengthUnit) : null));
    if (left && right && left.atomic < right.atomic) box = [left.atomic, right.atomic];
    else if (left && right) reader.complain('box', block.box[0].line, `box [${block.box[0].text}, ${block.box[1].text}] must have its left wall below its right wall`);
  }

  const { bound, trialDimension } = checkExpressions(reader, block, scope, massProfile !== null);
  if (massProfile) {
    const profileBound = checkMassProfile(reader, massProfile, scope, block.varied.map((p) => p.name));
    if (profileBound) {
      Object.assign(bound, profileBound);
      mass = { text: massProfile.text, line: massProfile.line };
    }
  }

  const readEnergy = (field: string, source: QuantitySource) => reader.energy(field, source, blockEnergy);
  const toleranceOf = (field: string, source: QuantitySource | null) => (source ? { field, source } : null);
  const reference: BlockSpec['reference'] = {
    solve: block.reference.solve,
    energy: block.reference.energy ? reader.claimed('reference.energy', block.reference.energy, toleranceOf('reference.tolerance', block.reference.tolerance), readEnergy, 1) : null,
    source: block.reference.source,
    ...(block.reference.tolerance ? { toleranceGiven: true as const } : {}),
  };
  let claim: BlockSpec['claim'] = null;
  if (block.claim) {
    const parameters: Record<string, Claimed> = {};
    for (const [name, entry] of Object.entries(block.claim.parameters)) {
      const field = `claim.parameters.${name}`;
      const unit = parameterUnits[name];
      const dimension = scope.variables[name] ?? scope.constants[name]?.dimension;
      if (!unit || dimension === undefined || dimension === ANY) {
        reader.complain(field, entry.value.line, `claim names parameter ${name}, which the block does not declare or cannot read`);
        continue;
      }
      // A bare claimed value is in the unit the parameter is reported in.
      const plain = unit.unit === null ? PURE_NUMBER : { text: unit.unit, atomic: 1 / unit.perAtomic };
      const readParameter = (f: string, s: QuantitySource) => reader.quantity(f, s, dimension, plain);
      const c = reader.claimed(field, entry.value, toleranceOf(`${field}.tolerance`, entry.tolerance), readParameter, 0.5);
      if (c) parameters[name] = c;
    }
    const energy = block.claim.energy ? reader.claimed('claim.energy', block.claim.energy, toleranceOf('claim.tolerance', block.claim.tolerance), readEnergy, 0.5) : null;
    claim = { energy, parameters };
  }

  if (reader.problems.length > 0 || !lengthUnit || !reportEnergy) return { ok: false, problems: reader.problems };
  const back: UnitsBack = {
    energy: { unit: reportEnergy.name, perHartree: 1 / reportEnergy.hartrees, definition: reportEnergy.definition },
    length: { unit: lengthUnit.text, perBohr: 1 / lengthUnit.atomic },
    parameters: parameterUnits,
    constants: constantUnits,
    norm: normUnit(power(trialDimension, 2), block.space === 'radial' ? 3 : 1, lengthUnit),
  };
  const constantsUsed = [...reader.relied].map(constantUse);
  return {
    ok: true,
    spec: {
      id: block.id,
      caption: block.caption,
      ...(block.system !== undefined ? { system: block.system } : {}),
      line: block.line,
      units: 'atomic',
      space: block.space,
      box,
      angularMomentum: block.angularMomentum,
      mass,
      masses: null,
      constants: { ...bound, ...declared },
      potential: block.potential,
      trial: block.trial,
      basis: block.basis,
      states: block.states,
      ...(block.level ? { level: block.level } : {}),
      varied,
      fixed,
      reference,
      claim,
      report: { energyUnit: null, plots: block.report.plots },
      quantity: { ...back, constantsUsed, bound: Object.keys(bound) },
    },
    back,
    bound,
    constantsUsed,
  };
}

/** Checks the potential (an energy) and the trial or basis once, before any numerics; returns the mathjs names they use. */
function checkExpressions(reader: FieldReader, block: QuantityBlockSource, scope: DimensionScope, massVaries: boolean): { bound: Record<string, number>; trialDimension: DimensionOrAny } {
  const bound: Record<string, number> = {};
  let trialDimension: DimensionOrAny = DIMENSIONLESS;
  const fields: Array<[string, SourceText]> = [['potential', block.potential]];
  if (block.trial) fields.push(['trial', block.trial]);
  (block.basis ?? []).forEach((source, i) => fields.push([`basis[${i}]`, source]));
  for (const [field, source] of fields) {
    const analysed = analyseExpression(source.text, scope);
    if (!analysed.ok) {
      const unbound = massVaries && analysed.token === 'mass';
      reader.complain(field, source.line, unbound ? 'the mass depends on the coordinate in this block, so the name mass has no single value; write the mass it should stand for' : analysed.message);
      continue;
    }
    if (field === 'potential' && analysed.dimension !== ANY && !sameDimension(analysed.dimension, ENERGY)) {
      // Common slips: e is Euler's number here, as in atomic units; rydberg in an expression is mathjs's R_inf.
      const hint = [
        dependsOn(analysed.tree, 'e') ? "e is Euler's number; the elementary charge is elementaryCharge" : null,
        dependsOn(analysed.tree, 'rydberg') ? 'rydberg in an expression is the Rydberg constant R_inf, a wavenumber; the Rydberg energy is 0.5 hartree' : null,
      ].filter((h) => h !== null).map((h) => ` (${h})`).join('');
      reader.complain(field, source.line, `the potential must be an energy, but ${analysed.tree.toString()} is ${describeDimension(analysed.dimension)}${hint}`);
    }
    if (field === 'trial') trialDimension = analysed.dimension;
    reader.rely(analysed.physical.values());
    for (const [name, p] of analysed.physical) bound[name] = p.atomic;
  }
  return { bound, trialDimension };
}

/** Whether the mass as written names the coordinate (a position-dependent mass); unreadable text is left to the quantity reader. */
function dependsOnCoordinate(text: string, coordinate: string): boolean {
  try {
    return dependsOn(parse(text), coordinate);
  } catch {
    return false;
  }
}

/**
 * Checks a mass written as an expression of the coordinate: readable, free of varied parameters, and a mass (a bare
 * number counts electron masses, as for a constant mass). Returns the mathjs names it binds, or null after complaining.
 */
function checkMassProfile(reader: FieldReader, source: QuantitySource, scope: DimensionScope, varied: string[]): Record<string, number> | null {
  const analysed = analyseExpression(source.text, scope);
  if (!analysed.ok) {
    reader.complain('mass', source.line, analysed.message);
    return null;
  }
  const parameter = varied.find((name) => dependsOn(analysed.tree, name));
  if (parameter) {
    reader.complain('mass', source.line, `the mass may not depend on the varied parameter ${parameter}; hold it fixed (a plain value under parameters) or move it to constants`);
    return null;
  }
  const dimension = analysed.dimension;
  if (dimension !== ANY && !sameDimension(dimension, MASS) && !isDimensionless(dimension)) {
    reader.complain('mass', source.line, `the mass must be a mass (or a number of electron masses), but ${analysed.tree.toString()} is ${describeDimension(dimension)}`);
    return null;
  }
  reader.rely(analysed.physical.values());
  const bound: Record<string, number> = {};
  for (const [name, p] of analysed.physical) bound[name] = p.atomic;
  return bound;
}

function readLengthUnit(reader: FieldReader, source: QuantitySource | undefined, line: number): WrittenUnit | null {
  if (!source) {
    reader.complain('units.length', line, 'quantity mode needs a length unit, as in { length: nm, energy: meV }');
    return null;
  }
  const resolved = resolvePhysicalName(source.text.trim());
  if (resolved?.ok && resolved.name.kind === 'unit' && sameDimension(resolved.name.dimension, LENGTH)) return { text: source.text.trim(), atomic: resolved.name.atomic };
  reader.complain('units.length', source.line, `${source.text} is not a unit of length; write one such as nm, angstrom or um`);
  return null;
}

function readEnergyUnit(reader: FieldReader, field: string, source: QuantitySource | undefined, line: number): EnergyUnit | null {
  if (!source) {
    reader.complain(field, line, `quantity mode needs an energy unit: ${ENERGY_UNIT_HELP}`);
    return null;
  }
  const reading = sizeEnergyUnit(source.text.trim());
  if (reading.ok) return reading.unit;
  reader.complain(field, source.line, reading.message);
  return null;
}

/** The norm integral's unit: a power of the block's length unit when it is one (a dimensionless trial), else SI. */
function normUnit(trialSquared: DimensionOrAny, lengthPower: number, length: WrittenUnit): StatedUnit {
  const dimension = multiply(trialSquared, power(LENGTH, lengthPower));
  if (isDimensionless(dimension)) return { unit: null, perAtomic: 1 };
  const d = dimension as Dimension;
  if (!d.every((exponent, i) => i === 1 || exponent === 0)) return displayUnit(d, []);
  return { unit: d[1] === 1 ? length.text : `${length.text}^${d[1]}`, perAtomic: length.atomic ** -d[1] };
}

/** The unit a parameter is reported in: the first one written with its values, else the coherent SI unit. */
function displayUnit(dimension: DimensionOrAny, readings: Array<Reading | null>): StatedUnit {
  if (isDimensionless(dimension)) return { unit: null, perAtomic: 1 };
  const unit = readings.find((r) => r?.unit)?.unit ?? siUnit(dimension as Dimension);
  return { unit: unit.text, perAtomic: 1 / unit.atomic };
}
