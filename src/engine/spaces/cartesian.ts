import { cartesianEnergyIntegrand, cartesianVarianceIntegrand } from '../cubature/energy-integrands.ts';
import { integrateProduct, type CubaturePartition } from '../cubature/integrate-product.ts';
import type { PointFunction } from '../problem.ts';
import { boxSpace } from './box.ts';
import { cubatureAxes, gridHint, type FieldSpace } from './field-space.ts';
import { halfLineSpace } from './half-line.ts';
import { lineSpace } from './line.ts';
import type { CoordinateSpace } from './space.ts';

/** One Cartesian coordinate of a product: the whole line, x >= 0 with a wall at 0, or [a, b] with walls at both ends. */
export type AxisRange = 'line' | 'half-line' | [number, number];

/** A product of 2 or 3 named Cartesian coordinates, each with its range and its own mass; volume element dx dy [dz]. */
export function cartesianSpace(coordinates: Array<{ name: string; range: AxisRange; mass: number }>): FieldSpace {
  const masses = coordinates.map((c) => c.mass);
  const closures = (trial: Parameters<FieldSpace['energyIntegrand']>[0], potential: PointFunction) => ({ value: trial.value, gradient: trial.gradient, potential, masses });
  return {
    name: 'product',
    coordinates: coordinates.map((c) => c.name),
    axes: coordinates.map((c) => axisOf(c.range)),
    energyIntegrand: (trial, potential) => cartesianEnergyIntegrand(closures(trial, potential)),
    // The compiled Laplacian is already sum_k d2_k psi / m_k.
    varianceIntegrand: (trial, potential, energy) => cartesianVarianceIntegrand({ ...closures(trial, potential), laplacian: trial.laplacian }, energy),
    integrate(integrand, components, placements, options) {
      return integrateProduct(integrand, components, cubatureAxes(this, placements), { relTol: options.relTol, absTol: options.absTol, start: options.start as CubaturePartition | undefined });
    },
    singularities: () => [],
    gridProblem: (potential, placements) => ({
      axes: coordinates.map((c, k) => ({
        name: c.name,
        ...(Array.isArray(c.range) ? { kind: 'interval' as const, lo: c.range[0], hi: c.range[1] } : { kind: c.range }),
        mass: c.mass,
        breakpoints: placements[k].breakpoints,
        hint: gridHint(placements[k]),
      })),
      potential,
    }),
  };
}

function axisOf(range: AxisRange): CoordinateSpace {
  if (range === 'line') return lineSpace;
  if (range === 'half-line') return halfLineSpace;
  return boxSpace(range[0], range[1]);
}
