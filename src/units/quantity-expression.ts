import { parse, type MathNode, type SymbolNode } from 'mathjs';
import { checkExpression, MAX_EXPRESSION_LENGTH } from '../expr/allow-list.ts';
import { checkDimensions, type DimensionScope } from './check-dimensions.ts';
import type { DimensionOrAny } from './dimension.ts';
import { PHYSICAL_CONSTANT_NAMES, resolvePhysicalName, type PhysicalName } from './physical-names.ts';

export type AnalysedExpression =
  | { ok: true; tree: MathNode; dimension: DimensionOrAny; physical: Map<string, PhysicalName> }
  | { ok: false; token: string; message: string };

/**
 * Reads a quantity-mode expression: the allow-list first (the same one as in atomic units, with
 * the mathjs units and constants the text names admitted), then its dimensions.
 */
export function analyseExpression(text: string, scope: DimensionScope): AnalysedExpression {
  const constants: Record<string, number> = {};
  for (const [name, c] of Object.entries(scope.constants)) constants[name] = c.atomic;
  for (const name of physicalCandidates(text, scope)) constants[name] = Number.NaN;
  const checked = checkExpression(text, { variables: Object.keys(scope.variables), constants, suggestable: PHYSICAL_CONSTANT_NAMES });
  if (!checked.ok) return checked;
  const dimensions = checkDimensions(checked.tree, scope);
  if (!dimensions.ok) return { ok: false, token: dimensions.term, message: dimensions.message };
  return { ok: true, tree: checked.tree, dimension: dimensions.dimension, physical: dimensions.physical };
}

/**
 * Names in the text that mathjs knows as units or constants (including those we refuse, so the
 * dimensional pass can say why rather than calling them unknown). Unreadable text yields none:
 * the allow-list then reports why it cannot be read.
 */
function physicalCandidates(text: string, scope: DimensionScope): string[] {
  if (text.length > MAX_EXPRESSION_LENGTH) return [];
  let tree: MathNode;
  try {
    tree = parse(text);
  } catch {
    return [];
  }
  const names = new Set<string>();
  tree.traverse((node) => {
    if (node.type !== 'SymbolNode') return;
    const name = (node as SymbolNode).name;
    if (!(name in scope.variables) && !(name in scope.constants) && resolvePhysicalName(name) !== null) names.add(name);
  });
  return [...names];
}
