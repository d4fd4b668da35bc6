import type { CompiledBlock } from '../expr/compile-block.ts';
import type { BlockSpec, LineSpace } from '../spec/types.ts';
import type { Hamiltonian } from './result-types.ts';

// Spread geometrically from 0.05 to 2000 bohr: a Coulomb core, an atomic-scale trap and a well tens of
// nanometres wide (1 nm is about 19 bohr) each have points where they differ from their neighbours.
const OFFSETS = Array.from({ length: 20 }, (_, k) => 0.05 * (2000 / 0.05) ** (k / 19));
// Inside hard walls: fractions away from the centre and the quarter points, where symmetric potentials
// written differently would still agree by accident.
const INSIDE = Array.from({ length: 24 }, (_, k) => (k + 0.37) / 24);

/** Where a block's Hamiltonian is sampled (bohr): fixed for a given space and box, so two blocks are compared point by point. */
export function samplePoints(space: LineSpace, box: [number, number] | null): number[] {
  if (box) return INSIDE.map((f) => box[0] + f * (box[1] - box[0]));
  return space === 'line' ? [...OFFSETS.map((x) => -x).reverse(), 0, ...OFFSETS] : OFFSETS;
}

const finiteOrNull = (value: number) => (Number.isFinite(value) ? value : null);

function sampled(f: (x: number) => number, points: number[]): Array<number | null> {
  return points.map((x) => {
    try {
      return finiteOrNull(f(x));
    } catch {
      return null;
    }
  });
}

/**
 * What identifies the block's Hamiltonian across records: space, walls, angular momentum, and the mass and
 * potential at fixed points in atomic units (constants substituted, units converted), so two records that write
 * the same operator differently compare equal (src/log/systems.ts).
 */
export function hamiltonianSamples(spec: BlockSpec, space: LineSpace, block: CompiledBlock): Hamiltonian {
  const points = samplePoints(space, spec.box);
  const mass = block.massProfile ? sampled((x) => block.massProfile!.value(x), points) : points.map(() => block.mass);
  return { space, box: spec.box, angularMomentum: spec.angularMomentum, system: spec.system ?? null, potential: sampled(block.potential, points), mass };
}
