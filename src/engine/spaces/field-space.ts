import type { CubatureAxis, CubatureResult, ProductIntegrand } from '../cubature/integrate-product.ts';
import type { ProductGridProblem } from '../grid-nd/product-grid-levels.ts';
import type { FieldTrial, PointFunction } from '../problem.ts';
import type { CoordinateSpace } from './space.ts';

/** Where a trial of several coordinates lives along one axis: through its peak, the centre and length scale. */
export interface AxisPlacement {
  center: number;
  scale: number;
  /** Interior split points along the axis: kinks of the potential or trial, nuclei on it. */
  breakpoints: number[];
}

/**
 * A space of several coordinates (axial, a Cartesian product): its axes (each a space of one coordinate, whose
 * weight is the volume element along it and whose walls are the faces of the region), the integrands of the energy
 * over it, and how to integrate over it. The evaluation reads such a space only through this.
 */
export interface FieldSpace {
  name: 'axial' | 'product';
  coordinates: string[];
  axes: CoordinateSpace[];
  /** N, T and V integrands (the kinetic one already divided by 2m: masses may differ per axis). */
  energyIntegrand(trial: FieldTrial, potential: PointFunction): ProductIntegrand;
  varianceIntegrand(trial: FieldTrial, potential: PointFunction, energy: number): ProductIntegrand;
  /**
   * The integral over the space of an integrand that carries its volume element, with its error estimate, placed
   * where the trial lives; `start` is a previous result's partition at nearby parameters.
   */
  integrate(integrand: ProductIntegrand, components: number, placements: AxisPlacement[], options: FieldCubatureOptions): FieldCubatureResult;
  /** Points along the axis where the potential is singular although no switch function marks them (axial: nuclei on the axis). */
  singularities(potential: PointFunction, placements: AxisPlacement[]): Array<{ axis: number; points: number[] }>;
  /** The product-grid problem of H on this space, its element edges at the split points and its scales from the placement. */
  gridProblem(potential: PointFunction, placements: AxisPlacement[]): ProductGridProblem;
}

/** The grid hint of an axis from where the trial lives along it. */
export function gridHint(placement: AxisPlacement): { center: number; width: number } {
  return { center: placement.center, width: placement.scale };
}

export interface FieldCubatureOptions {
  relTol: number;
  absTol?: number;
  start?: unknown;
}

/** A cubature's values and diagnostics; its partition is the space's own, handed back as `start`. */
export type FieldCubatureResult = Omit<CubatureResult, 'partition'> & { partition: unknown };

/** The cubature axes of a space at a placement of the trial. */
export function cubatureAxes(space: FieldSpace, placements: AxisPlacement[]): CubatureAxis[] {
  return space.axes.map((axis, k) => ({ lo: axis.lo, hi: axis.hi, breakpoints: placements[k].breakpoints, center: axis.lo === 0 ? 0 : placements[k].center, scale: placements[k].scale }));
}
