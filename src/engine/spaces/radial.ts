import { gridLevels } from '../grid-levels.ts';
import { radialFactor } from './radial-factor.ts';
import type { CoordinateSpace } from './space.ts';

/** `radial`: 3-D with a spherically symmetric potential; the trial is the radial factor R(r), volume element r^2 dr. */
export function radialSpace(l: number): CoordinateSpace {
  const l2 = l * (l + 1);
  return {
    ...radialFactor({ dimension: 3, angular: l2, weight: (r) => r * r, centrifugal: () => l2 }),
    name: 'radial',
    lo: 0,
    hi: Infinity,
    walls: [],
    // The grid solves for chi = r R, whose centrifugal term l(l+1)/(2 m r^2) it adds to V.
    gridLevels: (request) => gridLevels({ ...request, space: 'radial', angularMomentum: l }),
    gridFactor: (r) => r,
  };
}
