import type { MathNode } from 'mathjs';
import { coordinatesOf, spaceLabel, type BlockSpec } from '../spec/types.ts';
import { treeShape } from './tree-shape.ts';

export interface ExpressionProblem {
  field: string;
  line: number;
  token: string | null;
  message: string;
}

/** hbar in atomic units. */
const HBAR = 1;

/**
 * Terms a derivative of the trial may have when written out: some twenty times what honest trials
 * need (a 30-term polynomial times a Gaussian has about 1000), small enough that a product or tower
 * of a few dozen factors, whose derivatives grow like a power of its length, is refused at once.
 */
export const MAX_DERIVATIVE_SIZE = 20_000;

/** The names with a value in every expression of the block, besides `mass` (which may not have one). */
export function sharedConstants(spec: BlockSpec): Record<string, number> {
  return { pi: Math.PI, e: Math.E, ...spec.constants, ...spec.fixed, hbar: HBAR };
}

/** The names with a value in every expression of the block; `mass` only where the block has one constant mass. */
export function blockConstants(spec: BlockSpec): Record<string, number> {
  const constants = sharedConstants(spec);
  if (spec.masses === null && typeof spec.mass === 'number') constants.mass = spec.mass;
  return constants;
}

/** The state fields of a block: `trial`, or `basis[0]`, `basis[1]`, ... */
export function stateFields(spec: BlockSpec): Array<{ field: string; text: string; line: number }> {
  return spec.trial ? [{ field: 'trial', ...spec.trial }] : (spec.basis ?? []).map((b, i) => ({ field: `basis[${i}]`, ...b }));
}

export function derivativeTooLarge(tree: MathNode, order: string, state: { field: string; line: number }): ExpressionProblem | null {
  const { size } = treeShape(tree);
  if (size <= MAX_DERIVATIVE_SIZE) return null;
  return {
    field: state.field,
    line: state.line,
    token: null,
    message: `the ${state.field === 'trial' ? "trial's" : `${state.field} function's`} ${order} derivative has ${size} terms when written out (the limit is ${MAX_DERIVATIVE_SIZE}); write the trial with fewer nested products, powers or functions`,
  };
}

/** Names that are a coordinate of some space, for telling a misplaced coordinate from an unknown name. */
const SPACE_COORDINATES: Record<string, string> = { x: 'line, half-line', r: 'radial, plane', rho: 'axial', z: 'axial', r1: 'two-electron', r2: 'two-electron', r12: 'two-electron' };

/** The allow-list's refusal, said in the block's terms where a block-level reason is known. */
export function explainRefusal(token: string, message: string, spec: BlockSpec, field: string): string {
  if ((field === 'potential' || field === 'mass') && spec.varied.some((p) => p.name === token)) {
    return `the ${field} may not depend on the varied parameter ${token}; hold it fixed (a plain value under parameters) or move it to constants`;
  }
  if (token === 'mass' && typeof spec.mass !== 'number') {
    return field === 'mass' ? 'the mass may not refer to itself (mass)' : `the mass depends on the coordinate in this block, so the name mass has no single value; write the number it should stand for`;
  }
  const coordinates = coordinatesOf(spec.space);
  const own = coordinates.length === 1 ? `the coordinate of space ${spaceLabel(spec.space)} is ${coordinates[0]}` : `the coordinates of space ${spaceLabel(spec.space)} are ${coordinates.join(', ')}`;
  if (token in SPACE_COORDINATES && !coordinates.includes(token)) return `unknown name ${token} (a coordinate of space ${SPACE_COORDINATES[token]}): ${own}`;
  // A two-electron trial is a function of the three distances only: a stray name is most likely a fourth coordinate.
  if (spec.space === 'two-electron' && message.startsWith('unknown name')) return `${message}; ${own}`;
  if (token === 'mass' && spec.masses !== null) return `mass is given per coordinate in this block (${Object.keys(spec.masses).join(', ')}), so the name mass has no single value; declare the value you need under constants`;
  return message;
}
