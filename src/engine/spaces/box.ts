import { gridLevels } from '../grid-levels.ts';
import { flatCoordinate } from './flat-coordinate.ts';
import type { CoordinateSpace } from './space.ts';

/** `box: [a, b]` on the line: hard walls at a and b. */
export function boxSpace(a: number, b: number): CoordinateSpace {
  return {
    ...flatCoordinate,
    name: 'box',
    lo: a,
    hi: b,
    walls: [a, b],
    gridLevels: (request) => gridLevels({ ...request, space: 'box', box: [a, b], angularMomentum: 0 }),
  };
}
