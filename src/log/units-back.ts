import type { FieldCut, FieldDensity } from '../engine/field-plot-data.ts';
import { g, type ValueDisplay } from '../engine/format.ts';
import type { QuantityMode, StatedUnit } from '../spec/types.ts';
import type { BlockResult, Sensitivity } from './result-types.ts';

const PURE: StatedUnit = { unit: null, perAtomic: 1 };

/**
 * The one place that knows which unit each kind of value of a quantity-mode block is stated in:
 * energies in the block's (or report's) energy unit, lengths in its length unit, parameters and
 * declared constants in the units they were written in, the norm integral in a power of the length unit.
 * Both the numbers (inBlockUnits) and the words of check details (blockUnitsDisplay) come from here.
 */
function scalesOf(units: QuantityMode): BlockScales {
  return {
    energy: { unit: units.energy.unit, perAtomic: units.energy.perHartree },
    length: { unit: units.length.unit, perAtomic: units.length.perBohr },
    norm: units.norm,
    parameter: (name) => units.parameters[name] ?? PURE,
    constant: (name) => units.constants[name] ?? PURE,
  };
}

interface BlockScales {
  energy: StatedUnit;
  length: StatedUnit;
  norm: StatedUnit;
  parameter(name: string): StatedUnit;
  constant(name: string): StatedUnit;
}

/** A value with its unit, as a message states it: "5 nm", "12.9". */
function stated(value: number, scale: StatedUnit, digits?: number): string {
  return `${g(value * scale.perAtomic, digits)}${scale.unit ? ` ${scale.unit}` : ''}`;
}

/**
 * A result computed in atomic units, stated in the units of its quantity-mode block. Relative errors
 * and ratios stay as computed.
 */
export function inBlockUnits(result: BlockResult, units: QuantityMode): BlockResult {
  const s = scalesOf(units);
  const E = s.energy.perAtomic;
  const L = s.length.perAtomic;
  const energy = (v: number) => v * E;
  const maybe = (v: number | null) => (v === null ? null : v * E);
  const parameter = (name: string, v: number) => v * s.parameter(name).perAtomic;
  const { reference, claim, plots, inputs, diagnostics } = result;
  const varied = Object.keys(result.parameters).filter((name) => result.parameters[name].varied);
  const declared = inputs ? Object.keys(inputs.constants).filter((name) => !units.bound.includes(name)) : [];
  return {
    ...result,
    inputs: inputs && {
      ...inputs,
      lengthUnit: units.length.unit,
      box: inputs.box && [inputs.box[0] * L, inputs.box[1] * L],
      constants: Object.fromEntries(declared.map((name) => [name, inputs.constants[name] * s.constant(name).perAtomic])),
      constantUnits: Object.fromEntries(declared.map((name) => [name, s.constant(name).unit])),
      ranges: inputs.ranges.map((r) => ({ name: r.name, start: parameter(r.name, r.start), min: parameter(r.name, r.min), max: parameter(r.name, r.max) })),
    },
    energy: result.energy && { value: energy(result.energy.value), unit: units.energy.unit },
    hamiltonian: result.hamiltonian && {
      ...result.hamiltonian,
      box: result.hamiltonian.box && [result.hamiltonian.box[0] * L, result.hamiltonian.box[1] * L],
      potential: result.hamiltonian.potential.map((v) => (v === null ? null : energy(v))),
    },
    parameters: Object.fromEntries(
      Object.entries(result.parameters).map(([name, p]) => [name, { ...p, value: parameter(name, p.value), unit: s.parameter(name).unit }]),
    ),
    variance: result.variance === null ? null : result.variance * E * E,
    states: result.states.map((state) => ({ energy: energy(state.energy), reference: maybe(state.reference), errorEstimate: state.errorEstimate * Math.abs(E) })),
    components: result.components && {
      kinetic: energy(result.components.kinetic),
      potential: energy(result.components.potential),
      norm: result.components.norm * s.norm.perAtomic,
    },
    reference: reference && {
      ...reference,
      energy: maybe(reference.energy),
      excited: maybe(reference.excited),
      threshold: maybe(reference.threshold),
      published: reference.published && { ...reference.published, energy: energy(reference.published.energy), tolerance: reference.published.tolerance * E },
    },
    bounds: {
      upper: maybe(result.bounds.upper),
      lower: maybe(result.bounds.lower),
      weinstein: result.bounds.weinstein && [energy(result.bounds.weinstein[0]), energy(result.bounds.weinstein[1])],
    },
    // The numbers beside a check's words are stated in the same units as the words.
    checks: result.checks.map((c) => {
      if (!c.measure || c.measure.quantity === 'ratio') return c;
      const q = c.measure.quantity;
      const scale = q === 'energy' ? E : s.parameter(q.parameter).perAtomic;
      return { ...c, measure: { ...c.measure, value: c.measure.value * scale, limit: c.measure.limit * scale } };
    }),
    claim: claim && {
      energy: maybe(claim.energy),
      tolerance: maybe(claim.tolerance),
      parameters: Object.fromEntries(Object.entries(claim.parameters).map(([name, c]) => [name, { value: parameter(name, c.value), tolerance: parameter(name, c.tolerance) }])),
    },
    plots: plots && {
      ...plots,
      scans: plots.scans.map((scan) => ({
        parameter: scan.parameter,
        optimum: parameter(scan.parameter, scan.optimum),
        points: scan.points.map((p) => ({ value: parameter(scan.parameter, p.value), energy: maybe(p.energy) })),
      })),
      // Densities are per unit length, so they scale inversely with it.
      density: plots.density && {
        coordinate: plots.density.coordinate,
        ...(plots.density.plane ? { plane: true } : {}),
        samples: plots.density.samples.map((x) => ({ x: x.x * L, trial: x.trial / L, potential: maybe(x.potential) })),
        grid: plots.density.grid.map((p) => ({ x: p.x * L, density: p.density / L })),
      },
      field: plots.field && fieldInUnits(plots.field, L, maybe),
    },
    diagnostics: diagnostics && {
      ...diagnostics,
      // d2E / dp_i dp_j: an energy per unit of each of the two parameters (varied ones, in the engine's order).
      optimiser: diagnostics.optimiser && {
        ...diagnostics.optimiser,
        curvature: diagnostics.optimiser.curvature.map((row, i) => row.map((c, j) => (c * E) / (s.parameter(varied[i]).perAtomic * s.parameter(varied[j]).perAtomic))),
      },
      energyError: diagnostics.energyError === null ? null : diagnostics.energyError * Math.abs(E),
      grid: diagnostics.grid && {
        ...diagnostics.grid,
        domain: [diagnostics.grid.domain[0] * L, diagnostics.grid.domain[1] * L],
        ...(diagnostics.grid.correlated
          ? {
              correlated: {
                ...diagnostics.grid.correlated,
                sets: diagnostics.grid.correlated.sets.map((s) => ({ alpha: s.alpha / L, beta: s.beta / L, omega: s.omega })),
                steps: diagnostics.grid.correlated.steps.map((s) => ({ ...s, levels: [energy(s.levels[0]), maybe(s.levels[1])] as [number, number | null] })),
              },
            }
          : {}),
      },
    },
    sensitivities: result.sensitivities && result.sensitivities.map((s) => sensitivityInUnits(s, units)),
    uncertainty: result.uncertainty && {
      ...result.uncertainty,
      energy: energy(result.uncertainty.energy),
      uncertainty: result.uncertainty.uncertainty * E,
      reevaluated: maybe(result.uncertainty.reevaluated),
    },
    ...(result.binding !== undefined ? { binding: result.binding && { ...result.binding, threshold: energy(result.binding.threshold) } } : {}),
    quantity: units,
  };
}

