import { gridLevels } from '../grid-levels.ts';
import { flatCoordinate } from './flat-coordinate.ts';
import type { CoordinateSpace } from './space.ts';

/** `line`: x on the whole real line, no walls. */
export const lineSpace: CoordinateSpace = {
  ...flatCoordinate,
  name: 'line',
  lo: -Infinity,
  hi: Infinity,
  walls: [],
  gridLevels: (request) => gridLevels({ ...request, space: 'line', angularMomentum: 0 }),
};
