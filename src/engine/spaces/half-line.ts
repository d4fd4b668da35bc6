import { gridLevels } from '../grid-levels.ts';
import { flatCoordinate } from './flat-coordinate.ts';
import type { CoordinateSpace } from './space.ts';

/** `half-line`: x >= 0 with a hard wall at 0. */
export const halfLineSpace: CoordinateSpace = {
  ...flatCoordinate,
  name: 'half-line',
  lo: 0,
  hi: Infinity,
  walls: [0],
  gridLevels: (request) => gridLevels({ ...request, space: 'half-line', angularMomentum: 0 }),
};
