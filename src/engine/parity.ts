import type { Domain } from './spaces/space.ts';
import { g } from './format.ts';
import { gradedCheck, type GradedCheck } from './status.ts';

/** Parity under x -> -x. */
export type Parity = 'even' | 'odd';

/** The level a trial is compared with, and where that level and the next of its parity sit among all levels. */
export interface TargetLevel {
  /** null: counted among all levels. */
  symmetry: Parity | null;
  /** 0-based among the levels of that parity (or among all levels). */
  index: number;
  gridIndex: number;
  /** The next level of the same parity: Temple's E1. */
  nextGridIndex: number;
}

/**
 * The bound levels of an even potential on the line (or in a box symmetric about 0) alternate in
 * parity, starting with an even ground level: level n has n nodes and parity (-1)^n (Sturm's
 * oscillation theorem; Landau & Lifshitz, Quantum Mechanics, §21), so the k-th even level is level
 * 2k and the k-th odd level is level 2k + 1, and no grid vector needs to be tested for its parity.
 */
export function targetLevel(symmetry: Parity | null, index: number): TargetLevel {
  if (symmetry === null) return { symmetry, index, gridIndex: index, nextGridIndex: index + 1 };
  const gridIndex = 2 * index + (symmetry === 'odd' ? 1 : 0);
  return { symmetry, index, gridIndex, nextGridIndex: gridIndex + 2 };
}

export const GROUND_LEVEL = targetLevel(null, 0);

const ORDINALS = ['lowest', 'second', 'third'];

/** "ground level", "lowest odd level", "second even level", "third level". */
export function describeLevel(level: { symmetry: Parity | null; index: number }): string {
  if (level.symmetry === null && level.index === 0) return 'ground level';
  const ordinal = ORDINALS[level.index] ?? `${level.index + 1}th`;
  return `${ordinal} ${level.symmetry ? `${level.symmetry} ` : ''}level`;
}

/** A trial counts as even (odd) when psi(x) -/+ psi(-x) stays below this fraction of its peak at every sample. */
const PARITY_TOLERANCE = 1e-8;
/** V(x) and V(-x) may differ by this fraction of their size (rounding in how the expression is written). */
const POTENTIAL_TOLERANCE = 1e-9;
/** The trial probe's distances on the line (2^-12 to 2^14, four per factor of two). */
const LINE_DISTANCES = Array.from({ length: 105 }, (_, k) => 2 ** ((k - 48) / 4));

/** Distances from 0 at which x and -x are compared, or null when the domain is not symmetric about 0. */
function mirrorDistances(domain: Domain): readonly number[] | null {
  if (domain.lo !== -domain.hi) return null;
  if (!Number.isFinite(domain.hi)) return LINE_DISTANCES;
  return Array.from({ length: 63 }, (_, i) => (domain.hi * (i + 1)) / 64);
}

/** Why the problem is not symmetric under x -> -x, or null when it is (at every sample point). */
export function mirrorAsymmetry(potential: (x: number) => number, domain: Domain): string | null {
  const distances = mirrorDistances(domain);
  if (!distances) return domain.lo === 0 ? 'the space is not the line' : `the box [${g(domain.lo)}, ${g(domain.hi)}] is not symmetric about 0`;
  for (const x of distances) {
    const [right, left] = [potential(x), potential(-x)];
    if (Object.is(right, left)) continue;
    if (!(Math.abs(right - left) <= POTENTIAL_TOLERANCE * Math.max(Math.abs(right), Math.abs(left)))) {
      return `the potential is not even: V(${g(x, 6)}) = ${g(right, 6)}, V(${g(-x, 6)}) = ${g(left, 6)}`;
    }
  }
  return null;
}

/** The sample where the trial departs most from `parity`, or null when it has that parity to PARITY_TOLERANCE. */
export function parityMismatch(value: (x: number) => number, domain: Domain, parity: Parity, peakAmplitude: number): { x: number; right: number; left: number } | null {
  const sign = parity === 'even' ? -1 : 1;
  let worst: { x: number; right: number; left: number; gap: number } | null = null;
  for (const x of mirrorDistances(domain) ?? []) {
    const [right, left] = [value(x), value(-x)];
    const gap = Math.abs(right + sign * left);
    if (gap > PARITY_TOLERANCE * peakAmplitude && (!worst || gap > worst.gap)) worst = { x, right, left, gap };
  }
  return worst && { x: worst.x, right: worst.right, left: worst.left };
}

/**
 * The level a trial is compared with: the one the block declares (`symmetry`, `level`), checked
 * against the problem and the trial; else, on a problem symmetric under x -> -x, the lowest odd
 * level for a trial that is odd, which is orthogonal to the ground state; else the ground level.
 * A declared symmetry that the problem or the trial lacks fails a check graded `invalid`.
 */
export function resolveTarget(
  declared: { symmetry: Parity | null; index: number } | undefined,
  potential: (x: number) => number,
  value: (x: number) => number,
  domain: Domain,
  peakAmplitude: number,
  where: string,
): { target: TargetLevel; checks: GradedCheck[] } {
  const index = declared?.index ?? 0;
  if (declared?.symmetry) {
    const { symmetry } = declared;
    const asymmetry = mirrorAsymmetry(potential, domain);
    if (asymmetry) {
      const check = gradedCheck('symmetry', false, `symmetry: ${symmetry} needs a potential even under x -> -x on a domain symmetric about 0, and ${asymmetry}`, 'invalid', 'symmetry');
      return { target: targetLevel(symmetry, index), checks: [check] };
    }
    const mismatch = parityMismatch(value, domain, symmetry, peakAmplitude);
    const detail = mismatch
      ? `symmetry: ${symmetry}, but the trial is not ${symmetry} at ${where}: psi(${g(mismatch.x, 6)}) = ${g(mismatch.right, 6)}, psi(${g(-mismatch.x, 6)}) = ${g(mismatch.left, 6)}`
      : `the trial is ${symmetry} and the potential even at every sample point (${where}); compared with the ${describeLevel(declared)}`;
    return { target: targetLevel(symmetry, index), checks: [gradedCheck('symmetry', mismatch === null, detail, 'invalid', mismatch ? 'symmetry' : undefined)] };
  }
  const odd = mirrorAsymmetry(potential, domain) === null && parityMismatch(value, domain, 'odd', peakAmplitude) === null;
  return { target: targetLevel(odd ? 'odd' : null, index), checks: [] };
}
