import type { MathNode } from 'mathjs';
import { compileTree, type Compiled } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';

/** d(tree)/d(name) compiled as a function of the coordinates, read from the first slots of the array it is given. */
export interface CompiledDerivative {
  tree: MathNode;
  /** Takes the coordinates in point order (a point of a field space, or a one-slot array on a line). */
  at: Compiled;
}

/**
 * The symbolic derivative of a block expression (the potential) with respect to one of its declared constants, the
 * other constants substituted: dH/dc for the Hellmann–Feynman theorem. Null when the expression does not use the
 * name, so dH/dc is zero.
 */
export function compileDerivative(tree: MathNode, name: string, coordinates: string[], constants: Readonly<Record<string, number>>): CompiledDerivative | null {
  if (!dependsOn(tree, name)) return null;
  const derivative = differentiate(tree, name);
  const slotOf: Record<string, number> = {};
  coordinates.forEach((c, k) => (slotOf[c] = k));
  return { tree: derivative, at: compileTree(derivative, slotOf, constants) };
}
