import type { EngineSpace } from './problem.ts';

/** The coordinate range of a space and the weight of its volume element. */
export interface Domain {
  lo: number;
  hi: number;
  /** Hard walls where the trial must vanish. */
  walls: number[];
  radial: boolean;
}

export function domainOf(space: EngineSpace, box: [number, number] | null): Domain {
  if (box) return { lo: box[0], hi: box[1], walls: [box[0], box[1]], radial: false };
  if (space === 'line') return { lo: -Infinity, hi: Infinity, walls: [], radial: false };
  return { lo: 0, hi: Infinity, walls: space === 'half-line' ? [0] : [], radial: space === 'radial' };
}

/** Interval ends and interior split points for quadrature, sorted and without repeats. */
export function splitPoints(domain: Domain, interior: number[]): number[] {
  const inside = interior.filter((x) => x > domain.lo && x < domain.hi);
  return [...new Set([domain.lo, ...inside, domain.hi])].sort((a, b) => a - b);
}
