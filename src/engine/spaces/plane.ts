import { gridLevels } from '../grid-levels.ts';
import { radialFactor } from './radial-factor.ts';
import type { CoordinateSpace } from './space.ts';

/**
 * `plane`: 2-D with a rotationally symmetric potential, psi = R(r) e^{i m phi}; the trial is R(r), volume element
 * 2 pi r dr, and the angular part of the kinetic energy m^2/(2 mass r^2) (any integer m).
 */
export function planeSpace(m: number): CoordinateSpace {
  const m2 = m * m;
  return {
    ...radialFactor({ dimension: 2, angular: m2, weight: (r) => r, centrifugal: m2 === 0 ? () => 0 : (r) => m2 / r }),
    name: 'plane',
    lo: 0,
    hi: Infinity,
    walls: [],
    // The grid reports chi = sqrt(r) R (its square is the density in r) at nodes that avoid r = 0.
    gridLevels: (request) => gridLevels({ ...request, space: 'plane', angularMomentum: m }),
    gridFactor: (r) => Math.sqrt(r),
  };
}
