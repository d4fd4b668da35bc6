import type { MathNode } from 'mathjs';
import { compileTree, type Compiled } from './compile.ts';
import { dependsOn, differentiate } from './differentiate.ts';
import { switchFunctions } from './switch-points.ts';

/** d(tree)/d(name) compiled as a function of the coordinates, read from the first slots of the array it is given. */
export interface CompiledDerivative {
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
  return { at: compileOnCoordinates(derivative, coordinates, constants) };
}

/** A checked tree compiled over its coordinates alone (slots 0, 1, ...), every other name a constant. */
export function compileOnCoordinates(tree: MathNode, coordinates: string[], constants: Readonly<Record<string, number>>): Compiled {
  const slotOf: Record<string, number> = {};
  coordinates.forEach((c, k) => (slotOf[c] = k));
  return compileTree(tree, slotOf, constants);
}

/**
 * A potential of one coordinate compiled again with other constants, with the switch functions that mark its kinks:
 * a re-optimisation at a changed constant reuses the trial's closures and recompiles only this.
 */
export function recompileLinePotential(tree: MathNode, coordinate: string, constants: Readonly<Record<string, number>>): { potential: (x: number) => number; switches: Array<(x: number) => number> } {
  const slot = new Float64Array(1);
  const on = (f: Compiled) => (x: number) => ((slot[0] = x), f(slot));
  const switches = switchFunctions(tree).filter((g) => dependsOn(g, coordinate)).map((g) => on(compileOnCoordinates(g, [coordinate], constants)));
  return { potential: on(compileOnCoordinates(tree, [coordinate], constants)), switches };
}
