import type { MathNode } from 'mathjs';
import { compileTree } from '../expr/compile.ts';
import type { DimensionScope } from './check-dimensions.ts';
import type { PhysicalName } from './physical-names.ts';

/** Evaluates a tree without variables in atomic units: each name is its atomic-unit value. */
export function evaluateFixed(tree: MathNode, scope: DimensionScope, physical: ReadonlyMap<string, PhysicalName>): number {
  const values: Record<string, number> = {};
  for (const [name, c] of Object.entries(scope.constants)) values[name] = c.atomic;
  for (const [name, p] of physical) values[name] = p.atomic;
  return compileTree(tree, {}, values)(new Float64Array(0));
}
