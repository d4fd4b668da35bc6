import { ConditionalNode, ConstantNode, FunctionNode, OperatorNode, SymbolNode, type MathNode } from 'mathjs';

/**
 * Node constructors that fold constants and drop 0 and 1 as they build, so derivative trees
 * stay close to what a person would write (they are typeset on the pages too).
 */

export const num = (value: number): MathNode => new ConstantNode(value);
export const sym = (name: string): MathNode => new SymbolNode(name);

export function constantValue(node: MathNode): number | null {
  const inner = unwrap(node);
  if (inner.type === 'ConstantNode') {
    const value = (inner as ConstantNode).value;
    return typeof value === 'number' ? value : null;
  }
  if (inner.type === 'OperatorNode' && (inner as OperatorNode).fn === 'unaryMinus') {
    const arg = constantValue((inner as OperatorNode).args[0]);
    return arg === null ? null : -arg;
  }
  return null;
}

export function unwrap(node: MathNode): MathNode {
  let current = node;
  while (current.type === 'ParenthesisNode') current = (current as unknown as { content: MathNode }).content;
  return current;
}

const op = (symbol: string, fn: string, args: MathNode[]) => new OperatorNode(symbol as never, fn as never, args);

export function add(a: MathNode, b: MathNode): MathNode {
  const ca = constantValue(a);
  const cb = constantValue(b);
  if (ca !== null && cb !== null) return num(ca + cb);
  if (ca === 0) return b;
  if (cb === 0) return a;
  if (cb !== null && cb < 0) return op('-', 'subtract', [a, num(-cb)]);
  return op('+', 'add', [a, b]);
}

export function sub(a: MathNode, b: MathNode): MathNode {
  const ca = constantValue(a);
  const cb = constantValue(b);
  if (ca !== null && cb !== null) return num(ca - cb);
  if (cb === 0) return a;
  if (ca === 0) return neg(b);
  return op('-', 'subtract', [a, b]);
}

export function neg(a: MathNode): MathNode {
  const ca = constantValue(a);
  if (ca !== null) return num(-ca);
  const inner = unwrap(a);
  if (inner.type === 'OperatorNode' && (inner as OperatorNode).fn === 'unaryMinus') return (inner as OperatorNode).args[0];
  return op('-', 'unaryMinus', [a]);
}

export function mul(a: MathNode, b: MathNode): MathNode {
  const ca = constantValue(a);
  const cb = constantValue(b);
  if (ca !== null && cb !== null) return num(ca * cb);
  if (ca === 0 || cb === 0) return num(0);
  if (ca === 1) return b;
  if (cb === 1) return a;
  if (ca === -1) return neg(b);
  if (cb === -1) return neg(a);
  // Constants lead, as a person writes them.
  if (cb !== null) return op('*', 'multiply', [b, a]);
  return op('*', 'multiply', [a, b]);
}

export function div(a: MathNode, b: MathNode): MathNode {
  const ca = constantValue(a);
  const cb = constantValue(b);
  if (ca === 0) return num(0);
  if (cb === 1) return a;
  if (ca !== null && cb !== null && cb !== 0) return num(ca / cb);
  return op('/', 'divide', [a, b]);
}

export function pow(a: MathNode, b: MathNode): MathNode {
  const cb = constantValue(b);
  if (cb === 0) return num(1);
  if (cb === 1) return a;
  const ca = constantValue(a);
  if (ca !== null && cb !== null) return num(ca ** cb);
  return op('^', 'pow', [a, b]);
}

export const call = (name: string, ...args: MathNode[]): MathNode => new FunctionNode(new SymbolNode(name), args);

export function conditional(condition: MathNode, whenTrue: MathNode, whenFalse: MathNode): MathNode {
  const ct = constantValue(whenTrue);
  if (ct !== null && ct === constantValue(whenFalse)) return whenTrue;
  return new ConditionalNode(condition, whenTrue, whenFalse);
}

export const smaller = (a: MathNode, b: MathNode): MathNode => op('<', 'smaller', [a, b]);
