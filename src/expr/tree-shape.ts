import type { MathNode } from 'mathjs';

export interface TreeShape {
  /** Nodes counted as written out: a subtree shared n times counts n times, as it is evaluated n times. */
  size: number;
  depth: number;
}

/**
 * Size and depth of an expression tree without recursion, so neither a deeply nested expression
 * nor a derivative that shares subtrees many times can exhaust the stack or the time to count it.
 */
export function treeShape(root: MathNode): TreeShape {
  const shapes = new Map<MathNode, TreeShape>();
  const stack: Array<{ node: MathNode; childrenPushed: boolean }> = [{ node: root, childrenPushed: false }];
  while (stack.length > 0) {
    const top = stack[stack.length - 1];
    if (shapes.has(top.node)) {
      stack.pop();
      continue;
    }
    const children = childrenOf(top.node);
    if (!top.childrenPushed) {
      top.childrenPushed = true;
      for (const child of children) if (!shapes.has(child)) stack.push({ node: child, childrenPushed: false });
      continue;
    }
    stack.pop();
    let size = 1;
    let depth = 0;
    for (const child of children) {
      const shape = shapes.get(child)!;
      size += shape.size;
      depth = Math.max(depth, shape.depth);
    }
    shapes.set(top.node, { size, depth: depth + 1 });
  }
  return shapes.get(root)!;
}

function childrenOf(node: MathNode): MathNode[] {
  const children: MathNode[] = [];
  node.forEach((child) => children.push(child));
  return children;
}
