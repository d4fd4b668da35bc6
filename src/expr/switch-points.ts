import type { ConditionalNode, FunctionNode, MathNode, OperatorNode } from 'mathjs';
import { sub } from './build.ts';
import { COMPARISON } from './allow-list.ts';

/**
 * The functions g whose sign changes mark where an expression switches branch (conditions,
 * abs, min, max): its kinks and steps. Quadrature splits there and the grid puts element
 * boundaries there, which keeps both converging fast for piecewise-smooth input.
 */
export function switchFunctions(tree: MathNode): MathNode[] {
  const found: MathNode[] = [];
  tree.traverse((node) => {
    if (node.type === 'ConditionalNode') found.push(...conditionSwitches((node as ConditionalNode).condition));
    if (node.type === 'FunctionNode') {
      const f = node as FunctionNode;
      if (f.fn.name === 'abs' || f.fn.name === 'sign') found.push(f.args[0]);
      if (f.fn.name === 'min' || f.fn.name === 'max') found.push(sub(f.args[0], f.args[1]));
    }
  });
  return found;
}

function conditionSwitches(condition: MathNode): MathNode[] {
  if (condition.type === 'ParenthesisNode') return conditionSwitches((condition as unknown as { content: MathNode }).content);
  if (condition.type === 'RelationalNode') {
    const params = (condition as unknown as { params: MathNode[] }).params;
    return params.slice(1).map((right, i) => sub(params[i], right));
  }
  if (condition.type === 'OperatorNode') {
    const op = condition as OperatorNode;
    if (COMPARISON.has(op.fn)) return [sub(op.args[0], op.args[1])];
    return op.args.flatMap(conditionSwitches);
  }
  return [];
}
