import type { ProblemBase } from '../problem.ts';
import { boxSpace } from './box.ts';
import { halfLineSpace } from './half-line.ts';
import { lineSpace } from './line.ts';
import { planeSpace } from './plane.ts';
import { radialSpace } from './radial.ts';
import type { CoordinateSpace } from './space.ts';

/** The space a block's problem lives on. */
export function spaceOf(problem: Pick<ProblemBase, 'space' | 'box' | 'angularMomentum'>): CoordinateSpace {
  if (problem.box) return boxSpace(problem.box[0], problem.box[1]);
  switch (problem.space) {
    case 'line':
      return lineSpace;
    case 'half-line':
      return halfLineSpace;
    case 'radial':
      return radialSpace(problem.angularMomentum);
    case 'plane':
      return planeSpace(problem.angularMomentum);
  }
}