/** dE/dc in the block's energy unit per the input's unit; the input, its step and uncertainty in that unit. */
function sensitivityInUnits(s: Sensitivity, units: QuantityMode): Sensitivity {
  const input = units.inputs[s.name] ?? { unit: null, perAtomic: 1 };
  const E = units.energy.perHartree;
  const slope = (v: number | null) => (v === null ? null : (v * E) / input.perAtomic);
  return {
    ...s,
    value: s.value * input.perAtomic,
    unit: input.unit,
    step: s.step * input.perAtomic,
    uncertainty: s.uncertainty === null ? null : s.uncertainty * input.perAtomic,
    hellmannFeynman: slope(s.hellmannFeynman),
    finiteDifference: slope(s.finiteDifference),
    contribution: s.contribution === null ? null : s.contribution * E,
    reevaluated: s.reevaluated === null ? null : s.reevaluated * E,
    perUnit: input.unit ? `${units.energy.unit}/(${input.unit})` : units.energy.unit,
  };
}

/** Every coordinate of a space of several coordinates is a length; the density is per length to the space's dimension. */
function fieldInUnits(field: FieldDensity, L: number, energy: (v: number | null) => number | null): FieldDensity {
  const perVolume = L ** field.dimension;
  const cut = (c: FieldCut): FieldCut => ({
    coordinate: c.coordinate,
    samples: c.samples.map((s) => ({ x: s.x * L, trial: s.trial / perVolume, potential: energy(s.potential) })),
    grid: c.grid.map((g) => ({ x: g.x * L, density: g.density / perVolume })),
  });
  return {
    ...field,
    through: field.through.map((x) => x * L),
    picture: { x: field.picture.x.map((x) => x * L), y: field.picture.y.map((y) => y * L), density: field.picture.density.map((v) => v / perVolume) },
    cuts: field.cuts.map(cut),
  };
}

/** Check details of a quantity-mode block in its own units (every quantity in a detail scales linearly). */
export function blockUnitsDisplay(units: QuantityMode): ValueDisplay {
  const s = scalesOf(units);
  return {
    energy: (value, digits) => stated(value, s.energy, digits),
    parameter: (name, value, digits) => stated(value, s.parameter(name), digits),
    length: (value, digits) => stated(value, s.length, digits),
    norm: (value, digits) => stated(value, s.norm, digits),
  };
}
