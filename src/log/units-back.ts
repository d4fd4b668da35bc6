import type { FieldCut, FieldDensity } from '../engine/field-plot-data.ts';
import { g, type ValueDisplay } from '../engine/format.ts';
import type { QuantityMode } from '../spec/types.ts';
import type { BlockResult } from './result-types.ts';

/**
 * A result computed in atomic units, stated in the units of its quantity-mode block: energies in the block's (or
 * report's) energy unit, lengths in its length unit, parameters in the units they were written in. Relative
 * errors and the check details stay as computed.
 */
export function inBlockUnits(result: BlockResult, units: QuantityMode): BlockResult {
  const E = units.energy.perHartree;
  const L = units.length.perBohr;
  const energy = (v: number) => v * E;
  const maybe = (v: number | null) => (v === null ? null : v * E);
  const parameter = (name: string, v: number) => v * (units.parameters[name]?.perAtomic ?? 1);
  const { reference, claim, plots, inputs, diagnostics } = result;
  return {
    ...result,
    inputs: inputs && {
      ...inputs,
      lengthUnit: units.length.unit,
      box: inputs.box && [inputs.box[0] * L, inputs.box[1] * L],
      constants: Object.fromEntries(Object.entries(inputs.constants).filter(([name]) => !units.bound.includes(name))),
      ranges: inputs.ranges.map((r) => ({ name: r.name, start: parameter(r.name, r.start), min: parameter(r.name, r.min), max: parameter(r.name, r.max) })),
    },
    energy: result.energy && { value: energy(result.energy.value), unit: units.energy.unit },
    parameters: Object.fromEntries(
      Object.entries(result.parameters).map(([name, p]) => [name, { ...p, value: parameter(name, p.value), unit: units.parameters[name]?.unit ?? null }]),
    ),
    variance: result.variance === null ? null : result.variance * E * E,
    states: result.states.map((s) => ({ energy: energy(s.energy), reference: maybe(s.reference), errorEstimate: s.errorEstimate * Math.abs(E) })),
    components: result.components && { ...result.components, kinetic: energy(result.components.kinetic), potential: energy(result.components.potential) },
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
        samples: plots.density.samples.map((s) => ({ x: s.x * L, trial: s.trial / L, potential: maybe(s.potential) })),
        grid: plots.density.grid.map((g) => ({ x: g.x * L, density: g.density / L })),
      },
      field: plots.field && fieldInUnits(plots.field, L, maybe),
    },
    diagnostics: diagnostics && {
      ...diagnostics,
      energyError: diagnostics.energyError === null ? null : diagnostics.energyError * Math.abs(E),
      grid: diagnostics.grid && { ...diagnostics.grid, domain: [diagnostics.grid.domain[0] * L, diagnostics.grid.domain[1] * L] },
    },
    quantity: units,
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
  return {
    energy: (value, digits) => `${g(value * units.energy.perHartree, digits)} ${units.energy.unit}`,
    parameter: (name, value, digits) => {
      const p = units.parameters[name];
      return p ? `${g(value * p.perAtomic, digits)}${p.unit ? ` ${p.unit}` : ''}` : g(value, digits);
    },
  };
}
